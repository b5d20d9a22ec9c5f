package engine

import (
	"cmp"
	"math"
	"math/big"
	"strconv"
)

// prio is the exact priority value p/s(a) of a unit's (a+1)-th seat under a
// divisor method: p is the unit's scaled population, a the seats it holds.
type prio struct {
	p uint64
	a int
}

// infinite reports whether the priority is p/0 with p > 0.
func (m Method) infinite(x prio) bool { return x.p > 0 && m.signpost(x.a).n == 0 }

// cmpPrio compares two priority values exactly.
func (m Method) cmpPrio(x, y prio) int {
	sx, sy := m.signpost(x.a), m.signpost(y.a)
	return cmpQuot(x.p, sx, y.p, sy)
}

// cmpQuot compares px/s(x) with py/s(y). A zero population has priority 0;
// a positive population over a zero signpost is infinite.
func cmpQuot(px uint64, sx signpost, py uint64, sy signpost) int {
	if px == 0 || py == 0 {
		return cmp.Compare(px, py)
	}
	ix, iy := sx.n == 0, sy.n == 0
	switch {
	case ix && iy:
		return 0
	case ix:
		return 1
	case iy:
		return -1
	}
	if sx.sq {
		// px^2/nx against py^2/ny.
		return cmpProd3(px, px, sy.n, py, py, sx.n)
	}
	// px*dx/nx against py*dy/ny.
	return cmpProd3(px, sx.d, sy.n, py, sy.d, sx.n)
}

// prioRat returns the priority as an exact rational (divided by 10^places),
// or nil when it is infinite or irrational (Huntington–Hill).
func (m Method) prioRat(x prio, places int) *big.Rat {
	s := m.signpost(x.a)
	if s.sq || (s.n == 0 && x.p > 0) {
		return nil
	}
	if x.p == 0 {
		return new(big.Rat)
	}
	num := new(big.Int).Mul(bigU(x.p), bigU(s.d))
	den := new(big.Int).Mul(bigU(s.n), bigU(pow10(places)))
	return new(big.Rat).SetFrac(num, den)
}

// prioFloat returns the priority in the input's units as a big.Float of the
// given precision (display only; never used to decide a seat).
func (m Method) prioFloat(x prio, places int, prec uint) *big.Float {
	s := m.signpost(x.a)
	p := new(big.Float).SetPrec(prec).SetUint64(x.p)
	p.Quo(p, new(big.Float).SetPrec(prec).SetUint64(pow10(places)))
	if x.p == 0 {
		return p
	}
	if s.n == 0 {
		return p.SetInf(false)
	}
	if s.sq {
		r := new(big.Float).SetPrec(prec).SetUint64(s.n)
		r.Sqrt(r)
		return p.Quo(p, r)
	}
	p.Mul(p, new(big.Float).SetPrec(prec).SetUint64(s.d))
	return p.Quo(p, new(big.Float).SetPrec(prec).SetUint64(s.n))
}

// ValueDigits is the number of decimal places in displayed priority values
// and divisors.
const ValueDigits = 3

// A Value is a priority value or divisor as shown to people: a decimal string
// (rounded to [ValueDigits] places unless Exact is set) and a float64
// approximation for charts. Infinite values have Infinite set.
type Value struct {
	Text     string  // decimal text, e.g. "762314.333"
	Approx   float64 // nearest float64 (within a few units in the last place for Huntington–Hill), for charts and sorting in pages
	Exact    bool    // Text is the exact value
	Infinite bool    // the value is p/0: the unit's first seat under Adams, Dean or Huntington–Hill
}

func (m Method) value(x prio, places int) Value { return m.valueIn(nil, x, places) }

// valueIn is value with its text written into t (nil: a string of its own).
func (m Method) valueIn(t *textSlab, x prio, places int) Value {
	if m.infinite(x) {
		return Value{Text: "inf", Infinite: true}
	}
	if v, ok := m.valueIntIn(t, x, places); ok {
		return v
	}
	if r := m.prioRat(x, places); r != nil {
		return ratValue(r)
	}
	f := m.prioFloat(x, places, 200)
	a, _ := f.Float64()
	return Value{Text: f.Text('f', ValueDigits), Approx: a}
}

