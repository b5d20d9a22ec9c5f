package election

import (
	"strconv"
	"testing"

	"pgregory.net/rapid"

	"seatsmith/engine"
)

var errNoUnits = &Error{Msg: "no units"}

func divisorMethods() []engine.Method {
	var ms []engine.Method
	for _, m := range engine.Methods() {
		if m.IsDivisor() {
			ms = append(ms, m)
		}
	}
	return ms
}

// genElection draws a small election: m districts, n parties, votes from a
// range small enough to make ties common when small is set.
func genElection(t *rapid.T, system System, methods []engine.Method) *Scenario {
	m := rapid.IntRange(1, 5).Draw(t, "districts")
	n := rapid.IntRange(1, 5).Draw(t, "parties")
	maxVotes := rapid.SampledFrom([]uint64{4, 20, 1000, 1_000_000}).Draw(t, "maxVotes")
	method := rapid.SampledFrom(methods).Draw(t, "method")
	s := &Scenario{System: system, Method: method}
	for i := range m {
		s.Districts = append(s.Districts, District{Name: "D" + strconv.Itoa(i), Seats: rapid.IntRange(1, 12).Draw(t, "seats")})
	}
	for i := range m {
		for j := range n {
			if rapid.IntRange(0, 5).Draw(t, "present") == 0 {
				continue
			}
			v := rapid.Uint64Range(0, maxVotes).Draw(t, "votes")
			s.Votes = append(s.Votes, Vote{District: s.Districts[i].Name, Party: "P" + strconv.Itoa(j), Votes: engine.Whole(v)})
		}
	}
	if len(s.Votes) == 0 {
		s.Votes = append(s.Votes, Vote{District: "D0", Party: "P0", Votes: engine.Whole(1)})
	}
	s.Tie = rapid.SampledFrom([]engine.TieRule{{}, {Kind: engine.TieByOrder}, {Kind: engine.TieByLot, Seed: 7}}).Draw(t, "tie")
	return s
}

// Every biproportional result satisfies its own certificate, its rows and
// columns add up (the seats a tie leaves open counted), and it fails only
// when no apportionment with seats only where a party has votes exists.
func TestPropertyBiproportionalCertificate(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		s := genElection(t, Biproportional, divisorMethods())
		res, err := Compute(s)
		if err != nil {
			if err == errInfeasible {
				if res2 := feasibleBrute(t, s); res2 {
					t.Fatalf("refused as infeasible, but margins can be met: %v", err)
				}
				return
			}
			if e, ok := err.(*Error); ok && (e.Field == "seats" || e.Field == "votes" || e.Field == "thresholds") {
				return // the upper apportionment refused (Adams with too few seats, say)
			}
			t.Fatalf("Compute: %v", err)
		}
		if res.Pending != "" {
			return
		}
		if err := Verify(res); err != nil {
			t.Fatalf("certificate: %v", err)
		}
		rows := make([]int, len(res.Districts))
		cols := make([]int, len(res.Parties))
		for _, c := range res.Cells {
			rows[c.District] += c.Seats
			cols[c.Party] += c.Seats
		}
		open := 0
		for _, tie := range res.Ties {
			if tie.Stage == StageLower && s.Tie.Kind == engine.TieReport {
				open += tie.Seats
			}
			if tie.Stage == StageLower && s.Tie.Kind != engine.TieReport && len(tie.WinnerCells) != tie.Seats {
				t.Fatalf("a settled tie of %d seats has %d winners", tie.Seats, len(tie.WinnerCells))
			}
		}
		if open != res.Unassigned {
			t.Fatalf("ties contest %d seats, %d unassigned", open, res.Unassigned)
		}
		sr, sc := 0, 0
		for i, d := range res.Districts {
			sr += d.Seats - rows[i]
			if rows[i] > d.Seats {
				t.Fatalf("district %s holds %d of %d seats", d.Name, rows[i], d.Seats)
			}
		}
		for j, p := range res.Parties {
			sc += p.Seats - cols[j]
		}
		if sr != res.Unassigned || (res.Unassigned == 0 && sc != 0) {
			t.Fatalf("rows short by %d, columns by %d, unassigned %d", sr, sc, res.Unassigned)
		}
		for _, tie := range res.Ties {
			if tie.Stage == StageLower && res.Certificate.Strict {
				t.Fatalf("a strict certificate with ties %v", res.Ties)
			}
		}
	})
}

