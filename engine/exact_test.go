package engine

import (
	"math/big"
	"math/rand/v2"
	"reflect"
	"testing"

	"pgregory.net/rapid"
)

// Exactness: the 128-bit fast path and the math/big path must agree on
// everything, on inputs near the limits where 128-bit products overflow
// (populations near MaxCoefficient = 10^18 squared for Huntington–Hill, and
// times large signposts for Dean and the others).

// withBig runs f with every comparison forced onto the math/big path.
func withBig(f func()) {
	forceBig = true
	defer func() { forceBig = false }()
	f()
}

func TestCmpProdMatchesBig(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		g := rapid.OneOf(rapid.Uint64(), rapid.Uint64Range(MaxCoefficient-1000, MaxCoefficient), rapid.Uint64Range(0, 10))
		a, b, c := g.Draw(t, "a"), g.Draw(t, "b"), g.Draw(t, "c")
		d, e, f := g.Draw(t, "d"), g.Draw(t, "e"), g.Draw(t, "f")
		x := new(big.Int).Mul(new(big.Int).Mul(bigU(a), bigU(b)), bigU(c))
		y := new(big.Int).Mul(new(big.Int).Mul(bigU(d), bigU(e)), bigU(f))
		if got, want := cmpProd3(a, b, c, d, e, f), x.Cmp(y); got != want {
			t.Fatalf("cmpProd3 = %d, want %d", got, want)
		}
	})
}

// nearLimit draws a scenario whose populations sit near 10^18, or are
// spread over many orders of magnitude, with house sizes large enough that
// s(a) times p^2 leaves 128 bits.
func nearLimit(t *rapid.T, m Method) *Scenario {
	n := rapid.IntRange(1, 7).Draw(t, "units")
	s := &Scenario{Method: m, Seats: rapid.SampledFrom([]int{1, 7, 435, 3000}).Draw(t, "seats")}
	if s.Seats > 1000 && !m.IsDivisor() {
		s.Seats = 1000
	}
	places := uint8(rapid.IntRange(0, 3).Draw(t, "places"))
	lim := MaxCoefficient / pow10(int(places))
	for i := 0; i < n; i++ {
		var c uint64
		switch rapid.IntRange(0, 2).Draw(t, "kind") {
		case 0:
			c = lim - rapid.Uint64Range(0, 1_000_000).Draw(t, "below")
		case 1:
			c = rapid.Uint64Range(1, lim).Draw(t, "any")
		default:
			c = rapid.Uint64Range(0, 1000).Draw(t, "small")
		}
		s.Units = append(s.Units, Unit{Name: testNames[i], Population: Decimal{Coef: c * pow10(int(places)), Places: places}.trim()})
	}
	if rapid.Bool().Draw(t, "threshold") {
		s.Threshold = Decimal{Coef: 5, Places: 2}
	}
	if rapid.Bool().Draw(t, "min") {
		s.Min = 1
	}
	return s
}

func TestFastAndBigPathsAgree(t *testing.T) {
	for _, m := range Methods() {
		t.Run(m.String(), func(t *testing.T) {
			rapid.Check(t, func(t *rapid.T) {
				s := nearLimit(t, m)
				// Margins of largest-remainder methods at these sizes are
				// searches of many full apportionments: they are checked on
				// the big path at small sizes in TestMarginsBigPath.
				detail := Full
				if !m.IsDivisor() || (!s.Threshold.IsZero() && s.Seats > 435) {
					// With a threshold, divisor margins are searches too.
					detail = WithOrder
				}
				r1, e1 := Allot(s, detail)
				var r2 *Result
				var e2 error
				withBig(func() { r2, e2 = Allot(s, detail) })
				if (e1 == nil) != (e2 == nil) || (e1 != nil && e1.Error() != e2.Error()) {
					t.Fatalf("errors differ: %v / %v", e1, e2)
				}
				if e1 != nil {
					return
				}
				// The quota's display text is computed differently on the
				// two paths; its exact value is compared below.
				for _, r := range []*Result{r1, r2} {
					for k := range r.Units {
						r.Units[k].Quota = Fraction{}
					}
				}
				if !reflect.DeepEqual(r1, r2) {
					t.Fatalf("results differ:\nfast %+v\nbig  %+v", r1.Units, r2.Units)
				}
				checkResult(t, s, r1)
				if m.IsDivisor() {
					checkCertificate(t, s, r1)
				}
			})
		})
	}
}

// TestHuntingtonHillOverflow puts two units at the largest population with
// seat counts whose products need more than 128 bits, and a third just
// below, so that every comparison takes the math/big path on its own.
func TestHuntingtonHillOverflow(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	for k := 0; k < 20; k++ {
		// p^2 = 10^36 is about 2^120, so p^2·a(a+1) leaves 128 bits from
		// about the 16th seat on.
		s := &Scenario{Method: HuntingtonHill, Seats: 100 + r.IntN(2000), Units: []Unit{
			{Name: "Orlen", Population: Whole(MaxCoefficient)},
			{Name: "Tamsk", Population: Whole(MaxCoefficient - uint64(r.IntN(1_000_000)))},
			{Name: "Brevia", Population: Whole(MaxCoefficient/3 + uint64(r.IntN(1000)))},
		}}
		r1, err := Allot(s, 0)
		if err != nil {
			t.Fatal(err)
		}
		var r2 *Result
		withBig(func() { r2, err = Allot(s, 0) })
		if err != nil {
			t.Fatal(err)
		}
		if !reflect.DeepEqual(seatsOf(r1), seatsOf(r2)) || len(r1.Ties) != len(r2.Ties) {
			t.Fatalf("fast %v, big %v", seatsOf(r1), seatsOf(r2))
		}
		// The reference, entirely in big.Rat, agrees.
		if ref := refAllot(s); !reflect.DeepEqual(ref.seats, seatsOf(r1)) {
			t.Fatalf("engine %v, reference %v", seatsOf(r1), ref.seats)
		}
	}
}

// TestMarginsBigPath: the margins of every method agree on both paths.
func TestMarginsBigPath(t *testing.T) {
	for _, m := range Methods() {
		t.Run(m.String(), func(t *testing.T) {
			rapid.Check(t, func(t *rapid.T) {
				s := genScenario(t, m, 4, 50_000, 12, rapid.Bool().Draw(t, "bounds"))
				r1, e1 := Allot(s, WithMargins)
				var r2 *Result
				var e2 error
				withBig(func() { r2, e2 = Allot(s, WithMargins) })
				if (e1 == nil) != (e2 == nil) {
					t.Fatalf("errors differ: %v / %v", e1, e2)
				}
				if e1 != nil {
					return
				}
				for k := range r1.Units {
					a, b := r1.Units[k], r2.Units[k]
					if a.Seats != b.Seats || decPtr(a.Gain) != decPtr(b.Gain) || decPtr(a.Lose) != decPtr(b.Lose) ||
						a.Lower != b.Lower || a.Upper != b.Upper || a.Quota.Approx != b.Quota.Approx {
						t.Fatalf("unit %d: fast %+v, big %+v", k, a, b)
					}
				}
			})
		})
	}
}
