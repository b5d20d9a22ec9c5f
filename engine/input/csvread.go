package input

import (
	"bufio"
	"bytes"
	"errors"
	"io"
	"strconv"
)

// A CSVReader reads records from CSV text as RFC 4180 describes them:
// fields separated by commas, records by line feeds or CR LF, fields in
// double quotes holding commas, line breaks and doubled quotes. A byte
// order mark at the start is skipped and empty lines are ignored. Every
// record must have as many fields as the first. It reads as it goes,
// holding one record at a time, and gives the same records and errors as
// encoding/csv with its default settings, but for records longer than
// [MaxRecordBytes], which it refuses.
type CSVReader struct {
	r       *bufio.Reader
	line    int // lines read so far
	start   int // the line on which the last record began
	fields  int // fields per record, from the first
	started bool
	buf     []byte // the fields of the record, end to end
	ends    []int
	rec     []string
	raw     []byte
}

// A CSVError is a CSV syntax error: Line and Column (1-based, in bytes)
// locate it, Msg says what is wrong. FieldCount is set for a record whose
// number of fields differs from the first record's.
type CSVError struct {
	Line, Column int
	Msg          string
	FieldCount   bool
}

func (e *CSVError) Error() string {
	return "line " + strconv.Itoa(e.Line) + ", column " + strconv.Itoa(e.Column) + ": " + e.Msg
}

// The messages of CSV syntax errors.
const (
	msgBareQuote  = "bare \" in non-quoted-field"
	msgQuote      = "extraneous or missing \" in quoted-field"
	msgFieldCount = "wrong number of fields"
	msgTooLong    = "a record longer than 1 MiB: this does not look like a table"
)

// NewCSVReader returns a reader of the CSV text in r.
func NewCSVReader(r io.Reader) *CSVReader {
	return &CSVReader{r: bufio.NewReaderSize(r, 64<<10)}
}

// Line returns the line on which the record last read began.
func (c *CSVReader) Line() int { return c.start }

// readLine returns the next line with CR LF turned into LF; the slice is
// valid until the next call.
func (c *CSVReader) readLine() ([]byte, error) {
	line, err := c.r.ReadSlice('\n')
	if err == bufio.ErrBufferFull {
		c.raw = append(c.raw[:0], line...)
		for err == bufio.ErrBufferFull {
			if len(c.raw) > MaxRecordBytes {
				return nil, &CSVError{Line: c.line + 1, Column: 1, Msg: msgTooLong}
			}
			line, err = c.r.ReadSlice('\n')
			c.raw = append(c.raw, line...)
		}
		line = c.raw
	}
	if len(line) > 0 && err == io.EOF {
		err = nil
		if line[len(line)-1] == '\r' {
			line = line[:len(line)-1]
		}
	}
	if c.line == 0 {
		line = bytes.TrimPrefix(line, []byte("\xEF\xBB\xBF"))
	}
	c.line++
	if n := len(line); n >= 2 && line[n-2] == '\r' && line[n-1] == '\n' {
		line[n-2] = '\n'
		line = line[:n-1]
	}
	return line, err
}

func lengthNL(b []byte) int {
	if len(b) > 0 && b[len(b)-1] == '\n' {
		return 1
	}
	return 0
}

// Read returns the next record, or io.EOF after the last. The slice is
// reused by the next call; its strings stay valid (each record's fields
// share one new string).
func (c *CSVReader) Read() ([]string, error) {
	var line []byte
	var errRead error
	for errRead == nil {
		line, errRead = c.readLine()
		if errRead == nil && len(line) == lengthNL(line) {
			line = nil
			continue // an empty line
		}
		break
	}
	if errRead == io.EOF {
		return nil, errRead
	}
	c.start = c.line
	c.buf, c.ends = c.buf[:0], c.ends[:0]
	col := 1
	var err error
	line0 := c.line
parse:
	for {
		if len(line) == 0 || line[0] != '"' {
			i := bytes.IndexByte(line, ',')
			field := line
			if i >= 0 {
				field = field[:i]
			} else {
				field = field[:len(field)-lengthNL(field)]
			}
			if j := bytes.IndexByte(field, '"'); j >= 0 {
				err = &CSVError{Line: c.line, Column: col + j, Msg: msgBareQuote}
				break parse
			}
			c.buf = append(c.buf, field...)
			c.ends = append(c.ends, len(c.buf))
			if i >= 0 {
				line = line[i+1:]
				col += i + 1
				continue parse
			}
			break parse
		}
		// A quoted field.
		line = line[1:]
		col++
		for {
			i := bytes.IndexByte(line, '"')
			switch {
			case i >= 0:
				c.buf = append(c.buf, line[:i]...)
				line = line[i+1:]
				col += i + 1
				switch {
				case len(line) > 0 && line[0] == '"':
					c.buf = append(c.buf, '"')
					line = line[1:]
					col++
				case len(line) > 0 && line[0] == ',':
					line = line[1:]
					col++
					c.ends = append(c.ends, len(c.buf))
					continue parse
				case lengthNL(line) == len(line):
					c.ends = append(c.ends, len(c.buf))
					break parse
				default:
					err = &CSVError{Line: c.line, Column: col - 1, Msg: msgQuote}
					break parse
				}
			case len(line) > 0:
				// The field goes on to the next line.
				c.buf = append(c.buf, line...)
				if len(c.buf) > MaxRecordBytes {
					err = &CSVError{Line: c.start, Column: 1, Msg: msgTooLong}
					break parse
				}
				if errRead != nil {
					break parse
				}
				col += len(line)
				line, errRead = c.readLine()
				if len(line) > 0 {
					line0++
					col = 1
				}
				if errRead == io.EOF {
					errRead = nil
				}
			default:
				// The input ends inside the quotes.
				if errRead == nil {
					err = &CSVError{Line: line0, Column: col, Msg: msgQuote}
					break parse
				}
				c.ends = append(c.ends, len(c.buf))
				break parse
			}
		}
	}
	if err == nil {
		err = errRead
	}
	s := string(c.buf)
	c.rec = c.rec[:0]
	prev := 0
	for _, e := range c.ends {
		c.rec = append(c.rec, s[prev:e])
		prev = e
	}
	if err != nil {
		return c.rec, err
	}
	if !c.started {
		c.started, c.fields = true, len(c.rec)
	} else if len(c.rec) != c.fields {
		return c.rec, &CSVError{Line: c.start, Column: 1, Msg: msgFieldCount, FieldCount: true}
	}
	return c.rec, nil
}

// errorOf turns a read error into an *Error naming the file and line.
func errorOf(file string, err error) error {
	var ce *CSVError
	if errors.As(err, &ce) {
		if ce.FieldCount {
			return &Error{File: file, Line: ce.Line, Field: "row", Msg: "this row has a different number of fields from the header"}
		}
		return &Error{File: file, Line: ce.Line, Field: "column " + strconv.Itoa(ce.Column), Msg: ce.Msg}
	}
	return &Error{File: file, Msg: err.Error()}
}

// CSVErrorOf turns an error from a [CSVReader] into an *[Error] naming the
// file, line and column.
func CSVErrorOf(file string, err error) error { return errorOf(file, err) }
