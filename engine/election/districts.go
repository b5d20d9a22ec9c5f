package election

import (
	"sort"
	"strconv"

	"seatsmith/engine"
)

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
