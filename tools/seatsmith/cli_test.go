package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"seatsmith/engine/format"
	"seatsmith/engine/jsondoc"
)

const demoCSV = "testdata/demo/vessaria.csv"
const demoJSON = "testdata/demo/vessaria.json"

func TestAllotText(t *testing.T) {
	out, errOut, code := cli(t, "", "allot", "-method", "huntington-hill", "-seats", "40", "-min", "1", demoCSV)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, want := range []string{"Huntington–Hill, 40 seats, population 8200567", "Orlen", "Divisor range:", "Next seats beyond the house size:", format.Wrap(format.Caution, 76)} {
		if !strings.Contains(out, want) {
			t.Errorf("output lacks %q:\n%s", want, out)
		}
	}
}

func TestAllotJSON(t *testing.T) {
	out, errOut, code := cli(t, "", "allot", "-format", "json", demoJSON)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	v, err := jsondoc.Parse([]byte(out))
	if err != nil {
		t.Fatalf("output is not JSON: %v\n%s", err, out)
	}
	if v.Get("method").Text != "huntington-hill" || v.Get("seats").Text != "40" {
		t.Errorf("method/seats = %s/%s", v.Get("method").Text, v.Get("seats").Text)
	}
	if ties := v.Get("ties"); ties == nil || ties.Kind != jsondoc.Array || len(ties.Items) != 0 {
		t.Errorf("ties = %v, want an empty array", ties)
	}
	units := v.Get("units").Items
	if len(units) != 9 {
		t.Fatalf("%d units, want 9", len(units))
	}
	total := 0
	for _, u := range units {
		for _, k := range []string{"name", "seats", "quota", "gain_margin", "lose_margin"} {
			if u.Get(k) == nil {
				t.Errorf("unit lacks %q", k)
			}
		}
		n := 0
		for _, c := range u.Get("seats").Text {
			n = n*10 + int(c-'0')
		}
		total += n
	}
	if total != 40 {
		t.Errorf("seats sum to %d, want 40", total)
	}
	// A unit at its minimum of one seat cannot lose it: null, not a number.
	last := units[len(units)-1]
	if last.Get("name").Text != "Marrowgate" || !last.Get("lose_margin").IsNull() {
		t.Errorf("Marrowgate lose_margin = %v, want null", last.Get("lose_margin"))
	}
}

func TestCompareFormats(t *testing.T) {
	for _, format := range []string{"text", "json", "csv", "markdown"} {
		out, errOut, code := cli(t, "", "compare", "-format", format, demoJSON)
		if code != 0 {
			t.Fatalf("%s: exit %d: %s", format, code, errOut)
		}
		if !strings.Contains(out, "Orlen") {
			t.Errorf("%s output lacks the units:\n%s", format, out)
		}
		if format == "json" {
			v, err := jsondoc.Parse([]byte(out))
			if err != nil {
				t.Fatal(err)
			}
			if got := len(v.Get("methods").Items); got != 8 {
				t.Errorf("%d methods compared, want 8", got)
			}
		}
	}
	out, _, _ := cli(t, "", "compare", demoJSON)
	if !strings.Contains(out, "!12") || !strings.Contains(out, "adams: breaks quota for 2 units") {
		t.Errorf("compare does not mark the quota breaks of the demo:\n%s", out)
	}
}

func TestStdin(t *testing.T) {
	out, errOut, code := cli(t, "name,population\nNorth Ward,5000\nSouth Ward,3000\nMill Ward,2000\n", "allot", "-method", "webster", "-seats", "10", "-format", "csv", "-")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if !strings.Contains(out, "webster,10,0,,0,none,North Ward,5000,0,,false,5,5,5,5,true,") {
		t.Errorf("csv output:\n%s", out)
	}
}

func TestHelp(t *testing.T) {
	for _, args := range [][]string{{"help"}, {"allot", "-h"}, {"compare", "-h"}} {
		out, _, code := cli(t, "", args...)
		if code != 0 {
			t.Errorf("%v: exit %d", args, code)
		}
		if !strings.Contains(out, "Not an official apportionment") {
			t.Errorf("%v: help lacks the caution:\n%s", args, out)
		}
		if args[0] != "help" && !strings.Contains(out, "Examples:") {
			t.Errorf("%v: help lacks examples", args)
		}
	}
}

