package api

import (
	"errors"
	"fmt"
	"os"
	"strings"
	"testing"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/format"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
)

// fn returns the calculator module's function name.
func fn(t testing.TB, name string) Function {
	for _, f := range Calculator() {
		if f.Name == name {
			return f
		}
	}
	t.Fatalf("no function %s", name)
	return Function{}
}

// call invokes the function name as JavaScript would and returns its
// answer as a tree (a document written as raw JSON read back).
func call(t testing.TB, name string, arg, opts *jsondoc.Value) *jsondoc.Value {
	t.Helper()
	v := Invoke(fn(t, name), arg, opts)
	back, err := jsondoc.Parse(jsondoc.Marshal(v))
	if err != nil {
		t.Fatalf("%s answered malformed JSON: %v", name, err)
	}
	return back
}

func TestFunctions(t *testing.T) {
	seen := map[string]bool{}
	for _, f := range Calculator() {
		if f.Name == "" || f.Name == "version" || f.Name == "caution" || f.Name == "limits" || seen[f.Name] {
			t.Errorf("function name %q is reserved or taken twice", f.Name)
		}
		seen[f.Name] = true
	}
	for _, name := range []string{"allot", "compare", "methods", "readCSV", "calculator"} {
		if !seen[name] {
			t.Errorf("the calculator module has no %s", name)
		}
	}
}

func TestInvokeRecovers(t *testing.T) {
	var nilMap map[string]int
	for _, f := range []func(_, _ *jsondoc.Value) (*jsondoc.Value, error){
		func(_, _ *jsondoc.Value) (*jsondoc.Value, error) { panic("broken") },
		func(_, _ *jsondoc.Value) (*jsondoc.Value, error) { nilMap["x"] = 1; return nil, nil },
		func(_, _ *jsondoc.Value) (*jsondoc.Value, error) { panic(struct{}{}) },
	} {
		got := string(jsondoc.Marshal(Invoke(Function{Name: "f", Call: f}, nil, nil)))
		if !strings.HasPrefix(got, `{"error":{"message":"internal error: `) {
			t.Errorf("call of a panicking function = %s, want an internal error", got)
		}
	}
	if got := string(jsondoc.Marshal(Invoke(Function{Name: "f", Call: func(arg, _ *jsondoc.Value) (*jsondoc.Value, error) {
		if arg == nil || arg.Kind != jsondoc.Null {
			return nil, errors.New("no null argument")
		}
		return nil, nil
	}}, nil, nil))); got != "null" {
		t.Errorf("call with no argument and no result = %s, want null", got)
	}
	if got := string(jsondoc.Marshal(Invoke(fn(t, "compare"), jsondoc.NewObject(), jsondoc.NewObject()))); !strings.Contains(got, "takes one argument") {
		t.Errorf("compare with options = %s", got)
	}
}

func TestErrorDoc(t *testing.T) {
	for _, tc := range []struct {
		err  error
		want string
	}{
		{&input.Error{File: "x", Line: 3, Field: "population", Msg: "bad"},
			`{"error":{"message":"line 3: population: bad","field":"population","line":3}}`},
		{&input.Error{Field: "units[1].min", Msg: "bad"},
			`{"error":{"message":"units[1].min: bad","field":"units[1].min"}}`},
		{&engine.Error{Unit: 2, Name: "Tamsk", Field: "name", Msg: "the same name as unit 1"},
			`{"error":{"message":"units[2].name: \"Tamsk\": the same name as unit 1","field":"units[2].name"}}`},
		{&engine.Error{Unit: -1, Field: "seats", Msg: "too few"},
			`{"error":{"message":"seats: too few","field":"seats"}}`},
		{fmt.Errorf("wrapped: %w", &engine.Error{Unit: -1, Msg: "plain"}),
			`{"error":{"message":"plain"}}`},
		{errors.New("something else"), `{"error":{"message":"something else"}}`},
	} {
		if got := string(jsondoc.Marshal(errorDoc(tc.err))); got != tc.want {
			t.Errorf("errorDoc(%v) = %s, want %s", tc.err, got, tc.want)
		}
	}
}

func demo(t *testing.T) *jsondoc.Value {
	t.Helper()
	data, err := os.ReadFile("../../testdata/demo/vessaria.json")
	if err != nil {
		t.Fatal(err)
	}
	v, err := jsondoc.Parse(data)
	if err != nil {
		t.Fatal(err)
	}
	return v
}

