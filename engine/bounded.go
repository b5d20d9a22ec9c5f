package engine

import (
	"math"
	"slices"
)

// This file finds a margin under a largest-remainder method when some
// units have a minimum or a maximum (or when the Droop quota could leave
// more seats over than units with people): the passes that fix units at a
// bound, and so the units and seats of the pass that decides unit i's
// seats, change with its population. The changes are taken in stretches
// over which the passes provably stay what they are, and inside each
// stretch the seats of unit i come from counting claims in its final pass
// (claims.go).
//
// What the procedure decides in a pass depends on the population only
// through the whole parts, the quota and which remainders rank above
// which. While only unit i's population moves, the whole parts and the
// quota move monotonically, and with them fixed every remainder is linear
// in the population (the numerator p·S - f·T over the pass's total T, or
// p - f·Q under a fixed Droop quota). So if at both ends of a stretch the
// whole parts and the quota are the same and a set of remainders ranks
// above another, the smallest of the first set less the largest of the
// second is a concave function of the population, positive at both ends:
// the first set ranks above the second all along. Hence two runs of the
// procedure at the ends of a stretch prove it (certify):
//
//   - every pass has the same units, seats and whole parts at both ends;
//   - in every pass, either the same remainders lie above the cut value,
//     equal to it and below it at both ends (it is the same pass all
//     along), or no unit's remainder seat decides a bound: every unit
//     whose seat decides one (it needs the seat to reach its minimum, or is
//     at its maximum) ranks above every unit without a seat if it has one,
//     and below every unit with one if it has none, at both ends. A pass's remainder seats then change only among units they
//     decide nothing for: it fixes the same units at their bounds, and the
//     next pass has the same units and seats. Inside such a stretch unit
//     i's seats change only with its remainder seat in the last pass (a
//     unit that needs, or is at its maximum, has none to change), and are
//     counted.
//
// Under the Droop quota the quota may differ at the ends. It is a step
// function of the population, and every remainder is linear in the step
// and the population within it together; the bounds are checked at the
// corners of the few rectangles of the two that hold the populations
// between the ends, each a population that occurs, with its own quota
// (cornersHold). The check is exact: it fails only where some population
// in between decides differently.
//
// A stretch as long as it can be proven is found by galloping and
// bisection from a guess of its end: where a whole part is next due to
// change, or where a remainder that decides a bound next crosses one of
// another role (nextWhole, orderChange). The next stretch starts where the
// passes change, from the run that found the change.
//
// How many stretches: each but the last ends where the next change
// decides differently (the proof is exact), at a change of a whole part,
// of a pass's units or seats, or of the order of a remainder whose seat
// decides a bound against another. None of these depends on how far the
// search runs: under Hamilton, with unit i's population moving one way,
// every whole part moves one way, at most H times, and between two such
// moves the remainders are linear in the population, so each pair crosses
// at most once. Under the Droop quota the other units' whole parts move one
// way with the quota; unit i's whole part and remainder run a sawtooth,
// rising one person a person within a step of the quota and falling by the
// whole part f at a step (W = (seats+1) people apart), so they gain W - f
// people a step and cross any one value in at most f/(W-f) + 1 <= H + 1
// steps. The count is at most polynomial in H and the number of units,
// whatever the range; the loop below takes a stretch of at least one
// change each time round.