func TestBadInput(t *testing.T) {
	dir := t.TempDir()
	write := func(name, body string) string {
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	neg := write("neg.csv", "name,population\nA,10\nB,-4\n")
	dup := write("dup.csv", "name,population\nA,10\nA,4\n")
	ragged := write("ragged.csv", "name,population\nA,10\nB,4,5\n")
	badjson := write("bad.json", "{\n  \"seats\": 4,\n  \"units\": [\n    {\"name\": \"A\", \"population\": \"ten\"}\n  ]\n}\n")
	for _, tc := range []struct {
		args []string
		code int
		want string
	}{
		{[]string{"allot", "-method", "webster", "-seats", "5", neg}, 1, "neg.csv:3: population: \"B\": \"-4\" is not a population: populations cannot be negative"},
		{[]string{"allot", "-method", "webster", "-seats", "5", dup}, 1, "dup.csv:3: name: \"A\": the same name as unit 1"},
		{[]string{"allot", "-method", "webster", "-seats", "5", ragged}, 1, "ragged.csv:3: row:"},
		{[]string{"allot", "-method", "webster", badjson}, 1, "bad.json:4: units[0].population: \"A\": \"ten\" is not a population"},
		{[]string{"allot", "-method", "webster", "-seats", "5", filepath.Join(dir, "missing.csv")}, 1, "missing.csv: cannot read"},
		{[]string{"allot", "-method", "lottery", "-seats", "5", neg}, 2, "-method: unknown method \"lottery\""},
		{[]string{"allot", "-method", "webster", "-seats", "5", "-format", "xml", neg}, 2, "-format: unknown format"},
		{[]string{"allot", "-method", "webster", neg}, 1, "population"},
		{[]string{"allot", "-method", "webster", "-seats", "2000000000", demoCSV}, 2, "-seats: must be between 1 and"},
		{[]string{"allot", "-method", "adams", "-seats", "5", filepath.Join(repoRoot(t), "testdata", "us-2020-apportionment.csv")}, 1, "unknown column \"seats\""},
		{[]string{"allot", "-method", "adams", "-seats", "2", write("three.csv", "name,population\nA,5\nB,4\nC,3\n")}, 1, "Adams gives every unit with people a seat before any unit gets two"},
		{[]string{"allot", "-method", "webster", "-seats", "5", "-min", "1", "-max", "0", demoCSV}, 1, "the minimums add up to 9 seats, more than the house size 5"},
		{[]string{"allot", "-method", "webster", "-seats", "40", "-max", "3", demoCSV}, 1, "the maximums allow units with people only 27 seats"},
		{[]string{"frobnicate"}, 2, "unknown command"},
		{[]string{"allot", "-method", "webster", "-seats", "5"}, 2, "expected one FILE argument"},
	} {
		_, errOut, code := cli(t, "", tc.args...)
		if code != tc.code || !strings.Contains(errOut, tc.want) {
			t.Errorf("%v: exit %d, stderr %q; want exit %d and %q", tc.args, code, errOut, tc.code, tc.want)
		}
	}
}

func TestTieExitStatus(t *testing.T) {
	// Two equal wards contest the last of three seats.
	in := "name,population\nEast Ward,300\nWest Ward,300\nHill Ward,1000\n"
	out, errOut, code := cli(t, in, "allot", "-method", "jefferson", "-seats", "4", "-")
	if code != 3 {
		t.Fatalf("exit %d, want 3 for an unsettled tie: %s", code, errOut)
	}
	if !strings.Contains(out, "TIE: East Ward, West Ward") || !strings.Contains(out, "tie at 300 for 1 seat: left unassigned") {
		t.Errorf("tie not reported:\n%s", out)
	}
	out, _, code = cli(t, in, "allot", "-method", "jefferson", "-seats", "4", "-tiebreak", "lot:11", "-format", "json", "-")
	if code != 0 {
		t.Fatalf("with a tie rule: exit %d", code)
	}
	v, err := jsondoc.Parse([]byte(out))
	if err != nil {
		t.Fatal(err)
	}
	ties := v.Get("ties").Items
	if len(ties) != 1 || len(ties[0].Get("winners").Items) != 1 || ties[0].Get("rule").Text != "lot:11" {
		t.Errorf("settled tie not reported: %s", out)
	}
	again, _, _ := cli(t, in, "allot", "-method", "jefferson", "-seats", "4", "-tiebreak", "lot:11", "-format", "json", "-")
	if again != out {
		t.Errorf("the same seed drew differently")
	}
}

func TestOutputFileKeptOnError(t *testing.T) {
	dir := t.TempDir()
	dst := filepath.Join(dir, "result.json")
	if err := os.WriteFile(dst, []byte("previous result\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	_, _, code := cli(t, "name,population\nA,-1\n", "allot", "-method", "webster", "-seats", "3", "-o", dst, "-")
	if code != 1 {
		t.Fatalf("exit %d, want 1", code)
	}
	if b, _ := os.ReadFile(dst); string(b) != "previous result\n" {
		t.Errorf("a failed run changed the output file: %q", b)
	}
	_, _, code = cli(t, "", "allot", "-format", "json", "-o", dst, demoJSON)
	if code != 0 {
		t.Fatalf("exit %d", code)
	}
	if b, _ := os.ReadFile(dst); !strings.Contains(string(b), "\"kind\": \"allotment\"") {
		t.Errorf("output file not written: %q", b)
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		t.Errorf("temporary files left behind: %v", entries)
	}
}

// TestCensus2020ThroughCLI runs the published 2020 U.S. apportionment through
// the binary. Source: U.S. Census Bureau, 2020 Census Apportionment Results,
// Table 1 (April 26, 2021): 435 seats by the method of equal proportions,
// every state at least one; New York fell 89 people short of a 27th seat.
func TestCensus2020ThroughCLI(t *testing.T) {
	b, err := os.ReadFile(filepath.Join(repoRoot(t), "testdata", "us-2020-apportionment.csv"))
	if err != nil {
		t.Fatal(err)
	}
	var in strings.Builder
	in.WriteString("name,population\n")
	want := map[string]string{}
	for _, line := range strings.Split(strings.TrimSpace(string(b)), "\n")[1:] {
		f := strings.Split(line, ",")
		in.WriteString(f[0] + "," + f[1] + "\n")
		want[f[0]] = f[2]
	}
	out, errOut, code := cli(t, in.String(), "allot", "-method", "equal-proportions", "-seats", "435", "-min", "1", "-format", "json", "-")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	v, err := jsondoc.Parse([]byte(out))
	if err != nil {
		t.Fatal(err)
	}
	for _, u := range v.Get("units").Items {
		name := u.Get("name").Text
		if got := u.Get("seats").Text; got != want[name] {
			t.Errorf("%s: %s seats, want %s", name, got, want[name])
		}
		if name == "New York" && u.Get("gain_margin").Text != "89" {
			t.Errorf("New York gain margin %s, want 89", u.Get("gain_margin").Text)
		}
	}
}
