package engine

import (
	"math/big"
	"runtime"
	"sync"
	"sync/atomic"
)

// This file computes margins: the fewest people a unit needs to gain one
// seat outright, or can lose before it drops one, all other units fixed.
//
// A unit's seats change with its population only at crossing points, where
// one of its claims (the priority value p/s(a) of its next or last seat
// under a divisor method, or the quota p/Q less a whole number of seats
// under a largest-remainder method) meets another unit's claim, or where
// the units taking part change. The margins are these crossing points,
// computed exactly, never searched for by apportioning again:
//
//   - Divisor methods are population monotone, and with all other units
//     fixed their claims do not move: unit i's (a+1)-th seat is won
//     outright exactly when p'/s(a) exceeds the claim of another unit that
//     it must overtake, so p' is the least whole number above that claim
//     times s(a); it stops holding its a-th seat outright as soon as
//     p''/s(a-1) falls to the claim that would overtake it (at equality the
//     two tie). Without a threshold (and without an unsettled tie) that
//     claim is the weakest seat another unit holds, or the best one it
//     lacks, for every unit at once. With a threshold the units taking part
//     change at known populations (nextBreak); between those points the
//     same closed form holds, from an apportionment at the start of each
//     stretch.
//   - Largest-remainder methods change every quota when one population
//     moves. Their margins come from counting claims (claims.go): unit i
//     holds s+1 seats outright exactly when fewer than H-s of the other
//     units' claims rank at or above its (s+1)-th, and the count is a step
//     function of its population whose steps are the crossing points. With
//     minimums or maximums the passes that fix units at a bound change with
//     the population too; bounded.go finds the stretches where they do not
//     and counts inside them.
//
// The units' margins are independent, and are computed in parallel on
// every processor Go may use (one, in WebAssembly). Each worker keeps one
// copy of the populations, changed in place for the unit it works on, and
// reuses its scratch: memory grows with the number of workers, not with
// the number of probes.

// marginChunk is how many units a margin worker takes at a time.
const marginChunk = 16

func (pr *problem) margins(o *outcome, res *Result) {
	if pr.m.IsDivisor() && pr.threshold.IsZero() && (o.tie == nil || pr.tie.Kind != TieReport) {
		pr.closedMargins(o.seats, res)
		return
	}
	var tab *claimTable
	if pr.m.IsLargestRemainder() && !pr.anyBounds() {
		tab = pr.newClaimTable()
	}
	n := pr.n()
	workers := min(runtime.GOMAXPROCS(0), (n+marginChunk-1)/marginChunk)
	var next atomic.Int64
	work := func() {
		w := pr.newMarginWorker(tab)
		for {
			lo := int(next.Add(marginChunk)) - marginChunk
			if lo >= n {
				return
			}
			for i := lo; i < min(lo+marginChunk, n); i++ {
				u := &res.Units[i]
				u.Gain = pr.marginDecimal(w.gain(i, o.seats[i]))
				u.Lose = pr.marginDecimal(w.lose(i, o.seats[i]))
			}
		}
	}
	if workers <= 1 {
		work()
		return
	}
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			work()
		}()
	}
	wg.Wait()
}

// CostlyMargins reports whether the margins of s cost more than the
// closed forms, whose time grows about as fast as the number of units: a
// largest-remainder method where some unit has a minimum or a maximum (the
// passes that fix units at their bounds change with the population and
// are proven stretch by stretch), or a threshold (the units taking part
// change at known populations, and each stretch between starts from an
// apportionment). Measured natively on one processor, two seats a unit:
// by Hamilton with minimum 1 and maximum 5, 0.03–0.07 s at 100 units,
// 0.23–0.27 s at 300; by the Droop quota with minimum 1, 0.3–0.7 s at 300;
// with a threshold about 10 ms at 300 units and 0.4 s at 2,000. Without
// them, Hamilton's margins for 20,000 units take 0.1 s.
func (s *Scenario) CostlyMargins() bool {
	if !s.Threshold.IsZero() {
		return true
	}
	return s.Method.IsLargestRemainder() && s.HasBounds()
}

// anyBounds reports whether some unit has a minimum or a maximum.
func (pr *problem) anyBounds() bool {
	for j := range pr.pops {
		if pr.min[j] > 0 || pr.max[j] != noCap {
			return true
		}
	}
	return false
}

// marginDecimal writes a margin in scaled units as a Decimal; nil when
// there is none.
func (pr *problem) marginDecimal(x uint64, ok bool) *Decimal {
	if !ok {
		return nil
	}
	d := Decimal{Coef: x, Places: uint8(pr.places)}.trim()
	return &d
}