// feasibleBrute decides by a maximum flow whether seats can meet the
// districts' seats and the parties' totals with seats only where a party
// has votes (and at least one in each such cell for methods whose first
// signpost is zero). It recomputes the parties' totals by the engine.
func feasibleBrute(t *rapid.T, s *Scenario) bool {
	p, err := prepare(s)
	if err != nil {
		return false
	}
	var idx []int
	var pop []engine.Decimal
	for j := range p.parties {
		idx = append(idx, j)
		pop = append(pop, p.decimalOf(p.partyTotal(j).Uint64()))
	}
	up, err := p.allot(idx, pop, nil, sum(p.seats), s.upperMethod(), "upper")
	if err != nil || up.Unassigned > 0 {
		return false
	}
	m, n := len(p.names), len(idx)
	fl := roundingOf(s.Method).floor()
	r := append([]int(nil), p.seats...)
	c := make([]int, n)
	for k := range idx {
		c[k] = up.Units[k].Seats
	}
	// lower bounds first
	for i := range m {
		for j := range n {
			if p.v[i][j] > 0 {
				r[i] -= fl
				c[j] -= fl
			}
		}
	}
	for i := range m {
		if r[i] < 0 {
			return false
		}
	}
	for j := range n {
		if c[j] < 0 {
			return false
		}
	}
	// max flow source → rows → cells → columns → sink
	N := m + n + 2
	src, snk := m+n, m+n+1
	capm := make([][]int, N)
	for i := range capm {
		capm[i] = make([]int, N)
	}
	need := 0
	for i := range m {
		capm[src][i] = r[i]
		need += r[i]
		for j := range n {
			if p.v[i][j] > 0 {
				capm[i][m+j] = 1 << 30
			}
		}
	}
	for j := range n {
		capm[m+j][snk] = c[j]
	}
	flow := 0
	for {
		prev := make([]int, N)
		for i := range prev {
			prev[i] = -1
		}
		prev[src] = src
		q := []int{src}
		for len(q) > 0 && prev[snk] < 0 {
			u := q[0]
			q = q[1:]
			for v := range N {
				if prev[v] < 0 && capm[u][v] > 0 {
					prev[v] = u
					q = append(q, v)
				}
			}
		}
		if prev[snk] < 0 {
			break
		}
		f := 1 << 30
		for v := snk; v != src; v = prev[v] {
			f = min(f, capm[prev[v]][v])
		}
		for v := snk; v != src; v = prev[v] {
			capm[prev[v]][v] -= f
			capm[v][prev[v]] += f
		}
		flow += f
	}
	return flow == need
}

// With one district, the biproportional result is the plain method's.
func TestPropertyBiproportionalOneDistrict(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		method := rapid.SampledFrom(divisorMethods()).Draw(t, "method")
		n := rapid.IntRange(1, 8).Draw(t, "parties")
		seats := rapid.IntRange(1, 30).Draw(t, "seats")
		s := &Scenario{System: Biproportional, Method: method, Districts: []District{{Name: "Only", Seats: seats}}}
		var units []engine.Unit
		for j := range n {
			v := engine.Whole(rapid.Uint64Range(1, 100000).Draw(t, "votes"))
			s.Votes = append(s.Votes, Vote{District: "Only", Party: "P" + strconv.Itoa(j), Votes: v})
			units = append(units, engine.Unit{Name: "P" + strconv.Itoa(j), Population: v})
		}
		plain, perr := engine.Allot(&engine.Scenario{Units: units, Seats: seats, Method: method}, 0)
		res, err := Compute(s)
		if (perr != nil) != (err != nil) {
			t.Fatalf("plain error %v, biproportional error %v", perr, err)
		}
		if err != nil {
			return
		}
		for j, u := range plain.Units {
			got := res.Cells[j].Seats
			if res.Pending != "" {
				got = res.Parties[j].Seats
			}
			if got != u.Seats {
				t.Fatalf("%s: %d seats, plain %s gives %d", u.Name, got, method, u.Seats)
			}
		}
		if plain.Unassigned != res.Unassigned {
			t.Fatalf("unassigned %d, plain %d", res.Unassigned, plain.Unassigned)
		}
	})
}

