package analysis

import (
	"math/big"
	"strconv"
	"testing"

	"pgregory.net/rapid"

	"seatsmith/engine"
)

// Property tests. Each property names the methods it holds for, after
// Balinski and Young, Fair Representation (2nd ed. 2001): divisor methods
// are house monotone (no Alabama paradox) and population monotone (no
// population paradox); Hamilton satisfies quota; Jefferson never falls
// below lower quota and Adams never rises above upper quota; and each of
// Huntington–Hill, Dean and Webster passes its own pairwise test
// (Huntington 1928).

func drawScenario(t *rapid.T, bounds bool) *engine.Scenario {
	n := rapid.IntRange(2, 7).Draw(t, "units")
	maxPop := rapid.SampledFrom([]uint64{20, 1000, 1_000_000}).Draw(t, "maxPop")
	s := &engine.Scenario{}
	for i := 0; i < n; i++ {
		s.Units = append(s.Units, engine.Unit{Name: "u" + strconv.Itoa(i), Population: engine.Whole(rapid.Uint64Range(1, maxPop).Draw(t, "pop"))})
	}
	if bounds && rapid.Bool().Draw(t, "withBounds") {
		s.Min = rapid.IntRange(0, 2).Draw(t, "min")
		if rapid.Bool().Draw(t, "withMax") {
			s.Max = rapid.IntRange(3, 12).Draw(t, "max")
		}
	}
	return s
}

func divisorMethod(t *rapid.T) engine.Method {
	return rapid.SampledFrom([]engine.Method{engine.Jefferson, engine.Webster, engine.Adams, engine.Dean, engine.HuntingtonHill, engine.ModifiedSainteLague}).Draw(t, "method")
}

func TestNoAlabamaDivisor(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		s := drawScenario(t, true)
		s.Method = divisorMethod(t)
		if rapid.Bool().Draw(t, "byOrder") {
			s.Tie = engine.TieRule{Kind: engine.TieByOrder}
		}
		sw, err := engine.Sweep(s, 1, 60)
		if err != nil {
			return
		}
		if fs := FindAlabama(sw); len(fs) != 0 {
			t.Fatalf("%s", fs[0].Text())
		}
	})
}

func TestNoPopulationParadoxDivisor(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		s := drawScenario(t, true)
		s.Method = divisorMethod(t)
		s.Seats = rapid.IntRange(len(s.Units), 40).Draw(t, "seats")
		later := &engine.Scenario{}
		for _, u := range s.Units {
			p := u.Population.Coef
			// Grow or shrink each unit by up to half.
			q := rapid.Uint64Range(p/2+1, p+p/2+1).Draw(t, "later")
			later.Units = append(later.Units, engine.Unit{Name: u.Name, Population: engine.Whole(q)})
		}
		r, err := FindPopulation(s, later)
		if err != nil {
			return
		}
		if len(r.Before.Ties) > 0 || len(r.After.Ties) > 0 {
			return // outright seats of tied units are not a settled result
		}
		if len(r.Findings) != 0 {
			t.Fatalf("%s", r.Findings[0].Text())
		}
	})
}

func TestQuotaProperties(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		s := drawScenario(t, false)
		s.Method = rapid.SampledFrom([]engine.Method{engine.Hamilton, engine.Jefferson, engine.Adams}).Draw(t, "method")
		sw, err := engine.Sweep(s, len(s.Units), len(s.Units)+40)
		if err != nil {
			return
		}
		for _, v := range FindQuotaViolations(sw, s) {
			switch {
			case s.Method == engine.Hamilton:
				t.Fatalf("Hamilton breaks quota: %s", v.Text())
			case s.Method == engine.Jefferson && !v.Above():
				t.Fatalf("Jefferson below lower quota: %s", v.Text())
			case s.Method == engine.Adams && v.Above():
				t.Fatalf("Adams above upper quota: %s", v.Text())
			}
		}
	})
}

func TestPairwiseTests(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		s := drawScenario(t, false)
		test := rapid.SampledFrom(PairTests()).Draw(t, "test")
		s.Method = test.Passer()
		s.Seats = rapid.IntRange(len(s.Units), 60).Draw(t, "seats")
		res, err := engine.Allot(s, 0)
		if err != nil || len(res.Ties) > 0 {
			return
		}
		if tr := ImprovingTransfers(res, test); len(tr) != 0 {
			t.Fatalf("%s fails %s: moving a seat from %d to %d lowers it from %s to %s",
				s.Method, test, tr[0].From, tr[0].To, tr[0].Before.RatString(), tr[0].After.RatString())
		}
	})
}

func TestNearestCubeRoot(t *testing.T) {
	for _, c := range []struct{ x, want int64 }{{1, 1}, {7, 2}, {8, 2}, {27, 3}, {42, 3}, {43, 4}, {1_000_000, 100}} {
		if got := nearestCubeRoot(big.NewRat(c.x, 1)); got.Int64() != c.want {
			t.Errorf("nearest cube root of %d = %d, want %d", c.x, got, c.want)
		}
	}
	rapid.Check(t, func(t *rapid.T) {
		x := new(big.Rat).SetFrac64(rapid.Int64Range(1, 1<<62).Draw(t, "num"), rapid.Int64Range(1, 1000).Draw(t, "den"))
		n := nearestCubeRoot(x)
		eight := new(big.Rat).Mul(x, big.NewRat(8, 1))
		two := func(d int64) *big.Rat {
			m := new(big.Int).Mul(n, big.NewInt(2))
			m.Add(m, big.NewInt(d))
			return new(big.Rat).SetInt(cube(m))
		}
		if !(n.Sign() == 0 || two(-1).Cmp(eight) <= 0) || eight.Cmp(two(1)) >= 0 {
			t.Fatalf("nearest cube root of %s = %s", x.RatString(), n)
		}
	})
}

// TestQuotaTestMatchesRationals: the allocation-free quota test agrees
// with the quota written as an exact rational, for populations with
// decimal places and excluded units.
func TestQuotaTestMatchesRationals(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		n := rapid.IntRange(1, 6).Draw(t, "units")
		pops := make([]engine.Decimal, n)
		excluded := make([]bool, n)
		for i := range pops {
			pops[i] = engine.Decimal{Coef: rapid.Uint64Range(0, 1<<40).Draw(t, "coef"), Places: uint8(rapid.IntRange(0, 3).Draw(t, "places"))}
			excluded[i] = rapid.IntRange(0, 5).Draw(t, "excluded") == 0
		}
		qt := newQuotaTest(pops, excluded)
		total := totalOf(pops, excluded)
		h := rapid.IntRange(1, 1000).Draw(t, "house")
		for i := range pops {
			lo, hi := floorCeil(quotaOf(pops[i], total, h, excluded[i]))
			for _, a := range []int{lo - 1, lo, hi, hi + 1, rapid.IntRange(0, 1000).Draw(t, "a")} {
				if a < 0 {
					continue
				}
				if want := a >= lo && a <= hi; qt.within(i, a, h) != want {
					t.Fatalf("unit %d (%v of %v), house %d, %d seats: within %v, quota says %v", i, pops[i], total, h, a, !want, want)
				}
			}
		}
	})
}
