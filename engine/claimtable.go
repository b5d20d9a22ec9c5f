package engine

import (
	"cmp"
	"slices"
	"sort"
)

// This file holds the claim table: the claims of the scenario's units near
// the cut, sorted once for every margin, in which a count of claims
// (claims.go) for one unit at another population is a binary search.

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
		if j != i {
			n += claimsAtOrAbove(c.pops[j], p, s, num, den)
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