// Per-district results are the engine's, district by district, with the
// threshold within the district measured on the votes for lists.
func TestPropertyDistrictsEqualAllot(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		s := genElection(t, Districts, engine.Methods())
		var th engine.Decimal
		if rapid.Bool().Draw(t, "threshold") {
			th = engine.Decimal{Coef: uint64(rapid.IntRange(1, 30).Draw(t, "share")), Places: 2}
			s.Thresholds = []Threshold{{Share: th, Scope: InDistrict, Base: Lists}}
		}
		res, err := Compute(s)
		failed := len(s.Districts)
		if err != nil {
			e, ok := err.(*Error)
			if !ok || e.Part != "districts" {
				t.Fatalf("Compute: %v", err)
			}
			failed = e.Index
		}
		for i, d := range s.Districts {
			if i > failed {
				break
			}
			var units []engine.Unit
			var cells []*Cell
			for k, v := range s.Votes {
				if v.District != d.Name {
					continue
				}
				units = append(units, engine.Unit{Name: v.Party, Population: v.Votes})
				if res != nil {
					for ci := range res.Cells {
						if res.Cells[ci].Row == k {
							cells = append(cells, &res.Cells[ci])
						}
					}
				}
			}
			var want *engine.Result
			var werr error = errNoUnits
			if len(units) > 0 {
				want, werr = engine.Allot(&engine.Scenario{Units: units, Seats: d.Seats, Method: s.Method, Threshold: th, Tie: s.Tie}, 0)
			}
			if res == nil {
				// Only the district the election refused is checked: the
				// engine must refuse it too.
				if i == failed && werr == nil {
					t.Fatalf("district %s: the election refuses (%v), the engine does not", d.Name, err)
				}
				continue
			}
			if werr != nil {
				t.Fatalf("district %s: the engine refuses (%v), the election does not", d.Name, werr)
			}
			for k, u := range want.Units {
				if cells[k].Seats != u.Seats {
					t.Fatalf("district %s, %s: %d seats, engine %d", d.Name, u.Name, cells[k].Seats, u.Seats)
				}
			}
			if res.Districts[i].Result.Unassigned != want.Unassigned {
				t.Fatalf("district %s: unassigned differ", d.Name)
			}
		}
		if err != nil {
			return
		}
		total := 0
		for _, p := range res.Parties {
			total += p.Seats
		}
		if total+res.Unassigned != res.Seats {
			t.Fatalf("parties hold %d + %d open of %d seats", total, res.Unassigned, res.Seats)
		}
	})
}

