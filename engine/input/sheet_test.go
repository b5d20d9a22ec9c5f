package input

import (
	"errors"
	"strconv"
	"strings"
	"testing"
	"unicode/utf16"

	"seatsmith/engine"
)

// unitsText writes units as name=count[/min/max] for compact comparison.
func unitsText(us []engine.Unit) string {
	var b strings.Builder
	for i, u := range us {
		if i > 0 {
			b.WriteString(" ")
		}
		b.WriteString(u.Name + "=" + u.Population.String())
		if u.Min != nil {
			b.WriteString("/min" + strconv.Itoa(*u.Min))
		}
		if u.Max != nil {
			b.WriteString("/max" + strconv.Itoa(*u.Max))
		}
	}
	return b.String()
}

func TestReadSheet(t *testing.T) {
	tests := []struct {
		name, text string
		sep        byte
		header     bool
		want       string
	}{
		{"spreadsheet paste with header", "School\tStudents\nAshgrove\t1234\nBellmoor\t567\n", '\t', true,
			"Ashgrove=1234 Bellmoor=567"},
		{"spreadsheet paste without header", "Ashgrove\t1,234,567\r\nBellmoor\t567\r\n", '\t', false,
			"Ashgrove=1234567 Bellmoor=567"},
		{"semicolon file with decimal comma", "name;votes\nRed list;1.234.567\nBlue list;12,5\n", ';', true,
			"Red list=1234567 Blue list=12.5"},
		{"comma file with quoted thousands", "state,pop\nNorth,\"1,234,567\"\nSouth,\"2,000\"\n", ',', true,
			"North=1234567 South=2000"},
		{"plain CSV", "name,population,min,max\nNorth,5200,1,9\nSouth,3900,,\n", ',', true,
			"North=5200/min1/max9 South=3900"},
		{"space and apostrophe groups", "n\tp\nA\t1 234 567\nB\t2'345\nC\t3\u00a0000\n", '\t', true,
			"A=1234567 B=2345 C=3000"},
		{"quoted names holding separators", "name;count\n\"Upper; Lower\";10\n\"The \"\"Old\"\" Ward\";20\n", ';', true,
			"Upper; Lower=10 The \"Old\" Ward=20"},
		{"blank lines and trailing spaces", "\n name , population \n\n North , 10 \nSouth,20\n\n", ',', true,
			"North=10 South=20"},
		{"point thousands decided by a three-group number", "a;b\nX;1.234\nY;1.234.567\n", ';', true,
			"X=1234 Y=1234567"},
		{"decimal point decided by a one-digit fraction", "a\tb\nX\t1,234\nY\t12.5\n", '\t', true,
			"X=1234 Y=12.5"},
		{"utf-8 byte order mark", "\uFEFFname,population\nA,1\nB,2\n", ',', true, "A=1 B=2"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			s, err := ReadSheet(tc.text)
			if err != nil {
				t.Fatal(err)
			}
			if s.Sep != tc.sep {
				t.Errorf("separator %q, want %q", s.Sep, tc.sep)
			}
			if (s.Header != nil) != tc.header {
				t.Errorf("header %q, want header: %v", s.Header, tc.header)
			}
			us, err := s.Units(s.GuessColumns())
			if err != nil {
				t.Fatal(err)
			}
			if got := unitsText(us); got != tc.want {
				t.Errorf("units %s, want %s", got, tc.want)
			}
		})
	}
}

func TestReadSheetUTF16(t *testing.T) {
	text := "name\tvotes\r\nCafé list\t1 000\r\n"
	u := utf16.Encode([]rune(text))
	b := []byte{0xFF, 0xFE}
	for _, x := range u {
		b = append(b, byte(x), byte(x>>8))
	}
	s, err := ReadSheet(string(b))
	if err != nil {
		t.Fatal(err)
	}
	us, err := s.Units(s.GuessColumns())
	if err != nil {
		t.Fatal(err)
	}
	if got := unitsText(us); got != "Café list=1000" {
		t.Errorf("got %s", got)
	}
}