// The API functions return exactly the documents the command-line tool
// prints.
func TestDocumentsMatchReport(t *testing.T) {
	doc := demo(t)
	src, err := input.FromDoc("", doc)
	if err != nil {
		t.Fatal(err)
	}
	res, err := engine.Allot(&src.Scenario, engine.Full)
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		f    string
		want *jsondoc.Value
	}{
		{"allot", format.AllotmentJSON(src.Title, res)},
		{"compare", format.ComparisonJSON(src.Title, analysis.CompareMethods(src.Scenario, nil, 0))},
	} {
		got := string(jsondoc.Marshal(call(t, tc.f, doc, nil)))
		if want := string(jsondoc.Marshal(tc.want)); got != want {
			t.Errorf("got  %s\nwant %s", got, want)
		}
	}
}

func TestAPIErrors(t *testing.T) {
	parse := func(s string) *jsondoc.Value {
		v, err := jsondoc.Parse([]byte(s))
		if err != nil {
			t.Fatal(err)
		}
		return v
	}
	for _, tc := range []struct {
		f     string
		arg   string
		field string
		msg   string
	}{
		{"allot", `null`, "", "a scenario is a JSON object"},
		{"allot", `{"seats": 3, "method": "webster"}`, "units", "missing"},
		{"allot", `{"seats": 3, "units": [{"name": "A", "population": 5}]}`, "method", "no method"},
		{"allot", `{"seats": 3, "method": "borda", "units": [{"name": "A", "population": 5}]}`, "method", "unknown method"},
		{"allot", `{"seats": 3, "method": "adams", "units": [{"name": "A", "population": -5}]}`, "units[0].population", "negative"},
		{"allot", `{"seats": 200000, "method": "adams", "units": [{"name": "A", "population": 5}]}`, "seats", "command-line tool"},
		{"allot", `{"seats": 1, "method": "adams", "units": [{"name": "A", "population": 5}, {"name": "B", "population": 5}]}`, "seats", "Adams"},
		{"allot", `{"seats": 3, "method": "webster", "units": [{"name": "A", "population": 5}, {"name": "A", "population": 5}]}`, "units[1].name", "same name"},
		{"compare", `{"units": [{"name": "A", "population": 5}]}`, "seats", "house size"},
		{"methods", `1`, "", "takes no argument"},
		{"readCSV", `{"units": []}`, "", "not an object"},
		{"readCSV", `"name,population\nA,5\nB,x\n"`, "population", "line 3"},
		{"readCSV", `"name,people\nA,5\n"`, "column 2", "unknown column"},
	} {
		got := call(t, tc.f, parse(tc.arg), nil)
		e := got.Get("error")
		if e == nil || len(got.Fields) != 1 {
			t.Errorf("%s: got %s, want an error", tc.arg, jsondoc.Marshal(got))
			continue
		}
		field := ""
		if f := e.Get("field"); f != nil {
			field = f.Text
		}
		if msg := e.Get("message").Text; field != tc.field || !strings.Contains(msg, tc.msg) {
			t.Errorf("%s: error %s; want field %q and a message containing %q", tc.arg, jsondoc.Marshal(e), tc.field, tc.msg)
		}
	}
}

func TestReadCSV(t *testing.T) {
	got := string(jsondoc.Marshal(call(t, "readCSV", jsondoc.Str("\uFEFFName,Population,Min,Max\r\nOrlen,2694457,2,\r\nTamsk,880.50,,9\r\n"), nil)))
	want := `{"units":[{"name":"Orlen","population":"2694457","min":2},{"name":"Tamsk","population":"880.5","max":9}]}`
	if got != want {
		t.Errorf("readCSV = %s, want %s", got, want)
	}
}

func Example() {
	scenario := `{"seats": 5, "method": "jefferson", "units": [
		{"name": "Amber League", "population": 5100}, {"name": "Blue Hand", "population": 3000},
		{"name": "Cedar Party", "population": 1900}]}`
	v, _ := jsondoc.Parse([]byte(scenario))
	allot := Calculator()[1]
	doc, _ := jsondoc.Parse(jsondoc.Marshal(Invoke(allot, v, nil)))
	for _, u := range doc.Get("units").Items {
		fmt.Println(u.Get("name").Text, u.Get("seats").Text)
	}
	fmt.Println(string(jsondoc.Marshal(Invoke(allot, jsondoc.NewObject(), nil).Get("error"))))
	// Output:
	// Amber League 3
	// Blue Hand 1
	// Cedar Party 1
	// {"message":"units: missing: a scenario needs a units array","field":"units"}
}
