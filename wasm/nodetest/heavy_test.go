//go:build !js

package nodetest

import (
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"seatsmith/engine/jsondoc"
	"seatsmith/wasm/wasmbuild"
)

// A heavyCase is a request at or beyond the API's limits, made in
// JavaScript, and what must come back: a document of some kind, or an
// error value whose message names a limit.
type heavyCase struct {
	name, fn, js string
	kind         string // the document's kind, when it must succeed
	limit        string // the limits() key the error names, when it must fail
}

// unitsJS is a JavaScript expression for n units with invented names and
// populations.
func unitsJS(n string) string {
	return `Array.from({length: ` + n + `}, (_, i) => ({name: "U" + i, population: 1000 + (i * 7919) % 100000}))`
}

// electionJS is a JavaScript expression for an election block's document
// as JSON text: d districts of seats seats each, p parties standing in
// every district with invented votes.
func electionJS(d, p, seats int) string {
	return `JSON.stringify({compensatory: 10, districts: Array.from({length: ` + strconv.Itoa(d) + `}, (_, i) => ({name: "D" + i, seats: ` + strconv.Itoa(seats) + `})),
 votes: Array.from({length: ` + strconv.Itoa(d*p) + `}, (_, k) => ({district: "D" + Math.floor(k / ` + strconv.Itoa(p) + `), party: "P" + (k % ` + strconv.Itoa(p) + `), votes: 1000 + (k * 7919) % 100000}))})`
}

// The heavy requests a page could send: each returns a result or an error
// value naming the limit it is beyond, and the engine answers the next
// call. No timing is asserted; the times are logged.
func TestHeavyRequestsUnderNode(t *testing.T) {
	calc := []heavyCase{
		{"100,000 units by Hamilton", "allot", `[{seats: 100000, method: "hamilton", units: ` + unitsJS("100000") + `}]`, "allotment", ""},
		{"100,000 units by Huntington–Hill", "allot", `[{seats: 100000, method: "huntington-hill", units: ` + unitsJS("100000") + `}]`, "allotment", ""},
		{"Hamilton with margins at 2,000 units", "allot", `[{seats: 4000, method: "hamilton", units: ` + unitsJS("2000") + `}, {margins: true}]`, "allotment", ""},
		{"Hamilton with margins at 20,000 units", "allot", `[{seats: 40000, method: "hamilton", units: ` + unitsJS("20000") + `}, {margins: true}]`, "allotment", ""},
		{"Hamilton with minimums, margins at 2,000 units", "allot", `[{seats: 4000, method: "hamilton", min: 1, units: ` + unitsJS("2000") + `}, {margins: true}]`, "", "searched_margin_units"},
		{"Huntington–Hill with margins at 100,000 units", "allot", `[{seats: 100000, method: "huntington-hill", units: ` + unitsJS("100000") + `}, {margins: true}]`, "", "margin_units"},
		{"100,001 units", "allot", `[{seats: 100000, method: "webster", units: ` + unitsJS("100001") + `}]`, "", "units"},
		{"a name of 10^6 characters", "allot", `[{seats: 10, method: "webster", units: [{name: "x".repeat(1e6), population: 5}, {name: "B", population: 7}]}]`, "", "name_length"},
		{"comparing 20,000 units", "compare", `[{seats: 100000, units: ` + unitsJS("20000") + `}]`, "comparison", ""},
		{"a table of 100,000 rows", "readCSV", `["name,population\n" + Array.from({length: 100000}, (_, i) => "U" + i + "," + (1000 + i)).join("\n")]`, "", ""},
		{"a calculator block of 5,001 units", "calculator", `[{block_text: JSON.stringify({seats: 10, method: "hamilton", units: ` + unitsJS("5001") + `})}]`, "", ""},
	}
	analysis := []heavyCase{
		{"a sweep with a name of 10^6 characters", "sweep", `[{from: 1, to: 400, units: [{name: "x".repeat(1e6), population: 5}, {name: "B", population: 7}]}]`, "", "name_length"},
		{"a sweep of 10^6 results", "sweep", `[{from: 1, to: 100, methods: ["hamilton"], units: ` + unitsJS("10000") + `}]`, "sweep", ""},
		{"a sweep beyond 10^6 results", "sweep", `[{from: 1, to: 101, units: ` + unitsJS("10000") + `}]`, "", "sweep_cells"},
		{"an election of 60 districts and 20 parties", "election", `[{doc: ` + electionJS(60, 20, 80) + `}]`, "", ""},
		{"an election of 61 districts", "election", `[{doc: ` + electionJS(61, 2, 1) + `}]`, "", "election_districts"},
		{"an election of 21 parties", "election", `[{doc: ` + electionJS(2, 21, 1) + `}]`, "", "election_parties"},
		{"an election of 5,050 seats", "election", `[{doc: ` + electionJS(60, 2, 84) + `}]`, "", "election_seats"},
	}
	dir, node := modules(t)
	runHeavy(t, node, dir, wasmbuild.Calculator.File, calc)
	runHeavy(t, node, dir, wasmbuild.Analysis.File, analysis)
}