func TestGuessColumns(t *testing.T) {
	tests := []struct {
		text string
		want Columns
	}{
		{"Votes,Party\n10,Red\n20,Blue\n", Columns{Name: 1, Count: 0, Min: -1, Max: -1}},
		{"id,district,population,cap,floor\n1,North,10,5,1\n2,South,20,6,1\n", Columns{Name: 1, Count: 2, Min: 4, Max: 3}},
		{"code,region,people\nN1,North,10\nS1,South,20\n", Columns{Name: 1, Count: 2, Min: -1, Max: -1}},
		// No header: the first text column and the first number column.
		{"7;North;10\n8;South;20\n", Columns{Name: 1, Count: 0, Min: -1, Max: -1}},
		// Headers the words do not cover fall back to the columns' content.
		{"Kreis\tEinwohner\nNorth\t10\nSouth\t20\n", Columns{Name: 0, Count: 1, Min: -1, Max: -1}},
	}
	for _, tc := range tests {
		s, err := ReadSheet(tc.text)
		if err != nil {
			t.Fatalf("%q: %v", tc.text, err)
		}
		if got := s.GuessColumns(); got != tc.want {
			t.Errorf("%q: guessed %+v, want %+v", tc.text, got, tc.want)
		}
	}
}

func TestSheetErrors(t *testing.T) {
	tests := []struct {
		text string
		cols *Columns
		line int
		want string
	}{
		{"name\tcount\nA\t1,234\nB\t5,678\n", nil, 2, `could be 1234 or 1.234`},
		{"name\tcount\nA\t1,234.5\nB\t5.678,5\n", nil, 2, `two styles`},
		{"name,count\nA,-5\nB,6\n", nil, 2, `cannot be negative`},
		{"name,count\nA,12abc\nB,6\n", nil, 2, `is not a population`},
		{"name,count\n,5\nB,6\n", nil, 2, `name "name" (column 1): empty`},
		{"name,count\nA,\"5\nB,6\n", nil, 2, `never closed`},
		{"just one column\nA\nB\n", nil, 1, `found no columns`},
		{"name,count,max\nA,5,x\nB,6,1\n", nil, 2, `not a whole number of seats`},
		{"name,count\nA,5\n", &Columns{Name: 0, Count: -1, Min: -1, Max: -1}, 0, `choose the column that holds the count`},
		{"name,count\nA,5\n", &Columns{Name: 0, Count: 7, Min: -1, Max: -1}, 0, `no column 8`},
		{"a,b\nx\x00,1\n", nil, 2, `NUL`},
	}
	for _, tc := range tests {
		s, err := ReadSheet(tc.text)
		if err == nil {
			c := s.GuessColumns()
			if tc.cols != nil {
				c = *tc.cols
			}
			_, err = s.Units(c)
		}
		var ie *Error
		if !errors.As(err, &ie) {
			t.Errorf("%q: error %v, want an *Error", tc.text, err)
			continue
		}
		if ie.Line != tc.line || !strings.Contains(ie.Error(), tc.want) {
			t.Errorf("%q: error %q at line %d, want %q at line %d", tc.text, ie.Error(), ie.Line, tc.want, tc.line)
		}
	}
}

func FuzzReadSheet(f *testing.F) {
	for _, s := range []string{"a\tb\nx\t1\n", "a;b\nx;1.234,5\n", "a,b\n\"x,y\",\"1,234\"\n", "\xff\xfe1\x00"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, text string) {
		s, err := ReadSheet(text)
		if err != nil {
			return
		}
		w := len(s.Rows[0])
		for _, r := range s.Rows {
			if len(r) != w {
				t.Fatalf("ragged rows")
			}
		}
		if us, err := s.Units(s.GuessColumns()); err == nil && len(us) != len(s.Rows) {
			t.Fatalf("%d units from %d rows", len(us), len(s.Rows))
		}
	})
}
