package election

import (
	"math"

	"seatsmith/engine"
)

// A rounding is a divisor method's rule for rounding a quotient q = v/D to
// seats: q rounds to a when s(a-1) ≤ q ≤ s(a), at the method's signposts
// s(a) (at a signpost both neighbours are possible: a tie). For
// Huntington–Hill, whose signposts are square roots, the lower
// apportionment compares squares: the quotient's square against
// s(a)² = a(a+1), so every value it compares is rational.
type rounding struct {
	m  engine.Method
	sq bool // Huntington–Hill: values are squares
}

func roundingOf(m engine.Method) rounding {
	return rounding{m: m, sq: m == engine.HuntingtonHill}
}

// sign returns the signpost s(a) (its square for Huntington–Hill) as the
// fraction n/d, for a ≥ 0. n is zero for a zero signpost.
func (r rounding) sign(a int) (n, d uint64) {
	n, d, _, ok := r.m.Signpost(a)
	if !ok {
		return 1, 1
	}
	return n, d
}

// zeroFirst reports whether s(0) is zero, so that every cell with votes
// takes at least one seat.
func (r rounding) zeroFirst() bool { return r.m.ZeroFirstSignpost() }

// floor is the fewest seats a cell with votes holds: 1 when s(0) is zero.
func (r rounding) floor() int {
	if r.zeroFirst() {
		return 1
	}
	return 0
}

// float returns s(a) as a float64 (not squared), for estimates.
func (r rounding) float(a int) float64 {
	n, d := r.sign(a)
	f := float64(n) / float64(d)
	if r.sq {
		return math.Sqrt(f)
	}
	return f
}

// roundFloat rounds the quotient q ≥ 0 to seats (an estimate).
func (r rounding) roundFloat(q float64) int {
	if q <= 0 || math.IsNaN(q) {
		return 0
	}
	if q > 4e9 {
		return int(4e9)
	}
	a := max(0, int(q)-2)
	for q > r.float(a) {
		a++
	}
	return a
}
