package engine

import (
	"math/big"
)

// This file finds the divisor interval of a divisor-method result and a
// short decimal divisor inside it, checked exactly.

// divisorBounds returns the priority values bounding the divisor: low is the
// greatest next-seat priority of a unit below its maximum, high the least
// last-seat priority of a unit above its minimum. ok flags report whether
// each bound exists.
func (pr *problem) divisorBounds(seats []int) (low prio, lowOK bool, high prio, highOK bool) {
	for i, p := range pr.pops {
		if !pr.eligible[i] || p == 0 {
			continue
		}
		a := seats[i]
		if a < pr.max[i] {
			x := prio{p, a}
			if !lowOK || pr.m.cmpPrio(x, low) > 0 {
				low, lowOK = x, true
			}
		}
		if a > pr.min[i] {
			x := prio{p, a - 1}
			if !highOK || pr.m.cmpPrio(x, high) < 0 {
				high, highOK = x, true
			}
		}
	}
	return
}

// cmpRatPrio compares the divisor d (in the input's units) with the priority
// value x exactly.
func (pr *problem) cmpRatPrio(d *big.Rat, x prio) int {
	if x.p == 0 {
		return d.Sign()
	}
	s := pr.m.signpost(x.a)
	if s.n == 0 {
		return -1 // x is infinite
	}
	// d = N/M; x = p/(10^places · s). Compare N·10^places·s with M·p.
	l := new(big.Int).Mul(d.Num(), bigU(pow10(pr.places)))
	r := new(big.Int).Mul(d.Denom(), bigU(x.p))
	if s.sq {
		l.Mul(l, l)
		l.Mul(l, bigU(s.n))
		r.Mul(r, r)
		return l.Cmp(r)
	}
	l.Mul(l, bigU(s.n))
	r.Mul(r, bigU(s.d))
	return l.Cmp(r)
}

// divisorRange explains the divisors that give seats.
func (pr *problem) divisorRange(seats []int) *DivisorRange {
	low, lowOK, high, highOK := pr.divisorBounds(seats)
	dr := &DivisorRange{Low: Value{Text: "0", Exact: true}, High: Value{Text: "inf", Infinite: true}}
	if lowOK {
		dr.Low = pr.m.value(low, pr.places)
	}
	if highOK {
		dr.High = pr.m.value(high, pr.places)
	}
	if lowOK && highOK && pr.m.cmpPrio(low, high) >= 0 {
		dr.Single = true
		return dr
	}
	dr.Certificate = pr.certificateText(low, lowOK, high, highOK)
	return dr
}
