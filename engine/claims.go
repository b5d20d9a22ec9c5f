package engine

import (
	"math/big"
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
	// group orders equal remainders at the cut when some units have
	// bounds (see cutGroups): 0 a unit that needs the seat to reach its
	// minimum, 1 a free unit, 2 a unit at its maximum; nil without bounds.
	group []int8
	floor []int // the units' whole parts, when group is set
	tab   *claimTable
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

// droopQuota is floor(t/(seats+1)) + 1 people, in scaled units.
func droopQuota(t u128, seats int, sc uint64) u128 {
	w, ok := u128{0, uint64(seats) + 1}.mulSmall(sc)
	if !ok || w.hi != 0 {
		return u128{0, sc}
	}
	q, _ := t.div64(w.lo)
	q, _ = q.add64(1)
	q, ok = q.mulSmall(sc)
	if !ok {
		return u128{^uint64(0), ^uint64(0)}
	}
	return q
}

// count returns how many claims of the pass's other units rank at or above
// unit i's (s+1)-th claim when i has population p, and whether the pass
// can be apportioned then (the Droop quota can leave more seats over than
// there are units with people to take them).
func (c *claimPass) count(p uint64, s int) (int, bool) {
	if c.tab != nil {
		if n, ok := c.tab.count(c, p, s); ok {
			return n, true
		}
	}
	num, den := c.quota(p)
	n := 0
	extra, populated := int64(c.seats), int64(0)
	if p > 0 {
		populated++
		extra -= floorDiv(int64(p), num, den)
	}
	for _, j := range c.units {
		pj := c.pops[j]
		if j == c.i || pj == 0 {
			continue
		}
		populated++
		var d int64
		if pj >= p {
			d = int64(pj - p)
		} else {
			d = -int64(p - pj)
		}
		k, exact := floorDivExact(d, num, den)
		if c.m == Droop {
			extra -= floorDiv(int64(pj), num, den)
		}
		if exact && c.group != nil && int(k)+s == c.floor[j] && s == c.floor[c.i] && c.group[j] > c.group[c.i] {
			// Equal remainders at the cut: the unit ranks after unit i.
			k--
		}
		if k+int64(s)+1 > 0 {
			n += int(k) + s + 1
		}
	}
	if c.m == Droop && (extra < 0 || extra > populated) {
		return n, false
	}
	return n, true
}

// floorDiv returns floor(d·den/num) for a signed d and a fraction num/den > 0.
func floorDiv(d int64, num u128, den uint64) int64 {
	k, _ := floorDivExact(d, num, den)
	return k
}

// floorDivExact returns floor(d/(num/den)) = floor(d·den/num) for num > 0,
// and whether the division is exact.
func floorDivExact(d int64, num u128, den uint64) (int64, bool) {
	neg := d < 0
	a := uint64(d)
	if neg {
		a = uint64(-d)
	}
	x := mul128(a, den)
	var q u128
	var exact bool
	switch {
	case num.hi == 0 && num.lo != 0:
		var r uint64
		q, r = x.div64(num.lo)
		exact = r == 0
	case x.cmp(num) < 0:
		exact = x.hi == 0 && x.lo == 0
	default:
		qq, rr := new(big.Int).QuoRem(x.big(), num.big(), new(big.Int))
		q, exact = u128{0, qq.Uint64()}, rr.Sign() == 0
	}
	k := int64(q.lo)
	if q.hi != 0 || q.lo > 1<<62 {
		k = 1 << 62
	}
	if neg {
		k = -k
		if !exact {
			k--
		}
	}
	return k, exact
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
		slices.SortFunc(all, func(x, y fj) int { return cmpInt64(y.f, x.f) })
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
		key uint64
		k   int32
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
			entries = append(entries, entry{t.key(pr.pops[b.j], k), int32(k)})
		}
	}
	slices.SortFunc(entries, func(x, y entry) int { return cmpU(x.key, y.key) })
	t.keys = make([]uint64, len(entries))
	t.ks = make([]int32, len(entries))
	for e, x := range entries {
		t.keys[e], t.ks[e] = x.key, x.k
	}
	return t
}

func cmpInt64(x, y int64) int {
	switch {
	case x < y:
		return -1
	case x > y:
		return 1
	}
	return 0
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
