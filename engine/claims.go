package engine

import (
	"cmp"
	"math/big"
	"math/bits"
	"slices"
	"sort"
)

// This file counts claims, for the margins of the largest-remainder
// methods (margin.go).
//
// Under a largest-remainder method with quota Q (P/H for Hamilton, the
// Droop quota otherwise) a unit with population p has a claim p/Q - k on
// its (k+1)-th seat, for every k >= 0: the claims of at least 1 are its
// whole seats, the claim below 1 is its remainder, the rest are negative.
// The procedure hands the H seats to the H greatest claims: every whole
// part, then the largest remainders; equal claims at the cut are a tie,
// and a unit without people has no claims (it takes no seat). So unit i
// holds s+1 seats outright exactly when fewer than H-s claims of the other
// units rank at or above its (s+1)-th claim, p_i/Q - s. Unit j has
//
//	max(0, floor((p_j - p_i)/Q) + s + 1)
//
// such claims, a whole number that changes only where p_j/Q - k crosses
// p_i/Q - s: at a crossing point. With only unit i's population moving,
// the count is a step function of it, falling as it grows (Hamilton; the
// Droop quota within each stretch of totals where it is constant, and from
// one stretch end to the next), and the margin is where the count crosses
// H-s. The count costs a pass over the units (claimPass.count), or, for the
// scenario's own units, a binary search in a table of their claims near the
// cut (claimTable), made once for every margin.

// A claimPass is the pass of the largest-remainder procedure in which unit
// i's seats are decided, as the margins see it: its units, the seats they
// share, and their population other than unit i's.
type claimPass struct {
	m     Method
	pops  []uint64
	units []int // the pass's units, i among them
	i     int
	seats int
	rest  u128   // the population of the units other than i
	sc    uint64 // one person in scaled units, for the Droop quota
	// group, when some units have bounds, is what the pass does with a
	// unit's remainder seat whatever its remainder (the bounds prove it for
	// the stretch counted): 0 gives it (the unit needs it to reach its
	// minimum), 2 withholds it (the unit is at its maximum), 1 ranks the
	// remainder with the others'. nil without bounds.
	group []int8
	floor []int // the units' whole parts, when group is set
	tab   *claimTable
	cands []crossing // scratch for claimTable.selectCrossing
}

// quota returns the pass's quota with unit i at population p, as a
// fraction num/den of scaled people.
func (c *claimPass) quota(p uint64) (num u128, den uint64) {
	t, _ := c.rest.add64(p)
	if c.m == Hamilton {
		return t, uint64(c.seats)
	}
	return droopQuota(t, c.seats, c.sc), 1
}

// droopQuota is floor(t/(seats+1)) + 1 people, in scaled units (sc, one
// person, at most 10^9, and seats at most MaxSeats).
func droopQuota(t u128, seats int, sc uint64) u128 {
	q, _ := t.div64((uint64(seats) + 1) * sc)
	q, _ = q.add64(1)
	q, ok := q.mulSmall(sc)
	if !ok {
		return u128{^uint64(0), ^uint64(0)}
	}
	return q
}

// count returns how many claims of the pass's other units rank at or above
// unit i's (s+1)-th claim when i has population p (whether the pass can
// then be apportioned at all is feasible's question): from the table when
// it can tell, otherwise unit by unit.
func (c *claimPass) count(p uint64, s int) int {
	if c.tab != nil {
		if n, ok := c.tab.count(c, p, s); ok {
			return n
		}
	}
	num, den := c.quota(p)
	n := 0
	for _, j := range c.units {
		pj := c.pops[j]
		if j == c.i || pj == 0 {
			continue
		}
		var d int64
		if pj >= p {
			d = int64(pj - p)
		} else {
			d = -int64(p - pj)
		}
		if c.group != nil && c.group[j] != 1 {
			// Its whole seats, and its remainder seat if it is given.
			n += c.floor[j] + int(1-c.group[j]/2)
			continue
		}
		if k := floorDiv(d, num, den) + int64(s) + 1; k > 0 {
			n += int(k)
		}
	}
	return n
}

