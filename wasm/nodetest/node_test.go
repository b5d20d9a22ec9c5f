//go:build !js

package nodetest

import (
	"bufio"
	"errors"
	"math"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"testing"
	"time"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/format"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	"seatsmith/wasm/wasmbuild"
)

// browserMaxSeats is the largest house size the WebAssembly API
// apportions (maxSeats in package wasm).
const browserMaxSeats = 100_000

// A testCase is one call of the JavaScript API and what it must return.
type testCase struct {
	name string
	fn   string
	args []*jsondoc.Value // the arguments as JSON, or
	js   string           // a JavaScript expression for the argument array

	// want is the document the call must return; when it is nil the call
	// must return an error object, with this field when checkField is set.
	want       *jsondoc.Value
	field      string
	checkField bool
}

// expect fills in the native result of fn on arg: the document the report
// packages build, or the error the native packages give.
func (c *testCase) expect(t *testing.T, arg *jsondoc.Value) {
	t.Helper()
	doc, err := native(c.fn, arg)
	if err != nil {
		c.want, c.field, c.checkField = nil, errorField(err), true
		return
	}
	c.want = doc
}

func native(fn string, arg *jsondoc.Value) (*jsondoc.Value, error) {
	switch fn {
	case "allot", "compare":
		src, err := input.FromDoc("", arg)
		if err != nil {
			return nil, err
		}
		if src.Scenario.Seats > browserMaxSeats {
			return nil, &input.Error{Field: "seats", Msg: "too large for the browser"}
		}
		if fn == "allot" {
			res, err := engine.Allot(&src.Scenario, engine.Full)
			if err != nil {
				return nil, err
			}
			return format.AllotmentJSON(src.Title, res), nil
		}
		c := analysis.CompareMethods(src.Scenario, nil, 0)
		if c.First() == nil {
			return nil, c.Errors[0]
		}
		return format.ComparisonJSON(src.Title, c), nil
	case "readCSV":
		if arg.Kind != jsondoc.String {
			return nil, &input.Error{Msg: "not a string"}
		}
		src, err := input.ReadCSV("", strings.NewReader(arg.Text))
		if err != nil {
			return nil, err
		}
		units := jsondoc.NewArray()
		for _, u := range src.Scenario.Units {
			x := jsondoc.NewObject().Set("name", jsondoc.Str(u.Name)).Set("population", jsondoc.Str(u.Population.String()))
			if u.Min != nil {
				x.Set("min", jsondoc.Int(*u.Min))
			}
			if u.Max != nil {
				x.Set("max", jsondoc.Int(*u.Max))
			}
			units.Append(x)
		}
		return jsondoc.NewObject().Set("units", units), nil
	case "methods":
		arr := jsondoc.NewArray()
		for _, m := range engine.Methods() {
			arr.Append(jsondoc.NewObject().Set("id", jsondoc.Str(m.String())).Set("name", jsondoc.Str(m.Name())).
				Set("divisor", jsondoc.Boolean(m.IsDivisor())))
		}
		return arr, nil
	}
	panic("no native counterpart for " + fn)
}

// errorField is the field the error object must name for err.
func errorField(err error) string {
	var ie *input.Error
	var ee *engine.Error
	switch {
	case errors.As(err, &ie):
		return ie.Field
	case errors.As(err, &ee):
		if ee.Unit >= 0 {
			f := "units[" + strconv.Itoa(ee.Unit) + "]"
			if ee.Field != "" {
				f += "." + ee.Field
			}
			return f
		}
		return ee.Field
	}
	return ""
}

func mustParse(t *testing.T, s string) *jsondoc.Value {
	t.Helper()
	v, err := jsondoc.Parse([]byte(s))
	if err != nil {
		t.Fatalf("bad test JSON %s: %v", s, err)
	}
	return v
}

// jsonCase is a call whose argument is JSON text; the native packages
// decide what it must return.
func jsonCase(t *testing.T, fn, arg string) testCase {
	t.Helper()
	v := mustParse(t, arg)
	c := testCase{name: fn + "(" + arg + ")", fn: fn, args: []*jsondoc.Value{v}}
	c.expect(t, v)
	return c
}

