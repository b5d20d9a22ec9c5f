package engine

import (
	"math"
	"strconv"
)

// This file holds the warm-start allotter: it apportions many variants of
// one scenario (new populations, everything else the same) exactly, starting
// each from a divisor near the one that solved the scenario instead of
// handing out every seat again.
//
// For a divisor method the procedure is:
//
//  1. Estimate the divisor: the baseline divisor scaled by the ratio of the
//     new total population to the baseline total, then moved in floating
//     point until the floating-point roundings add up to the house size.
//     This is an estimate only; no seat depends on it.
//  2. Fix an exact divisor D near that estimate. D is written as the
//     priority value P/s(K) of a virtual unit with population P and K seats,
//     so that every comparison with D is an ordinary exact comparison of
//     priority values (cmpQuot, 128-bit products with a math/big fallback).
//  3. Round every unit at D: start from the floating-point rounding and
//     correct it exactly against the signposts, so that every seat a unit
//     holds beyond its minimum has priority at least D and every next seat
//     below its maximum has priority at most D. The result is what a divisor
//     method gives at D, so it is consistent: its least held priority is at
//     least its greatest next priority.
//  4. If the seats do not add up to the house size, hand out the missing
//     seats to the greatest next priorities, or take back the surplus from
//     the least held priorities, with a small heap. Both steps keep the
//     result consistent, and a consistent result of the right size is the
//     divisor method's result.
//  5. Detect a tie exactly (the least held priority equals the greatest next
//     priority) and settle it exactly as Allot does.
//
// Largest-remainder methods have no divisor to start from; they are
// apportioned in full for every call.

// MaxWarmContest is the most seats on each side of the cut a
// [WarmAllotter] reports in [WarmResult.Last] and [WarmResult.Next].
const MaxWarmContest = 32

// A WarmAllotter apportions many variants of one scenario exactly and fast:
// the same units, bounds, method, house size, threshold and tie rule, with
// new populations for every call. Every result equals what [Allot] gives for
// the scenario with those populations: the same seats, the same ties, the
// same seats left unassigned.
//
// A WarmAllotter is not safe for concurrent use; give every goroutine its
// own with [WarmAllotter.Clone].
type WarmAllotter struct {
	sh   *warmShared
	pr   problem // the baseline problem with this call's populations
	elig []bool
	idx  []int32    // heap scratch
	sel  []warmSeat // contention scratch
	// Floating-point scratch: populations over the estimated divisor and
	// seat values, and the presolved divisor.
	xf, gf, tf, tn []float64
	fdiv           float64
}

// warmShared is the read-only part shared by clones.
type warmShared struct {
	base    *problem
	contest int
	// Divisor methods: a divisor inside the baseline's range and the
	// baseline's apportioned population (scaled units, floating point:
	// estimates only), and the virtual unit's seat count K and signpost.
	d0, q0 float64
	vk     int
	vs     signpost
	vsf    float64
	// Floating-point signposts s(k) and their reciprocals for the first
	// seat counts, to spare the divisions and square roots (estimates and
	// the contention filter only).
	sfT, rsT []float64
}

// warmTable is the most seat counts whose signposts are tabulated.
const warmTable = 1 << 14

// sf is s(k) in floating point.
func (sh *warmShared) sf(k int) float64 {
	if uint(k) < uint(len(sh.sfT)) {
		return sh.sfT[k]
	}
	return warmSignpostFloat(sh.base.m, k)
}

// rs is 1/s(k) in floating point (+Inf when s(k) is zero).
func (sh *warmShared) rs(k int) float64 {
	if uint(k) < uint(len(sh.rsT)) {
		return sh.rsT[k]
	}
	return 1 / warmSignpostFloat(sh.base.m, k)
}