// boundedStretch finds the least change in [x, e] at which unit i's seats
// meet the wish of dir, over which the units taking part stay the same.
func (w *marginWorker) boundedStretch(i, a, dir int, x, e uint64) (uint64, bool) {
	meets := func(s int) bool { return s >= 0 && ((dir > 0 && s > a) || (dir < 0 && s < a)) }
	// failed is the least change at which a probe found the passes
	// different from lo's, its run kept in w.tr[2]; the next stretch
	// starts there, and takes the run instead of making it again.
	failed := uint64(0)
	for lo := x; lo <= e; {
		var s int
		if failed == lo && lo > x {
			w.tr[0], w.tr[2] = w.tr[2], w.tr[0]
			w.trPop[0], w.trSeats[0] = w.trPop[2], w.trSeats[2]
			s = w.trSeats[0]
		} else {
			s = w.traceAt(i, dir, lo, 0)
		}
		if meets(s) {
			return lo, true
		}
		if lo == e {
			return 0, false
		}
		// The longest stretch from lo the two runs prove, looked for from
		// where a whole part is next due to change.
		kind := certifyNone
		last := lo
		hi, found := leastWhere(lo+1, e, w.nextWhole(i, dir, lo), func(y uint64) bool {
			w.traceAt(i, dir, y, 1)
			k := w.certify(i)
			if k == certifyNone {
				// leastWhere's failing probes only fall: the last is
				// where the stretch ends.
				w.tr[1], w.tr[2] = w.tr[2], w.tr[1]
				w.trPop[2], w.trSeats[2] = w.trPop[1], w.trSeats[1]
				failed = y
				return true
			}
			last, kind = y, k
			return false
		})
		if !found {
			hi = e + 1
		}
		end := hi - 1 // the stretch [lo, end] is proven
		if last != end {
			w.traceAt(i, dir, end, 1)
			kind = w.certify(i)
		}
		if kind == certifyPasses && end > lo {
			if got, ok := w.finalSearch(i, a, dir, lo+1, end); ok {
				return got, true
			}
		}
		lo = end + 1
	}
	return 0, false
}

// nextWhole returns the least change after lo at which a whole part of a
// pass that unit i takes part in, as w.tr[0] records them at lo, is due to
// change, if the passes stayed as they are; lo+1 when it cannot tell. Only
// a guess where to look: no result depends on it.
func (w *marginWorker) nextWhole(i, dir int, lo uint64) uint64 {
	t := &w.tr[0]
	next := ^uint64(0)
	p := w.trPop[0]
	for k := 0; k < t.n; k++ {
		x := &t.passes[k]
		pos := slices.Index(x.units, i)
		if pos < 0 || x.seats == 0 {
			continue
		}
		var tot u128
		for _, u := range x.units {
			if u == i {
				tot, _ = tot.add64(p)
			} else {
				tot, _ = tot.add64(w.q.pops[u])
			}
		}
		switch {
		case w.pr.m == Droop:
			next = min(next, droopWholeChange(x, w.q.pops, pos, p, tot.float(), pow10(w.pr.places), dir))
			if len(x.place) > 0 {
				next = min(next, w.orderChange(x, pos, dir))
			}
		case tot.hi != 0:
			return lo + 1
		default:
			next = min(next, hareWholeChange(x, w.q.pops, pos, p, tot.lo, dir))
			if len(x.place) > 0 {
				next = min(next, w.orderChange(x, pos, dir))
			}
		}
	}
	if next == ^uint64(0) || next > ^uint64(0)-lo {
		return lo + 1
	}
	return lo + max(next, 1)
}

