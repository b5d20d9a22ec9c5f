package projection

import (
	"errors"
	"math"
	"math/rand/v2"
	"strconv"
	"strings"
)

// A Distribution is the shape of the error around a unit's central count.
type Distribution uint8

const (
	// Normal error: a draw is c·(1 + σ·Z) for a standard normal Z, and zero
	// if that is negative. Its mean is c and its standard deviation σ·c
	// (before the cut at zero, which matters only for σ near 1/3 or above).
	Normal Distribution = iota + 1
	// LogNormal error: a draw is c·exp(s·Z - s²/2) with s² = ln(1 + σ²), so
	// that its mean is c and its standard deviation σ·c exactly, and it is
	// never negative.
	LogNormal
)

// String returns "normal" or "lognormal".
func (d Distribution) String() string {
	switch d {
	case Normal:
		return "normal"
	case LogNormal:
		return "lognormal"
	}
	return "none"
}

// ParseDistribution reads "normal" or "lognormal" ("log-normal" is
// accepted too).
func ParseDistribution(s string) (Distribution, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "normal", "gaussian":
		return Normal, nil
	case "lognormal", "log-normal":
		return LogNormal, nil
	}
	return 0, errors.New("unknown error model " + strconv.Quote(s) + "; use normal or lognormal")
}

// perturb is one unit's error model in a form fast to draw from: a draw is
// c·(1 + a·z) (normal) or c·exp(a·z + b) (log-normal) for a standard
// normal z.
type perturb struct {
	c    float64 // central population, scaled (a whole number of the input's smallest step)
	a, b float64
	log  bool
}

func newPerturb(d Distribution, c, rse float64) perturb {
	if d == LogNormal {
		s2 := math.Log1p(rse * rse)
		return perturb{c: c, a: math.Sqrt(s2), b: -s2 / 2, log: true}
	}
	return perturb{c: c, a: rse}
}

// draw returns a perturbed population for the standard normal z, rounded
// to a whole number (of the input's smallest step) and kept within
// [0, limit].
func (p perturb) draw(z, limit float64) uint64 {
	var x float64
	if p.log {
		x = p.c * math.Exp(p.a*z+p.b)
	} else {
		x = p.c * (1 + p.a*z)
	}
	x = math.Round(x)
	switch {
	case !(x > 0):
		return 0
	case x >= limit:
		return uint64(limit)
	}
	return uint64(x)
}

// splitmix64 is the SplitMix64 finaliser (Steele, Lea and Flood, "Fast
// splittable pseudorandom number generators", OOPSLA 2014; constants cited
// from memory): a bijection of 64-bit words that spreads nearby inputs far
// apart. Any such bijection would do here: the draws need only distinct,
// well-mixed seeds.
func splitmix64(x uint64) uint64 {
	x += 0x9e3779b97f4a7c15
	x = (x ^ (x >> 30)) * 0xbf58476d1ce4e5b9
	x = (x ^ (x >> 27)) * 0x94d049bb133111eb
	return x ^ (x >> 31)
}

// seedDraw seeds src for draw number i of a study with the given seed.
// Every draw has its own stream, a function of (seed, i) alone, so the
// numbers do not depend on how draws are shared among workers.
func seedDraw(src *rand.PCG, seed uint64, i int) {
	a := splitmix64(seed ^ 0x5ea75e1d)
	b := splitmix64(a ^ uint64(i))
	src.Seed(b, splitmix64(b^0x243f6a8885a308d3))
}
