package format_test

import (
	"bytes"
	"encoding/xml"
	"io"
	"os"
	"strings"
	"testing"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/format"
	"seatsmith/engine/format/csv"
	"seatsmith/engine/format/json"
	"seatsmith/engine/format/markdown"
	"seatsmith/engine/format/svg"
	"seatsmith/engine/format/text"
	"seatsmith/engine/jsondoc"
)

func demo() engine.Scenario {
	return engine.Scenario{Seats: 10, Method: engine.Webster, Units: []engine.Unit{
		{Name: "North Ward", Population: engine.Whole(5200)},
		{Name: "=cmd|' /C calc'!A0", Population: engine.Whole(3100)},
		{Name: "Mill <Ward>", Population: engine.Whole(1700)},
	}}
}

func encode(t *testing.T, e format.Encoder, d *format.Document) string {
	t.Helper()
	var b bytes.Buffer
	if err := e.Encode(&b, d); err != nil {
		t.Fatal(err)
	}
	return b.String()
}

func TestAllotmentJSON(t *testing.T) {
	s := demo()
	res, err := engine.Allot(&s, engine.Full)
	if err != nil {
		t.Fatal(err)
	}
	v := format.AllotmentJSON("Wards", res)
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

// TestStreamedJSONMatchesTree: the JSON encoder, which makes the units of
// an allotment and its seat order one at a time, writes byte for byte the indented tree, for
// every method, with and without a title and ties.
func TestStreamedJSONMatchesTree(t *testing.T) {
	for _, m := range engine.Methods() {
		for _, title := range []string{"", `Wards "north" <b>`} {
			s := demo()
			s.Method = m
			s.Units = append(s.Units, engine.Unit{Name: "Tie A", Population: engine.Whole(1000)}, engine.Unit{Name: "Tie B", Population: engine.Whole(1000)})
			res, err := engine.Allot(&s, engine.Full)
			if err != nil {
				t.Fatal(err)
			}
			got := encode(t, json.Encoder{}, format.Allotment(title, res, &s, format.AllotOptions{}))
			if want := string(jsondoc.MarshalIndent(format.AllotmentJSON(title, res), "  ")); got != want {
				t.Fatalf("%s: streamed\n%s\nwant\n%s", m, got, want)
			}
			v, err := jsondoc.Parse([]byte(encode(t, json.Encoder{}, format.Allotment(title, res, &s, format.AllotOptions{Skipped: []string{"margins", "order"}}))))
			if err != nil {
				t.Fatal(err)
			}
			if sk := v.Get("skipped"); sk == nil || len(sk.Items) != 2 || sk.Items[0].Text != "margins" {
				t.Fatalf("skipped = %s", jsondoc.Marshal(sk))
			}
		}
	}
}

func TestTextAndMarkdownGuardTheLayout(t *testing.T) {
	s := demo()
	res, err := engine.Allot(&s, engine.Full)
	if err != nil {
		t.Fatal(err)
	}
	d := format.Allotment("", res, &s, format.AllotOptions{})
	if out := encode(t, csv.Encoder{}, d); !strings.Contains(out, ",'=cmd|' /C calc'!A0,3100,") {
		t.Errorf("formula-like cell not guarded:\n%s", out)
	}
	if out := encode(t, markdown.Encoder{}, d); !strings.Contains(out, `=cmd\|'`) {
		t.Errorf("pipe in a name breaks the Markdown table:\n%s", out)
	}
	if out := encode(t, text.Encoder{}, d); !strings.HasSuffix(out, format.Wrap(format.Caution, text.Width)+"\n") {
		t.Errorf("text does not end with the caution:\n%s", out)
	}
	if err := (svg.Encoder{}).Encode(io.Discard, d); err != format.ErrNoPart {
		t.Errorf("an allotment written as SVG: %v", err)
	}
}

func TestCompareRecordsFailures(t *testing.T) {
	s := demo()
	s.Seats = 2 // too few for Adams, Dean and Huntington–Hill with three units
	c := analysis.CompareMethods(s, nil, 0)
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
	if got := format.ComparisonJSON("", c).Get("results").Items[4].Get("error"); got.IsNull() {
		t.Errorf("adams carries no error")
	}
}

func TestWrap(t *testing.T) {
	if got := format.Wrap("one two three four five", 9); got != "one two\nthree\nfour five" {
		t.Errorf("Wrap = %q", got)
	}
}

func sweepScenario() engine.Scenario {
	return engine.Scenario{Units: []engine.Unit{
		{Name: `Tarrow <"&">`, Population: engine.Whole(940)},
		{Name: "Ulm", Population: engine.Whole(9030)},
		{Name: "Vesk", Population: engine.Whole(10030)},
	}}
}

func TestSweepJSON(t *testing.T) {
	set := analysis.SweepAll(sweepScenario(), []engine.Method{engine.Hamilton, engine.Adams}, 1, 201)
	d := format.Sweep("t", set)
	streamed := encode(t, json.Encoder{}, d)
	if whole := string(jsondoc.MarshalIndent(format.SweepJSON("t", set), "  ")); streamed != whole {
		t.Fatalf("the streamed sweep differs from the tree")
	}
	v, err := jsondoc.Parse([]byte(streamed))
	if err != nil {
		t.Fatal(err)
	}
	if v.Get("kind").Text != "sweep" || v.Get("caution").Text != format.Caution {
		t.Errorf("header %s", jsondoc.Marshal(v)[:100])
	}
	sizes := v.Get("sizes").Items
	if len(sizes) != 2*201 {
		t.Fatalf("%d sizes, want 402", len(sizes))
	}
	// Adams refuses sizes 1 and 2 (three units need a first seat each).
	for _, z := range sizes {
		refused := z.Get("method").Text == "adams" && (z.Get("seats").Text == "1" || z.Get("seats").Text == "2")
		if refused != !z.Get("error").IsNull() || refused != (len(z.Get("units").Items) == 0) {
			t.Errorf("size %s", jsondoc.Marshal(z))
		}
	}
	var alabama []string
	for _, p := range v.Get("paradoxes").Items {
		alabama = append(alabama, p.Get("method").Text+" "+p.Get("unit").Text+" "+p.Get("from").Text+"→"+p.Get("to").Text)
	}
	if len(alabama) == 0 || alabama[len(alabama)-1] != `hamilton Tarrow <"&"> 200→201` {
		t.Errorf("paradoxes %v", alabama)
	}
}

func TestSweepChartWellFormed(t *testing.T) {
	set := analysis.SweepAll(sweepScenario(), []engine.Method{engine.Hamilton, engine.Adams}, 1, 205)
	out := encode(t, svg.Encoder{}, format.Sweep(`Chart <of> "Tarrow" & co`, set))
	d := xml.NewDecoder(strings.NewReader(out))
	circles, steps := 0, 0
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("not well-formed XML: %v", err)
		}
		if se, ok := tok.(xml.StartElement); ok {
			for _, a := range se.Attr {
				if a.Name.Local == "class" && strings.HasPrefix(a.Value, "sc-step sc-u") && se.Name.Local == "path" {
					steps++
				}
				if a.Name.Local == "class" && strings.HasPrefix(a.Value, "sc-ring sc-u") {
					circles++
				}
			}
			switch se.Name.Local {
			case "script", "foreignObject":
				t.Errorf("unexpected element %s", se.Name.Local)
			}
		}
	}
	if steps != 6 {
		t.Errorf("%d step lines, want 3 units × 2 methods", steps)
	}
	if circles != len(set.Paradoxes[0]) || circles == 0 {
		t.Errorf("%d rings for %d Alabama paradoxes", circles, len(set.Paradoxes[0]))
	}
	if strings.Contains(out, `Tarrow <"&">`) || !strings.Contains(out, "Tarrow &lt;&#34;&amp;&#34;&gt;") {
		t.Error("unit name not escaped")
	}
	if !strings.Contains(out, "Not an official apportionment.") {
		t.Error("no caution in the chart")
	}
}

