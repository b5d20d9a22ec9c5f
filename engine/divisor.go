package engine

// This file holds the sequential divisor procedure: every unit starts at its
// minimum and each next seat goes to the unit with the greatest priority
// value p/s(a), skipping units at their maximum.

// award is one seat handed out by priority: unit u took its (pr.a+1)-th seat
// with priority value p/s(pr.a).
type award struct {
	u  int
	pr prio
}

// prioHeap is a max-heap of units keyed by their next priority value; equal
// values come out in input order.
type prioHeap struct {
	m    Method
	pops []uint64
	a    []int
	idx  []int32
}

func (h *prioHeap) less(i, j int) bool { // i should come out before j
	x, y := int(h.idx[i]), int(h.idx[j])
	c := h.m.cmpPrio(prio{h.pops[x], h.a[x]}, prio{h.pops[y], h.a[y]})
	if c != 0 {
		return c > 0
	}
	return x < y
}

func (h *prioHeap) push(u int) {
	h.idx = append(h.idx, int32(u))
	i := len(h.idx) - 1
	for i > 0 {
		p := (i - 1) / 2
		if !h.less(i, p) {
			break
		}
		h.idx[i], h.idx[p] = h.idx[p], h.idx[i]
		i = p
	}
}

func (h *prioHeap) down(i int) {
	n := len(h.idx)
	for {
		l := 2*i + 1
		if l >= n {
			return
		}
		best := l
		if r := l + 1; r < n && h.less(r, l) {
			best = r
		}
		if !h.less(best, i) {
			return
		}
		h.idx[i], h.idx[best] = h.idx[best], h.idx[i]
		i = best
	}
}

func (h *prioHeap) top() int { return int(h.idx[0]) }

func (h *prioHeap) pop() int {
	u := int(h.idx[0])
	last := len(h.idx) - 1
	h.idx[0] = h.idx[last]
	h.idx = h.idx[:last]
	if last > 0 {
		h.down(0)
	}
	return u
}

// heapify builds the heap over the given units in O(n).
func (h *prioHeap) heapify(units []int32) {
	h.idx = units
	for i := len(units)/2 - 1; i >= 0; i-- {
		h.down(i)
	}
}

// divisorOutcome is the raw result of the sequential procedure.
type divisorOutcome struct {
	seats []int   // seats after the tie rule (or outright, if none)
	full  []int   // seats as the procedure handed them out, tie included
	order []award // seats awarded beyond the minimums, in order (when kept)
	free  int     // seats awarded by priority: H minus the minimums
	tie   *Tie
	tail  []award // the awarded seats at the cut value, when tied
}

// divisorSeats runs the divisor procedure. keepOrder records every award
// in order, by the sequential procedure; without it the seats are found by
// jump and step (jump.go), with the same outcome but for the order.
func (pr *problem) divisorSeats(keepOrder bool) (*divisorOutcome, error) {
	if !keepOrder {
		return pr.divisorJump()
	}
	return pr.divisorSequential(true)
}

// divisorSequential runs the sequential procedure, handing out the seats
// one at a time. keepOrder records every award.
func (pr *problem) divisorSequential(keepOrder bool) (*divisorOutcome, error) {
	n := pr.n()
	a := make([]int, n)
	cand := make([]int32, 0, n)
	given := 0
	for i := 0; i < n; i++ {
		if !pr.eligible[i] {
			continue
		}
		a[i] = pr.min[i]
		given += a[i]
		if pr.pops[i] > 0 && a[i] < pr.max[i] {
			cand = append(cand, int32(i))
		}
	}
	free := pr.h - given
	if free < 0 {
		return nil, scenarioError("min", "the minimums exceed the house size")
	}
	h := &prioHeap{m: pr.m, pops: pr.pops, a: a}
	h.heapify(cand)
	out := &divisorOutcome{free: free}
	if keepOrder {
		out.order = make([]award, 0, free)
	}
	var tail []award // trailing awards with equal priority values
	for k := 0; k < free; k++ {
		if len(h.idx) == 0 {
			return nil, scenarioError("max", "the maximums leave seats that no unit with people can take")
		}
		u := h.top()
		w := award{u, prio{pr.pops[u], a[u]}}
		if len(tail) > 0 && pr.m.cmpPrio(tail[0].pr, w.pr) == 0 {
			tail = append(tail, w)
		} else {
			tail = append(tail[:0], w)
		}
		if keepOrder {
			out.order = append(out.order, w)
		}
		a[u]++
		if a[u] < pr.max[u] {
			h.down(0)
		} else {
			h.pop()
		}
	}
	out.full = a
	out.seats = a
	// A tie: the best seat not awarded has the same value as the last one.
	if len(tail) > 0 && len(h.idx) > 0 {
		v := tail[0].pr
		if pr.m.cmpPrio(prio{pr.pops[h.top()], a[h.top()]}, v) == 0 {
			var losers []int
			for len(h.idx) > 0 {
				u := h.top()
				if pr.m.cmpPrio(prio{pr.pops[u], a[u]}, v) != 0 {
					break
				}
				losers = append(losers, u)
				h.pop()
			}
			out.tail = append([]award(nil), tail...)
			out.tie, out.seats = pr.settleTie(a, tail, losers, pr.m.value(v, pr.places))
		}
	}
	return out, nil
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
