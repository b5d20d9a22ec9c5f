package election

import (
	"math"
	"math/big"
	"strconv"
)

// start sets the district divisors from an estimate (all one when logd is
// nil) and fits every column exactly at them.
func (ex *exactLower) start(logd []float64) {
	for i := range ex.m {
		ex.d[i] = big.NewRat(1, 1)
		if logd != nil {
			// Six significant digits are near enough to start from, and
			// keep the divisors short where a tie pins them.
			if f := math.Exp(logd[i]); f > 0 && !math.IsInf(f, 0) && !math.IsNaN(f) {
				if r, ok := new(big.Rat).SetString(strconv.FormatFloat(f, 'g', 6, 64)); ok {
					if ex.lp.rd.sq {
						r.Mul(r, r)
					}
					ex.d[i] = r
				}
			}
		}
	}
	for j := range ex.n {
		ex.fitColumn(j)
	}
}

// fitColumn gives column j exactly its seats at the current district
// divisors and sets its divisor to the least quotient among the seats it
// holds (or, when none can be given up, the greatest claim on a further
// seat), so that the column's cells sit on their signposts where they can.
func (ex *exactLower) fitColumn(j int) {
	m := ex.m
	w := make([]float64, m)
	for i := range m {
		if ex.w[i][j] != nil {
			df, _ := ex.d[i].Float64()
			if ex.lp.rd.sq {
				df = math.Sqrt(df)
			}
			w[i] = float64(ex.lp.v[i][j]) / df
		}
	}
	xc := make([]int, m)
	if _, _, ok := apportion1(w, ex.lp.c[j], ex.lp.rd, xc); !ok {
		// quickCheck has ruled this out; start from the floor.
		for i := range m {
			if ex.w[i][j] != nil {
				xc[i] = ex.fl
			}
		}
	}
	for i := range m {
		ex.x[i][j] = xc[i]
		if ex.w[i][j] != nil && xc[i] < ex.fl {
			// A weight lost to overflow: every cell with votes holds
			// its floor.
			ex.x[i][j] = ex.fl
		}
	}
	// next(i) is the claim on a further seat, last(i) that of the last
	// seat held; both divided by the district divisor.
	next := func(i int) *big.Rat { v := ex.value(i, j, ex.x[i][j]); return v.Quo(v, ex.d[i]) }
	last := func(i int) *big.Rat { v := ex.value(i, j, ex.x[i][j]-1); return v.Quo(v, ex.d[i]) }
	for {
		sum := 0
		bn, bl := -1, -1
		var vn, vl *big.Rat
		for i := range m {
			if ex.w[i][j] == nil {
				continue
			}
			sum += ex.x[i][j]
			if v := next(i); bn < 0 || v.Cmp(vn) > 0 {
				bn, vn = i, v
			}
			if ex.x[i][j] > ex.fl {
				if v := last(i); bl < 0 || v.Cmp(vl) < 0 {
					bl, vl = i, v
				}
			}
		}
		switch {
		case sum < ex.lp.c[j]:
			ex.x[bn][j]++
			continue
		case sum > ex.lp.c[j]:
			ex.x[bl][j]--
			continue
		case bn >= 0 && bl >= 0 && vn.Cmp(vl) > 0:
			ex.x[bl][j]--
			ex.x[bn][j]++
			continue
		}
		switch {
		case bl >= 0:
			ex.e[j] = vl
		case bn >= 0:
			ex.e[j] = vn
		default:
			ex.e[j] = nil
		}
		return
	}
}