// A WarmResult is one apportionment made by a [WarmAllotter]. Its slices are
// reused by the next call that is given the same WarmResult.
type WarmResult struct {
	// Seats holds every unit's seats, in input order: outright, or given
	// by the scenario's tie rule.
	Seats []int
	// Unassigned counts the seats left open by a tie that no rule settled.
	Unassigned int
	// Tied lists the units (indexes, in input order) with exactly equal
	// claims on contested seats; TieSeats is the number of seats they
	// contest. Both are empty when there is no tie.
	Tied     []int
	TieSeats int
	// Last lists the units holding the last seats handed out, the last
	// first: for a divisor method the holders of the least priority values
	// among the seats held beyond the minimums (Last[0] holds the seat
	// numbered H minus Unassigned); for a largest-remainder method the units
	// whose remainders won the last seats in the final pass, the smallest
	// winning remainder first. Next lists the units that would take the
	// first seats beyond: for a divisor method seats H+1, H+2, ... (a unit
	// may appear more than once); for a largest-remainder method the largest
	// remainders that won no seat. Both have at most the contest length
	// given to [NewWarmAllotter].
	Last, Next []int
}

// NewWarmAllotter prepares to apportion variants of s. It apportions s
// itself to find the divisor that later calls start from, and returns an
// *[Error] when s is invalid or cannot be apportioned. contest (0 to
// [MaxWarmContest]) is how many seats on each side of the cut every result
// reports in Last and Next; 0 skips that work.
func NewWarmAllotter(s *Scenario, contest int) (*WarmAllotter, error) {
	if contest < 0 || contest > MaxWarmContest {
		return nil, scenarioError("contest", "the seats reported on each side of the cut must be between 0 and "+strconv.Itoa(MaxWarmContest)+", not "+strconv.Itoa(contest))
	}
	pr, err := prepare(s)
	if err != nil {
		return nil, err
	}
	sh := &warmShared{base: pr, contest: contest}
	o, err := pr.run(false)
	if err != nil {
		return nil, err
	}
	if pr.m.IsDivisor() {
		sh.setDivisor(o.full)
	}
	return sh.allotter(), nil
}

// setDivisor records the baseline divisor estimate and picks the virtual
// unit that represents exact divisors.
func (sh *warmShared) setDivisor(seats []int) {
	pr := sh.base
	var qmax uint64
	for i, p := range pr.pops {
		if pr.eligible[i] {
			sh.q0 += float64(p)
			qmax = max(qmax, p)
		}
	}
	low, lowOK, high, highOK := pr.divisorBounds(seats)
	lf, hf := 0.0, math.Inf(1)
	if lowOK {
		lf = warmFloat(pr.m, low)
	}
	if highOK {
		hf = warmFloat(pr.m, high)
	}
	switch {
	case lf > 0 && !math.IsInf(hf, 0):
		sh.d0 = math.Sqrt(lf * hf)
	case lf > 0:
		sh.d0 = lf * 1.05
	case !math.IsInf(hf, 0) && hf > 0:
		sh.d0 = hf * 0.95
	default:
		sh.d0 = sh.q0 / float64(pr.h)
	}
	if !(sh.d0 > 0) || math.IsInf(sh.d0, 0) {
		sh.d0 = 1
	}
	// Keep q·K within 2^57 for the largest population so that the exact
	// comparisons with the divisor stay in 128-bit arithmetic, and K large
	// enough that P/s(K) can sit almost anywhere.
	k := uint64(1) << 30
	if qmax > 0 {
		k = min(k, (uint64(1)<<57)/qmax)
	}
	sh.vk = int(max(k, 1))
	sh.vs = pr.m.signpost(sh.vk)
	sh.vsf = warmSignpostFloat(pr.m, sh.vk)
	n := min(pr.h+2, warmTable)
	sh.sfT, sh.rsT = make([]float64, n), make([]float64, n)
	for k := range n {
		sh.sfT[k] = warmSignpostFloat(pr.m, k)
		sh.rsT[k] = 1 / sh.sfT[k]
	}
}

func (sh *warmShared) allotter() *WarmAllotter {
	n := sh.base.n()
	w := &WarmAllotter{sh: sh, pr: *sh.base, elig: make([]bool, n), idx: make([]int32, 0, n),
		xf: make([]float64, n), gf: make([]float64, n)}
	w.sel = make([]warmSeat, 0, sh.contest+1)
	w.tf = make([]float64, 0, sh.contest+1)
	w.tn = make([]float64, 0, sh.contest+1)
	return w
}

// Clone returns a WarmAllotter for the same scenario with its own scratch
// space, for use by another goroutine.
func (w *WarmAllotter) Clone() *WarmAllotter { return w.sh.allotter() }

