package input

import (
	"bytes"
	"errors"
	"io"
	"strings"
	"testing"

	"golang.org/x/text/unicode/norm"
)

// TestRefusesWhatIsNotATable: inputs that are not UTF-8 text, or are a
// JSON array, are refused with a message that says what they are, naming
// the file and line.
func TestRefusesWhatIsNotATable(t *testing.T) {
	utf16 := func(s string, bom bool) string {
		var b []byte
		if bom {
			b = append(b, 0xFF, 0xFE)
		}
		for _, r := range s {
			b = append(b, byte(r), 0)
		}
		return string(b)
	}
	for _, tc := range []struct{ name, in, want string }{
		{"json array", "\n  [{\"name\": \"A\", \"population\": 5}]", "units.csv:2: a JSON array; a scenario is a JSON object"},
		{"utf-16 with a mark", utf16("name,population\nA,5\n", true), "units.csv:1: the file is UTF-16 text (it starts with a UTF-16 byte-order mark); save it as UTF-8"},
		{"utf-16 without a mark", utf16("name,population\nA,5\n", false), "units.csv:1: the file looks like UTF-16 text"},
		{"utf-32", "\xFF\xFE\x00\x00n\x00\x00\x00", "UTF-32 text"},
		{"zeros", "\x00\x00\x00\x00\x00\x00", "units.csv:1: holds a NUL byte (byte 1): this is not a text file"},
		{"nul in a name", "name,population\nA\x00B,5\n", "units.csv:2: holds a NUL byte"},
		{"bad utf-8 in a name", "name,population\nCaf\xe9,5\n", "units.csv:2: name: the text is not UTF-8 text (byte 4 is 0xe9); save the file as UTF-8"},
		{"bad utf-8 in the header", "name,popul\xe9tion\nA,5\n", "units.csv:1: column 2: the text is not UTF-8 text"},
		{"nul escaped in json", `{"units": [{"name": "A\u0000", "population": 5}]}`, "units.csv:1: units[0].name: the text holds a NUL byte"},
		{"threshold too precise", `{"threshold": "0.0000000001", "units": [{"name": "A", "population": 5}]}`, "has more than 9 decimal places; a threshold takes at most 9 (7 in a percentage)"},
		{"percent too precise", `{"threshold": "0.00000001%", "units": [{"name": "A", "population": 5}]}`, "has more than 7 decimal places; a percentage takes at most 7"},
		{"negative threshold", `{"threshold": "-5%", "units": [{"name": "A", "population": 5}]}`, "is negative; a threshold is a share from 0 to 1"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Read("units.csv", strings.NewReader(tc.in))
			var ie *Error
			if !errors.As(err, &ie) || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error = %v, want an *Error containing %q", err, tc.want)
			}
		})
	}
}

// endless is an input that never ends: zero bytes, or one character
// without a line break.
type endless byte

func (e endless) Read(p []byte) (int, error) {
	for i := range p {
		p[i] = byte(e)
	}
	return len(p), nil
}

// TestEndlessInputIsRefused: an endless input (like /dev/zero) is refused
// after reading at most a record's length, not read into memory.
func TestEndlessInputIsRefused(t *testing.T) {
	for _, in := range []io.Reader{endless(0), io.MultiReader(strings.NewReader("name,population\nA,"), endless('7')), endless('x')} {
		_, err := Read("endless", in)
		if err == nil {
			t.Fatal("an endless input was read")
		}
		if !strings.Contains(err.Error(), "NUL") && !strings.Contains(err.Error(), "longer than 1 MiB") {
			t.Errorf("error = %v", err)
		}
	}
	_, err := readLimited("big.json", endless(' '), 3<<20, "the JSON document")
	if err == nil || err.Error() != "big.json: the JSON document is larger than the limit of 3 MiB; give a large table as CSV, which is read as it streams" {
		t.Errorf("error = %v", err)
	}
}

// TestNamesInNormalForm: with a name form, "Café" written composed and
// decomposed is one name, in CSV and JSON; the message says why.
func TestNamesInNormalForm(t *testing.T) {
	composed, decomposed := "Caf\u00e9", "Cafe\u0301"
	opt := Options{NameForm: norm.NFC.String}
	src, err := opt.Read("u.csv", strings.NewReader("name,population\n"+decomposed+",5\nMill,3\n"))
	if err != nil {
		t.Fatal(err)
	}
	if got := src.Scenario.Units[0].Name; got != composed {
		t.Errorf("name = %q, want %q", got, composed)
	}
	for _, in := range []string{
		"name,population\n" + composed + ",5\n" + decomposed + ",3\n",
		"{\"units\": [\n{\"name\": \"" + composed + "\", \"population\": 5},\n{\"name\": \"" + decomposed + "\", \"population\": 3}]}",
	} {
		_, err := opt.Read("u.csv", strings.NewReader(in))
		if err == nil || !strings.Contains(err.Error(), "u.csv:3: ") || !strings.Contains(err.Error(), "name: \"Café\": the same name as unit 1 (line 2), written with other Unicode characters") {
			t.Errorf("error = %v", err)
		}
	}
	// Without a name form the two are different units, as written.
	src, err = Read("u.csv", strings.NewReader("name,population\n"+composed+",5\n"+decomposed+",3\n"))
	if err != nil || len(src.Scenario.Units) != 2 {
		t.Errorf("without a form: %v", err)
	}
}

func TestSniffLeavesTheInput(t *testing.T) {
	in := "\ufeff  {\"units\": [{\"name\": \"A\", \"population\": 5}]}"
	src, err := Read("x", bytes.NewReader([]byte(in)))
	if err != nil || src.Scenario.Units[0].Name != "A" {
		t.Fatalf("%v", err)
	}
}
