package text

import (
	"bufio"
	"io"
	"strings"
	"unicode/utf8"

	"seatsmith/engine/format"
)

// Width is the width text is wrapped to.
const Width = 76

// Encoder writes documents as text.
type Encoder struct{}

// Encode writes d as text: its title and body, then the caution.
func (Encoder) Encode(w io.Writer, d *format.Document) error {
	b := bufio.NewWriterSize(w, 64<<10)
	underline(b, d.Title, '=')
	for _, blk := range d.Body {
		switch x := blk.(type) {
		case format.Heading:
			underline(b, x.Text, '-')
		case format.Paragraph:
			b.WriteString(format.Wrap(x.Text, Width) + "\n\n")
		case format.List:
			indent := ""
			if x.Head != "" {
				b.WriteString(x.Head + "\n")
				indent = "  "
			}
			for _, it := range x.Items {
				b.WriteString(indent + it + "\n") // one line an item, whole, for grep
			}
			b.WriteString("\n")
		case *format.Table:
			WriteTable(b, x)
			b.WriteString("\n")
		}
	}
	b.WriteString(format.Wrap(format.Caution, Width) + "\n")
	return b.Flush()
}

func underline(b *bufio.Writer, s string, c byte) {
	if s == "" {
		return
	}
	b.WriteString(s + "\n" + strings.Repeat(string(c), utf8.RuneCountInString(s)) + "\n\n")
}

// WriteTable writes t with aligned columns and a rule under the header.
func WriteTable(b *bufio.Writer, t *format.Table) {
	ws := make([]int, len(t.Columns))
	for i, c := range t.Columns {
		ws[i] = utf8.RuneCountInString(c.Name)
	}
	var row []string
	n := t.Len()
	for k := 0; k < n; k++ {
		row = t.At(k, row)
		for i, c := range row {
			if i < len(ws) {
				ws[i] = max(ws[i], utf8.RuneCountInString(c))
			}
		}
	}
	var line []byte
	write := func(cells []string) {
		line = line[:0]
		for i := range ws {
			c := ""
			if i < len(cells) {
				c = cells[i]
			}
			pad := ws[i] - utf8.RuneCountInString(c)
			if i > 0 {
				line = append(line, "  "...)
			}
			if t.IsNumber(i) {
				line = appendSpaces(line, pad)
				line = append(line, c...)
			} else {
				line = append(line, c...)
				if i < len(ws)-1 {
					line = appendSpaces(line, pad)
				}
			}
		}
		for len(line) > 0 && line[len(line)-1] == ' ' {
			line = line[:len(line)-1]
		}
		line = append(line, '\n')
		b.Write(line)
	}
	write(t.Names())
	rule := make([]string, len(ws))
	for i, n := range ws {
		rule[i] = strings.Repeat("-", n)
	}
	write(rule)
	for k := 0; k < n; k++ {
		row = t.At(k, row)
		write(row)
	}
}

func appendSpaces(b []byte, n int) []byte {
	for ; n > 0; n-- {
		b = append(b, ' ')
	}
	return b
}
