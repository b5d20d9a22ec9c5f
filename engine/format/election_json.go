package format

import (
	"seatsmith/engine"
	"seatsmith/engine/election"
	"seatsmith/engine/jsondoc"
)

// ElectionJSON returns the election result document (JSON) of res; its
// schema is in the documentation of package engine/election.
func ElectionJSON(title string, res *election.Result) *jsondoc.Value {
	v := header(election.ResultKind, title)
	v.Set("version", jsondoc.Int(election.ResultVersion))
	v.Set("system", jsondoc.Str(res.System.String()))
	v.Set("system_name", jsondoc.Str(res.System.Name()))
	v.Set("method", jsondoc.Str(res.Method.String()))
	v.Set("method_name", jsondoc.Str(res.Method.Name()))
	v.Set("upper_method", methodOrNull(res.UpperMethod))
	v.Set("seats", jsondoc.Int(res.Seats))
	intIf := func(ok bool, n int) *jsondoc.Value {
		if ok {
			return jsondoc.Int(n)
		}
		return jsondoc.NullValue()
	}
	strIf := func(ok bool, s string) *jsondoc.Value {
		if ok {
			return jsondoc.Str(s)
		}
		return jsondoc.NullValue()
	}
	mm, tt, bp := res.System == election.MixedMember, res.System == election.TwoTier, res.System == election.Biproportional
	v.Set("base_seats", intIf(mm || tt, res.BaseSeats))
	v.Set("compensatory", intIf(tt, res.Compensatory))
	v.Set("overhang_rule", strIf(mm, res.Overhang.String()))
	v.Set("upper_basis", strIf(bp, res.UpperBasis.String()))
	ths := jsondoc.NewArray()
	for _, t := range res.Thresholds {
		o := jsondoc.NewObject()
		o.Set("share", jsondoc.Num(t.Share.String()))
		o.Set("scope", jsondoc.Str(t.Scope.String()))
		o.Set("base", jsondoc.Str(t.Base.String()))
		ths.Append(o)
	}
	v.Set("thresholds", ths)
	v.Set("alternative_wins", intIf(res.WinsThreshold > 0, res.WinsThreshold))
	v.Set("tie_rule", jsondoc.Str(res.TieRule.String()))
	v.Set("unassigned", jsondoc.Int(res.Unassigned))
	v.Set("pending", strIf(res.Pending != "", res.Pending))

	parties := jsondoc.NewArray()
	for _, p := range res.Parties {
		o := jsondoc.NewObject()
		o.Set("name", jsondoc.Str(p.Name))
		o.Set("votes", jsondoc.Num(p.Votes.String()))
		o.Set("qualified", jsondoc.Boolean(p.Qualified))
		o.Set("reason", jsondoc.Str(p.Reason))
		o.Set("exempt", jsondoc.Boolean(p.Exempt))
		o.Set("seats", jsondoc.Int(p.Seats))
		o.Set("district_seats", intIf(mm || tt, p.DistrictSeats))
		o.Set("list_seats", intIf(mm || tt, p.ListSeats))
		o.Set("entitlement", intIf(mm && p.Qualified, p.Entitlement))
		o.Set("overhang", intIf(mm && p.Qualified, p.Overhang))
		if bp && p.Qualified {
			o.Set("basis", jsondoc.Num(p.Basis.String()))
		} else {
			o.Set("basis", jsondoc.NullValue())
		}
		o.Set("divisor", strIf(bp && p.Divisor != "", p.Divisor))
		parties.Append(o)
	}
	v.Set("parties", parties)

	districts := jsondoc.NewArray()
	for _, d := range res.Districts {
		o := jsondoc.NewObject()
		o.Set("name", jsondoc.Str(d.Name))
		o.Set("seats", jsondoc.Int(d.Seats))
		o.Set("votes", jsondoc.Num(d.Votes.String()))
		o.Set("other_votes", jsondoc.Num(d.OtherVotes.String()))
		if d.Population != nil {
			o.Set("population", jsondoc.Num(d.Population.String()))
		} else {
			o.Set("population", jsondoc.NullValue())
		}
		o.Set("divisor", strIf(d.Divisor != "", d.Divisor))
		districts.Append(o)
	}
	v.Set("districts", districts)

	cells := jsondoc.NewArray()
	for _, c := range res.Cells {
		o := jsondoc.NewObject()
		o.Set("district", jsondoc.Str(res.Districts[c.District].Name))
		o.Set("party", jsondoc.Str(res.Parties[c.Party].Name))
		o.Set("votes", jsondoc.Num(c.Votes.String()))
		o.Set("seats", jsondoc.Int(c.Seats))
		o.Set("excluded", jsondoc.Boolean(c.Excluded))
		o.Set("tied", jsondoc.Boolean(c.Tied))
		cells.Append(o)
	}
	v.Set("cells", cells)

	ties := jsondoc.NewArray()
	for _, t := range res.Ties {
		o := jsondoc.NewObject()
		o.Set("stage", jsondoc.Str(t.Stage))
		o.Set("district", strIf(t.District >= 0, districtName(res, t.District)))
		names := func(idx []int, district bool) *jsondoc.Value {
			a := jsondoc.NewArray()
			for _, k := range idx {
				if district {
					a.Append(jsondoc.Str(res.Districts[k].Name))
				} else {
					a.Append(jsondoc.Str(res.Parties[k].Name))
				}
			}
			return a
		}
		cellsOf := func(cs []election.CellRef) *jsondoc.Value {
			a := jsondoc.NewArray()
			for _, c := range cs {
				co := jsondoc.NewObject()
				co.Set("district", jsondoc.Str(res.Districts[c.District].Name))
				co.Set("party", jsondoc.Str(res.Parties[c.Party].Name))
				a.Append(co)
			}
			return a
		}
		o.Set("districts", names(t.Districts, true))
		o.Set("parties", names(t.Parties, false))
		o.Set("cells", cellsOf(t.Cells))
		o.Set("seats", jsondoc.Int(t.Seats))
		o.Set("value", strIf(t.Value != "", t.Value))
		o.Set("rule", jsondoc.Str(t.Rule))
		if t.Stage == election.StageLower {
			o.Set("winners", cellsOf(t.WinnerCells))
		} else {
			o.Set("winners", names(t.Winners, t.Stage == election.StageDistrictSeats))
		}
		ties.Append(o)
	}
	v.Set("ties", ties)

	if res.Certificate != nil {
		c := jsondoc.NewObject()
		c.Set("checked", jsondoc.Boolean(true))
		c.Set("strict", jsondoc.Boolean(res.Certificate.Strict))
		c.Set("exact", jsondoc.Boolean(res.Certificate.Exact))
		v.Set("certificate", c)
	} else {
		v.Set("certificate", jsondoc.NullValue())
	}
	return v
}

func methodOrNull(m engine.Method) *jsondoc.Value {
	if m.Valid() {
		return jsondoc.Str(m.String())
	}
	return jsondoc.NullValue()
}

func districtName(res *election.Result, i int) string {
	if i >= 0 && i < len(res.Districts) {
		return res.Districts[i].Name
	}
	return ""
}