// The exact procedure and the proven estimate give the same seats when
// the lower apportionment is unique; when it is not, both are checked
// lower apportionments.
func TestPropertyExactMatchesEstimate(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		m := rapid.IntRange(1, 6).Draw(t, "m")
		n := rapid.IntRange(1, 6).Draw(t, "n")
		method := rapid.SampledFrom(divisorMethods()).Draw(t, "method")
		rd := roundingOf(method)
		v := make([][]uint64, m)
		for i := range v {
			v[i] = make([]uint64, n)
			for j := range v[i] {
				v[i][j] = rapid.Uint64Range(1, 5000).Draw(t, "v")
			}
		}
		// Margins from a matrix of valid seats, so a solution exists.
		r, c := make([]int, m), make([]int, n)
		for i := range m {
			for j := range n {
				x := rapid.IntRange(rd.floor(), 6).Draw(t, "x")
				r[i] += x
				c[j] += x
			}
		}
		lp := &lowerProblem{v: v, r: r, c: c, rd: rd}
		a, errA := solveLower(lp, nil)
		ex := newExactLower(lp)
		ex.start(nil)
		errB := ex.tieAndTransfer()
		var b *lowerResult
		if errB == nil {
			b, errB = ex.finish(nil)
		}
		if (errA != nil) != (errB != nil) {
			t.Fatalf("estimate %v, exact %v", errA, errB)
		}
		if errA != nil {
			return
		}
		if a.strict != b.strict || len(a.ties) != len(b.ties) || a.unassigned != b.unassigned {
			t.Fatalf("estimate strict %v ties %d, exact strict %v ties %d", a.strict, len(a.ties), b.strict, len(b.ties))
		}
		if a.strict {
			for i := range m {
				for j := range n {
					if a.x[i][j] != b.x[i][j] {
						t.Fatalf("cell %d,%d: %d against %d", i, j, a.x[i][j], b.x[i][j])
					}
				}
			}
		}
	})
}

// A two-tier result never takes a district seat away, places every
// compensatory seat, and matches the engine's apportionment with the
// district seats as minimums.
func TestPropertyTwoTier(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		s := genElection(t, TwoTier, engine.Methods())
		s.Compensatory = rapid.IntRange(0, 15).Draw(t, "compensatory")
		s.Tie = engine.TieRule{Kind: engine.TieByOrder}
		res, err := Compute(s)
		if err != nil {
			return
		}
		total := 0
		for _, p := range res.Parties {
			if p.Seats < p.DistrictSeats {
				t.Fatalf("%s: %d seats below its %d district seats", p.Name, p.Seats, p.DistrictSeats)
			}
			total += p.Seats
		}
		if total != res.Seats {
			t.Fatalf("parties hold %d of %d seats", total, res.Seats)
		}
	})
}

// Mixed-member: kept overhang adds exactly the overhang; levelling leaves
// none and never a smaller house; a fixed house stays its size.
func TestPropertyMixedMember(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		n := rapid.IntRange(1, 6).Draw(t, "parties")
		base := rapid.IntRange(5, 60).Draw(t, "seats")
		method := rapid.SampledFrom(engine.Methods()).Draw(t, "method")
		s := &Scenario{System: MixedMember, Method: method, Seats: base, Tie: engine.TieRule{Kind: engine.TieByOrder}}
		wins := 0
		for j := range n {
			w := rapid.IntRange(0, base/n).Draw(t, "wins")
			wins += w
			name := "P" + strconv.Itoa(j)
			s.Parties = append(s.Parties, Party{Name: name, Wins: w})
			s.Votes = append(s.Votes, Vote{Party: name, Votes: engine.Whole(rapid.Uint64Range(1, 100000).Draw(t, "votes"))})
		}
		results := map[OverhangRule]*Result{}
		for _, rule := range []OverhangRule{Keep, Level, Fixed} {
			s.Overhang = rule
			res, err := Compute(s)
			if err != nil {
				return
			}
			results[rule] = res
			over := 0
			for _, p := range res.Parties {
				if p.Seats < p.DistrictSeats {
					t.Fatalf("%s: %s holds %d seats, below its %d wins", rule, p.Name, p.Seats, p.DistrictSeats)
				}
				over += p.Overhang
			}
			switch rule {
			case Keep:
				if res.Seats != base+over {
					t.Fatalf("keep: house %d, base %d + overhang %d", res.Seats, base, over)
				}
			case Fixed:
				if res.Seats != base {
					t.Fatalf("fixed: house %d, base %d", res.Seats, base)
				}
			case Level:
				if res.Seats < base {
					t.Fatalf("level: house %d below base %d", res.Seats, base)
				}
				for _, p := range res.Parties {
					if p.Qualified && p.Seats > p.DistrictSeats && p.Seats != p.ListSeats+p.DistrictSeats {
						t.Fatalf("level: %s's seats do not add up", p.Name)
					}
				}
			}
		}
		if results[Level].Seats < results[Keep].Seats && method.IsDivisor() {
			t.Fatalf("levelling gave a smaller house (%d) than keeping the overhang (%d)", results[Level].Seats, results[Keep].Seats)
		}
	})
}

