package engine

import (
	"cmp"
	"math"
	"slices"
	"sync"
)

// This file holds the first step of the divisor procedure's fast form
// (divisor.go): from a starting divisor, a few safeguarded Newton steps in
// floating point to a divisor at which the roundings of the populations
// (clamped to the bounds) add up to the house size, then one pass that
// picks the seats still missing (or in excess) from the priority values
// nearest the estimate. This is an estimate only; no seat depends on it:
// the exact rounding (cut.go) and the exact steps that follow decide every
// seat.

// signpostCount is the most seat counts whose floating-point signposts
// are tabulated.
const signpostCount = 1 << 14

// signpostTables holds each divisor method's floating-point signposts
// s(0), ..., s(signpostCount-1) and their reciprocals, computed once on
// first use.
var signpostTables [ModifiedSainteLague + 1]struct {
	once  sync.Once
	s, rs []float64
}

// signpostTable returns the floating-point signposts of m and their
// reciprocals (+Inf for a zero signpost), shared and read-only.
func signpostTable(m Method) (s, rs []float64) {
	e := &signpostTables[m]
	e.once.Do(func() {
		e.s, e.rs = make([]float64, signpostCount), make([]float64, signpostCount)
		for k := range e.s {
			e.s[k] = signpostFloat(m, k)
			e.rs[k] = 1 / e.s[k]
		}
	})
	return e.s, e.rs
}

