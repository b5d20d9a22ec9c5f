package election

import (
	"math"
	"math/big"
)

// exactLower is the exact side of the lower apportionment: the votes (their
// squares for Huntington–Hill), the seats, and the divisors as exact
// rationals (squares for Huntington–Hill). A divisor is nil when no cell
// constrains it.
type exactLower struct {
	lp   *lowerProblem
	m, n int
	w    [][]*big.Int // nil for a cell without votes
	x    [][]int
	d, e []*big.Rat
	fl   int

	l, r, t big.Int // scratch
}

func newExactLower(lp *lowerProblem) *exactLower {
	m, n := len(lp.r), len(lp.c)
	ex := &exactLower{lp: lp, m: m, n: n, fl: lp.rd.floor()}
	ex.w = make([][]*big.Int, m)
	ex.x = make([][]int, m)
	for i := range m {
		ex.w[i] = make([]*big.Int, n)
		ex.x[i] = make([]int, n)
		for j := range n {
			if v := lp.v[i][j]; v > 0 {
				w := new(big.Int).SetUint64(v)
				if lp.rd.sq {
					w.Mul(w, w)
				}
				ex.w[i][j] = w
			}
		}
	}
	ex.d = make([]*big.Rat, m)
	ex.e = make([]*big.Rat, n)
	return ex
}

// cmp compares the quotient of cell (i, j) at divisors di, ej with the
// signpost s(a): the sign of w/(di·ej) − s(a). The cell has votes.
func (ex *exactLower) cmp(i, j, a int, di, ej *big.Rat) int {
	sn, sd := ex.lp.rd.sign(a)
	if sn == 0 {
		return 1
	}
	// w·sd·den(di)·den(ej) against sn·num(di)·num(ej)
	ex.l.Mul(ex.w[i][j], di.Denom())
	ex.l.Mul(&ex.l, ej.Denom())
	ex.l.Mul(&ex.l, ex.r.SetUint64(sd))
	ex.t.Mul(di.Num(), ej.Num())
	ex.t.Mul(&ex.t, ex.r.SetUint64(sn))
	return ex.l.Cmp(&ex.t)
}

// value is w/s(a) for cell (i, j): the divisor product at which the cell
// sits on the signpost s(a). s(a) must not be zero.
func (ex *exactLower) value(i, j, a int) *big.Rat {
	sn, sd := ex.lp.rd.sign(a)
	num := new(big.Int).Mul(ex.w[i][j], new(big.Int).SetUint64(sd))
	return new(big.Rat).SetFrac(num, new(big.Int).SetUint64(sn))
}

// status of a cell at the current divisors.
const (
	offSign = iota // strictly between its signposts
	atLower        // at its lower signpost: it could give up a seat
	atUpper        // at its upper signpost: it could take one more
)

func (ex *exactLower) status(i, j int) int {
	if ex.w[i][j] == nil {
		return offSign
	}
	a := ex.x[i][j]
	if a > ex.fl && ex.cmp(i, j, a-1, ex.d[i], ex.e[j]) == 0 {
		return atLower
	}
	if ex.cmp(i, j, a, ex.d[i], ex.e[j]) == 0 {
		return atUpper
	}
	return offSign
}

// cellOK reports whether cell (i, j) rounds to its seats at di, ej, and
// whether strictly (at no signpost).
func (ex *exactLower) cellOK(i, j int, di, ej *big.Rat) (ok, strict bool) {
	a := ex.x[i][j]
	if ex.w[i][j] == nil {
		return a == 0, a == 0
	}
	if a < ex.fl {
		return false, false
	}
	strict = true
	if a > 0 {
		if c := ex.cmp(i, j, a-1, di, ej); c < 0 {
			return false, false
		} else if c == 0 {
			strict = false
		}
	}
	if c := ex.cmp(i, j, a, di, ej); c > 0 {
		return false, false
	} else if c == 0 {
		strict = false
	}
	return true, strict
}

