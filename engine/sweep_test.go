package engine

import (
	"fmt"
	"reflect"
	"strconv"
	"testing"

	"pgregory.net/rapid"
)

// sweepScenario draws a scenario for sweep tests: few units with small
// populations (so that ties are common), optional bounds, threshold and tie
// rule.
func sweepScenario(t *rapid.T, m Method) *Scenario {
	n := rapid.IntRange(1, 7).Draw(t, "units")
	maxPop := rapid.SampledFrom([]uint64{6, 40, 1000, 1_000_000}).Draw(t, "maxPop")
	s := &Scenario{Method: m}
	for i := 0; i < n; i++ {
		u := Unit{Name: "u" + strconv.Itoa(i), Population: Decimal{Coef: rapid.Uint64Range(0, maxPop).Draw(t, "pop")}}
		if rapid.IntRange(0, 5).Draw(t, "ownMin") == 0 {
			v := rapid.IntRange(0, 3).Draw(t, "min")
			u.Min = &v
		}
		if rapid.IntRange(0, 5).Draw(t, "ownMax") == 0 {
			v := rapid.IntRange(0, 8).Draw(t, "max")
			u.Max = &v
		}
		s.Units = append(s.Units, u)
	}
	if rapid.IntRange(0, 3).Draw(t, "bounds") == 0 {
		s.Min = rapid.IntRange(0, 2).Draw(t, "defaultMin")
		s.Max = rapid.IntRange(0, 9).Draw(t, "defaultMax")
	}
	if rapid.IntRange(0, 5).Draw(t, "threshold") == 0 {
		s.Threshold = Decimal{Coef: rapid.Uint64Range(1, 30).Draw(t, "pct"), Places: 2}
	}
	switch rapid.IntRange(0, 3).Draw(t, "tie") {
	case 1:
		s.Tie = TieRule{Kind: TieByOrder}
	case 2:
		s.Tie = TieRule{Kind: TieByLot, Seed: rapid.Uint64().Draw(t, "seed")}
	}
	return s
}

// TestSweepMatchesAllot checks the sweep against separate Allot calls at
// every house size, for every method: the same seats, the same ties, the
// same unassigned seats, and the same error where a size is refused.
func TestSweepMatchesAllot(t *testing.T) {
	for _, m := range Methods() {
		t.Run(m.String(), func(t *testing.T) {
			rapid.Check(t, func(t *rapid.T) {
				s := sweepScenario(t, m)
				from := rapid.IntRange(1, 12).Draw(t, "from")
				to := from + rapid.IntRange(0, 30).Draw(t, "span")
				sw, err := Sweep(s, from, to)
				if err != nil {
					// Then no size in range may be apportioned.
					for h := from; h <= to; h++ {
						c := *s
						c.Seats = h
						if _, aerr := Allot(&c, 0); aerr == nil {
							t.Fatalf("Sweep(%d..%d) failed (%v) but Allot at %d succeeds", from, to, err, h)
						}
					}
					return
				}
				if sw.From != from || sw.To != to || len(sw.Sizes) != to-from+1 {
					t.Fatalf("sweep covers %d..%d with %d sizes", sw.From, sw.To, len(sw.Sizes))
				}
				for h := from; h <= to; h++ {
					z := sw.Size(h)
					c := *s
					c.Seats = h
					res, aerr := Allot(&c, 0)
					if aerr != nil {
						if z.Err == nil || z.Err.Error() != aerr.Error() {
							t.Fatalf("size %d: sweep error %v, Allot error %v", h, z.Err, aerr)
						}
						continue
					}
					if z.Err != nil {
						t.Fatalf("size %d: sweep error %v, Allot succeeds", h, z.Err)
					}
					if got, want := z.Seats, seatsOf(res); !reflect.DeepEqual(got, want) {
						t.Fatalf("size %d: sweep seats %v, Allot %v", h, got, want)
					}
					if z.Unassigned != res.Unassigned {
						t.Fatalf("size %d: sweep unassigned %d, Allot %d", h, z.Unassigned, res.Unassigned)
					}
					if got, want := tiesText(z.Ties), tiesText(res.Ties); got != want {
						t.Fatalf("size %d: sweep ties %s, Allot %s", h, got, want)
					}
				}
			})
		})
	}
}

func tiesText(ts []Tie) string {
	s := ""
	for _, t := range ts {
		s += fmt.Sprintf("{%v %d %s %v %s}", t.Units, t.Seats, t.Value.Text, t.Winners, t.Rule)
	}
	return s
}

// TestSweepNoAlabamaDivisor checks that no divisor method ever takes a seat
// from a unit when the house grows by one (house monotonicity; Balinski and
// Young, Fair Representation, 2nd ed. 2001, ch. 6 and Appendix A), on the
// seats held outright and on seats given by input order.
func TestSweepNoAlabamaDivisor(t *testing.T) {
	for _, m := range Methods() {
		if !m.IsDivisor() {
			continue
		}
		t.Run(m.String(), func(t *testing.T) {
			rapid.Check(t, func(t *rapid.T) {
				s := sweepScenario(t, m)
				if s.Tie.Kind == TieByLot {
					// Each size draws its own lot; a different draw is not
					// the method's doing.
					s.Tie = TieRule{}
				}
				sw, err := Sweep(s, 1, 40)
				if err != nil {
					return
				}
				for k := 1; k < len(sw.Sizes); k++ {
					prev, cur := &sw.Sizes[k-1], &sw.Sizes[k]
					if prev.Err != nil || cur.Err != nil {
						continue
					}
					for i := range cur.Seats {
						if cur.Seats[i] < prev.Seats[i] {
							t.Fatalf("%s: unit %d has %d seats at %d and %d at %d", m, i, prev.Seats[i], prev.House, cur.Seats[i], cur.House)
						}
					}
				}
			})
		})
	}
}

