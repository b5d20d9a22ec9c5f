package report

import (
	"bufio"
	"io"
	"strings"
	"unicode"
	"unicode/utf8"
)

// A Table is a titled grid of text cells that can be written as aligned
// text, Markdown or CSV.
type Table struct {
	Header []string
	// Right marks the columns aligned right (numbers).
	Right []bool
	Rows  [][]string
}

// AddRow appends a row.
func (t *Table) AddRow(cells ...string) { t.Rows = append(t.Rows, cells) }

// stream returns the table as rows made on demand.
func (t *Table) stream() *Rows {
	return &Rows{Header: t.Header, Right: t.Right, N: len(t.Rows),
		Row: func(i int, _ []string) []string { return t.Rows[i] }}
}

// WriteText writes the table with aligned columns and a rule under the
// header.
func (t *Table) WriteText(w io.Writer) error { return t.stream().WriteText(w) }

// Write writes the table as Markdown when md is set, as aligned text
// otherwise.
func (t *Table) Write(w io.Writer, md bool) error {
	if md {
		return t.WriteMarkdown(w)
	}
	return t.WriteText(w)
}

// WriteMarkdown writes the table as a Markdown pipe table.
func (t *Table) WriteMarkdown(w io.Writer) error { return t.stream().WriteMarkdown(w) }

// WriteCSV writes the table as CSV with a header row. Cells that a
// spreadsheet would run as a formula are prefixed with an apostrophe.
func (t *Table) WriteCSV(w io.Writer) error { return t.stream().WriteCSV(w) }

// Rows is a table whose rows are made one at a time as they are written,
// so that a table of millions of rows is never held in memory as text.
type Rows struct {
	Header []string
	// Right marks the columns aligned right (numbers).
	Right []bool
	// N is the number of rows; Row returns row i, and may reuse dst (the
	// slice it returned for the previous row) to hold it.
	N   int
	Row func(i int, dst []string) []string
}

func (t *Rows) right(i int) bool { return i < len(t.Right) && t.Right[i] }

// widths makes every row once to measure the columns.
func (t *Rows) widths() []int {
	w := make([]int, len(t.Header))
	for i, h := range t.Header {
		w[i] = utf8.RuneCountInString(h)
	}
	var row []string
	for k := 0; k < t.N; k++ {
		row = t.Row(k, row)
		for i, c := range row {
			if i < len(w) {
				w[i] = max(w[i], utf8.RuneCountInString(c))
			}
		}
	}
	return w
}

// buffered returns w as a buffered writer, and whether it made one (and so
// must flush it).
func buffered(w io.Writer) (*bufio.Writer, bool) {
	if bw, ok := w.(*bufio.Writer); ok {
		return bw, false
	}
	return bufio.NewWriterSize(w, 64<<10), true
}

func finish(b *bufio.Writer, own bool) error {
	if own {
		return b.Flush()
	}
	return nil
}

// WriteText writes the rows with aligned columns and a rule under the
// header. It makes every row twice: once to measure, once to write.
func (t *Rows) WriteText(w io.Writer) error {
	ws := t.widths()
	b, own := buffered(w)
	var line []byte
	spaces := func(n int) {
		for ; n > 0; n-- {
			line = append(line, ' ')
		}
	}
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
			if t.right(i) {
				spaces(pad)
				line = append(line, c...)
			} else {
				line = append(line, c...)
				if i < len(ws)-1 {
					spaces(pad)
				}
			}
		}
		for len(line) > 0 && line[len(line)-1] == ' ' {
			line = line[:len(line)-1]
		}
		line = append(line, '\n')
		b.Write(line)
	}
	write(t.Header)
	rule := make([]string, len(ws))
	for i, n := range ws {
		rule[i] = strings.Repeat("-", n)
	}
	write(rule)
	var row []string
	for k := 0; k < t.N; k++ {
		row = t.Row(k, row)
		write(row)
	}
	return finish(b, own)
}

// WriteMarkdown writes the rows as a Markdown pipe table.
func (t *Rows) WriteMarkdown(w io.Writer) error {
	b, own := buffered(w)
	esc := func(s string) {
		b.WriteString(" ")
		if strings.ContainsAny(s, "|\n") {
			s = strings.ReplaceAll(strings.ReplaceAll(s, "|", `\|`), "\n", " ")
		}
		b.WriteString(s)
		b.WriteString(" |")
	}
	b.WriteString("|")
	for _, h := range t.Header {
		esc(h)
	}
	b.WriteString("\n|")
	for i := range t.Header {
		if t.right(i) {
			b.WriteString(" ---: |")
		} else {
			b.WriteString(" --- |")
		}
	}
	b.WriteString("\n")
	var row []string
	for k := 0; k < t.N; k++ {
		row = t.Row(k, row)
		b.WriteString("|")
		for _, c := range row {
			esc(c)
		}
		b.WriteString("\n")
	}
	return finish(b, own)
}

// WriteCSV writes the rows as CSV with a header row. Cells of text
// columns that a spreadsheet would run as a formula are prefixed with an
// apostrophe; cells of numeric columns (Right) are numbers and are written
// as they are.
func (t *Rows) WriteCSV(w io.Writer) error {
	b, own := buffered(w)
	var line []byte
	line = AppendCSVRecord(line[:0], t.Header)
	b.Write(line)
	var row []string
	for k := 0; k < t.N; k++ {
		row = t.Row(k, row)
		line = line[:0]
		for i, c := range row {
			if i > 0 {
				line = append(line, ',')
			}
			if !t.right(i) {
				c = CSVSafe(c)
			}
			line = appendCSVField(line, c)
		}
		line = append(line, '\n')
		b.Write(line)
	}
	return finish(b, own)
}

// AppendCSVRecord appends one CSV record (RFC 4180, ending in a line feed)
// to b: a field is quoted when it holds a comma, a quote, a line break or
// begins with white space, with quotes doubled inside.
func AppendCSVRecord(b []byte, fields []string) []byte {
	for i, f := range fields {
		if i > 0 {
			b = append(b, ',')
		}
		b = appendCSVField(b, f)
	}
	return append(b, '\n')
}

func appendCSVField(b []byte, f string) []byte {
	if !csvNeedsQuotes(f) {
		return append(b, f...)
	}
	b = append(b, '"')
	for i := 0; i < len(f); i++ {
		if f[i] == '"' {
			b = append(b, '"')
		}
		b = append(b, f[i])
	}
	return append(b, '"')
}

func csvNeedsQuotes(f string) bool {
	if f == "" {
		return false
	}
	if f == `\.` {
		return true
	}
	for i := 0; i < len(f); i++ {
		switch f[i] {
		case '\n', '\r', '"', ',':
			return true
		}
	}
	r, _ := utf8.DecodeRuneInString(f)
	return unicode.IsSpace(r)
}

// CSVSafe guards a text cell against formula injection when opened in a
// spreadsheet: a cell starting with =, +, -, @, a tab or a carriage return
// gets a leading apostrophe, so "-2+3" stays text. Numbers are written in
// numeric columns, which are never guarded.
func CSVSafe(c string) string {
	if c == "" {
		return c
	}
	switch c[0] {
	case '=', '+', '-', '@', '\t', '\r':
		return "'" + c
	}
	return c
}
