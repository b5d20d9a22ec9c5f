package analysis

import (
	"errors"
	"math"
	"math/big"
	"math/rand/v2"
	"sort"
	"strconv"

	"seatsmith/engine"
)

// The bias study: apportion many random population sets by each method and
// average how many seats beyond their quotas the large units receive,
// against the small units.
//
// # Population sets
//
// Every set is drawn from a PCG generator (math/rand/v2, NewPCG(seed,
// 0xb1a5)) using only its raw 64-bit outputs, so the same seed draws the
// same sets on every platform. Uniform whole numbers in [0, m) are taken by
// rejection (no modulo bias). Two distributions:
//
//   - Simplex (default): n−1 cut points drawn uniformly from the whole
//     numbers 0..T (T = the total population, default 10^8), sorted; the
//     populations are the n gaps between 0, the cut points and T. This is
//     the uniform distribution on the simplex of population shares, the
//     usual model of seat-bias theory (Schwingenschlögl and Pukelsheim,
//     "Seat biases in proportional representation systems with
//     thresholds", Social Choice and Welfare 27, 2006). A set with an
//     empty unit is drawn again.
//   - Decades: each population independently; its decade is chosen
//     uniformly among 10^3, 10^4, 10^5 and 10^6, then the population
//     uniformly among the whole numbers from 10^d to 10^(d+1) − 1 (a
//     piecewise log-uniform spread over four orders of magnitude).
//
// # The measure
//
// In each set the units are ranked by population (largest first, equal
// populations in draw order). The large class is the top third (at least
// one unit), the small class the bottom third. A class's seat bias is
// Σ (a_i − q_i) over its units, seats minus exact quotas q_i = p_i·H/P,
// computed exactly and then rounded to float64. The study reports, per
// method, the mean seat bias of each class, the mean of their difference
// (large minus small) and its standard error; averages are float64 (they
// decide no seat). A difference more than two standard errors from zero is
// called a lean towards large (positive) or small (negative) units.
//
// The house size matters. When the small units' quotas fall below one
// seat, the methods that give every unit a first seat (Adams, Dean,
// Huntington–Hill) favour them heavily and the others, Webster included,
// leave some of them without a seat; the default of 20 seats per unit
// keeps most quotas above that floor, where the classical pattern shows.
// Ties in
// a set are settled by lot, seeded from the study's seed and the set's
// number, so that no seat is left unassigned.
//
// Balinski and Young (Fair Representation, 2nd ed. 2001, ch. 9 and
// Appendix A) show the divisor methods ordered by how much they favour
// small units: Adams most, then Dean, Huntington–Hill, Webster (unbiased)
// and Jefferson, which favours large units.

// A Spread is the distribution population sets are drawn from.
type Spread uint8

const (
	// Simplex draws population shares uniformly on the simplex.
	Simplex Spread = iota
	// Decades draws each population piecewise log-uniformly over four
	// orders of magnitude.
	Decades
)

// String returns the spread's id.
func (d Spread) String() string {
	if d == Decades {
		return "decades"
	}
	return "simplex"
}

// ParseSpread reads "simplex" or "decades".
func ParseSpread(s string) (Spread, error) {
	switch s {
	case "simplex", "":
		return Simplex, nil
	case "decades":
		return Decades, nil
	}
	return 0, errors.New("unknown spread " + strconv.Quote(s) + "; use simplex or decades")
}

// BiasConfig describes a bias study. Zero fields take the defaults.
type BiasConfig struct {
	Seed    uint64          // default 1
	Draws   int             // population sets (default 2000)
	Units   int             // units per set (default 12)
	House   int             // house size (default 20 seats per unit)
	Spread  Spread          // default Simplex
	Total   uint64          // total population for Simplex (default 10^8)
	Methods []engine.Method // default all
}

// Limits on a bias study.
const (
	MaxBiasDraws = 1_000_000
	MaxBiasUnits = 1000
)

func (c *BiasConfig) defaults() error {
	if c.Seed == 0 {
		c.Seed = 1
	}
	if c.Draws == 0 {
		c.Draws = 2000
	}
	if c.Units == 0 {
		c.Units = 12
	}
	if c.House == 0 {
		c.House = 20 * c.Units
	}
	if c.Total == 0 {
		c.Total = 100_000_000
	}
	if len(c.Methods) == 0 {
		c.Methods = engine.Methods()
	}
	switch {
	case c.Draws < 1 || c.Draws > MaxBiasDraws:
		return errors.New("draws must be between 1 and " + itoa(MaxBiasDraws))
	case c.Units < 2 || c.Units > MaxBiasUnits:
		return errors.New("units must be between 2 and " + itoa(MaxBiasUnits))
	case c.House < c.Units || c.House > engine.MaxSeats:
		return errors.New("the house size must be at least the number of units (" + itoa(c.Units) + "), so that every method can give each unit a seat")
	case c.Spread == Simplex && c.Total < uint64(c.Units)*10:
		return errors.New("the total population must be at least ten people per unit")
	case c.Total > engine.MaxCoefficient:
		return errors.New("the total population must be at most 10^18")
	}
	return nil
}

// A MethodBias is one method's result in a bias study.
type MethodBias struct {
	Method engine.Method
	// Large and Small are the mean seat biases of the large and small
	// classes; Difference is the mean of Large − Small per set and
	// StdErr its standard error.
	Large, Small, Difference, StdErr float64
	// LargeAhead and SmallAhead count the sets where the large class's
	// seat bias is above, or below, the small class's.
	LargeAhead, SmallAhead int
	// Ties counts the sets with a tie settled by lot.
	Ties int
}