// jsCase is a call whose arguments JSON cannot hold; it must return an
// error object naming field (any field, or none, when field is "*").
func jsCase(fn, js, field string) testCase {
	return testCase{name: fn + " with " + js, fn: fn, js: js, field: field, checkField: field != "*"}
}

// sameAs is a call whose JavaScript arguments must give what equivalent
// JSON gives.
func sameAs(t *testing.T, fn, js, equiv string) testCase {
	t.Helper()
	c := testCase{name: fn + " with " + js, fn: fn, js: js}
	c.expect(t, mustParse(t, equiv))
	return c
}

const okUnits = `[{"name": "Amber", "population": 5100}, {"name": "Birch", "population": 3000}, {"name": "Cedar", "population": 1900}]`

// badCases are calls that must return error objects (and a few oddly
// written good ones).
func badCases(t *testing.T) []testCase {
	withUnits := func(members string) string {
		return `{"seats": 10, "method": "webster", ` + members + `}`
	}
	unit := func(members string) string {
		return `{"seats": 10, "method": "webster", "units": [` + members + `, {"name": "Birch", "population": 3000}]}`
	}
	js := func(expr string) string { return expr } // readability
	ok := `{seats: 5, method: "jefferson", units: ` + okUnits + `}`
	okJSON := `{"seats": 5, "method": "jefferson", "units": ` + okUnits + `}`
	cs := []testCase{
		// Missing or wrongly typed scenarios.
		jsonCase(t, "allot", `null`), jsonCase(t, "allot", `42`), jsonCase(t, "allot", `"webster"`),
		jsonCase(t, "allot", `[1, 2]`), jsonCase(t, "allot", `true`), jsonCase(t, "allot", `{}`),
		jsonCase(t, "compare", `{}`), jsonCase(t, "compare", `[]`),
		jsonCase(t, "allot", withUnits(`"units": []`)), jsonCase(t, "allot", withUnits(`"units": "abc"`)),
		jsonCase(t, "allot", withUnits(`"units": {}`)), jsonCase(t, "allot", withUnits(`"units": [1, 2]`)),
		jsonCase(t, "allot", withUnits(`"units": [null]`)), jsonCase(t, "allot", withUnits(`"units": [[]]`)),
		jsonCase(t, "compare", withUnits(`"units": [{"name": "A"}]`)),
		// Populations.
		jsonCase(t, "allot", unit(`{"name": "A", "population": -5}`)),
		jsonCase(t, "allot", unit(`{"name": "A", "population": "-0.5"}`)),
		jsonCase(t, "allot", unit(`{"name": "A", "population": 1e30}`)),
		jsonCase(t, "allot", unit(`{"name": "A", "population": "1e5"}`)),
		jsonCase(t, "allot", unit(`{"name": "A", "population": "12,345"}`)),
		jsonCase(t, "allot", unit(`{"name": "A", "population": ""}`)),
		jsonCase(t, "allot", unit(`{"name": "A", "population": " "}`)),
		jsonCase(t, "allot", unit(`{"name": "A", "population": "0x10"}`)),
		jsonCase(t, "allot", unit(`{"name": "A", "population": "1.0000000001"}`)),
		jsonCase(t, "allot", unit(`{"name": "A", "population": "99999999999999999999"}`)),
		jsonCase(t, "allot", unit(`{"name": "A", "population": true}`)),
		jsonCase(t, "allot", unit(`{"name": "A", "population": [[[]]]}`)),
		jsonCase(t, "allot", unit(`{"name": "A", "population": {"value": 5}}`)),
		jsonCase(t, "allot", withUnits(`"units": [{"name": "A", "population": 0}, {"name": "B", "population": "0.0"}]`)),
		// Names and members.
		jsonCase(t, "allot", unit(`{"population": 5}`)),
		jsonCase(t, "allot", unit(`{"name": "", "population": 5}`)),
		jsonCase(t, "allot", unit(`{"name": "   ", "population": 5}`)),
		jsonCase(t, "allot", unit(`{"name": 42, "population": 5}`)),
		jsonCase(t, "allot", unit(`{"name": {"a": [1, {"b": 2}]}, "population": [[[]]]}`)),
		jsonCase(t, "allot", unit(`{"name": "Birch", "population": 5}`)),
		jsonCase(t, "allot", unit(`{"name": "A", "population": 5, "colour": "red"}`)),
		jsonCase(t, "allot", withUnits(`"colour": "red", "units": `+okUnits)),
		// Scenario members.
		jsonCase(t, "allot", `{"method": "webster", "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 0, "method": "webster", "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": -1, "method": "webster", "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 2.5, "method": "webster", "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": "ten", "method": "webster", "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 1e300, "method": "webster", "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 1000000001, "method": "webster", "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 200000, "method": "webster", "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 10, "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 10, "method": "borda", "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 10, "method": 42, "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 10, "method": ["webster"], "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 10, "method": "webster", "min": -1, "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 10, "method": "webster", "min": "x", "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 10, "method": "webster", "min": 1.5, "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 10, "method": "webster", "min": 4, "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 10, "method": "webster", "max": -2, "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 10, "method": "webster", "max": 3, "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 2, "method": "adams", "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 10, "method": "webster", "threshold": "150%", "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 10, "method": "webster", "threshold": "abc", "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 10, "method": "webster", "threshold": -0.1, "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 10, "method": "webster", "threshold": true, "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 10, "method": "webster", "threshold": 0.9, "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 10, "method": "webster", "tie": "coin", "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 10, "method": "webster", "tie": 7, "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 10, "method": "webster", "tie": "lot:x", "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"seats": 10, "method": "webster", "title": 42, "units": `+okUnits+`}`),
		jsonCase(t, "allot", `{"version": 2, "seats": 10, "method": "webster", "units": `+okUnits+`}`),
		jsonCase(t, "compare", `{"seats": 10, "min": 5, "units": `+okUnits+`}`),
		// Values JSON cannot hold.
		jsCase("allot", js(`[]`), ""),
		jsCase("allot", js(`[undefined]`), ""),
		jsCase("allot", js(`[{seats: NaN, method: "webster", units: `+okUnits+`}]`), "seats"),
		jsCase("allot", js(`[{seats: Infinity, method: "webster", units: `+okUnits+`}]`), "seats"),
		jsCase("allot", js(`[{seats: 10, method: "webster", units: [{name: "A", population: NaN}]}]`), "units[0].population"),
		jsCase("allot", js(`[{seats: 10, method: "webster", units: [{name: "A", population: -Infinity}]}]`), "units[0].population"),
		jsCase("allot", js(`[{seats: 10, method: "webster", units: [{name: "A", population: 1e300}]}]`), "units[0].population"),
		jsCase("allot", js(`[{seats: 10, method: "webster", units: [{name: "A", population: -1n}]}]`), "units[0].population"),
		jsCase("allot", js(`[{seats: 10, method: "webster", units: [{name: "A", population: 10n ** 30n}]}]`), "units[0].population"),
		jsCase("allot", js(`[{seats: 10, method: "webster", min: NaN, units: `+okUnits+`}]`), "min"),
		jsCase("allot", js(`[{seats: 10, method: "webster", threshold: NaN, units: `+okUnits+`}]`), "threshold"),
		jsCase("allot", js(`[() => 1]`), ""),
		jsCase("allot", js(`[{seats: 10, method: "webster", units: [{name: "A", population: () => 5}]}]`), "units[0].population"),
		jsCase("allot", js(`[Symbol("scenario")]`), ""),
		jsCase("allot", js(`[{seats: 10, method: "webster", units: Symbol.iterator}]`), "units"),
		jsCase("allot", js(`[{seats: 10, method: Symbol("webster"), units: `+okUnits+`}]`), "method"),
		jsCase("allot", js(`[{seats: 10, method: "webster", get units() { throw new Error("a getter that throws"); }}]`), "units"),
		jsCase("allot", js(`[new Proxy({}, {ownKeys() { throw new Error("ownKeys throws"); }})]`), ""),
		jsCase("allot", js(`[new Proxy({units: []}, {get() { throw new Error("get throws"); }})]`), "units"),
		jsCase("allot", js(`(() => { const p = Proxy.revocable({}, {}); p.revoke(); return [p.proxy]; })()`), ""),
		jsCase("allot", js(`(() => { const a = [{name: "A", population: 1}]; Object.defineProperty(a, 0, {get() { throw new Error("index throws"); }}); return [{seats: 3, method: "webster", units: a}]; })()`), "units[0]"),
		jsCase("allot", js(`[{seats: 10, method: "webster", units: new Array(4294967295)}]`), "units"),
		jsCase("allot", js(`[{seats: 10, method: "webster", units: new Array(100001).fill(null)}]`), "units"),
		jsCase("allot", js(`[{seats: 10, method: "webster", units: new Uint8Array(3)}]`), "units"),
		jsCase("allot", js(`[new Date(0)]`), "units"),
		jsCase("allot", js(`[new Map([["units", []]])]`), "units"),
		jsCase("allot", js(`(() => { const s = {seats: 3, method: "webster"}; s.units = [s]; return [s]; })()`), "units"),
		jsCase("allot", js(`(() => { let a = []; for (let i = 0; i < 1000; i++) a = [a]; return [{units: a}]; })()`), "units"),
		jsCase("allot", js(`[`+ok+`, 1]`), ""),
		jsCase("compare", js(`[{seats: NaN, units: `+okUnits+`}]`), "seats"),
		// Good scenarios written in ways only JavaScript allows.
		sameAs(t, "allot", js(`[`+ok+`]`), okJSON),
		sameAs(t, "allot", js(`[{seats: 5, method: "jefferson", min: undefined, units: [{name: "Amber", population: 5100n}, {name: "Birch", population: 3000, max: undefined}, {name: "Cedar", population: 1900}]}]`), okJSON),
		sameAs(t, "allot", js(`[Object.assign(Object.create(null), `+ok+`)]`), okJSON),
		sameAs(t, "allot", js(`[new (class Scenario { constructor() { Object.assign(this, `+ok+`); } })()]`), okJSON),
		sameAs(t, "allot", js(`[{seats: 5, method: "webster", units: [{name: "Big", population: 2 ** 52 + 2}, {name: "Bigger", population: 123456789012345678901234n / 1000000000n}, {name: "Small", population: 1}]}]`),
			`{"seats": 5, "method": "webster", "units": [{"name": "Big", "population": "4503599627370498"}, {"name": "Bigger", "population": "123456789012345"}, {"name": "Small", "population": "1"}]}`),
		sameAs(t, "allot", js(`[{seats: 3, method: "hamilton", units: [{name: "A", population: 1e-3}, {name: "B", population: 0.5}, {name: "C", population: 2.25}]}]`),
			`{"seats": 3, "method": "hamilton", "units": [{"name": "A", "population": "0.001"}, {"name": "B", "population": "0.5"}, {"name": "C", "population": "2.25"}]}`),
		sameAs(t, "allot", js(`[{seats: 3, method: "hamilton", title: "\uD800 lone", units: [{name: "\uDC00", population: 7}, {name: "B", population: 3}]}]`),
			`{"seats": 3, "method": "hamilton", "title": "\ufffd lone", "units": [{"name": "\ufffd", "population": 7}, {"name": "B", "population": 3}]}`),
		sameAs(t, "compare", js(`[{seats: 5, method: undefined, units: `+okUnits+`}]`), `{"seats": 5, "units": `+okUnits+`}`),
		sameAs(t, "methods", js(`[]`), `null`),
		sameAs(t, "methods", js(`[undefined]`), `null`),
		// Other functions.
		jsCase("methods", js(`[1]`), ""),
		jsCase("methods", js(`[{}]`), ""),
		jsonCase(t, "readCSV", `null`), jsonCase(t, "readCSV", `42`), jsonCase(t, "readCSV", `{"text": "name,population"}`),
		jsonCase(t, "readCSV", `""`), jsonCase(t, "readCSV", `"name,population\n"`),
		jsonCase(t, "readCSV", `"name,population\nA,\"unterminated\n"`),
		jsonCase(t, "readCSV", `"name,population,min\nA,5,-1\n"`),
		jsonCase(t, "readCSV", `"name,population,max\nA,5,99999999999\n"`),
		jsonCase(t, "readCSV", `"a,b\n1,2\n"`), jsonCase(t, "readCSV", `"name,population\nA,5,6\n"`),
		jsonCase(t, "readCSV", `"name,population\nA,1e30\n"`), jsonCase(t, "readCSV", `"name,name\nA,B\n"`),
		jsonCase(t, "readCSV", `"\u0000\uffff\u0001,\n\"\"\"\n"`),
		jsCase("readCSV", js(`["name,population\n" + "A,1\n".repeat(2) + "x".repeat(33 << 20)]`), ""),
		jsCase("readCSV", js(`[new String("name,population\nA,5\n")]`), ""),
	}
	for i := range cs {
		if cs[i].want != nil && cs[i].js == "" {
			t.Fatalf("%s: the native packages accept it; it belongs with the good cases", cs[i].name)
		}
	}
	return cs
}

