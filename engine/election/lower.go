package election

import "math"

// The lower apportionment of a biproportional election.
//
// Votes v[i][j] sit in a matrix of districts (rows) and parties (columns);
// every row i has its seats r[i] and every column j its seats c[j]. The
// lower apportionment finds seats x[i][j] and divisors d[i] (districts)
// and e[j] (parties) such that x[i][j] is the method's rounding of the
// quotient v[i][j] / (d[i]·e[j]) and every row and column adds up.
//
// It is found in two ways:
//
//   - Alternating scaling in floating point (fit every row by its divisor,
//     then every column, until both fit) suggests the seats and the
//     divisors. The suggestion is then proven exactly: party divisors are
//     chosen as short decimals inside their exact ranges given the district
//     divisors, district divisors likewise, and every cell is checked to
//     round strictly to its seats. A strict certificate proves the seats are
//     the only lower apportionment there is (any other would have to round
//     differently at the same divisors).
//   - When the suggestion fails the exact check (a tie, or a near tie that
//     floating point cannot settle), tie-and-transfer runs in exact
//     rational arithmetic: columns are fitted exactly, then seats move from
//     districts with too many to districts with too few along paths of cells
//     that sit exactly on a signpost, and where no path exists the divisors
//     of the districts and parties reached are scaled by the least factor
//     that puts one more cell on a signpost. Every step keeps every cell a
//     valid rounding, and each transfer brings the rows closer to their
//     totals, so it ends.
//
// Ties. At the final divisors some cells sit on a signpost: a cell at its
// lower signpost could give up a seat, one at its upper signpost could take
// one. Another lower apportionment exists exactly when such cells close an
// alternating cycle (give in one cell, take in the next cell of its
// column, give in the next of that row, ...): moving a seat around the cycle
// keeps every total. The product of the quotients around such a cycle does
// not depend on the divisors, so these cycles are the same at every
// certificate. The cells on them (the strongly connected parts of the graph
// of cells on signposts) are reported as ties; without a tie rule the
// seats they contest are left unassigned. Cells on signposts that close no
// cycle are not ties: the divisors are moved off the signposts along a
// topological order of that graph, which makes every other cell strict.
//
// Huntington–Hill's signposts are square roots; for it every value here is
// a square (the quotient's square against a(a+1)), so all arithmetic stays
// rational.

// lowerProblem is one lower apportionment.
type lowerProblem struct {
	v  [][]uint64
	r  []int
	c  []int
	rd rounding
}

// cellRef is a cell: district (row) i, party (column) j.
type cellRef struct{ i, j int }

// lowerTie is one set of cells whose seats could go more than one way.
type lowerTie struct {
	cells   []cellRef // every cell of the tie, in row-major order
	seats   int       // seats contested
	winners []cellRef // the cells given the contested seats by the tie rule
}

// lowerResult is a lower apportionment with its certificate.
type lowerResult struct {
	x [][]int // seats held (outright, or given by the tie rule)
	// d, e are the divisors' texts: exact decimals ("" for a district or
	// party that no cell constrains). At a tie, where the cells on the tie
	// pin the divisors to each other, a divisor may be an exact fraction
	// "n/d" (or, for Huntington–Hill, "sqrt(n/d)").
	d, e []string
	// strict reports a certificate at which every cell rounds strictly:
	// the lower apportionment is the only one.
	strict     bool
	ties       []lowerTie
	unassigned int
	exact      bool // found by the exact procedure rather than proven from the estimate
}

// errInfeasible is returned when no lower apportionment exists.
var errInfeasible = &Error{Index: -1, Field: "districts", Msg: "no lower apportionment exists: the districts' and parties' seats cannot both be met with seats only where a party has votes"}

// solveLower finds the lower apportionment. tieOrder ranks the cells for a
// tie rule (lower first wins); nil leaves ties unassigned.
func solveLower(lp *lowerProblem, tieOrder func([]cellRef) []cellRef) (*lowerResult, error) {
	if err := lp.quickCheck(); err != nil {
		return nil, err
	}
	ex := newExactLower(lp)
	x, logd, loge, ok := lp.alternatingScaling(400)
	if ok {
		if res, ok := ex.certifyFloat(x, logd, loge); ok {
			return res, nil
		}
	}
	// Start the exact procedure from the estimate's district divisors
	// (nil when it failed at once): near a solution few seats move.
	ex.start(logd)
	if err := ex.tieAndTransfer(); err != nil {
		return nil, err
	}
	return ex.finish(tieOrder)
}

// active reports whether cell (i, j) has votes (a cell without votes never
// takes a seat).
func (lp *lowerProblem) active(i, j int) bool { return lp.v[i][j] > 0 }

// quickCheck refuses totals that no apportionment can meet for plain
// reasons: seats where no party has votes, or too few seats for cells that
// each need one.
func (lp *lowerProblem) quickCheck() error {
	m, n := len(lp.r), len(lp.c)
	fl := lp.rd.floor()
	sr, sc := 0, 0
	for i := range m {
		sr += lp.r[i]
		k := 0
		for j := range n {
			if lp.active(i, j) {
				k++
			}
		}
		if (k == 0 && lp.r[i] > 0) || k*fl > lp.r[i] {
			return errInfeasible
		}
	}
	for j := range n {
		sc += lp.c[j]
		k := 0
		for i := range m {
			if lp.active(i, j) {
				k++
			}
		}
		if (k == 0 && lp.c[j] > 0) || k*fl > lp.c[j] {
			return errInfeasible
		}
	}
	if sr != sc {
		return errInfeasible
	}
	return nil
}

