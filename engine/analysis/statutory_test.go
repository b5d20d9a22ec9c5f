package analysis

import (
	"strings"
	"testing"

	"pgregory.net/rapid"

	"seatsmith/engine"
)

// The first apportionment of the U.S. House of Representatives: one member
// for every 33,000 persons, fractions dropped (Jefferson's rounding), which
// made a House of 105.
//
// Sources: the representable numbers are those Thomas Jefferson stated in
// his opinion to President Washington of 4 April 1792 on the
// apportionment bill (Papers of George Washington, Presidential Series,
// vol. 10; Founders Online, National Archives); the seats per state are
// those of the Act of 14 April 1792 (1 Stat. 253), as tabulated in St.
// George Tucker's edition of Blackstone's Commentaries (1803), vol. 1,
// appendix note D, "representation according to the first census" (one
// for every thirty-three thousand).
func TestFixedRatio1792(t *testing.T) {
	states := []struct {
		name  string
		pop   uint64
		seats int
	}{
		{"Vermont", 85532, 2}, {"New Hampshire", 141823, 4}, {"Massachusetts", 475327, 14},
		{"Rhode Island", 68444, 2}, {"Connecticut", 235941, 7}, {"New York", 352915, 10},
		{"New Jersey", 179556, 5}, {"Pennsylvania", 432880, 13}, {"Delaware", 55538, 1},
		{"Maryland", 278513, 8}, {"Virginia", 630558, 19}, {"Kentucky", 68705, 2},
		{"North Carolina", 353521, 10}, {"South Carolina", 206236, 6}, {"Georgia", 70843, 2},
	}
	s := &engine.Scenario{Method: engine.Jefferson, Min: 1}
	for _, st := range states {
		s.Units = append(s.Units, engine.Unit{Name: st.name, Population: engine.Whole(st.pop)})
	}
	f, err := ApplyRatio(s, engine.Whole(33000))
	if err != nil {
		t.Fatal(err)
	}
	if f.Seats != 105 || f.Unassigned != 0 {
		t.Errorf("house of %d (%d open), want 105", f.Seats, f.Unassigned)
	}
	for k, u := range f.Units {
		if u.Seats != states[k].seats {
			t.Errorf("%s: %d seats, want %d", u.Name, u.Seats, states[k].seats)
		}
	}
	if v := f.Units[10]; v.Quotient != "19.107818" || v.Lower != "19" || v.Upper != "20" {
		t.Errorf("Virginia: quotient %s between %s and %s", v.Quotient, v.Lower, v.Upper)
	}
	if !strings.Contains(f.Text(), "a house of 105 seats") {
		t.Errorf("text: %s", f.Text())
	}
}

// A quotient exactly on a signpost is a tie between rounding down and up.
func TestFixedRatioTie(t *testing.T) {
	s := &engine.Scenario{Method: engine.Webster, Units: []engine.Unit{
		{Name: "Even", Population: engine.Whole(25000)}, // 2.5 seats of 10,000: on the signpost
		{Name: "Plain", Population: engine.Whole(31000)},
	}}
	f, err := ApplyRatio(s, engine.Whole(10000))
	if err != nil {
		t.Fatal(err)
	}
	if !f.Units[0].Tied || f.Units[0].Seats != 2 || f.Unassigned != 1 || f.Seats != 5 {
		t.Errorf("tie: %+v, house %d, open %d", f.Units[0], f.Seats, f.Unassigned)
	}
	s.Tie = engine.TieRule{Kind: engine.TieByLot, Seed: 3}
	g, err := ApplyRatio(s, engine.Whole(10000))
	if err != nil {
		t.Fatal(err)
	}
	if g.Unassigned != 0 || g.Units[0].Seats != 2+b2i(g.Units[0].Won) {
		t.Errorf("by lot: %+v", g.Units[0])
	}
	s.Tie = engine.TieRule{Kind: engine.TieByOrder}
	if _, err := ApplyRatio(s, engine.Whole(10000)); err == nil {
		t.Errorf("input order accepted for a tie under a fixed ratio")
	}
	s.Tie, s.Max = engine.TieRule{}, 2
	h, _ := ApplyRatio(s, engine.Whole(10000))
	if h.Unassigned != 0 || h.Units[0].Seats != 2 || !h.Units[0].AtMax {
		t.Errorf("a maximum of 2 settles the tie: %+v", h.Units[0])
	}
}