// Places is the number of decimal places of the scaled populations that
// [WarmAllotter.Allot] takes: a population x is passed as x·10^Places, a
// whole number.
func (w *WarmAllotter) Places() int { return w.sh.base.places }

// Populations returns the scenario's own populations, scaled as Allot takes
// them.
func (w *WarmAllotter) Populations() []uint64 {
	return append([]uint64(nil), w.sh.base.pops...)
}

// Method returns the scenario's method.
func (w *WarmAllotter) Method() Method { return w.sh.base.m }

// Allot apportions the scenario with the populations pops (one per unit,
// in input order, scaled by 10^Places and at most [MaxCoefficient]) and
// stores the result in r. It returns an *[Error] when no apportionment
// exists for these populations (for example when a unit drops to zero and
// the bounds can no longer be met); r is then undefined. Allot does not
// modify pops.
func (w *WarmAllotter) Allot(pops []uint64, r *WarmResult) error {
	base := w.sh.base
	n := base.n()
	if len(pops) != n {
		return scenarioError("units", strconv.Itoa(len(pops))+" populations for "+strconv.Itoa(n)+" units")
	}
	var total u128
	same := true // the same units have people as in the scenario
	for i, p := range pops {
		if p > MaxCoefficient {
			return unitError(i, base.names[i], "population", "out of range")
		}
		total, _ = total.add64(p)
		same = same && (p == 0) == (base.pops[i] == 0)
	}
	if total.hi == 0 && total.lo == 0 {
		return scenarioError("population", "every unit has a population of zero")
	}
	pr := &w.pr
	pr.pops = pops
	if th := base.threshold; !th.IsZero() {
		for i, p := range pops {
			w.elig[i] = !belowShare(p, total, th)
		}
		pr.eligible = w.elig
	}
	// Feasibility depends on the populations only through which units have
	// people and which pass the threshold; the scenario itself passed.
	if !same || !base.threshold.IsZero() {
		if err := pr.checkFeasible(); err != nil {
			return err
		}
	}
	r.reset(n)
	if !pr.m.IsDivisor() {
		return w.remainder(r)
	}
	return w.divisor(r)
}

func (r *WarmResult) reset(n int) {
	if cap(r.Seats) >= n {
		r.Seats = r.Seats[:n]
	} else {
		r.Seats = make([]int, n)
	}
	r.Unassigned, r.TieSeats = 0, 0
	r.Tied, r.Last, r.Next = r.Tied[:0], r.Last[:0], r.Next[:0]
}