// tieAndTransfer moves seats between districts until every district has
// its seats, keeping every column's total and every cell a valid rounding.
func (ex *exactLower) tieAndTransfer() error {
	m, n := ex.m, ex.n
	f := make([]int, m)
	for i := range m {
		f[i] = -ex.lp.r[i]
		for j := range n {
			f[i] += ex.x[i][j]
		}
	}
	rowLab, colLab := make([]bool, m), make([]bool, n)
	rowPar, colPar := make([]int, m), make([]int, n)
	type node struct {
		row bool
		k   int
	}
	var queue []node
	for {
		any := false
		for i := range m {
			rowLab[i] = f[i] > 0
			rowPar[i] = -1
			if f[i] > 0 {
				any = true
				queue = append(queue, node{true, i})
			}
		}
		if !any {
			return nil
		}
		for j := range n {
			colLab[j] = false
		}
		found := -1
		for found < 0 {
			for len(queue) > 0 && found < 0 {
				nd := queue[0]
				queue = queue[1:]
				if nd.row {
					i := nd.k
					for j := range n {
						if !colLab[j] && ex.w[i][j] != nil && ex.status(i, j) == atLower {
							colLab[j], colPar[j] = true, i
							queue = append(queue, node{false, j})
						}
					}
					continue
				}
				j := nd.k
				for i := range m {
					if !rowLab[i] && ex.w[i][j] != nil && ex.status(i, j) == atUpper {
						rowLab[i], rowPar[i] = true, j
						if f[i] < 0 {
							found = i
							break
						}
						queue = append(queue, node{true, i})
					}
				}
			}
			if found >= 0 {
				break
			}
			// No path: scale the reached districts' divisors up and the
			// reached parties' divisors down by the least factor that puts
			// one more cell on a signpost.
			// Candidates as unreduced fractions, compared by cross
			// multiplication; only the least is reduced.
			var aN, aD, cN, cD, u, v, sv big.Int
			have := false
			for i := range m {
				for j := range n {
					if ex.w[i][j] == nil || rowLab[i] == colLab[j] {
						continue
					}
					var sn, sd uint64
					if rowLab[i] {
						// its quotient falls to its lower signpost:
						// alpha = q/s(a-1) = w·sd·den(d)·den(e) / (sn·num(d)·num(e))
						if ex.x[i][j] <= ex.fl {
							continue
						}
						sn, sd = ex.lp.rd.sign(ex.x[i][j] - 1)
						cN.Mul(ex.w[i][j], sv.SetUint64(sd))
						cN.Mul(&cN, ex.d[i].Denom())
						cN.Mul(&cN, ex.e[j].Denom())
						cD.Mul(ex.d[i].Num(), ex.e[j].Num())
						cD.Mul(&cD, sv.SetUint64(sn))
					} else {
						// its quotient rises to its upper signpost:
						// alpha = s(a)/q
						sn, sd = ex.lp.rd.sign(ex.x[i][j])
						cD.Mul(ex.w[i][j], sv.SetUint64(sd))
						cD.Mul(&cD, ex.d[i].Denom())
						cD.Mul(&cD, ex.e[j].Denom())
						cN.Mul(ex.d[i].Num(), ex.e[j].Num())
						cN.Mul(&cN, sv.SetUint64(sn))
					}
					if !have || u.Mul(&cN, &aD).Cmp(v.Mul(&aN, &cD)) < 0 {
						aN.Set(&cN)
						aD.Set(&cD)
						have = true
					}
				}
			}
			if !have {
				return errInfeasible
			}
			alpha := new(big.Rat).SetFrac(&aN, &aD)
			for i := range m {
				if rowLab[i] {
					ex.d[i] = new(big.Rat).Mul(ex.d[i], alpha)
				}
			}
			for j := range n {
				if colLab[j] {
					ex.e[j] = new(big.Rat).Quo(ex.e[j], alpha)
				}
			}
			// Expand every labelled district and party again: the cells
			// the scaling put on a signpost are reached from them.
			for i := range m {
				if rowLab[i] {
					queue = append(queue, node{true, i})
				}
			}
			for j := range n {
				if colLab[j] {
					queue = append(queue, node{false, j})
				}
			}
		}
		queue = queue[:0]
		// Move one seat along the path back to an over-full district.
		u := found
		f[u]++
		for {
			j := rowPar[u]
			ex.x[u][j]++
			i := colPar[j]
			ex.x[i][j]--
			u = i
			if rowPar[u] < 0 {
				break
			}
		}
		f[u]--
	}
}

