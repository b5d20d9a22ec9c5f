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
	// Tree is the JSON form.
	Tree *Tree
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

// A Tree is a document's JSON form: Root, and optionally one large array
// member of Root made item by item as it is written, so that a million
// units are never held as a tree. Root then holds that member, named Key,
// as an empty array; Item makes item i of N.
type Tree struct {
	Root *jsondoc.Value
	Key  string
	N    int
	Item func(i int) *jsondoc.Value
}

// Value returns the whole tree, the streamed array made in full.
func (t *Tree) Value() *jsondoc.Value {
	if t.Key == "" {
		return t.Root
	}
	arr := t.Root.Get(t.Key)
	arr.Items = arr.Items[:0]
	for i := 0; i < t.N; i++ {
		arr.Append(t.Item(i))
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
