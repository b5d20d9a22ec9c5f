package projection

import (
	"errors"
	"math"
	"math/big"
	"strconv"
	"strings"

	"seatsmith/engine"
)

// A Growth is a model of how a unit's population changes with time.
type Growth uint8

const (
	// Linear growth: the population changes by the same number of people
	// every year.
	Linear Growth = iota + 1
	// Geometric growth: the population changes by the same factor every
	// year (exponential growth).
	Geometric
)

// String returns "linear" or "geometric".
func (g Growth) String() string {
	switch g {
	case Linear:
		return "linear"
	case Geometric:
		return "geometric"
	}
	return "none"
}

// ParseGrowth reads "linear" or "geometric" ("exponential" is accepted
// for geometric).
func ParseGrowth(s string) (Growth, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "linear":
		return Linear, nil
	case "geometric", "exponential":
		return Geometric, nil
	}
	return 0, errors.New("unknown growth model " + strconv.Quote(s) + "; use linear or geometric")
}

// A Fit says which counts a projection rests on.
type Fit uint8

const (
	// AllCounts fits the growth model to every count of the unit by least
	// squares.
	AllCounts Fit = iota
	// LastTwo draws the growth model through the two most recent counts.
	LastTwo
)

// String returns "all" or "last2".
func (f Fit) String() string {
	if f == LastTwo {
		return "last2"
	}
	return "all"
}

// ParseFit reads "all" or "last2".
func ParseFit(s string) (Fit, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "all", "":
		return AllCounts, nil
	case "last2", "last-two", "last":
		return LastTwo, nil
	}
	return 0, errors.New("unknown fit " + strconv.Quote(s) + "; use all or last2")
}

// A Projected is one unit's population projected to the target date.
type Projected struct {
	// Population is the projection, rounded to the nearest multiple of
	// 10^-places (to the nearest whole person for whole-number counts),
	// halves away from zero.
	Population engine.Decimal
	// Clamped is set when the fitted line falls below zero at the target
	// date; the projection is then zero.
	Clamped bool
	// Rate is the fitted change per year, for display: people per year
	// (linear) or the growth factor minus one (geometric; 0.01 is one
	// percent a year).
	Rate float64
}

// Project projects the counts of s to the target date under growth model g,
// fitted to the counts f chooses, and rounds the result to places decimal
// places. It needs at least two counts on different dates.
//
// Times are decimal years (see [Date.Years]). With counts (t_k, p_k),
// k = 1..m:
//
// Linear growth fits p(t) = a + b·t by ordinary least squares,
//
//	b = Σ (t_k - t̄)(p_k - p̄) / Σ (t_k - t̄)²,   p(T) = p̄ + b·(T - t̄),
//
// where t̄ and p̄ are the means. Through two counts this is the straight
// line p(T) = p_2 + (p_2 - p_1)·(T - t_2)/(t_2 - t_1). The arithmetic is
// exact (rational numbers) up to the final rounding.
//
// Geometric growth fits ln p(t) = a + b·t the same way, on the logarithms
// of the counts, so p(T) = exp(mean(ln p_k) + b·(T - t̄)); through two counts
// p(T) = p_2·(p_2/p_1)^((T - t_2)/(t_2 - t_1)). It needs every count above
// zero and is computed in floating point (float64) before the rounding.
func Project(s *Series, target Date, g Growth, f Fit, places int) (Projected, error) {
	cs := s.Counts
	if f == LastTwo && len(cs) > 2 {
		cs = cs[len(cs)-2:]
	}
	if len(cs) < 2 {
		return Projected{}, errors.New("a projection needs at least two dated counts; this unit has " + strconv.Itoa(len(cs)))
	}
	for _, c := range cs {
		if !c.Dated {
			return Projected{}, errors.New("a projection needs dated counts")
		}
	}
	switch g {
	case Linear:
		return projectLinear(cs, target, places)
	case Geometric:
		return projectGeometric(cs, target, places)
	}
	return Projected{}, errors.New("no growth model chosen")
}

