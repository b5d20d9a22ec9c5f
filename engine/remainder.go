package engine

import (
	"math/big"
	"math/bits"
	"sort"
	"strconv"
)

// This file holds the largest-remainder procedure: every unit receives the
// whole part of p/Q, the seats left over go to the largest remainders, and
// units whose result breaks a bound are fixed at it and the rest apportioned
// again.

// lrRound is one pass of the largest-remainder procedure over some units.
type lrRound struct {
	units []int // the units apportioned in this pass, in input order
	seats int   // the seats they share
	// whole holds the whole parts, by unit (not position): the seats of
	// the procedure's outcome, which the pass fills before the remainder
	// seats are added.
	whole []int
	// The remainder numerators, by position in units: in rem64 when every
	// one fits in 64 bits (the quota or the total does), otherwise in rems.
	rems  []u128
	rem64 []uint64
	// For Hamilton the remainder of unit j is rems[j]/total (a fraction of a
	// seat); for Droop it is rems[j] people (scaled).
	total u128 // population of these units (scaled)
	quota *big.Rat
	// ranked holds the positions in units: first those whose remainder is
	// above the cut value (the extra-th largest remainder), then those
	// equal to it from index gt, then those below it from index ge, each
	// group in input order (the group at the cut as cutGroups orders it),
	// and last the noPeople units without people, which take no seat by
	// remainder. Once sorted is set (rankAll), ranked is the full
	// ranking, largest remainder first and equal remainders in input order,
	// the units without people last.
	ranked   []int
	gt, ge   int
	noPeople int
	sorted   bool
	near     bool // rankNear has reordered the groups
	extra    int  // seats handed out by remainder
	// bound is at least every remainder; hist, when set, counts the
	// remainders by their leading bits below it (see kthLargest).
	bound u128
	hist  *[selectBuckets]int32
}