// apportion1 divides seats among the weights w by the rounding: x[k] is the
// rounding of w[k]/D for a common divisor D. It returns the range of such
// divisors [lo, hi] (hi may be +Inf; lo is 0 when no weight is positive).
// This is a floating-point estimate.
func apportion1(w []float64, seats int, rd rounding, x []int) (lo, hi float64, ok bool) {
	total := 0.0
	fl := rd.floor()
	need := 0
	for _, v := range w {
		total += v
		if v > 0 {
			need += fl
		}
	}
	if need > seats || (total == 0 && seats > 0) {
		return 0, 0, false
	}
	D := math.Inf(1)
	if seats > 0 {
		D = total / float64(seats)
	}
	// next[k] is the claim on a further seat, last[k] that of the last
	// seat held (+Inf when it cannot be given up).
	next := make([]float64, len(w))
	last := make([]float64, len(w))
	set := func(k int) {
		next[k], last[k] = 0, math.Inf(1)
		if w[k] <= 0 {
			return
		}
		next[k] = w[k] / rd.float(x[k])
		if x[k] > fl {
			last[k] = w[k] / rd.float(x[k]-1)
		}
	}
	sum := 0
	for k, v := range w {
		x[k] = 0
		if v > 0 {
			x[k] = max(fl, rd.roundFloat(v/D))
		}
		sum += x[k]
		set(k)
	}
	for sum < seats {
		best := -1
		for k := range w {
			if w[k] > 0 && (best < 0 || next[k] > next[best]) {
				best = k
			}
		}
		x[best]++
		sum++
		set(best)
	}
	for sum > seats {
		best := -1
		for k := range w {
			if !math.IsInf(last[k], 1) && (best < 0 || last[k] < last[best]) {
				best = k
			}
		}
		if best < 0 {
			return 0, 0, false
		}
		x[best]--
		sum--
		set(best)
	}
	lo, hi = 0, math.Inf(1)
	for k, v := range w {
		if v > 0 {
			lo = max(lo, next[k])
			hi = min(hi, last[k])
		}
	}
	return lo, hi, true
}

// logMid is the logarithm of a divisor inside [lo, hi].
func logMid(lo, hi float64) float64 {
	switch {
	case lo <= 0 && math.IsInf(hi, 1):
		return 0
	case lo <= 0:
		return math.Log(hi) - math.Ln2
	case math.IsInf(hi, 1):
		return math.Log(lo) + math.Ln2
	}
	return (math.Log(lo) + math.Log(hi)) / 2
}

// alternatingScaling estimates the lower apportionment in floating point:
// it fits every row at the current column divisors, then every column at
// the row divisors, until both fit. It reports false when the rounding
// does not settle within maxIter rounds (at a tie it may cycle), with the
// divisors reached.
func (lp *lowerProblem) alternatingScaling(maxIter int) (x [][]int, logd, loge []float64, ok bool) {
	m, n := len(lp.r), len(lp.c)
	x = make([][]int, m)
	for i := range x {
		x[i] = make([]int, n)
	}
	logd = make([]float64, m)
	loge = make([]float64, n)
	wr := make([]float64, n)
	wc := make([]float64, m)
	xc := make([]int, m)
	fe := make([]float64, n)
	fd := make([]float64, m)
	for range maxIter {
		for j := range n {
			fe[j] = math.Exp(-loge[j])
		}
		for i := range m {
			for j := range n {
				wr[j] = float64(lp.v[i][j]) * fe[j]
			}
			lo, hi, good := apportion1(wr, lp.r[i], lp.rd, x[i])
			if !good {
				return nil, nil, nil, false
			}
			logd[i] = logMid(lo, hi)
		}
		if lp.columnsFit(x) {
			return x, logd, loge, true
		}
		for i := range m {
			fd[i] = math.Exp(-logd[i])
		}
		for j := range n {
			for i := range m {
				wc[i] = float64(lp.v[i][j]) * fd[i]
			}
			lo, hi, good := apportion1(wc, lp.c[j], lp.rd, xc)
			if !good {
				return nil, nil, nil, false
			}
			for i := range m {
				x[i][j] = xc[i]
			}
			loge[j] = logMid(lo, hi)
		}
		if lp.rowsFit(x) {
			return x, logd, loge, true
		}
	}
	return nil, logd, loge, false
}

func (lp *lowerProblem) columnsFit(x [][]int) bool {
	for j := range lp.c {
		s := 0
		for i := range lp.r {
			s += x[i][j]
		}
		if s != lp.c[j] {
			return false
		}
	}
	return true
}

func (lp *lowerProblem) rowsFit(x [][]int) bool {
	for i := range lp.r {
		s := 0
		for j := range lp.c {
			s += x[i][j]
		}
		if s != lp.r[i] {
			return false
		}
	}
	return true
}