// signpostFloat is s(a) in floating point, with a relative error of at
// most three units in the last place.
func signpostFloat(m Method, a int) float64 {
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

// prioEstimate is the priority value x in floating point, in scaled units
// (+Inf for a first seat under a zero signpost): for estimates only.
func (m Method) prioEstimate(x prio) float64 {
	if m.signpost(x.a).n == 0 {
		return math.Inf(1)
	}
	return float64(x.p) / signpostFloat(m, x.a)
}

// divisorRun holds the state of one run of the divisor procedure's fast
// form: the seats being found and the scratch the estimate uses.
type divisorRun struct {
	pr    *problem
	a     []int
	plain bool    // every unit takes part, with no minimum and no maximum
	total float64 // the population taking part, in floating point
	// sT holds the floating-point signposts s(k) for k < len(sT); beyond,
	// s(k) is taken as s(len(sT)-1) + k - (len(sT)-1), exact for the
	// linear signposts and within 10^-5 for Dean and Huntington–Hill.
	sT         []float64
	next, held []nearSeat // seats near the estimate (see collect)
	idx        []int32
}

// nearSeat is a seat near the estimate: unit u's, with floating-point
// priority v.
type nearSeat struct {
	v float64
	u int32
}

// sf is s(k) in floating point, as the estimate takes it.
func (j *divisorRun) sf(k int) float64 {
	t := min(k, len(j.sT)-1)
	return j.sT[t] + float64(k-t)
}

// roundF rounds x (at most the house size) at the signposts in floating
// point: the number of signposts below x.
func (j *divisorRun) roundF(x float64) int {
	f := int(x)
	t := min(f, len(j.sT)-1)
	// One more when s(f) < x: the sign bit of s(f) - x.
	return f + int(math.Float64bits(j.sT[t]+float64(f-t)-x)>>63)
}

// estimate moves the divisor d > 0 in floating point until the roundings
// add up to the house size, leaving the roundings at it in j.a; when ties
// (or floating-point limits) leave none, it returns the best divisor
// found. near says that d is a close start (the warm start's): its first
// pass already gathers the few seats such a start misses by. From the
// standard divisor the miss is larger, and a first pass that only counts
// it (sumAt) aims the first step.
func (j *divisorRun) estimate(d float64, near bool) float64 {
	pr := j.pr
	j.sT, _ = signpostTable(pr.m)
	if !(d > 0) || math.IsInf(d, 0) {
		d = 1
	}
	lo, hi := 0.0, math.Inf(1) // the sum exceeds h at lo and falls short at hi
	diff, slope := 0, j.total/d
	if !near {
		if diff, slope = j.sumAt(d); diff != 0 {
			lo, hi, d = j.step(d, diff, slope, lo, hi)
		}
	}
	for iter, widen := 0, 1.0; iter < 40; iter++ {
		// Collect the seats near d: about four times the square root of
		// the seats now missing, as a Newton step leaves about that many.
		want := (4*math.Sqrt(math.Abs(float64(diff))) + 64) * widen
		if iter == 0 && near {
			want = firstWindow
		}
		w := min(want/max(slope, 1), 0.25)
		ndiff, nslope, e, ok := j.collect(d, w, int(8*want)+256)
		if ok {
			return e
		}
		diff, slope = ndiff, nslope
		nlo, nhi, nd := j.step(d, diff, slope, lo, hi)
		if !math.IsInf(nhi, 0) && nhi-nlo <= nhi*0x1p-45 {
			break // a bracket this narrow holds a tie, or float limits
		}
		if !(nd > 0) || math.IsInf(nd, 0) {
			break
		}
		if nd == d {
			widen *= 4 // the same divisor again: look wider around it
		}
		lo, hi, d = nlo, nhi, nd
	}
	j.collect(d, 0, 0)
	return d
}

// step narrows the bracket [lo, hi] with the miss diff (the sum of the
// roundings less the house size, nonzero) at the divisor d and returns it
// with the next divisor to try: a Newton step in log d with the slope,
// safeguarded to stay inside the bracket.
func (j *divisorRun) step(d float64, diff int, slope, lo, hi float64) (float64, float64, float64) {
	if diff > 0 {
		lo = d
	} else {
		hi = d
	}
	nd := d
	if den := slope - float64(diff); slope > 0 && den > 0 {
		nd = d * slope / den
	} else if diff > 0 {
		nd = d * 2
	} else {
		nd = d / 2
	}
	if !(nd > lo && nd < hi) {
		switch {
		case lo > 0 && !math.IsInf(hi, 0):
			nd = math.Sqrt(lo) * math.Sqrt(hi)
		case diff > 0:
			nd = d * 4
		default:
			nd = d / 4
		}
	}
	return lo, hi, nd
}

// sumAt returns what collect does of the roundings at the divisor d (their
// sum less the house size, and the slope) without gathering seats: for
// units without bounds, in a pass that only counts.
func (j *divisorRun) sumAt(d float64) (diff int, slope float64) {
	if !j.plain {
		diff, slope, _, _ = j.collect(d, 0, 0)
		return diff, slope
	}
	inv := 1 / d
	hf := float64(j.pr.h)
	sum := 0
	for _, p := range j.pr.pops {
		sum += j.roundF(min(float64(p)*inv, hf))
	}
	return sum - j.pr.h, j.total * inv
}

// firstWindow is the seats the first pass of the estimate looks for around
// the starting divisor.
const firstWindow = 4

// collect rounds every unit at the divisor d in floating point into j.a
// and gathers the seats whose floating-point priority lies within the
// relative window w of d: next seats above d(1-w) and held seats below
// d(1+w), up to limit on each side. If the roundings miss the house size by
// fewer seats than it gathered on the side that makes up the difference, it
// moves those seats in j.a and returns a divisor between the last seat
// moved and the next one, and ok. It returns the sum of the roundings less
// the house size, and the sum of the quotients p/d of the units not held
// at a bound (the slope of the sum in log d).
func (j *divisorRun) collect(d, w float64, limit int) (diff int, slope, e float64, ok bool) {
	pr, a := j.pr, j.a
	inv := 1 / d
	hf := float64(pr.h)
	cn, ch := 1/(1-w), 1/(1+w) // next seat k in window: s(k) < x·cn; held: s(k-1) > x·ch
	j.next, j.held = j.next[:0], j.held[:0]
	sum := 0
	if j.plain {
		sum = j.collectPlain(inv, cn, ch, limit)
		slope = j.total * inv
	} else {
		for i, p := range pr.pops {
			if !pr.eligible[i] {
				continue
			}
			lo, hi := pr.min[i], min(pr.max[i], pr.h)
			if p == 0 {
				a[i] = lo
				sum += lo
				continue
			}
			x := min(float64(p)*inv, hf)
			k := min(max(j.roundF(x), lo), hi)
			if lo < k && k < hi {
				slope += x
			}
			a[i] = k
			sum += k
			j.gather(i, p, x, k, lo, hi, cn, ch, limit)
		}
	}
	next, held := j.next, j.held
	diff = sum - pr.h
	if diff == 0 {
		return 0, slope, d, true
	}
	gain := diff < 0
	need, seats, edge := diff, held, d*(1+w)
	if gain {
		need, seats, edge = -diff, next, d*(1-w)
	}
	if len(seats) < need || len(seats) > limit {
		return diff, slope, 0, false
	}
	firstSeats(seats, need+1, gain)
	for _, s := range seats[:need] {
		if gain {
			a[s.u]++
		} else {
			a[s.u]--
		}
	}
	if len(seats) > need {
		edge = seats[need].v
	}
	return diff, slope, (seats[need-1].v + edge) / 2, true
}

// collectPlain is the loop of collect when every unit takes part without
// bounds. Most units are far from every signpost in the window; a unit is
// looked at closely only when its signposts s(f-1), s(f) or s(f+1) may lie
// in it (s(f) is in [f, f+1] for every method).
func (j *divisorRun) collectPlain(inv, cn, ch float64, limit int) (sum int) {
	h := j.pr.h
	hf := float64(h)
	a, sT := j.a, j.sT
	t0 := len(sT) - 1
	// A seat is in the window when its signpost is within x·wc of x.
	wc := max(cn-1, 1-ch)
	for i, p := range j.pr.pops {
		x := min(float64(p)*inv, hf)
		f := int(x)
		t := min(f, t0)
		ds := sT[t] + float64(f-t) - x
		k := min(f+int(math.Float64bits(ds)>>63), h)
		a[i] = k
		sum += k
		// The distance from x to s(f) and to the ends of its cell, which
		// bound s(f-1) and s(f+1), compared as the bits of non-negative
		// floats.
		near := min(math.Float64bits(math.Abs(ds)), math.Float64bits(float64(f+1)-x), math.Float64bits(x-float64(f)))
		if near > math.Float64bits(x*wc) {
			continue
		}
		if p != 0 {
			j.gather(i, p, x, k, 0, h, cn, ch, limit)
		}
	}
	return sum
}

// gather adds the seats of unit i (population p, quotient x at the
// divisor, k seats within [lo, hi]) whose floating-point priority lies in
// the window of collect: next seats s(q) < x·cn and held seats
// s(q-1) > x·ch.
func (j *divisorRun) gather(i int, p uint64, x float64, k, lo, hi int, cn, ch float64, limit int) {
	pf := float64(p)
	if k < hi && j.sf(k) < x*cn && len(j.next) <= limit {
		for q := k; q < hi && j.sf(q) < x*cn; q++ {
			j.next = append(j.next, nearSeat{pf / j.sf(q), int32(i)})
		}
	}
	if k > lo && j.sf(k-1) > x*ch && len(j.held) <= limit {
		for q := k; q > lo && j.sf(q-1) > x*ch; q-- {
			j.held = append(j.held, nearSeat{pf / j.sf(q-1), int32(i)})
		}
	}
}

// firstSeats puts the m seats that come first (highest value first when
// desc, lowest first otherwise), or all of them if there are fewer, at the
// front of seats in that order. Few are wanted after a good estimate, and
// picking them costs less than sorting the window.
func firstSeats(seats []nearSeat, m int, desc bool) {
	before := func(x, y nearSeat) bool { return x.v < y.v }
	if desc {
		before = func(x, y nearSeat) bool { return x.v > y.v }
	}
	if m > firstSeatsByInsertion {
		slices.SortFunc(seats, func(x, y nearSeat) int {
			if desc {
				return cmp.Compare(y.v, x.v)
			}
			return cmp.Compare(x.v, y.v)
		})
		return
	}
	m = min(m, len(seats))
	for i := range seats {
		// seats[:min(i, m)] holds the first of seats[:i], in order.
		var x nearSeat
		var j int
		switch {
		case i < m:
			x, j = seats[i], i
		case before(seats[i], seats[m-1]):
			x, j = seats[i], m-1
			seats[i] = seats[m-1] // no longer among the first m
		default:
			continue
		}
		for ; j > 0 && before(x, seats[j-1]); j-- {
			seats[j] = seats[j-1]
		}
		seats[j] = x
	}
}

// Up to this many seats, firstSeats picks by insertion; beyond, it sorts.
const firstSeatsByInsertion = 32