// droopWholeChange guesses after how many more people of change (dir) a
// whole part floor(p_u/Q) of the Droop pass x changes, unit i (at
// position pos) moving from population p, the pass's total from t. The
// quota is Q = (m+1)·sc with m = floor(T/W), W = (seats+1)·sc: it steps
// once every W people of the total. Another unit's whole part moves one
// way with the quota; unit i's runs a sawtooth, rising by one person a
// person within a step and falling by its whole part at a step, so it
// rises to f+1 within the first step whose last population reaches
// (f+1)·Q, and falls below f only at the step next to the population,
// taking people away, within the last step whose first population is below
// f·Q. A guess in floating point, for nextWhole: one result is exact or a
// few people off, which the search after it corrects.
func droopWholeChange(x *lrPassTrace, pops []uint64, pos int, p uint64, t float64, sc uint64, dir int) uint64 {
	w, q := float64(x.seats+1)*float64(sc), float64(sc)
	pf := float64(p)
	rest := t - pf
	m0 := math.Floor(t/w) + 1 // the quota at p is m0·sc
	first := func(m float64) float64 { return (m-1)*w - rest }
	last := func(m float64) float64 { return m*w - 1 - rest }
	best := math.Inf(1)
	at := func(y float64) { // unit i's population y, after the change
		if d := (y - pf) * float64(dir); d >= 1 && d < best {
			best = d
		}
	}
	f := float64(x.whole[pos])
	for j, u := range x.units {
		fu := float64(x.whole[j])
		pu := float64(pops[u])
		switch {
		case j == pos && dir > 0:
			// Rises to f+1 in the first step m >= m0 with last(m) >= (f+1)·m·sc.
			if den := w - (f+1)*q; den > 0 {
				m := max(m0, math.Ceil((rest+1)/den))
				at(max(pf, first(m), (f+1)*q*m))
			}
			// Falls below f at the next step if its first population does.
			if y := first(m0 + 1); y < f*q*(m0+1) {
				at(y)
			}
		case j == pos:
			// Falls below f in the last step m <= m0 whose first population
			// is below f·m·sc.
			if den := w - f*q; f > 0 && den > 0 {
				m := min(m0, math.Ceil((w+rest)/den)-1)
				if m >= 1 {
					at(min(pf, f*q*m-1, last(m)))
				}
			}
			// Rises to f+1 at the step before if its last population does.
			if y := last(m0 - 1); m0 > 1 && y >= (f+1)*q*(m0-1) {
				at(y)
			}
		case dir > 0:
			// Another's falls below fu once the quota passes pu/fu.
			if fu > 0 {
				at(first(math.Floor(pu/(fu*q)) + 1))
			}
		default:
			// Another's rises to fu+1 once the quota is at most pu/(fu+1).
			if m := math.Floor(pu / ((fu + 1) * q)); m >= 1 && m < m0 {
				at(last(m))
			}
		}
	}
	if best >= 1<<63 {
		return ^uint64(0)
	}
	return uint64(best)
}

// hareWholeChange returns after how many more people of change (dir) a
// whole part floor(p_u·S/T) of the Hamilton pass x changes, unit i (at
// position pos) moving from population p, and with it the total from t.
func hareWholeChange(x *lrPassTrace, pops []uint64, pos int, p, t uint64, dir int) uint64 {
	s := uint64(x.seats)
	best := ^uint64(0)
	for j, u := range x.units {
		f := uint64(x.whole[j])
		var d u128
		switch {
		case j == pos && dir > 0:
			// Unit i's rises to f+1 once (p+d)·S >= (f+1)·(t+d).
			if s <= f+1 {
				continue
			}
			num := mul128(f+1, t).sub(mul128(p, s))
			q, r := num.div64(s - f - 1)
			if d = q; r != 0 {
				d = q.plus(1)
			}
		case j == pos:
			// Unit i's falls below f once (p-d)·S < f·(t-d).
			if f == 0 || s <= f {
				continue
			}
			q, _ := mul128(p, s).sub(mul128(f, t)).div64(s - f)
			d = q.plus(1)
		case dir > 0:
			// Another's falls below f once t+d > p_u·S/f.
			if f == 0 {
				continue
			}
			q, _ := mul128(pops[u], s).div64(f)
			d = q.plus(1).sub(u128{0, t})
		default:
			// Another's rises to f+1 once t-d <= p_u·S/(f+1).
			q, _ := mul128(pops[u], s).div64(f + 1)
			d = u128{0, t}.sub(q)
		}
		if d.hi == 0 {
			best = min(best, d.lo)
		}
	}
	return best
}