// closedMargins fills the margins of a divisor method without a threshold
// from the weakest seats held and the best seats not held, for every unit
// at once.
func (pr *problem) closedMargins(seats []int, res *Result) {
	var held, open topTwo
	for j, p := range pr.pops {
		if p == 0 {
			continue
		}
		a := seats[j]
		if a > pr.min[j] {
			held.add(pr.m, j, prio{p, a - 1}, -1)
		}
		if a < pr.max[j] {
			open.add(pr.m, j, prio{p, a}, +1)
		}
	}
	for i := range res.Units {
		u := &res.Units[i]
		u.Gain = pr.marginDecimal(pr.gainClosed(i, seats[i], held))
		x, ok := pr.loseClosed(i, seats[i], open)
		if ok && x == pr.pops[i] && pr.checkFeasibleWith(i, 0) != nil {
			// The unit drops a seat only at no people, where the others'
			// bounds cannot all be met: there is no apportionment to
			// lose the seat in.
			ok = false
		}
		u.Lose = pr.marginDecimal(x, ok)
	}
}

// topTwo keeps the two most extreme priorities (least for dir -1, greatest
// for dir +1) and their units, so that the extreme excluding any one unit is
// at hand.
type topTwo struct {
	n int
	u [2]int
	v [2]prio
}

func (t *topTwo) add(m Method, u int, v prio, dir int) {
	better := func(x, y prio) bool { return m.cmpPrio(x, y)*dir > 0 }
	switch {
	case t.n == 0:
		t.u[0], t.v[0], t.n = u, v, 1
	case better(v, t.v[0]):
		t.u[1], t.v[1] = t.u[0], t.v[0]
		t.u[0], t.v[0] = u, v
		t.n = 2
	case t.n == 1 || better(v, t.v[1]):
		t.u[1], t.v[1], t.n = u, v, 2
	}
}

// except returns the extreme priority among units other than i.
func (t *topTwo) except(i int) (prio, bool) {
	if t.n > 0 && t.u[0] != i {
		return t.v[0], true
	}
	if t.n > 1 {
		return t.v[1], true
	}
	return prio{}, false
}

func (pr *problem) gainClosed(i, a int, held topTwo) (uint64, bool) {
	if a >= pr.max[i] {
		return 0, false
	}
	w, ok := held.except(i)
	if !ok {
		return 0, false
	}
	need, ok := pr.m.overtake(w, a)
	if !ok {
		return 0, false
	}
	return pr.marginUp(i, need)
}

// marginUp is the gain margin of unit i from the least population p that
// wins it the seat.
func (pr *problem) marginUp(i int, p uint64) (uint64, bool) {
	if p > MaxCoefficient {
		return 0, false
	}
	if p <= pr.pops[i] {
		return 1, true
	}
	if pr.pops[i] == 0 && !pr.feasibleWith(i, p) {
		return 0, false // with people it would need a seat the house lacks
	}
	return p - pr.pops[i], true
}

func (pr *problem) loseClosed(i, a int, open topTwo) (uint64, bool) {
	if a <= pr.min[i] || pr.pops[i] == 0 {
		return 0, false
	}
	best, ok := open.except(i)
	if !ok {
		return 0, false
	}
	if pr.m.signpost(a-1).n == 0 {
		// Only an empty unit loses its first seat, if the rest can still
		// be apportioned without it.
		if !pr.feasibleWith(i, 0) {
			return 0, false
		}
		return pr.pops[i], true
	}
	keep, ok := pr.m.overtakenBelow(best, a-1)
	if !ok {
		return 0, false
	}
	return pr.loseFrom(i, keep)
}

// loseFrom is the lose margin of unit i from the greatest population keep
// at which it no longer holds its last seat outright.
func (pr *problem) loseFrom(i int, keep uint64) (uint64, bool) {
	if keep >= pr.pops[i] {
		return 1, true
	}
	if keep == 0 && !pr.feasibleWith(i, 0) {
		return 0, false // emptied, the unit leaves seats no one can take
	}
	return pr.pops[i] - keep, true
}

// overtake returns the least population whose (a+1)-th seat has a
// priority above the claim w; false when none does (w is a first seat
// under a zero signpost, or the population would pass 2^64).
func (m Method) overtake(w prio, a int) (uint64, bool) {
	sw := m.signpost(w.a)
	if w.p > 0 && sw.n == 0 {
		return 0, false // an infinite claim is never beaten outright
	}
	s := m.signpost(a)
	if s.n == 0 {
		return 1, true // a first seat under a zero signpost: any people win it
	}
	if w.p == 0 {
		return 1, true
	}
	q, ok := scaledFloor(w.p, s, sw)
	if !ok || q == ^uint64(0) {
		return 0, false
	}
	return q + 1, true
}

