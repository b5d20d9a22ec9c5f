package json

import (
	"bufio"
	"bytes"
	"errors"
	"io"

	"seatsmith/engine/format"
	"seatsmith/engine/jsondoc"
)

// Encoder writes documents as JSON.
type Encoder struct{}

// Encode writes d's tree, or returns format.ErrNoPart when d has none.
func (Encoder) Encode(w io.Writer, d *format.Document) error {
	if d.Tree == nil {
		return format.ErrNoPart
	}
	t := d.Tree()
	b := bufio.NewWriterSize(w, 64<<10)
	doc := jsondoc.MarshalIndent(t.Root, "  ")
	var one []byte
	for _, st := range t.Streams {
		mark := []byte("\n  \"" + st.Key + "\": []")
		k := bytes.Index(doc, mark)
		if k < 0 {
			return errors.New("json: the tree has no member " + st.Key + " to stream")
		}
		b.Write(doc[:k+len(mark)-1])
		doc = doc[k+len(mark):]
		if st.N == 0 {
			b.WriteByte(']')
			continue
		}
		for i := 0; i < st.N; i++ {
			if i > 0 {
				b.WriteByte(',')
			}
			b.WriteString("\n    ")
			// Indent the item's own lines by two levels.
			one = append(one[:0], jsondoc.MarshalIndent(st.Item(i), "  ")...)
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
	}
	b.Write(doc)
	return b.Flush()
}