// valueIntIn is value in 64- and 128-bit integer arithmetic, with the same
// text; false when the numbers do not fit, and value falls back to
// math/big. The priority is p·d/(n·10^places), or for Huntington–Hill
// p/(10^places·sqrt(n)).
// The text is written into t (nil: a string of its own).
func (m Method) valueIntIn(t *textSlab, x prio, places int) (Value, bool) {
	s := m.signpost(x.a)
	if x.p == 0 {
		if s.sq {
			return Value{Text: "0.000"}, true
		}
		return Value{Text: "0", Exact: true}, true
	}
	hi, den := mulWide(s.n, pow10(places))
	if hi != 0 || den == 0 {
		return Value{}, false
	}
	if !s.sq {
		return fracValueIn(t, mul128(x.p, s.d), den)
	}
	// Huntington–Hill: sqrt(n) is irrational (n = a(a+1), a >= 1), so the
	// value is never a short decimal. With y = 1000p/(10^places·sqrt(n)),
	// floor(y) = isqrt(floor((1000p)^2/den')) for den' = 10^(2·places)·n,
	// and y rounds up when (2·floor(y)+1)^2·den' < 4·(1000p)^2.
	hi, p3 := mulWide(x.p, 1000)
	if hi != 0 || p3 >= 1<<62 {
		return Value{}, false
	}
	hi, den2 := mulWide(den, pow10(places))
	if hi != 0 {
		return Value{}, false
	}
	a := mul128(p3, p3) // below 2^124
	y, _ := a.div64(den2)
	k := isqrt128(y)
	c, ok := mul128(2*k+1, 2*k+1).mulSmall(den2)
	if ok && c.cmp(a.shl(2)) < 0 {
		k++
	}
	approx := float64(x.p) / float64(pow10(places)) / math.Sqrt(float64(s.n))
	return Value{Text: pointText(t, k, ValueDigits), Approx: approx}, true
}

// fracValueIn is ratValue for num/den with a 64-bit denominator den > 0:
// exact when num/den has at most ValueDigits decimals, otherwise rounded
// half up to ValueDigits places (as big.Rat.FloatString rounds); false when
// the scaled quotient does not fit in 64 bits.
// The text is written into t (nil: a string of its own).
func fracValueIn(t *textSlab, num u128, den uint64) (Value, bool) {
	var q, r uint64
	for i := 0; i <= ValueDigits; i++ {
		x, ok := num.mulSmall(pow10(i))
		if !ok {
			return Value{}, false
		}
		if q, r, ok = divmod128(x, den); !ok {
			return Value{}, false
		}
		if r == 0 {
			return Value{Text: pointText(t, q, i), Approx: ratFloat(num, den), Exact: true}, true
		}
	}
	if r >= den-r {
		if q == math.MaxUint64 {
			return Value{}, false
		}
		q++
	}
	return Value{Text: pointText(t, q, ValueDigits), Approx: ratFloat(num, den)}, true
}

// pointText writes q/10^places with exactly places decimals, into t.
func pointText(t *textSlab, q uint64, places int) string {
	var buf [32]byte
	return t.add(appendPoint(buf[:0], q, places))
}

// appendPoint appends q/10^places with exactly places decimals to b.
func appendPoint(b []byte, q uint64, places int) []byte {
	if places == 0 {
		return strconv.AppendUint(b, q, 10)
	}
	var digits [20]byte
	d := strconv.AppendUint(digits[:0], q, 10)
	if len(d) > places {
		b = append(b, d[:len(d)-places]...)
		b = append(b, '.')
		return append(b, d[len(d)-places:]...)
	}
	b = append(b, '0', '.')
	for k := len(d); k < places; k++ {
		b = append(b, '0')
	}
	return append(b, d...)
}

// ratValue shows a rational exactly when it has a short decimal expansion,
// otherwise rounded to ValueDigits places.
func ratValue(r *big.Rat) Value {
	a, _ := r.Float64()
	if s, ok := exactDecimal(r, ValueDigits); ok {
		return Value{Text: s, Approx: a, Exact: true}
	}
	return Value{Text: r.FloatString(ValueDigits), Approx: a}
}

// exactDecimal writes r with at most places decimals if that is exact.
func exactDecimal(r *big.Rat, places int) (string, bool) {
	den := new(big.Int).Set(r.Denom())
	ten := big.NewInt(10)
	for i := 0; i <= places; i++ {
		if new(big.Int).Rem(new(big.Int).Mul(r.Num(), new(big.Int).Exp(ten, big.NewInt(int64(i)), nil)), den).Sign() == 0 {
			s := r.FloatString(i)
			return s, true
		}
	}
	return "", false
}

func strconvQuote(s string) string { return strconv.Quote(s) }