// orderChange guesses after how many more people of change (dir) the pass
// x next ranks a unit whose remainder seat decides a bound on the other
// side of a unit of another role (where boundsHold would fail), unit i at
// position pos. With the whole parts fixed, every remainder is about
// linear in the change d. Under Hamilton its numerator over the pass's
// total is r_u + dir·d·c_u, where c_u = -f_u for another unit (the total
// grows by d) and S - f_i for unit i. Under the Droop quota the quota
// grows by about d/(S+1) people, so the remainder p_u - f_u·Q changes by
// dir·d·c_u/(S+1), where c_u = -f_u for another unit and S+1 - f_i for
// unit i. The guess pairs every unit with a seat with the strongest unit
// without one in each role, and every unit without a seat with the
// weakest with one, in floating point: a guess for nextWhole, which only
// tells the search where to look; the proof of each stretch is exact. It
// returns ^uint64(0) when no pair crosses.
func (w *marginWorker) orderChange(x *lrPassTrace, pos, dir int) uint64 {
	pr := w.pr
	w.roles = resize(w.roles, len(x.units))
	win, lose := [3]int{-1, -1, -1}, [3]int{-1, -1, -1}
	for j, u := range x.units {
		if x.place[j] == 3 {
			continue
		}
		g := pr.remainderRole(u, x.whole[j])
		w.roles[j] = g
		if x.win[j] {
			if k := win[g]; k < 0 || x.rems[j].cmp(x.rems[k]) <= 0 {
				win[g] = j
			}
		} else if k := lose[g]; k < 0 || x.rems[j].cmp(x.rems[k]) > 0 {
			lose[g] = j
		}
	}
	s, scale := float64(x.seats), 1.0
	if pr.m == Droop {
		s = float64(x.seats) + 1
		scale = s
	}
	slope := func(j int) float64 {
		if j == pos {
			return s - float64(x.whole[j])
		}
		return -float64(x.whole[j])
	}
	best := math.Inf(1)
	// cross notes where b, now below a, would rise to it.
	cross := func(a, b int) {
		if k := float64(dir) * (slope(b) - slope(a)); k > 0 {
			d := math.Max(1, math.Ceil((x.rems[a].float()-x.rems[b].float())*scale/k))
			best = math.Min(best, d)
		}
	}
	free := int8(seatFree)
	for j := range x.units {
		if x.place[j] == 3 {
			continue
		}
		g := w.roles[j]
		if x.win[j] {
			for gl, y := range lose {
				if y >= 0 && (g != free || int8(gl) != free) {
					cross(j, y)
				}
			}
		} else {
			for gw, a := range win {
				if a >= 0 && (g != free || int8(gw) != free) {
					cross(a, j)
				}
			}
		}
	}
	if best >= 1<<63 {
		return ^uint64(0)
	}
	return uint64(best)
}

// Kinds of stretch the two runs prove.
const (
	certifyNone   = iota // nothing: the passes may change inside
	certifySame          // the whole run, unit i's seats included
	certifyPasses        // the passes; unit i's remainder seat may change
)

// traceAt runs the procedure with unit i's population after the change y,
// recording it in w.tr[k] (with the population in w.trPop[k] and the
// seats in w.trSeats[k]), and returns unit i's outright seats (-1 when
// there is no apportionment).
func (w *marginWorker) traceAt(i, dir int, y uint64, k int) int {
	w.setPop(i, w.popAt(i, dir, y))
	w.trPop[k], w.trSeats[k] = w.q.pops[i], -1
	t := &w.tr[k]
	t.reset()
	if w.q.checkFeasible() != nil {
		t.failed = true
		return -1
	}
	w.q.trace = t
	o, err := w.q.remainderCut()
	w.q.trace = nil
	if err != nil {
		return -1
	}
	w.trSeats[k] = o.seats[i]
	return o.seats[i]
}

// certify compares the runs in w.tr[0] and w.tr[1] (see the top of the
// file).
func (w *marginWorker) certify(i int) int {
	x, y := &w.tr[0], &w.tr[1]
	if x.failed != y.failed || x.n != y.n {
		return certifyNone
	}
	same := true
	for k := 0; k < x.n; k++ {
		a, b := &x.passes[k], &y.passes[k]
		if a.seats != b.seats || a.extra != b.extra ||
			!slices.Equal(a.units, b.units) || !slices.Equal(a.whole, b.whole) {
			return certifyNone
		}
		if len(a.place) == 0 {
			continue // a pass that failed on its whole parts: they decide
		}
		if a.quota != b.quota {
			// The Droop quota moves with the total between the ends.
			if !w.cornersHold(i, a) {
				return certifyNone
			}
			same = false
			continue
		}
		if slices.Equal(a.place, b.place) && slices.Equal(a.win, b.win) {
			continue
		}
		if !w.boundsHold(a, a.rems) || !w.boundsHold(a, b.rems) {
			return certifyNone
		}
		same = false
	}
	if same || x.failed {
		// Unchanged; or failing all along, for the same reason: why a run
		// fails (whole parts, units fixed at their bounds) is proven the
		// same.
		return certifySame
	}
	return certifyPasses
}

