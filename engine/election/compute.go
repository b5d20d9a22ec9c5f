package election

import (
	"math/big"
	"math/rand/v2"
	"sort"
	"strconv"

	"seatsmith/engine"
)

// Compute apportions the election's seats by its system and explains the
// result. It returns an *Error for a scenario that is invalid or cannot be
// apportioned.
func Compute(s *Scenario) (*Result, error) {
	p, err := prepare(s)
	if err != nil {
		return nil, err
	}
	res := p.skeleton()
	switch s.System {
	case Districts:
		err = p.districts(res)
	case Biproportional:
		err = p.biproportional(res)
	case TwoTier:
		err = p.twoTier(res)
	case MixedMember:
		err = p.mixedMember(res)
	}
	if err != nil {
		return nil, err
	}
	cells := cellIndex(res)
	for _, t := range res.Ties {
		for _, c := range t.Cells {
			cells[c].Tied = true
		}
		if t.Stage == StageDistrict {
			for _, j := range t.Parties {
				cells[CellRef{t.District, j}].Tied = true
			}
		}
	}
	if err := Verify(res); err != nil {
		return nil, &Error{Index: -1, Msg: "internal error: the certificate does not check: " + err.Error()}
	}
	return res, nil
}

// skeleton is the result before any seat is given.
func (p *prepared) skeleton() *Result {
	s := p.s
	res := &Result{System: s.System, Method: s.Method, TieRule: s.Tie, Overhang: s.Overhang, UpperBasis: s.UpperBasis, DistrictSeats: p.seatsRes,
		Thresholds: append([]Threshold(nil), s.Thresholds...), WinsThreshold: s.WinsThreshold}
	if s.System == Biproportional || s.System == TwoTier {
		res.UpperMethod = s.upperMethod()
	}
	for j, q := range p.parties {
		res.Parties = append(res.Parties, PartyResult{Name: q.name, Votes: p.totalDecimal(p.partyTotal(j)), Exempt: q.exempt})
	}
	var x big.Int
	for i, name := range p.names {
		t := new(big.Int)
		for _, v := range p.v[i] {
			t.Add(t, x.SetUint64(v))
		}
		res.Districts = append(res.Districts, DistrictResult{Name: name, Seats: p.seats[i], Votes: p.totalDecimal(t),
			OtherVotes: p.decimalOf(p.other[i]), Population: s.Districts[i].Population})
	}
	for i := range p.v {
		for j := range p.v[i] {
			if r := p.row[i][j]; r >= 0 {
				res.Cells = append(res.Cells, Cell{District: i, Party: j, Row: r, Votes: p.decimalOf(p.v[i][j])})
			}
		}
	}
	sort.Slice(res.Cells, func(a, b int) bool { return res.Cells[a].Row < res.Cells[b].Row })
	if p.seatsRes != nil {
		res.Ties = append(res.Ties, p.engineTies(p.seatsRes, StageDistrictSeats, -1, nil)...)
		res.Unassigned += p.seatsRes.Unassigned
	}
	return res
}

// totalDecimal writes a total of scaled votes as a Decimal; a total above
// 10^18 (which no engine apportionment accepts) keeps its largest value.
func (p *prepared) totalDecimal(x *big.Int) engine.Decimal {
	if d, ok := p.bigDecimal(x); ok {
		return d
	}
	return engine.Decimal{Coef: engine.MaxCoefficient, Places: p.places}
}

// cellIndex maps district and party to the result's cells.
func cellIndex(res *Result) map[CellRef]*Cell {
	m := make(map[CellRef]*Cell, len(res.Cells))
	for k := range res.Cells {
		c := &res.Cells[k]
		m[CellRef{c.District, c.Party}] = c
	}
	return m
}

// partyRef names where party j was given: its party entry, or the first
// vote row naming it.
func (p *prepared) partyError(j int, field, msg string) *Error {
	q := p.parties[j]
	msg = strconv.Quote(q.name) + ": " + msg
	if q.index >= 0 {
		return partyErr(q.index, field, msg)
	}
	return voteErr(q.firstVote, field, msg)
}