// divisor runs steps 1 to 5 of the procedure described at the top of the
// file.
func (w *WarmAllotter) divisor(r *WarmResult) error {
	sh, pr := w.sh, &w.pr
	m, a := pr.m, r.Seats
	var qf float64
	for i, p := range pr.pops {
		if pr.eligible[i] {
			qf += float64(p)
		}
	}
	// The exact divisor D = P/s(K) and its floating-point value.
	pf := math.Round(sh.d0 * qf / sh.q0 * sh.vsf)
	var P uint64
	switch {
	case !(pf >= 1):
		P = 1
	case pf >= 1<<63:
		P = 1 << 63
	default:
		P = uint64(pf)
	}
	df := float64(P) / sh.vsf
	// The floating-point rounding at df, moved to the house size in
	// floating point; it only chooses the exact divisor and the starting
	// points of the exact rounding below.
	w.presolve(a, df)
	if w.fdiv > 0 {
		pf = math.Round(df * w.fdiv * sh.vsf)
		if pf >= 1 && pf < 1<<63 {
			P = uint64(pf)
		}
	}
	onD := false // some seat's priority equals D exactly
	sum := 0
	for i, p := range pr.pops {
		if !pr.eligible[i] {
			a[i] = 0
			continue
		}
		lo, hi := pr.min[i], min(pr.max[i], pr.h)
		if p == 0 {
			a[i] = lo
			sum += lo
			continue
		}
		k := a[i]
		moved := false
		for k > lo {
			c := cmpQuot(p, m.signpost(k-1), P, sh.vs)
			if c == 0 {
				onD = true
			}
			if c >= 0 {
				break
			}
			k--
			moved = true
		}
		if !moved {
			for k < hi {
				c := cmpQuot(p, m.signpost(k), P, sh.vs)
				if c == 0 {
					onD = true
				}
				if c <= 0 {
					break
				}
				k++
			}
		}
		a[i] = k
		sum += k
	}
	tied := false
	switch {
	case sum < pr.h:
		h := w.heap(a, false)
		var last prio
		for ; sum < pr.h; sum++ {
			if len(h.idx) == 0 {
				return scenarioError("max", "the maximums leave seats that no unit with people can take")
			}
			u := h.top()
			last = prio{pr.pops[u], a[u]}
			a[u]++
			if a[u] < pr.max[u] {
				h.down(0)
			} else {
				h.pop()
			}
		}
		// The least held priority is the last seat given; the greatest
		// next priority is at the top of the heap.
		tied = len(h.idx) > 0 && m.cmpPrio(h.key(0), last) == 0
	case sum > pr.h:
		h := w.heap(a, true)
		var last prio
		for ; sum > pr.h; sum-- {
			if len(h.idx) == 0 {
				return scenarioError("min", "the minimums exceed the house size")
			}
			u := h.top()
			a[u]--
			last = prio{pr.pops[u], a[u]}
			if a[u] > pr.min[u] {
				h.down(0)
			} else {
				h.pop()
			}
		}
		// The greatest next priority is the last seat taken back; the
		// least held priority is at the top of the heap.
		tied = len(h.idx) > 0 && m.cmpPrio(h.key(0), last) == 0
	default:
		// Every held seat is at or above D and every next seat at or below
		// it; they can be equal only at D.
		if onD {
			lowest, lok := w.extreme(a, true)
			highest, hok := w.extreme(a, false)
			tied = lok && hok && m.cmpPrio(lowest, highest) == 0
		}
	}
	if tied {
		w.settle(a, r)
	}
	if sh.contest > 0 {
		w.contention(a, r)
	}
	return nil
}

// presolveMax is the most seats the floating-point presolve moves; beyond
// it the exact heap does the work.
const presolveMax = 24

// presolve writes into a the floating-point rounding of every unit at the
// divisor df (clamped to the bounds) and, when those seats miss the house
// size by at most presolveMax, moves seats in floating point until they add
// up, setting w.fdiv to a divisor between the last seat moved and the next
// one, as a multiple of df (0 when unchanged). These are estimates only:
// the exact rounding that follows decides every seat.
func (w *WarmAllotter) presolve(a []int, df float64) {
	pr, sh := &w.pr, w.sh
	x, g := w.xf, w.gf
	w.fdiv = 0
	sum := 0
	for i, p := range pr.pops {
		x[i] = 0
		if !pr.eligible[i] {
			a[i] = 0
			continue
		}
		lo, hi := pr.min[i], min(pr.max[i], pr.h)
		if p == 0 {
			a[i] = lo
			sum += lo
			continue
		}
		x[i] = float64(p) / df
		a[i] = max(min(sh.estimate(x[i], hi), hi), lo)
		sum += a[i]
	}
	d := pr.h - sum
	if d == 0 || d > presolveMax || d < -presolveMax {
		return
	}
	// g[i] is the value, in units of df, of the seat unit i would gain
	// (d > 0) or give back (d < 0) next; -1 when it has none.
	gain := d > 0
	val := func(i int) float64 {
		if x[i] == 0 {
			return -1
		}
		if gain {
			if a[i] >= pr.max[i] || a[i] >= pr.h {
				return -1
			}
			return x[i] * sh.rs(a[i])
		}
		if a[i] <= pr.min[i] {
			return -1
		}
		return x[i] * sh.rs(a[i]-1)
	}
	for i := range x {
		g[i] = val(i)
	}
	var last, next float64
	for k := 0; ; k++ {
		best, bv := -1, 0.0
		for i, v := range g {
			if v >= 0 && (best < 0 || (gain && v > bv) || (!gain && v < bv)) {
				best, bv = i, v
			}
		}
		if k == max(d, -d) {
			next = bv
			if best < 0 {
				next = -1
			}
			break
		}
		if best < 0 {
			return
		}
		last = bv
		if gain {
			a[best]++
		} else {
			a[best]--
		}
		g[best] = val(best)
	}
	switch {
	case math.IsInf(last, 1):
	case next < 0 || math.IsInf(next, 1):
		if gain {
			w.fdiv = last * 0.999
		} else {
			w.fdiv = last * 1.001
		}
	default:
		w.fdiv = (last + next) / 2
	}
}

