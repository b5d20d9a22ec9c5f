package election

import (
	"math/big"
	"math/rand/v2"
	"sort"

	"seatsmith/engine"
)

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
