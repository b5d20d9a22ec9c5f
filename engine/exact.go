package engine

import (
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

// cmpProd2 compares a*b with c*d exactly.
func cmpProd2(a, b, c, d uint64) int {
	if !forceBig {
		return mul128(a, b).cmp(mul128(c, d))
	}
	x := new(big.Int).Mul(bigU(a), bigU(b))
	return x.Cmp(new(big.Int).Mul(bigU(c), bigU(d)))
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
