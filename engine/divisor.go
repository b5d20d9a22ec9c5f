package engine

// This file holds the divisor procedure: the one way a divisor method's
// seats are found, for Allot with or without the seat order, the warm
// start of projections (warm.go) and sweeps (sweep.go).
//
// A divisor method gives every unit the number of signposts s(0), s(1), ...
// below p/D, clamped to its bounds, for a divisor D at which the seats add
// up to the house size. The procedure finds them in three steps:
//
//  1. Start from a consistent result: one in which every seat a unit holds
//     beyond its minimum has a priority value p/s(a) at least that of every
//     seat a unit below its maximum could take next. The fast form starts
//     from a divisor estimate (the caller's, or the standard divisor, the
//     total population over the house size), moves it in floating point
//     until the roundings add up (estimate.go), fixes an exact divisor D
//     there and rounds every unit at D exactly (cut.go): a result at a
//     divisor is consistent. The sequential form starts every unit at its
//     minimum, where no seat is held beyond a minimum.
//  2. Step to the house size, one seat at a time with a heap of exact
//     priorities: while seats are missing, give the next one to the
//     greatest next priority; while there are too many, take back the least
//     held one. Both steps keep the result consistent, and a consistent
//     result of the right size is the divisor method's result, up to the
//     seats at a tie. From the minimums the steps are the seats in order:
//     the seat order of the explanation, and every house size of a sweep.
//  3. Settle a tie: when the least held priority equals the greatest next
//     priority, the seats at that value go to the tied units in input
//     order, as the sequential form hands them out, and the scenario's tie
//     rule settles them (or they stay unassigned).
//
// Every comparison that decides a seat is exact; floating point only
// chooses where to start.

// award is one seat handed out by priority: unit u took its (pr.a+1)-th seat
// with priority value p/s(pr.a).
type award struct {
	u  int
	pr prio
}

// divisorOutcome is the raw result of the divisor procedure.
type divisorOutcome struct {
	seats []int   // seats after the tie rule (or outright, if none)
	full  []int   // seats as the procedure handed them out, tie included
	order []award // seats awarded beyond the minimums, in order (when kept)
	free  int     // seats awarded by priority: H minus the minimums
	tie   *Tie
	tail  []award // the awarded seats at the cut value, when tied
}

// A divisorStart says where the divisor procedure starts.
type divisorStart struct {
	// d is a divisor estimate in scaled units (people per seat) for a
	// population taking part of at (zero: the population taking part
	// now); the procedure scales it to the population taking part. Zero
	// takes the standard divisor.
	d, at float64
	// sequential starts every unit at its minimum instead: the sequential
	// form, which hands out every seat in order; order records them.
	sequential, order bool
}

// divisorScratch lends the divisor procedure its slices, for a caller that
// runs it many times (the warm start). a holds the seats.
type divisorScratch struct {
	a          []int
	idx        []int32
	next, held []nearSeat
}

// divisorSeats runs the divisor procedure from the standard divisor, or,
// with keepOrder, in its sequential form recording every seat in order.
func (pr *problem) divisorSeats(keepOrder bool) (*divisorOutcome, error) {
	out := new(divisorOutcome)
	if err := pr.divisor(out, divisorStart{sequential: keepOrder, order: keepOrder}, nil); err != nil {
		return nil, err
	}
	return out, nil
}