// estimate rounds x at the method's signposts in floating point: the
// number of signposts s(0), s(1), ... below x, capped at hi.
func (sh *warmShared) estimate(x float64, hi int) int {
	if !(x < float64(hi)) {
		return hi
	}
	f := int(x)
	if uint(f) < uint(len(sh.sfT)) {
		if x > sh.sfT[f] {
			f++
		}
	} else if x > sh.sf(f) {
		f++
	}
	return f
}

// warmSignpostFloat is s(a) in floating point, with a relative error of at
// most three units in the last place.
func warmSignpostFloat(m Method, a int) float64 {
	f := float64(a)
	switch m {
	case Jefferson:
		return f + 1
	case Webster:
		return f + 0.5
	case Adams:
		return f
	case Dean:
		return 2 * f * (f + 1) / (2*f + 1)
	case HuntingtonHill:
		return math.Sqrt(f * (f + 1))
	case ModifiedSainteLague:
		if a == 0 {
			return 0.7
		}
		return f + 0.5
	}
	panic("engine: signpost of a method that has none")
}

// warmFloat is the priority value x in floating point (scaled units).
func warmFloat(m Method, x prio) float64 {
	s := m.signpost(x.a)
	if s.n == 0 {
		return math.Inf(1)
	}
	return float64(x.p) / warmSignpostFloat(m, x.a)
}

// extreme returns the least priority of a seat held beyond a minimum
// (held true) or the greatest priority of a next seat below a maximum
// (held false), exactly.
func (w *WarmAllotter) extreme(a []int, held bool) (prio, bool) {
	pr := &w.pr
	var best prio
	ok := false
	for i, p := range pr.pops {
		if !pr.eligible[i] || p == 0 {
			continue
		}
		if held {
			if a[i] > pr.min[i] {
				x := prio{p, a[i] - 1}
				if !ok || pr.m.cmpPrio(x, best) < 0 {
					best, ok = x, true
				}
			}
		} else if a[i] < pr.max[i] {
			x := prio{p, a[i]}
			if !ok || pr.m.cmpPrio(x, best) > 0 {
				best, ok = x, true
			}
		}
	}
	return best, ok
}

// settle handles a tie at the cut as the sequential procedure does: the
// seats at the cut value come off the units holding them and go to the
// winners the tie rule draws from all the units with a seat at that value,
// or stay unassigned.
func (w *WarmAllotter) settle(a []int, r *WarmResult) {
	pr := &w.pr
	v, _ := w.extreme(a, true)
	seats := 0
	for i, p := range pr.pops {
		if !pr.eligible[i] || p == 0 {
			continue
		}
		switch {
		case a[i] > pr.min[i] && pr.m.cmpPrio(prio{p, a[i] - 1}, v) == 0:
			r.Tied = append(r.Tied, i)
			a[i]--
			seats++
		case a[i] < pr.max[i] && pr.m.cmpPrio(prio{p, a[i]}, v) == 0:
			r.Tied = append(r.Tied, i)
		}
	}
	r.TieSeats = seats
	if pr.tie.Kind == TieReport {
		r.Unassigned = seats
		return
	}
	for _, u := range pr.tie.settle(r.Tied, seats) {
		a[u]++
	}
}

// heap builds a heap over the units that can gain a seat (held false: the
// greatest next priority on top) or give one back (held true: the least
// held priority beyond the minimum on top).
func (w *WarmAllotter) heap(a []int, held bool) *warmHeap {
	pr := &w.pr
	idx := w.idx[:0]
	for i, p := range pr.pops {
		if !pr.eligible[i] || p == 0 {
			continue
		}
		if (held && a[i] > pr.min[i]) || (!held && a[i] < pr.max[i]) {
			idx = append(idx, int32(i))
		}
	}
	h := &warmHeap{m: pr.m, pops: pr.pops, a: a, held: held, idx: idx}
	for i := len(idx)/2 - 1; i >= 0; i-- {
		h.down(i)
	}
	w.idx = idx
	return h
}