// allot apportions seats among the parties idx with the given populations
// (and minimums, when mins is not nil) and locates an error at the party
// it concerns.
func (p *prepared) allot(idx []int, pop []engine.Decimal, mins []int, seats int, m engine.Method, stage string) (*engine.Result, error) {
	units := make([]engine.Unit, len(idx))
	for k, j := range idx {
		units[k] = engine.Unit{Name: p.parties[j].name, Population: pop[k]}
		if mins != nil {
			mn := mins[k]
			units[k].Min = &mn
		}
	}
	res, err := engine.Allot(&engine.Scenario{Units: units, Seats: seats, Method: m, Tie: p.s.Tie}, 0)
	if err != nil {
		ee, ok := err.(*engine.Error)
		if !ok {
			return nil, err
		}
		if ee.Unit >= 0 && ee.Unit < len(idx) {
			return nil, p.partyError(idx[ee.Unit], "votes", "in the "+stage+" apportionment: "+ee.Msg)
		}
		return nil, scenarioErr("seats", "the "+stage+" apportionment: "+ee.Msg)
	}
	return res, nil
}

// engineTies turns an engine result's ties into the election's, mapping
// units to parties through idx (to districts when idx is nil).
func (p *prepared) engineTies(r *engine.Result, stage string, district int, idx []int) []Tie {
	var out []Tie
	for _, t := range r.Ties {
		tie := Tie{Stage: stage, District: district, Seats: t.Seats, Value: t.Value.Text, Rule: t.Rule}
		for _, u := range t.Units {
			if idx == nil {
				tie.Districts = append(tie.Districts, u)
			} else {
				tie.Parties = append(tie.Parties, idx[u])
			}
		}
		for _, u := range t.Winners {
			if idx == nil {
				tie.Winners = append(tie.Winners, u)
			} else {
				tie.Winners = append(tie.Winners, idx[u])
			}
		}
		out = append(out, tie)
	}
	return out
}

// districtApportion apportions district i among the parties that may take
// seats there (ok[j] and its in-district thresholds) and records the
// seats in the result's cells.
func (p *prepared) districtApportion(res *Result, i int, ok []bool, cells map[CellRef]*Cell) error {
	var idx []int
	var pop []engine.Decimal
	for j := range p.parties {
		c := cells[CellRef{i, j}]
		if c == nil {
			continue
		}
		if !ok[j] || !p.inDistrict(i, j) {
			c.Excluded = true
			continue
		}
		idx = append(idx, j)
		pop = append(pop, p.decimalOf(p.v[i][j]))
	}
	// The district's units in the order of its vote rows, which a tie
	// rule by input order follows.
	order := make([]int, len(idx))
	for k := range order {
		order[k] = k
	}
	sort.SliceStable(order, func(a, b int) bool { return p.row[i][idx[order[a]]] < p.row[i][idx[order[b]]] })
	idx2, pop2 := make([]int, len(idx)), make([]engine.Decimal, len(idx))
	for k, o := range order {
		idx2[k], pop2[k] = idx[o], pop[o]
	}
	idx, pop = idx2, pop2
	d := &res.Districts[i]
	if p.seats[i] == 0 {
		return nil
	}
	if len(idx) == 0 {
		return districtErr(i, "seats", strconv.Quote(p.names[i])+": no party may take a seat here")
	}
	units := make([]engine.Unit, len(idx))
	for k, j := range idx {
		units[k] = engine.Unit{Name: p.parties[j].name, Population: pop[k]}
	}
	r, err := engine.Allot(&engine.Scenario{Units: units, Seats: p.seats[i], Method: p.s.Method, Tie: p.s.Tie}, 0)
	if err != nil {
		msg := err.Error()
		if ee, ok := err.(*engine.Error); ok {
			msg = ee.Msg
		}
		return districtErr(i, "seats", strconv.Quote(p.names[i])+": "+msg)
	}
	d.Result, d.Parties = r, idx
	if r.Divisor != nil {
		d.Divisor = r.Divisor.Certificate
	}
	for k, j := range idx {
		cells[CellRef{i, j}].Seats = r.Units[k].Seats
	}
	res.Ties = append(res.Ties, p.engineTies(r, StageDistrict, i, idx)...)
	res.Unassigned += r.Unassigned
	return nil
}

