package engine

import "math/big"

// This file computes margins: the fewest people a unit needs to gain one
// seat outright, or can lose before it drops one, all other units fixed.
//
// Divisor methods without a threshold use a closed form. With all other
// units fixed, unit i's (a+1)-th seat is won outright exactly when its
// priority p'/s(a) exceeds the weakest seat another unit holds beyond its
// minimum, so p' is the least whole number above that value times s(a). It
// loses its a-th seat outright exactly when p''/s(a-1) falls below the best
// seat another unit does not hold.
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
	if !need.IsUint64() || need.Uint64() > MaxCoefficient {
		return 0, false
	}
	p := need.Uint64()
	if p <= pr.pops[i] {
		return 1, true
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
		return pr.pops[i], true // only an empty unit loses its first seat
	}
	var keep *big.Int // the greatest population that loses the seat
	if t.sq {
		x := new(big.Int).Mul(bigU(best.p), bigU(best.p))
		x.Mul(x, bigU(t.n))
		x.Sub(x, big.NewInt(1))
		x.Quo(x, bigU(sb.n))
		keep = x.Sqrt(x)
	} else {
		num := new(big.Int).Mul(bigU(best.p), bigU(sb.d))
		num.Mul(num, bigU(t.n))
		num.Sub(num, big.NewInt(1))
		den := new(big.Int).Mul(bigU(t.d), bigU(sb.n))
		keep = num.Quo(num, den)
	}
	k := keep.Uint64()
	if !keep.IsUint64() || k >= pr.pops[i] {
		return 1, true
	}
	return pr.pops[i] - k, true
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

// stretchEnd returns, for the Droop quota, the last change x' >= x (in the
// direction dir) at which the quota stays what it is at change x; for other
// methods x itself.
func (pr *problem) stretchEnd(x uint64, dir int) uint64 {
	if pr.m != Droop {
		return x
	}
	total := sum128(pr.pops).big()
	w := new(big.Int).Mul(bigU(pow10(pr.places)), big.NewInt(int64(pr.h)+1))
	t := new(big.Int).Set(total)
	if dir > 0 {
		t.Add(t, bigU(x))
		k := new(big.Int).Quo(t, w)
		end := k.Add(k, big.NewInt(1)).Mul(k, w)
		end.Sub(end, big.NewInt(1))
		end.Sub(end, total) // x at the stretch's end
		return end.Uint64()
	}
	t.Sub(t, bigU(x))
	k := new(big.Int).Quo(t, w)
	end := new(big.Int).Sub(total, k.Mul(k, w))
	return end.Uint64()
}

// searchChange returns the least x in [1, limit] with ok(x), where ok holds
// monotonically at stretch ends and within each stretch.
func (pr *problem) searchChange(limit uint64, dir int, ok func(uint64) bool) (uint64, bool) {
	if limit == 0 {
		return 0, false
	}
	end := func(x uint64) uint64 { return min(pr.stretchEnd(x, dir), limit) }
	atEnd := func(x uint64) bool { return ok(end(x)) }
	// Exponential probe for a stretch whose end satisfies.
	var lo, hi uint64 = 0, 1
	for !atEnd(hi) {
		if hi == limit {
			return 0, false
		}
		lo = hi
		hi = min(hi*2, limit)
	}
	// Least x in (lo, hi] whose stretch end satisfies: a stretch start.
	for hi-lo > 1 {
		mid := lo + (hi-lo)/2
		if atEnd(mid) {
			hi = mid
		} else {
			lo = mid
		}
	}
	start, stop := hi, end(hi)
	// Least x in [start, stop] with ok(x).
	lo, hi = start-1, stop
	for hi-lo > 1 {
		mid := lo + (hi-lo)/2
		if ok(mid) {
			hi = mid
		} else {
			lo = mid
		}
	}
	return hi, true
}

func (pr *problem) gainSearch(i, a int) (uint64, bool) {
	if a >= pr.max[i] {
		return 0, false
	}
	p := pr.pops[i]
	return pr.searchChange(MaxCoefficient-p, +1, func(x uint64) bool { return pr.outrightAt(i, p+x) > a })
}

func (pr *problem) loseSearch(i, a int) (uint64, bool) {
	if a <= pr.min[i] && pr.threshold.IsZero() {
		return 0, false
	}
	if a == 0 {
		return 0, false
	}
	p := pr.pops[i]
	return pr.searchChange(p, -1, func(x uint64) bool {
		s := pr.outrightAt(i, p-x)
		return s >= 0 && s < a
	})
}
