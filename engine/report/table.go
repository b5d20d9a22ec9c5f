package report

import (
	"encoding/csv"
	"io"
	"strings"
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

func (t *Table) widths() []int {
	w := make([]int, len(t.Header))
	for i, h := range t.Header {
		w[i] = utf8.RuneCountInString(h)
	}
	for _, r := range t.Rows {
		for i, c := range r {
			if i < len(w) {
				w[i] = max(w[i], utf8.RuneCountInString(c))
			}
		}
	}
	return w
}

func (t *Table) right(i int) bool { return i < len(t.Right) && t.Right[i] }

// WriteText writes the table with aligned columns and a rule under the
// header.
func (t *Table) WriteText(w io.Writer) error {
	ws := t.widths()
	var b strings.Builder
	line := func(cells []string) {
		for i := range ws {
			c := ""
			if i < len(cells) {
				c = cells[i]
			}
			pad := strings.Repeat(" ", ws[i]-utf8.RuneCountInString(c))
			if i > 0 {
				b.WriteString("  ")
			}
			if t.right(i) {
				b.WriteString(pad + c)
			} else if i == len(ws)-1 {
				b.WriteString(c)
			} else {
				b.WriteString(c + pad)
			}
		}
		trimmed := strings.TrimRight(b.String(), " ")
		b.Reset()
		b.WriteString(trimmed)
		b.WriteString("\n")
	}
	line(t.Header)
	rule := make([]string, len(ws))
	for i, n := range ws {
		rule[i] = strings.Repeat("-", n)
	}
	line(rule)
	for _, r := range t.Rows {
		line(r)
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// Write writes the table as Markdown when md is set, as aligned text
// otherwise.
func (t *Table) Write(w io.Writer, md bool) error {
	if md {
		return t.WriteMarkdown(w)
	}
	return t.WriteText(w)
}

// WriteMarkdown writes the table as a Markdown pipe table.
func (t *Table) WriteMarkdown(w io.Writer) error {
	var b strings.Builder
	esc := func(s string) string { return strings.ReplaceAll(strings.ReplaceAll(s, "|", `\|`), "\n", " ") }
	b.WriteString("|")
	for _, h := range t.Header {
		b.WriteString(" " + esc(h) + " |")
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
	for _, r := range t.Rows {
		b.WriteString("|")
		for _, c := range r {
			b.WriteString(" " + esc(c) + " |")
		}
		b.WriteString("\n")
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// WriteCSV writes the table as CSV with a header row. Cells that a
// spreadsheet would run as a formula are prefixed with an apostrophe.
func (t *Table) WriteCSV(w io.Writer) error {
	cw := csv.NewWriter(w)
	if err := cw.Write(t.Header); err != nil {
		return err
	}
	for _, r := range t.Rows {
		safe := make([]string, len(r))
		for i, c := range r {
			safe[i] = CSVSafe(c)
		}
		if err := cw.Write(safe); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

// CSVSafe guards a cell against formula injection when opened in a
// spreadsheet: a text cell starting with =, +, - or @ gets a leading
// apostrophe. Numbers are left alone.
func CSVSafe(c string) string {
	if c == "" {
		return c
	}
	switch c[0] {
	case '=', '+', '@', '\t', '\r':
		return "'" + c
	case '-':
		if len(c) > 1 && (c[1] < '0' || c[1] > '9') {
			return "'" + c
		}
	}
	return c
}
