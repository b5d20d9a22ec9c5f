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
	// early lists the ties in passes before the last that decided which
	// units were fixed at a bound; they were settled inside the pass by the
	// tie rule, or in input order when the scenario has none.
	early []Tie
	// passes are every pass in order, the final one last.
	passes []*lrRound
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
	if seats == 0 {
		// Nothing left to share: every whole part is zero.
		r.ranked = make([]int, len(units))
		for j := range r.ranked {
			r.ranked[j] = j
		}
		return r, nil
	}
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

// cutGroups orders the units tied at the cut and returns the tie that is
// left once the bounds have spoken. Among the tied units, those that need
// the contested seat to reach their minimum come first (they end with it
// either way: by remainder, or fixed at their minimum) and those already
// at their maximum come last (they end without it either way); the tie
// rule orders the rest, input order standing in when there is none. The
// tie that remains is the group the cut falls inside: aw are its positions
// (in r.units) that take a seat, lf those left out. forced reports that it
// is one of the bound groups, so that how it is settled decides which units
// are fixed at a bound.
func (pr *problem) cutGroups(r *lrRound) (aw, lf []int, forced bool) {
	a0, l0 := r.cutTie()
	if len(a0) == 0 {
		return nil, nil, false
	}
	k := len(a0)
	var need, free, full []int
	for _, j := range append(append([]int(nil), a0...), l0...) {
		u, f := r.units[j], r.floors[j]
		switch {
		case f+1 == pr.min[u]:
			need = append(need, j)
		case f == pr.max[u]:
			full = append(full, j)
		default:
			free = append(free, j)
		}
	}
	sortInts(need)
	sortInts(free)
	sortInts(full)
	if pr.tie.Kind == TieByLot && len(free) > 0 {
		// Put the units the rule draws first, so that the bounds are
		// checked against the rule's outcome.
		seats := min(max(k-len(need), 0), len(free))
		cands := make([]int, len(free))
		for x, j := range free {
			cands[x] = r.units[j]
		}
		win := map[int]bool{}
		for _, u := range pr.tie.settle(cands, seats) {
			win[u] = true
		}
		sort.SliceStable(free, func(x, y int) bool { return win[r.units[free[x]]] && !win[r.units[free[y]]] })
	}
	run := r.ranked[r.extra-k : r.extra-k+len(a0)+len(l0)]
	copy(run, append(append(append([]int(nil), need...), free...), full...))
	start := 0
	for g, grp := range [][]int{need, free, full} {
		if start < k && k < start+len(grp) {
			return grp[:k-start], grp[k-start:], g != 1
		}
		start += len(grp)
	}
	return nil, nil, false
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
		out.passes = append(out.passes, r)
		aw, lf, forced := pr.cutGroups(r)
		got := make([]int, len(active))
		for j := range active {
			got[j] = r.floors[j]
		}
		for k := 0; k < r.extra; k++ {
			got[r.ranked[k]]++
		}
		var rest []int
		fixedAny := false
		for j, u := range active {
			switch {
			case got[j] < pr.min[u]:
				out.full[u], out.pinned[u] = pr.min[u], -1
				left -= pr.min[u]
				fixedAny = true
			case got[j] > pr.max[u]:
				out.full[u], out.pinned[u] = pr.max[u], 1
				left -= pr.max[u]
				fixedAny = true
			default:
				rest = append(rest, u)
			}
		}
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
		// A tie among units whose bound it decides (a pass before the
		// last) was settled inside the pass: report it.
		if len(aw) > 0 && forced {
			out.early = append(out.early, *pr.lrTieRecord(r, aw, lf))
		}
		active = rest
	}
	if out.seats == nil {
		out.seats = out.full
	}
	return out, nil
}

// lrTieRecord reports a tie from a pass before the last; its seats were
// settled inside that pass by the tie rule, or in input order when the
// scenario has none.
func (pr *problem) lrTieRecord(r *lrRound, aw, lf []int) *Tie {
	rule := pr.tie.String()
	if pr.tie.Kind == TieReport {
		rule = "order (in a pass that fixed units at their bounds)"
	}
	t := &Tie{Seats: len(aw), Value: r.remValue(pr, aw[0]), Rule: rule}
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
