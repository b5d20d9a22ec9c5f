package format

import (
	"strconv"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/jsondoc"
)

// Comparison returns the document of one scenario apportioned by several
// methods.
func Comparison(title string, c *analysis.Comparison) *Document {
	d := &Document{Kind: "comparison", Title: title}
	if d.Title == "" {
		d.Title = "Methods compared"
	}
	if f := c.First(); f != nil {
		d.Body = append(d.Body, Paragraph{capital(Plural(len(c.Methods), "method")) + ", " + Plural(f.Seats, "seat") + ", population " + f.Total + "."})
	}
	d.Body = append(d.Body, comparisonTable(c), List{Items: comparisonNotes(c)})
	d.Data = ComparisonData(c)
	d.Tree = func() *Tree { return &Tree{Root: ComparisonJSON(title, c)} }
	return d
}

// comparisonTable has one row per unit with its seats under each method:
// a seat count that breaks quota is marked with "!", and the last column
// says whether the methods differ for the unit. A last row gives the
// seats a tie left unassigned, when one did.
func comparisonTable(c *analysis.Comparison) *Table {
	t := NewTable(Text("unit"), Numbers("population", "quota"))
	for _, m := range c.Methods {
		t.Columns = append(t.Columns, Column{Name: m.String(), Number: true})
	}
	t.Columns = append(t.Columns, Column{Name: "differs"})
	first := c.First()
	if first == nil {
		return t
	}
	for i := range first.Units {
		u := &first.Units[i]
		row := []string{u.Name, u.Population.String(), u.Quota.Text}
		for _, r := range c.Results {
			if r == nil {
				row = append(row, "error")
				continue
			}
			s := strconv.Itoa(r.Units[i].Seats)
			if !r.Units[i].MeetsQuota {
				s = "!" + s
			}
			row = append(row, s)
		}
		mark := ""
		if c.Differs(i) {
			mark = "*"
		}
		t.Add(append(row, mark)...)
	}
	if row := unassignedRow(c.Results, 3); row != nil {
		t.Add(append(row, "")...)
	}
	return t
}

// unassignedRow is a table row, after lead cells (the first naming the
// row), with the seats a tie left unassigned in each result, so that a
// column of seats never sums short in silence; nil when every seat is
// assigned.
func unassignedRow(rs []*engine.Result, lead int) []string {
	any := false
	for _, r := range rs {
		any = any || (r != nil && r.Unassigned > 0)
	}
	if !any {
		return nil
	}
	row := make([]string, lead, lead+len(rs))
	row[0] = "(unassigned: tie)"
	for _, r := range rs {
		if r == nil {
			row = append(row, "")
			continue
		}
		row = append(row, strconv.Itoa(r.Unassigned))
	}
	return row
}

func comparisonNotes(c *analysis.Comparison) []string {
	notes := []string{"\"!\" marks seats outside the unit's lower and upper quota; \"*\" marks units the methods treat differently."}
	for k, m := range c.Methods {
		r := c.Results[k]
		if r == nil {
			notes = append(notes, m.String()+": cannot apportion this scenario: "+errText(c.Errors[k]))
			continue
		}
		if v := c.QuotaViolations(k); v > 0 {
			notes = append(notes, m.String()+": breaks quota for "+Plural(v, "unit"))
		}
		for i := range r.Ties {
			notes = append(notes, m.String()+": TIE: "+TieText(&r.Ties[i], unitName(r)))
		}
	}
	return notes
}

// ComparisonData is the comparison's data table, one row a method and unit
// (methods in order, then units): the unit's quota and seats by that
// method, whether they meet quota, the unit's tie, the method's
// unassigned seats, whether the methods differ for the unit, and the
// method's error (its seats then empty).
func ComparisonData(c *analysis.Comparison) *Table {
	st := SettingsOf(&c.Scenario)
	t := NewTable(st.columns(false, true), Text("method", "unit"), Numbers("population", "min", "max", "quota", "lower_quota", "upper_quota", "seats"),
		Text("meets_quota", "tied"), Numbers("unassigned"), Text("differs", "error"))
	first := c.First()
	if first == nil {
		return t
	}
	st.Seats = first.Seats
	lead := st.cells(false, true)
	for k, m := range c.Methods {
		r := c.Results[k]
		for i := range first.Units {
			u := &first.Units[i]
			cells := row(lead, m.String(), u.Name, u.Population.String(), strconv.Itoa(u.Min), maxCell(u.Max),
				u.Quota.Text, strconv.Itoa(u.Lower), strconv.Itoa(u.Upper))
			if r == nil {
				cells = append(cells, "", "", "", "", boolCell(c.Differs(i)), errText(c.Errors[k]))
			} else {
				ru := &r.Units[i]
				cells = append(cells, strconv.Itoa(ru.Seats), boolCell(ru.MeetsQuota), boolCell(ru.Tied), strconv.Itoa(r.Unassigned), boolCell(c.Differs(i)), "")
			}
			t.Add(cells...)
		}
	}
	return t
}

// ComparisonJSON returns the comparison document (JSON).
func ComparisonJSON(title string, c *analysis.Comparison) *jsondoc.Value {
	v := header("comparison", title)
	first := c.First()
	ids := jsondoc.NewArray()
	for _, m := range c.Methods {
		ids.Append(jsondoc.Str(m.String()))
	}
	if first != nil {
		v.Set("seats", jsondoc.Int(first.Seats)).Set("total", jsondoc.Str(first.Total))
	}
	v.Set("methods", ids)
	units := jsondoc.NewArray()
	if first != nil {
		for i := range first.Units {
			u := &first.Units[i]
			x := jsondoc.NewObject().Set("name", jsondoc.Str(u.Name)).Set("population", jsondoc.Str(u.Population.String()))
			x.Set("quota", jsondoc.Str(u.Quota.Text)).Set("lower_quota", jsondoc.Int(u.Lower)).Set("upper_quota", jsondoc.Int(u.Upper))
			seats := jsondoc.NewObject()
			breaks := jsondoc.NewArray()
			for k, m := range c.Methods {
				r := c.Results[k]
				if r == nil {
					seats.Set(m.String(), nil)
					continue
				}
				seats.Set(m.String(), jsondoc.Int(r.Units[i].Seats))
				if !r.Units[i].MeetsQuota {
					breaks.Append(jsondoc.Str(m.String()))
				}
			}
			x.Set("seats", seats).Set("differs", jsondoc.Boolean(c.Differs(i))).Set("breaks_quota", breaks)
			units.Append(x)
		}
	}
	v.Set("units", units)
	results := jsondoc.NewArray()
	for k, m := range c.Methods {
		x := methodDoc(m)
		if r := c.Results[k]; r != nil {
			x.Set("error", nil).Set("ties", Ties(r)).Set("unassigned", jsondoc.Int(r.Unassigned))
			x.Set("quota_violations", jsondoc.Int(c.QuotaViolations(k)))
		} else {
			x.Set("error", jsondoc.Str(c.Errors[k].Error())).Set("ties", jsondoc.NewArray()).Set("unassigned", nil).Set("quota_violations", nil)
		}
		results.Append(x)
	}
	return v.Set("results", results)
}
