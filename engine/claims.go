package engine

import "math/big"

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
// cut (claimtable.go), made once for every margin; from the table the
// crossing itself can be selected (crossing.go).

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
	// group, when some units have bounds, is the role of each unit's
	// remainder seat (remainderRole) for the stretch counted, which the
	// bounds prove: seatNeeded gives it whatever the remainder, seatBarred
	// withholds it, seatFree ranks the remainder with the others'. nil
	// without bounds.
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
		if c.group != nil && c.group[j] != seatFree {
			// Its whole seats, and its remainder seat if it is given.
			n += c.floor[j]
			if c.group[j] == seatNeeded {
				n++
			}
			continue
		}
		n += claimsAtOrAbove(pj, p, s, num, den)
	}
	return n
}

// claimsAtOrAbove is how many claims of a unit with population pj rank at
// or above the (s+1)-th claim of a unit with population p under the quota
// num/den: max(0, floor((pj - p)/Q) + s + 1).
func claimsAtOrAbove(pj, p uint64, s int, num u128, den uint64) int {
	var d int64
	if pj >= p {
		d = int64(pj - p)
	} else {
		d = -int64(p - pj)
	}
	if k := floorDiv(d, num, den) + int64(s) + 1; k > 0 {
		return int(k)
	}
	return 0
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
