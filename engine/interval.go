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
	if c := pr.certificate(low, lowOK, high, highOK); c != nil {
		dr.Certificate = decimalText(c)
	}
	return dr
}

// certificate finds the shortest decimal strictly between the bounds.
func (pr *problem) certificate(low prio, lowOK bool, high prio, highOK bool) *big.Rat {
	const prec = 256
	inside := func(d *big.Rat) bool {
		if d.Sign() <= 0 {
			return false
		}
		if lowOK && pr.cmpRatPrio(d, low) <= 0 {
			return false
		}
		if highOK && pr.cmpRatPrio(d, high) >= 0 {
			return false
		}
		return true
	}
	var lo, hi *big.Float
	if lowOK {
		lo = pr.m.prioFloat(low, pr.places, prec)
	} else {
		lo = new(big.Float).SetPrec(prec)
	}
	if highOK && !pr.m.infinite(high) {
		hi = pr.m.prioFloat(high, pr.places, prec)
	} else {
		hi = new(big.Float).SetPrec(prec).Mul(lo, big.NewFloat(2))
		hi.Add(hi, big.NewFloat(1))
	}
	// Try multiples of 10^e from coarse to fine.
	e := hi.MantExp(nil)/3 + 2 // a power of ten above hi (2^k < 10^(k/3+1))
	ten := big.NewRat(10, 1)
	step := new(big.Rat).SetInt(new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(max(e, 0))), nil))
	if e < 0 {
		step.SetFrac(big.NewInt(1), new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(-e)), nil))
	}
	loR, _ := lo.Rat(nil)
	for i := 0; i < 400; i++ {
		// c = (floor(lo/step)+1)·step, the first multiple above lo.
		q := new(big.Rat).Quo(loR, step)
		f := new(big.Int).Quo(q.Num(), q.Denom())
		f.Add(f, big.NewInt(1))
		c := new(big.Rat).Mul(new(big.Rat).SetInt(f), step)
		for k := 0; k < 3; k++ { // the float bound may sit a hair off the exact one
			if inside(c) {
				return c
			}
			c.Add(c, step)
		}
		step.Quo(step, ten)
	}
	return nil
}

// decimalText writes a rational with a terminating decimal expansion.
func decimalText(r *big.Rat) string {
	if s, ok := exactDecimal(r, 80); ok {
		return s
	}
	return r.FloatString(12)
}