// districts: every district on its own.
func (p *prepared) districts(res *Result) error {
	ok, why := p.qualify(nil)
	cells := cellIndex(res)
	for i := range p.names {
		if err := p.districtApportion(res, i, ok, cells); err != nil {
			return err
		}
	}
	p.sumParties(res, ok, why)
	res.Seats = sum(p.seats)
	return nil
}

// sumParties fills in each party's qualification and seats from the cells.
func (p *prepared) sumParties(res *Result, ok []bool, why []string) {
	for j := range res.Parties {
		res.Parties[j].Qualified, res.Parties[j].Reason = ok[j], why[j]
		res.Parties[j].Seats = 0
	}
	for _, c := range res.Cells {
		res.Parties[c.Party].Seats += c.Seats
	}
}

func sum(xs []int) int {
	t := 0
	for _, x := range xs {
		t += x
	}
	return t
}

// biproportional: the upper apportionment, then the lower.
func (p *prepared) biproportional(res *Result) error {
	s := p.s
	ok, why := p.qualify(nil)
	cells := cellIndex(res)
	m := len(p.names)
	var idx []int
	col := make([]int, len(p.parties))
	for j := range p.parties {
		col[j] = -1
		if ok[j] {
			col[j] = len(idx)
			idx = append(idx, j)
		}
	}
	res.Seats = sum(p.seats)
	for j := range res.Parties {
		res.Parties[j].Qualified, res.Parties[j].Reason = ok[j], why[j]
	}
	if len(idx) == 0 {
		return scenarioErr("thresholds", "no party qualifies for seats")
	}
	// Eligible votes, and the basis of the upper apportionment.
	v := make([][]uint64, m)
	basis := make([]engine.Decimal, len(idx))
	ten := new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(p.places)), nil)
	for i := range m {
		v[i] = make([]uint64, len(idx))
		for k, j := range idx {
			c := cells[CellRef{i, j}]
			if c != nil && p.inDistrict(i, j) {
				v[i][k] = p.v[i][j]
			} else if c != nil {
				c.Excluded = true
			}
		}
	}
	for j := range p.parties {
		if !ok[j] {
			for i := range m {
				if c := cells[CellRef{i, j}]; c != nil {
					c.Excluded = true
				}
			}
		}
	}
	for k, j := range idx {
		t := new(big.Int)
		var x big.Int
		for i := range m {
			if s.UpperBasis == Voters {
				if p.seats[i] == 0 {
					continue
				}
				// round(v / (seats·10^places)), halves up
				den := new(big.Int).Mul(big.NewInt(int64(p.seats[i])), ten)
				num := new(big.Int).Mul(x.SetUint64(v[i][k]), big.NewInt(2))
				num.Add(num, den)
				num.Quo(num, den.Mul(den, big.NewInt(2)))
				t.Add(t, num)
			} else {
				t.Add(t, x.SetUint64(v[i][k]))
			}
		}
		if s.UpperBasis == Voters {
			if !t.IsUint64() || t.Uint64() > engine.MaxCoefficient {
				return p.partyError(j, "votes", "the voter number is larger than 10^18")
			}
			basis[k] = engine.Whole(t.Uint64())
		} else {
			d, good := p.bigDecimal(t)
			if !good {
				return p.partyError(j, "votes", "the votes add up to more than 10^18")
			}
			basis[k] = d
		}
		res.Parties[j].Basis = basis[k]
	}
	if p.seatsRes != nil && p.seatsRes.Unassigned > 0 {
		res.Pending = "the lower apportionment waits for the tie in the districts' seats to be settled"
		return nil
	}
	upper, err := p.allot(idx, basis, nil, res.Seats, s.upperMethod(), "upper")
	if err != nil {
		return err
	}
	res.Upper = upper
	res.Ties = append(res.Ties, p.engineTies(upper, StageUpper, -1, idx)...)
	res.Unassigned += upper.Unassigned
	for k, j := range idx {
		res.Parties[j].Seats = upper.Units[k].Seats
	}
	if upper.Unassigned > 0 {
		res.Pending = "the lower apportionment waits for the tie in the parties' seats to be settled"
		return nil
	}
	c := make([]int, len(idx))
	for k := range idx {
		c[k] = upper.Units[k].Seats
	}
	lp := &lowerProblem{v: v, r: p.seats, c: c, rd: roundingOf(s.Method)}
	var order func([]cellRef) []cellRef
	if s.Tie.Kind != engine.TieReport {
		order = func(tied []cellRef) []cellRef {
			out := append([]cellRef(nil), tied...)
			sort.Slice(out, func(a, b int) bool {
				return p.row[out[a].i][idx[out[a].j]] < p.row[out[b].i][idx[out[b].j]]
			})
			if s.Tie.Kind == engine.TieByLot {
				r := rand.New(rand.NewPCG(s.Tie.Seed, 0x5ea75a1d))
				r.Shuffle(len(out), func(a, b int) { out[a], out[b] = out[b], out[a] })
			}
			return out
		}
	}
	lr, err := solveLower(lp, order)
	if err != nil {
		return err
	}
	res.Certificate = &Certificate{Strict: lr.strict, Exact: lr.exact}
	for i := range m {
		res.Districts[i].Divisor = shiftDivisor(lr.d[i], p.places)
		for k, j := range idx {
			if cl := cells[CellRef{i, j}]; cl != nil {
				cl.Seats = lr.x[i][k]
			}
		}
	}
	for k, j := range idx {
		res.Parties[j].Divisor = lr.e[k]
	}
	for _, t := range lr.ties {
		tie := Tie{Stage: StageLower, District: -1, Seats: t.seats, Rule: s.Tie.String()}
		for _, cr := range t.cells {
			tie.Cells = append(tie.Cells, CellRef{cr.i, idx[cr.j]})
		}
		for _, cr := range t.winners {
			tie.WinnerCells = append(tie.WinnerCells, CellRef{cr.i, idx[cr.j]})
		}
		res.Ties = append(res.Ties, tie)
	}
	res.Unassigned += lr.unassigned
	for j := range res.Parties {
		res.Parties[j].Seats = 0
	}
	for _, cl := range res.Cells {
		res.Parties[cl.Party].Seats += cl.Seats
	}
	return nil
}