// interval is the exact range of the divisor of row k (or column k) given
// the divisors on the other side: every value strictly between lo and hi
// makes each of its cells round strictly to its seats. hasLo is false when
// the line has no cell with votes, hasHi when none of its cells could give
// up a seat.
func (ex *exactLower) interval(row bool, k int) (lo, hi *big.Rat, hasLo, hasHi bool) {
	cnt := ex.n
	if !row {
		cnt = ex.m
	}
	// Bounds as unreduced fractions num/den, compared by cross
	// multiplication; only the two winners become reduced rationals.
	var loN, loD, hiN, hiD, num, den, a, b big.Int
	for t := range cnt {
		i, j := k, t
		if !row {
			i, j = t, k
		}
		if ex.w[i][j] == nil {
			continue
		}
		other := ex.e[j]
		if !row {
			other = ex.d[i]
		}
		if other == nil {
			continue
		}
		// w·sd / (sn·other) = w·sd·den(other) / (sn·num(other))
		x := ex.x[i][j]
		frac := func(s int) {
			sn, sd := ex.lp.rd.sign(s)
			num.Mul(ex.w[i][j], a.SetUint64(sd))
			num.Mul(&num, other.Denom())
			den.Mul(b.SetUint64(sn), other.Num())
		}
		frac(x)
		if !hasLo || a.Mul(&num, &loD).Cmp(b.Mul(&loN, &den)) > 0 {
			loN.Set(&num)
			loD.Set(&den)
			hasLo = true
		}
		if x > ex.fl {
			frac(x - 1)
			if !hasHi || a.Mul(&num, &hiD).Cmp(b.Mul(&hiN, &den)) < 0 {
				hiN.Set(&num)
				hiD.Set(&den)
				hasHi = true
			}
		}
	}
	if hasLo {
		lo = new(big.Rat).SetFrac(&loN, &loD)
	}
	if hasHi {
		hi = new(big.Rat).SetFrac(&hiN, &hiD)
	}
	return lo, hi, hasLo, hasHi
}

// shortest returns the shortest decimal t with lo < t < hi (lo < t² < hi
// when sq), its text, and its value (t², when sq). Without hasHi there is no
// upper end; without hasLo the lower end is zero.
func shortest(lo, hi *big.Rat, hasLo, hasHi, sq bool) (string, *big.Rat, bool) {
	if !hasLo {
		lo = new(big.Rat)
	}
	if hasHi && lo.Cmp(hi) >= 0 {
		return "", nil, false
	}
	ref := new(big.Rat)
	if hasHi {
		ref.Set(hi)
	} else {
		ref.Add(lo, lo)
		ref.Add(ref, big.NewRat(1, 1))
	}
	fr := new(big.Int).Quo(ref.Num(), ref.Denom())
	if sq {
		fr.Sqrt(fr)
	}
	e := len(fr.String())
	ten := big.NewInt(10)
	var t, pw big.Int
	cand := new(big.Rat)
	for k := -e; k <= -e+120; k++ {
		// The first multiple of 10^-k above lo (above sqrt(lo) when sq).
		pw.Exp(ten, big.NewInt(int64(abs(k))), nil)
		l := new(big.Rat).Set(lo)
		if sq {
			if k >= 0 {
				l.Mul(l, new(big.Rat).SetInt(new(big.Int).Mul(&pw, &pw)))
			} else {
				l.Quo(l, new(big.Rat).SetInt(new(big.Int).Mul(&pw, &pw)))
			}
		} else if k >= 0 {
			l.Mul(l, new(big.Rat).SetInt(&pw))
		} else {
			l.Quo(l, new(big.Rat).SetInt(&pw))
		}
		t.Quo(l.Num(), l.Denom())
		if sq {
			t.Sqrt(&t)
		}
		t.Add(&t, big.NewInt(1))
		if k >= 0 {
			cand.SetFrac(&t, &pw)
		} else {
			cand.SetInt(new(big.Int).Mul(&t, &pw))
		}
		val := new(big.Rat).Set(cand)
		if sq {
			val.Mul(val, cand)
		}
		if !hasHi || val.Cmp(hi) < 0 {
			return decimalText(&t, k), val, true
		}
	}
	return "", nil, false
}

