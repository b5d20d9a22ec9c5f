package analysis

import (
	"math"
	"math/big"

	"seatsmith/engine"
)

// Measures are the usual indices of disproportionality of one result.
//
// They are computed in float64 from the exact seats and populations, for
// display and comparison only: no seat depends on them. Vote (population)
// shares v_i = p_i/P are taken over every unit, including those excluded by
// a threshold (their people count as unrepresented), and seat shares
// s_i = a_i/H over the house size H. With shares written in percent:
//
//   - Loosemore–Hanby index (Loosemore and Hanby, British Journal of
//     Political Science 1, 1971): D = ½ Σ |v_i − s_i|.
//   - Gallagher least-squares index (Gallagher, Electoral Studies 10,
//     1991): LSq = sqrt(½ Σ (v_i − s_i)²).
//   - Sainte-Laguë index (same source): SL = Σ (s_i − v_i)² / v_i over the
//     units with v_i > 0.
//
// District size is persons per seat, p_i/a_i, over the units that hold a
// seat and are not excluded. Largest and Smallest are its extremes and
// Ratio = Largest/Smallest. AbsoluteDifference = Largest − Smallest is the
// greatest absolute difference of district size between two units, and
// RelativeDifference = (Largest − Smallest)/Smallest the greatest relative
// difference, |x − y|/min(x, y) (Huntington, Transactions of the AMS 30,
// 1928). Unseated counts the units with people and no seat, whose district
// size is unbounded.
type Measures struct {
	Method engine.Method
	House  int

	LoosemoreHanby float64 // percent
	Gallagher      float64 // percentage points
	SainteLague    float64 // percent scale

	Largest, Smallest         float64 // persons per seat
	LargestUnit, SmallestUnit string
	Ratio                     float64
	AbsoluteDifference        float64 // persons per seat
	RelativeDifference        float64 // a fraction: 0.25 is 25%
	Unseated                  int

	// Pairwise counts, for each of Huntington's pairwise tests, the
	// transfers of one seat between two units that would improve the
	// pair (see [ImprovingTransfers]); -1 when not computed (more than
	// [PairwiseLimit] units).
	Pairwise [3]int
}

// PairwiseLimit is the most units for which [Measure] runs the pairwise
// tests (they look at every pair).
const PairwiseLimit = 200

// Measure computes the measures of res.
func Measure(res *engine.Result) Measures {
	m := Measures{Method: res.Method, House: res.Seats}
	n := len(res.Units)
	pops := make([]*big.Rat, n)
	all := new(big.Rat)
	for i := range res.Units {
		pops[i] = ratOf(res.Units[i].Population)
		all.Add(all, pops[i])
	}
	v := make([]*big.Rat, n)
	sh := make([]*big.Rat, n)
	for i := range res.Units {
		v[i] = new(big.Rat)
		if all.Sign() > 0 {
			v[i].Quo(pops[i], all)
		}
		sh[i] = big.NewRat(int64(res.Units[i].Seats), int64(res.Seats))
	}
	m.LoosemoreHanby, m.Gallagher, m.SainteLague = Indices(v, sh)
	first := true
	for i := range res.Units {
		u := &res.Units[i]
		if u.Excluded || u.Population.IsZero() {
			continue
		}
		if u.Seats == 0 {
			m.Unseated++
			continue
		}
		d := approx(new(big.Rat).Quo(pops[i], big.NewRat(int64(u.Seats), 1)))
		if first || d > m.Largest {
			m.Largest, m.LargestUnit = d, u.Name
		}
		if first || d < m.Smallest {
			m.Smallest, m.SmallestUnit = d, u.Name
		}
		first = false
	}
	if !first && m.Smallest > 0 {
		m.Ratio = m.Largest / m.Smallest
		m.AbsoluteDifference = m.Largest - m.Smallest
		m.RelativeDifference = m.AbsoluteDifference / m.Smallest
	}
	for k := range m.Pairwise {
		m.Pairwise[k] = -1
		if n <= PairwiseLimit {
			m.Pairwise[k] = len(ImprovingTransfers(res, PairTest(k)))
		}
	}
	return m
}

// Indices returns the Loosemore–Hanby index, the Gallagher index and the
// Sainte-Laguë index, in percent, of population shares v against seat
// shares s (both fractions of one; see [Measures] for the formulas). They
// are float64 for display.
func Indices(v, s []*big.Rat) (lh, gallagher, sl float64) {
	var sum, sq float64
	for i := range v {
		d := approx(new(big.Rat).Sub(v[i], s[i])) * 100
		sum += math.Abs(d)
		sq += d * d
		if v[i].Sign() > 0 {
			sl += d * d / (approx(v[i]) * 100)
		}
	}
	return sum / 2, math.Sqrt(sq / 2), sl
}
