package engine

// This file finds the seats nearest the cut of a divisor method's result,
// in the order the sequential form hands them out: the next seats beyond
// the house size (Result.Beyond), the warm start's contest lists, and the
// claims a unit must overtake for its margins.

// A seatRef is unit u's (k+1)-th seat, of priority p_u/s(k).
type seatRef struct {
	u, k int
}

// bestSeats appends to out the k seats (k at most MaxWarmContest) that
// come first on one side of the cut of the consistent seats a, in the
// sequential form's order: with held, the seats held beyond the minimums from the least
// priority up (equal values in reverse input order), the seat given last
// first; otherwise the next seats from the greatest priority down (equal
// values in input order), a unit appearing once for each of its seats
// among them. sel is scratch; both slices are returned for reuse.
//
// Every unit's own seats come in order, so the k first seats lie among the
// units whose first seat on that side is among the k first; a pass in
// floating point finds the k-th best first seat's approximate value t, and
// a unit whose approximate value is worse than t by more than the relative
// slack is provably worse, exactly, than at least k others: it is set aside
// without an exact comparison. The rest are ranked by exact comparisons
// only.
func (pr *problem) bestSeats(a []int, held bool, k int, out, sel []seatRef) ([]seatRef, []seatRef) {
	_, rsT := signpostTable(pr.m)
	// approx is the floating-point priority of unit i's first seat on this
	// side; false when it has none.
	approx := func(i int, p uint64) (float64, bool) {
		if !pr.eligible[i] || p == 0 {
			return 0, false
		}
		s := a[i]
		if held {
			if s <= pr.min[i] {
				return 0, false
			}
			s--
		} else if s >= pr.max[i] {
			return 0, false
		}
		if s < len(rsT) {
			return float64(p) * rsT[s], true
		}
		return float64(p) / signpostFloat(pr.m, s), true
	}
	var top [MaxWarmContest + 1]float64 // the k best approximate values, best first
	nt := 0
	worse := func(x, y float64) bool { return (held && x > y) || (!held && x < y) }
	for i, p := range pr.pops {
		v, ok := approx(i, p)
		if !ok || (nt == k && !worse(top[nt-1], v)) {
			continue
		}
		j := nt
		if nt < k {
			nt++
		} else {
			j--
		}
		for ; j > 0 && worse(top[j-1], v); j-- {
			top[j] = top[j-1]
		}
		top[j] = v
	}
	if nt == 0 {
		return out, sel
	}
	cut := top[nt-1] * (1 - seatSlack)
	if held {
		cut = top[nt-1] * (1 + seatSlack)
	}
	before := func(x, y seatRef) bool {
		c := pr.m.cmpPrio(prio{pr.pops[x.u], x.k}, prio{pr.pops[y.u], y.k})
		if held {
			return c < 0 || (c == 0 && x.u > y.u)
		}
		return c > 0 || (c == 0 && x.u < y.u)
	}
	insert := func(s seatRef, limit int) {
		if len(sel) == limit && !before(s, sel[len(sel)-1]) {
			return
		}
		j := len(sel)
		if j < limit {
			sel = append(sel, s)
		} else {
			j--
		}
		for ; j > 0 && before(s, sel[j-1]); j-- {
			sel[j] = sel[j-1]
		}
		sel[j] = s
	}
	sel = sel[:0]
	for i, p := range pr.pops {
		v, ok := approx(i, p)
		if !ok || worse(v, cut) {
			continue
		}
		if held {
			insert(seatRef{i, a[i] - 1}, k)
		} else {
			insert(seatRef{i, a[i]}, k)
		}
	}
	for e := 0; e < k && len(sel) > 0; e++ {
		s := sel[0]
		out = append(out, s)
		copy(sel, sel[1:])
		sel = sel[:len(sel)-1]
		left := k - e - 1
		if len(sel) > left {
			sel = sel[:left]
		}
		if left == 0 {
			break
		}
		if held && s.k-1 >= pr.min[s.u] {
			insert(seatRef{s.u, s.k - 1}, left)
		} else if !held && s.k+1 < pr.max[s.u] {
			insert(seatRef{s.u, s.k + 1}, left)
		}
	}
	return out, sel
}

// seatSlack bounds the relative error of the floating-point seat values
// that bestSeats uses to set units aside: each value p·(1/s(k)) is computed
// with at most about eight rounding errors of 2^-53, far inside 2^-30.
const seatSlack = 1.0 / (1 << 30)
