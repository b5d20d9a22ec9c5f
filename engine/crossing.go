package engine

import (
	"cmp"
	"math/bits"
	"slices"
	"sort"
)

// This file selects a margin's crossing from the claim table
// (claimtable.go) instead of searching for it by counting: the claim
// whose crossing with unit i's brings the count (claims.go) to what the
// margin asks for is found among the few claims whose crossings may be it,
// compared as exact fractions.

// A crossing is where a claim crosses unit i's: after num/den people of
// change (a whole number under the Droop quota, den 1).
type crossing struct {
	num u128
	den uint64
}

// cmpCrossing compares two crossings exactly.
func cmpCrossing(x, y crossing) int {
	a2, a1, a0 := mul192(x.num, y.den)
	b2, b1, b0 := mul192(y.num, x.den)
	switch {
	case a2 != b2:
		return cmp.Compare(a2, b2)
	case a1 != b1:
		return cmp.Compare(a1, b1)
	}
	return cmp.Compare(a0, b0)
}

// mul192 returns x·y as three 64-bit words, high first.
func mul192(x u128, y uint64) (uint64, uint64, uint64) {
	h1, l1 := bits.Mul64(x.lo, y)
	h2, l2 := bits.Mul64(x.hi, y)
	mid, c := bits.Add64(h1, l2, 0)
	return h2 + c, mid, l1
}

// A crossSel asks claimTable.selectCrossing for the r-th claim of the other
// units to cross unit i's claim on its (s+1)-th seat, scanning the table
// away from the key g: up for the claims at or above unit i's, which fall
// below it as it grows; down for those below, which rise above it as it
// shrinks. A claim at distance d = |key - g| on its (k+1)-th seat crosses
// after d/(H-s+k) people under Hamilton (the keys are H times the claims
// in people); under the Droop quota, within a stretch where the quota is
// Q0 + Δ, after d - k·|Δ| people. Only the crossings after from (up: at or
// after; down: strictly after) are in play.
type crossSel struct {
	up    bool
	g     uint64
	s, r  int
	delta uint64 // |Δ| for the Droop quota
	from  uint64
}

// value is the crossing of a claim at distance d on seat k+1; false when
// it lies before zero.
func (t *claimTable) value(q crossSel, d uint64, k int) (crossing, bool) {
	if t.m == Hamilton {
		return crossing{u128{0, d}, uint64(t.h-q.s) + uint64(k)}, true
	}
	sh := uint64(k) * q.delta
	if sh > d {
		return crossing{}, false
	}
	return crossing{u128{0, d - sh}, 1}, true
}

// inPlay reports whether the crossing v is in play.
func (q crossSel) inPlay(v crossing) bool {
	c := cmpCrossing(v, crossing{u128{0, q.from}, 1})
	return c > 0 || (c == 0 && q.up)
}

