package main

import (
	"encoding/xml"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"seatsmith/engine/format"
	"seatsmith/engine/jsondoc"
)

// textbookCSV is the worked example of the Alabama paradox in Tannenbaum,
// Excursions in Modern Mathematics (figures from memory, checked by hand
// in engine/analysis): Hamilton gives A 10 seats in a house of 200 and 9
// in a house of 201.
const textbookCSV = "name,population\nA,940\nB,9030\nC,10030\n"

func parseJSON(t *testing.T, out string) *jsondoc.Value {
	t.Helper()
	v, err := jsondoc.Parse([]byte(out))
	if err != nil {
		t.Fatalf("output is not JSON: %v\n%s", err, out)
	}
	return v
}

func TestSweepJSON(t *testing.T) {
	out, errOut, code := cli(t, textbookCSV, "sweep", "-method", "hamilton", "-from", "199", "-to", "202", "-format", "json", "-")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	v := parseJSON(t, out)
	sizes := v.Get("sizes").Items
	if len(sizes) != 4 {
		t.Fatalf("%d sizes, want 4", len(sizes))
	}
	want := map[string][]string{"199": {"9", "90", "100"}, "200": {"10", "90", "100"}, "201": {"9", "91", "101"}}
	for _, z := range sizes {
		if z.Get("seats") == nil || len(z.Get("units").Items) != 3 {
			t.Fatalf("size %s", jsondoc.Marshal(z))
		}
		if w, ok := want[z.Get("seats").Text]; ok {
			for i, u := range z.Get("units").Items {
				if u.Get("name").Text != []string{"A", "B", "C"}[i] || u.Get("seats").Text != w[i] {
					t.Errorf("house %s: %s", z.Get("seats").Text, jsondoc.Marshal(z.Get("units")))
				}
			}
		}
	}
	ps := v.Get("paradoxes").Items
	if len(ps) != 1 {
		t.Fatalf("paradoxes %s", jsondoc.Marshal(v.Get("paradoxes")))
	}
	p := ps[0]
	if p.Get("kind").Text != "alabama" || p.Get("unit").Text != "A" || p.Get("from").Text != "200" || p.Get("to").Text != "201" {
		t.Errorf("paradox %s", jsondoc.Marshal(p))
	}
}

func TestSweepAllMethods(t *testing.T) {
	for _, args := range [][]string{{"sweep", "-method", "all"}, {"sweep"}} {
		out, errOut, code := cli(t, "", append(args, "-from", "9", "-to", "12", "-format", "json", demoCSV)...)
		if code != 0 {
			t.Fatalf("exit %d: %s", code, errOut)
		}
		v := parseJSON(t, out)
		if n := len(v.Get("methods").Items); n != 8 {
			t.Errorf("%d methods, want 8", n)
		}
		if n := len(v.Get("sizes").Items); n != 8*4 {
			t.Errorf("%d sizes, want 32", n)
		}
	}
	// -to defaults to the file's house size.
	out, errOut, code := cli(t, "", "sweep", "-method", "webster", "-from", "38", "-format", "csv", demoJSON)
	if code != 0 || !strings.Contains(out, "webster,40,") || strings.Contains(out, "webster,41,") {
		t.Errorf("exit %d: %s\n%s", code, errOut, out)
	}
}

func TestSweepSVG(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "chart.svg")
	_, errOut, code := cli(t, textbookCSV, "sweep", "-method", "hamilton,webster", "-from", "190", "-to", "210", "-format", "svg", "-o", file, "-")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	data, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	d := xml.NewDecoder(strings.NewReader(string(data)))
	for {
		_, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("not well-formed SVG: %v", err)
		}
	}
	if !strings.Contains(string(data), "<circle") {
		t.Error("no Alabama paradox marked")
	}
}

func TestSweepTieExit(t *testing.T) {
	out, _, code := cli(t, "name,population\nA,500\nB,500\n", "sweep", "-method", "webster", "-from", "1", "-to", "4", "-")
	if code != exitTie || !strings.Contains(out, "A, B tie at 1000 for 1 seat: left unassigned") {
		t.Errorf("exit %d, want %d:\n%s", code, exitTie, out)
	}
	out, _, code = cli(t, "name,population\nA,500\nB,500\n", "sweep", "-method", "webster", "-tiebreak", "order", "-from", "1", "-to", "4", "-")
	if code != 0 || !strings.Contains(out, "settled by input order for A") {
		t.Errorf("exit %d:\n%s", code, out)
	}
}

