package markdown

import (
	"bufio"
	"io"
	"strings"

	"seatsmith/engine/format"
)

// Encoder writes documents as Markdown.
type Encoder struct{}

// Encode writes d as Markdown: its title and body, then the caution.
func (Encoder) Encode(w io.Writer, d *format.Document) error {
	b := bufio.NewWriterSize(w, 64<<10)
	if d.Title != "" {
		b.WriteString("## " + d.Title + "\n\n")
	}
	for _, blk := range d.Body {
		switch x := blk.(type) {
		case format.Heading:
			b.WriteString("### " + x.Text + "\n\n")
		case format.Paragraph:
			b.WriteString(x.Text + "\n\n")
		case format.List:
			if x.Head != "" {
				b.WriteString(x.Head + "\n\n")
			}
			for _, it := range x.Items {
				b.WriteString("- " + it + "\n")
			}
			b.WriteString("\n")
		case *format.Table:
			WriteTable(b, x)
			b.WriteString("\n")
		}
	}
	b.WriteString("> " + format.Caution + "\n")
	return b.Flush()
}

// WriteTable writes t as a pipe table.
func WriteTable(b *bufio.Writer, t *format.Table) {
	cell := func(s string) {
		b.WriteString(" ")
		if strings.ContainsAny(s, "|\n") {
			s = strings.ReplaceAll(strings.ReplaceAll(s, "|", `\|`), "\n", " ")
		}
		b.WriteString(s)
		b.WriteString(" |")
	}
	b.WriteString("|")
	for _, c := range t.Columns {
		cell(c.Name)
	}
	b.WriteString("\n|")
	for _, c := range t.Columns {
		if c.Number {
			b.WriteString(" ---: |")
		} else {
			b.WriteString(" --- |")
		}
	}
	b.WriteString("\n")
	var row []string
	for k, n := 0, t.Len(); k < n; k++ {
		row = t.At(k, row)
		b.WriteString("|")
		for _, c := range row {
			cell(c)
		}
		b.WriteString("\n")
	}
}