// lrOutcome is the raw result of the largest-remainder procedure.
type lrOutcome struct {
	seats  []int // after the tie rule
	full   []int // as handed out, tie included
	pinned []int // +1 fixed at maximum, -1 fixed at minimum, 0 free; nil when none is fixed
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

// lrPass apportions seats among units (total is their population) by
// whole parts and remainders, writing the whole parts into whole (by
// unit), and finds the cut.
func (pr *problem) lrPass(units []int, seats int, total u128, whole []int) (*lrRound, error) {
	r := &lrRound{units: units, seats: seats, whole: whole, total: total}
	if r.total.hi == 0 && r.total.lo == 0 {
		return nil, scenarioError("population", "the units left to apportion have no population")
	}
	sum := 0
	if seats == 0 {
		// Nothing left to share: every whole part and remainder is zero.
		for _, u := range units {
			whole[u] = 0
		}
		r.rem64 = make([]uint64, len(units))
		r.cutOrder()
		r.setAsideEmpty(pr.pops)
		return r, nil
	}
	switch pr.m {
	case Hamilton:
		if !pr.probe {
			r.quota = new(big.Rat).SetFrac(r.total.big(), new(big.Int).Mul(big.NewInt(int64(seats)), bigU(pow10(pr.places))))
		}
		if r.total.hi == 0 && !forceBig {
			sum = r.hareFloors(pr.pops, uint64(seats))
			break
		}
		r.bound = r.total
		r.rems = make([]u128, len(units))
		for j, u := range units {
			num := mul128(pr.pops[u], uint64(seats))
			q, rem := new(big.Int).QuoRem(num.big(), r.total.big(), new(big.Int))
			whole[u], r.rems[j] = int(q.Int64()), bigToU128(rem)
			sum += whole[u]
		}
	case Droop:
		scale := pow10(pr.places)
		q := droopQuota(r.total, seats, scale) // in scaled units
		if !pr.probe {
			r.quota = new(big.Rat).SetFrac(q.big(), bigU(scale))
		}
		if q.hi == 0 && !forceBig {
			sum = r.droopFloors(pr.pops, q.lo)
		} else {
			r.bound = q
			r.rems = make([]u128, len(units))
			qb := q.big()
			for j, u := range units {
				f, rem := new(big.Int).QuoRem(bigU(pr.pops[u]), qb, new(big.Int))
				whole[u], r.rems[j] = int(f.Int64()), bigToU128(rem)
				sum += whole[u]
			}
		}
	}
	r.extra = seats - sum
	populated := 0
	for _, u := range units {
		if pr.pops[u] > 0 {
			populated++
		}
	}
	if r.extra < 0 || r.extra > populated {
		pr.trace.recordWhole(r)
		return nil, scenarioError("seats", "the "+pr.m.Name()+" leaves "+strconv.Itoa(r.extra)+
			" seats over for "+strconv.Itoa(populated)+" units with people: too few people for this house size")
	}
	r.cutOrder()
	if populated < len(units) {
		r.setAsideEmpty(pr.pops)
	}
	return r, nil
}

// setAsideEmpty moves the units without people to the end of the ranking:
// a unit with no people takes no seat by remainder, even where its
// remainder (zero) equals the cut value. They were in the group at the
// cut or below it, never above it.
func (r *lrRound) setAsideEmpty(pops []uint64) {
	var kept, empty []int
	for _, j := range r.ranked[r.gt:] {
		if pops[r.units[j]] == 0 {
			empty = append(empty, j)
		} else {
			kept = append(kept, j)
		}
	}
	if len(empty) == 0 {
		return
	}
	ge := r.ge
	for _, j := range r.ranked[r.gt:r.ge] {
		if pops[r.units[j]] == 0 {
			ge--
		}
	}
	sortInts(empty)
	copy(r.ranked[r.gt:], kept)
	copy(r.ranked[r.gt+len(kept):], empty)
	r.ge, r.noPeople = ge, len(empty)
}

// narrowRems makes the pass's remainders 64-bit, every one below bound,
// and the histogram of their leading bits that kthLargest needs (nil for a
// pass too small to want one) with its shift.
func (r *lrRound) narrowRems(bound uint64) ([]uint64, *[selectBuckets]int32, int) {
	r.bound = u128{0, bound}
	var hist *[selectBuckets]int32
	if len(r.units) >= selectSmall {
		hist = new([selectBuckets]int32)
	}
	r.rem64 = make([]uint64, len(r.units))
	return r.rem64, hist, selectShift(r.bound)
}

// hareFloors fills the whole parts and remainders of p·seats/total for a
// 64-bit total and returns the sum of the whole parts. A floating-point
// quotient is only the first guess; the 128-bit remainder corrects it
// exactly.
func (r *lrRound) hareFloors(pops []uint64, seats uint64) (sum int) {
	t := r.total.lo
	ratio := float64(seats) / float64(t)
	rems, hist, shift := r.narrowRems(t)
	for j, u := range r.units {
		num := mul128(pops[u], seats)
		q := uint64(float64(pops[u]) * ratio)
		prod := mul128(q, t)
		for prod.cmp(num) > 0 {
			q--
			prod = prod.sub(u128{0, t})
		}
		rem := num.sub(prod) // below 2^64 once q is within one of the quotient
		for rem.hi != 0 || rem.lo >= t {
			q++
			rem = rem.sub(u128{0, t})
		}
		r.whole[u], rems[j] = int(q), rem.lo
		if hist != nil {
			hist[rem.lo>>shift&(selectBuckets-1)]++
		}
		sum += int(q)
	}
	r.hist = hist
	return sum
}

// droopFloors fills the whole parts and remainders of p/q for a 64-bit quota
// q (scaled) and returns the sum of the whole parts, correcting a
// floating-point first guess exactly.
func (r *lrRound) droopFloors(pops []uint64, q uint64) (sum int) {
	inv := 1 / float64(q)
	rems, hist, shift := r.narrowRems(q)
	for j, u := range r.units {
		p := pops[u]
		f := uint64(float64(p) * inv)
		hi, lo := bits.Mul64(f, q)
		for hi != 0 || lo > p {
			f--
			hi, lo = bits.Mul64(f, q)
		}
		rem := p - lo
		for rem >= q {
			f++
			rem -= q
		}
		r.whole[u], rems[j] = int(f), rem
		if hist != nil {
			hist[rem>>shift&(selectBuckets-1)]++
		}
		sum += int(f)
	}
	r.hist = hist
	return sum
}

// rem returns the remainder numerator at position j.
func (r *lrRound) rem(j int) u128 {
	if r.rem64 != nil {
		return u128{0, r.rem64[j]}
	}
	return r.rems[j]
}

func bigToU128(b *big.Int) u128 {
	lo := new(big.Int).And(b, new(big.Int).SetUint64(^uint64(0))).Uint64()
	hi := new(big.Int).Rsh(b, 64).Uint64()
	return u128{hi, lo}
}

// cutTie reports the positions (in r.units) tied at the cut: those awarded a
// remainder seat at the cut value and those left out at the same value, in
// input order. They are the group of remainders equal to the cut value
// (cutOrder), when it reaches past the cut.
func (r *lrRound) cutTie() (awarded, left []int) {
	if r.extra == 0 || r.extra == len(r.units) || r.ge <= r.extra {
		return nil, nil
	}
	awarded = append([]int(nil), r.ranked[r.gt:r.extra]...)
	left = append([]int(nil), r.ranked[r.extra:r.ge]...)
	return awarded, left
}

// The roles of a unit's remainder seat in a pass (remainderRole).
const (
	seatNeeded int8 = iota // it needs the seat to reach its minimum: it ends with it either way
	seatFree               // its remainder decides
	seatBarred             // it is at its maximum: it ends without the seat either way
)

// remainderRole is the role of the remainder seat of unit u, with whole
// part f in a pass: whether the seat decides that the pass fixes it at a
// bound.
func (pr *problem) remainderRole(u, f int) int8 {
	switch {
	case f+1 == pr.min[u]:
		return seatNeeded
	case f == pr.max[u]:
		return seatBarred
	}
	return seatFree
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
		u := r.units[j]
		switch pr.remainderRole(u, r.whole[u]) {
		case seatNeeded:
			need = append(need, j)
		case seatBarred:
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

// remainderCut runs the largest-remainder procedure with bounds. Its passes
// find the cut by selection: the remainders on either side of the cut are
// grouped but not ranked (see lrRound.ranked).
func (pr *problem) remainderCut() (*lrOutcome, error) {
	n := pr.n()
	out := &lrOutcome{full: make([]int, n)}
	active := make([]int, 0, n)
	bounded := false // some unit has a minimum or a maximum
	var total u128   // the population of the active units
	for i := 0; i < n; i++ {
		if pr.eligible[i] {
			active = append(active, i)
			bounded = bounded || pr.min[i] > 0 || pr.max[i] != noCap
			total, _ = total.add64(pr.pops[i])
		}
	}
	left := pr.h
	for {
		out.rounds++
		if len(active) == 0 {
			if left != 0 {
				pr.trace.fail()
				return nil, scenarioError("max", "the bounds cannot all be met")
			}
			break
		}
		if left < 0 {
			pr.trace.fail()
			return nil, scenarioError("min", "the minimums cannot all be met")
		}
		r, err := pr.lrPass(active, left, total, out.full)
		if err != nil {
			pr.trace.fail()
			return nil, err
		}
		out.passes = append(out.passes, r)
		aw, lf, forced := pr.cutGroups(r)
		pr.trace.record(pr, r)
		// This pass's seats (the whole parts are in out.full), then the
		// units they put outside a bound.
		for _, j := range r.ranked[:r.extra] {
			out.full[active[j]]++
		}
		fixedAny := false
		for _, u := range active {
			if !bounded {
				break
			}
			g := out.full[u]
			if (g < pr.min[u] || g > pr.max[u]) && out.pinned == nil {
				out.pinned = make([]int, n)
			}
			switch {
			case g < pr.min[u]:
				out.full[u], out.pinned[u] = pr.min[u], -1
				left -= pr.min[u]
				fixedAny = true
			case g > pr.max[u]:
				out.full[u], out.pinned[u] = pr.max[u], 1
				left -= pr.max[u]
				fixedAny = true
			}
		}
		if !fixedAny {
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
		rest := make([]int, 0, len(active))
		total = u128{}
		for _, u := range active {
			if out.pinned[u] == 0 {
				rest = append(rest, u)
				total, _ = total.add64(pr.pops[u])
			}
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
		return ratValue(new(big.Rat).SetFrac(r.rem(j).big(), r.total.big()))
	}
	return ratValue(new(big.Rat).SetFrac(r.rem(j).big(), bigU(pow10(pr.places))))
}