// divisor runs the divisor procedure from st into out, with the slices of
// sc when it is not nil (out's seats may then be sc.a).
func (pr *problem) divisor(out *divisorOutcome, st divisorStart, sc *divisorScratch) error {
	if sc == nil {
		sc = new(divisorScratch)
	}
	n := pr.n()
	if cap(sc.a) < n {
		sc.a = make([]int, n)
	}
	a := sc.a[:n]
	given := 0
	plain := true // every unit takes part, with no minimum and no maximum
	var total float64
	for i, p := range pr.pops {
		if !pr.eligible[i] {
			a[i] = 0
			plain = false
			continue
		}
		lo := pr.min[i]
		a[i] = lo
		given += lo
		if lo != 0 || pr.max[i] != noCap {
			plain = false
		}
		total += float64(p)
	}
	free := pr.h - given
	*out = divisorOutcome{free: free, seats: a, full: a}
	if free < 0 {
		return errMinimums()
	}
	if free == 0 {
		return nil
	}
	if !pr.roomFor(a, free) {
		return errMaximums()
	}
	sum, onCut := given, false
	if st.sequential {
		if st.order {
			out.order = make([]award, 0, free)
		}
	} else {
		j := divisorRun{pr: pr, a: a, plain: plain, total: total, next: sc.next, held: sc.held, idx: sc.idx}
		d := st.d
		if st.at > 0 {
			d *= total / st.at
		}
		if !(d > 0) {
			d = total / float64(pr.h)
		}
		c := newCut(pr, j.estimate(d, st.d > 0))
		var onHeld, onNext bool
		sum, onHeld, onNext = j.round(&c)
		// Every held seat is at or above D and every next seat at or below
		// it: they can be equal only at D.
		onCut = onHeld && onNext
		sc.next, sc.held, sc.idx = j.next, j.held, j.idx
	}
	tied := onCut
	if sum != pr.h {
		var order *[]award
		if st.order {
			order = &out.order
		}
		var err error
		if tied, err = pr.stepTo(a, sum, order, sc); err != nil {
			return err
		}
	}
	if tied {
		pr.settleCut(out)
	}
	return nil
}

// roomFor reports whether the units with people can take the free seats
// beyond the seats a gives them.
func (pr *problem) roomFor(a []int, free int) bool {
	room := 0
	for i, p := range pr.pops {
		if pr.eligible[i] && p > 0 && a[i] < pr.max[i] {
			room += min(pr.max[i]-a[i], free)
			if room >= free {
				return true
			}
		}
	}
	return false
}

func errMinimums() error { return scenarioError("min", "the minimums exceed the house size") }

func errMaximums() error {
	return scenarioError("max", "the maximums leave seats that no unit with people can take")
}

// stepTo steps the consistent seats a, which add up to sum, to the house
// size, recording every seat given in order when order is not nil, and
// reports whether the result ends in a tie.
func (pr *problem) stepTo(a []int, sum int, order *[]award, sc *divisorScratch) (bool, error) {
	s := pr.newStepper(a, sum > pr.h, sc.idx)
	for ; sum < pr.h; sum++ {
		u, ok := s.step()
		if !ok {
			return false, errMaximums()
		}
		if order != nil {
			*order = append(*order, award{u, s.last})
		}
	}
	for ; sum > pr.h; sum-- {
		if _, ok := s.step(); !ok {
			return false, errMinimums()
		}
	}
	sc.idx = s.h.idx
	return s.tied(), nil
}

// A stepper moves the seats of a consistent result one at a time, keeping
// it consistent: it either gives, each seat to the greatest next priority,
// or takes, each time the least held priority beyond a minimum.
type stepper struct {
	pr   *problem
	h    seatHeap
	last prio // the seat given or taken last
}

// newStepper builds a stepper over the seats a that takes (held) or gives,
// with its heap in the scratch idx.
func (pr *problem) newStepper(a []int, held bool, idx []int32) stepper {
	idx = idx[:0]
	for i, p := range pr.pops {
		if !pr.eligible[i] || p == 0 {
			continue
		}
		if (held && a[i] > pr.min[i]) || (!held && a[i] < pr.max[i]) {
			idx = append(idx, int32(i))
		}
	}
	s := stepper{pr: pr, h: seatHeap{m: pr.m, pops: pr.pops, a: a, held: held, idx: idx}}
	s.h.init()
	return s
}

// step moves one seat and returns its unit: a stepper that gives hands
// the next seat to the unit with the greatest next priority, one that
// takes takes back the seat with the least held priority. False when no
// unit can move (every one at its maximum, or at its minimum).
func (s *stepper) step() (int, bool) {
	h := &s.h
	if len(h.idx) == 0 {
		return 0, false
	}
	u := h.top()
	s.last = h.key(0)
	if h.held {
		h.a[u]--
	} else {
		h.a[u]++
	}
	if (h.held && h.a[u] > s.pr.min[u]) || (!h.held && h.a[u] < s.pr.max[u]) {
		h.down(0)
	} else {
		h.pop()
	}
	return u, true
}