// finish finds the ties at the exact solution, settles them by the tie
// rule when one is given, and makes the certificate.
func (ex *exactLower) finish(tieOrder func([]cellRef) []cellRef) (*lowerResult, error) {
	m, n := ex.m, ex.n
	st := make([][]int, m)
	for i := range m {
		st[i] = make([]int, n)
		for j := range n {
			st[i][j] = ex.status(i, j)
		}
	}
	comp, ncomp := sccs(m, n, st)
	size := make([]int, ncomp)
	for _, c := range comp {
		size[c]++
	}
	inTie := func(i, j int) bool {
		return st[i][j] != offSign && comp[i] == comp[m+j] && size[comp[i]] > 1
	}
	// Ties, by component.
	byComp := map[int]*lowerTie{}
	var order []int
	var tied []cellRef
	for i := range m {
		for j := range n {
			if !inTie(i, j) {
				continue
			}
			c := comp[i]
			t := byComp[c]
			if t == nil {
				t = &lowerTie{}
				byComp[c] = t
				order = append(order, c)
			}
			t.cells = append(t.cells, cellRef{i, j})
			if st[i][j] == atLower {
				t.seats++
			}
			tied = append(tied, cellRef{i, j})
		}
	}
	res := &lowerResult{exact: true}
	if len(tied) > 0 && tieOrder != nil {
		ex.settle(st, inTie, tieOrder(tied))
	}
	for _, c := range order {
		t := byComp[c]
		for _, cr := range t.cells {
			if st[cr.i][cr.j] == atLower && tieOrder != nil {
				t.winners = append(t.winners, cr)
			}
		}
		res.ties = append(res.ties, *t)
	}
	if err := ex.perturb(st, comp, ncomp, size); err != nil {
		return nil, err
	}
	keepR, keepC := make([]bool, m), make([]bool, n)
	for i := range m {
		keepR[i] = size[comp[i]] > 1
	}
	for j := range n {
		keepC[j] = size[comp[m+j]] > 1
	}
	ex.normalize()
	res.d, res.e = make([]string, m), make([]string, n)
	for i := range m {
		if keepR[i] {
			res.d[i] = ratText(ex.d[i], ex.lp.rd.sq)
		}
	}
	for j := range n {
		if keepC[j] {
			res.e[j] = ratText(ex.e[j], ex.lp.rd.sq)
		}
	}
	if !ex.shortestPass(false, res.e, keepC) || !ex.shortestPass(true, res.d, keepR) || !ex.shortestPass(false, res.e, keepC) {
		return nil, &Error{Index: -1, Msg: "internal error: no divisors found for the lower apportionment"}
	}
	// The certificate, checked exactly.
	res.strict = true
	for i := range m {
		for j := range n {
			ok, strict := ex.cellOK(i, j, ex.d[i], ex.e[j])
			if !ok || (!strict && !inTie(i, j) && ex.w[i][j] != nil) {
				return nil, &Error{Index: -1, Msg: "internal error: the divisors found do not certify the lower apportionment"}
			}
			if !strict && ex.w[i][j] != nil {
				res.strict = false
			}
		}
	}
	res.x = ex.copyX()
	if tieOrder == nil {
		for _, t := range res.ties {
			for _, cr := range t.cells {
				if st[cr.i][cr.j] == atLower {
					res.x[cr.i][cr.j]--
					res.unassigned++
				}
			}
		}
	}
	return res, nil
}

// settle gives the contested seats by the tie rule: taking the cells in the
// rule's order, each cell that could take a seat takes it when a cycle of
// cells not yet settled lets it, and is then settled.
func (ex *exactLower) settle(st [][]int, inTie func(i, j int) bool, order []cellRef) {
	m, n := ex.m, ex.n
	locked := make([][]bool, m)
	for i := range locked {
		locked[i] = make([]bool, n)
	}
	free := func(i, j int) bool { return !locked[i][j] && inTie(i, j) }
	rowPar, colPar := make([]int, m), make([]int, n)
	for _, c := range order {
		if st[c.i][c.j] == atUpper {
			// A cycle: +c, then in its column a cell that gives, in that
			// cell's row a cell that takes, ..., until a column with a
			// giving cell in c's row.
			for i := range rowPar {
				rowPar[i] = -2
			}
			for j := range colPar {
				colPar[j] = -2
			}
			colPar[c.j] = -1
			queue := []int{c.j}
			end := -1
			for len(queue) > 0 && end < 0 {
				j := queue[0]
				queue = queue[1:]
				if j != c.j && free(c.i, j) && st[c.i][j] == atLower {
					end = j
					break
				}
				for i := range m {
					if i == c.i || rowPar[i] != -2 || !free(i, j) || st[i][j] != atLower {
						continue
					}
					rowPar[i] = j
					for k := range n {
						if colPar[k] == -2 && free(i, k) && st[i][k] == atUpper {
							colPar[k] = i
							queue = append(queue, k)
						}
					}
				}
			}
			if end >= 0 {
				flip := func(i, j, by int) {
					ex.x[i][j] += by
					if by > 0 {
						st[i][j] = atLower
					} else {
						st[i][j] = atUpper
					}
				}
				flip(c.i, end, -1)
				for j := end; j != c.j; {
					i := colPar[j]
					flip(i, j, +1)
					j = rowPar[i]
					flip(i, j, -1)
				}
				flip(c.i, c.j, +1)
			}
		}
		locked[c.i][c.j] = true
	}
}