// Leaning says which units the method favours: "large", "small" or
// "neither" (within two standard errors of zero).
func (b *MethodBias) Leaning() string {
	switch {
	case b.Difference > 2*b.StdErr:
		return "large"
	case b.Difference < -2*b.StdErr:
		return "small"
	}
	return "neither"
}

// A BiasStudy is the outcome of [StudyBias].
type BiasStudy struct {
	Config  BiasConfig
	Class   int // units in each class
	Methods []MethodBias
}

// StudyBias runs a bias study.
func StudyBias(cfg BiasConfig) (*BiasStudy, error) {
	if err := cfg.defaults(); err != nil {
		return nil, err
	}
	for _, m := range cfg.Methods {
		if !m.Valid() {
			return nil, errors.New("invalid method")
		}
	}
	g := &draw{r: rand.NewPCG(cfg.Seed, 0xb1a5)}
	n := cfg.Units
	k := max(1, n/3)
	st := &BiasStudy{Config: cfg, Class: k, Methods: make([]MethodBias, len(cfg.Methods))}
	for j, m := range cfg.Methods {
		st.Methods[j].Method = m
	}
	sums := make([][3]float64, len(cfg.Methods)) // large, small, diff
	sq := make([]float64, len(cfg.Methods))
	units := make([]engine.Unit, n)
	for i := range units {
		units[i].Name = "unit " + itoa(i+1)
	}
	pops := make([]uint64, n)
	order := make([]int, n)
	for d := 0; d < cfg.Draws; d++ {
		g.populations(pops, cfg)
		var total uint64
		for i, p := range pops {
			units[i].Population = engine.Whole(p)
			total += p
			order[i] = i
		}
		sort.SliceStable(order, func(x, y int) bool { return pops[order[x]] > pops[order[y]] })
		large, small := order[:k], order[n-k:]
		for j, m := range cfg.Methods {
			s := &engine.Scenario{Units: units, Method: m, Tie: engine.TieRule{Kind: engine.TieByLot, Seed: cfg.Seed ^ uint64(d)*0x9e3779b97f4a7c15}}
			sw, err := engine.Sweep(s, cfg.House, cfg.House)
			if err != nil {
				return nil, err
			}
			z := &sw.Sizes[0]
			if z.Err != nil {
				return nil, z.Err
			}
			if len(z.Ties) > 0 {
				st.Methods[j].Ties++
			}
			l := classBias(large, z.Seats, pops, total, cfg.House)
			sm := classBias(small, z.Seats, pops, total, cfg.House)
			sums[j][0] += l
			sums[j][1] += sm
			sums[j][2] += l - sm
			sq[j] += (l - sm) * (l - sm)
			switch {
			case l > sm:
				st.Methods[j].LargeAhead++
			case l < sm:
				st.Methods[j].SmallAhead++
			}
		}
	}
	nd := float64(cfg.Draws)
	for j := range st.Methods {
		b := &st.Methods[j]
		b.Large, b.Small, b.Difference = sums[j][0]/nd, sums[j][1]/nd, sums[j][2]/nd
		if cfg.Draws > 1 {
			v := (sq[j] - nd*b.Difference*b.Difference) / (nd - 1)
			b.StdErr = math.Sqrt(math.Max(v, 0) / nd)
		}
	}
	return st, nil
}

// classBias returns Σ (a_i − p_i·H/P) over the class, exactly, as float64.
func classBias(class []int, seats []int, pops []uint64, total uint64, h int) float64 {
	var a int64
	p := new(big.Int)
	for _, i := range class {
		a += int64(seats[i])
		p.Add(p, new(big.Int).SetUint64(pops[i]))
	}
	num := new(big.Int).Mul(big.NewInt(a), new(big.Int).SetUint64(total))
	num.Sub(num, p.Mul(p, big.NewInt(int64(h))))
	f, _ := new(big.Rat).SetFrac(num, new(big.Int).SetUint64(total)).Float64()
	return f
}

// draw turns raw generator output into population sets.
type draw struct {
	r    *rand.PCG
	cuts []uint64
}

// below returns a uniform whole number in [0, m), m > 0, by rejection.
func (g *draw) below(m uint64) uint64 {
	limit := ^uint64(0) - (^uint64(0)%m+1)%m // the largest multiple of m, minus one
	for {
		x := g.r.Uint64()
		if x <= limit {
			return x % m
		}
	}
}

func (g *draw) populations(pops []uint64, cfg BiasConfig) {
	n := len(pops)
	if cfg.Spread == Decades {
		for i := range pops {
			lo := uint64(1000)
			for d := g.below(4); d > 0; d-- {
				lo *= 10
			}
			pops[i] = lo + g.below(9*lo)
		}
		return
	}
	for {
		g.cuts = g.cuts[:0]
		for i := 0; i < n-1; i++ {
			g.cuts = append(g.cuts, g.below(cfg.Total+1))
		}
		sort.Slice(g.cuts, func(x, y int) bool { return g.cuts[x] < g.cuts[y] })
		prev, ok := uint64(0), true
		for i := 0; i < n; i++ {
			next := cfg.Total
			if i < n-1 {
				next = g.cuts[i]
			}
			pops[i] = next - prev
			ok = ok && pops[i] > 0
			prev = next
		}
		if ok {
			return
		}
	}
}
