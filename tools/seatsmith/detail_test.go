package main

import (
	"strconv"
	"strings"
	"testing"

	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
)

func TestPlanDetail(t *testing.T) {
	units := func(n int) []engine.Unit { return make([]engine.Unit, n) }
	th, _ := engine.ParseDecimal("0.05")
	for _, c := range []struct {
		name                 string
		s                    engine.Scenario
		format               string
		mAsked, m, oAsked, o bool
		want                 engine.Detail
		skipped              string
		notes                int
	}{
		{"small divisor", engine.Scenario{Method: engine.Webster, Seats: 40, Units: units(10)}, "text", false, false, false, false, engine.Full, "", 0},
		{"small divisor csv", engine.Scenario{Method: engine.Webster, Seats: 40, Units: units(10)}, "csv", false, false, false, false, engine.WithMargins, "", 0},
		{"small remainder", engine.Scenario{Method: engine.Hamilton, Seats: 40, Units: units(10)}, "json", false, false, false, false, engine.WithMargins, "", 0},
		{"many units divisor", engine.Scenario{Method: engine.Jefferson, Seats: 40, Units: units(autoMarginUnits + 1)}, "text", false, false, false, false, engine.WithOrder, "margins", 1},
		{"divisor closed forms at 10^5", engine.Scenario{Method: engine.Jefferson, Seats: 40, Units: units(autoMarginUnits)}, "csv", false, false, false, false, engine.WithMargins, "", 0},
		{"remainder counts", engine.Scenario{Method: engine.Droop, Seats: 40, Units: units(autoSearchUnits + 1)}, "csv", false, false, false, false, engine.WithMargins, "", 0},
		{"remainder with bounds", engine.Scenario{Method: engine.Droop, Seats: 40, Min: 1, Units: units(autoSearchUnits + 1)}, "csv", false, false, false, false, 0, "margins", 1},
		{"threshold searches", engine.Scenario{Method: engine.Webster, Seats: 40, Threshold: th, Units: units(autoSearchUnits + 1)}, "csv", false, false, false, false, 0, "margins", 1},
		{"asked for margins", engine.Scenario{Method: engine.Droop, Seats: 40, Units: units(autoSearchUnits + 1)}, "csv", true, true, false, false, engine.WithMargins, "", 0},
		{"refused margins", engine.Scenario{Method: engine.Webster, Seats: 40, Units: units(3)}, "json", true, false, false, false, engine.WithOrder, "margins", 0},
		{"large house", engine.Scenario{Method: engine.Webster, Seats: autoOrderSeats + 1, Units: units(3)}, "json", false, false, false, false, engine.WithMargins, "order", 1},
		{"large house asked", engine.Scenario{Method: engine.Webster, Seats: autoOrderSeats + 1, Units: units(3)}, "text", false, false, true, true, engine.Full, "", 0},
		{"large house csv", engine.Scenario{Method: engine.Webster, Seats: autoOrderSeats + 1, Units: units(3)}, "csv", false, false, true, true, engine.WithMargins, "", 0},
		{"refused order", engine.Scenario{Method: engine.Webster, Seats: 10, Units: units(3)}, "text", false, false, true, false, engine.WithMargins, "order", 0},
	} {
		p := planDetail(&c.s, c.format, c.mAsked, c.m, c.oAsked, c.o)
		if p.detail != c.want || strings.Join(p.skipped, ",") != c.skipped || len(p.notes) != c.notes {
			t.Errorf("%s: detail %b skipped %v notes %q; want %b %q and %d notes", c.name, p.detail, p.skipped, p.notes, c.want, c.skipped, c.notes)
		}
	}
}

// TestAllotLargeInput: on a table with more units than costly margins are
// computed for unasked (Hamilton's method with a minimum), allot says on standard error what it left out and how to
// ask for it, and JSON lists it; -margins asks for them.
func TestAllotLargeInput(t *testing.T) {
	var b strings.Builder
	b.WriteString("name,population\n")
	for i := 0; i < autoSearchUnits+1; i++ {
		b.WriteString("district-" + strconv.Itoa(i) + "," + strconv.Itoa(1000+i*37%5000) + "\n")
	}
	out, errOut, code := cli(t, b.String(), "allot", "-method", "hamilton", "-min", "1", "-seats", "1500", "-format", "json", "-")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if !strings.Contains(errOut, "margins left out") || !strings.Contains(errOut, "-margins") {
		t.Errorf("stderr does not say margins were left out: %q", errOut)
	}
	v, err := jsondoc.Parse([]byte(out))
	if err != nil {
		t.Fatal(err)
	}
	if sk := v.Get("skipped"); sk == nil || len(sk.Items) != 1 || sk.Items[0].Text != "margins" {
		t.Errorf("skipped = %s", jsondoc.Marshal(v.Get("skipped")))
	}
	if u := v.Get("units").Items[0]; !u.Get("gain_margin").IsNull() {
		t.Errorf("margin computed: %s", jsondoc.Marshal(u))
	}
	// Text and Markdown say it above the table, so that the dashes in the
	// margin columns are not read as "cannot happen".
	for _, format := range []string{"text", "markdown"} {
		out, _, code := cli(t, b.String(), "allot", "-method", "hamilton", "-min", "1", "-seats", "1500", "-format", format, "-")
		if code != 0 || !strings.Contains(out, "margins were not computed") {
			t.Errorf("%s output (exit %d) does not say the margins were left out: %.300s", format, code, out)
		}
	}
	// Asked for, on a smaller table, margins come back without a note.
	small := strings.Join(strings.SplitAfter(b.String(), "\n")[:60], "")
	out, errOut, code = cli(t, small, "allot", "-method", "hamilton", "-min", "1", "-seats", "100", "-margins", "-format", "csv", "-")
	if code != 0 || errOut != "" {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if line := strings.Split(out, "\n")[1]; strings.Count(line, ",-,") != 0 {
		t.Errorf("margins missing: %s", line)
	}
}
