package engine

import "math/big"

// This file computes margins: the fewest people a unit needs to gain one
// seat outright, or can lose before it drops one, all other units fixed.
//
// Divisor methods without a threshold use a closed form. With all other
// units fixed, unit i's (a+1)-th seat is won outright exactly when its
// priority p'/s(a) exceeds the weakest seat another unit holds beyond its
// minimum, so p' is the least whole number above that value times s(a). It
// stops holding its a-th seat outright as soon as p''/s(a-1) falls to the
// best seat another unit does not hold (at equality the two tie).
//
// Largest-remainder methods (and any method with a threshold) change every
// quota when one population moves, so their margins come from an exact
// search over the unit's population: each probe is a complete exact
// apportionment. For Hamilton the seats of the moving unit never fall as it
// grows: its quota rises, every other quota falls, and its remainder rises
// against every other remainder between the points where its whole part
// steps up. For the Droop quota the same holds within each stretch of totals
// where the quota is constant, and the condition holds at the ends of those
// stretches monotonically, so the search runs over stretch ends first and
// then inside one stretch. Property tests check both against brute force.

func (pr *problem) margins(o *outcome, res *Result) {
	closed := pr.m.IsDivisor() && pr.threshold.IsZero() && (o.tie == nil || pr.tie.Kind != TieReport)
	var held, open topTwo
	if closed {
		for j, p := range pr.pops {
			if p == 0 {
				continue
			}
			a := o.seats[j]
			if a > pr.min[j] {
				held.add(pr.m, j, prio{p, a - 1}, -1)
			}
			if a < pr.max[j] {
				open.add(pr.m, j, prio{p, a}, +1)
			}
		}
	}
	for i := range res.Units {
		u := &res.Units[i]
		var gain, lose uint64
		var gok, lok bool
		if closed {
			gain, gok = pr.gainClosed(i, o.seats[i], held)
			lose, lok = pr.loseClosed(i, o.seats[i], open)
		} else {
			gain, gok = pr.gainSearch(i, o.seats[i])
			lose, lok = pr.loseSearch(i, o.seats[i])
		}
		if gok {
			d := Decimal{Coef: gain, Places: uint8(pr.places)}.trim()
			u.Gain = &d
		}
		if lok {
			d := Decimal{Coef: lose, Places: uint8(pr.places)}.trim()
			u.Lose = &d
		}
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
	sw := pr.m.signpost(w.a)
	if sw.n == 0 {
		return 0, false // the weakest seat held by another is a first seat: never beaten outright
	}
	s := pr.m.signpost(a)
	if s.n != 0 {
		if q, ok := scaledFloor(w.p, s, sw); ok {
			return pr.marginUp64(i, q+1)
		}
	}
	var need *big.Int // the least population that wins the seat
	if s.n == 0 {
		need = bigU(pr.pops[i] + 1)
	} else if s.sq {
		x := new(big.Int).Mul(bigU(w.p), bigU(w.p))
		x.Mul(x, bigU(s.n))
		x.Quo(x, bigU(sw.n))
		need = x.Sqrt(x)
		need.Add(need, big.NewInt(1))
	} else {
		num := new(big.Int).Mul(bigU(w.p), bigU(sw.d))
		num.Mul(num, bigU(s.n))
		den := new(big.Int).Mul(bigU(s.d), bigU(sw.n))
		need = num.Quo(num, den)
		need.Add(need, big.NewInt(1))
	}
	return pr.marginUp(i, need)
}

func (pr *problem) marginUp(i int, need *big.Int) (uint64, bool) {
	if !need.IsUint64() {
		return 0, false
	}
	return pr.marginUp64(i, need.Uint64())
}

// marginUp64 is the gain margin of unit i from the least population p that
// wins it the seat.
func (pr *problem) marginUp64(i int, p uint64) (uint64, bool) {
	if p > MaxCoefficient {
		return 0, false
	}
	if p <= pr.pops[i] {
		return 1, true
	}
	if pr.pops[i] == 0 && pr.withPop(i, p) == nil {
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
	sb := pr.m.signpost(best.a)
	if sb.n == 0 {
		return 0, false
	}
	t := pr.m.signpost(a - 1)
	if t.n == 0 {
		// Only an empty unit loses its first seat, if the rest can still
		// be apportioned without it.
		if pr.withPop(i, 0) == nil {
			return 0, false
		}
		return pr.pops[i], true
	}
	// The greatest population at which the a-th seat is no longer held
	// outright: p''/s(a-1) <= best, a tie at equality.
	if k, ok := scaledFloor(best.p, t, sb); ok {
		return pr.loseFrom(i, k)
	}
	var keep *big.Int
	if t.sq {
		x := new(big.Int).Mul(bigU(best.p), bigU(best.p))
		x.Mul(x, bigU(t.n))
		x.Quo(x, bigU(sb.n))
		keep = x.Sqrt(x)
	} else {
		num := new(big.Int).Mul(bigU(best.p), bigU(sb.d))
		num.Mul(num, bigU(t.n))
		den := new(big.Int).Mul(bigU(t.d), bigU(sb.n))
		keep = num.Quo(num, den)
	}
	if !keep.IsUint64() {
		return 1, true
	}
	return pr.loseFrom(i, keep.Uint64())
}

// loseFrom is the lose margin of unit i from the greatest population keep
// at which it no longer holds its last seat outright.
func (pr *problem) loseFrom(i int, keep uint64) (uint64, bool) {
	if keep >= pr.pops[i] {
		return 1, true
	}
	if keep == 0 && pr.withPop(i, 0) == nil {
		return 0, false // emptied, the unit leaves seats no one can take
	}
	return pr.pops[i] - keep, true
}

// scaledFloor returns floor(p·s/w) for signposts s and w (both nonzero),
// the population at which a quotient over s equals p over w, in 128-bit
// arithmetic; false when that does not fit, for the math/big path.
func scaledFloor(p uint64, s, w signpost) (uint64, bool) {
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

// withPop returns a copy of the problem with unit i's population set to p,
// ties left open and eligibility recomputed, or nil if that is infeasible.
func (pr *problem) withPop(i int, p uint64) *problem {
	q := *pr
	q.pops = append([]uint64(nil), pr.pops...)
	q.pops[i] = p
	q.tie = TieRule{}
	if !pr.threshold.IsZero() {
		q.eligible = make([]bool, len(q.pops))
		total := sum128(q.pops)
		for j, v := range q.pops {
			q.eligible[j] = !belowShare(v, total, pr.threshold)
		}
	}
	if q.checkFeasible() != nil {
		return nil
	}
	return &q
}

// outrightAt returns unit i's outright seats with population p, or -1 when
// no apportionment exists.
func (pr *problem) outrightAt(i int, p uint64) int {
	q := pr.withPop(i, p)
	if q == nil {
		return -1
	}
	o, err := q.run(false)
	if err != nil {
		return -1
	}
	return o.seats[i]
}

// The searches below find the least change x in [1, limit] (people added
// for a gain, taken away for a loss) at which unit i holds more, or fewer,
// seats outright. The range of x is cut into pieces on which the outcome is
// monotone in x, and each piece is searched by bisection:
//
//   - A threshold changes who takes part at known points: unit j drops out
//     once p_j/P falls below the threshold and unit i joins once its own
//     share reaches it. These points cut x into segments with a fixed set
//     of eligible units. A population of zero (the end of a loss) is a
//     segment of its own, since under Adams, Dean and Huntington–Hill it
//     changes which house sizes are feasible.
//   - Within a segment a divisor method is population monotone, and so is
//     Hamilton: a growing unit's quota rises and every other quota falls.
//   - The Droop quota floor(P/(H+1))+1 steps up with the total, and a step
//     can cost the growing unit a seat, so each pass that contains unit i
//     also cuts the segment where its quota steps. With the quota of every
//     pass fixed, the unit's seats rise with its population.
//
// Within a piece the changes with an apportionment form an interval, so the
// search finds its end first.
//
// With bounds, a largest-remainder pass fixes units at their bounds and
// apportions the rest again, and which units it fixes changes with the
// population: the outcome is not monotone between those points, which the
// pieces above do not locate. For these the first scanFirst changes are
// visited one by one, so a margin of up to scanFirst people (or units of
// the last decimal place) is exact; a larger one is found by the piecewise
// search, which assumes the pass structure does not change inside a piece.

// eligibilityBreaks returns the changes x in [1, limit] at which the set of
// eligible units, or the populated state of unit i, differs from that at
// x-1, in increasing order.
func (pr *problem) eligibilityBreaks(i int, dir int, limit uint64) []uint64 {
	p := pr.pops[i]
	var out []uint64
	add := func(x *big.Int) {
		if x.Sign() > 0 && x.IsUint64() && x.Uint64() <= limit {
			out = append(out, x.Uint64())
		}
	}
	if dir < 0 && p <= limit {
		add(bigU(p)) // the population reaches zero
	}
	if !pr.threshold.IsZero() {
		var rest big.Int // the population of the other units
		for j, v := range pr.pops {
			if j != i {
				rest.Add(&rest, bigU(v))
			}
		}
		c := bigU(pr.threshold.Coef)
		unit := bigU(pow10(int(pr.threshold.Places)))
		pb := bigU(p)
		for j, v := range pr.pops {
			if j == i {
				// i takes part once p'·10^k >= c·(rest + p'), that is
				// p' >= c·rest / (10^k - c).
				d := new(big.Int).Sub(unit, c)
				if d.Sign() <= 0 {
					continue
				}
				u := new(big.Int).Mul(c, &rest)
				u.Add(u, new(big.Int).Sub(d, big.NewInt(1)))
				u.Quo(u, d) // the least p' at which i takes part
				if dir > 0 {
					add(new(big.Int).Sub(u, pb))
				} else {
					add(new(big.Int).Add(new(big.Int).Sub(pb, u), big.NewInt(1)))
				}
				continue
			}
			// j takes part while p' <= floor(p_j·10^k / c) - rest.
			vj := new(big.Int).Mul(bigU(v), unit)
			vj.Quo(vj, c)
			vj.Sub(vj, &rest)
			if dir > 0 {
				add(new(big.Int).Add(new(big.Int).Sub(vj, pb), big.NewInt(1)))
			} else {
				add(new(big.Int).Sub(pb, vj))
			}
		}
	}
	sortUint64s(out)
	return out
}

// pieceEnd returns the last change x' >= x, in the direction dir, at which
// the Droop quota of every pass containing unit i stays what it is at x;
// for the other methods it returns limit.
func (pr *problem) pieceEnd(i int, x uint64, dir int, limit uint64) uint64 {
	if pr.m != Droop {
		return limit
	}
	p := pr.pops[i] + x
	if dir < 0 {
		p = pr.pops[i] - x
	}
	q := pr.withPop(i, p)
	var passes []*lrRound
	if q != nil && !pr.hasBounds() {
		// One pass over the eligible units.
		passes = []*lrRound{{seats: pr.h, units: []int{i}, total: q.eligibleTotal()}}
	} else if q != nil {
		if o, err := q.remainderCut(); err == nil {
			passes = o.passes
		}
	}
	if passes == nil {
		// No apportionment at x: use the first pass's quota over the
		// eligible units.
		if q == nil {
			q = pr.withPopAnyway(i, p)
		}
		r := &lrRound{seats: pr.h, units: []int{i}}
		r.total = q.eligibleTotal()
		passes = []*lrRound{r}
	}
	end := limit
	w0 := bigU(pow10(pr.places))
	for _, r := range passes {
		if !containsInt(r.units, i) || r.seats == 0 {
			continue
		}
		w := new(big.Int).Mul(w0, big.NewInt(int64(r.seats)+1))
		t := r.total.big()
		k := new(big.Int).Quo(t, w)
		var room *big.Int // further change with the same quota
		if dir > 0 {
			room = k.Add(k, big.NewInt(1)).Mul(k, w)
			room.Sub(room, big.NewInt(1))
			room.Sub(room, t)
		} else {
			room = new(big.Int).Sub(t, k.Mul(k, w))
		}
		e := new(big.Int).Add(room, bigU(x))
		if e.IsUint64() && e.Uint64() < end {
			end = e.Uint64()
		}
	}
	return end
}

// withPopAnyway is withPop without the feasibility check.
func (pr *problem) withPopAnyway(i int, p uint64) *problem {
	q := *pr
	q.pops = append([]uint64(nil), pr.pops...)
	q.pops[i] = p
	q.eligible = append([]bool(nil), pr.eligible...)
	if !pr.threshold.IsZero() {
		total := sum128(q.pops)
		for j, v := range q.pops {
			q.eligible[j] = !belowShare(v, total, pr.threshold)
		}
	}
	return &q
}

func containsInt(s []int, v int) bool {
	for _, u := range s {
		if u == v {
			return true
		}
	}
	return false
}

func sortUint64s(s []uint64) {
	for k := 1; k < len(s); k++ {
		for j := k; j > 0 && s[j] < s[j-1]; j-- {
			s[j], s[j-1] = s[j-1], s[j]
		}
	}
}

// searchChange returns the least x in [1, limit] at which seats(x) meets
// want. seats returns -1 where no apportionment exists.
func (pr *problem) searchChange(i int, dir int, limit uint64, seats func(uint64) int, want func(int) bool) (uint64, bool) {
	if limit == 0 {
		return 0, false
	}
	from := uint64(1)
	if pr.m.IsLargestRemainder() && pr.hasBounds() {
		// With bounds, which units a largest-remainder pass fixes at a
		// bound changes with the population, and with it every later
		// pass: the outcome need not be monotone between those points.
		// Visit the first changes one by one.
		for ; from <= min(limit, scanFirst); from++ {
			if s := seats(from); s >= 0 && want(s) {
				return from, true
			}
		}
		if from > limit {
			return 0, false
		}
	}
	breaks := pr.eligibilityBreaks(i, dir, limit)
	starts := append([]uint64{1}, breaks...)
	for k, s := range starts {
		if k > 0 && s == starts[k-1] {
			continue
		}
		e := limit
		for _, b := range breaks {
			if b > s {
				e = b - 1
				break
			}
		}
		if e < from {
			continue
		}
		pieces := 0
		for x := max(s, from); x <= e; {
			end := min(pr.pieceEnd(i, x, dir, e), e)
			if pieces++; pieces > maxPieces {
				// Very many quota steps: bisect over the ends of the
				// pieces instead of visiting each (see below).
				if got, ok := pr.searchPieceEnds(i, x, e, dir, seats, want); ok {
					return got, true
				}
				break // nothing in this segment: try the next

			}
			if got, ok := pr.searchSegments(i, x, end, dir, seats, want); ok {
				return got, true
			}
			if end == e {
				break
			}
			x = end + 1
		}
	}
	return 0, false
}

// scanFirst is how many changes are visited one by one for a
// largest-remainder method with bounds.
const scanFirst = 4096

// hasBounds reports whether any eligible unit has a minimum or a maximum.
func (pr *problem) hasBounds() bool {
	for j := range pr.pops {
		if pr.eligible[j] && (pr.min[j] > 0 || pr.max[j] != noCap) {
			return true
		}
	}
	return false
}

// maxPieces bounds the Droop quota steps visited one by one in a segment.
// A margin that needs more steps (a unit tens of thousands of quota steps
// from its next seat, which for the Droop quota means a change of more
// than maxPieces·(H+1) people) is found by bisection over the ends of the
// pieces, which assumes that the outcome at those ends rises with the
// change, as it does when the quota's steps are small against the
// populations.
const maxPieces = 256

// searchPieceEnds bisects over the piece ends in [x, e] for the first one
// that meets want, then searches inside that piece.
func (pr *problem) searchPieceEnds(i int, x, e uint64, dir int, seats func(uint64) int, want func(int) bool) (uint64, bool) {
	ok := func(y uint64) bool { s := seats(y); return s >= 0 && want(s) }
	end := func(y uint64) uint64 { return min(pr.pieceEnd(i, y, dir, e), e) }
	if !ok(e) {
		return 0, false
	}
	lo, hi := x, e // the piece holding lo fails at its end; e succeeds
	if ok(end(lo)) {
		return pr.searchSegments(i, lo, end(lo), dir, seats, want)
	}
	for hi-lo > 1 {
		mid := lo + (hi-lo)/2
		if ok(end(mid)) {
			hi = mid
		} else {
			lo = mid
		}
	}
	// hi's piece succeeds at its end and lo's does not: hi starts it.
	return pr.searchSegments(i, hi, end(hi), dir, seats, want)
}

// searchPiece searches [lo, hi], where the outcome is monotone and the
// feasible changes form an interval.
func (pr *problem) searchPiece(lo, hi uint64, dir int, seats0 func(uint64) int, want func(int) bool) (uint64, bool) {
	var lastX uint64
	lastS, have := 0, false
	seats := func(x uint64) int { // remembers the last probe
		if !have || x != lastX {
			lastX, lastS, have = x, seats0(x), true
		}
		return lastS
	}
	feasible := func(x uint64) bool { return seats(x) >= 0 }
	if !feasible(hi) {
		// The feasible changes form a prefix: find its end. (A loss can
		// run into infeasible house sizes; with bounds, a largest-
		// remainder pass can fix more seats at the bounds than the house
		// holds once one unit is very large.)
		if !feasible(lo) {
			return 0, false
		}
		a, b := lo, hi // feasible(a), !feasible(b)
		for b-a > 1 {
			m := a + (b-a)/2
			if feasible(m) {
				a = m
			} else {
				b = m
			}
		}
		hi = a
	}
	ok := func(x uint64) bool { s := seats(x); return s >= 0 && want(s) }
	if !ok(hi) {
		return 0, false
	}
	if ok(lo) {
		return lo, true
	}
	a, b := lo, hi // !ok(a), ok(b)
	for b-a > 1 {
		m := a + (b-a)/2
		if ok(m) {
			b = m
		} else {
			a = m
		}
	}
	return b, true
}

func (pr *problem) gainSearch(i, a int) (uint64, bool) {
	if a >= pr.max[i] {
		return 0, false
	}
	p := pr.pops[i]
	return pr.searchChange(i, +1, min(MaxCoefficient-p, pr.gainLimit(i)),
		func(x uint64) int { return pr.outrightAt(i, p+x) },
		func(s int) bool { return s > a })
}

// gainLimit bounds the useful gain of unit i: past it every other unit has
// dropped below the threshold (if there is one) and unit i takes every seat
// the bounds leave it, so more people change nothing. With rest the other
// units' population and s one person in scaled units, (2H+2)·(rest +
// (H+2)·s) people is enough for both quotas: the Hare quota gives unit i
// H-1 seats once p > (H-1)·rest and the last one once its remainder beats
// every other quota, p > (2H-1)·rest; the Droop quota gives it H seats
// once p >= H·(rest + (H+1)·s). Add rest/threshold for the threshold.
func (pr *problem) gainLimit(i int) uint64 {
	var rest big.Int
	for j, v := range pr.pops {
		if j != i {
			rest.Add(&rest, bigU(v))
		}
	}
	s := bigU(pow10(pr.places))
	h := big.NewInt(int64(pr.h))
	u := new(big.Int).Mul(new(big.Int).Add(h, big.NewInt(2)), s)
	u.Add(u, &rest)
	u.Mul(u, new(big.Int).Add(new(big.Int).Lsh(h, 1), big.NewInt(2)))
	if !pr.threshold.IsZero() {
		t := new(big.Int).Mul(&rest, bigU(pow10(int(pr.threshold.Places))))
		t.Quo(t, bigU(pr.threshold.Coef))
		u.Add(u, t)
	}
	u.Add(u, big.NewInt(1))
	if !u.IsUint64() || u.Uint64() > MaxCoefficient {
		return MaxCoefficient
	}
	return u.Uint64()
}

func (pr *problem) loseSearch(i, a int) (uint64, bool) {
	if a == 0 || (a <= pr.min[i] && pr.threshold.IsZero()) {
		return 0, false
	}
	p := pr.pops[i]
	return pr.searchChange(i, -1, p,
		func(x uint64) int { return pr.outrightAt(i, p-x) },
		func(s int) bool { return s < a })
}

// searchSegments searches [lo, hi] for the least change that meets want.
// With bounds, a largest-remainder result depends on which units the
// passes fix at a bound, and that changes with the population: as unit i
// grows every other quota falls, so another unit can only come to be held
// up by its minimum, or cease to be held down by its maximum, and unit i
// only the reverse. Each unit's pinned state thus changes at most once in
// one direction, and the changes with the same pinned states as lo form a
// prefix of [lo, hi]. Inside such a segment the last pass is Hamilton (or
// Droop) over a fixed set of units with a fixed number of seats, where the
// outcome is monotone. So the range is cut at the ends of those segments,
// each found by bisection, and each segment is searched in turn.
func (pr *problem) searchSegments(i int, lo, hi uint64, dir int, seats func(uint64) int, want func(int) bool) (uint64, bool) {
	if !pr.m.IsLargestRemainder() || !pr.hasBounds() {
		return pr.searchPiece(lo, hi, dir, seats, want)
	}
	pop := func(x uint64) uint64 {
		if dir > 0 {
			return pr.pops[i] + x
		}
		return pr.pops[i] - x
	}
	for lo <= hi {
		sig := pr.pinnedAt(i, pop(lo))
		same := func(x uint64) bool { return equalInts(pr.pinnedAt(i, pop(x)), sig) }
		end := hi
		if !same(hi) {
			a, b := lo, hi // same(a), !same(b)
			for b-a > 1 {
				m := a + (b-a)/2
				if same(m) {
					a = m
				} else {
					b = m
				}
			}
			end = a
		}
		if got, ok := pr.searchPiece(lo, end, dir, seats, want); ok {
			return got, true
		}
		if end == hi {
			break
		}
		lo = end + 1
	}
	return 0, false
}

// pinnedAt returns which units the largest-remainder passes fix at a bound
// when unit i has population p (nil when nothing can be apportioned).
func (pr *problem) pinnedAt(i int, p uint64) []int {
	q := pr.withPop(i, p)
	if q == nil {
		return nil
	}
	o, err := q.remainderCut()
	if err != nil {
		return nil
	}
	if o.pinned == nil {
		return make([]int, q.n()) // none fixed
	}
	return o.pinned
}

func equalInts(a, b []int) bool {
	if (a == nil) != (b == nil) || len(a) != len(b) {
		return false
	}
	for k := range a {
		if a[k] != b[k] {
			return false
		}
	}
	return true
}
