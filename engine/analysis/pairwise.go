package analysis

import (
	"math/big"

	"seatsmith/engine"
)

// Huntington's pairwise tests (E. V. Huntington, "The apportionment of
// representatives in Congress", Transactions of the American Mathematical
// Society 30, 1928; Balinski and Young, Fair Representation, 2nd ed. 2001,
// Appendix A): an apportionment passes a test when no transfer of one seat
// from one unit to another makes the two units' inequality, by the test's
// measure, smaller. Each divisor method passes exactly one:
//
//   - Huntington–Hill: the relative difference of district sizes,
//     |x − y|/min(x, y) with x = p_i/a_i (the same for representation
//     per person a_i/p_i);
//   - Dean: the absolute difference of district sizes |p_i/a_i − p_j/a_j|;
//   - Webster: the absolute difference of representation per person
//     |a_i/p_i − a_j/p_j|.
//
// All comparisons here are exact (math/big).

// A PairTest is one of Huntington's pairwise measures of inequality.
type PairTest uint8

const (
	// RelativeDifference is |x − y|/min(x, y) for district sizes x, y;
	// Huntington–Hill passes it.
	RelativeDifference PairTest = iota
	// DistrictSizeDifference is |p_i/a_i − p_j/a_j|; Dean passes it.
	DistrictSizeDifference
	// RepresentationDifference is |a_i/p_i − a_j/p_j|; Webster passes it.
	RepresentationDifference
)

// PairTests lists the tests in order.
func PairTests() []PairTest {
	return []PairTest{RelativeDifference, DistrictSizeDifference, RepresentationDifference}
}

// String returns the test's id.
func (t PairTest) String() string {
	switch t {
	case RelativeDifference:
		return "relative_difference"
	case DistrictSizeDifference:
		return "district_size_difference"
	case RepresentationDifference:
		return "representation_difference"
	}
	return "unknown"
}

// Passer returns the divisor method that passes the test.
func (t PairTest) Passer() engine.Method {
	switch t {
	case RelativeDifference:
		return engine.HuntingtonHill
	case DistrictSizeDifference:
		return engine.Dean
	}
	return engine.Webster
}

// A Transfer is one seat moved from unit From to unit To, with the pair's
// inequality before and after (exact).
type Transfer struct {
	From, To      int
	Before, After *big.Rat
}

// inequality returns the pair measure for populations p, q holding a, b
// seats, or nil when it is unbounded (a district size over zero seats).
func (t PairTest) inequality(p, q *big.Rat, a, b int) *big.Rat {
	switch t {
	case RepresentationDifference:
		x := new(big.Rat).Quo(big.NewRat(int64(a), 1), p)
		y := new(big.Rat).Quo(big.NewRat(int64(b), 1), q)
		return x.Abs(x.Sub(x, y))
	}
	if a == 0 || b == 0 {
		return nil
	}
	x := new(big.Rat).Quo(p, big.NewRat(int64(a), 1))
	y := new(big.Rat).Quo(q, big.NewRat(int64(b), 1))
	d := new(big.Rat).Sub(x, y)
	d.Abs(d)
	if t == DistrictSizeDifference {
		return d
	}
	if x.Cmp(y) > 0 {
		x = y
	}
	return d.Quo(d, x)
}

// ImprovingTransfers returns every transfer of one seat between two units
// of res that lowers the pair's inequality by test t, within the units'
// bounds. Units excluded by a threshold and units without people take no
// part. An empty list means res passes the test.
func ImprovingTransfers(res *engine.Result, t PairTest) []Transfer {
	var out []Transfer
	pops := make([]*big.Rat, len(res.Units))
	for i := range res.Units {
		pops[i] = ratOf(res.Units[i].Population)
	}
	for i := range res.Units {
		ui := &res.Units[i]
		if ui.Excluded || ui.Population.IsZero() || ui.Seats == 0 || ui.Seats <= ui.Min {
			continue
		}
		for j := range res.Units {
			uj := &res.Units[j]
			if j == i || uj.Excluded || uj.Population.IsZero() || (uj.Max >= 0 && uj.Seats >= uj.Max) {
				continue
			}
			before := t.inequality(pops[i], pops[j], ui.Seats, uj.Seats)
			after := t.inequality(pops[i], pops[j], ui.Seats-1, uj.Seats+1)
			if after == nil {
				continue // the giver would be left with an unbounded district
			}
			if before == nil || after.Cmp(before) < 0 {
				out = append(out, Transfer{From: i, To: j, Before: before, After: after})
			}
		}
	}
	return out
}