// warmHeap is a heap of units keyed by their next priority (held false,
// greatest first, equal values in input order) or by the priority of their
// last seat held (held true, least first, equal values in reverse input
// order): the orders in which the sequential procedure would hand out the
// next seats and in which it handed out the last ones, backwards.
type warmHeap struct {
	m    Method
	pops []uint64
	a    []int
	held bool
	idx  []int32
}

func (h *warmHeap) key(i int) prio {
	u := h.idx[i]
	if h.held {
		return prio{h.pops[u], h.a[u] - 1}
	}
	return prio{h.pops[u], h.a[u]}
}

func (h *warmHeap) before(i, j int) bool {
	c := h.m.cmpPrio(h.key(i), h.key(j))
	if h.held {
		c = -c
	}
	if c != 0 {
		return c > 0
	}
	if h.held {
		return h.idx[i] > h.idx[j]
	}
	return h.idx[i] < h.idx[j]
}

func (h *warmHeap) top() int { return int(h.idx[0]) }

func (h *warmHeap) down(i int) {
	n := len(h.idx)
	for {
		l := 2*i + 1
		if l >= n {
			return
		}
		best := l
		if r := l + 1; r < n && h.before(r, l) {
			best = r
		}
		if !h.before(best, i) {
			return
		}
		h.idx[i], h.idx[best] = h.idx[best], h.idx[i]
		i = best
	}
}

func (h *warmHeap) pop() {
	last := len(h.idx) - 1
	h.idx[0] = h.idx[last]
	h.idx = h.idx[:last]
	if last > 0 {
		h.down(0)
	}
}

// warmSeat is one seat of unit u: its (k+1)-th.
type warmSeat struct {
	u int
	k int
}

// contention fills r.Last and r.Next: the seats held with the least
// priorities and the next seats with the greatest, in the sequential
// procedure's order (equal values in input order).
//
// Every unit's own seats are ordered the same way, so the contest-many
// first seats on either side lie among the units whose first seat on that
// side is among the contest-many first; those are found in one pass and
// merged.
//
// The pass runs in floating point: it finds, on each side, the
// contest-th best first seat's approximate value t. A unit whose
// approximate value is worse than t by more than the relative slack is
// provably worse, exactly, than at least contest-many others, so it is set
// aside without an exact comparison; every other unit is ranked by exact
// comparisons only.
func (w *WarmAllotter) contention(a []int, r *WarmResult) {
	pr, sh := &w.pr, w.sh
	k := sh.contest
	pops, elig, mins, maxs, rsT := pr.pops, pr.eligible, pr.min, pr.max, sh.rsT
	gh, gn := w.xf[:len(pops)], w.gf[:len(pops)] // approximate held and next values, -1 for none
	th, tn := w.tf[:0], w.tn[:0]
	a = a[:len(pops)]
	for i, p := range pops {
		gh[i], gn[i] = -1, -1
		if !elig[i] || p == 0 {
			continue
		}
		pf := float64(p)
		if ai := a[i]; ai > mins[i] {
			var v float64
			if uint(ai-1) < uint(len(rsT)) {
				v = pf * rsT[ai-1]
			} else {
				v = pf * sh.rs(ai-1)
			}
			gh[i] = v
			if len(th) < k || v < th[k-1] {
				th = insertFloat(th, v, k, true)
			}
		}
		if ai := a[i]; ai < maxs[i] {
			var v float64
			if uint(ai) < uint(len(rsT)) {
				v = pf * rsT[ai]
			} else {
				v = pf * sh.rs(ai)
			}
			gn[i] = v
			if len(tn) < k || v > tn[k-1] {
				tn = insertFloat(tn, v, k, false)
			}
		}
	}
	w.tf, w.tn = th, tn
	r.Last = w.bestSeats(a, true, gh, th, r.Last)
	r.Next = w.bestSeats(a, false, gn, tn, r.Next)
}

