package engine

import (
	"strconv"
	"testing"

	"pgregory.net/rapid"
)

// genClaimScenario draws a largest-remainder scenario without bounds for
// the claim table: tens to hundreds of units whose populations spread over
// decades, sometimes with a few giants holding most of the house, units
// without people, equal populations, decimals and a threshold.
func genClaimScenario(t *rapid.T, m Method) *Scenario {
	n := rapid.IntRange(1, 240).Draw(t, "units")
	s := &Scenario{Method: m, Seats: rapid.IntRange(1, rapid.SampledFrom([]int{n, 10 * n, 100_000}).Draw(t, "maxSeats")).Draw(t, "seats")}
	places := uint8(rapid.IntRange(0, 3).Draw(t, "places"))
	giants := rapid.IntRange(0, 3).Draw(t, "giants")
	var last uint64
	for i := 0; i < n; i++ {
		var p uint64
		switch {
		case i < giants:
			p = rapid.Uint64Range(1_000_000, 1_000_000_000_000).Draw(t, "giant")
		case rapid.IntRange(0, 9).Draw(t, "same") == 0:
			p = last
		default:
			p = 1
			for k := rapid.IntRange(0, 9).Draw(t, "decades"); k > 0; k-- {
				p *= 10
			}
			p = rapid.Uint64Range(0, 9*p).Draw(t, "pop")
		}
		last = p
		s.Units = append(s.Units, Unit{Name: "u" + strconv.Itoa(i), Population: Decimal{Coef: p, Places: places}.trim()})
	}
	if rapid.IntRange(0, 4).Draw(t, "hasThreshold") == 0 {
		s.Threshold = Decimal{Coef: uint64(rapid.IntRange(1, 50).Draw(t, "share")), Places: 3}
	}
	s.Tie = drawTieRule(t)
	return s
}

// TestClaimTableMatchesCount: the margins counted from the claim table
// (binary searches, and the crossing selected among a few claims) equal
// those counted unit by unit.
func TestClaimTableMatchesCount(t *testing.T) {
	for _, m := range []Method{Hamilton, Droop} {
		t.Run(m.String(), func(t *testing.T) {
			rapid.Check(t, func(t *rapid.T) {
				s := genClaimScenario(t, m)
				pr, err := prepare(s)
				if err != nil {
					return
				}
				o, err := pr.run(false)
				if err != nil {
					return
				}
				tab := pr.newClaimTable()
				if tab == nil {
					return
				}
				fast, slow := pr.newMarginWorker(tab), pr.newMarginWorker(nil)
				for i := range pr.pops {
					a := o.seats[i]
					g1, ok1 := fast.gain(i, a)
					g2, ok2 := slow.gain(i, a)
					if ok1 != ok2 || g1 != g2 {
						t.Fatalf("unit %d (%d seats): gain %d %v from the table, %d %v counted", i, a, g1, ok1, g2, ok2)
					}
					l1, ok1 := fast.lose(i, a)
					l2, ok2 := slow.lose(i, a)
					if ok1 != ok2 || l1 != l2 {
						t.Fatalf("unit %d (%d seats): lose %d %v from the table, %d %v counted", i, a, l1, ok1, l2, ok2)
					}
				}
			})
		})
	}
}
