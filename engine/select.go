package engine

import (
	"cmp"
	"math/bits"
	"slices"
)

// This file holds the selection that the largest-remainder procedure uses
// in place of sorting every remainder: to hand out e leftover seats it only
// needs the e-th largest remainder v and, for each unit, whether its
// remainder is above, equal to or below v. Finding v takes two passes over
// the remainders (a histogram of their leading bits, then a selection
// among those in the bucket that holds v); the three groups keep the input
// order, as a stable sort would leave them. The full ranking the
// explanation shows is made only when asked for (rankAll), and a few ranks
// on either side of the cut cost little more (rankNear).

// selectBuckets is the number of buckets of the leading-bit histogram.
const selectBuckets = 1 << 11

// selectSmall is the fewest keys worth a histogram; fewer are selected
// among directly.
const selectSmall = 1 << 12

// selectShift is the shift that maps keys below bound to the buckets of
// the leading-bit histogram: the 11 bits below the leading bit of bound.
func selectShift(bound u128) int { return max(bitLen128(bound)-11, 0) }

// kthLargest returns the e-th largest (1 <= e <= len(keys)) of the keys,
// and how many keys are greater than it and equal to it. The keys are wide,
// or narrow when wide is nil. Every key is at most bound, and count holds
// the histogram of the keys by key.shr(selectShift(bound)), or is nil.
func kthLargest(wide []u128, narrow []uint64, e int, bound u128, count *[selectBuckets]int32) (v u128, gt, eq int) {
	if len(wide)+len(narrow) < selectSmall {
		in := make([]u128, 0, len(wide)+len(narrow))
		in = append(in, wide...)
		for _, k := range narrow {
			in = append(in, u128{0, k})
		}
		v = quickSelect(in, e)
		gt, eq = countAround(in, v)
		return v, gt, eq
	}
	shift := selectShift(bound)
	const mask = selectBuckets - 1
	if count == nil {
		count = new([selectBuckets]int32)
		for _, k := range wide {
			count[k.shr(uint(shift)).lo&mask]++
		}
		for _, k := range narrow {
			count[u128{0, k}.shr(uint(shift)).lo&mask]++
		}
	}
	b, above := selectBuckets-1, 0
	for ; b > 0 && above+int(count[b]) < e; b-- {
		above += int(count[b])
	}
	in := make([]u128, 0, count[b])
	for _, k := range wide {
		if k.shr(uint(shift)).lo&mask == uint64(b) {
			in = append(in, k)
		}
	}
	if shift < 64 {
		for _, k := range narrow {
			if k>>shift&mask == uint64(b) {
				in = append(in, u128{0, k})
			}
		}
	} else if b == 0 {
		for _, k := range narrow {
			in = append(in, u128{0, k})
		}
	}
	v = quickSelect(in, e-above)
	gt, eq = countAround(in, v)
	return v, above + gt, eq
}

// countAround counts the keys above v and equal to it.
func countAround(keys []u128, v u128) (gt, eq int) {
	for _, k := range keys {
		switch k.cmp(v) {
		case 1:
			gt++
		case 0:
			eq++
		}
	}
	return gt, eq
}

// quickSelect returns the e-th largest (1 <= e <= len(s)) of s, reordering
// s. Three-way partitions around a median of three keep it linear on
// average, with many equal keys too; past a depth of about 2·log2(len(s))
// it sorts what is left, so the worst case is O(n log n).
func quickSelect(s []u128, e int) u128 {
	lo, hi := 0, len(s) // the answer is in s[lo:hi], the e-th largest there
	for depth := 2 * bits.Len(uint(len(s))); hi-lo > 16; depth-- {
		if depth == 0 {
			break
		}
		m := lo + (hi-lo)/2
		p := median3(s[lo], s[m], s[hi-1])
		// Dutch flag, largest first: [lo,gt) > p, [gt,i) == p, (lt,hi) < p.
		gt, i, lt := lo, lo, hi-1
		for i <= lt {
			switch c := s[i].cmp(p); {
			case c > 0:
				s[gt], s[i] = s[i], s[gt]
				gt++
				i++
			case c < 0:
				s[i], s[lt] = s[lt], s[i]
				lt--
			default:
				i++
			}
		}
		switch {
		case e <= gt-lo:
			hi = gt
		case e <= i-lo:
			return p
		default:
			e -= i - lo
			lo = i
		}
	}
	t := s[lo:hi]
	slices.SortFunc(t, func(x, y u128) int { return y.cmp(x) })
	return t[e-1]
}

func median3(a, b, c u128) u128 {
	if a.cmp(b) > 0 {
		a, b = b, a
	}
	if b.cmp(c) > 0 {
		b = c
	}
	if a.cmp(b) > 0 {
		return a
	}
	return b
}

