package election

import (
	"math/big"
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