func TestEngineUnderNode(t *testing.T) {
	mods, node := modules(t)
	wasm := filepath.Join(mods, wasmbuild.Calculator.File)
	dir := t.TempDir()

	// The cases: random scenarios through allot and compare, some of their
	// tables through readCSV, with the bad calls spread between them so
	// that every error is followed by good work.
	scenarios := 240
	if testing.Short() {
		scenarios = 80 // every method ten times
	}
	r := rand.New(rand.NewPCG(20261201, 7))
	var good []testCase
	methodsCase := testCase{name: "methods()", fn: "methods"}
	methodsCase.expect(t, jsondoc.NullValue())
	good = append(good, methodsCase)
	apportioned, failed := 0, 0
	for k := 0; k < scenarios; k++ {
		doc := randomScenario(r, k)
		for _, fn := range []string{"allot", "compare"} {
			c := testCase{name: fn + " of random scenario " + strconv.Itoa(k), fn: fn, args: []*jsondoc.Value{doc}}
			c.expect(t, doc)
			if fn == "allot" {
				if c.want != nil {
					apportioned++
				} else {
					failed++
				}
			}
			good = append(good, c)
		}
		if k%4 == 0 {
			text := jsondoc.Str(csvText(r, doc))
			c := testCase{name: "readCSV of random scenario " + strconv.Itoa(k), fn: "readCSV", args: []*jsondoc.Value{text}}
			c.expect(t, text)
			good = append(good, c)
		}
	}
	if apportioned < scenarios/2 || failed < scenarios/20 {
		t.Fatalf("the generator made %d scenarios that apportion and %d that do not; want both kinds", apportioned, failed)
	}
	bad := badCases(t)
	var cases []testCase
	for i, j := 0, 0; i < len(good) || j < len(bad); {
		if i < len(good) {
			cases = append(cases, good[i])
			i++
		}
		if j < len(bad) && i%3 == 0 {
			cases = append(cases, bad[j])
			j++
		}
		if i == len(good) && j < len(bad) {
			cases = append(cases, bad[j:]...)
			j = len(bad)
		}
	}
	cases = append(cases, good[1]) // still working after everything

	casesPath := filepath.Join(dir, "cases.json")
	if err := os.WriteFile(casesPath, casesJSON(cases), 0o644); err != nil {
		t.Fatal(err)
	}
	outPath := filepath.Join(dir, "out.ndjson")
	start := time.Now()
	cmd := exec.Command(node, "--stack-size=8192", filepath.Join("testdata", "harness.js"), execJS(mods), wasm, casesPath, outPath)
	msg, err := cmd.CombinedOutput()
	if err != nil {
		t.Fatalf("node: %v\n%s", err, msg)
	}
	lines := readLines(t, outPath)
	t.Logf("%d calls (%d random scenarios, %d apportioned, through allot and compare; %d bad calls) in one Node process: %v",
		len(cases), scenarios, apportioned, len(bad), time.Since(start).Round(time.Millisecond))
	if len(lines) != len(cases)+2 {
		t.Fatalf("the harness wrote %d lines for %d cases", len(lines), len(cases))
	}
	checkShape(t, lines[0].Get("shape"))
	type timing struct {
		name string
		ms   float64
	}
	var slow []timing
	for i, c := range cases {
		checkCase(t, c, lines[i+1])
		if ms := lines[i+1].Get("ms"); ms != nil {
			f, _ := strconv.ParseFloat(ms.Text, 64)
			slow = append(slow, timing{c.name, f})
		}
	}
	sort.Slice(slow, func(i, j int) bool { return slow[i].ms > slow[j].ms })
	for _, s := range slow[:min(5, len(slow))] {
		t.Logf("slowest: %s: %.0f ms", s.name, s.ms)
	}
	end := lines[len(lines)-1]
	if e := end.Get("exited"); e == nil || e.Bool {
		t.Errorf("the Go program stopped: %s", jsondoc.Marshal(end))
	}
	t.Logf("time inside Node for the calls: %s ms", end.Get("ms").Text)
}