// cutOrder fills r.ranked with the positions of r.units in three groups,
// each in input order: remainders above the cut value v (the extra-th
// largest), equal to it, and below it; r.gt and r.ge are where the second
// and third groups start. With no seats over every position is in the
// group below the cut; with one for every unit, in the group above it.
// (setAsideEmpty then moves the units without people to the end.)
func (r *lrRound) cutOrder() {
	n := len(r.units)
	r.ranked = make([]int, n)
	if r.extra == 0 || r.extra == n {
		for j := range r.ranked {
			r.ranked[j] = j
		}
		r.gt = 0
		if r.extra == n {
			r.gt = n
		}
		r.ge = r.gt
		return
	}
	v, gt, eq := kthLargest(r.rems, r.rem64, r.extra, r.bound, r.hist)
	// One pass, without a branch on the comparison: the positions above v
	// fill r.ranked from the front and those below it from the back (in
	// reverse), each written at both frontiers and kept by the one that
	// moves; the few equal to v are set aside and fill the gap between.
	p := partition{ranked: r.ranked, back: n - 1, eqs: make([]int, 0, eq)}
	if r.rem64 != nil {
		vv := v.lo
		for j, x := range r.rem64 {
			_, up := bits.Sub64(vv, x, 0)   // x > v
			_, down := bits.Sub64(x, vv, 0) // x < v
			p.put(j, up, down)
		}
	}
	for j, x := range r.rems {
		_, up := bits.Sub64(v.lo, x.lo, 0)
		_, up = bits.Sub64(v.hi, x.hi, up) // x > v
		_, down := bits.Sub64(x.lo, v.lo, 0)
		_, down = bits.Sub64(x.hi, v.hi, down) // x < v
		p.put(j, up, down)
	}
	eqs := p.eqs
	copy(r.ranked[gt:], eqs)
	slices.Reverse(r.ranked[gt+eq:])
	r.gt, r.ge = gt, gt+eq
}

// A partition fills ranked from the front with the positions above the
// cut value and from the back with those below it; the equal ones wait in
// eqs.
type partition struct {
	ranked      []int
	front, back int
	eqs         []int
}

// put places position j: up is 1 when it is above the cut value, down 1
// when below. It is written at both frontiers, and kept by the one that
// moves.
func (p *partition) put(j int, up, down uint64) {
	p.ranked[p.front] = j
	p.ranked[p.back] = j
	p.front += int(up)
	p.back -= int(down)
	if up|down == 0 {
		p.eqs = append(p.eqs, j)
	}
}

// before reports whether position x ranks before position y: a larger
// remainder, or an equal one earlier in the input.
func (r *lrRound) before(x, y int) int {
	if r.rem64 != nil {
		if a, b := r.rem64[x], r.rem64[y]; a != b {
			return cmp.Compare(b, a)
		}
		return x - y
	}
	if c := r.rems[y].cmp(r.rems[x]); c != 0 {
		return c
	}
	return x - y
}

// rankAll completes r.ranked into the full ranking, largest remainder first
// and equal remainders in input order, leaving the group at the cut as
// cutGroups ordered it.
func (r *lrRound) rankAll() {
	if r.ranked == nil || r.sorted {
		return
	}
	for _, g := range [][]int{r.ranked[:r.gt], r.ranked[r.ge : len(r.ranked)-r.noPeople]} {
		if r.rem64 != nil && len(g) >= selectSmall && !r.near {
			radixRank(g, r.rem64, bitLen128(r.bound))
		} else {
			slices.SortFunc(g, r.before)
		}
	}
	r.sorted = true
}

// radixRank sorts the positions g, given in input order, by their keys
// (below 2^width), largest first: a least-significant-digit radix sort,
// which is stable, so that equal keys stay in input order.
func radixRank(g []int, keys []uint64, width int) {
	const digit = 11
	type pair struct {
		k uint64
		j int
	}
	a, b := make([]pair, len(g)), make([]pair, len(g))
	for i, j := range g {
		a[i] = pair{keys[j], j}
	}
	var count [1 << digit]int
	for shift := 0; shift < width; shift += digit {
		clear(count[:])
		for _, p := range a {
			count[(1<<digit-1)-(p.k>>shift)&(1<<digit-1)]++
		}
		at := 0
		for d, c := range count {
			count[d] = at
			at += c
		}
		for _, p := range a {
			d := (1<<digit - 1) - (p.k>>shift)&(1<<digit-1)
			b[count[d]] = p
			count[d]++
		}
		a, b = b, a
	}
	for i, p := range a {
		g[i] = p.j
	}
}

// rankNear puts the k positions on either side of the cut in rank order:
// the last k of the group above the cut value and the first k of the group
// below it; the rest of each group stays in no particular order.
func (r *lrRound) rankNear(k int) {
	if r.ranked == nil || r.sorted {
		return
	}
	r.near = true
	above := r.ranked[:r.gt]
	if k >= len(above) {
		slices.SortFunc(above, r.before)
	} else {
		// The k smallest to the end, in order.
		r.bestTo(above, k, func(x, y int) int { return -r.before(x, y) })
		slices.Reverse(above)
	}
	below := r.ranked[r.ge : len(r.ranked)-r.noPeople]
	if k >= len(below) {
		slices.SortFunc(below, r.before)
	} else {
		r.bestTo(below, k, r.before)
	}
}

// bestTo moves the k first positions of s under cmp to the front of s, in
// order (k < len(s)).
func (r *lrRound) bestTo(s []int, k int, cmp func(x, y int) int) {
	best := make([]int, 0, k+1)
	for _, j := range s {
		if len(best) == k && cmp(j, best[k-1]) >= 0 {
			continue
		}
		at, _ := slices.BinarySearchFunc(best, j, cmp)
		best = slices.Insert(best, at, j)
		if len(best) > k {
			best = best[:k]
		}
	}
	in := make(map[int]bool, k)
	for _, j := range best {
		in[j] = true
	}
	rest := make([]int, 0, len(s)-k)
	for _, j := range s {
		if !in[j] {
			rest = append(rest, j)
		}
	}
	copy(s, best)
	copy(s[k:], rest)
}
