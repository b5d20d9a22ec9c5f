package engine

// This file finds one unit's margins (see margin.go): the least change of
// its population, up or down, at which it holds more, or fewer, seats
// outright than it does.

// A marginWorker finds units' margins, one unit at a time, in a problem of
// its own: the scenario with its own copy of the populations (one changed
// at a time, in place) and of who takes part.
type marginWorker struct {
	pr    *problem // the scenario, read only
	q     problem  // the scenario with the worker's populations
	total u128     // of q.pops
	tab   *claimTable
	sc    divisorScratch
	out   divisorOutcome
	best  []seatRef
	sel   []seatRef
	units []int
	// Largest-remainder methods: the pass counted in, and two runs of the
	// procedure with their passes recorded (bounded.go).
	pass    claimPass
	group   []int8
	floor   []int
	tr      [3]lrTrace // lo's run, a probe's, and the least failing probe's
	trPop   [3]uint64  // unit i's population in each run
	trSeats [3]int     // and its seats, -1 for none
	rems    []u128
	roles   []int8 // remainder roles of a pass's units (bounded.go)
	bounded bool   // some unit has a bound: the passes can change
	// Without a threshold: the units taking part, always the same, and
	// their population.
	all      []int
	allTotal u128
}

func (pr *problem) newMarginWorker(tab *claimTable) *marginWorker {
	w := &marginWorker{pr: pr, q: *pr, tab: tab, total: sum128(pr.pops)}
	w.q.pops = append([]uint64(nil), pr.pops...)
	w.q.eligible = append([]bool(nil), pr.eligible...)
	w.q.tie = TieRule{} // outright seats: ties left open
	w.q.quotas = nil
	w.q.probe = true
	w.bounded = pr.anyBounds()
	if pr.m.IsLargestRemainder() && pr.threshold.IsZero() {
		for j, el := range pr.eligible {
			if el {
				w.all = append(w.all, j)
			}
		}
		w.allTotal = pr.eligibleTotal()
	}
	return w
}

// setPop sets unit i's population to p in the worker's problem, with the
// units taking part as the threshold then has them.
func (w *marginWorker) setPop(i int, p uint64) {
	w.total = w.total.sub(u128{0, w.q.pops[i]})
	w.total, _ = w.total.add64(p)
	w.q.pops[i] = p
	if th := w.pr.threshold; !th.IsZero() {
		for j, v := range w.q.pops {
			w.q.eligible[j] = !belowShare(v, w.total, th)
		}
	}
}

// gain returns the fewest extra people who would win unit i, which holds a
// seats, one more seat outright.
func (w *marginWorker) gain(i, a int) (uint64, bool) {
	pr := w.pr
	if a >= pr.max[i] || a >= pr.h {
		return 0, false // no unit holds more than every seat
	}
	defer w.setPop(i, pr.pops[i])
	return w.change(i, a, +1, min(MaxCoefficient-pr.pops[i], pr.gainLimitWith(i, w.total)))
}

// lose returns the fewest people whose loss would leave unit i, which
// holds a seats, no longer holding them all outright.
func (w *marginWorker) lose(i, a int) (uint64, bool) {
	pr := w.pr
	if a == 0 || (a <= pr.min[i] && pr.threshold.IsZero()) {
		return 0, false
	}
	defer w.setPop(i, pr.pops[i])
	return w.change(i, a, -1, pr.pops[i])
}

// popAt is unit i's population after a change x in direction dir.
func (w *marginWorker) popAt(i, dir int, x uint64) uint64 {
	if dir > 0 {
		return w.pr.pops[i] + x
	}
	return w.pr.pops[i] - x
}

// change returns the least change x in [1, limit] in direction dir (+1
// people added, -1 taken away) at which unit i holds more (dir > 0) or
// fewer (dir < 0) than a seats outright. The changes are taken in stretches
// over which the units taking part stay the same; the population zero, at
// the end of a loss, is a stretch of its own. Each stretch but the last
// ends at a change of the units taking part (nextBreak), and each unit
// crosses the threshold at most once as unit i's population moves one
// way: at most n+2 stretches.
func (w *marginWorker) change(i, a, dir int, limit uint64) (uint64, bool) {
	p := w.pr.pops[i]
	for x := uint64(1); x <= limit; {
		e := min(limit, w.nextBreak(i, dir, x)-1)
		if dir < 0 && x < p {
			e = min(e, p-1)
		}
		var got uint64
		var ok bool
		if w.pr.m.IsDivisor() {
			got, ok = w.divisorStretch(i, a, dir, x, e)
		} else {
			got, ok = w.remainderStretch(i, a, dir, x, e)
		}
		if ok {
			return got, true
		}
		x = e + 1
	}
	return 0, false
}