// feasible reports whether the pass can be apportioned with unit i at
// population p: the Droop quota must leave at most as many seats over as
// there are units with people, which it does once the total passes
// (H+1)^2 people (the quota is then above P/(H+1) - 1 person, and the whole
// parts add up to more than H - n); Hamilton always can.
func (c *claimPass) feasible(p uint64) bool {
	if c.m != Droop {
		return true
	}
	t, _ := c.rest.add64(p)
	h := uint64(c.seats) + 1
	if need, ok := mul128(h, h).mulSmall(c.sc); ok && t.cmp(need) > 0 {
		return true
	}
	num, den := c.quota(p)
	extra, populated := int64(c.seats), int64(0)
	for _, j := range c.units {
		pj := c.pops[j]
		if j == c.i {
			pj = p
		}
		if pj > 0 {
			populated++
			extra -= floorDiv(int64(pj), num, den)
		}
	}
	return extra >= 0 && extra <= populated
}

// wish returns what unit i's count is held to for it to hold more than a
// seats outright (dir > 0: its claim on seat a+1, counted at most k times)
// or fewer (dir < 0: its claim on seat a, counted at least k times).
func (c *claimPass) wish(a, dir int) (s, k int) {
	if dir > 0 {
		return a, c.seats - a - 1
	}
	return a - 1, c.seats - a + 1
}

// meets reports whether, with unit i at population p, the count of claims
// at or above its (s+1)-th is what wish asked for.
func (c *claimPass) meets(p uint64, s, k, dir int) bool {
	n := c.count(p, s)
	if dir > 0 {
		return n <= k
	}
	return n >= k
}

// floorDiv returns floor(d/(num/den)) = floor(d·den/num) for num > 0,
// saturating at ±2^62 (beyond every count of seats).
func floorDiv(d int64, num u128, den uint64) int64 {
	a := uint64(d)
	if d < 0 {
		a = uint64(-d)
	}
	x := mul128(a, den)
	var q u128
	exact := true
	switch {
	case num.hi == 0:
		var r uint64
		q, r = x.div64(num.lo)
		exact = r == 0
	case x.cmp(num) < 0:
		exact = x.hi == 0 && x.lo == 0
	default:
		qq, rr := new(big.Int).QuoRem(x.big(), num.big(), new(big.Int))
		q, exact = u128{1, 0}, rr.Sign() == 0
		if qq.IsUint64() {
			q = u128{0, qq.Uint64()}
		}
	}
	k := int64(1 << 62)
	if q.hi == 0 && q.lo < 1<<62 {
		k = int64(q.lo)
	}
	if d < 0 {
		k = -k
		if !exact {
			k--
		}
	}
	return k
}

// A claimTable holds the claims of the scenario's units near the cut at
// their own populations, sorted, so that a count for unit i at another
// population is a binary search: when unit i's population moves, the
// other units' claims (p_j - k·Q, in scaled people) move only through the
// quota, by k·ΔQ; unit i's moves by its change and s·ΔQ. The claims of
// seat k of unit j at or above unit i's (s+1)-th claim are those whose key
// p_j·c - k·Q0·c (with c the quota's denominator) is at least a threshold
// T0 + k·B; every claim near the cut is in the table, the claims above it
// are counted once, and the units with the most seats (whose claims move
// most with the quota) are counted apart, one by one.
type claimTable struct {
	m     Method
	h     int
	sc    uint64
	total u128   // P, the population of the units taking part
	q0    uint64 // Droop: the quota at P; Hamilton: P (the quota is P/H)
	unit  uint64 // one claim unit in keys: P for Hamilton, q0 for Droop
	keys  []uint64
	ks    []int32 // the entry's seat index k
	us    []int32 // the entry's unit
	kmax  int     // the greatest k among the entries
	above int     // claims of the table's units above it (k <= F-3)
	whole []int32 // every unit's whole part F at P; -1 for a unit not in the table
	big   []int   // the units counted apart
	pops  []uint64
	elig  []bool // the units taking part, as the table was made for them
}

// claimTableBig is how many units with the most seats a claim table counts
// apart.
const claimTableBig = 16

