package engine

import (
	"math"
	"math/bits"
	"slices"
	"sync"
)

// This file holds the jump-and-step form of the divisor procedure, used
// when the seat order is not asked for. Instead of handing out the seats
// one at a time it
//
//  1. estimates, in floating point, a divisor at which the roundings of
//     the populations (clamped to the bounds) add up to the house size:
//     a few safeguarded Newton steps, then one pass that picks the seats
//     still missing (or in excess) from the priority values nearest the
//     estimate. This is an estimate only; no seat depends on it.
//  2. fixes an exact divisor D at the estimate (a dyadic rational X/2^s,
//     the estimate's own value to 53 bits, or for Huntington–Hill such a
//     D^2; a virtual unit's priority value when the shift would not keep
//     the comparisons in 128 bits) and
//     rounds every unit at D exactly, starting from the floating-point
//     rounding and correcting it by exact comparisons with D, so that
//     every seat a unit holds beyond its minimum has priority at least D
//     and every next seat below its maximum has priority at most D.
//  3. steps to the house size: if the seats do not add up, it hands the
//     missing seats to the greatest next priorities, or takes the surplus
//     back from the least held priorities, one at a time with a heap of
//     exact priorities. Both steps keep the result consistent (no next
//     seat has a greater priority than a held one), and a consistent
//     result of the right size is what the sequential procedure gives,
//     up to the seats at a tie.
//  4. detects a tie exactly (the least held priority equals the greatest
//     next priority), gives the tied seats to the tied units in input
//     order, as the sequential procedure hands them out, and settles the
//     tie as the sequential procedure does.
//
// The outcome equals the sequential procedure's in every field but the seat
// order, which it does not record.

// jumpTable is the most seat counts whose floating-point signposts are
// tabulated for the estimate.
const jumpTable = 1 << 14

// signpostTables holds each divisor method's floating-point signposts
// s(0), ..., s(jumpTable-1), computed once on first use.
var signpostTables [ModifiedSainteLague + 1]struct {
	once sync.Once
	t    []float64
}

// signpostTable returns the floating-point signposts of m, shared and
// read-only.
func signpostTable(m Method) []float64 {
	e := &signpostTables[m]
	e.once.Do(func() {
		e.t = make([]float64, jumpTable)
		for k := range e.t {
			e.t[k] = warmSignpostFloat(m, k)
		}
	})
	return e.t
}

