package engine

import (
	"math/big"
	"sort"
	"strconv"
)

// This file holds the largest-remainder procedure: every unit receives the
// whole part of p/Q, the seats left over go to the largest remainders, and
// units whose result breaks a bound are fixed at it and the rest apportioned
// again.

// lrRound is one pass of the largest-remainder procedure over some units.
type lrRound struct {
	units  []int  // the units apportioned in this pass, in input order
	seats  int    // the seats they share
	floors []int  // whole parts, by position in units
	rems   []u128 // remainder numerators, by position in units
	// For Hamilton the remainder of unit j is rems[j]/total (a fraction of a
	// seat); for Droop it is rems[j] people (scaled).
	total  u128 // population of these units (scaled)
	quota  *big.Rat
	ranked []int // positions in units, largest remainder first
	extra  int   // seats handed out by remainder
}

// lrOutcome is the raw result of the largest-remainder procedure.
type lrOutcome struct {
	seats  []int // after the tie rule
	full   []int // as handed out, tie included
	pinned []int // +1 fixed at maximum, -1 fixed at minimum, 0 free
	final  *lrRound
	rounds int
	tie    *Tie
}

func (pr *problem) lrPass(units []int, seats int) (*lrRound, error) {
	r := &lrRound{units: units, seats: seats, floors: make([]int, len(units)), rems: make([]u128, len(units))}
	for _, u := range units {
		r.total, _ = r.total.add64(pr.pops[u])
	}
	if r.total.hi == 0 && r.total.lo == 0 {
		return nil, scenarioError("population", "the units left to apportion have no population")
	}
	sum := 0
	switch pr.m {
	case Hamilton:
		r.quota = new(big.Rat).SetFrac(r.total.big(), new(big.Int).Mul(big.NewInt(int64(seats)), bigU(pow10(pr.places))))
		for j, u := range units {
			num := mul128(pr.pops[u], uint64(seats))
			if r.total.hi == 0 && !forceBig {
				q, rem, _ := divmod128(num, r.total.lo)
				r.floors[j], r.rems[j] = int(q), u128{0, rem}
			} else {
				q, rem := new(big.Int).QuoRem(num.big(), r.total.big(), new(big.Int))
				r.floors[j], r.rems[j] = int(q.Int64()), bigToU128(rem)
			}
			sum += r.floors[j]
		}
	case Droop:
		scale := pow10(pr.places)
		div := new(big.Int).Mul(bigU(scale), big.NewInt(int64(seats)+1))
		q := new(big.Int).Quo(r.total.big(), div)
		q.Add(q, big.NewInt(1))
		r.quota = new(big.Rat).SetInt(q)
		q.Mul(q, bigU(scale)) // the quota in scaled units
		if q.IsUint64() && !forceBig {
			qq := q.Uint64()
			for j, u := range units {
				r.floors[j], r.rems[j] = int(pr.pops[u]/qq), u128{0, pr.pops[u] % qq}
				sum += r.floors[j]
			}
		} else {
			for j, u := range units {
				f, rem := new(big.Int).QuoRem(bigU(pr.pops[u]), q, new(big.Int))
				r.floors[j], r.rems[j] = int(f.Int64()), bigToU128(rem)
				sum += r.floors[j]
			}
		}
	}
	r.extra = seats - sum
	if r.extra < 0 || r.extra > len(units) {
		return nil, scenarioError("seats", "the "+pr.m.Name()+" leaves "+strconv.Itoa(r.extra)+
			" seats over for "+strconv.Itoa(len(units))+" units: too few people for this house size")
	}
	r.ranked = make([]int, len(units))
	for j := range r.ranked {
		r.ranked[j] = j
	}
	sort.SliceStable(r.ranked, func(x, y int) bool {
		return r.rems[r.ranked[x]].cmp(r.rems[r.ranked[y]]) > 0
	})
	return r, nil
}

func bigToU128(b *big.Int) u128 {
	lo := new(big.Int).And(b, new(big.Int).SetUint64(^uint64(0))).Uint64()
	hi := new(big.Int).Rsh(b, 64).Uint64()
	return u128{hi, lo}
}