// tied reports whether the seat moved last has the priority of the first
// on the heap: after giving, the least held priority (the seat given last)
// equals the greatest next one; after taking, the reverse. Either way the
// result ends in a tie.
func (s *stepper) tied() bool {
	return len(s.h.idx) > 0 && s.pr.m.cmpPrio(s.h.key(0), s.last) == 0
}

// seatHeap is a heap of units keyed by the priority of their next seat
// (held false: the greatest first, equal values in input order) or of the
// last seat they hold (held true: the least first, equal values in reverse
// input order): the orders in which the sequential form hands out the next
// seats and in which it handed out the last ones, backwards.
type seatHeap struct {
	m    Method
	pops []uint64
	a    []int
	held bool
	idx  []int32
}

func (h *seatHeap) key(i int) prio {
	u := h.idx[i]
	if h.held {
		return prio{h.pops[u], h.a[u] - 1}
	}
	return prio{h.pops[u], h.a[u]}
}

// before reports whether the unit at i comes out before the unit at j.
func (h *seatHeap) before(i, j int) bool {
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

// init orders the units in h.idx into a heap, in linear time.
func (h *seatHeap) init() {
	for i := len(h.idx)/2 - 1; i >= 0; i-- {
		h.down(i)
	}
}

func (h *seatHeap) top() int { return int(h.idx[0]) }

func (h *seatHeap) down(i int) {
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

func (h *seatHeap) pop() {
	last := len(h.idx) - 1
	h.idx[0] = h.idx[last]
	h.idx = h.idx[:last]
	if last > 0 {
		h.down(0)
	}
}

// settleCut settles a tie at the cut of the consistent seats out.full,
// which add up to the house size: the seats held at the cut value (the
// least held priority) go to the units tied at that value in input order,
// as the sequential form hands them out, and the tie rule settles them.
// out.full ends as the sequential form leaves it; out.seats, out.tie and
// out.tail are set.
func (pr *problem) settleCut(out *divisorOutcome) {
	a := out.full
	// The cut value: the least held priority.
	var v prio
	ok := false
	for i, p := range pr.pops {
		if pr.eligible[i] && p > 0 && a[i] > pr.min[i] {
			x := prio{p, a[i] - 1}
			if !ok || pr.m.cmpPrio(x, v) < 0 {
				v, ok = x, true
			}
		}
	}
	var tied []int
	seats := 0
	for i, p := range pr.pops {
		if !pr.eligible[i] || p == 0 {
			continue
		}
		switch {
		case a[i] > pr.min[i] && pr.m.cmpPrio(prio{p, a[i] - 1}, v) == 0:
			tied = append(tied, i)
			a[i]--
			seats++
		case a[i] < pr.max[i] && pr.m.cmpPrio(prio{p, a[i]}, v) == 0:
			tied = append(tied, i)
		}
	}
	tail := make([]award, seats)
	for k, u := range tied[:seats] {
		tail[k] = award{u, prio{pr.pops[u], a[u]}}
		a[u]++
	}
	out.tail = tail
	out.tie, out.seats = pr.settleTie(a, tail, tied[seats:], pr.m.value(tail[0].pr, pr.places))
}

// settleTie builds the Tie for the awarded seats in tail and the equal
// unawarded claims of losers, and returns the seats after the tie rule.
func (pr *problem) settleTie(full []int, tail []award, losers []int, v Value) (*Tie, []int) {
	cands := make([]int, 0, len(tail)+len(losers))
	for _, w := range tail {
		cands = append(cands, w.u)
	}
	cands = append(cands, losers...)
	sortInts(cands)
	t := &Tie{Units: cands, Seats: len(tail), Value: v, Rule: pr.tie.String()}
	for _, u := range cands {
		t.Names = append(t.Names, pr.names[u])
	}
	seats := append([]int(nil), full...)
	for _, w := range tail {
		seats[w.u]--
	}
	if pr.tie.Kind != TieReport {
		t.Winners = pr.tie.settle(cands, len(tail))
		for _, u := range t.Winners {
			seats[u]++
		}
	} else {
		t.Rule = "none"
	}
	return t, seats
}