// sccs finds the strongly connected components of the graph of cells on
// signposts: district i → party j for a cell at its lower signpost, party j
// → district i for one at its upper. Nodes are the districts 0..m-1 and
// the parties m..m+n-1. Components are numbered in the order they are
// completed, so an edge between two components leads to one numbered
// lower.
func sccs(m, n int, st [][]int) (comp []int, ncomp int) {
	N := m + n
	succ := func(u int, f func(v int)) {
		if u < m {
			for j := range n {
				if st[u][j] == atLower {
					f(m + j)
				}
			}
			return
		}
		j := u - m
		for i := range m {
			if st[i][j] == atUpper {
				f(i)
			}
		}
	}
	adj := make([][]int, N)
	for u := range N {
		succ(u, func(v int) { adj[u] = append(adj[u], v) })
	}
	index := make([]int, N)
	low := make([]int, N)
	on := make([]bool, N)
	comp = make([]int, N)
	for u := range index {
		index[u] = -1
	}
	var stack []int
	next := 0
	type frame struct{ u, k int }
	for root := range N {
		if index[root] >= 0 {
			continue
		}
		call := []frame{{root, 0}}
		index[root], low[root] = next, next
		next++
		stack = append(stack, root)
		on[root] = true
		for len(call) > 0 {
			fr := &call[len(call)-1]
			u := fr.u
			if fr.k < len(adj[u]) {
				v := adj[u][fr.k]
				fr.k++
				if index[v] < 0 {
					index[v], low[v] = next, next
					next++
					stack = append(stack, v)
					on[v] = true
					call = append(call, frame{v, 0})
				} else if on[v] {
					low[u] = min(low[u], index[v])
				}
				continue
			}
			if low[u] == index[u] {
				for {
					v := stack[len(stack)-1]
					stack = stack[:len(stack)-1]
					on[v] = false
					comp[v] = ncomp
					if v == u {
						break
					}
				}
				ncomp++
			}
			call = call[:len(call)-1]
			if len(call) > 0 {
				p := call[len(call)-1].u
				low[p] = min(low[p], low[u])
			}
		}
	}
	return comp, ncomp
}

// perturb moves the divisors off the signposts that close no cycle: every
// district divisor is multiplied by (1+ε)^t and every party divisor by
// (1+ε)^-t, where t numbers the node's component along the graph's edges,
// so that every cell on a signpost outside a tie moves strictly inside. ε
// halves until every cell outside the ties is strict.
func (ex *exactLower) perturb(st [][]int, comp []int, ncomp int, size []int) error {
	m, n := ex.m, ex.n
	anyEdge := false
	for i := range m {
		for j := range n {
			if st[i][j] != offSign && !(comp[i] == comp[m+j] && size[comp[i]] > 1) {
				anyEdge = true
			}
		}
	}
	if !anyEdge {
		return nil
	}
	d0 := make([]*big.Rat, m)
	e0 := make([]*big.Rat, n)
	copy(d0, ex.d)
	copy(e0, ex.e)
	for k := uint(4); k < 400; k += 4 {
		base := new(big.Rat).SetFrac(new(big.Int).Add(new(big.Int).Lsh(big.NewInt(1), k), big.NewInt(1)), new(big.Int).Lsh(big.NewInt(1), k))
		pow := make([]*big.Rat, ncomp)
		pow[0] = big.NewRat(1, 1)
		for c := 1; c < ncomp; c++ {
			pow[c] = new(big.Rat).Mul(pow[c-1], base)
		}
		for i := range m {
			if d0[i] != nil {
				ex.d[i] = new(big.Rat).Mul(d0[i], pow[ncomp-1-comp[i]])
			}
		}
		for j := range n {
			if e0[j] != nil {
				ex.e[j] = new(big.Rat).Quo(e0[j], pow[ncomp-1-comp[m+j]])
			}
		}
		good := true
		for i := range m {
			for j := range n {
				if ex.w[i][j] == nil {
					continue
				}
				ok, strict := ex.cellOK(i, j, ex.d[i], ex.e[j])
				tie := comp[i] == comp[m+j] && size[comp[i]] > 1 && st[i][j] != offSign
				if !ok || (!strict && !tie) {
					good = false
					break
				}
			}
			if !good {
				break
			}
		}
		if good {
			return nil
		}
	}
	return &Error{Index: -1, Msg: "internal error: the divisors could not be moved off the signposts"}
}