// divisorJump runs the divisor procedure by jump and step.
func (pr *problem) divisorJump() (*divisorOutcome, error) {
	n := pr.n()
	a := make([]int, n)
	given := 0
	plain := true // every unit takes part, with no minimum and no maximum
	var total float64
	for i, p := range pr.pops {
		if !pr.eligible[i] {
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
	if free < 0 {
		return nil, scenarioError("min", "the minimums exceed the house size")
	}
	out := &divisorOutcome{free: free, seats: a, full: a}
	if free == 0 {
		return out, nil
	}
	room := 0 // seats the units with people can take beyond their minimums
	for i, p := range pr.pops {
		if pr.eligible[i] && p > 0 && a[i] < pr.max[i] {
			room += min(pr.max[i]-a[i], free)
			if room >= free {
				break
			}
		}
	}
	if room < free {
		return nil, scenarioError("max", "the maximums leave seats that no unit with people can take")
	}
	j := &jumper{pr: pr, a: a, plain: plain}
	d := j.estimate(total)
	cut := newCut(pr, d)
	sum, onHeld, onNext := j.round(&cut)
	tied, err := j.step(sum)
	if err != nil {
		return nil, err
	}
	if sum == pr.h {
		tied = onHeld && onNext
	}
	if tied {
		pr.jumpTie(out)
	}
	return out, nil
}

// jumper holds the state of one jump-and-step run.
type jumper struct {
	pr    *problem
	a     []int
	plain bool
	total float64 // the population taking part, in floating point
	// sT holds the floating-point signposts s(k) for k < len(sT); beyond,
	// s(k) is taken as s(len(sT)-1) + k - (len(sT)-1), exact for the
	// linear signposts and within 10^-5 for Dean and Huntington–Hill.
	sT         []float64
	next, held []jumpSeat // seats near the estimate (see collect)
	idx        []int32
}

// jumpSeat is a seat of unit u with floating-point priority v.
type jumpSeat struct {
	v float64
	u int32
}

// sf is s(k) in floating point, as the estimate takes it.
func (j *jumper) sf(k int) float64 {
	t := min(k, len(j.sT)-1)
	return j.sT[t] + float64(k-t)
}

// roundF rounds x (at most the house size) at the signposts in floating
// point: the number of signposts below x.
func (j *jumper) roundF(x float64) int {
	f := int(x)
	t := min(f, len(j.sT)-1)
	// One more when s(f) < x: the sign bit of s(f) - x.
	return f + int(math.Float64bits(j.sT[t]+float64(f-t)-x)>>63)
}

// evalSum returns the sum of the floating-point roundings at the divisor d,
// clamped to the bounds, and the sum of the quotients p/d of the units not
// held at a bound (the slope of the sum in log d).
func (j *jumper) evalSum(d float64) (sum int, slope float64) {
	pr := j.pr
	inv := 1 / d
	hf := float64(pr.h)
	if j.plain {
		for _, p := range pr.pops {
			sum += j.roundF(min(float64(p)*inv, hf))
		}
		return sum, j.total * inv
	}
	for i, p := range pr.pops {
		if !pr.eligible[i] {
			continue
		}
		lo := pr.min[i]
		if p == 0 {
			sum += lo
			continue
		}
		hi := min(pr.max[i], pr.h)
		x := min(float64(p)*inv, hf)
		k := j.roundF(x)
		switch {
		case k <= lo:
			k = lo
		case k >= hi:
			k = hi
		default:
			slope += x
		}
		sum += k
	}
	return sum, slope
}

// estimate finds, in floating point, a divisor at which the roundings add
// up to the house size, leaving the roundings at it in j.a; when ties (or
// floating-point limits) leave none, it returns the best divisor found.
func (j *jumper) estimate(total float64) float64 {
	pr := j.pr
	j.sT = signpostTable(pr.m)
	d := total / float64(pr.h)
	if !(d > 0) || math.IsInf(d, 0) {
		d = 1
	}
	lo, hi := 0.0, math.Inf(1) // the sum exceeds h at lo and falls short at hi
	j.total = total
	sum, slope := j.evalSum(d)
	diff := sum - pr.h
	for iter, widen := 0, 1.0; iter < 40; iter++ {
		if diff > 0 {
			lo = d
		} else if diff < 0 {
			hi = d
		}
		nd := d
		if diff != 0 {
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
			if !(nd > 0) || math.IsInf(nd, 0) {
				break
			}
		}
		// Collect the seats near nd: about four times the square root of
		// the seats now missing, as a Newton step leaves about that many.
		want := (4*math.Sqrt(math.Abs(float64(diff))) + 64) * widen
		w := min(want/max(slope, 1), 0.25)
		ndiff, nslope, e, ok := j.collect(nd, w, int(8*want)+256)
		if ok {
			return e
		}
		if ndiff == diff && nd == d {
			widen *= 4
		}
		d, diff, slope = nd, ndiff, nslope
		if !math.IsInf(hi, 0) && hi-lo <= hi*0x1p-45 {
			break // a bracket this narrow holds a tie, or float limits
		}
	}
	j.collect(d, 0, 0)
	return d
}

// collect rounds every unit at the divisor d in floating point into j.a
// and gathers the seats whose floating-point priority lies within the
// relative window w of d: next seats above d(1-w) and held seats below
// d(1+w), up to limit on each side. If the roundings miss the house size by
// fewer seats than it gathered on the side that makes up the difference, it
// moves those seats in j.a and returns a divisor between the last seat
// moved and the next one, and ok. It returns the sum of the roundings less
// the house size, and the slope as evalSum does.
func (j *jumper) collect(d, w float64, limit int) (diff int, slope, e float64, ok bool) {
	pr, a := j.pr, j.a
	inv := 1 / d
	hf := float64(pr.h)
	cn, ch := 1/(1-w), 1/(1+w) // next seat k in window: s(k) < x·cn; held: s(k-1) > x·ch
	j.next, j.held = j.next[:0], j.held[:0]
	sum := 0
	if j.plain {
		sum = j.collectPlain(inv, cn, ch, limit)
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
	if j.plain {
		slope = j.total * inv
	}
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
func (j *jumper) collectPlain(inv, cn, ch float64, limit int) (sum int) {
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
func (j *jumper) gather(i int, p uint64, x float64, k, lo, hi int, cn, ch float64, limit int) {
	pf := float64(p)
	if k < hi && j.sf(k) < x*cn && len(j.next) <= limit {
		for q := k; q < hi && j.sf(q) < x*cn; q++ {
			j.next = append(j.next, jumpSeat{pf / j.sf(q), int32(i)})
		}
	}
	if k > lo && j.sf(k-1) > x*ch && len(j.held) <= limit {
		for q := k; q > lo && j.sf(q-1) > x*ch; q-- {
			j.held = append(j.held, jumpSeat{pf / j.sf(q-1), int32(i)})
		}
	}
}

func cmpFloat(x, y float64) int {
	switch {
	case x < y:
		return -1
	case x > y:
		return 1
	}
	return 0
}

// A cut is an exact divisor D that units are compared with.
type cut struct {
	m    Method
	kind uint8
	// D = x/2^s (s >= 0) or x·2^-s (s < 0) for the fast kinds; for
	// Huntington–Hill, D^2.
	x uint64
	s int
	// D = vp/s(vk), a virtual unit's priority value, for the general kind.
	vp uint64
	vk int
	vs signpost
}

const (
	cutGeneral uint8 = iota
	cutLinear        // s(k) = n/d with n < 2^33 and d <= 10
	cutDean
	cutHill
)

// newCut fixes an exact divisor at (or very near) the floating-point value
// d > 0.
func newCut(pr *problem, d float64) cut {
	m := pr.m
	c := cut{m: m}
	switch m {
	case Dean:
		c.kind = cutDean
	case HuntingtonHill:
		// Huntington–Hill compares squares: the cut holds D^2.
		c.kind = cutHill
		d *= d
	default:
		c.kind = cutLinear
	}
	frac, exp := math.Frexp(d)
	c.x = uint64(math.Ldexp(frac, 53))
	c.s = 53 - exp
	if c.x == 0 || c.s > 64 || c.s < -64 || math.IsNaN(d) || math.IsInf(d, 0) {
		c.kind = cutGeneral
	}
	if c.kind != cutGeneral {
		return c
	}
	// A virtual unit with population vp and vk seats: vp·vk within 2^57 of
	// the largest population keeps most comparisons in 128 bits.
	var qmax uint64
	for _, p := range pr.pops {
		qmax = max(qmax, p)
	}
	k := uint64(1) << 30
	if qmax > 0 {
		k = min(k, (uint64(1)<<57)/qmax)
	}
	c.vk = int(max(k, 1))
	c.vs = m.signpost(c.vk)
	if m == HuntingtonHill {
		d = math.Sqrt(d)
	}
	pf := math.Round(d * warmSignpostFloat(m, c.vk))
	switch {
	case !(pf >= 1):
		c.vp = 1
	case pf >= 1<<63:
		c.vp = 1 << 63
	default:
		c.vp = uint64(pf)
	}
	return c
}

// shl returns x·2^s as 128 bits (0 <= s <= 64) and whether it fits.
func shl(hi, lo uint64, s int) (u128, bool) {
	switch {
	case s == 0:
		return u128{hi, lo}, true
	case s == 64:
		return u128{lo, 0}, hi == 0
	}
	if hi>>(64-s) != 0 {
		return u128{}, false
	}
	return u128{hi<<s | lo>>(64-s), lo << s}, true
}

// cmp compares the priority value p/s(k) of a unit with population p > 0
// with D exactly.
func (c *cut) cmp(p uint64, k int) int {
	if forceBig {
		return c.cmpBig(p, k)
	}
	switch c.kind {
	case cutLinear:
		var n, d uint64
		switch c.m {
		case Jefferson:
			n, d = uint64(k)+1, 1
		case Adams:
			if k == 0 {
				return 1
			}
			n, d = uint64(k), 1
		case ModifiedSainteLague:
			if k == 0 {
				n, d = 7, 10
				break
			}
			n, d = 2*uint64(k)+1, 2
		default: // Webster
			n, d = 2*uint64(k)+1, 2
		}
		// p·d against x·n·2^-s.
		return c.cmpScaled(0, p*d, n)
	case cutDean:
		if k == 0 {
			return 1
		}
		u := uint64(k)
		hi, lo := bits.Mul64(p, 2*u+1)
		return c.cmpScaled(hi, lo, 2*u*(u+1))
	case cutHill:
		if k == 0 {
			return 1
		}
		// p^2/(k(k+1)) against D^2.
		u := uint64(k)
		hi, lo := bits.Mul64(p, p)
		return c.cmpScaled(hi, lo, u*(u+1))
	}
	return cmpQuot(p, c.m.signpost(k), c.vp, c.vs)
}

// cmpScaled compares L = (hi,lo) (a population times a signpost
// denominator) with x·n·2^-s.
func (c *cut) cmpScaled(hi, lo, n uint64) int {
	r := mul128(c.x, n)
	if c.s >= 0 {
		l, ok := shl(hi, lo, c.s)
		if !ok {
			return 1
		}
		return l.cmp(r)
	}
	rr, ok := shl(r.hi, r.lo, -c.s)
	if !ok {
		return -1
	}
	return u128{hi, lo}.cmp(rr)
}

// cmpBig is cmp in math/big arithmetic, for the tests that force it.
func (c *cut) cmpBig(p uint64, k int) int {
	if c.kind == cutGeneral {
		return cmpQuot(p, c.m.signpost(k), c.vp, c.vs)
	}
	s := c.m.signpost(k)
	if s.n == 0 {
		return 1
	}
	// p/s against x·2^-s, s(k) = n/d: p·d·2^s against x·n; for
	// Huntington–Hill (s(k)^2 = n), p^2·2^s against x·n.
	l, r := bigU(p), bigU(c.x)
	if s.sq {
		l.Mul(l, l)
		r.Mul(r, bigU(s.n))
		if c.s >= 0 {
			l.Lsh(l, uint(c.s))
		} else {
			r.Lsh(r, uint(-c.s))
		}
		return l.Cmp(r)
	}
	l.Mul(l, bigU(s.d))
	r.Mul(r, bigU(s.n))
	if c.s >= 0 {
		l.Lsh(l, uint(c.s))
	} else {
		r.Lsh(r, uint(-c.s))
	}
	return l.Cmp(r)
}

// round rounds every unit at the exact divisor, starting from the seats in
// j.a, and returns their sum and whether a held seat and a next seat have
// priority exactly D.
func (j *jumper) round(c *cut) (sum int, onHeld, onNext bool) {
	if j.plain && c.kind != cutGeneral && 0 < c.s && c.s < 64 && !forceBig {
		return j.roundFast(c)
	}
	pr, a := j.pr, j.a
	for i, p := range pr.pops {
		if !pr.eligible[i] {
			continue
		}
		lo := pr.min[i]
		if p == 0 {
			a[i] = lo
			sum += lo
			continue
		}
		hi := min(pr.max[i], pr.h)
		k, eh, en := c.fix(p, a[i], lo, hi)
		onHeld, onNext = onHeld || eh, onNext || en
		a[i] = k
		sum += k
	}
	return sum, onHeld, onNext
}

// fix rounds one unit with population p > 0 at the exact divisor, starting
// from k seats, within [lo, hi]: it takes seats back while the last one
// held is below D and adds seats while the next one is above D. It reports
// whether the held or the next seat it stops at has priority exactly D.
func (c *cut) fix(p uint64, k, lo, hi int) (int, bool, bool) {
	k = min(max(k, lo), hi)
	heldEq, nextEq := false, false
	moved := false
	for k > lo {
		r := c.cmp(p, k-1)
		heldEq = r == 0
		if r >= 0 {
			break
		}
		k--
		moved = true
	}
	if !moved {
		for k < hi {
			r := c.cmp(p, k)
			nextEq = r == 0
			if r <= 0 {
				break
			}
			k++
		}
	}
	return k, heldEq, nextEq
}

// sign128 returns the sign of a - b for 128-bit a and b, without branches.
func sign128(ah, al, bh, bl uint64) int {
	_, lt := bits.Sub64(al, bl, 0)
	_, lt = bits.Sub64(ah, bh, lt)
	_, gt := bits.Sub64(bl, al, 0)
	_, gt = bits.Sub64(bh, ah, gt)
	return int(gt) - int(lt)
}

// roundFast is round for every unit taking part without bounds, with the
// comparisons written out for a cut x/2^s with 0 < s < 64. p/s(k) against
// the cut is L(k)·2^s against x·n(k), with
//
//	s(k) = n(k)/g, n(k) = αk + β:  L = p·g (the modified first signpost
//	                                 7/10 as 7/10, the others (10k+5)/10)
//	Dean, n(k) = 2k(k+1):          L(k) = p(2k+1)
//	Huntington–Hill, n(k) = k(k+1): L = p^2 (the cut holds D^2)
//
// The loops check that the seats from the estimate are the seats at the
// cut with every priority strictly on its side; a unit that fails (its
// estimate is off, a priority equals D, it holds the whole house or has
// no people) is rounded afterwards by fix, which also notes equalities.
func (j *jumper) roundFast(c *cut) (sum int, onHeld, onNext bool) {
	h, x := j.pr.h, c.x
	sh := uint(c.s) & 63
	rs := (64 - sh) & 63
	a, pops := j.a, j.pr.pops
	bad := j.idx[:0]
	switch c.kind {
	case cutLinear:
		var al, be, g, e7 uint64 // e7 = n(0) - β for the modified first signpost
		switch c.m {
		case Jefferson:
			al, be, g = 1, 1, 1
		case Adams:
			al, be, g = 1, 0, 1
		case ModifiedSainteLague:
			al, be, g, e7 = 10, 5, 10, 2
		default:
			al, be, g = 2, 1, 2
		}
		for i, p := range pops {
			k := a[i]
			v := p * g
			lh, ll := v>>rs, v<<sh
			// Branch-free in k, as many units hold no seat (or one): with
			// no held seat, n = 0 puts the held side below L.
			var mask, eh, en uint64
			if k > 0 {
				mask = ^uint64(0)
			}
			if k == 1 {
				eh = e7
			}
			if k == 0 {
				en = e7
			}
			rh, rl := bits.Mul64(x, (al*uint64(k-1)+be+eh)&mask)
			_, below := bits.Sub64(rl, ll, 0)
			_, below = bits.Sub64(rh, lh, below) // held seat above D
			nh, nl := bits.Mul64(x, al*uint64(k)+be+en)
			_, above := bits.Sub64(ll, nl, 0)
			_, above = bits.Sub64(lh, nh, above) // next seat below D
			if below&above == 0 || p == 0 || k >= h {
				bad = append(bad, int32(i))
				continue
			}
			sum += k
		}
	case cutHill:
		for i, p := range pops {
			k := a[i]
			ph, pl := bits.Mul64(p, p)
			lh, ll := ph<<sh|pl>>rs, pl<<sh
			u := uint64(k)
			rh, rl := bits.Mul64(x, (u-1)*u)
			_, below := bits.Sub64(rl, ll, 0)
			_, below = bits.Sub64(rh, lh, below)
			nh, nl := bits.Mul64(x, u*(u+1))
			_, above := bits.Sub64(ll, nl, 0)
			_, above = bits.Sub64(lh, nh, above)
			// k = 0 (no people) and an L beyond 128 bits go to fix.
			if below&above == 0 || k == 0 || k >= h || ph>>rs != 0 {
				bad = append(bad, int32(i))
				continue
			}
			sum += k
		}
	default: // Dean
		for i, p := range pops {
			k := a[i]
			u := uint64(k)
			hh, hl := bits.Mul64(p, 2*u-1)
			rh, rl := bits.Mul64(x, 2*(u-1)*u)
			_, below := bits.Sub64(rl, hl<<sh, 0)
			_, below = bits.Sub64(rh, hh<<sh|hl>>rs, below)
			nh2, nl2 := bits.Mul64(p, 2*u+1)
			nh, nl := bits.Mul64(x, 2*u*(u+1))
			_, above := bits.Sub64(nl2<<sh, nl, 0)
			_, above = bits.Sub64(nh2<<sh|nl2>>rs, nh, above)
			if below&above == 0 || k == 0 || k >= h || (nh2|hh)>>rs != 0 {
				bad = append(bad, int32(i))
				continue
			}
			sum += k
		}
	}
	for _, i := range bad {
		k := 0
		if p := pops[i]; p > 0 {
			var eh, en bool
			k, eh, en = c.fix(p, a[i], 0, h)
			onHeld, onNext = onHeld || eh, onNext || en
		}
		a[i] = k
		sum += k
	}
	j.idx = bad
	return sum, onHeld, onNext
}

// step hands out the missing seats to the greatest next priorities, or
// takes the surplus back from the least held priorities, one at a time,
// and reports whether the result ends in a tie.
func (j *jumper) step(sum int) (bool, error) {
	pr, a := j.pr, j.a
	if sum == pr.h {
		return false, nil
	}
	held := sum > pr.h
	h := heapOver(pr, a, held, j.idx)
	var last prio
	for sum != pr.h {
		if len(h.idx) == 0 {
			if held {
				return false, scenarioError("min", "the minimums exceed the house size")
			}
			return false, scenarioError("max", "the maximums leave seats that no unit with people can take")
		}
		u := h.top()
		if held {
			a[u]--
			last = prio{pr.pops[u], a[u]}
			sum--
			if a[u] > pr.min[u] {
				h.down(0)
			} else {
				h.pop()
			}
			continue
		}
		last = prio{pr.pops[u], a[u]}
		a[u]++
		sum++
		if a[u] < pr.max[u] {
			h.down(0)
		} else {
			h.pop()
		}
	}
	j.idx = h.idx
	// Adding: the last seat given is the least held priority and the top
	// of the heap the greatest next one. Taking back: the last seat taken
	// is the greatest next priority and the top the least held one.
	return len(h.idx) > 0 && pr.m.cmpPrio(h.key(0), last) == 0, nil
}

// heapOver builds a heap over the units that can gain a seat (held false:
// the greatest next priority on top) or give one back (held true: the
// least held priority beyond the minimum on top), in the scratch idx.
func heapOver(pr *problem, a []int, held bool, idx []int32) *warmHeap {
	idx = idx[:0]
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
	return h
}

// jumpTie handles a tie at the cut of the consistent seats in out.full: the
// seats held at the cut value go to the tied units in input order, as the
// sequential procedure hands them out, and the tie is settled as the
// sequential procedure settles it.
func (pr *problem) jumpTie(out *divisorOutcome) {
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

// firstSeats puts the m seats that come first (highest value first when
// desc, lowest first otherwise), or all of them if there are fewer, at the
// front of seats in that order. Few are wanted after a good estimate, and
// picking them costs less than sorting the window.
func firstSeats(seats []jumpSeat, m int, desc bool) {
	before := func(x, y jumpSeat) bool { return x.v < y.v }
	if desc {
		before = func(x, y jumpSeat) bool { return x.v > y.v }
	}
	if m > firstSeatsByInsertion {
		slices.SortFunc(seats, func(x, y jumpSeat) int {
			if desc {
				return cmpFloat(y.v, x.v)
			}
			return cmpFloat(x.v, y.v)
		})
		return
	}
	m = min(m, len(seats))
	for i := range seats {
		// seats[:min(i, m)] holds the first of seats[:i], in order.
		var x jumpSeat
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