// insertFloat inserts v into top, kept sorted (ascending when least is
// set, descending otherwise) and at most k long.
func insertFloat(top []float64, v float64, k int, least bool) []float64 {
	j := len(top)
	if j < k {
		top = append(top, v)
	} else {
		j--
	}
	for j > 0 && ((least && v < top[j-1]) || (!least && v > top[j-1])) {
		top[j] = top[j-1]
		j--
	}
	top[j] = v
	return top
}

// warmSlack bounds the relative error of the floating-point seat values
// that contention uses to set units aside: each value p·(1/s(k)) is computed
// with at most about eight rounding errors of 2^-53, far inside 2^-30.
const warmSlack = 1.0 / (1 << 30)

// bestSeats selects the contest-many seats that come first in the order:
// for held, the seats held beyond the minimums from the least priority up
// (ties: larger index first); otherwise the seats beyond the current ones
// from the greatest priority down (ties: smaller index first). g holds the
// units' approximate first values on that side (-1 for none) and top the
// best of them, as contention found them.
func (w *WarmAllotter) bestSeats(a []int, held bool, g, top []float64, out []int) []int {
	if len(top) == 0 {
		return out
	}
	pr := &w.pr
	m := pr.m
	k := w.sh.contest
	cut := top[len(top)-1]
	if held {
		cut *= 1 + warmSlack
	} else {
		cut *= 1 - warmSlack
	}
	sel := w.sel[:0]
	before := func(x, y warmSeat) bool {
		c := m.cmpPrio(prio{pr.pops[x.u], x.k}, prio{pr.pops[y.u], y.k})
		if held {
			if c != 0 {
				return c < 0
			}
			return x.u > y.u
		}
		if c != 0 {
			return c > 0
		}
		return x.u < y.u
	}
	insert := func(s warmSeat, limit int) {
		if len(sel) == limit && !before(s, sel[len(sel)-1]) {
			return
		}
		j := len(sel)
		if j < limit {
			sel = append(sel, s)
		} else {
			j--
		}
		for j > 0 && before(s, sel[j-1]) {
			sel[j] = sel[j-1]
			j--
		}
		sel[j] = s
	}
	for i, v := range g {
		if v < 0 || (held && v > cut) || (!held && v < cut) {
			continue
		}
		if held {
			insert(warmSeat{i, a[i] - 1}, k)
		} else {
			insert(warmSeat{i, a[i]}, k)
		}
	}
	for e := 0; e < k && len(sel) > 0; e++ {
		s := sel[0]
		out = append(out, s.u)
		copy(sel, sel[1:])
		sel = sel[:len(sel)-1]
		left := k - e - 1
		if len(sel) > left {
			sel = sel[:left]
		}
		if left == 0 {
			break
		}
		if held && s.k-1 >= pr.min[s.u] {
			insert(warmSeat{s.u, s.k - 1}, left)
		} else if !held && s.k+1 < pr.max[s.u] {
			insert(warmSeat{s.u, s.k + 1}, left)
		}
	}
	w.sel = sel
	return out
}

// remainder apportions by a largest-remainder method in full; the passes
// find their cut by selection, and only the remainders the contest lists
// name are ranked.
func (w *WarmAllotter) remainder(r *WarmResult) error {
	pr := &w.pr
	o, err := pr.remainderCut()
	if err != nil {
		return err
	}
	sum := 0
	for i, s := range o.seats {
		r.Seats[i] = s
		sum += s
	}
	r.Unassigned = pr.h - sum
	ties := o.early
	if o.tie != nil {
		ties = append(ties[:len(ties):len(ties)], *o.tie)
	}
	if len(ties) > 0 {
		in := make([]bool, pr.n())
		for _, t := range ties {
			r.TieSeats += t.Seats
			for _, u := range t.Units {
				in[u] = true
			}
		}
		for u, ok := range in {
			if ok {
				r.Tied = append(r.Tied, u)
			}
		}
	}
	if k := w.sh.contest; k > 0 && o.final != nil {
		f := o.final
		f.rankNear(k)
		for j := f.extra - 1; j >= 0 && j >= f.extra-k; j-- {
			r.Last = append(r.Last, f.units[f.ranked[j]])
		}
		for j := f.extra; j < len(f.ranked) && j < f.extra+k; j++ {
			r.Next = append(r.Next, f.units[f.ranked[j]])
		}
	}
	return nil
}
