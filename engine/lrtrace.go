package engine

// This file records what the largest-remainder procedure (remainder.go)
// decided in each pass, for the bounded margins (bounded.go), which prove
// from two runs that the passes stay the same over a stretch.

// An lrTrace records what the largest-remainder procedure decided in each
// pass, for the margins (bounded.go), which compare two runs. The nil
// *lrTrace records nothing.
type lrTrace struct {
	passes []lrPassTrace // the first n in use
	n      int
	failed bool // the procedure found no apportionment
}

// An lrPassTrace is one pass of an lrTrace. Its slices are by position in
// units.
type lrPassTrace struct {
	units        []int
	seats, extra int
	quota        u128   // the Droop quota, scaled (zero for Hamilton)
	whole        []int  // the whole parts
	rems         []u128 // the remainders' numerators (over the pass's total for Hamilton)
	place        []int8 // 0 above the cut value, 1 equal to it, 2 below it, 3 no people
	win          []bool // takes a seat by remainder
}

func (t *lrTrace) reset() { t.n, t.failed = 0, false }

// recordWhole adds the pass r that failed on its whole parts, before its
// cut: its units, seats, seats left over and whole parts.
func (t *lrTrace) recordWhole(r *lrRound) {
	if t == nil {
		return
	}
	x := t.next()
	x.units = append(x.units[:0], r.units...)
	x.seats, x.extra, x.quota = r.seats, r.extra, u128{}
	x.whole, x.rems, x.place, x.win = x.whole[:0], x.rems[:0], x.place[:0], x.win[:0]
	for _, u := range r.units {
		x.whole = append(x.whole, r.whole[u])
	}
}

// next returns the trace's next pass, its slices emptied for reuse.
func (t *lrTrace) next() *lrPassTrace {
	if t.n == len(t.passes) {
		t.passes = append(t.passes, lrPassTrace{})
	}
	t.n++
	return &t.passes[t.n-1]
}

func (t *lrTrace) fail() {
	if t != nil {
		t.failed = true
	}
}

// record adds the pass r, its whole parts in r.whole and its cut groups
// ordered.
func (t *lrTrace) record(pr *problem, r *lrRound) {
	if t == nil {
		return
	}
	x := t.next()
	n := len(r.units)
	x.units = append(x.units[:0], r.units...)
	x.seats, x.extra = r.seats, r.extra
	x.quota = u128{}
	if pr.m == Droop && r.seats > 0 {
		x.quota = droopQuota(r.total, r.seats, pow10(pr.places))
	}
	x.whole, x.rems = x.whole[:0], x.rems[:0]
	x.place, x.win = resize(x.place, n), resize(x.win, n)
	for j, u := range r.units {
		x.whole = append(x.whole, r.whole[u])
		x.rems = append(x.rems, r.rem(j))
	}
	for k, j := range r.ranked {
		switch {
		case k < r.gt:
			x.place[j] = 0
		case k < r.ge:
			x.place[j] = 1
		case k < n-r.noPeople:
			x.place[j] = 2
		default:
			x.place[j] = 3
		}
		x.win[j] = k < r.extra
	}
}