// boundsHold reports whether, in the pass a, with the remainders rems, no
// unit's remainder seat decides whether the pass fixes it at a bound:
// every unit for which it does (one that needs the seat to reach its
// minimum, or is at its maximum) and has the seat ranks above every unit
// without one, and every such unit without it ranks below every unit with
// one (a deciding which units have one). Among equal remainders at the cut
// the units that need the seat come first, those at their maximum last,
// and within each of the two in input order (cutGroups): a unit ranks
// above another with the same remainder when its role comes first, or when
// the role is the same and so is the unit first in input order. Each
// condition holds for every pair of a unit with a seat and one without
// when it holds for the weakest of the first in each role and the
// strongest of the second in each role.
func (w *marginWorker) boundsHold(a *lrPassTrace, rems []u128) bool {
	pr := w.pr
	// By role (seatNeeded, seatFree, seatBarred: the order at equal
	// remainders): the position of the weakest unit with a seat and of the
	// strongest without; -1 for none.
	win, lose := [3]int{-1, -1, -1}, [3]int{-1, -1, -1}
	for j, u := range a.units {
		if a.place[j] == 3 {
			continue
		}
		g := pr.remainderRole(u, a.whole[j])
		if a.win[j] {
			if k := win[g]; k < 0 || rems[j].cmp(rems[k]) <= 0 {
				win[g] = j // the later of equals ranks lower
			}
		} else if k := lose[g]; k < 0 || rems[j].cmp(rems[k]) > 0 {
			lose[g] = j // the earlier of equals ranks higher
		}
	}
	for gw, x := range win {
		for gl, y := range lose {
			if x < 0 || y < 0 || (gw == int(seatFree) && gl == int(seatFree)) {
				continue // free units' seats decide no bound
			}
			c := rems[x].cmp(rems[y])
			if c < 0 || (c == 0 && (gw > gl || (gw == gl && x > y))) {
				return false
			}
		}
	}
	return true
}

// cornersHold proves a pass of the Droop quota the same all along when the
// quota differs at the ends (a and b). The quota is a step function of unit
// i's population p: with R the pass's other units' population and W =
// (seats+1) people, it is k+1 people where p = k·W + j - R, 0 <= j < W.
// With the whole parts fixed every remainder is linear in (k, j): p_u -
// f_u·(k+1) people for another unit, k·W + j - R - f_i·(k+1) people for
// unit i. The populations between the ends are the points of at most three
// rectangles of (k, j): the rest of the first quota's stretch, the whole
// stretches between, and the start of the last one. Over each, the
// smallest of one set of remainders less the largest of another is concave,
// and positive if it is at the rectangle's corners; unit i's whole part
// f_i (p - f_i·Q >= 0 and p - (f_i+1)·Q < 0, linear too) is the same all
// over if it is there. Every corner is a population between the ends with
// its own quota, so the check is exact: it fails only where some
// population between the ends breaks a bound as boundsHold has it, or
// changes unit i's whole part. (The other units' whole parts fall as the
// quota rises, and are the same at both ends.) A rectangle of populations
// and quotas taken apart would hold pairs that never occur, such as the
// greatest population with the least quota, where unit i's whole part can
// be one more than at any population between: a whole part a few people
// short of the next all along would then cut the stretches to those few
// people.
func (w *marginWorker) cornersHold(i int, a *lrPassTrace) bool {
	pos := slices.Index(a.units, i)
	if pos < 0 {
		return false
	}
	p0, p1 := min(w.trPop[0], w.trPop[1]), max(w.trPop[0], w.trPop[1])
	var rest u128
	for _, u := range a.units {
		if u != i {
			rest, _ = rest.add64(w.q.pops[u])
		}
	}
	sc := pow10(w.pr.places)
	width := (uint64(a.seats) + 1) * sc // at most (10^9+1)·10^9 people
	t0, _ := rest.add64(p0)
	t1, _ := rest.add64(p1)
	_, j0 := t0.div64(width)
	_, j1 := t1.div64(width)
	// The first quota's stretch ends at e0, the last one starts at s1.
	e0, s1 := p0+(width-1-j0), p1-j1
	pts := [8]uint64{p0, p1}
	n := 2
	if e0 < p1 {
		pts[2], pts[3] = e0, s1
		n = 4
		if s1-e0 > 1 {
			// Whole stretches between: their first and last populations.
			pts[4], pts[5], pts[6], pts[7] = e0+1, e0+width, s1-width, s1-1
			n = 8
		}
	}
	f := a.whole[pos]
	for _, p := range pts[:n] {
		t, _ := rest.add64(p)
		q := droopQuota(t, a.seats, sc)
		if wholeOf(p, q) != f || !w.boundsHold(a, w.cornerRems(a, i, p, q)) {
			return false
		}
	}
	return true
}