func TestSweepText(t *testing.T) {
	set := analysis.SweepAll(sweepScenario(), []engine.Method{engine.Hamilton}, 199, 202)
	out := encode(t, text.Encoder{}, format.Sweep("", set))
	for _, want := range []string{"House sizes 199 to 202", "Tarrow <\"&\"> −1, Ulm +1, Vesk +1", "Alabama paradoxes in this range: 1", "Tarrow <\"&\"> has 10 seats in a house of 200 but 9 in a house of 201"} {
		if !strings.Contains(out, want) {
			t.Errorf("text lacks %q:\n%s", want, out)
		}
	}
}

// Example: one apportionment written as text, the form a terminal shows.
func Example() {
	s := engine.Scenario{Seats: 7, Method: engine.Jefferson, Units: []engine.Unit{
		{Name: "Harbour School", Population: engine.Whole(640)},
		{Name: "Ridge School", Population: engine.Whole(410)},
		{Name: "Fen School", Population: engine.Whole(150)},
	}}
	res, err := engine.Allot(&s, engine.Full)
	if err != nil {
		panic(err)
	}
	d := format.Allotment("Schools (invented)", res, &s, format.AllotOptions{})
	csv.Encoder{}.Encode(os.Stdout, d)
	// Output:
	// method,house_size,default_min,default_max,threshold,tie_rule,unit,population,min,max,excluded,quota,lower_quota,upper_quota,seats,meets_quota,tied,at_min,at_max,unassigned,last_priority,next_priority,gain_margin,lose_margin
	// jefferson,7,0,,0,none,Harbour School,640,0,,false,3.733333,3,4,4,true,false,false,false,0,160,128,111,94
	// jefferson,7,0,,0,none,Ridge School,410,0,,false,2.391667,2,3,2,true,false,false,false,0,205,136.667,41,154
	// jefferson,7,0,,0,none,Fen School,150,0,,false,0.875,0,1,1,true,false,false,false,0,150,75,171,14
}