func b2i(b bool) int {
	if b {
		return 1
	}
	return 0
}

// A fixed ratio is the divisor method at that divisor: apportioning the
// house it makes gives every unit the same seats (common practice: the
// divisor method's definition).
func TestPropertyFixedRatioIsDivisorMethod(t *testing.T) {
	var divisors []engine.Method
	for _, m := range engine.Methods() {
		if m.IsDivisor() {
			divisors = append(divisors, m)
		}
	}
	rapid.Check(t, func(t *rapid.T) {
		m := rapid.SampledFrom(divisors).Draw(t, "method")
		n := rapid.IntRange(1, 8).Draw(t, "units")
		s := &engine.Scenario{Method: m}
		for k := range n {
			s.Units = append(s.Units, engine.Unit{Name: string(rune('A' + k)), Population: engine.Whole(rapid.Uint64Range(1, 1_000_000).Draw(t, "pop"))})
		}
		ratio := engine.Whole(rapid.Uint64Range(1000, 200_000).Draw(t, "ratio"))
		f, err := ApplyRatio(s, ratio)
		if err != nil {
			t.Fatal(err)
		}
		if f.Unassigned > 0 || f.Seats == 0 {
			return
		}
		s.Seats = f.Seats
		res, err := engine.Allot(s, 0)
		if err != nil {
			t.Fatalf("Allot at %d seats: %v", f.Seats, err)
		}
		if res.Unassigned > 0 {
			return
		}
		for k, u := range res.Units {
			if u.Seats != f.Units[k].Seats {
				t.Fatalf("%s: ratio gives %d, Allot at %d seats gives %d", u.Name, f.Units[k].Seats, f.Seats, u.Seats)
			}
		}
	})
}

// Base seats are the base plus the method's apportionment of the rest.
func TestBaseSeats(t *testing.T) {
	// Worked example (common practice): 3 units, 2 base seats each, 20
	// seats; the 14 others by Hamilton on 50,000 : 30,000 : 20,000 give
	// quotas 7, 4.2 and 2.8, so 7, 4 and 3; totals 9, 6 and 5.
	s := &engine.Scenario{Method: engine.Hamilton, Seats: 20, Units: []engine.Unit{
		{Name: "Ardent", Population: engine.Whole(50000)},
		{Name: "Bellow", Population: engine.Whole(30000)},
		{Name: "Corran", Population: engine.Whole(20000)},
	}}
	b, err := ApplyBase(s, 2)
	if err != nil {
		t.Fatal(err)
	}
	for k, want := range []int{9, 6, 5} {
		if b.Units[k].Seats != want || b.Units[k].Base != 2 {
			t.Errorf("%s: %d seats, want %d", b.Units[k].Name, b.Units[k].Seats, want)
		}
	}
	if !strings.Contains(b.Text(), "the other 14 seats are apportioned by Hamilton") {
		t.Errorf("text: %s", b.Text())
	}
	if _, err := ApplyBase(s, 7); err == nil {
		t.Errorf("21 base seats in a house of 20 accepted")
	}
	rapid.Check(t, func(t *rapid.T) {
		m := rapid.SampledFrom(engine.Methods()).Draw(t, "method")
		n := rapid.IntRange(1, 8).Draw(t, "units")
		base := rapid.IntRange(0, 3).Draw(t, "base")
		s := &engine.Scenario{Method: m, Seats: n*base + rapid.IntRange(n, 60).Draw(t, "rest"), Tie: engine.TieRule{Kind: engine.TieByOrder}}
		for k := range n {
			s.Units = append(s.Units, engine.Unit{Name: string(rune('A' + k)), Population: engine.Whole(rapid.Uint64Range(1, 100000).Draw(t, "pop"))})
		}
		b, err := ApplyBase(s, base)
		rest := *s
		rest.Seats -= n * base
		res, rerr := engine.Allot(&rest, 0)
		if (err != nil) != (rerr != nil) {
			t.Fatalf("base seats: %v; the rest alone: %v", err, rerr)
		}
		if err != nil {
			return
		}
		total := 0
		for k, u := range b.Units {
			if u.Seats != base+res.Units[k].Seats {
				t.Fatalf("%s: %d, want %d + %d", u.Name, u.Seats, base, res.Units[k].Seats)
			}
			total += u.Seats
		}
		if total != s.Seats {
			t.Fatalf("%d seats of %d", total, s.Seats)
		}
	})
}