// nationalList records every party's qualification and district seats,
// and returns the qualifying parties with their votes over the election,
// and the district seats the others keep (which come off the house).
func (p *prepared) nationalList(res *Result, ok []bool, why []string, dseats []int) (idx []int, pop []engine.Decimal, kept int, err error) {
	for j := range p.parties {
		pr := &res.Parties[j]
		pr.Qualified, pr.Reason = ok[j], why[j]
		pr.DistrictSeats, pr.Seats = dseats[j], dseats[j]
		if !ok[j] {
			kept += dseats[j]
			continue
		}
		d, good := p.bigDecimal(p.partyTotal(j))
		if !good {
			return nil, nil, 0, p.partyError(j, "votes", "the votes add up to more than 10^18")
		}
		idx = append(idx, j)
		pop = append(pop, d)
	}
	return idx, pop, kept, nil
}

// twoTier: the districts, then the compensatory seats.
func (p *prepared) twoTier(res *Result) error {
	s := p.s
	all := make([]bool, len(p.parties))
	for j := range all {
		all[j] = true
	}
	cells := cellIndex(res)
	for i := range p.names {
		if err := p.districtApportion(res, i, all, cells); err != nil {
			return err
		}
	}
	dseats := make([]int, len(p.parties))
	for _, c := range res.Cells {
		dseats[c.Party] += c.Seats
	}
	ok, why := p.qualify(dseats)
	res.BaseSeats = sum(p.seats)
	res.Compensatory = s.Compensatory
	house := res.BaseSeats + s.Compensatory
	if house > engine.MaxSeats {
		return scenarioErr("compensatory", "the house would have more than "+strconv.Itoa(engine.MaxSeats)+" seats")
	}
	idx, pop, kept, err := p.nationalList(res, ok, why, dseats)
	if err != nil {
		return err
	}
	house -= kept
	mins := make([]int, len(idx))
	for k, j := range idx {
		mins[k] = dseats[j]
	}
	res.Seats = res.BaseSeats + s.Compensatory
	if len(idx) == 0 {
		if s.Compensatory > 0 {
			return scenarioErr("compensatory", "no party qualifies for the compensatory seats")
		}
		return nil
	}
	nat, err := p.allot(idx, pop, mins, house, s.upperMethod(), "national")
	if err != nil {
		return err
	}
	res.Upper = nat
	res.Ties = append(res.Ties, p.engineTies(nat, StageNational, -1, idx)...)
	res.Unassigned += nat.Unassigned
	for k, j := range idx {
		res.Parties[j].Seats = nat.Units[k].Seats
		res.Parties[j].ListSeats = nat.Units[k].Seats - dseats[j]
	}
	return nil
}

