package input

import (
	"encoding/csv"
	"errors"
	"io"
	"reflect"
	"strings"
	"testing"
)

// stdRecords reads s with encoding/csv as the readers used it: every record
// as long as the first, a leading byte order mark removed.
func stdRecords(s string) (recs [][]string, lines []int, errLine, errCol int, err error) {
	cr := csv.NewReader(strings.NewReader(strings.TrimPrefix(s, "\uFEFF")))
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			return recs, lines, 0, 0, nil
		}
		if err != nil {
			var pe *csv.ParseError
			if errors.As(err, &pe) {
				return recs, lines, pe.Line, pe.Column, err
			}
			return recs, lines, 0, 0, err
		}
		l, _ := cr.FieldPos(0)
		recs, lines = append(recs, rec), append(lines, l)
	}
}

func ownRecords(s string) (recs [][]string, lines []int, errLine, errCol int, err error) {
	cr := NewCSVReader(strings.NewReader(s))
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			return recs, lines, 0, 0, nil
		}
		if err != nil {
			var ce *CSVError
			if errors.As(err, &ce) {
				return recs, lines, ce.Line, ce.Column, err
			}
			return recs, lines, 0, 0, err
		}
		recs, lines = append(recs, append([]string(nil), rec...)), append(lines, cr.Line())
	}
}

func checkSame(t *testing.T, s string) {
	t.Helper()
	r1, l1, el1, ec1, e1 := stdRecords(s)
	r2, l2, el2, ec2, e2 := ownRecords(s)
	if (e1 == nil) != (e2 == nil) || el1 != el2 || ec1 != ec2 {
		t.Fatalf("%q: errors differ: encoding/csv %v (line %d col %d), reader %v (line %d col %d)", s, e1, el1, ec1, e2, el2, ec2)
	}
	if !reflect.DeepEqual(r1, r2) || !reflect.DeepEqual(l1, l2) {
		t.Fatalf("%q: records differ:\nencoding/csv %q %v\nreader       %q %v", s, r1, l1, r2, l2)
	}
	if e1 != nil && e2 != nil {
		var pe *csv.ParseError
		var ce *CSVError
		if errors.As(e1, &pe) && errors.As(e2, &ce) && pe.Err.Error() != ce.Msg {
			t.Fatalf("%q: message %q, encoding/csv %q", s, ce.Msg, pe.Err.Error())
		}
	}
}

var csvCases = []string{
	"",
	"name,population\n",
	"name,population\nA,1\nB,2\n",
	"name,population\r\nA,1\r\nB,2\r\n",
	"name,population\nA,1\nB,2",
	"name,population\nA,1\r",
	"\uFEFFname,population\nA,1\n",
	"name,population\n\n\nA,1\n\r\n\nB,2\n",
	"name,population\n\"North, East\",1\n",
	"name,population\n\"say \"\"hi\"\"\",1\n",
	"name,population\n\"two\nlines\",1\n",
	"name,population\n\"two\r\nlines\",1\nC,3\n",
	"name,population\n\"\",1\n",
	"name,population\n,\n",
	"name,population\nA,1,extra\n",
	"name,population\nA\n",
	"name,population\nA \"b\",1\n",
	"name,population\n\"A\" b,1\n",
	"name,population\n\"unterminated,1\n",
	"name,population\n\"unterminated,1\nmore\n",
	"a,b\n\"x\"\"\n,y\n",
	"a\rb,c\n",
	"a,b\n\"q\"\r\n",
	"  spaced , fields \n1,2\n",
	"é,ü\n\"ß\",\"日本\"\n",
	"a,b\nc,\"d\n\n\ne\"\nf,g\n",
}

func TestCSVReaderMatchesEncodingCSV(t *testing.T) {
	for _, s := range csvCases {
		checkSame(t, s)
	}
	// A line longer than the buffer.
	long := "name,population\n" + strings.Repeat("x", 200_000) + ",1\n\"" + strings.Repeat("y\n", 50_000) + "\",2\n"
	checkSame(t, long)
}

// TestCSVReaderLines: errors and records name the lines of the file.
func TestCSVReaderLines(t *testing.T) {
	_, err := ReadCSV("units.csv", strings.NewReader("name,population\n\"A\nB\",1\nC,x\"y\n"))
	if err == nil || err.Error() != `units.csv:4: column 4: bare " in non-quoted-field` {
		t.Errorf("error %v", err)
	}
	_, err = ReadCSV("units.csv", strings.NewReader("name,population\r\nA,1\r\n\r\nB,2,3\r\n"))
	if err == nil || err.Error() != "units.csv:4: row: this row has a different number of fields from the header" {
		t.Errorf("error %v", err)
	}
}

func FuzzCSVReader(f *testing.F) {
	for _, s := range csvCases {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		if strings.HasPrefix(s, "\uFEFF\uFEFF") {
			return // encoding/csv is given the text after one mark
		}
		checkSame(t, s)
	})
}