// normalize scales the party divisors towards one by a factor 1, 2 or 5
// times a power of ten, and the district divisors the other way, which
// changes no quotient and keeps decimals decimal.
func (ex *exactLower) normalize() {
	sum, k := 0.0, 0
	for _, e := range ex.e {
		if e != nil {
			f, _ := e.Float64()
			if f > 0 {
				sum += math.Log10(f)
				k++
			}
		}
	}
	if k == 0 {
		return
	}
	mean := sum / float64(k)
	if ex.lp.rd.sq {
		mean /= 2
	}
	best, bestC, bestP := math.Inf(1), int64(1), 0
	for p := int(math.Floor(mean)) - 1; p <= int(math.Ceil(mean))+1; p++ {
		for _, c := range []int64{1, 2, 5} {
			if d := math.Abs(math.Log10(float64(c)) + float64(p) - mean); d < best {
				best, bestC, bestP = d, c, p
			}
		}
	}
	if bestC == 1 && bestP == 0 {
		return
	}
	f := new(big.Rat).SetInt(new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(abs(bestP))), nil))
	if bestP < 0 {
		f.Inv(f)
	}
	f.Mul(f, big.NewRat(bestC, 1))
	if ex.lp.rd.sq {
		f.Mul(f, f)
	}
	for i, d := range ex.d {
		if d != nil {
			ex.d[i] = new(big.Rat).Mul(d, f)
		}
	}
	for j, e := range ex.e {
		if e != nil {
			ex.e[j] = new(big.Rat).Quo(e, f)
		}
	}
}

// ratText writes an exact divisor: a decimal when it has one, else n/d;
// for Huntington–Hill (sq) the square root of the value, exactly when it
// is a rational square, else sqrt(n/d).
func ratText(r *big.Rat, sq bool) string {
	if r == nil {
		return ""
	}
	if sq {
		a, b := new(big.Int).Sqrt(r.Num()), new(big.Int).Sqrt(r.Denom())
		if new(big.Int).Mul(a, a).Cmp(r.Num()) == 0 && new(big.Int).Mul(b, b).Cmp(r.Denom()) == 0 {
			return ratText(new(big.Rat).SetFrac(a, b), false)
		}
		return "sqrt(" + r.Num().String() + "/" + r.Denom().String() + ")"
	}
	den := new(big.Int).Set(r.Denom())
	k := 0
	two, five := big.NewInt(2), big.NewInt(5)
	var q, rem big.Int
	for {
		q.QuoRem(den, two, &rem)
		if rem.Sign() != 0 {
			break
		}
		den.Set(&q)
		k++
	}
	k5 := 0
	for {
		q.QuoRem(den, five, &rem)
		if rem.Sign() != 0 {
			break
		}
		den.Set(&q)
		k5++
	}
	if den.Cmp(big.NewInt(1)) != 0 {
		return r.Num().String() + "/" + r.Denom().String()
	}
	p := max(k, k5)
	t := new(big.Int).Mul(r.Num(), new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(p)), nil))
	t.Quo(t, r.Denom())
	return decimalText(t, p)
}
