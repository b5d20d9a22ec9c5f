package engine

import (
	"slices"
	"testing"
)

// Exact ties are reported with their units and the seats they contest, the
// contested seats stay unassigned without a rule, and the rules "order" and
// "lot:SEED" settle them reproducibly.

func tieScenario(m Method, rule TieRule) *Scenario {
	// Three equal units share four seats: each takes one and they tie for
	// the fourth under every method (a unit with no people looks on).
	return &Scenario{Method: m, Seats: 4, Tie: rule, Units: []Unit{
		{Name: "Orlen", Population: Whole(0)},
		{Name: "Tamsk", Population: Whole(1000)},
		{Name: "Brevia", Population: Whole(1000)},
		{Name: "Quill", Population: Whole(1000)},
	}}
}

func TestTiesReported(t *testing.T) {
	for _, m := range Methods() {
		t.Run(m.String(), func(t *testing.T) {
			res, err := Allot(tieScenario(m, TieRule{}), Full)
			if err != nil {
				t.Fatal(err)
			}
			if len(res.Ties) != 1 {
				t.Fatalf("ties %+v, want one", res.Ties)
			}
			tie := res.Ties[0]
			if !slices.Equal(tie.Units, []int{1, 2, 3}) || !slices.Equal(tie.Names, []string{"Tamsk", "Brevia", "Quill"}) {
				t.Errorf("tied units %v %v, want Tamsk, Brevia, Quill", tie.Units, tie.Names)
			}
			if tie.Seats != 1 {
				t.Errorf("contested seats %d, want 1", tie.Seats)
			}
			if got := seatsOf(res); !slices.Equal(got, []int{0, 1, 1, 1}) {
				t.Errorf("outright seats %v, want [0 1 1 1]", got)
			}
			if res.Unassigned != tie.Seats || tie.Winners != nil || tie.Rule != "none" {
				t.Errorf("unassigned %d, winners %v, rule %q: want %d, none, \"none\"", res.Unassigned, tie.Winners, tie.Rule, tie.Seats)
			}
			for i, u := range res.Units {
				if u.Tied != (i > 0) {
					t.Errorf("unit %d Tied = %v", i, u.Tied)
				}
			}
			if res.Units[1].Seats != res.Units[2].Seats || res.Units[2].Seats != res.Units[3].Seats {
				t.Errorf("tied units hold different seats outright: %v", seatsOf(res))
			}
			if m.IsDivisor() && (!res.Divisor.Single || res.Divisor.Certificate != "") {
				t.Errorf("divisor range %+v, want a single point", res.Divisor)
			}
		})
	}
}

func TestTieRulesSettle(t *testing.T) {
	for _, m := range Methods() {
		t.Run(m.String(), func(t *testing.T) {
			open, _ := Allot(tieScenario(m, TieRule{}), 0)
			k := open.Ties[0].Seats
			// By order: the first tied units in the input win.
			res, err := Allot(tieScenario(m, TieRule{Kind: TieByOrder}), WithOrder)
			if err != nil {
				t.Fatal(err)
			}
			if w := res.Ties[0].Winners; !slices.Equal(w, []int{1, 2, 3}[:k]) {
				t.Errorf("order winners %v", w)
			}
			if res.Unassigned != 0 || res.Ties[0].Rule != "order" {
				t.Errorf("unassigned %d, rule %q", res.Unassigned, res.Ties[0].Rule)
			}
			for _, w := range res.Ties[0].Winners {
				if res.Units[w].Seats != open.Units[w].Seats+1 {
					t.Errorf("winner %d has %d seats, %d outright", w, res.Units[w].Seats, open.Units[w].Seats)
				}
			}
			// By lot: the same seed draws the same winners; over many seeds
			// every tied unit wins sometimes.
			won := map[int]int{}
			for seed := uint64(0); seed < 60; seed++ {
				rule := TieRule{Kind: TieByLot, Seed: seed}
				a, err := Allot(tieScenario(m, rule), 0)
				if err != nil {
					t.Fatal(err)
				}
				b, _ := Allot(tieScenario(m, rule), 0)
				if !slices.Equal(a.Ties[0].Winners, b.Ties[0].Winners) || !slices.Equal(seatsOf(a), seatsOf(b)) {
					t.Fatalf("seed %d drew %v then %v", seed, a.Ties[0].Winners, b.Ties[0].Winners)
				}
				if len(a.Ties[0].Winners) != k || a.Unassigned != 0 || a.Ties[0].Rule != rule.String() {
					t.Fatalf("seed %d: winners %v, unassigned %d, rule %q", seed, a.Ties[0].Winners, a.Unassigned, a.Ties[0].Rule)
				}
				for _, w := range a.Ties[0].Winners {
					won[w]++
				}
			}
			for u := 1; u <= 3; u++ {
				if won[u] == 0 {
					t.Errorf("unit %d never won the lot in 60 draws: %v", u, won)
				}
			}
		})
	}
}

func TestParseTieRule(t *testing.T) {
	for _, c := range []struct {
		in   string
		want TieRule
		ok   bool
	}{
		{"", TieRule{}, true}, {"none", TieRule{}, true}, {"Order", TieRule{Kind: TieByOrder}, true},
		{"lot", TieRule{Kind: TieByLot, Seed: 1}, true}, {"lot:42", TieRule{Kind: TieByLot, Seed: 42}, true},
		{"lot:-1", TieRule{}, false}, {"lot:x", TieRule{}, false}, {"coin", TieRule{}, false},
	} {
		got, err := ParseTieRule(c.in)
		if (err == nil) != c.ok || (c.ok && got != c.want) {
			t.Errorf("ParseTieRule(%q) = %v, %v", c.in, got, err)
		}
		if err != nil {
			if e, isE := err.(*Error); !isE || e.Field != "tie" {
				t.Errorf("ParseTieRule(%q) error %v, want *Error with Field tie", c.in, err)
			}
		}
		if c.ok {
			if back, _ := ParseTieRule(got.String()); back != got {
				t.Errorf("round trip of %v gives %v", got, back)
			}
		}
	}
}
