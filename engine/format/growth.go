package format

import (
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/jsondoc"
)

// Growth returns the document of the population paradox search: each
// unit's populations, growth and seats before and after under each
// method, and each method's findings, which never say there is none where
// a tie leaves seats unassigned.
func Growth(title string, g *analysis.GrowthSet) *Document {
	t := title
	if t == "" {
		t = "Population paradox"
	}
	if f := g.First(); f != nil {
		t += ": house of " + strconv.Itoa(f.Before.Seats) + ", population " + f.Before.Total + " → " + f.After.Total
	}
	d := &Document{Kind: "population-paradox", Title: t}
	var lines []string
	for k, m := range g.Methods {
		r := g.Results[k]
		if r == nil {
			lines = append(lines, m.Name()+": cannot apportion: "+errText(g.Errors[k]))
			continue
		}
		var ties []string
		for _, t := range []string{tieText("the first apportionment", r.Before), tieText("the later apportionment", r.After)} {
			if t != "" {
				ties = append(ties, t)
			}
		}
		switch {
		case len(r.Findings) == 0 && len(ties) == 0:
			lines = append(lines, m.Name()+": no population paradox.")
		case len(r.Findings) == 0:
			lines = append(lines, m.Name()+": no population paradox among the seats held outright, but "+strings.Join(ties, ", and ")+
				"; how the tie is settled decides whether there is one.")
		default:
			for j := range r.Findings {
				lines = append(lines, r.Findings[j].Text())
			}
			if len(ties) > 0 {
				lines = append(lines, m.Name()+": "+strings.Join(ties, ", and ")+"; settling the tie may change these findings.")
			}
		}
	}
	d.Body = []Block{growthTable(g), List{Items: lines}}
	d.Data = growthData(g)
	d.Tree = func() *Tree { return &Tree{Root: growthJSON(title, g)} }
	return d
}

// tieText says how a tie leaves seats unassigned in a result: "" when
// none does. where names the apportionment ("the later apportionment").
func tieText(where string, r *engine.Result) string {
	if r == nil || r.Unassigned == 0 {
		return ""
	}
	var ts []string
	for _, t := range r.Ties {
		if len(t.Winners) == 0 {
			ts = append(ts, strings.Join(t.Names, ", ")+" tie for "+Plural(t.Seats, "seat"))
		}
	}
	return "a tie leaves " + Plural(r.Unassigned, "seat") + " unassigned in " + where + " (" + strings.Join(ts, "; ") + ")"
}

// seatsPair writes seats before and after: "3", or "4 → 5" when they
// differ.
func seatsPair(a, b int) string {
	if a == b {
		return strconv.Itoa(a)
	}
	return strconv.Itoa(a) + " → " + strconv.Itoa(b)
}

// unassignedPairRow is unassignedRow for results before and after a
// change: "0 → 1" where a tie leaves seats unassigned on either side; nil
// when none does.
func unassignedPairRow(before, after []*engine.Result, lead int) []string {
	any := false
	for k := range before {
		any = any || (before[k] != nil && (before[k].Unassigned > 0 || after[k].Unassigned > 0))
	}
	if !any {
		return nil
	}
	row := make([]string, lead, lead+len(before))
	row[0] = "(unassigned: tie)"
	for k := range before {
		if before[k] == nil {
			row = append(row, "")
			continue
		}
		row = append(row, seatsPair(before[k].Unassigned, after[k].Unassigned))
	}
	return row
}

// growthText writes a growth rate as a percentage, "-" from zero.
func growthText(from, to engine.Decimal) string {
	g := analysis.Growth(from, to)
	if g == nil {
		return "-"
	}
	return analysis.Percent(g)
}

// growthNumber writes a growth rate as a fraction of one (0.05 is five
// percent), "" from zero.
func growthNumber(from, to engine.Decimal) string {
	g := analysis.Growth(from, to)
	if g == nil {
		return ""
	}
	return analysis.Decimal(g)
}

// growthTable has one row per unit: populations, growth and the seats
// before and after under each method, and a row of the seats a tie left
// unassigned when one did.
func growthTable(g *analysis.GrowthSet) *Table {
	t := NewTable(Text("unit"), Numbers("before", "after", "growth"))
	var before, after []*engine.Result
	for k, m := range g.Methods {
		t.Columns = append(t.Columns, Column{Name: m.String(), Number: true})
		if r := g.Results[k]; r != nil {
			before, after = append(before, r.Before), append(after, r.After)
		} else {
			before, after = append(before, nil), append(after, nil)
		}
	}
	f := g.First()
	if f == nil {
		return t
	}
	for i := range f.Before.Units {
		bu, au := &f.Before.Units[i], &f.After.Units[i]
		cells := []string{bu.Name, bu.Population.String(), au.Population.String(), growthText(bu.Population, au.Population)}
		for _, r := range g.Results {
			if r == nil {
				cells = append(cells, "error")
				continue
			}
			cells = append(cells, seatsPair(r.Before.Units[i].Seats, r.After.Units[i].Seats))
		}
		t.Add(cells...)
	}
	if r := unassignedPairRow(before, after, 4); r != nil {
		t.Add(r...)
	}
	return t
}