func decimalRat(d engine.Decimal) *big.Rat {
	den := new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(d.Places)), nil)
	return new(big.Rat).SetFrac(new(big.Int).SetUint64(d.Coef), den)
}

func projectLinear(cs []Count, target Date, places int) (Projected, error) {
	m := big.NewRat(int64(len(cs)), 1)
	tbar, pbar := new(big.Rat), new(big.Rat)
	ts := make([]*big.Rat, len(cs))
	ps := make([]*big.Rat, len(cs))
	for k, c := range cs {
		ts[k], ps[k] = c.Date.Years(), decimalRat(c.Population)
		tbar.Add(tbar, ts[k])
		pbar.Add(pbar, ps[k])
	}
	tbar.Quo(tbar, m)
	pbar.Quo(pbar, m)
	sxy, sxx := new(big.Rat), new(big.Rat)
	for k := range cs {
		dt := new(big.Rat).Sub(ts[k], tbar)
		dp := new(big.Rat).Sub(ps[k], pbar)
		sxy.Add(sxy, new(big.Rat).Mul(dt, dp))
		sxx.Add(sxx, new(big.Rat).Mul(dt, dt))
	}
	if sxx.Sign() == 0 {
		return Projected{}, errors.New("the counts are all on one date")
	}
	b := new(big.Rat).Quo(sxy, sxx)
	v := new(big.Rat).Sub(target.Years(), tbar)
	v.Mul(v, b).Add(v, pbar)
	rate, _ := b.Float64()
	out := Projected{Rate: rate}
	if v.Sign() < 0 {
		out.Clamped = true
		out.Population = engine.Decimal{Places: uint8(places)}
		return out, nil
	}
	// Round v·10^places to the nearest whole number, halves up.
	scale := new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(places)), nil)
	v.Mul(v, new(big.Rat).SetInt(scale))
	num := new(big.Int).Mul(v.Num(), big.NewInt(2))
	num.Add(num, v.Denom())
	q := num.Quo(num, new(big.Int).Mul(v.Denom(), big.NewInt(2)))
	if !q.IsUint64() || q.Uint64() > engine.MaxCoefficient {
		return Projected{}, errors.New("the projection is larger than 10^18")
	}
	out.Population = engine.Decimal{Coef: q.Uint64(), Places: uint8(places)}
	return out, nil
}

func projectGeometric(cs []Count, target Date, places int) (Projected, error) {
	n := float64(len(cs))
	t0 := cs[len(cs)-1].Date.yearsFloat() // times relative to the latest count
	var tbar, ybar float64
	ts := make([]float64, len(cs))
	ys := make([]float64, len(cs))
	for k, c := range cs {
		if c.Population.IsZero() {
			return Projected{}, errors.New("geometric growth needs every count above zero; the count for " + c.Date.String() + " is 0")
		}
		ts[k] = c.Date.yearsFloat() - t0
		f, _ := decimalRat(c.Population).Float64()
		ys[k] = math.Log(f)
		tbar += ts[k]
		ybar += ys[k]
	}
	tbar /= n
	ybar /= n
	var sxy, sxx float64
	for k := range cs {
		sxy += (ts[k] - tbar) * (ys[k] - ybar)
		sxx += (ts[k] - tbar) * (ts[k] - tbar)
	}
	if sxx == 0 {
		return Projected{}, errors.New("the counts are all on one date")
	}
	b := sxy / sxx
	v := math.Exp(ybar + b*(target.yearsFloat()-t0-tbar))
	scaled := math.Round(v * math.Pow(10, float64(places)))
	if !(scaled <= engine.MaxCoefficient) {
		return Projected{}, errors.New("the projection is larger than 10^18")
	}
	return Projected{Population: engine.Decimal{Coef: uint64(scaled), Places: uint8(places)}, Rate: math.Expm1(b)}, nil
}
