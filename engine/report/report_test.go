package report

import (
	"bytes"
	"os"
	"strings"
	"testing"

	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
)

func demo() engine.Scenario {
	return engine.Scenario{Seats: 10, Method: engine.Webster, Units: []engine.Unit{
		{Name: "North Ward", Population: engine.Whole(5200)},
		{Name: "=cmd|' /C calc'!A0", Population: engine.Whole(3100)},
		{Name: "Mill <Ward>", Population: engine.Whole(1700)},
	}}
}

func TestAllotmentDocument(t *testing.T) {
	s := demo()
	res, err := engine.Allot(&s, engine.Full)
	if err != nil {
		t.Fatal(err)
	}
	v := Allotment("Wards", res)
	for _, k := range []string{"version", "kind", "caution", "title", "method", "method_name", "seats", "total", "tie_rule", "unassigned", "units", "ties", "divisor", "order", "beyond", "quota", "passes"} {
		if v.Get(k) == nil {
			t.Errorf("document lacks %q", k)
		}
	}
	u := v.Get("units").Items[0]
	if u.Get("seats").Text != "5" || u.Get("quota").Text != "5.2" || u.Get("remainder").Kind != jsondoc.Null {
		t.Errorf("unit = %s", jsondoc.Marshal(u))
	}
	if !strings.Contains(string(jsondoc.Marshal(v)), `Mill \u003cWard\u003e`) {
		t.Errorf("names are not escaped for HTML script blocks")
	}
}

func TestTablesGuardCSV(t *testing.T) {
	s := demo()
	res, err := engine.Allot(&s, engine.Full)
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := AllotTable(res).WriteCSV(&b); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(b.String(), "'=cmd") {
		t.Errorf("formula-like cell not guarded:\n%s", b.String())
	}
	b.Reset()
	if err := AllotTable(res).WriteMarkdown(&b); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(b.String(), `=cmd\|'`) {
		t.Errorf("pipe in a name breaks the Markdown table:\n%s", b.String())
	}
}

func TestCompareRecordsFailures(t *testing.T) {
	s := demo()
	s.Seats = 2 // too few for Adams, Dean and Huntington–Hill with three units
	c := Compare(s, nil, 0)
	failed := 0
	for k, m := range c.Methods {
		if c.Results[k] == nil {
			failed++
			if !m.ZeroFirstSignpost() {
				t.Errorf("%s failed: %v", m, c.Errors[k])
			}
		}
	}
	if failed != 3 {
		t.Errorf("%d methods failed, want 3", failed)
	}
	doc := c.Doc("")
	if got := doc.Get("results").Items[4].Get("error"); got.IsNull() {
		t.Errorf("adams carries no error")
	}
}

func TestWrap(t *testing.T) {
	got := Wrap("one two three four five", 9)
	if got != "one two\nthree\nfour five" {
		t.Errorf("Wrap = %q", got)
	}
}

func ExampleAllotTable() {
	s := engine.Scenario{Seats: 7, Method: engine.Jefferson, Units: []engine.Unit{
		{Name: "Harbour School", Population: engine.Whole(640)},
		{Name: "Ridge School", Population: engine.Whole(410)},
		{Name: "Fen School", Population: engine.Whole(150)},
	}}
	res, err := engine.Allot(&s, engine.Full)
	if err != nil {
		panic(err)
	}
	AllotTable(res).WriteText(os.Stdout)
	// Output:
	// unit            population     quota  seats  quota ok  last priority  next priority  gain margin  lose margin  notes
	// --------------  ----------  --------  -----  --------  -------------  -------------  -----------  -----------  -----
	// Harbour School         640  3.733333      4  yes                 160            128          111           94
	// Ridge School           410  2.391667      2  yes                 205        136.667           41          154
	// Fen School             150     0.875      1  yes                 150             75          171           14
}