// At the divisors a tied result reports, the other lower apportionments
// are exactly the other roundings of the tied cells that keep every total:
// there is at least one for every tie, every tied cell changes in one of
// them, and with a strict certificate there is none.
func TestPropertyTiesAreAlternatives(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		m := rapid.IntRange(1, 3).Draw(t, "m")
		n := rapid.IntRange(1, 3).Draw(t, "n")
		method := rapid.SampledFrom(divisorMethods()).Draw(t, "method")
		rd := roundingOf(method)
		v := make([][]uint64, m)
		r, c := make([]int, m), make([]int, n)
		for i := range v {
			v[i] = make([]uint64, n)
			for j := range v[i] {
				v[i][j] = rapid.Uint64Range(1, 3).Draw(t, "v")
				x := rapid.IntRange(rd.floor(), 3).Draw(t, "x")
				r[i] += x
				c[j] += x
			}
		}
		lp := &lowerProblem{v: v, r: r, c: c, rd: rd}
		res, err := solveLower(lp, nil)
		if err != nil {
			t.Fatalf("margins from a valid matrix refused: %v", err)
		}
		// The same problem with ties settled by input order: a complete
		// lower apportionment, with the same ties.
		full, err := solveLower(lp, func(c []cellRef) []cellRef { return c })
		if err != nil {
			t.Fatal(err)
		}
		if len(full.ties) != len(res.ties) {
			t.Fatalf("%d ties reported, %d settled", len(res.ties), len(full.ties))
		}
		ex := newExactLower(lp)
		for i := range m {
			copy(ex.x[i], full.x[i])
			ex.d[i], _ = parseDivisor(full.d[i], rd.sq)
		}
		for j := range n {
			ex.e[j], _ = parseDivisor(full.e[j], rd.sq)
		}
		tied := map[cellRef]bool{}
		for _, tie := range full.ties {
			for _, cr := range tie.cells {
				tied[cr] = true
			}
		}
		open := 0
		for _, tie := range res.ties {
			open += tie.seats
		}
		if open != res.unassigned || sumAll(full.x)-sumAll(res.x) != open {
			t.Fatalf("ties contest %d seats, %d unassigned, settling gave %d", open, res.unassigned, sumAll(full.x)-sumAll(res.x))
		}
		// Every combination of the tied cells' two roundings.
		var cells []cellRef
		for cr := range tied {
			cells = append(cells, cr)
		}
		changed := map[cellRef]bool{}
		found := 0
		base := ex.copyX()
		for mask := 0; mask < 1<<len(cells); mask++ {
			x := ex.copyX()
			for k, cr := range cells {
				if mask>>k&1 == 0 {
					continue
				}
				if ex.status(cr.i, cr.j) == atLower {
					x[cr.i][cr.j]--
				} else {
					x[cr.i][cr.j]++
				}
			}
			if !lp.rowsFit(x) || !lp.columnsFit(x) {
				continue
			}
			same := true
			for i := range m {
				for j := range n {
					if x[i][j] != base[i][j] {
						same = false
						changed[cellRef{i, j}] = true
					}
				}
			}
			if !same {
				found++
			}
		}
		if res.strict && (found > 0 || len(res.ties) > 0) {
			t.Fatalf("strict certificate, yet %d alternatives and %d ties", found, len(res.ties))
		}
		if len(res.ties) > 0 && found == 0 {
			t.Fatalf("ties %v reported, but no alternative keeps the totals", res.ties)
		}
		for cr := range tied {
			if !changed[cr] {
				t.Fatalf("cell %v reported tied, but no alternative changes it", cr)
			}
		}
	})
}

func sumAll(x [][]int) int {
	s := 0
	for _, r := range x {
		s += sum(r)
	}
	return s
}