// nextBreak returns the least change x' > x at which the set of units
// taking part differs from that at x'-1, unit i moving in direction dir;
// ^uint64(0) when there is none. A unit takes part while p·10^k >= c·P
// for the threshold c/10^k, and with only unit i's population moving each
// unit crosses that line at most once.
func (w *marginWorker) nextBreak(i, dir int, x uint64) uint64 {
	pr := w.pr
	th := pr.threshold
	next := ^uint64(0)
	if th.IsZero() {
		return next
	}
	p := pr.pops[i]
	rest := w.total.sub(u128{0, w.q.pops[i]}) // the others' population
	unit := pow10(int(th.Places))
	c := th.Coef
	pp := u128{0, p}
	consider := func(b u128) {
		if b.hi == 0 && b.lo > x && b.lo < next {
			next = b.lo
		}
	}
	// Unit i takes part once p'·(10^k - c) >= c·rest.
	if c < unit {
		if cr, ok := rest.mulSmall(c); ok {
			u, r := cr.div64(unit - c)
			if r != 0 {
				u = u.plus(1) // the least population taking part
			}
			switch {
			case dir > 0 && u.cmp(pp) > 0:
				consider(u.sub(pp))
			case dir < 0 && u.cmp(pp) <= 0:
				consider(pp.sub(u).plus(1))
			}
		}
	}
	// Another unit j takes part while p' <= floor(p_j·10^k/c) - rest.
	for j, v := range pr.pops {
		if j == i {
			continue
		}
		vj, _ := mul128(v, unit).div64(c)
		if vj.cmp(rest) < 0 {
			continue // out at every population of unit i
		}
		vj = vj.sub(rest) // the greatest p' with j taking part
		switch {
		case dir > 0 && vj.cmp(pp) >= 0:
			consider(vj.sub(pp).plus(1))
		case dir < 0 && vj.cmp(pp) < 0:
			consider(pp.sub(vj))
		}
	}
	return next
}

// leastWhere returns the least x in [lo, hi] with ok(x), where ok is false
// up to some point and true from there on; hint is a guess of it. It
// gallops from the guess to a bracket, then bisects. False when ok(hi) is
// false.
func leastWhere(lo, hi, hint uint64, ok func(uint64) bool) (uint64, bool) {
	if lo > hi {
		return 0, false
	}
	hint = min(max(hint, lo), hi)
	var a, b uint64 // the answer is in [a, b], and ok(b)
	if ok(hint) {
		a, b = lo, hint
		for step := uint64(1); b > lo; step *= 2 {
			t := b - min(step, b-lo)
			if !ok(t) {
				a = t + 1
				break
			}
			b = t
			if t == lo {
				return lo, true
			}
		}
	} else {
		a = hint + 1
		found := false
		for step := uint64(1); a <= hi; step *= 2 {
			t := hint + min(step, hi-hint)
			if ok(t) {
				b, found = t, true
				break
			}
			if t == hi {
				break
			}
			a = t + 1
		}
		if !found {
			return 0, false
		}
	}
	for a < b {
		m := a + (b-a)/2
		if ok(m) {
			b = m
		} else {
			a = m + 1
		}
	}
	return b, true
}

