package engine

import (
	"testing"

	"pgregory.net/rapid"
)

// Margins against brute force. For a small scenario, every unit's gain
// margin is found by raising its population one person (one unit of the
// last decimal place) at a time, and its lose margin by lowering it, each
// probe a complete Allot with no tie rule, until the unit holds more (or
// fewer) seats outright than in the result. The engine's Gain and Lose must
// be exactly these numbers, for every method, with and without bounds and
// thresholds.

// outrightSeats returns unit i's outright seats with its population set to
// c × 10^-places, or -1 when the scenario has no apportionment then.
func outrightSeats(s *Scenario, i int, c uint64, places uint8) int {
	t := cloneScenario(s)
	t.Tie = TieRule{}
	t.Units[i].Population = Decimal{Coef: c, Places: places}.trim()
	res, err := Allot(t, SeatsOnly)
	if err != nil {
		return -1
	}
	return res.Units[i].Seats
}

// scaledPops writes every population with the scenario's largest number of
// decimal places.
func scaledPops(s *Scenario) (pops []uint64, places uint8, total uint64) {
	for _, u := range s.Units {
		places = max(places, u.Population.Places)
	}
	for _, u := range s.Units {
		c := u.Population.Coef * pow10(int(places-u.Population.Places))
		pops = append(pops, c)
		total += c
	}
	return
}

// bruteGain scans x = 1, 2, ... up to limit.
func bruteGain(s *Scenario, i, a int, limit uint64) (uint64, bool) {
	pops, places, _ := scaledPops(s)
	for x := uint64(1); x <= limit; x++ {
		if outrightSeats(s, i, pops[i]+x, places) > a {
			return x, true
		}
	}
	return 0, false
}

func bruteLose(s *Scenario, i, a int) (uint64, bool) {
	pops, places, _ := scaledPops(s)
	for x := uint64(1); x <= pops[i]; x++ {
		if k := outrightSeats(s, i, pops[i]-x, places); k >= 0 && k < a {
			return x, true
		}
	}
	return 0, false
}

// genMarginScenario draws a tiny scenario for the brute-force margin test.
func genMarginScenario(t *rapid.T, m Method) *Scenario {
	s := genScenario(t, m, 4, 60, 6, rapid.Bool().Draw(t, "bounds"))
	for i := range s.Units {
		if s.Units[i].Population.Places > 1 {
			s.Units[i].Population = Decimal{Coef: s.Units[i].Population.Coef, Places: 1}.trim()
		}
	}
	if !s.Threshold.IsZero() {
		// Thresholds of a tenth or more keep the brute-force scan short.
		s.Threshold = rapid.SampledFrom([]Decimal{{Coef: 1, Places: 1}, {Coef: 2, Places: 1}, {Coef: 25, Places: 2}}).Draw(t, "bigThreshold")
	}
	s.Tie = rapid.SampledFrom([]TieRule{{}, {}, {Kind: TieByOrder}, {Kind: TieByLot, Seed: 3}}).Draw(t, "tie")
	return s
}

func TestMarginsBruteForce(t *testing.T) {
	for _, m := range Methods() {
		t.Run(m.String(), func(t *testing.T) {
			rapid.Check(t, func(t *rapid.T) {
				s := genMarginScenario(t, m)
				res, err := Allot(s, WithMargins)
				if err != nil {
					return
				}
				_, places, total := scaledPops(s)
				// Past this change every other unit is below the threshold
				// and unit i's quota is so large that more people change
				// nothing for it: (2H+2)·(P + (H+2)·s) + P/threshold with
				// s one person (2·(H+2)·(P+(H+2)·s) covers both quotas).
				one := pow10(int(places))
				limit := 2 * uint64(s.Seats+2) * (total + uint64(s.Seats+2)*one)
				if !s.Threshold.IsZero() {
					limit += total * pow10(int(s.Threshold.Places)) / s.Threshold.Coef
				}
				for i, u := range res.Units {
					checkMargin(t, s, i, "gain", u.Gain, func() (uint64, bool) {
						if u.Max >= 0 && u.Seats >= u.Max {
							return 0, false
						}
						return bruteGain(s, i, u.Seats, limit)
					})
					checkMargin(t, s, i, "lose", u.Lose, func() (uint64, bool) { return bruteLose(s, i, u.Seats) })
				}
			})
		})
	}
}

func checkMargin(t *rapid.T, s *Scenario, i int, what string, got *Decimal, brute func() (uint64, bool)) {
	t.Helper()
	want, ok := brute()
	_, places, _ := scaledPops(s)
	switch {
	case !ok && got != nil:
		t.Fatalf("unit %d %s margin %s, brute force finds none", i, what, got)
	case ok && got == nil:
		t.Fatalf("unit %d %s margin nil, brute force %s", i, what, Decimal{Coef: want, Places: places}.trim())
	case ok && got.Cmp(Decimal{Coef: want, Places: places}) != 0:
		t.Fatalf("unit %d %s margin %s, brute force %s", i, what, got, Decimal{Coef: want, Places: places}.trim())
	}
}
