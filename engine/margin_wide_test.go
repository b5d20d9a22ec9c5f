package engine

import (
	"testing"

	"pgregory.net/rapid"
)

// genWideScenario draws a scenario of the kind the pages and the CLI are
// given: up to a dozen units under a largest-remainder method, up to
// twenty under a divisor method (always with a threshold, or with ties left
// open, where its margins are not closed forms); populations from none and
// a few people to about 10^12, some with decimals, some repeated (ties);
// minimums and maximums per unit and for the scenario, maximums that
// cannot bind, thresholds, tie rules; some cannot be apportioned.
func genWideScenario(t *rapid.T, m Method) *Scenario {
	maxUnits := 20
	if m.IsLargestRemainder() {
		maxUnits = 12
	}
	n := rapid.IntRange(1, maxUnits).Draw(t, "units")
	h := rapid.IntRange(1, 1000).Draw(t, "seats")
	s := &Scenario{Method: m, Seats: h}
	places := 0
	if rapid.IntRange(0, 3).Draw(t, "decimals") == 0 {
		places = rapid.IntRange(1, 6).Draw(t, "places")
	}
	for i := 0; i < n; i++ {
		var p Decimal
		switch {
		case i > 0 && rapid.IntRange(0, 5).Draw(t, "repeat") == 0:
			p = s.Units[rapid.IntRange(0, i-1).Draw(t, "of")].Population
		case rapid.IntRange(0, 20).Draw(t, "empty") == 0:
		default:
			mag := uint64(1)
			for k := rapid.IntRange(0, 12).Draw(t, "digits"); k > 0; k-- {
				mag *= 10
			}
			p = Decimal{Coef: rapid.Uint64Range(1, mag).Draw(t, "pop")}
			if places > 0 && mag <= 1_000_000_000_000 {
				p = Decimal{Coef: p.Coef*pow10(places) + rapid.Uint64Range(0, pow10(places)-1).Draw(t, "fraction"), Places: uint8(places)}
			}
			p = p.trim()
		}
		un := Unit{Name: testNames[i%len(testNames)] + suffix(i), Population: p}
		if rapid.IntRange(0, 9).Draw(t, "hasMin") == 0 {
			v := rapid.IntRange(0, 3).Draw(t, "min")
			un.Min = &v
		}
		if rapid.IntRange(0, 9).Draw(t, "hasMax") == 0 {
			v := rapid.IntRange(0, h+1).Draw(t, "max")
			un.Max = &v
		}
		s.Units = append(s.Units, un)
	}
	if rapid.IntRange(0, 3).Draw(t, "hasDefMin") == 0 {
		s.Min = rapid.IntRange(0, 2).Draw(t, "defMin")
	}
	if rapid.IntRange(0, 3).Draw(t, "hasDefMax") == 0 {
		s.Max = rapid.IntRange(0, h/2+2).Draw(t, "defMax")
	}
	if m.IsDivisor() || rapid.IntRange(0, 3).Draw(t, "hasThreshold") == 0 {
		s.Threshold = rapid.SampledFrom([]Decimal{{Coef: 1, Places: 2}, {Coef: 3, Places: 2}, {Coef: 5, Places: 2}, {Coef: 1, Places: 1}, {Coef: 1, Places: 3}}).Draw(t, "threshold")
	}
	if m.IsDivisor() && rapid.Bool().Draw(t, "openTies") {
		s.Threshold = Decimal{}
		s.Tie = TieRule{}
	} else {
		s.Tie = drawTieRule(t)
	}
	return s
}

// TestMarginsMatchSearchWide holds the margins to the reference search
// (checkMarginsMatchSearch) on genWideScenario's scenarios.
func TestMarginsMatchSearchWide(t *testing.T) {
	for _, m := range Methods() {
		t.Run(m.String(), func(t *testing.T) {
			rapid.Check(t, func(t *rapid.T) { checkMarginsMatchSearch(t, genWideScenario(t, m)) })
		})
	}
}
