package report

import (
	"bytes"
	"encoding/xml"
	"io"
	"strings"
	"testing"

	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
)

func sweepScenario() engine.Scenario {
	return engine.Scenario{Units: []engine.Unit{
		{Name: `Tarrow <"&">`, Population: engine.Whole(940)},
		{Name: "Ulm", Population: engine.Whole(9030)},
		{Name: "Vesk", Population: engine.Whole(10030)},
	}}
}

func TestSweepDoc(t *testing.T) {
	set := SweepAll(sweepScenario(), []engine.Method{engine.Hamilton, engine.Adams}, 1, 201)
	v, err := jsondoc.Parse(jsondoc.Marshal(set.Doc("t")))
	if err != nil {
		t.Fatal(err)
	}
	if v.Get("kind").Text != "sweep" || v.Get("caution").Text != Caution {
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
	set := SweepAll(sweepScenario(), []engine.Method{engine.Hamilton, engine.Adams}, 1, 205)
	svg := SweepChart(`Chart <of> "Tarrow" & co`, set)
	d := xml.NewDecoder(strings.NewReader(svg))
	circles, paths := 0, 0
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("not well-formed XML: %v", err)
		}
		if se, ok := tok.(xml.StartElement); ok {
			switch se.Name.Local {
			case "circle":
				circles++
			case "path":
				paths++
			case "script", "foreignObject":
				t.Errorf("unexpected element %s", se.Name.Local)
			}
		}
	}
	if paths != 6 {
		t.Errorf("%d step lines, want 3 units × 2 methods", paths)
	}
	if circles != len(set.Paradoxes[0]) || circles == 0 {
		t.Errorf("%d rings for %d Alabama paradoxes", circles, len(set.Paradoxes[0]))
	}
	if strings.Contains(svg, `Tarrow <"&">`) || !strings.Contains(svg, "Tarrow &lt;&quot;&amp;&quot;&gt;") {
		t.Error("unit name not escaped")
	}
	if !strings.Contains(svg, "Not an official apportionment.") {
		t.Error("no caution in the chart")
	}
}

func TestSweepTextAndCSV(t *testing.T) {
	set := SweepAll(sweepScenario(), []engine.Method{engine.Hamilton}, 199, 202)
	var b bytes.Buffer
	if err := WriteSweepText(&b, "", set); err != nil {
		t.Fatal(err)
	}
	out := b.String()
	for _, want := range []string{"House sizes 199 to 202", "-Tarrow", "+Ulm +Vesk", "Alabama paradoxes in this range: 1", "Tarrow <\"&\"> has 10 seats in a house of 200 but 9 in a house of 201"} {
		if !strings.Contains(out, want) {
			t.Errorf("text lacks %q:\n%s", want, out)
		}
	}
	b.Reset()
	if err := SweepCSVTable(set).WriteCSV(&b); err != nil {
		t.Fatal(err)
	}
	if !strings.HasPrefix(b.String(), "method,house,\"Tarrow <\"\"&\"\">\",Ulm,Vesk,unassigned,notes\nhamilton,199,") {
		t.Errorf("csv:\n%s", b.String())
	}
}
