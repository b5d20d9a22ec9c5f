package analysis

import (
	"errors"
	"math"
	"math/big"

	"seatsmith/engine"
)

// House-size rules: ways to choose the house size from the populations
// alone, and bodies derived from an apportionment.

// A SizeRule is a rule that chooses a house size.
type SizeRule uint8

const (
	// CubeRoot is the cube-root law of assembly size (R. Taagepera, "The
	// size of national assemblies", Social Science Research 1, 1972):
	// a national assembly tends to have about P^(1/3) seats for a
	// population of P. The house size is the whole number nearest to the
	// real cube root of the total population, found exactly: the n with
	// (2n − 1)³ ≤ 8P < (2n + 1)³.
	CubeRoot SizeRule = iota + 1
	// SmallestUnit makes the smallest unit's population the divisor: the
	// house size is the whole number nearest to P/p_min (halves round
	// up), where p_min is the smallest positive population, so that the
	// smallest unit's quota is about one seat. (In U.S. debate this is
	// called the Wyoming rule.)
	SmallestUnit
)

// String returns the rule's id.
func (r SizeRule) String() string {
	switch r {
	case CubeRoot:
		return "cube-root"
	case SmallestUnit:
		return "smallest-unit"
	}
	return "unknown"
}

// ParseSizeRule reads a rule id.
func ParseSizeRule(s string) (SizeRule, error) {
	switch s {
	case "cube-root", "cuberoot", "cube":
		return CubeRoot, nil
	case "smallest-unit", "smallest":
		return SmallestUnit, nil
	}
	return 0, errors.New("unknown house-size rule \"" + s + "\"; use cube-root or smallest-unit")
}

// A HouseSize is the house size a rule gives, with how it was found.
type HouseSize struct {
	Rule  SizeRule
	Total *big.Rat // the total population P
	// Exact is P/p_min for SmallestUnit, nil for CubeRoot (an irrational
	// cube root; Size is still found exactly).
	Exact *big.Rat
	// Text is the unrounded value: P/p_min to six places, or the cube
	// root to three (display only).
	Text string
	Size int // the house size
	// Smallest names the smallest unit and its population (SmallestUnit).
	Smallest   string
	SmallestOf engine.Decimal
}

// ChooseSize applies the rule to the units' populations (every unit,
// whatever a threshold would exclude).
func ChooseSize(r SizeRule, units []engine.Unit) (*HouseSize, error) {
	pops := make([]engine.Decimal, len(units))
	for i, u := range units {
		pops[i] = u.Population
	}
	total := totalOf(pops, nil)
	if total.Sign() == 0 {
		return nil, errors.New("every unit has a population of zero")
	}
	hs := &HouseSize{Rule: r, Total: total}
	switch r {
	case CubeRoot:
		n := nearestCubeRoot(total)
		hs.Size = int(n.Int64())
		f := new(big.Float).SetPrec(128).SetRat(total)
		root := cbrtFloat(f)
		hs.Text = root.Text('f', 3)
	case SmallestUnit:
		k := -1
		for i, u := range units {
			if !u.Population.IsZero() && (k < 0 || u.Population.Cmp(units[k].Population) < 0) {
				k = i
			}
		}
		hs.Smallest, hs.SmallestOf = units[k].Name, units[k].Population
		hs.Exact = new(big.Rat).Quo(total, ratOf(units[k].Population))
		hs.Text = Decimal(hs.Exact)
		twice := new(big.Rat).Mul(hs.Exact, big.NewRat(2, 1))
		twice.Add(twice, big.NewRat(1, 1))
		z := new(big.Int).Quo(twice.Num(), twice.Denom())
		hs.Size = int(z.Quo(z, big.NewInt(2)).Int64())
	default:
		return nil, errors.New("unknown house-size rule")
	}
	if hs.Size < 1 {
		hs.Size = 1
	}
	if hs.Size > engine.MaxSeats {
		return nil, errors.New("the rule gives a house larger than the limit")
	}
	return hs, nil
}

// nearestCubeRoot returns the whole number nearest to the cube root of
// x > 0: the n >= 0 with (2n−1)³ <= 8x < (2n+1)³.
func nearestCubeRoot(x *big.Rat) *big.Int {
	eight := new(big.Rat).Mul(x, big.NewRat(8, 1))
	// floor(8x) decides, since (2n+1)³ is a whole number.
	f := new(big.Int).Quo(eight.Num(), eight.Denom())
	// m = floor(cbrt(f)) by bisection on whole numbers.
	lo, hi := big.NewInt(0), big.NewInt(1)
	for cube(hi).Cmp(f) <= 0 {
		hi.Lsh(hi, 1)
	}
	for new(big.Int).Sub(hi, lo).Cmp(big.NewInt(1)) > 0 {
		mid := new(big.Int).Add(lo, hi)
		mid.Rsh(mid, 1)
		if cube(mid).Cmp(f) <= 0 {
			lo = mid
		} else {
			hi = mid
		}
	}
	// lo = floor(cbrt(8x)) = floor(2·cbrt(x)), and 2n−1 <= 2·cbrt(x) <
	// 2n+1 gives n = floor((lo+1)/2).
	n := new(big.Int).Add(lo, big.NewInt(1))
	return n.Rsh(n, 1)
}

