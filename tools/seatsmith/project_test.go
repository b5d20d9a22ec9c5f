package main

import (
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"seatsmith/engine/format"
	"seatsmith/engine/jsondoc"
)

// demoCounts are the invented dated counts of Vessaria's provinces.
const demoCounts = "testdata/demo/vessaria-counts.csv"

func projectArgs(extra ...string) []string {
	return append([]string{"project", "-seats", "40", "-method", "huntington-hill", "-min", "1"}, extra...)
}

func TestProjectText(t *testing.T) {
	out, errOut, code := cli(t, "", projectArgs("-target", "2030-04-01", "-rse", "2%", "-draws", "3000", demoCounts)...)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, want := range []string{
		"Counts projected to 2030-04-01 by linear growth",
		"Error model: normal, relative standard error 2.00% (own: Orlen 1.50%)",
		"3000 draws, seed 1; 3000 apportioned",
		"Orlen", "Marrowgate",
		"holds the last seat (seat 40):",
		"would take the next seat (41):",
		format.Wrap(format.Caution, 76),
	} {
		if !strings.Contains(out, want) {
			t.Errorf("output lacks %q:\n%s", want, out)
		}
	}
}

// TestProjectJSON checks the document's shape and arithmetic, and that the
// same seed gives the same document whatever the number of workers.
func TestProjectJSON(t *testing.T) {
	args := projectArgs("-target", "2031", "-growth", "geometric", "-error", "lognormal", "-rse", "0.03", "-draws", "2000", "-seed", "5", "-format", "json")
	var docs []string
	for _, w := range []string{"1", "2", "7"} {
		out, errOut, code := cli(t, "", append(args, "-workers", w, demoCounts)...)
		if code != 0 {
			t.Fatalf("exit %d: %s", code, errOut)
		}
		docs = append(docs, out)
	}
	if docs[0] != docs[1] || docs[0] != docs[2] {
		t.Fatal("1, 2 and 7 workers give different documents")
	}
	v, err := jsondoc.Parse([]byte(docs[0]))
	if err != nil {
		t.Fatalf("not JSON: %v", err)
	}
	for key, want := range map[string]string{"kind": "projection", "target": "2031-01-01", "growth": "geometric", "fit": "all", "draws": "2000", "seed": "5", "caution": format.Caution} {
		if got := v.Get(key); got == nil || got.Text != want {
			t.Errorf("%s = %v, want %s", key, got, want)
		}
	}
	if e := v.Get("error"); e.Get("model").Text != "lognormal" || e.Get("rse").Text != "0.03" {
		t.Errorf("error = %s", jsondoc.Marshal(e))
	}
	units := v.Get("units").Items
	if len(units) != 9 {
		t.Fatalf("%d units", len(units))
	}
	num := func(x *jsondoc.Value) int64 {
		n, err := strconv.ParseInt(x.Text, 10, 64)
		if err != nil {
			t.Fatalf("%q is not a whole number", x.Text)
		}
		return n
	}
	apportioned := num(v.Get("apportioned"))
	var lastTotal int64
	for _, u := range units {
		var draws int64
		for _, s := range u.Get("distribution").Items {
			draws += num(s.Get("draws"))
		}
		if draws != apportioned {
			t.Errorf("%s: seat distribution covers %d of %d draws", u.Get("name").Text, draws, apportioned)
		}
		lastTotal += num(u.Get("last_seat").Get("draws"))
		if u.Get("latest_date").Text != "2020-04-01" || u.Get("rate_per_year").Kind != jsondoc.Number {
			t.Errorf("%s: latest_date %v, rate %v", u.Get("name").Text, u.Get("latest_date"), u.Get("rate_per_year"))
		}
	}
	if lastTotal != apportioned {
		t.Errorf("the last seat is held in %d of %d draws", lastTotal, apportioned)
	}
}

func TestProjectCSVAndFile(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "p.csv")
	_, errOut, code := cli(t, "", projectArgs("-rse", "1%", "-draws", "500", "-format", "csv", "-o", out, demoCSV)...)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	b, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(strings.TrimSpace(string(b)), "\n")
	if len(lines) != 10 || !strings.HasPrefix(lines[0], "method,house_size,default_min,default_max,threshold,tie_rule,target,growth,fit,error_model,default_rse,draws,apportioned,seed,"+
		"unit,latest_date,latest,projected,rse,baseline_seats,central_seats,baseline_tied,central_tied,baseline_unassigned,central_unassigned,mean_seats,p_lose,p_gain") {
		t.Fatalf("csv:\n%s", b)
	}
	if !strings.HasPrefix(lines[1], "huntington-hill,40,1,,0,none,,,,normal,0.01,500,500,1,Orlen,,2694457,2694457,0.01,12,12,false,false,0,0,") {
		t.Errorf("first row %q", lines[1])
	}
}