// selectCrossing returns the r-th crossing in play (r >= 1) among the
// claims of the other units: the table's, those of the units counted apart,
// and none of those above or below the table, which it checks lie beyond.
// False when the table cannot tell, and the count must search.
//
// A claim's crossing rises with its distance d, within bounds: between
// d/(H-s+kmax) and d/(H-s) under Hamilton, between d - kmax·|Δ| and d
// under the Droop quota. The r-th claim surely in play in scan order bounds
// the r-th crossing from above (U); the m-th claim in scan order, with m
// the r less the apart claims up to U, from below (L). The claims whose
// bounds lie below L are counted by their place in the table, and only
// those whose bounds meet [L, U] are compared exactly.
func (t *claimTable) selectCrossing(c *claimPass, q crossSel) (crossing, bool) {
	n := len(t.keys)
	a := sort.Search(n, func(e int) bool { return t.keys[e] >= q.g })
	size := n - a // the entries in scan order
	if !q.up {
		size = a
	}
	entry := func(j int) int { // the j-th entry in scan order
		if q.up {
			return a + j
		}
		return a - 1 - j
	}
	dist := func(e int) uint64 {
		if q.up {
			return t.keys[e] - q.g
		}
		return q.g - t.keys[e]
	}
	// before counts the entries in scan order closer than d.
	before := func(d u128) int {
		if d.hi != 0 {
			return size
		}
		if q.up {
			if d.lo > ^uint64(0)-q.g {
				return size
			}
			k := q.g + d.lo
			return sort.Search(n, func(e int) bool { return t.keys[e] >= k }) - a
		}
		if d.lo > q.g {
			return size
		}
		// Closer than d: keys above g - d.
		k := q.g - d.lo
		return a - sort.Search(n, func(e int) bool { return t.keys[e] > k })
	}
	// Unit i's own claims in the table are not another unit's: their
	// distances.
	var own [5]uint64
	nOwn := 0
	if f := int(t.whole[c.i]); f >= 0 {
		for k := max(0, f-2); k <= f+2; k++ {
			key := t.key(t.pops[c.i], k)
			if q.up && key >= q.g {
				own[nOwn], nOwn = key-q.g, nOwn+1
			} else if !q.up && key < q.g {
				own[nOwn], nOwn = q.g-key, nOwn+1
			}
		}
	}
	ownBefore := func(d u128) int {
		cnt := 0
		for _, x := range own[:nOwn] {
			if d.hi != 0 || x < d.lo {
				cnt++
			}
		}
		return cnt
	}
	others := func(from, to u128) int { // claims of others at distances in [from, to)
		return before(to) - before(from) - (ownBefore(to) - ownBefore(from))
	}
	// nth returns the distance of the r-th claim of another unit at a
	// distance of at least from.
	nth := func(from u128, r int) (uint64, bool) {
		j := before(from) + r - 1
		for range 8 {
			if j >= size {
				return 0, false
			}
			d := dist(entry(j))
			got := others(from, u128{0, d}.plus(1))
			if got >= r {
				return d, true
			}
			j += r - got
		}
		return 0, false
	}
	kmax := uint64(t.kmax)
	h0 := uint64(t.h - q.s) // under Hamilton a claim on seat k+1 crosses at d/(h0+k)
	// sure: the distance from which every claim is in play.
	var sure u128
	switch {
	case t.m == Droop:
		sure = mul128(kmax, q.delta).plus(q.from)
		if !q.up {
			sure = sure.plus(1)
		}
	case !q.up:
		sure = u128{0, 1}
	}
	du, ok := nth(sure, q.r)
	if !ok {
		return crossing{}, false
	}
	upper := crossing{u128{0, du}, 1}
	if t.m == Hamilton {
		upper.den = h0
	}
	// The claims of the units counted apart, in play, up to U.
	cands := c.cands[:0]
	defer func() { c.cands = cands[:0] }()
	for _, j := range t.big {
		if j != c.i && !t.apartCrossings(c, q, j, upper, &cands) {
			return crossing{}, false
		}
	}
	// Closer than from, a claim crosses before from: out of play.
	start := u128{0, q.from}
	if !q.up {
		start = start.plus(1)
	}
	lower := crossing{u128{0, q.from}, 1}
	if m := q.r - len(cands); m >= 1 {
		dm, ok := nth(start, m)
		if !ok {
			return crossing{}, false
		}
		lm := crossing{}
		if t.m == Hamilton {
			lm = crossing{u128{0, dm}, h0 + kmax}
		} else if sh := mul128(kmax, q.delta); sh.cmp(u128{0, dm}) < 0 {
			lm = crossing{u128{0, dm - sh.lo}, 1}
		}
		if cmpCrossing(lm, lower) > 0 {
			lower = lm
		}
	}
	below := 0
	kept := cands[:0]
	for _, v := range cands {
		if cmpCrossing(v, lower) < 0 {
			below++
		} else {
			kept = append(kept, v)
		}
	}
	cands = kept
	// Below the distance d1 a claim crosses before L; beyond d2, after U.
	var d1, d2 u128
	if t.m == Hamilton {
		// d/h0 < L = num/den: d < num·h0/den, rounded up.
		x, ok := lower.num.mulSmall(h0)
		if !ok {
			return crossing{}, false
		}
		var r uint64
		d1, r = x.div64(lower.den)
		if r != 0 {
			d1 = d1.plus(1)
		}
		// d/(h0+kmax) > U = du/h0: d > du·(h0+kmax)/h0.
		d2, _ = mul128(du, h0+kmax).div64(h0)
	} else {
		d1 = lower.num
		d2 = mul128(kmax, q.delta).plus(du)
	}
	j1, j2 := before(d1), before(d2.plus(1))
	if j2 >= size {
		return crossing{}, false // claims past the table might cross before U
	}
	// Every claim closer than d1 crosses before L: those surely in play
	// are counted by their place, the others looked at.
	js := before(sure)
	if j1 > js {
		below += others(sure, d1)
	}
	look := func(j int) (crossing, bool) {
		e := entry(j)
		if int(t.us[e]) == c.i {
			return crossing{}, false
		}
		v, ok := t.value(q, dist(e), int(t.ks[e]))
		return v, ok && q.inPlay(v)
	}
	for j := before(start); j < min(j1, js); j++ {
		if _, ok := look(j); ok {
			below++
		}
	}
	for j := j1; j < j2; j++ {
		v, ok := look(j)
		if !ok {
			continue
		}
		if cmpCrossing(v, lower) < 0 {
			below++
		} else if cmpCrossing(v, upper) <= 0 {
			cands = append(cands, v)
		}
	}
	want := q.r - below
	if want < 1 || want > len(cands) {
		return crossing{}, false
	}
	slices.SortFunc(cands, cmpCrossing)
	return cands[want-1], true
}