func cube(x *big.Int) *big.Int {
	c := new(big.Int).Mul(x, x)
	return c.Mul(c, x)
}

// cbrtFloat approximates the cube root of f > 0 (display only).
func cbrtFloat(f *big.Float) *big.Float {
	x, _ := f.Float64()
	r := new(big.Float).SetPrec(f.Prec()).SetFloat64(cbrt64(x))
	// Newton steps in high precision: r = r - (r³ - f)/(3r²).
	for k := 0; k < 4; k++ {
		r2 := new(big.Float).Mul(r, r)
		num := new(big.Float).Sub(new(big.Float).Mul(r2, r), f)
		den := new(big.Float).Mul(r2, big.NewFloat(3))
		r.Sub(r, num.Quo(num, den))
	}
	return r
}

func cbrt64(x float64) float64 { return math.Cbrt(x) }

// A DerivedBody is a body made from an apportionment by adding the same
// number of seats to every unit, such as a college of the house's seats
// plus k per unit.
type DerivedBody struct {
	Result *engine.Result // the apportionment it is derived from
	Plus   int            // seats added to every unit
	Size   int            // the body's size: H + n·Plus over the units counted
	Units  []DerivedUnit
	// HouseIndices and BodyIndices are the Loosemore–Hanby, Gallagher
	// and Sainte-Laguë indices (see [Indices]) of the house and of the
	// body against the population shares of the units counted.
	HouseIndices, BodyIndices [3]float64
}

// A DerivedUnit is one unit's part of a derived body. Shares are exact
// fractions of one. Weight is the body share over the population share (1
// is exactly proportional, above 1 over-represented) and HouseWeight the
// same for the house; both nil for a unit without people.
type DerivedUnit struct {
	Name                string
	Seats, Body         int // seats in the house and in the body
	PopShare, BodyShare *big.Rat
	HouseShare          *big.Rat
	Weight, HouseWeight *big.Rat
	Counted             bool // false when excluded by a threshold
}

// Derive builds the body of res's seats plus plus seats per unit. Units
// excluded by a threshold receive no added seats and are not counted.
func Derive(res *engine.Result, plus int) (*DerivedBody, error) {
	if plus < 0 || plus > engine.MaxSeats/max(1, len(res.Units)) {
		return nil, errors.New("the seats added per unit must be between 0 and " + itoa(engine.MaxSeats/max(1, len(res.Units))))
	}
	d := &DerivedBody{Result: res, Plus: plus}
	total := new(big.Rat)
	for i := range res.Units {
		u := &res.Units[i]
		if u.Excluded {
			continue
		}
		total.Add(total, ratOf(u.Population))
		d.Size += u.Seats + plus
	}
	if d.Size == 0 || total.Sign() == 0 {
		return nil, errors.New("the body has no seats or no people")
	}
	for i := range res.Units {
		u := &res.Units[i]
		du := DerivedUnit{Name: u.Name, Seats: u.Seats, Counted: !u.Excluded, PopShare: new(big.Rat)}
		if du.Counted {
			du.Body = u.Seats + plus
			du.PopShare.Quo(ratOf(u.Population), total)
		}
		du.BodyShare = big.NewRat(int64(du.Body), int64(d.Size))
		du.HouseShare = big.NewRat(int64(u.Seats), int64(res.Seats))
		if du.PopShare.Sign() > 0 {
			du.Weight = new(big.Rat).Quo(du.BodyShare, du.PopShare)
			du.HouseWeight = new(big.Rat).Quo(du.HouseShare, du.PopShare)
		}
		d.Units = append(d.Units, du)
	}
	var v, hs, bs []*big.Rat
	for _, du := range d.Units {
		if du.Counted {
			v, hs, bs = append(v, du.PopShare), append(hs, du.HouseShare), append(bs, du.BodyShare)
		}
	}
	d.HouseIndices[0], d.HouseIndices[1], d.HouseIndices[2] = Indices(v, hs)
	d.BodyIndices[0], d.BodyIndices[1], d.BodyIndices[2] = Indices(v, bs)
	return d, nil
}