// overtakenBelow returns the greatest population whose (a+1)-th seat
// (s(a) > 0) has a priority at or below the claim best, where it is
// overtaken or tied; false when that is beyond 2^64 (never, in practice).
func (m Method) overtakenBelow(best prio, a int) (uint64, bool) {
	sb := m.signpost(best.a)
	if best.p > 0 && sb.n == 0 {
		return 0, false // infinite: overtaken at any population
	}
	if best.p == 0 {
		return 0, true
	}
	k, ok := scaledFloor(best.p, m.signpost(a), sb)
	if !ok {
		return ^uint64(0), true // beyond every population
	}
	return k, true
}

// scaledFloor returns floor(p·s/w) for signposts s and w (both nonzero),
// the population at which a quotient over s equals p over w: in 128-bit
// arithmetic, or math/big where that does not fit. False when it does not
// fit in 64 bits.
func scaledFloor(p uint64, s, w signpost) (uint64, bool) {
	if q, ok := scaledFloor128(p, s, w); ok {
		return q, true
	}
	var q *big.Int
	if s.sq {
		x := new(big.Int).Mul(bigU(p), bigU(p))
		x.Mul(x, bigU(s.n))
		x.Quo(x, bigU(w.n))
		q = x.Sqrt(x)
	} else {
		num := new(big.Int).Mul(bigU(p), bigU(w.d))
		num.Mul(num, bigU(s.n))
		q = num.Quo(num, new(big.Int).Mul(bigU(s.d), bigU(w.n)))
	}
	return q.Uint64(), q.IsUint64()
}

// scaledFloor128 is scaledFloor in 128-bit arithmetic; false when that
// does not fit.
func scaledFloor128(p uint64, s, w signpost) (uint64, bool) {
	if forceBig {
		return 0, false
	}
	if s.sq {
		// floor(sqrt(floor(p²·s.n/w.n))) = floor(sqrt(p²·s.n/w.n)).
		x, ok := mul128(p, p).mulSmall(s.n)
		if !ok {
			return 0, false
		}
		q, _ := x.div64(w.n)
		if q.hi >= 1<<62 {
			return 0, false
		}
		return isqrt128(q), true
	}
	num, ok := mul128(p, w.d).mulSmall(s.n)
	dhi, den := mulWide(s.d, w.n)
	if !ok || dhi != 0 {
		return 0, false
	}
	q, _ := num.div64(den)
	if q.hi != 0 {
		return 0, false
	}
	return q.lo, true
}

// feasibleWith reports whether the problem can be apportioned with unit
// i's population set to p, the units taking part as they are.
func (pr *problem) feasibleWith(i int, p uint64) bool {
	return pr.checkFeasibleWith(i, p) == nil
}

// gainLimitWith bounds the useful gain of unit i: past it every other unit has
// dropped below the threshold (if there is one) and unit i takes every seat
// the bounds leave it, so more people change nothing. With rest the other
// units' population and s one person in scaled units, (2H+2)·(rest +
// (H+2)·s) people is enough for both quotas: the Hare quota gives unit i
// H-1 seats once p > (H-1)·rest and the last one once its remainder beats
// every other quota, p > (2H-1)·rest; the Droop quota gives it H seats
// once p >= H·(rest + (H+1)·s). Add rest/threshold for the threshold.
// total is the population of every unit.
func (pr *problem) gainLimitWith(i int, total u128) uint64 {
	rest := total.sub(u128{0, pr.pops[i]})
	h := uint64(pr.h)
	u, ok := u128{0, h + 2}.mulSmall(pow10(pr.places))
	if ok {
		u, ok = u.add(rest)
	}
	if ok {
		u, ok = u.mulSmall(2*h + 2)
	}
	if ok && !pr.threshold.IsZero() {
		t, tok := rest.mulSmall(pow10(int(pr.threshold.Places)))
		if tok {
			t, _ = t.div64(pr.threshold.Coef)
			u, ok = u.add(t)
		}
		ok = ok && tok
	}
	if ok {
		u, ok = u.add64(1)
	}
	if !ok || u.hi != 0 || u.lo > MaxCoefficient {
		return MaxCoefficient
	}
	return u.lo
}