// newClaimTable builds the claim table of the problem's eligible units, or
// returns nil when its keys would not fit in 64 bits.
func (pr *problem) newClaimTable() *claimTable {
	t := &claimTable{m: pr.m, h: pr.h, sc: pow10(pr.places), total: pr.eligibleTotal(), pops: pr.pops, elig: pr.eligible}
	if t.total.hi != 0 || t.total.lo == 0 || t.total.lo > (1<<63)/5 {
		return nil
	}
	if pr.m == Hamilton {
		t.q0, t.unit = t.total.lo, t.total.lo
	} else {
		q := droopQuota(t.total, pr.h, t.sc)
		if q.hi != 0 || q.lo > (1<<63)/5 {
			return nil
		}
		t.q0, t.unit = q.lo, q.lo
	}
	n := pr.n()
	t.whole = make([]int32, n)
	type fj struct {
		f int64
		j int
	}
	var all []fj
	for j, p := range pr.pops {
		t.whole[j] = -1
		if !pr.eligible[j] || p == 0 {
			continue
		}
		all = append(all, fj{t.wholeAt(p), j})
	}
	// The units with the most seats are counted apart.
	if len(all) > claimTableBig {
		slices.SortFunc(all, func(x, y fj) int { return cmp.Compare(y.f, x.f) })
		for _, b := range all[:claimTableBig] {
			t.big = append(t.big, b.j)
		}
		all = all[claimTableBig:]
	} else {
		for _, b := range all {
			t.big = append(t.big, b.j)
		}
		all = nil
	}
	type entry struct {
		key  uint64
		k, u int32
	}
	entries := make([]entry, 0, 5*len(all))
	for _, b := range all {
		if b.f > 1<<30 {
			return nil
		}
		f := int(b.f)
		t.whole[b.j] = int32(f)
		t.above += max(0, f-2)
		t.kmax = max(t.kmax, f+2)
		for k := max(0, f-2); k <= f+2; k++ {
			entries = append(entries, entry{t.key(pr.pops[b.j], k), int32(k), int32(b.j)})
		}
	}
	slices.SortFunc(entries, func(x, y entry) int { return cmp.Compare(x.key, y.key) })
	t.keys = make([]uint64, len(entries))
	t.ks = make([]int32, len(entries))
	t.us = make([]int32, len(entries))
	for e, x := range entries {
		t.keys[e], t.ks[e], t.us[e] = x.key, x.k, x.u
	}
	return t
}

// wholeAt is the whole part of p at the table's quota.
func (t *claimTable) wholeAt(p uint64) int64 {
	if t.m == Hamilton {
		q, _ := mul128(p, uint64(t.h)).div64(t.total.lo)
		if q.hi != 0 || q.lo > 1<<40 {
			return 1 << 40
		}
		return int64(q.lo)
	}
	return int64(p / t.q0)
}

// key is the table key of the claim on seat k+1 of a unit with population
// p, its claim p/Q0 - k scaled to a whole number and moved up by two: p·H -
// k·P + 2P for Hamilton (Q0 = P/H), p - k·Q0 + 2·Q0 for the Droop quota.
// The claims in the table have keys in [0, 5·unit).
func (t *claimTable) key(p uint64, k int) uint64 {
	if t.m == Hamilton {
		x := mul128(p, uint64(t.h))
		x, _ = x.add64(2 * t.total.lo)
		x = x.sub(mul128(uint64(k), t.total.lo))
		return x.lo
	}
	return p + 2*t.q0 - uint64(k)*t.q0
}

