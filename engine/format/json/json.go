package json

import (
	"bufio"
	"bytes"
	"io"

	"seatsmith/engine/format"
	"seatsmith/engine/jsondoc"
)

// Encoder writes documents as JSON.
type Encoder struct{}

// Encode writes d's tree, or returns format.ErrNoPart when d has none.
func (Encoder) Encode(w io.Writer, d *format.Document) error {
	t := d.Tree
	if t == nil {
		return format.ErrNoPart
	}
	b := bufio.NewWriterSize(w, 64<<10)
	doc := jsondoc.MarshalIndent(t.Root, "  ")
	if t.Key == "" || t.N == 0 {
		b.Write(doc)
		return b.Flush()
	}
	mark := []byte("\n  \"" + t.Key + "\": []")
	k := bytes.Index(doc, mark)
	if k < 0 {
		b.Write(jsondoc.MarshalIndent(t.Value(), "  "))
		return b.Flush()
	}
	b.Write(doc[:k+len(mark)-1])
	var one []byte
	for i := 0; i < t.N; i++ {
		if i > 0 {
			b.WriteByte(',')
		}
		b.WriteString("\n    ")
		// Indent the item's own lines by two levels.
		one = append(one[:0], jsondoc.MarshalIndent(t.Item(i), "  ")...)
		one = one[:len(one)-1] // the final line feed
		for len(one) > 0 {
			j := bytes.IndexByte(one, '\n')
			if j < 0 {
				b.Write(one)
				break
			}
			b.Write(one[:j+1])
			b.WriteString("    ")
			one = one[j+1:]
		}
	}
	b.WriteString("\n  ]")
	b.Write(doc[k+len(mark):])
	return b.Flush()
}
