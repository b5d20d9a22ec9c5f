package engine

import (
	"math"
	"math/bits"
)

// This file holds the exact divisor of the divisor procedure's fast form
// (divisor.go) and the rounding at it. The estimate (estimate.go) gives a
// divisor d in floating point; newCut fixes an exact divisor D there (a
// dyadic rational X/2^s, the estimate's own value to 53 bits, or for
// Huntington–Hill such a D^2; a virtual unit's priority value when the
// shift would not keep the comparisons in 128 bits), and round rounds
// every unit at D exactly, starting from the floating-point rounding and
// correcting it by exact comparisons with D, so that every seat a unit
// holds beyond its minimum has priority at least D and every next seat
// below its maximum has priority at most D.

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
	pf := math.Round(d * signpostFloat(m, c.vk))
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
		l, ok := u128{hi, lo}.shlFits(c.s)
		if !ok {
			return 1
		}
		return l.cmp(r)
	}
	rr, ok := r.shlFits(-c.s)
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
	} else {
		l.Mul(l, bigU(s.d))
	}
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
func (j *divisorRun) round(c *cut) (sum int, onHeld, onNext bool) {
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
func (j *divisorRun) roundFast(c *cut) (sum int, onHeld, onNext bool) {
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