// count is claimPass.count from the table, for a pass over the units the
// table was made for; false when the thresholds leave the table, and the
// pass must be counted unit by unit.
func (t *claimTable) count(c *claimPass, p uint64, s int) (int, bool) {
	i := c.i
	pi := t.pops[i] // unit i's population as the table holds its claims
	// The threshold of seat k: T_k = T0 + k·B, T0 as a difference pos -
	// neg.
	var pos, neg u128
	var b int64
	if t.m == Hamilton {
		// T_k = p·(H-s) + s·p_i + 2P - s·P + k·(p - p_i).
		pos = mul128(p, uint64(t.h-s))
		pos, _ = pos.add(mul128(uint64(s), pi))
		pos, _ = pos.add64(2 * t.total.lo)
		neg = mul128(uint64(s), t.total.lo)
		if p >= pi {
			b = int64(p - pi)
		} else {
			b = -int64(pi - p)
		}
	} else {
		// T_k = p + 2·Q0 - s·Q + k·(Q - Q0).
		tot, _ := c.rest.add64(p)
		q := droopQuota(tot, t.h, t.sc)
		if q.hi != 0 || q.lo > 1<<62 {
			return 0, false
		}
		pos, _ = u128{0, p}.add64(2 * t.q0)
		neg = mul128(uint64(s), q.lo)
		b = int64(q.lo) - int64(t.q0)
	}
	if neg.cmp(pos) > 0 {
		return 0, false
	}
	t0 := pos.sub(neg)
	top := mul128(5, t.unit)
	ends := [2]u128{t0, t0}
	if b >= 0 {
		ends[1], _ = t0.add(mul128(uint64(t.kmax), uint64(b)))
	} else {
		d := mul128(uint64(t.kmax), uint64(-b))
		if d.cmp(t0) > 0 {
			return 0, false
		}
		ends[0] = t0.sub(d)
	}
	if ends[0].hi != 0 || ends[1].cmp(top) > 0 {
		return 0, false
	}
	lo, hi := ends[0].lo, ends[1].lo
	a := sort.Search(len(t.keys), func(e int) bool { return t.keys[e] >= lo })
	z := a + sort.Search(len(t.keys)-a, func(e int) bool { return t.keys[a+e] >= hi })
	n := t.above + len(t.keys) - z
	for e := a; e < z; e++ {
		if t.keys[e] >= t0.lo+uint64(t.ks[e])*uint64(b) {
			n++
		}
	}
	// Unit i's own claims in the table, at its own population, are not
	// another unit's.
	if f := int(t.whole[i]); f >= 0 {
		n -= max(0, f-2)
		for k := max(0, f-2); k <= f+2; k++ {
			if t.key(pi, k) >= t0.lo+uint64(k)*uint64(b) {
				n--
			}
		}
	}
	num, den := c.quota(p)
	for _, j := range t.big {
		pj := c.pops[j]
		if j == i {
			continue
		}
		var d int64
		if pj >= p {
			d = int64(pj - p)
		} else {
			d = -int64(p - pj)
		}
		if k := floorDiv(d, num, den) + int64(s) + 1; k > 0 {
			n += int(k)
		}
	}
	return n, true
}

// hint estimates the change at which unit i's count of claims at or above
// its (s+1)-th crosses k (falls to k adding people, dir > 0; rises to k
// taking them away): the crossing of the claim as many places from unit
// i's in the table as the count must move, at the rate claim and unit i
// close in on each other (H - s + k' people of the claim's seat k' for each
// P/H of change, under Hamilton; for the Droop quota, the same with H+1).
// The search starts from it; no result depends on it.
func (t *claimTable) hint(c *claimPass, s, k, dir int) uint64 {
	pi := t.pops[c.i]
	n0, ok := t.count(c, pi, s)
	if !ok {
		return 0
	}
	// T0: the threshold at unit i's own population, the same for every k.
	t0 := mul128(pi, uint64(t.h))
	if t.m == Droop {
		t0 = u128{0, pi}
	}
	t0, _ = t0.add64(2 * t.unit)
	sq := mul128(uint64(s), t.unit)
	if sq.cmp(t0) > 0 {
		return 0
	}
	t0 = t0.sub(sq)
	if t0.hi != 0 {
		return 0
	}
	a := sort.Search(len(t.keys), func(e int) bool { return t.keys[e] >= t0.lo })
	h := uint64(t.h)
	if t.m == Droop {
		h++
	}
	var e int
	var d uint64
	if dir > 0 {
		e = a + n0 - k - 1
		if n0 <= k || e >= len(t.keys) {
			return 0
		}
		d = t.keys[e] - t0.lo
	} else {
		e = a - (k - n0)
		if n0 >= k || e < 0 {
			return 0
		}
		d = t0.lo - t.keys[e]
	}
	rate := int64(h) - int64(s) + int64(t.ks[e])
	if rate <= 0 {
		return 0
	}
	y, _ := mul128(d, h).div64(uint64(rate))
	if t.m == Hamilton {
		// The keys are H times the claims in people.
		y, _ = u128{0, d}.div64(uint64(rate))
	}
	if y.hi != 0 {
		return 0
	}
	return y.lo
}

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

// plus returns x + y, saturating.
func (x u128) plus(y uint64) u128 {
	s, ok := x.add64(y)
	if !ok {
		return u128{^uint64(0), ^uint64(0)}
	}
	return s
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