// divisorStretch finds the change in [x, e] for a divisor method, over
// which the units taking part stay the same: an apportionment at x, then
// the closed form. A divisor method is population monotone, and while
// unit i holds its seats the others' seats do not depend on its
// population: unit i's (a+1)-th seat is won outright once its priority
// passes the claim of another unit it must overtake, and its a-th seat is
// lost once its priority falls to the claim that would overtake it.
func (w *marginWorker) divisorStretch(i, a, dir int, x, e uint64) (uint64, bool) {
	pr := w.pr
	p := pr.pops[i]
	w.setPop(i, w.popAt(i, dir, x))
	s, ok := w.divisorOutright(i)
	if !ok {
		return 0, false // no apportionment anywhere in the stretch
	}
	if (dir > 0 && s > a) || (dir < 0 && s < a) {
		return x, true
	}
	if x == e || w.q.pops[i] == 0 || !w.q.eligible[i] || (dir < 0 && a <= pr.min[i]) {
		// Nothing changes for unit i inside: its seats beyond x hold
		// (a seat within the minimum is held whatever the population).
		return 0, false
	}
	t := a // the seat index whose claim decides: a+1 to gain, a to keep
	if dir < 0 {
		t = a - 1
	}
	v, found, ok := w.rivalClaim(i, t)
	if !ok {
		// Too many claims to look past: bisect with apportionments.
		return leastWhere(x+1, e, x+1, func(y uint64) bool {
			w.setPop(i, w.popAt(i, dir, y))
			s, ok := w.divisorOutright(i)
			return ok && ((dir > 0 && s > a) || (dir < 0 && s < a))
		})
	}
	var y uint64
	if dir > 0 {
		if !found {
			return 0, false
		}
		need, ok := pr.m.overtake(v, a)
		if !ok || need <= p {
			return 0, false
		}
		y = need - p
	} else {
		if !found || pr.m.signpost(a-1).n == 0 {
			return 0, false
		}
		keep, ok := pr.m.overtakenBelow(v, a-1)
		if !ok || keep >= p {
			return 0, false
		}
		y = p - keep
	}
	if y <= x || y > e {
		return 0, false
	}
	return y, true
}

// divisorOutright apportions the worker's problem by the divisor procedure
// and returns unit i's outright seats; false when there is no
// apportionment. The result stays in w.out.
func (w *marginWorker) divisorOutright(i int) (int, bool) {
	if w.q.checkFeasible() != nil {
		return 0, false
	}
	if w.q.divisor(&w.out, divisorStart{}, &w.sc) != nil {
		return 0, false
	}
	return w.out.seats[i], true
}

// rivalClaim returns, from the apportionment in w.out, the claim that unit
// i's (t+1)-th seat must rank above to be held outright: with R the seats
// beyond the minimums left once unit i holds t+1, the (R+1)-th greatest
// claim of the other units (their seats beyond their minimums, below their
// maximums, greatest first). found is false when the others have fewer
// claims; ok is false when finding it would look past more than
// MaxWarmContest seats.
func (w *marginWorker) rivalClaim(i, t int) (v prio, found, ok bool) {
	q := &w.q
	full := w.out.full
	// The others hold their greatest claims in full; count from its cut.
	d := full[i] - t
	held := d <= 0
	k := d
	if held {
		k = 1 - d
	}
	if k > MaxWarmContest {
		return prio{}, false, false
	}
	q.eligible[i] = false
	w.best, w.sel = q.bestSeats(full, held, k, w.best[:0], w.sel)
	q.eligible[i] = true
	if len(w.best) < k {
		if held {
			// Fewer seats held than the house leaves them: unit i can
			// never hold its seat outright.
			return prio{}, true, true
		}
		return prio{}, false, true
	}
	s := w.best[k-1]
	return prio{q.pops[s.u], s.k}, true, true
}

// remainderStretch finds the change in [x, e] for a largest-remainder
// method, over which the units taking part stay the same. Without bounds
// the procedure is one pass over them, and unit i's seats come from
// counting claims: under Hamilton the count falls as unit i grows, under
// the Droop quota it does within each stretch where the quota stays, and
// from one stretch end to the next.
func (w *marginWorker) remainderStretch(i, a, dir int, x, e uint64) (uint64, bool) {
	pr := w.pr
	if w.bounded {
		return w.boundedStretch(i, a, dir, x, e)
	}
	w.setPop(i, w.popAt(i, dir, x))
	if w.q.pops[i] == 0 || !w.q.eligible[i] {
		// Unit i holds no seat all along: a loss, where the others can be
		// apportioned.
		if dir < 0 && w.q.checkFeasible() == nil {
			if _, err := w.q.remainderCut(); err == nil {
				return x, true
			}
		}
		return 0, false
	}
	c := w.plainPass(i)
	s, k := c.wish(a, dir)
	ok := func(y uint64) bool { return c.meets(w.popAt(i, dir, y), s, k, dir) }
	if pr.m == Hamilton && c.tab != nil {
		if y, found, decided := c.tab.hamiltonChange(c, s, k, dir, x, e); decided {
			return y, found
		}
	}
	hint := x
	if c.tab != nil {
		hint = max(x, c.tab.hint(c, s, k, dir))
	}
	if pr.m == Hamilton {
		return leastWhere(x, e, hint, ok)
	}
	return w.droopSearch(c, i, dir, x, e, hint, ok, func(lo, hi uint64) (uint64, bool) {
		if c.tab != nil {
			if y, found, decided := c.tab.droopChange(c, s, k, dir, lo, hi); decided {
				return y, found
			}
		}
		return leastWhere(lo, hi, hint, ok)
	})
}