// mixedMember: list seats fill each party's total above its district wins.
func (p *prepared) mixedMember(res *Result) error {
	s := p.s
	n := len(p.parties)
	wins := make([]int, n)
	for j, q := range p.parties {
		wins[j] = q.wins
	}
	ok, why := p.qualify(wins)
	cells := cellIndex(res)
	for i := range p.names {
		for j := range p.parties {
			if c := cells[CellRef{i, j}]; c != nil {
				c.Wins = 0
			}
		}
	}
	for k, v := range s.Votes {
		if v.Wins > 0 {
			for ci := range res.Cells {
				if res.Cells[ci].Row == k {
					res.Cells[ci].Wins = v.Wins
					res.Cells[ci].Seats = v.Wins
				}
			}
		}
	}
	idx, pop, kept, err := p.nationalList(res, ok, why, wins)
	if err != nil {
		return err
	}
	house0 := s.Seats - kept
	qualWins := 0
	for _, j := range idx {
		qualWins += wins[j]
	}
	if house0 < 0 {
		return scenarioErr("seats", "the district wins of parties without list seats add up to more than the house size")
	}
	res.BaseSeats = s.Seats
	if len(idx) == 0 {
		res.Seats = s.Seats - house0
		if house0 > 0 {
			return scenarioErr("thresholds", "no party qualifies for list seats")
		}
		return nil
	}
	if house0 == 0 {
		return scenarioErr("seats", "no seats are left for the lists once the district wins of parties without list seats are taken off")
	}
	m := s.Method
	var final *engine.Result
	switch s.Overhang {
	case Fixed:
		if qualWins > house0 {
			return scenarioErr("seats", "the qualifying parties' district wins ("+strconv.Itoa(qualWins)+") exceed the "+strconv.Itoa(house0)+" seats of the house, which this overhang rule keeps")
		}
		mins := make([]int, len(idx))
		for k, j := range idx {
			mins[k] = wins[j]
		}
		ent, err := p.allot(idx, pop, nil, house0, m, "list")
		if err != nil {
			return err
		}
		final, err = p.allot(idx, pop, mins, house0, m, "list")
		if err != nil {
			return err
		}
		for k, j := range idx {
			res.Parties[j].Entitlement = ent.Units[k].Seats
		}
		res.Entitlement = ent
	case Level:
		ent, err := p.allot(idx, pop, nil, house0, m, "list")
		if err != nil {
			return err
		}
		for k, j := range idx {
			res.Parties[j].Entitlement = ent.Units[k].Seats
		}
		res.Entitlement = ent
		final, err = p.level(idx, pop, wins, house0, ent)
		if err != nil {
			return err
		}
	default: // Keep
		var err error
		final, err = p.allot(idx, pop, nil, house0, m, "list")
		if err != nil {
			return err
		}
		for k, j := range idx {
			res.Parties[j].Entitlement = final.Units[k].Seats
		}
	}
	res.Upper = final
	res.Ties = append(res.Ties, p.engineTies(final, StageList, -1, idx)...)
	res.Unassigned += final.Unassigned
	total := s.Seats - house0 // wins kept by parties without lists
	for k, j := range idx {
		pr := &res.Parties[j]
		got := final.Units[k].Seats
		pr.Overhang = max(0, wins[j]-pr.Entitlement)
		pr.Seats = max(got, wins[j])
		pr.ListSeats = pr.Seats - wins[j]
		total += pr.Seats
	}
	res.Seats = total + final.Unassigned
	return nil
}