func runHeavy(t *testing.T, node, dir, module string, cases []heavyCase) {
	t.Helper()
	arr := jsondoc.NewArray()
	next := jsondoc.NewObject().Set("fn", jsondoc.Str("methods")).Set("js", jsondoc.Str("[]"))
	for _, c := range cases {
		arr.Append(jsondoc.NewObject().Set("fn", jsondoc.Str(c.fn)).Set("js", jsondoc.Str(c.js)).Set("summary", jsondoc.Boolean(true)), next)
	}
	tmp := t.TempDir()
	casesPath, outPath := filepath.Join(tmp, "cases.json"), filepath.Join(tmp, "out.ndjson")
	if err := os.WriteFile(casesPath, jsondoc.Marshal(arr), 0o644); err != nil {
		t.Fatal(err)
	}
	cmd := exec.Command(node, "--stack-size=8192", filepath.Join("testdata", "harness.js"), execJS(dir), filepath.Join(dir, module), casesPath, outPath)
	if msg, err := cmd.CombinedOutput(); err != nil {
		t.Fatalf("node: %v\n%s", err, msg)
	}
	lines := readLines(t, outPath)
	if len(lines) != 2*len(cases)+2 {
		t.Fatalf("%s: the harness wrote %d lines for %d calls", module, len(lines), 2*len(cases))
	}
	for i, c := range cases {
		got, after := lines[1+2*i], lines[2+2*i]
		if th := got.Get("threw"); th != nil {
			t.Errorf("%s threw: %s", c.name, th.Text)
		}
		if got.Get("exited") != nil || after.Get("exited") != nil {
			t.Fatalf("%s: the Go program stopped", c.name)
		}
		if r := after.Get("result"); r == nil || r.Kind != jsondoc.Array || len(r.Items) == 0 {
			t.Errorf("after %s the engine did not answer methods(): %s", c.name, jsondoc.Marshal(after))
		}
		r := got.Get("result")
		t.Logf("%s: %s ms: %s", c.name, got.Get("ms").Text, clip(string(jsondoc.Marshal(r))))
		if r == nil || r.Kind != jsondoc.Object {
			t.Errorf("%s: no document: %s", c.name, jsondoc.Marshal(got))
			continue
		}
		e := r.Get("error")
		switch {
		case c.kind != "":
			if k := r.Get("kind"); e != nil && !e.IsNull() || k == nil || k.Text != c.kind {
				t.Errorf("%s: want a %s document, got %s", c.name, c.kind, jsondoc.Marshal(r))
			}
		case c.limit != "":
			if e == nil || e.IsNull() || !strings.Contains(e.Get("message").Text, "limits()."+c.limit) {
				t.Errorf("%s: want an error naming limits().%s, got %s", c.name, c.limit, jsondoc.Marshal(r))
			}
		}
	}
}
