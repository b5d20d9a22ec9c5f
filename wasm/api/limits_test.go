package api

import (
	"strconv"
	"strings"
	"testing"

	"seatsmith/engine/jsondoc"
)

// scenarioOf builds a scenario document of n units by method.
func scenarioOf(n, seats int, method string) *jsondoc.Value {
	units := &jsondoc.Value{Kind: jsondoc.Array, Items: make([]*jsondoc.Value, n)}
	for i := range units.Items {
		units.Items[i] = object(jsondoc.Field{Key: "name", Value: jsondoc.Str("U" + strconv.Itoa(i))},
			jsondoc.Field{Key: "population", Value: jsondoc.Int(1000 + i*7919%100000)})
	}
	return object(jsondoc.Field{Key: "seats", Value: jsondoc.Int(seats)}, jsondoc.Field{Key: "method", Value: jsondoc.Str(method)},
		jsondoc.Field{Key: "units", Value: units})
}

// Every request beyond a limit is refused with an error value that names
// the limit as limits() lists it, before the engine computes anything.
func TestLimitsRefused(t *testing.T) {
	bool := func(b bool) *jsondoc.Value { return object(jsondoc.Field{Key: "margins", Value: jsondoc.Boolean(b)}) }
	longName := scenarioOf(3, 5, "webster")
	longName.Get("units").Items[1].Set("name", jsondoc.Str(strings.Repeat("é", MaxNameLength+1)))
	longTitle := scenarioOf(3, 5, "webster").Set("title", jsondoc.Str(strings.Repeat("t", MaxTitleLength+1)))
	for _, tc := range []struct {
		name, fn  string
		arg, opts *jsondoc.Value
		key       string
	}{
		{"units", "allot", scenarioOf(MaxUnits+1, 10, "webster"), nil, "units"},
		{"compare units", "compare", scenarioOf(MaxCompareUnits+1, 10, "webster"), nil, "compare_units"},
		{"seats", "allot", scenarioOf(3, MaxSeats+1, "webster"), nil, "seats"},
		{"name", "allot", longName, nil, "name_length"},
		{"title", "compare", longTitle, nil, "title_length"},
		{"text", "readCSV", jsondoc.Str("name,population\n" + strings.Repeat("x", MaxText)), nil, "text_bytes"},
		{"csv rows", "readCSV", jsondoc.Str("name,population\n" + strings.Repeat("A,1\n", MaxUnits+1)), nil, "units"},
		{"margins", "allot", scenarioOf(MaxMarginUnits+1, 100_000, "huntington-hill"), bool(true), "margin_units"},
		{"costly margins", "allot", scenarioOf(MaxSearchedMargins+1, 1000, "hamilton").Set("min", jsondoc.Int(1)), bool(true), "searched_margin_units"},
		{"threshold margins", "allot", scenarioOf(MaxSearchedMargins+1, 1000, "webster").Set("threshold", jsondoc.Str("0.001")), bool(true), "searched_margin_units"},
	} {
		got := Invoke(fn(t, tc.fn), tc.arg, tc.opts)
		e := got.Get("error")
		if e == nil {
			t.Errorf("%s: no error", tc.name)
			continue
		}
		if msg := e.Get("message").Text; !strings.Contains(msg, "(limits()."+tc.key+")") {
			t.Errorf("%s: %q does not name limits().%s", tc.name, msg, tc.key)
		}
	}
	// Arguments are refused while they are read.
	for _, tc := range []struct {
		name string
		v    *fake
		key  string
	}{
		{"values", &fake{k: jsArray, n: MaxValues + 1}, "values"},
		{"depth", func() *fake {
			v := fakeArr()
			for i := 0; i <= MaxDepth; i++ {
				v = fakeArr(v)
			}
			return v
		}(), "depth"},
	} {
		_, err := fromJS(tc.v)
		if err == nil || !strings.Contains(err.Error(), "limits()."+tc.key) {
			t.Errorf("%s: error %v does not name limits().%s", tc.name, err, tc.key)
		}
	}
}

// allot computes the costly parts of an explanation as asked, within the
// limits, and says which it left out.
func TestAllotDetail(t *testing.T) {
	for _, tc := range []struct {
		n, seats int
		method   string
		min      int
		margins  *bool
		skipped  string
	}{
		{10, 100, "webster", 0, nil, ""},
		{AutoMarginUnits + 1, AutoOrderSeats, "webster", 0, nil, "margins"},
		{10, AutoOrderSeats + 1, "webster", 0, nil, "order"},
		{AutoMarginUnits, 2 * AutoMarginUnits, "hamilton", 0, nil, ""},
		{AutoMarginUnits + 1, 2 * AutoMarginUnits, "hamilton", 0, nil, "margins"},
		{AutoSearchedMargins, 500, "hamilton", 1, nil, ""},
		{AutoSearchedMargins + 1, 500, "hamilton", 1, nil, "margins"},
	} {
		var opts *jsondoc.Value
		if tc.margins != nil {
			opts = object(jsondoc.Field{Key: "margins", Value: jsondoc.Boolean(*tc.margins)})
		}
		doc := scenarioOf(tc.n, tc.seats, tc.method)
		if tc.min > 0 {
			doc.Set("min", jsondoc.Int(tc.min))
		}
		got := call(t, "allot", doc, opts)
		if e := got.Get("error"); e != nil {
			t.Errorf("%d units by %s: %s", tc.n, tc.method, jsondoc.Marshal(e))
			continue
		}
		var skipped []string
		if s := got.Get("skipped"); s != nil {
			for _, x := range s.Items {
				skipped = append(skipped, x.Text)
			}
		}
		if g := strings.Join(skipped, ","); g != tc.skipped {
			t.Errorf("%d units, %d seats by %s: skipped %q, want %q", tc.n, tc.seats, tc.method, g, tc.skipped)
		}
		gain := got.Get("units").Items[0].Get("gain_margin")
		if computed := gain.Kind != jsondoc.Null; computed == strings.Contains(tc.skipped, "margins") {
			t.Errorf("%d units by %s: gain margin %s with skipped %q", tc.n, tc.method, jsondoc.Marshal(gain), tc.skipped)
		}
	}
}

// The limits function lists every limit once.
func TestLimitsListed(t *testing.T) {
	v := Invoke(LimitsFunction(Limits()), nil, nil)
	seen := map[string]bool{}
	for _, f := range v.Fields {
		if seen[f.Key] {
			t.Errorf("limit %s listed twice", f.Key)
		}
		seen[f.Key] = true
	}
	if len(seen) != len(Limits()) || !seen["units"] || !seen["name_length"] {
		t.Errorf("limits() = %s", jsondoc.Marshal(v))
	}
}