func TestAnalysisHelp(t *testing.T) {
	for _, c := range []string{"sweep", "paradox", "growth", "admit", "diff", "measure", "house", "derived", "bias"} {
		out, _, code := cli(t, "", c, "-h")
		if code != 0 {
			t.Errorf("%s -h: exit %d", c, code)
		}
		for _, want := range []string{"Usage: seatsmith " + c, "Examples:", "seatsmith " + c + " ", "Exit status:", format.Wrap(format.Caution, 76)} {
			if !strings.Contains(out, want) {
				t.Errorf("%s -h lacks %q", c, want)
			}
		}
		if out, _, _ := cli(t, "", "help"); !strings.Contains(out, "  "+c+" ") {
			t.Errorf("help does not list %s", c)
		}
	}
}

func TestAnalysisBadInput(t *testing.T) {
	for _, c := range []struct {
		stdin string
		args  []string
		code  int
		want  string
	}{
		{"", []string{"sweep", "-from", "0", "-to", "5", demoCSV}, exitUsage, "-from"},
		{"", []string{"sweep", "-from", "9", "-to", "5", demoCSV}, exitUsage, "-to"},
		{"", []string{"sweep", "-method", "fastest", "-to", "5", demoCSV}, exitUsage, "unknown method"},
		{"", []string{"sweep", "-format", "pdf", "-to", "5", demoCSV}, exitUsage, "-format"},
		{"", []string{"sweep", "-to", "5", "no-such-file.csv"}, exitInput, "no-such-file.csv"},
		{"name,population\nA,12\nB,x\n", []string{"sweep", "-to", "5", "-"}, exitInput, "stdin:3"},
		{"", []string{"sweep", "-to", "5", demoCSV}, exitInput, "minimums add up to 9"},
		{"", []string{"sweep", "-from", "1", "-to", "5000000", demoCSV}, exitUsage, "limit"},
		{"", []string{"growth", "-seats", "10", demoCSV}, exitUsage, "BEFORE and AFTER"},
		{"name,population\nOrlen,5\n", []string{"growth", "-seats", "10", demoCSV, "-"}, exitInput, "units"},
		{"", []string{"admit", "-seats", "10", "-population", "5", demoCSV}, exitUsage, "-name"},
		{"", []string{"admit", "-seats", "10", "-name", "Orlen", "-population", "5", demoCSV}, exitUsage, "already a unit"},
		{"", []string{"admit", "-seats", "10", "-name", "X", "-population", "-5", demoCSV}, exitUsage, "-population"},
		{"", []string{"diff", "-seats", "40", demoCSV}, exitUsage, "no method"},
		{"", []string{"diff", "-method", "adams", "-seats", "40", "-new-seats", "3", demoCSV}, exitInput, "proposal"},
		{"", []string{"house", "-rule", "biggest", demoCSV}, exitUsage, "-rule"},
		{"", []string{"house", "-rule", "cube-root", "-seats", "9", demoCSV}, exitUsage, "-seats"},
		{"", []string{"derived", "-seats", "40", "-plus", "-1", "-method", "webster", demoCSV}, exitUsage, "-plus"},
		{"", []string{"bias", "-units", "10", "-seats", "5"}, exitUsage, "house size"},
		{"", []string{"bias", "-spread", "bumpy"}, exitUsage, "-spread"},
		{"", []string{"bias", "extra"}, exitUsage, "no file"},
	} {
		_, errOut, code := cli(t, c.stdin, c.args...)
		if code != c.code || !strings.Contains(errOut, c.want) {
			t.Errorf("%v: exit %d, stderr %q; want exit %d and %q", c.args, code, errOut, c.code, c.want)
		}
	}
}

func TestOutputKeptOnSweepError(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "out.json")
	os.WriteFile(file, []byte("earlier result"), 0o644)
	_, _, code := cli(t, "name,population\nA,x\n", "sweep", "-to", "5", "-o", file, "-")
	if code != exitInput {
		t.Errorf("exit %d", code)
	}
	if data, _ := os.ReadFile(file); string(data) != "earlier result" {
		t.Errorf("output file changed to %q", data)
	}
}