// growthData has one row a method and unit: the populations, the growth
// rate (a fraction: 0.05 is five percent), the seats before and after and
// their change, the unit's ties and each apportionment's unassigned
// seats, and whether the unit loses or gains a seat in a population
// paradox.
func growthData(g *analysis.GrowthSet) *Table {
	st := SettingsOf(&g.Scenario)
	t := NewTable(st.columns(false, true), Text("method", "unit"), Numbers("population_before", "population_after", "growth", "seats_before", "seats_after", "change"),
		Text("tied_before", "tied_after"), Numbers("unassigned_before", "unassigned_after"), Text("paradox_loser", "paradox_gainer", "error"))
	f := g.First()
	if f == nil {
		return t
	}
	st.Seats = f.Before.Seats
	lead := st.cells(false, true)
	for k, m := range g.Methods {
		r := g.Results[k]
		losers, gainers := map[int]bool{}, map[int]bool{}
		if r != nil {
			for _, p := range r.Findings {
				losers[p.Loser.Unit], gainers[p.Gainer.Unit] = true, true
			}
		}
		for i := range f.Before.Units {
			bu, au := &f.Before.Units[i], &f.After.Units[i]
			cells := row(lead, m.String(), bu.Name, bu.Population.String(), au.Population.String(), growthNumber(bu.Population, au.Population))
			if r == nil {
				cells = append(cells, "", "", "", "", "", "", "", "", "", errText(g.Errors[k]))
			} else {
				b, a := r.Before.Units[i].Seats, r.After.Units[i].Seats
				cells = append(cells, strconv.Itoa(b), strconv.Itoa(a), strconv.Itoa(a-b), boolCell(r.Before.Units[i].Tied), boolCell(r.After.Units[i].Tied),
					strconv.Itoa(r.Before.Unassigned), strconv.Itoa(r.After.Unassigned), boolCell(losers[i]), boolCell(gainers[i]), "")
			}
			t.Add(cells...)
		}
	}
	return t
}

// growthJSON builds the population-paradox document.
func growthJSON(title string, g *analysis.GrowthSet) *jsondoc.Value {
	v := header("population-paradox", title)
	f := g.First()
	units := jsondoc.NewArray()
	if f != nil {
		v.Set("seats", jsondoc.Int(f.Before.Seats)).Set("total_before", jsondoc.Str(f.Before.Total)).Set("total_after", jsondoc.Str(f.After.Total))
		for i := range f.Before.Units {
			bu, au := &f.Before.Units[i], &f.After.Units[i]
			x := jsondoc.NewObject().Set("name", jsondoc.Str(bu.Name)).Set("before", jsondoc.Str(bu.Population.String())).
				Set("after", jsondoc.Str(au.Population.String()))
			if gr := analysis.Growth(bu.Population, au.Population); gr != nil {
				x.Set("growth", jsondoc.Str(analysis.Percent(gr))).Set("growth_exact", jsondoc.Str(analysis.Fraction(gr)))
			} else {
				x.Set("growth", nil).Set("growth_exact", nil)
			}
			units.Append(x)
		}
	}
	v.Set("units", units)
	results := jsondoc.NewArray()
	all := jsondoc.NewArray()
	for k, m := range g.Methods {
		x := methodDoc(m)
		r := g.Results[k]
		if r == nil {
			x.Set("error", jsondoc.Str(g.Errors[k].Error())).Set("seats_before", nil).Set("seats_after", nil).Set("paradoxes", nil)
			results.Append(x)
			continue
		}
		sb, sa := jsondoc.NewObject(), jsondoc.NewObject()
		for i := range r.Before.Units {
			sb.Set(r.Before.Units[i].Name, jsondoc.Int(r.Before.Units[i].Seats))
			sa.Set(r.After.Units[i].Name, jsondoc.Int(r.After.Units[i].Seats))
		}
		x.Set("error", nil).Set("seats_before", sb).Set("seats_after", sa).Set("paradoxes", jsondoc.Int(len(r.Findings)))
		x.Set("unassigned_before", jsondoc.Int(r.Before.Unassigned)).Set("unassigned_after", jsondoc.Int(r.After.Unassigned))
		results.Append(x)
		for j := range r.Findings {
			all.Append(populationDoc(&r.Findings[j]))
		}
	}
	return v.Set("results", results).Set("paradoxes", all)
}

func populationDoc(f *analysis.Population) *jsondoc.Value {
	side := func(c *analysis.PopulationChange) *jsondoc.Value {
		return jsondoc.NewObject().Set("unit", jsondoc.Str(c.Name)).Set("from", jsondoc.Str(c.From.String())).
			Set("to", jsondoc.Str(c.To.String())).Set("growth", jsondoc.Str(analysis.Percent(c.Growth))).
			Set("growth_exact", jsondoc.Str(analysis.Fraction(c.Growth))).
			Set("seats_before", jsondoc.Int(c.Before)).Set("seats_after", jsondoc.Int(c.After))
	}
	return jsondoc.NewObject().Set("kind", jsondoc.Str("population")).Set("method", jsondoc.Str(f.Method.String())).
		Set("house", jsondoc.Int(f.House)).Set("unit", jsondoc.Str(f.Loser.Name)).
		Set("loser", side(&f.Loser)).Set("gainer", side(&f.Gainer)).
		Set("faster", jsondoc.Boolean(f.Faster)).Set("tied", jsondoc.Boolean(f.Tied)).Set("text", jsondoc.Str(f.Text()))
}