// plainPass returns the claim pass over the units taking part in the
// worker's problem, counted from the claim table when they are the ones
// it was made for. Without a threshold they are always the scenario's.
func (w *marginWorker) plainPass(i int) *claimPass {
	pr := w.pr
	c := &w.pass
	*c = claimPass{m: pr.m, pops: w.q.pops, i: i, seats: pr.h, sc: pow10(pr.places), cands: c.cands}
	if pr.threshold.IsZero() && w.all != nil {
		c.units, c.tab = w.all, w.tab
		c.rest = w.allTotal.sub(u128{0, pr.pops[i]})
		return c
	}
	w.units = w.units[:0]
	same := w.tab != nil
	for j, el := range w.q.eligible {
		if el {
			w.units = append(w.units, j)
			if j != i {
				c.rest, _ = c.rest.add64(w.q.pops[j])
			}
		}
		same = same && el == w.tab.elig[j]
	}
	c.units = w.units
	if same {
		c.tab = w.tab
	}
	return c
}

// droopSearch finds the least change in [x, e] at which unit i's count
// meets ok under the Droop quota and the pass can be apportioned. The count
// meets ok from some point on within each stretch where the quota stays
// the same, and at the stretch ends from some stretch on: within finds the
// point inside a stretch. Whether the pass can be apportioned changes
// within a stretch only with unit i's whole part, so that it holds from
// some point on adding people, and up to some point taking them away.
func (w *marginWorker) droopSearch(c *claimPass, i, dir int, x, e, hint uint64, ok func(uint64) bool, within func(lo, hi uint64) (uint64, bool)) (uint64, bool) {
	feasible := func(y uint64) bool { return c.feasible(w.popAt(i, dir, y)) }
	width := (uint64(c.seats) + 1) * c.sc // the totals of one stretch
	t, _ := c.rest.add64(w.popAt(i, dir, x))
	_, r := t.div64(width)
	first := r // the changes left in x's stretch after x
	if dir > 0 {
		first = width - 1 - r
	}
	// The stretches in [x, e]: those that end inside it, j = 0..last, the
	// j-th at end(j), then the rest of the one that goes on past e. Only
	// the ends of stretches are in order.
	last := -1
	if first <= e-x {
		last = int((e - x - first) / width)
	}
	end := func(j int) uint64 { return x + first + uint64(j)*width }
	j := last + 1 // the first stretch whose end meets ok, if any
	if last >= 0 {
		j0 := uint64(0)
		if hint > x+first {
			j0 = min(uint64(last), (hint-x-first)/width)
		}
		if jj, found := leastWhere(0, uint64(last), j0, func(j uint64) bool { return ok(end(int(j))) }); found {
			j = int(jj)
		}
	}
	// The stretch found meets ok at its end, and so does every later one:
	// the loop goes past a stretch only where the pass cannot be
	// apportioned there, which needs a total of at most (H+1)^2 people
	// (feasible), at most H+1 stretches of H+1 people.
	for ; j <= last+1; j++ {
		lo, hi := x, e
		if j > 0 {
			lo = end(j-1) + 1
		}
		if j <= last {
			hi = end(j)
		}
		if lo > hi {
			break
		}
		y, found := within(lo, hi)
		if !found {
			continue
		}
		if feasible(y) {
			return y, true
		}
		if dir > 0 {
			if y, found := leastWhere(y, hi, y, feasible); found {
				return y, true
			}
		}
	}
	return 0, false
}
