package election

import (
	"math/big"
	"strconv"

	"seatsmith/engine"
)

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