// TestProjectStdinJSON reads dated counts as a JSON document from standard
// input, with the settings in the document.
func TestProjectStdinJSON(t *testing.T) {
	doc := `{"title": "Three districts (invented)", "seats": 7, "method": "webster",
  "units": [
    {"name": "Alder", "counts": [{"date": "2010", "population": 1000}, {"date": "2020", "population": 1300}]},
    {"name": "Birch", "rse": "5%", "counts": [{"date": "2010", "population": 2000}, {"date": "2020", "population": 1900}]},
    {"name": "Cedar", "counts": [{"date": "2010", "population": 900}, {"date": "2020", "population": 1000}]}
  ]}`
	out, errOut, code := cli(t, doc, "project", "-target", "2030", "-rse", "2%", "-draws", "1000", "-")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	// Linear growth through both counts: 1600, 1800 and 1100 in 2030.
	for _, want := range []string{"Projection: Three districts (invented)", "Webster (Sainte-Laguë), 7 seats", "1600", "1800", "1100", "(own: Birch 5.00%)"} {
		if !strings.Contains(out, want) {
			t.Errorf("output lacks %q:\n%s", want, out)
		}
	}
}

func TestProjectErrors(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.csv")
	os.WriteFile(bad, []byte("name,date,population\nA,2010,100\nA,2020,-4\n"), 0o644)
	single := filepath.Join(dir, "single.csv")
	os.WriteFile(single, []byte("name,date,population\nA,2010,100\nA,2020,120\nB,2020,80\n"), 0o644)
	for _, tc := range []struct {
		args []string
		code int
		want string
	}{
		{projectArgs(bad), 1, "bad.csv:3: population: \"A\": \"-4\" is not a population"},
		{projectArgs("-target", "2030", single), 1, "single.csv:4: counts: \"B\": a projection needs at least two dated counts"},
		{projectArgs("-target", "2030-02-30", demoCounts), 2, "-target: \"2030-02-30\" is not a day of the calendar"},
		{projectArgs("-growth", "cubic", demoCounts), 2, "-growth: unknown growth model"},
		{projectArgs("-fit", "some", demoCounts), 2, "-fit: unknown fit"},
		{projectArgs("-error", "uniform", demoCounts), 2, "-error: unknown error model"},
		{projectArgs("-rse", "-1%", demoCounts), 2, "-rse:"},
		{projectArgs("-draws", "0", demoCounts), 2, "-draws: must be between 1"},
		{projectArgs("-contest", "99", demoCounts), 2, "-contest: must be between 0"},
		{projectArgs("-workers", "-2", demoCounts), 2, "-workers: cannot be negative"},
		{[]string{"project", "-seats", "5", demoCounts}, 2, "no method"},
		{[]string{"project", "-method", "webster", demoCounts}, 2, "no house size"},
		{projectArgs("-seats", "3", demoCounts), 1, "min: the minimums add up to 9 seats"},
		{[]string{"project", "-seats", "3", "-method", "adams", demoCounts}, 1, "Adams gives every unit with people a seat"},
		{projectArgs(filepath.Join(dir, "missing.csv")), 1, "missing.csv: cannot read"},
		{projectArgs(), 2, "expected one FILE argument"},
	} {
		_, errOut, code := cli(t, "", tc.args...)
		if code != tc.code || !strings.Contains(errOut, tc.want) {
			t.Errorf("%v: exit %d, %q; want exit %d with %q", tc.args, code, errOut, tc.code, tc.want)
		}
	}
}

// TestProjectKeepsOutputOnError checks that a failed run leaves an
// existing output file as it was.
func TestProjectKeepsOutputOnError(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "keep.json")
	os.WriteFile(out, []byte("earlier result\n"), 0o644)
	_, _, code := cli(t, "", projectArgs("-target", "2030", "-o", out, demoCSV)...)
	if code != 1 {
		t.Fatalf("exit %d, want 1", code)
	}
	if b, _ := os.ReadFile(out); string(b) != "earlier result\n" {
		t.Errorf("output file changed to %q", b)
	}
}

func TestProjectHelp(t *testing.T) {
	out, _, code := cli(t, "", "project", "-h")
	if code != 0 {
		t.Fatalf("exit %d", code)
	}
	for _, want := range []string{"Usage: seatsmith project", "Examples:", "-target", "-rse", "-draws", "-seed", "-workers", "-growth", "-error", format.Wrap(format.Caution, 76)} {
		if !strings.Contains(out, want) {
			t.Errorf("help lacks %q", want)
		}
	}
	// Every example runs.
	for _, line := range strings.Split(out, "\n") {
		line = strings.TrimSpace(line)
		if !strings.HasPrefix(line, "seatsmith project ") || strings.Contains(line, "counts.json") {
			continue
		}
		args := strings.Fields(line)[1:]
		if _, errOut, code := cli(t, "", args...); code != 0 {
			t.Errorf("example %q: exit %d: %s", line, code, errOut)
		}
	}
}

// TestProjectTieExit: a tie in the apportionment of the counts that no
// rule settles exits with status 3.
func TestProjectTieExit(t *testing.T) {
	_, errOut, code := cli(t, "name,population\nA,100\nB,100\n", "project", "-seats", "3", "-method", "webster", "-")
	if code != 3 || !strings.Contains(errOut, "tie") {
		t.Errorf("exit %d: %s", code, errOut)
	}
	_, errOut, code = cli(t, "name,population\nA,100\nB,100\n", "project", "-seats", "3", "-method", "webster", "-tiebreak", "lot:3", "-rse", "1%", "-draws", "200", "-")
	if code != 0 {
		t.Errorf("settled tie: exit %d: %s", code, errOut)
	}
}
