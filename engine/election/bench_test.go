package election

import (
	"math"
	"math/rand/v2"
	"strconv"
	"testing"

	"seatsmith/engine"
)

// Benchmarks on an invented election of 100 districts and 30 parties:
// district sizes and party strengths drawn from a seeded generator, every
// party standing everywhere, 2 to 20 seats a district. Run with
//
//	go test -run XXX -bench . ./engine/election
//
// The baseline is one plain apportionment of the same house among the
// 3,000 district-and-party cells as units (engine.Allot, Webster): what
// apportioning the same numbers once, without districts, costs.

const benchDistricts, benchParties = 100, 30

func benchScenario(system System) *Scenario {
	r := rand.New(rand.NewPCG(2024, 16))
	s := &Scenario{System: system, Method: engine.Jefferson}
	strength := make([]float64, benchParties)
	for j := range strength {
		strength[j] = 1 / math.Pow(float64(j+1), 0.9)
	}
	for i := range benchDistricts {
		name := "District " + strconv.Itoa(i+1)
		size := 20000 + r.IntN(200000)
		s.Districts = append(s.Districts, District{Name: name, Seats: 2 + r.IntN(19)})
		best, bestV := 0, uint64(0)
		for j := range benchParties {
			share := strength[j] * (0.5 + r.Float64())
			v := uint64(float64(size) * share / 4)
			if v > bestV {
				best, bestV = j, v
			}
			s.Votes = append(s.Votes, Vote{District: name, Party: "Party " + strconv.Itoa(j+1), Votes: engine.Whole(v)})
		}
		if system == MixedMember {
			s.Votes[len(s.Votes)-benchParties+best].Wins = 1
		}
	}
	switch system {
	case Biproportional:
		s.Method = engine.Webster
	case TwoTier:
		s.Compensatory = 100
		s.UpperMethod = engine.Webster
		s.Thresholds = []Threshold{{Share: engine.Decimal{Coef: 4, Places: 2}}}
	case MixedMember:
		s.Method = engine.Webster
		s.Seats = 200
		s.Districts = nil
		for k := range s.Votes {
			s.Votes[k].District = ""
		}
		// One national row per party: the vote rows add up by party.
		sums := map[string]uint64{}
		wins := map[string]int{}
		var order []string
		for _, v := range s.Votes {
			if _, ok := sums[v.Party]; !ok {
				order = append(order, v.Party)
			}
			sums[v.Party] += v.Votes.Coef
			wins[v.Party] += v.Wins
		}
		s.Votes = nil
		for _, p := range order {
			s.Votes = append(s.Votes, Vote{Party: p, Votes: engine.Whole(sums[p]), Wins: wins[p]})
		}
		s.Thresholds = []Threshold{{Share: engine.Decimal{Coef: 5, Places: 2}}}
	}
	return s
}

func benchCompute(b *testing.B, s *Scenario) {
	b.Helper()
	res, err := Compute(s)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportMetric(float64(res.Seats), "seats")
	b.ResetTimer()
	for range b.N {
		if _, err := Compute(s); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkBaselinePlainCells(b *testing.B) {
	s := benchScenario(Districts)
	var units []engine.Unit
	for k, v := range s.Votes {
		units = append(units, engine.Unit{Name: strconv.Itoa(k), Population: v.Votes})
	}
	seats := 0
	for _, d := range s.Districts {
		seats += d.Seats
	}
	sc := &engine.Scenario{Units: units, Seats: seats, Method: engine.Webster}
	b.ResetTimer()
	for range b.N {
		if _, err := engine.Allot(sc, 0); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkDistricts(b *testing.B)      { benchCompute(b, benchScenario(Districts)) }
func BenchmarkBiproportional(b *testing.B) { benchCompute(b, benchScenario(Biproportional)) }
func BenchmarkTwoTier(b *testing.B)        { benchCompute(b, benchScenario(TwoTier)) }
func BenchmarkMixedMemberKeep(b *testing.B) {
	benchCompute(b, benchScenario(MixedMember))
}

func BenchmarkMixedMemberLevel(b *testing.B) {
	s := benchScenario(MixedMember)
	s.Overhang = Level
	benchCompute(b, s)
}

// Huntington–Hill compares squares throughout. Its first signpost is
// zero, so every party with votes in a district takes a seat there: the
// house must give even the smallest party 100 seats, so every district has
// 180 seats more (about 19,000 in all).
func BenchmarkBiproportionalHuntingtonHill(b *testing.B) {
	s := benchScenario(Biproportional)
	s.Method = engine.HuntingtonHill
	for i := range s.Districts {
		s.Districts[i].Seats += 180
	}
	benchCompute(b, s)
}

// benchLower is the benchmark election's lower apportionment problem.
func benchLower(b *testing.B) *lowerProblem {
	s := benchScenario(Biproportional)
	res, err := Compute(s)
	if err != nil {
		b.Fatal(err)
	}
	lp := &lowerProblem{r: make([]int, benchDistricts), c: make([]int, benchParties), rd: roundingOf(s.Method)}
	lp.v = make([][]uint64, benchDistricts)
	for i := range lp.v {
		lp.v[i] = make([]uint64, benchParties)
		lp.r[i] = res.Districts[i].Seats
	}
	for j := range lp.c {
		lp.c[j] = res.Parties[j].Seats
	}
	for _, c := range res.Cells {
		lp.v[c.District][c.Party] = c.Votes.Coef
	}
	return lp
}

func benchExact(b *testing.B, lp *lowerProblem, logd []float64) {
	b.Helper()
	for range b.N {
		ex := newExactLower(lp)
		ex.start(logd)
		if err := ex.tieAndTransfer(); err != nil {
			b.Fatal(err)
		}
		if _, err := ex.finish(nil); err != nil {
			b.Fatal(err)
		}
	}
}

// The exact procedure as it runs when the estimate cannot be proven (at a
// tie, or a near tie floating point cannot settle): tie-and-transfer in
// rational arithmetic from the estimate's district divisors, then the
// certificate.
func BenchmarkBiproportionalExactFromEstimate(b *testing.B) {
	lp := benchLower(b)
	_, logd, _, ok := lp.alternatingScaling(400)
	if !ok {
		b.Fatal("no estimate")
	}
	b.ResetTimer()
	benchExact(b, lp, logd)
}

// The exact procedure from all district divisors one: its worst case.
func BenchmarkBiproportionalExactFromScratch(b *testing.B) {
	lp := benchLower(b)
	b.ResetTimer()
	benchExact(b, lp, nil)
}
