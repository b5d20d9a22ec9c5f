package engine

import (
	"math"
	"math/big"
	"math/bits"
)

// This file holds the exact arithmetic every decision rests on: products of
// up to three 64-bit factors compared in 128-bit arithmetic, with a math/big
// path for the products that do not fit.

// forceBig makes every comparison take the math/big path. Tests set it to
// check that both paths give the same answers.
var forceBig = false

// u128 is an unsigned 128-bit integer.
type u128 struct{ hi, lo uint64 }

func mulWide(a, b uint64) (hi, lo uint64) { return bits.Mul64(a, b) }

func mul128(a, b uint64) u128 {
	hi, lo := bits.Mul64(a, b)
	return u128{hi, lo}
}

// mulSmall returns x*b and whether it fits in 128 bits.
func (x u128) mulSmall(b uint64) (u128, bool) {
	h1, l1 := bits.Mul64(x.lo, b)
	h2, l2 := bits.Mul64(x.hi, b)
	if h2 != 0 {
		return u128{}, false
	}
	hi, c := bits.Add64(h1, l2, 0)
	if c != 0 {
		return u128{}, false
	}
	return u128{hi, l1}, true
}

func (x u128) add(y u128) (u128, bool) {
	lo, c := bits.Add64(x.lo, y.lo, 0)
	hi, c2 := bits.Add64(x.hi, y.hi, c)
	return u128{hi, lo}, c2 == 0
}

func (x u128) add64(y uint64) (u128, bool) { return x.add(u128{0, y}) }

func (x u128) sub(y u128) u128 {
	lo, b := bits.Sub64(x.lo, y.lo, 0)
	hi, _ := bits.Sub64(x.hi, y.hi, b)
	return u128{hi, lo}
}

func (x u128) cmp(y u128) int {
	switch {
	case x.hi < y.hi:
		return -1
	case x.hi > y.hi:
		return 1
	case x.lo < y.lo:
		return -1
	case x.lo > y.lo:
		return 1
	}
	return 0
}

func (x u128) big() *big.Int {
	b := new(big.Int).SetUint64(x.hi)
	b.Lsh(b, 64)
	return b.Or(b, new(big.Int).SetUint64(x.lo))
}

// float is x in floating point, for estimates only.
func (x u128) float() float64 { return float64(x.hi)*0x1p64 + float64(x.lo) }

// plus returns x + y, saturating.
func (x u128) plus(y uint64) u128 {
	s, ok := x.add64(y)
	if !ok {
		return u128{^uint64(0), ^uint64(0)}
	}
	return s
}

func bigU(a uint64) *big.Int { return new(big.Int).SetUint64(a) }

// cmpProd3 compares a*b*c with d*e*f exactly.
func cmpProd3(a, b, c, d, e, f uint64) int {
	if !forceBig {
		x, ok1 := mul128(a, b).mulSmall(c)
		y, ok2 := mul128(d, e).mulSmall(f)
		if ok1 && ok2 {
			return x.cmp(y)
		}
	}
	x := new(big.Int).Mul(bigU(a), bigU(b))
	x.Mul(x, bigU(c))
	y := new(big.Int).Mul(bigU(d), bigU(e))
	y.Mul(y, bigU(f))
	return x.Cmp(y)
}

// sum128 adds non-negative values; 128 bits hold the sum of 2^64 values of
// up to 2^64 each, far beyond any scenario the engine accepts.
func sum128(vs []uint64) u128 {
	var s u128
	for _, v := range vs {
		s, _ = s.add64(v)
	}
	return s
}

// divmod128 returns x div y and x mod y for a 64-bit divisor y > 0, and
// false if the quotient does not fit in 64 bits.
func divmod128(x u128, y uint64) (q, r uint64, ok bool) {
	if x.hi >= y {
		return 0, 0, false
	}
	q, r = bits.Div64(x.hi, x.lo, y)
	return q, r, true
}

// div64 returns x div y and x mod y for a 64-bit divisor y > 0.
func (x u128) div64(y uint64) (u128, uint64) {
	qhi, r := x.hi/y, x.hi%y
	qlo, r := bits.Div64(r, x.lo, y)
	return u128{qhi, qlo}, r
}

// gcd64 is the greatest common divisor of a and b (b when a is zero).
func gcd64(a, b uint64) uint64 {
	for a != 0 {
		a, b = b%a, a
	}
	return b
}

// text writes x in decimal.
func (x u128) text() string {
	if x.hi == 0 {
		return strconvU(x.lo)
	}
	return x.big().String()
}

// isqrt128 returns floor(sqrt(x)) for x < 2^126.
func isqrt128(x u128) uint64 {
	f := math.Sqrt(x.float())
	r := uint64(f)
	if r == 0 {
		r = 1
	}
	// One Newton step from the float estimate, then exact correction.
	if q, _, ok := divmod128(x, r); ok {
		s, _ := mul128(1, q).add64(r)
		r = s.lo>>1 | s.hi<<63
	}
	for r > 0 && mul128(r, r).cmp(x) > 0 {
		r--
	}
	for mul128(r+1, r+1).cmp(x) <= 0 {
		r++
	}
	return r
}

// ratFloat returns the float64 nearest to num/den (ties to even), as
// big.Rat.Float64 does, for den > 0.
func ratFloat(num u128, den uint64) float64 {
	if num.hi == 0 && num.lo < 1<<53 && den < 1<<53 {
		return float64(num.lo) / float64(den) // both exact: one rounding
	}
	if num.hi == 0 && num.lo == 0 {
		return 0
	}
	// Scale num by 2^k so that the quotient q has 63 or 64 bits, keep a
	// sticky bit for what the division and the shift drop, and let the
	// conversion to float64 round once.
	ln := 128 - bits.LeadingZeros64(num.hi)
	if num.hi == 0 {
		ln = 64 - bits.LeadingZeros64(num.lo)
	}
	ld := 64 - bits.LeadingZeros64(den)
	k := 63 - (ln - ld)
	var x u128
	sticky := false
	switch {
	case k > 0:
		x = num.shl(uint(k))
	case k < 0:
		x = num.shr(uint(-k))
		sticky = num.sub(x.shl(uint(-k))) != u128{}
	default:
		x = num
	}
	q, r, _ := divmod128(x, den)
	if r != 0 || sticky {
		q |= 1
	}
	return math.Ldexp(float64(q), -k)
}

// bitLen128 is the number of bits of x.
func bitLen128(x u128) int {
	if x.hi != 0 {
		return 64 + bits.Len64(x.hi)
	}
	return bits.Len64(x.lo)
}

// shlFits returns x·2^n (0 <= n <= 128) and whether it fits in 128 bits.
func (x u128) shlFits(n int) (u128, bool) {
	if bitLen128(x)+n > 128 {
		return u128{}, false
	}
	return x.shl(uint(n)), true
}

func (x u128) shl(n uint) u128 {
	switch {
	case n == 0:
		return x
	case n >= 64:
		return u128{x.lo << (n - 64), 0}
	}
	return u128{x.hi<<n | x.lo>>(64-n), x.lo << n}
}

func (x u128) shr(n uint) u128 {
	switch {
	case n == 0:
		return x
	case n >= 64:
		return u128{0, x.hi >> (n - 64)}
	}
	return u128{x.hi >> n, x.lo>>n | x.hi<<(64-n)}
}