// cutTie reports the positions (in r.units) tied at the cut: those awarded a
// remainder seat at the cut value and those left out at the same value.
func (r *lrRound) cutTie() (awarded, left []int) {
	if r.extra == 0 || r.extra == len(r.units) {
		return nil, nil
	}
	v := r.rems[r.ranked[r.extra-1]]
	if r.rems[r.ranked[r.extra]].cmp(v) != 0 {
		return nil, nil
	}
	for k, j := range r.ranked {
		if r.rems[j].cmp(v) == 0 {
			if k < r.extra {
				awarded = append(awarded, j)
			} else {
				left = append(left, j)
			}
		}
	}
	return awarded, left
}

// remainderSeats runs the largest-remainder procedure with bounds.
func (pr *problem) remainderSeats() (*lrOutcome, error) {
	n := pr.n()
	out := &lrOutcome{full: make([]int, n), pinned: make([]int, n)}
	active := make([]int, 0, n)
	for i := 0; i < n; i++ {
		if pr.eligible[i] {
			active = append(active, i)
		}
	}
	left := pr.h
	var earlyTie *Tie
	for {
		out.rounds++
		if len(active) == 0 {
			if left != 0 {
				return nil, scenarioError("max", "the bounds cannot all be met")
			}
			break
		}
		if left < 0 {
			return nil, scenarioError("min", "the minimums cannot all be met")
		}
		r, err := pr.lrPass(active, left)
		if err != nil {
			return nil, err
		}
		got := make([]int, len(active))
		for j := range active {
			got[j] = r.floors[j]
		}
		for k := 0; k < r.extra; k++ {
			got[r.ranked[k]]++
		}
		var rest []int
		fixedAny := false
		fixedPos := map[int]bool{}
		for j, u := range active {
			switch {
			case got[j] < pr.min[u]:
				out.full[u], out.pinned[u] = pr.min[u], -1
				left -= pr.min[u]
				fixedAny = true
				fixedPos[j] = true
			case got[j] > pr.max[u]:
				out.full[u], out.pinned[u] = pr.max[u], 1
				left -= pr.max[u]
				fixedAny = true
				fixedPos[j] = true
			default:
				rest = append(rest, u)
			}
		}
		aw, lf := r.cutTie()
		if !fixedAny {
			for j, u := range active {
				out.full[u] = got[j]
			}
			out.final = r
			out.seats = out.full
			if len(aw) > 0 {
				tail := make([]award, len(aw))
				losers := make([]int, len(lf))
				for k, j := range aw {
					tail[k] = award{u: active[j]}
				}
				for k, j := range lf {
					losers[k] = active[j]
				}
				out.tie, out.seats = pr.settleTie(out.full, tail, losers, r.remValue(pr, aw[0]))
			}
			break
		}
		// A tie in a pass whose outcome fixed a tied unit at a bound also
		// decided the result: report it.
		if earlyTie == nil && len(aw) > 0 {
			for _, j := range append(append([]int(nil), aw...), lf...) {
				if fixedPos[j] {
					earlyTie = pr.lrTieRecord(r, aw, lf)
					break
				}
			}
		}
		active = rest
	}
	if out.tie == nil && earlyTie != nil {
		out.tie = earlyTie
	}
	if out.seats == nil {
		out.seats = out.full
	}
	return out, nil
}

// lrTieRecord reports a tie from a pass before the last; its seats were
// settled by input order inside that pass.
func (pr *problem) lrTieRecord(r *lrRound, aw, lf []int) *Tie {
	t := &Tie{Seats: len(aw), Value: r.remValue(pr, aw[0]), Rule: "order (in a pass that fixed a unit at a bound)"}
	for _, j := range append(append([]int(nil), aw...), lf...) {
		t.Units = append(t.Units, r.units[j])
	}
	sortInts(t.Units)
	for _, u := range t.Units {
		t.Names = append(t.Names, pr.names[u])
	}
	for _, j := range aw {
		t.Winners = append(t.Winners, r.units[j])
	}
	sortInts(t.Winners)
	return t
}

// remValue shows the remainder at position j: a fraction of a seat for
// Hamilton, people for Droop.
func (r *lrRound) remValue(pr *problem, j int) Value {
	if pr.m == Hamilton {
		return ratValue(new(big.Rat).SetFrac(r.rems[j].big(), r.total.big()))
	}
	return ratValue(new(big.Rat).SetFrac(r.rems[j].big(), bigU(pow10(pr.places))))
}