func TestSweepErrors(t *testing.T) {
	units := []Unit{{Name: "a", Population: Whole(10)}, {Name: "b", Population: Whole(20)}, {Name: "c", Population: Whole(30)}}
	for _, tc := range []struct {
		s        Scenario
		from, to int
		want     string
	}{
		{Scenario{Units: units, Method: Webster}, 0, 5, "from at least 1"},
		{Scenario{Units: units, Method: Webster}, 5, 4, "lowest first"},
		{Scenario{Units: units, Method: Adams}, 1, 2, "before any unit gets two"},
		{Scenario{Units: units, Method: Webster, Max: 1}, 4, 9, "maximums"},
		{Scenario{Units: units, Method: 0}, 1, 9, "method"},
		{Scenario{Units: units, Method: Webster}, 1, MaxSweepCells, "limit"},
	} {
		_, err := Sweep(&tc.s, tc.from, tc.to)
		if err == nil || !contains(err.Error(), tc.want) {
			t.Errorf("Sweep(%v, %d, %d) error = %v, want one containing %q", tc.s.Method, tc.from, tc.to, err, tc.want)
		}
	}
	// A range whose middle alone can be apportioned: Adams needs 3 seats,
	// the maximums allow at most 6.
	s := Scenario{Units: units, Method: Adams, Max: 2}
	sw, err := Sweep(&s, 1, 9)
	if err != nil {
		t.Fatal(err)
	}
	for _, z := range sw.Sizes {
		if ok := z.House >= 3 && z.House <= 6; ok != (z.Err == nil) {
			t.Errorf("size %d: error %v", z.House, z.Err)
		}
	}
}

func contains(s, sub string) bool {
	for i := 0; i+len(sub) <= len(s); i++ {
		if s[i:i+len(sub)] == sub {
			return true
		}
	}
	return false
}

// TestSweepTieAtEverySize: two equal units tie at every odd house size
// under Webster; the sweep reports each of those ties.
func TestSweepTieAtEverySize(t *testing.T) {
	s := Scenario{Method: Webster, Units: []Unit{{Name: "Ashwick", Population: Whole(500)}, {Name: "Brill", Population: Whole(500)}}}
	sw, err := Sweep(&s, 1, 10)
	if err != nil {
		t.Fatal(err)
	}
	for _, z := range sw.Sizes {
		odd := z.House%2 == 1
		if odd != (len(z.Ties) == 1) || odd != (z.Unassigned == 1) {
			t.Errorf("size %d: ties %v, unassigned %d", z.House, z.Ties, z.Unassigned)
		}
		if z.Seats[0] != z.House/2 || z.Seats[1] != z.House/2 {
			t.Errorf("size %d: seats %v", z.House, z.Seats)
		}
	}
}

func ExampleSweep() {
	s := &Scenario{Method: Jefferson, Units: []Unit{
		{Name: "Norrow", Population: Whole(6000)},
		{Name: "Quillan", Population: Whole(3000)},
		{Name: "Vesk", Population: Whole(1000)},
	}}
	sw, _ := Sweep(s, 1, 6)
	for _, z := range sw.Sizes {
		fmt.Println(z.House, z.Seats, len(z.Ties))
	}
	// Output:
	// 1 [1 0 0] 0
	// 2 [1 0 0] 1
	// 3 [2 1 0] 0
	// 4 [3 1 0] 0
	// 5 [3 1 0] 1
	// 6 [4 2 0] 0
}

// benchUnits returns 50 units with populations spread over three orders of
// magnitude, the same on every run.
func benchUnits() []Unit {
	units := make([]Unit, 50)
	x := uint64(88172645463325252)
	for i := range units {
		x ^= x << 13
		x ^= x >> 7
		x ^= x << 17
		units[i] = Unit{Name: "unit" + strconv.Itoa(i), Population: Whole(10_000 + x%10_000_000)}
	}
	return units
}

// BenchmarkSweep sweeps house sizes 1 to 10,000 over 50 units by each
// method (Adams, Dean and Huntington–Hill start at 50, where every unit can
// have its first seat; the smaller sizes are refused).
func BenchmarkSweep(b *testing.B) {
	units := benchUnits()
	for _, m := range Methods() {
		b.Run(m.String(), func(b *testing.B) {
			s := &Scenario{Units: units, Method: m}
			for b.Loop() {
				if _, err := Sweep(s, 1, 10_000); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkSweepVsAllot measures, in one run, the one-pass sweep of house
// sizes 1 to 10,000 over 50 units by Webster against the baseline of one
// Allot call (without the optional explanations) per size.
func BenchmarkSweepVsAllot(b *testing.B) {
	units := benchUnits()
	s := &Scenario{Units: units, Method: Webster}
	b.Run("one-pass", func(b *testing.B) {
		for b.Loop() {
			if _, err := Sweep(s, 1, 10_000); err != nil {
				b.Fatal(err)
			}
		}
	})
	b.Run("allot-per-size", func(b *testing.B) {
		for b.Loop() {
			for h := 1; h <= 10_000; h++ {
				c := *s
				c.Seats = h
				if _, err := Allot(&c, 0); err != nil {
					b.Fatal(err)
				}
			}
		}
	})
}
