package election

import (
	"strconv"

	"seatsmith/engine"
)

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