// wholeOf is floor(p/q).
func wholeOf(p uint64, q u128) int {
	if q.hi != 0 || q.lo == 0 {
		return 0
	}
	return int(p / q.lo)
}

// cornerRems returns the remainders p_u - f_u·q of pass a's units, unit i
// at population p, in scratch.
func (w *marginWorker) cornerRems(a *lrPassTrace, i int, p uint64, q u128) []u128 {
	w.rems = resize(w.rems, len(a.units))
	for j, u := range a.units {
		pu := w.q.pops[u]
		if u == i {
			pu = p
		}
		fq, ok := q.mulSmall(uint64(a.whole[j]))
		if !ok || fq.cmp(u128{0, pu}) > 0 {
			fq = u128{0, pu}
		}
		w.rems[j] = u128{0, pu}.sub(fq)
	}
	return w.rems
}

// finalSearch finds the least change in [lo, hi] at which unit i's seats
// meet the wish of dir, where the passes stay as w.tr[0] records them and
// only the remainder seats of the last pass change: by counting claims in
// that pass.
func (w *marginWorker) finalSearch(i, a, dir int, lo, hi uint64) (uint64, bool) {
	pr := w.pr
	t := &w.tr[0]
	f := &t.passes[t.n-1]
	pos := slices.Index(f.units, i)
	if pos < 0 {
		return 0, false // unit i is fixed at a bound all along
	}
	if pr.remainderRole(i, f.whole[pos]) != seatFree {
		return 0, false // its remainder seat is given, or withheld, all along
	}
	if fw := f.whole[pos]; fw+1 < pr.min[i] || fw > pr.max[i] {
		// The last pass fixed every unit at a bound (there is no final
		// pass): unit i is held at its bound all along, with its remainder
		// seat or without.
		return 0, false
	}
	c := &w.pass
	*c = claimPass{m: pr.m, pops: w.q.pops, units: f.units, i: i, seats: f.seats, sc: pow10(pr.places)}
	for _, u := range f.units {
		if u != i {
			c.rest, _ = c.rest.add64(w.q.pops[u])
		}
	}
	if cap(w.group) < pr.n() {
		w.group, w.floor = make([]int8, pr.n()), make([]int, pr.n())
	}
	c.group, c.floor = w.group[:pr.n()], w.floor[:pr.n()]
	for j, u := range f.units {
		c.floor[u] = f.whole[j]
		c.group[u] = pr.remainderRole(u, f.whole[j])
	}
	// Unit i's seats all come from this pass, as it takes part in it.
	s, k := c.wish(a, dir)
	if s < 0 {
		return 0, false
	}
	ok := func(y uint64) bool { return c.meets(w.popAt(i, dir, y), s, k, dir) }
	if pr.m == Droop {
		return w.droopSearch(c, i, dir, lo, hi, lo, ok, func(a, b uint64) (uint64, bool) { return leastWhere(a, b, a, ok) })
	}
	return leastWhere(lo, hi, lo, ok)
}