// apartCrossings appends the crossings in play, up to upper, of the claims
// of unit j, one of the units the table counts apart; false when there are
// too many to list.
func (t *claimTable) apartCrossings(c *claimPass, q crossSel, j int, upper crossing, out *[]crossing) bool {
	pi, pj := t.pops[c.i], c.pops[j]
	// Unit j's claims at or above unit i's at the reference point: those of
	// seat index below kk.
	var kk int64
	if t.m == Hamilton {
		d := int64(pj) - int64(pi)
		kk = floorDiv(d, t.total, uint64(t.h)) + int64(q.s) + 1
	} else {
		qq := t.q0 + q.delta
		if !q.up {
			qq = t.q0 - q.delta
		}
		d := int64(pj) - int64(pi) - int64(q.from)
		if !q.up {
			d = int64(pj) - int64(pi) + int64(q.from)
		}
		kk = floorDiv(d, u128{0, qq}, 1) + int64(q.s) + 1
	}
	kk = max(kk, 0) // a unit has no claims below seat one
	for step := 0; step < 4*MaxWarmContest; step++ {
		k := kk - 1 - int64(step) // up: the claims at or above, the lowest first
		if !q.up {
			k = kk + int64(step) // down: the claims below, the highest first
		}
		if k < 0 {
			return true
		}
		v, ok := t.apartValue(c, q, pj, int(k))
		if !ok || !q.inPlay(v) {
			continue
		}
		if cmpCrossing(v, upper) > 0 {
			return true
		}
		*out = append(*out, v)
	}
	return false
}

// apartValue is the crossing of the claim on seat k+1 of a unit with
// population pj counted apart.
func (t *claimTable) apartValue(c *claimPass, q crossSel, pj uint64, k int) (crossing, bool) {
	pi := t.pops[c.i]
	s := q.s
	if t.m == Hamilton {
		// d = |(p_j - p_i)·H - (k - s)·P|, over H - s + k.
		x := mul128(pj, uint64(t.h))
		y := mul128(pi, uint64(t.h))
		if k >= s {
			y, _ = y.add(mul128(uint64(k-s), t.total.lo))
		} else {
			x, _ = x.add(mul128(uint64(s-k), t.total.lo))
		}
		if q.up != (x.cmp(y) >= 0) {
			return crossing{}, false
		}
		d := x.sub(y)
		if !q.up {
			d = y.sub(x)
		}
		return crossing{d, uint64(t.h-s) + uint64(k)}, true
	}
	// Droop, quota Q = Q0 ± |Δ|: up, Y = p_j - p_i + (s - k)·Q; down,
	// Z = p_i - p_j + (k - s)·Q.
	qq := t.q0 + q.delta
	if !q.up {
		qq = t.q0 - q.delta
	}
	x, y := u128{0, pj}, u128{0, pi}
	if k >= s {
		y, _ = y.add(mul128(uint64(k-s), qq))
	} else {
		x, _ = x.add(mul128(uint64(s-k), qq))
	}
	if q.up != (x.cmp(y) >= 0) {
		return crossing{}, false
	}
	if q.up {
		return crossing{x.sub(y), 1}, true
	}
	return crossing{y.sub(x), 1}, true
}

