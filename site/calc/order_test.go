package calc

import (
	"math/rand/v2"
	"strconv"
	"strings"
	"testing"

	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
	"seatsmith/engine/render"
)

// withoutOrder is the output tree of resp with the seat order's folded
// section taken out, as HTML, and that section's summary line.
func withoutOrder(t *testing.T, resp *jsondoc.Value) (rest, summary string) {
	t.Helper()
	n, ok := render.FromDoc(resp.Get("output"))
	if !ok {
		t.Fatalf("no output tree in %.300s", jsondoc.Marshal(resp))
	}
	var drop func(*render.Node)
	drop = func(x *render.Node) {
		kept := x.Kids[:0]
		for _, k := range x.Kids {
			if c, _ := k.Attr("class"); k.Tag == "details" && c == "sc-order" {
				summary = k.Kids[0].TextContent()
				continue
			}
			drop(k)
			kept = append(kept, k)
		}
		x.Kids = kept
	}
	drop(n)
	return render.HTML(n), summary
}

// TestOrderLeftOut checks that a request without the seat order answers
// exactly as a full one but for the order's table: a full calculator of a
// divisor method says the order is pending and keeps its summary line,
// with the same count; anything else, or an export, is not affected.
func TestOrderLeftOut(t *testing.T) {
	divisor := `{"seats": 40, "method": "huntington-hill", "min": 1, "units": [{"name": "A", "population": 2694457}, {"name": "B", "population": 2079562}, {"name": "C", "population": 93288}]}`
	remainder := strings.Replace(divisor, "huntington-hill", "hamilton", 1)
	cases := []struct {
		block, mode string
		export      bool
		pending     bool
	}{
		{divisor, "full", false, true},
		{divisor, "full", true, false},
		{divisor, "compact", false, false},
		{remainder, "full", false, false},
		{vessaria(t), "full", false, true},
	}
	for _, c := range cases {
		name := c.mode + " " + c.block[:40]
		kv := []any{"mode", jsondoc.Str(c.mode), "export", jsondoc.Boolean(c.export)}
		full := live(request(c.block, kv...))
		left := live(request(c.block, append(kv, "order", jsondoc.Boolean(false))...))
		if got := left.Get("order_pending").Bool; got != c.pending {
			t.Errorf("%s: order_pending %v, want %v", name, got, c.pending)
		}
		if full.Get("order_pending").Bool {
			t.Errorf("%s: order pending when it was not left out", name)
		}
		if c.export && jsondoc.Marshal(left.Get("json")) == nil {
			t.Errorf("%s: no export", name)
		}
		if c.export && string(jsondoc.Marshal(left.Get("json"))) != string(jsondoc.Marshal(full.Get("json"))) {
			t.Errorf("%s: the export differs when the order is left out", name)
		}
		fullRest, fullSummary := withoutOrder(t, full)
		leftRest, leftSummary := withoutOrder(t, left)
		if fullRest != leftRest || fullSummary != leftSummary {
			t.Errorf("%s: the answers differ beyond the order's table:\n full %q %.400s\n left %q %.400s", name, fullSummary, fullRest, leftSummary, leftRest)
		}
		if got := strings.Contains(outputHTML(t, left), `data-role="order-pending"`); got != c.pending {
			t.Errorf("%s: pending note shown %v, want %v", name, got, c.pending)
		}
		if c.mode == "full" && c.block != remainder && fullSummary == "" {
			t.Errorf("%s: no seat order section", name)
		}
	}
}

// TestOrderLen checks on random invented scenarios, with minimums, caps,
// thresholds and ties, that the count the folded section shows without
// the order equals the length of the order.
func TestOrderLen(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 11))
	methods := []engine.Method{engine.Jefferson, engine.Webster, engine.Adams, engine.Dean, engine.HuntingtonHill, engine.ModifiedSainteLague}
	tested, tied := 0, 0
	for k := 0; k < 6000; k++ {
		s := engine.Scenario{Method: methods[r.IntN(len(methods))], Seats: 1 + r.IntN(60)}
		n := 1 + r.IntN(8)
		for i := 0; i < n; i++ {
			p := 1 + r.IntN(1000)
			if r.IntN(3) == 0 {
				p = 100 * (1 + r.IntN(5)) // equal populations make ties
			}
			s.Units = append(s.Units, engine.Unit{Name: "U" + strconv.Itoa(i), Population: engine.Whole(uint64(p))})
		}
		if r.IntN(3) == 0 {
			s.Min = r.IntN(3)
		}
		if r.IntN(4) == 0 {
			s.Max = 1 + r.IntN(10)
		}
		if r.IntN(5) == 0 {
			s.Threshold, _ = engine.ParseDecimal("0.05")
		}
		switch r.IntN(3) {
		case 1:
			s.Tie = engine.TieRule{Kind: engine.TieByOrder}
		case 2:
			s.Tie = engine.TieRule{Kind: engine.TieByLot, Seed: uint64(k)}
		}
		res, err := engine.Allot(&s, engine.WithOrder)
		if err != nil {
			continue
		}
		tested++
		if len(res.Ties) > 0 {
			tied++
		}
		if got := orderLen(res); got != len(res.Order) {
			t.Fatalf("scenario %+v: counted %d seats in the order, the order has %d", s, got, len(res.Order))
		}
	}
	if tested < 2000 || tied < 100 {
		t.Fatalf("only %d scenarios could be apportioned, %d of them with a tie", tested, tied)
	}
}
