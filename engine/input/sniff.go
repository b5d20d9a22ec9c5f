package input

import (
	"bufio"
	"bytes"
	"io"
	"strconv"
)

// Limits on what the readers take in, so that a file that is not a table
// (a disk image, /dev/zero, a log) is refused at once instead of being
// held in memory.
const (
	// MaxJSONBytes is the largest JSON document read: about a million
	// units. A JSON document is parsed whole, at about 18 bytes of memory
	// a byte of JSON (a 47 MB document of a million units peaks near
	// 850 MB), so this bounds a run near 1.2 GB; large tables belong in
	// CSV, which is read as it streams.
	MaxJSONBytes = 64 << 20
	// MaxRecordBytes is the longest CSV record (a row, with any line
	// breaks inside its quoted fields).
	MaxRecordBytes = 1 << 20
)

// A Kind is what the start of an input says it is.
type Kind uint8

const (
	// CSV is anything that is not JSON: a table.
	CSV Kind = iota
	// JSON is a JSON object.
	JSON
)

// sniffBytes is how much of an input Sniff looks at.
const sniffBytes = 4096

// Sniff looks at the start of an input, without consuming it, and says
// whether it is a JSON object or a CSV table. It refuses, naming the file
// and line, what neither reader could read sensibly: UTF-16 and UTF-32
// text (say so, and that UTF-8 is wanted), a JSON array (a scenario is an
// object), and NUL bytes (not text).
func Sniff(file string, br *bufio.Reader) (Kind, error) {
	head, err := br.Peek(sniffBytes)
	if err != nil && err != io.EOF && err != bufio.ErrBufferFull {
		return CSV, &Error{File: file, Msg: "cannot read: " + err.Error()}
	}
	if msg := wideText(head); msg != "" {
		return CSV, &Error{File: file, Line: 1, Msg: msg + "; save it as UTF-8 text (in a spreadsheet: CSV UTF-8)"}
	}
	if k := bytes.IndexByte(head, 0); k >= 0 {
		return CSV, &Error{File: file, Line: 1 + bytes.Count(head[:k], []byte{'\n'}),
			Msg: "holds a NUL byte (byte " + strconv.Itoa(k+1) + "): this is not a text file; give a CSV table or a JSON scenario"}
	}
	body := bytes.TrimPrefix(head, []byte("\xEF\xBB\xBF"))
	trimmed := bytes.TrimLeft(body, " \t\r\n")
	if len(trimmed) == 0 {
		return CSV, nil
	}
	line := 1 + bytes.Count(body[:len(body)-len(trimmed)], []byte{'\n'})
	switch trimmed[0] {
	case '{':
		return JSON, nil
	case '[':
		return CSV, &Error{File: file, Line: line, Msg: "a JSON array; a scenario is a JSON object with a units member, " +
			`such as {"seats": 10, "method": "webster", "units": [{"name": "North", "population": 5200}]}`}
	}
	return CSV, nil
}

// wideText says what the input is when it is UTF-16 or UTF-32 text (by its
// byte-order mark, or by the zero bytes beside ASCII characters that such
// text without a mark shows), or returns "".
func wideText(b []byte) string {
	switch {
	case bytes.HasPrefix(b, []byte{0xFF, 0xFE, 0, 0}), bytes.HasPrefix(b, []byte{0, 0, 0xFE, 0xFF}):
		return "the file is UTF-32 text (it starts with a UTF-32 byte-order mark)"
	case bytes.HasPrefix(b, []byte{0xFF, 0xFE}), bytes.HasPrefix(b, []byte{0xFE, 0xFF}):
		return "the file is UTF-16 text (it starts with a UTF-16 byte-order mark)"
	}
	// Without a mark: ASCII text in UTF-16 has a zero in every other byte.
	n := min(len(b), 64) &^ 1
	if n < 4 {
		return ""
	}
	even, odd := 0, 0
	for i := 0; i < n; i += 2 {
		if b[i] == 0 && b[i+1] != 0 {
			even++
		}
		if b[i+1] == 0 && b[i] != 0 {
			odd++
		}
	}
	if even == n/2 || odd == n/2 {
		return "the file looks like UTF-16 text (a zero byte beside every character)"
	}
	return ""
}

// readLimited reads all of r, refusing more than limit bytes.
func readLimited(file string, r io.Reader, limit int64, what string) ([]byte, error) {
	data, err := io.ReadAll(io.LimitReader(r, limit+1))
	if err != nil {
		return nil, &Error{File: file, Msg: "cannot read: " + err.Error()}
	}
	if int64(len(data)) > limit {
		return nil, &Error{File: file, Msg: what + " is larger than the limit of " + strconv.FormatInt(limit>>20, 10) +
			" MiB; give a large table as CSV, which is read as it streams"}
	}
	return data, nil
}

// ReadLimited reads all of a JSON input, refusing more than
// [MaxJSONBytes] with a message naming the limit.
func ReadLimited(file string, r io.Reader) ([]byte, error) {
	return readLimited(file, r, MaxJSONBytes, "the JSON document")
}
