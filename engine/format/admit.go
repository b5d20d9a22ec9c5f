package format

import (
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/jsondoc"
)

// Admit returns the document of the new-states test: every old unit's
// seats before and after the admission under each method, the new unit's
// seats, and each method's finding.
func Admit(title string, a *analysis.AdmitSet) *Document {
	t := title
	if t == "" {
		t = "New unit admitted"
	}
	if f := a.First(); f != nil {
		t += ": " + f.Name + " with " + Plural(f.Added, "seat") + " (fair share " + analysis.Decimal(f.FairShare) +
			"), house " + strconv.Itoa(f.House) + " → " + strconv.Itoa(f.NewHouse)
	}
	d := &Document{Kind: "new-states", Title: t}
	lines := []string{"\"!\" marks an old unit whose seats change: the new-states paradox."}
	for k, m := range a.Methods {
		if r := a.Results[k]; r != nil {
			lines = append(lines, r.Text())
		} else {
			lines = append(lines, m.Name()+": cannot apportion: "+errText(a.Errors[k]))
		}
	}
	d.Body = []Block{admitTable(a), List{Items: lines}}
	d.Data = admitData(a)
	d.Tree = func() *Tree { return &Tree{Root: admitJSON(title, a)} }
	return d
}

// admitTable has one row per old unit with its seats before and after
// under each method, a row for the new unit and a row of the seats a tie
// left unassigned when one did.
func admitTable(a *analysis.AdmitSet) *Table {
	t := NewTable(Text("unit"), Numbers("population"))
	var before, after []*engine.Result
	for k, m := range a.Methods {
		t.Columns = append(t.Columns, Column{Name: m.String(), Number: true})
		if r := a.Results[k]; r != nil {
			before, after = append(before, r.Before), append(after, r.After)
		} else {
			before, after = append(before, nil), append(after, nil)
		}
	}
	f := a.First()
	if f == nil {
		return t
	}
	for i := range f.Before.Units {
		cells := []string{f.Before.Units[i].Name, f.Before.Units[i].Population.String()}
		for _, r := range a.Results {
			if r == nil {
				cells = append(cells, "error")
				continue
			}
			x, y := r.Before.Units[i].Seats, r.After.Units[i].Seats
			s := seatsPair(x, y)
			if x != y {
				s += " !"
			}
			cells = append(cells, s)
		}
		t.Add(cells...)
	}
	cells := []string{f.Name + " (new)", f.People.String()}
	for _, r := range a.Results {
		if r == nil {
			cells = append(cells, "error")
			continue
		}
		cells = append(cells, "+"+strconv.Itoa(r.NewSeats))
	}
	t.Add(cells...)
	if r := unassignedPairRow(before, after, 2); r != nil {
		t.Add(r...)
	}
	return t
}

// admitData has one row a method and unit, the new unit last (new true,
// its seats before empty): the house sizes, the seats added and the new
// unit's fair share, each unit's seats before and after and their
// change, ties and unassigned seats, and whether the method shows the
// new-states paradox.
func admitData(a *analysis.AdmitSet) *Table {
	st := SettingsOf(&a.Scenario)
	t := NewTable(st.columns(false, false), Text("method"), Numbers("house_before", "house_after", "added", "fair_share"), Text("unit", "new"),
		Numbers("population", "seats_before", "seats_after", "change"), Text("tied_before", "tied_after"), Numbers("unassigned_before", "unassigned_after"),
		Text("paradox", "error"))
	f := a.First()
	if f == nil {
		return t
	}
	lead := st.cells(false, false)
	for k, m := range a.Methods {
		r := a.Results[k]
		head := row(lead, m.String(), strconv.Itoa(f.House), strconv.Itoa(f.NewHouse), strconv.Itoa(f.Added), analysis.Decimal(f.FairShare))
		for i := 0; i <= len(f.Before.Units); i++ {
			isNew := i == len(f.Before.Units)
			name, pop := f.Name, f.People.String()
			if !isNew {
				name, pop = f.Before.Units[i].Name, f.Before.Units[i].Population.String()
			}
			cells := row(head, name, boolCell(isNew), pop)
			switch {
			case r == nil:
				cells = append(cells, "", "", "", "", "", "", "", "", errText(a.Errors[k]))
			case isNew:
				cells = append(cells, "", strconv.Itoa(r.NewSeats), "", "", boolCell(r.After.Units[i].Tied),
					strconv.Itoa(r.Before.Unassigned), strconv.Itoa(r.After.Unassigned), boolCell(r.Paradox()), "")
			default:
				b, af := r.Before.Units[i].Seats, r.After.Units[i].Seats
				cells = append(cells, strconv.Itoa(b), strconv.Itoa(af), strconv.Itoa(af-b), boolCell(r.Before.Units[i].Tied), boolCell(r.After.Units[i].Tied),
					strconv.Itoa(r.Before.Unassigned), strconv.Itoa(r.After.Unassigned), boolCell(r.Paradox()), "")
			}
			t.Add(cells...)
		}
	}
	return t
}

// admitJSON builds the new-states document.
func admitJSON(title string, a *analysis.AdmitSet) *jsondoc.Value {
	v := header("new-states", title)
	v.Set("unit", jsondoc.NewObject().Set("name", jsondoc.Str(strings.TrimSpace(a.Unit.Name))).Set("population", jsondoc.Str(a.Unit.Population.String())))
	if f := a.First(); f != nil {
		v.Set("fair_share", jsondoc.Str(analysis.Decimal(f.FairShare))).Set("fair_share_exact", jsondoc.Str(analysis.Fraction(f.FairShare)))
		v.Set("added", jsondoc.Int(f.Added)).Set("house_before", jsondoc.Int(f.House)).Set("house_after", jsondoc.Int(f.NewHouse))
	}
	results := jsondoc.NewArray()
	for k, m := range a.Methods {
		x := methodDoc(m)
		r := a.Results[k]
		if r == nil {
			x.Set("error", jsondoc.Str(a.Errors[k].Error()))
			results.Append(x)
			continue
		}
		x.Set("error", nil).Set("new_unit_seats", jsondoc.Int(r.NewSeats)).Set("paradox", jsondoc.Boolean(r.Paradox()))
		x.Set("changes", changesDoc(r.Changes))
		us := jsondoc.NewArray()
		for i := range r.Before.Units {
			us.Append(jsondoc.NewObject().Set("name", jsondoc.Str(r.Before.Units[i].Name)).
				Set("before", jsondoc.Int(r.Before.Units[i].Seats)).Set("after", jsondoc.Int(r.After.Units[i].Seats)))
		}
		x.Set("units", us).Set("unassigned_before", jsondoc.Int(r.Before.Unassigned)).Set("unassigned_after", jsondoc.Int(r.After.Unassigned))
		x.Set("text", jsondoc.Str(r.Text()))
		results.Append(x)
	}
	return v.Set("results", results)
}
