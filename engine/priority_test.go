package engine

import (
	"math/big"
	"math/rand/v2"
	"testing"
)

// valueBig is value entirely in math/big, as the engine wrote every
// priority before the integer path.
func (m Method) valueBig(x prio, places int) Value {
	if m.infinite(x) {
		return Value{Text: "inf", Infinite: true}
	}
	if r := m.prioRat(x, places); r != nil {
		return ratValue(r)
	}
	f := m.prioFloat(x, places, 200)
	a, _ := f.Float64()
	return Value{Text: f.Text('f', ValueDigits), Approx: a}
}

// TestValueIntMatchesBig: the integer path writes every priority value as
// the math/big path does, for every method, seat count and number of
// decimal places, and its float is the nearest (Huntington–Hill: within
// a few units in the last place).
func TestValueIntMatchesBig(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 11))
	pops := func() uint64 {
		switch r.IntN(4) {
		case 0:
			return uint64(r.IntN(20))
		case 1:
			return r.Uint64N(1_000_000)
		case 2:
			return r.Uint64N(MaxCoefficient) + 1
		}
		return uint64(1) << r.IntN(60) * uint64(r.IntN(7)+1)
	}
	n := 0
	for k := 0; k < 200_000; k++ {
		m := Methods()[2+r.IntN(6)]
		x := prio{pops(), r.IntN(50)}
		if r.IntN(4) == 0 {
			x.a = r.IntN(MaxSeats)
		}
		places := r.IntN(MaxPlaces + 1)
		got, ok := m.valueIntIn(nil, x, places)
		if !ok {
			continue
		}
		n++
		want := m.valueBig(x, places)
		if got.Text != want.Text || got.Exact != want.Exact || got.Infinite != want.Infinite {
			t.Fatalf("%s p=%d a=%d places=%d: %+v, math/big %+v", m, x.p, x.a, places, got, want)
		}
		if s := m.signpost(x.a); !s.sq && got.Approx != want.Approx {
			t.Fatalf("%s p=%d a=%d places=%d: approx %v, math/big %v", m, x.p, x.a, places, got.Approx, want.Approx)
		} else if s.sq && !closeFloat(got.Approx, want.Approx) {
			t.Fatalf("%s p=%d a=%d places=%d: approx %v, math/big %v", m, x.p, x.a, places, got.Approx, want.Approx)
		}
	}
	if n < 100_000 {
		t.Fatalf("only %d of the values took the integer path", n)
	}
}

func closeFloat(a, b float64) bool {
	d := a - b
	if d < 0 {
		d = -d
	}
	return d <= 1e-14*b
}

// TestValueHalves: values exactly half way between two three-place
// decimals round up, as big.Rat.FloatString does.
func TestValueHalves(t *testing.T) {
	for _, c := range []struct {
		num  uint64
		den  uint64
		want string
	}{
		{1, 2000, "0.001"}, {3, 2000, "0.002"}, {2001, 2000, "1.001"}, {1, 3, "0.333"}, {2, 3, "0.667"},
		{5, 2, "2.5"}, {0, 7, "0"}, {7, 1, "7"}, {1, 8, "0.125"}, {1, 16, "0.063"}, {999999, 1000000, "1.000"},
	} {
		v, ok := fracValueIn(nil, u128{0, c.num}, c.den)
		want := ratValue(new(big.Rat).SetFrac(bigU(c.num), bigU(c.den)))
		if !ok || v.Text != c.want || v != want {
			t.Errorf("%d/%d: %+v, want %q (math/big %+v)", c.num, c.den, v, c.want, want)
		}
	}
}

// TestRatFloat: ratFloat rounds as big.Rat.Float64 does.
func TestRatFloat(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 5))
	for k := 0; k < 200_000; k++ {
		num := u128{r.Uint64() >> r.IntN(65), r.Uint64()}
		if r.IntN(2) == 0 {
			num.hi = 0
		}
		den := r.Uint64()>>r.IntN(64) | 1
		if num.hi >= den {
			num.hi %= den
		}
		want, _ := new(big.Rat).SetFrac(num.big(), bigU(den)).Float64()
		if got := ratFloat(num, den); got != want {
			t.Fatalf("%v/%d: %v, want %v", num, den, got, want)
		}
	}
}

// TestIsqrt128 checks the integer square root at and around squares.
func TestIsqrt128(t *testing.T) {
	r := rand.New(rand.NewPCG(9, 9))
	for k := 0; k < 100_000; k++ {
		s := r.Uint64() >> (1 + r.IntN(64))
		for _, d := range []int{-1, 0, 1} {
			x := mul128(s, s)
			switch {
			case d < 0 && s > 0:
				x = x.sub(u128{0, 1})
			case d > 0:
				x, _ = x.add64(1)
			}
			want := s
			if d < 0 && s > 0 {
				want = s - 1
			}
			if d > 0 && s == 0 {
				want = 1
			}
			if got := isqrt128(x); got != want {
				t.Fatalf("isqrt(%v) = %d, want %d", x, got, want)
			}
		}
	}
}
