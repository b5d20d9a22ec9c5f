package csv

import (
	"bufio"
	"io"
	"unicode"
	"unicode/utf8"

	"seatsmith/engine/format"
)

// Encoder writes documents' data as CSV.
type Encoder struct{}

// Encode writes d's data table, or returns format.ErrNoPart when d has
// none.
func (Encoder) Encode(w io.Writer, d *format.Document) error {
	if d.Data == nil {
		return format.ErrNoPart
	}
	return WriteTable(w, d.Data)
}

// WriteTable writes a data table as CSV, as Encode writes a document's.
func WriteTable(w io.Writer, t *format.Table) error {
	b := bufio.NewWriterSize(w, 64<<10)
	line := AppendRecord(nil, t.Names())
	b.Write(line)
	var row []string
	for k, n := 0, t.Len(); k < n; k++ {
		row = t.At(k, row)
		line = line[:0]
		for i, c := range row {
			if i > 0 {
				line = append(line, ',')
			}
			if !t.IsNumber(i) {
				c = Guard(c)
			}
			line = appendField(line, c)
		}
		b.Write(append(line, '\n'))
	}
	return b.Flush()
}

// AppendRecord appends one CSV record (ending in a line feed) to b.
func AppendRecord(b []byte, fields []string) []byte {
	for i, f := range fields {
		if i > 0 {
			b = append(b, ',')
		}
		b = appendField(b, f)
	}
	return append(b, '\n')
}

func appendField(b []byte, f string) []byte {
	if !needsQuotes(f) {
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

func needsQuotes(f string) bool {
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

// Guard guards a text cell against formula injection when opened in a
// spreadsheet: a cell starting with =, +, -, @, a tab or a carriage return
// gets a leading apostrophe, so that "-2+3" stays text.
func Guard(c string) string {
	if c == "" {
		return c
	}
	switch c[0] {
	case '=', '+', '-', '@', '\t', '\r':
		return "'" + c
	}
	return c
}