// decimalText writes t·10^-k.
func decimalText(t *big.Int, k int) string {
	s := t.String()
	if k <= 0 {
		for range -k {
			s += "0"
		}
		return s
	}
	for len(s) <= k {
		s = "0" + s
	}
	s = s[:len(s)-k] + "." + s[len(s)-k:]
	for s[len(s)-1] == '0' {
		s = s[:len(s)-1]
	}
	if s[len(s)-1] == '.' {
		s = s[:len(s)-1]
	}
	return s
}

func abs(k int) int {
	if k < 0 {
		return -k
	}
	return k
}

// ratOfFloat is the exact value of a positive float64 (its square when sq).
func ratOfFloat(f float64, sq bool) *big.Rat {
	r := new(big.Rat).SetFloat64(f)
	if r == nil {
		r = big.NewRat(1, 1)
	}
	if sq {
		r.Mul(r, r)
	}
	return r
}

// certifyFloat tries to prove the floating-point estimate x: it picks short
// decimal divisors inside the exact ranges and checks that every cell
// rounds strictly to its seats. On success the result is the only lower
// apportionment.
func (ex *exactLower) certifyFloat(x [][]int, logd, loge []float64) (*lowerResult, bool) {
	for i := range ex.m {
		copy(ex.x[i], x[i])
	}
	// Party divisors near one, the scale in the district divisors.
	mu, k := 0.0, 0
	for j := range ex.n {
		if ex.lineActive(false, j) {
			mu += loge[j]
			k++
		}
	}
	if k > 0 {
		mu /= float64(k)
	}
	for i := range ex.m {
		ex.d[i] = nil
		if ex.lineActive(true, i) {
			f := math.Exp(logd[i] + mu)
			if f <= 0 || math.IsInf(f, 0) || math.IsNaN(f) {
				return nil, false
			}
			ex.d[i] = ratOfFloat(f, ex.lp.rd.sq)
		}
	}
	dt, et := make([]string, ex.m), make([]string, ex.n)
	if !ex.shortestPass(false, et, nil) || !ex.shortestPass(true, dt, nil) || !ex.shortestPass(false, et, nil) {
		return nil, false
	}
	for i := range ex.m {
		for j := range ex.n {
			if ok, strict := ex.cellOK(i, j, ex.d[i], ex.e[j]); !ok || (!strict && ex.w[i][j] != nil) {
				return nil, false
			}
		}
	}
	return &lowerResult{x: ex.copyX(), d: dt, e: et, strict: true}, true
}

// lineActive reports whether row (or column) k has a cell with votes.
func (ex *exactLower) lineActive(row bool, k int) bool {
	if row {
		for j := range ex.n {
			if ex.w[k][j] != nil {
				return true
			}
		}
		return false
	}
	for i := range ex.m {
		if ex.w[i][k] != nil {
			return true
		}
	}
	return false
}

// shortestPass sets every row's (or column's) divisor to the shortest
// decimal inside its exact range given the other side, skipping the lines
// marked in keep. It reports false when a range is empty.
func (ex *exactLower) shortestPass(row bool, text []string, keep []bool) bool {
	cnt := ex.n
	div := ex.e
	if row {
		cnt, div = ex.m, ex.d
	}
	for k := range cnt {
		if keep != nil && keep[k] {
			continue
		}
		lo, hi, hasLo, hasHi := ex.interval(row, k)
		if !hasLo {
			div[k], text[k] = nil, ""
			continue
		}
		t, v, ok := shortest(lo, hi, hasLo, hasHi, ex.lp.rd.sq)
		if !ok {
			return false
		}
		div[k], text[k] = v, t
	}
	return true
}

func (ex *exactLower) copyX() [][]int {
	x := make([][]int, ex.m)
	for i := range x {
		x[i] = append([]int(nil), ex.x[i]...)
	}
	return x
}
