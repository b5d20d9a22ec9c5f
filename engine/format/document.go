package format

import (
	"errors"
	"io"

	"seatsmith/engine/jsondoc"
	"seatsmith/engine/render"
)

// A Document is one result ready to be written: what it says, as data,
// and no more. Each [Encoder] writes the parts its format shows: text and
// Markdown the title and the body, CSV the data table, JSON the tree, SVG
// the chart. A document builder fills in every part its kind has.
type Document struct {
	// Kind names the document, as its JSON form's kind does
	// ("allotment", "comparison", "sweep", ...).
	Kind string
	// Title heads the text and Markdown forms.
	Title string
	// Body is the readable content, in order.
	Body []Block
	// Data is the table a CSV file holds: one row per record, numbers in
	// numeric columns, the settings leading every row.
	Data *Table
	// Tree makes the JSON form (when asked for: the JSON form of a long
	// sweep's paradoxes is large).
	Tree func() *Tree
	// Chart, when the document has one, draws it as an <svg> element
	// (made only when asked for: a chart of a long sweep is large).
	Chart func() *render.Node
}

// A Block is one part of a document's body: a [Heading], [Paragraph],
// [List] or [*Table].
type Block interface{ block() }

// A Heading starts a section of the body.
type Heading struct{ Text string }

// A Paragraph is running text, wrapped to the width of a terminal in
// text.
type Paragraph struct{ Text string }

// A List is a run of lines, each a short statement, under an optional
// head line.
type List struct {
	Head  string
	Items []string
}

func (Heading) block()   {}
func (Paragraph) block() {}
func (List) block()      {}
func (*Table) block()    {}

// A Tree is a document's JSON form: Root, whose large array members
// (the units of an allotment, the sizes and paradoxes of a sweep) may be
// made item by item as they are written, so that a million of them are
// never held as a tree. Root holds each streamed member as an empty
// array.
type Tree struct {
	Root    *jsondoc.Value
	Streams []Stream
}

// A Stream is an array member of a tree's root, named Key, whose N items
// Item makes one at a time.
type Stream struct {
	Key  string
	N    int
	Item func(i int) *jsondoc.Value
}

// Value returns the whole tree, the streamed arrays made in full.
func (t *Tree) Value() *jsondoc.Value {
	for _, s := range t.Streams {
		arr := t.Root.Get(s.Key)
		arr.Items = arr.Items[:0]
		for i := 0; i < s.N; i++ {
			arr.Append(s.Item(i))
		}
	}
	return t.Root
}

// An Encoder writes documents in one format. The packages under
// engine/format hold one each: text, markdown, csv, json and svg.
type Encoder interface {
	Encode(w io.Writer, d *Document) error
}

// ErrNoPart is returned by an encoder for a document without the part
// its format writes (a chart for SVG, a tree for JSON, a table for CSV).
var ErrNoPart = errors.New("this document has nothing to write in this format")
