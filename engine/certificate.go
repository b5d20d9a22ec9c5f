package engine

import (
	"math"
	"math/big"
	"strconv"
)

// The certificate of a divisor method's result is the shortest decimal
// strictly inside the range of divisors that give it: the coarsest power
// of ten 10^e with a multiple between the bounds, and the first such
// multiple. It is worked out in 128-bit integer arithmetic when the
// numbers fit, and in math/big otherwise; both give the same decimal.

// certificateText returns the certificate for the bounds, or "" when there
// is none.
func (pr *problem) certificateText(low prio, lowOK bool, high prio, highOK bool) string {
	if highOK && !pr.m.infinite(high) && !forceBig {
		if f, e, ok := pr.certificate64(low, lowOK, high); ok {
			return decimalPower(f, e)
		}
	}
	if c := pr.certificate(low, lowOK, high, highOK); c != nil {
		return decimalText(c)
	}
	return ""
}

// certificate64 finds the certificate f·10^e below a finite upper bound
// high in 128-bit arithmetic; false when a number does not fit.
func (pr *problem) certificate64(low prio, lowOK bool, high prio) (f uint64, e int, ok bool) {
	hf := pr.m.prioEstimate(high) / math.Pow10(pr.places)
	if !(hf > 0) || math.IsInf(hf, 0) {
		return 0, 0, false
	}
	// 10^start is above high: no multiple of it lies between the bounds,
	// so starting there misses no coarser certificate.
	start := int(math.Floor(math.Log10(hf))) + 2
	for e := start; e > start-certificateSteps; e-- {
		f := uint64(1) // the first multiple of 10^e above low
		if lowOK {
			fl, ok := pr.floorOver(low, e)
			if !ok || fl == math.MaxUint64 {
				return 0, 0, false
			}
			f = fl + 1
		}
		c, ok := pr.cmpDecimal(f, e, high)
		if !ok {
			return 0, 0, false
		}
		if c < 0 {
			return f, e, true
		}
	}
	return 0, 0, false
}

// certificateSteps bounds the powers of ten certificate64 tries; beyond
// them math/big takes over.
const certificateSteps = 60

// floorOver returns floor(x / 10^e) for the priority value x, which is
// p·d/(10^places·n), or p/(10^places·sqrt(n)) under Huntington–Hill.
func (pr *problem) floorOver(x prio, e int) (uint64, bool) {
	if x.p == 0 {
		return 0, true
	}
	s := pr.m.signpost(x.a)
	if s.n == 0 {
		return 0, false // infinite
	}
	k := e + pr.places // x/10^e = num / (den·10^k)
	num := mul128(x.p, s.d)
	if s.sq {
		num, k = mul128(x.p, x.p), 2*k // floor(sqrt(y)) = floor(sqrt(floor(y)))
	}
	den := u128{0, s.n}
	var ok bool
	if k >= 0 {
		den, ok = mulPow10(den, k)
	} else {
		num, ok = mulPow10(num, -k)
	}
	if !ok {
		return 0, false
	}
	var q u128
	switch {
	case num.cmp(den) < 0:
		return 0, true
	case den.hi != 0:
		return 0, false
	default:
		q, _ = num.div64(den.lo)
	}
	if s.sq {
		if q.hi >= 1<<62 {
			return 0, false
		}
		return isqrt128(q), true
	}
	if q.hi != 0 {
		return 0, false
	}
	return q.lo, true
}

// cmpDecimal compares f·10^e with the priority value x.
func (pr *problem) cmpDecimal(f uint64, e int, x prio) (int, bool) {
	if x.p == 0 {
		return 1, true // f >= 1
	}
	s := pr.m.signpost(x.a)
	if s.n == 0 {
		return -1, true // x is infinite
	}
	// f·10^e against p·d/(10^places·n): f·n·10^k against p·d with k = e +
	// places; squared under Huntington–Hill, f²·n·10^2k against p².
	k := e + pr.places
	l, ok := u128{0, f}.mulSmall(s.n)
	r := mul128(x.p, s.d)
	if s.sq {
		l, ok = mul128(f, f).mulSmall(s.n)
		r, k = mul128(x.p, x.p), 2*k
	}
	if ok && k >= 0 {
		l, ok = mulPow10(l, k)
	} else if ok {
		r, ok = mulPow10(r, -k)
	}
	if !ok {
		return 0, false
	}
	return l.cmp(r), true
}

// mulPow10 returns x·10^k for k >= 0 and whether it fits in 128 bits.
func mulPow10(x u128, k int) (u128, bool) {
	ok := true
	for ; k > 0 && ok; k -= 19 {
		x, ok = x.mulSmall(pow10(min(k, 19)))
	}
	return x, ok
}

// decimalPower writes f·10^e as decimalText writes it: no exponent, no
// trailing zeros after the point.
func decimalPower(f uint64, e int) string {
	var buf [48]byte
	if e >= 0 {
		b := strconv.AppendUint(buf[:0], f, 10)
		for ; e > 0; e-- {
			b = append(b, '0')
		}
		return string(b)
	}
	b := appendPoint(buf[:0], f, -e)
	for b[len(b)-1] == '0' {
		b = b[:len(b)-1]
	}
	if b[len(b)-1] == '.' {
		b = b[:len(b)-1]
	}
	return string(b)
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
