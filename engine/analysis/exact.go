package analysis

import (
	"math/big"
	"strconv"

	"seatsmith/engine"
)

// This file holds the exact arithmetic the findings rest on: populations,
// shares and quotas as rational numbers (math/big), written as decimals
// only for reading.

// TextPlaces is the number of decimal places in the decimal texts of exact
// values (quotas, growth rates, shares) unless a shorter text is exact.
const TextPlaces = 6

// ratOf returns d as an exact rational.
func ratOf(d engine.Decimal) *big.Rat {
	den := new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(d.Places)), nil)
	return new(big.Rat).SetFrac(new(big.Int).SetUint64(d.Coef), den)
}

// Decimal writes r with at most TextPlaces decimal places: exactly when
// that is enough, otherwise rounded to nearest (halves away from zero).
func Decimal(r *big.Rat) string {
	if r == nil {
		return ""
	}
	if r.IsInt() {
		return r.Num().String()
	}
	for p := 1; p <= TextPlaces; p++ {
		scaled := new(big.Rat).Mul(r, new(big.Rat).SetInt(new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(p)), nil)))
		if scaled.IsInt() {
			return r.FloatString(p)
		}
	}
	return r.FloatString(TextPlaces)
}

// Fraction writes r exactly as "n/d", or as a whole number.
func Fraction(r *big.Rat) string {
	if r == nil {
		return ""
	}
	if r.IsInt() {
		return r.Num().String()
	}
	return r.Num().String() + "/" + r.Denom().String()
}

// Percent writes r as a percentage with two decimal places unless shorter
// and exact, such as "12.5%".
func Percent(r *big.Rat) string {
	p := new(big.Rat).Mul(r, big.NewRat(100, 1))
	for k := 0; k <= 2; k++ {
		s := new(big.Rat).Mul(p, new(big.Rat).SetInt(new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(k)), nil)))
		if s.IsInt() {
			return p.FloatString(k) + "%"
		}
	}
	return p.FloatString(2) + "%"
}

// approx returns the nearest float64 to r (display only).
func approx(r *big.Rat) float64 {
	f, _ := r.Float64()
	return f
}

// totalOf adds the populations of the units not excluded.
func totalOf(pops []engine.Decimal, excluded []bool) *big.Rat {
	t := new(big.Rat)
	for i, p := range pops {
		if excluded == nil || !excluded[i] {
			t.Add(t, ratOf(p))
		}
	}
	return t
}

// quotaOf returns the standard quota p·h/total exactly (zero when excluded
// or when the total is zero).
func quotaOf(p engine.Decimal, total *big.Rat, h int, excluded bool) *big.Rat {
	if excluded || total.Sign() == 0 {
		return new(big.Rat)
	}
	q := new(big.Rat).Mul(ratOf(p), big.NewRat(int64(h), 1))
	return q.Quo(q, total)
}

// floorCeil returns the lower and upper quota of q.
func floorCeil(q *big.Rat) (lo, hi int) {
	f := new(big.Int).Quo(q.Num(), q.Denom())
	lo = int(f.Int64())
	if q.IsInt() {
		return lo, lo
	}
	return lo, lo + 1
}

func itoa(n int) string { return strconv.Itoa(n) }

func plural(n int, w string) string {
	if n == 1 {
		return "1 " + w
	}
	return itoa(n) + " " + w + "s"
}