// level finds the smallest house, from house0 up, at which the list
// apportionment gives every party at least its district wins (counting
// the seats it holds outright), and returns that apportionment. Divisor
// methods are house monotone, so the size is found by doubling and then
// halving the range; largest-remainder methods are not, so the sizes are
// tried one by one between the size below which some party's quota
// cannot reach its wins and the size at which every quota does.
func (p *prepared) level(idx []int, pop []engine.Decimal, wins []int, house0 int, ent *engine.Result) (*engine.Result, error) {
	m := p.s.Method
	short := func(r *engine.Result) bool {
		for k, j := range idx {
			if r.Units[k].Seats < wins[j] {
				return true
			}
		}
		return false
	}
	if !short(ent) {
		return ent, nil
	}
	try := func(h int) (*engine.Result, error) { return p.allot(idx, pop, nil, h, m, "list") }
	tooMany := scenarioErr("seats", "levelling the overhang would need a house of more than "+strconv.Itoa(engine.MaxSeats)+" seats")
	if m.IsDivisor() {
		lo, hi := house0, house0
		var good *engine.Result
		for step := 1; ; step *= 2 {
			hi = lo + step
			if hi > engine.MaxSeats {
				hi = engine.MaxSeats
			}
			r, err := try(hi)
			if err != nil {
				return nil, err
			}
			if !short(r) {
				good = r
				break
			}
			if hi == engine.MaxSeats {
				return nil, tooMany
			}
			lo = hi
		}
		// lo is short, hi is not.
		for hi-lo > 1 {
			mid := lo + (hi-lo)/2
			r, err := try(mid)
			if err != nil {
				return nil, err
			}
			if short(r) {
				lo = mid
			} else {
				hi, good = mid, r
			}
		}
		return good, nil
	}
	// Largest remainders: a party's seats lie within one of its quota
	// w·H/P, so no size below (wins−1)·P/v can serve and every size from
	// wins·P/v on does.
	total := new(big.Int)
	for _, d := range pop {
		total.Add(total, new(big.Int).SetUint64(d.Coef))
	}
	from, to := int64(house0), int64(house0)
	for k, j := range idx {
		if wins[j] == 0 {
			continue
		}
		if pop[k].Coef == 0 {
			return nil, p.partyError(j, "votes", "a party without list votes cannot be levelled up to its district wins")
		}
		v := new(big.Int).SetUint64(pop[k].Coef)
		need := new(big.Int).Mul(total, big.NewInt(int64(wins[j]-1)))
		need.Quo(need, v)
		enough := new(big.Int).Mul(total, big.NewInt(int64(wins[j])))
		enough.Add(enough, new(big.Int).Sub(v, big.NewInt(1)))
		enough.Quo(enough, v)
		if !enough.IsInt64() || enough.Int64() > engine.MaxSeats {
			return nil, tooMany
		}
		from = max(from, need.Int64())
		to = max(to, enough.Int64())
	}
	const maxTrials = 200_000
	if to-from > maxTrials {
		return nil, scenarioErr("seats", "levelling the overhang by a largest-remainder method would mean trying more than "+strconv.Itoa(maxTrials)+" house sizes")
	}
	for h := max(from, int64(house0)); h <= to+int64(len(idx)); h++ {
		r, err := try(int(h))
		if err != nil {
			return nil, err
		}
		if !short(r) {
			return r, nil
		}
	}
	return nil, tooMany
}