// hamiltonChange finds from the table, under Hamilton, the least change in
// [x, e] at which unit i's count of claims at or above its (s+1)-th falls
// to k (dir > 0) or rises to k (dir < 0): the crossing of the claim that
// brings it there, counted from unit i's own population. decided is false
// when the table cannot tell.
func (t *claimTable) hamiltonChange(c *claimPass, s, k, dir int, x, e uint64) (y uint64, found, decided bool) {
	pi := t.pops[c.i]
	n0, ok := t.count(c, pi, s)
	if !ok {
		return 0, false, false
	}
	// g: unit i's claim as a key, p_i·H - s·P + 2P.
	g, ok := mul128(pi, uint64(t.h)).add(u128{0, 2 * t.unit})
	sp := mul128(uint64(s), t.unit)
	if !ok || sp.cmp(g) > 0 || g.sub(sp).hi != 0 {
		return 0, false, false
	}
	q := crossSel{up: dir > 0, g: g.sub(sp).lo, s: s}
	if dir > 0 {
		q.r = n0 - k
	} else {
		q.r = k - n0
		if q.r <= 0 {
			return x, true, true // the seat is not held outright even now
		}
	}
	if q.r <= 0 {
		return 0, false, false
	}
	v, ok := t.selectCrossing(c, q)
	if !ok {
		return 0, false, false
	}
	// Adding people, the claim drops out after v: at floor(v)+1. Taking
	// them away, it comes in at v: at ceil(v).
	z, r := v.num.div64(v.den)
	if z.hi != 0 {
		return 0, false, true
	}
	y = z.lo
	if dir > 0 || r != 0 {
		y++
	}
	if y < x {
		return 0, false, false
	}
	if y > e {
		return 0, false, true
	}
	return y, true, true
}

// droopChange is hamiltonChange under the Droop quota, within [lo, hi],
// a stretch over which the quota stays the same.
func (t *claimTable) droopChange(c *claimPass, s, k, dir int, lo, hi uint64) (y uint64, found, decided bool) {
	p := t.pops[c.i] + lo
	if dir < 0 {
		p = t.pops[c.i] - lo
	}
	n0, ok := t.count(c, p, s)
	if !ok {
		return 0, false, false
	}
	tot, _ := c.rest.add64(p)
	qq := droopQuota(tot, t.h, t.sc)
	if qq.hi != 0 {
		return 0, false, false
	}
	q := crossSel{up: dir > 0, s: s, from: lo}
	if dir > 0 {
		q.r = n0 - k
		if q.r <= 0 {
			return lo, true, true
		}
		if qq.lo < t.q0 {
			return 0, false, false
		}
		q.delta = qq.lo - t.q0
	} else {
		q.r = k - n0
		if q.r <= 0 {
			return lo, true, true
		}
		if qq.lo > t.q0 {
			return 0, false, false
		}
		q.delta = t.q0 - qq.lo
	}
	// g: unit i's claim at its own population as a key, p_i - s·Q + 2Q0.
	g, _ := u128{0, t.pops[c.i]}.add64(2 * t.q0)
	sq := mul128(uint64(s), qq.lo)
	if sq.cmp(g) > 0 || g.sub(sq).hi != 0 {
		return 0, false, false
	}
	q.g = g.sub(sq).lo
	v, ok := t.selectCrossing(c, q)
	if !ok || v.num.hi != 0 {
		return 0, false, false
	}
	y = v.num.lo
	if dir > 0 {
		y++ // the claim drops out after v
	}
	if y < lo || y > hi {
		return 0, false, false
	}
	return y, true, true
}