func casesJSON(cases []testCase) []byte {
	arr := jsondoc.NewArray()
	for _, c := range cases {
		x := jsondoc.NewObject().Set("fn", jsondoc.Str(c.fn))
		if c.js != "" {
			x.Set("js", jsondoc.Str(c.js))
		} else {
			x.Set("args", jsondoc.NewArray(c.args...))
		}
		arr.Append(x)
	}
	return jsondoc.Marshal(arr)
}

func readLines(t *testing.T, path string) []*jsondoc.Value {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var lines []*jsondoc.Value
	sc := bufio.NewScanner(f)
	sc.Buffer(nil, 256<<20)
	for sc.Scan() {
		v, err := jsondoc.Parse(sc.Bytes())
		if err != nil {
			t.Fatalf("line %d of the harness output: %v", len(lines)+1, err)
		}
		lines = append(lines, v)
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	return lines
}

func checkShape(t *testing.T, shape *jsondoc.Value) {
	t.Helper()
	if shape.IsNull() {
		t.Fatal("globalThis.seatsmith is not defined once go.run has started the module")
	}
	if v := shape.Get("version"); v == nil || v.Text != "1" {
		t.Errorf("seatsmith.version = %s, want 1", jsondoc.Marshal(v))
	}
	if c := shape.Get("caution"); c == nil || c.Text != format.Caution {
		t.Errorf("seatsmith.caution = %s, want format.Caution", jsondoc.Marshal(c))
	}
	if f := shape.Get("frozen"); f == nil || !f.Bool {
		t.Error("seatsmith is not frozen")
	}
	have := map[string]string{}
	for _, m := range shape.Get("members").Items {
		have[m.Items[0].Text] = m.Items[1].Text
	}
	for _, fn := range []string{"methods", "allot", "compare", "readCSV"} {
		if have[fn] != "function" {
			t.Errorf("seatsmith.%s is %q, want a function", fn, have[fn])
		}
	}
}

func checkCase(t *testing.T, c testCase, line *jsondoc.Value) {
	t.Helper()
	if th := line.Get("threw"); th != nil {
		t.Errorf("%s threw: %s", c.name, th.Text)
		return
	}
	if line.Get("exited") != nil {
		t.Errorf("%s: the Go program stopped", c.name)
	}
	got := line.Get("result")
	if c.want != nil {
		if typ := line.Get("type").Text; typ != "object" {
			t.Errorf("%s returned %s, want an object", c.name, typ)
			return
		}
		if bad := inexact(c.want); bad != "" {
			t.Errorf("%s: the native document holds the number %s, which JavaScript cannot hold exactly", c.name, bad)
		}
		g, w := string(jsondoc.Marshal(canonical(got))), string(jsondoc.Marshal(canonical(c.want)))
		if g != w {
			gs, ws := around(g, w)
			t.Errorf("%s: the JavaScript result differs from the native document\n got: %s\nwant: %s", c.name, gs, ws)
		}
		return
	}
	if msg := errorObject(got); msg != "" {
		t.Errorf("%s: %s: %s", c.name, msg, clip(string(jsondoc.Marshal(got))))
		return
	}
	if c.checkField {
		field := ""
		if f := got.Get("error").Get("field"); f != nil {
			field = f.Text
		}
		if field != c.field {
			t.Errorf("%s: error field %q, want %q (%s)", c.name, field, c.field, clip(string(jsondoc.Marshal(got))))
		}
	}
}

// errorObject checks that v is exactly {error: {message, field?, line?}}
// and returns what is wrong, or "".
func errorObject(v *jsondoc.Value) string {
	if v == nil || v.Kind != jsondoc.Object || len(v.Fields) != 1 || v.Get("error") == nil {
		return "want an error object {error: {...}}"
	}
	e := v.Get("error")
	if e.Kind != jsondoc.Object {
		return "error is not an object"
	}
	for _, f := range e.Fields {
		switch f.Key {
		case "message":
			if f.Value.Kind != jsondoc.String || strings.TrimSpace(f.Value.Text) == "" {
				return "the message is not a non-empty string"
			}
		case "field":
			if f.Value.Kind != jsondoc.String || f.Value.Text == "" {
				return "the field is not a non-empty string"
			}
		case "line":
			n, err := strconv.Atoi(f.Value.Text)
			if f.Value.Kind != jsondoc.Number || err != nil || n < 1 {
				return "the line is not a positive whole number"
			}
		default:
			return "unexpected member " + f.Key
		}
	}
	if e.Get("message") == nil {
		return "no message"
	}
	return ""
}

// canonical returns a copy of v with every number written as JavaScript
// writes the float64 nearest to it, so that a document and the JSON text of
// its JavaScript value compare equal exactly when JavaScript got the same
// numbers.
func canonical(v *jsondoc.Value) *jsondoc.Value {
	if v == nil {
		return nil
	}
	c := *v
	switch v.Kind {
	case jsondoc.Number:
		c.Text = jsNumber(v.Text)
	case jsondoc.Array:
		c.Items = make([]*jsondoc.Value, len(v.Items))
		for i, x := range v.Items {
			c.Items[i] = canonical(x)
		}
	case jsondoc.Object:
		c.Fields = make([]jsondoc.Field, len(v.Fields))
		for i, f := range v.Fields {
			c.Fields[i] = jsondoc.Field{Key: f.Key, Value: canonical(f.Value)}
		}
	}
	c.Line = 0
	return &c
}

// jsNumber writes the number text as JavaScript shows the nearest float64.
func jsNumber(text string) string {
	f, err := strconv.ParseFloat(text, 64)
	if err != nil {
		return "invalid:" + text
	}
	a := math.Abs(f)
	switch {
	case f == 0:
		return "0"
	case a >= 1e-6 && a < 1e21:
		return strconv.FormatFloat(f, 'f', -1, 64)
	}
	return strconv.FormatFloat(f, 'g', -1, 64)
}

// inexact returns the first number in v whose text is not exactly what
// JavaScript shows for it (a number JavaScript cannot hold exactly).
func inexact(v *jsondoc.Value) string {
	if v == nil {
		return ""
	}
	switch v.Kind {
	case jsondoc.Number:
		if jsNumber(v.Text) != v.Text {
			return v.Text
		}
	case jsondoc.Array:
		for _, x := range v.Items {
			if s := inexact(x); s != "" {
				return s
			}
		}
	case jsondoc.Object:
		for _, f := range v.Fields {
			if s := inexact(f.Value); s != "" {
				return s
			}
		}
	}
	return ""
}

// around returns the parts of a and b around their first difference.
func around(a, b string) (string, string) {
	i := 0
	for i < len(a) && i < len(b) && a[i] == b[i] {
		i++
	}
	cut := func(s string) string {
		lo, hi := max(0, i-120), min(len(s), i+120)
		return "…" + s[lo:hi] + "…"
	}
	return cut(a), cut(b)
}

func clip(s string) string {
	if len(s) > 2000 {
		return s[:2000] + "…"
	}
	return s
}
