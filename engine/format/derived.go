package format

import (
	"strconv"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/jsondoc"
)

// Derived returns the document of a derived body: the house's seats plus
// a fixed number per unit, each unit's share of it against its share of
// the population. s is the scenario apportioned.
func Derived(title string, d *analysis.DerivedBody, s *engine.Scenario) *Document {
	t := title
	if t == "" {
		t = "Derived body"
	}
	r := d.Result
	doc := &Document{Kind: "derived-body", Title: t + ": " + Plural(r.Seats, "seat") + " by " + r.Method.Name() + " plus " + strconv.Itoa(d.Plus) +
		" per unit = " + strconv.Itoa(d.Size)}
	lines := []string{"body/pop is the unit's share of the body over its share of the population: above 1 it weighs more than its people.",
		"Gallagher index: house " + fmtG(d.HouseIndices[1]) + ", body " + fmtG(d.BodyIndices[1]) +
			"; Loosemore–Hanby: house " + fmtG(d.HouseIndices[0]) + "%, body " + fmtG(d.BodyIndices[0]) + "% (float64, display only)"}
	for i := range r.Ties {
		s := "TIE: " + TieText(&r.Ties[i], unitName(r))
		if len(r.Ties[i].Winners) == 0 {
			s += " (in the house and in the body)"
		}
		lines = append(lines, s)
	}
	doc.Body = []Block{derivedTable(d), List{Items: lines}}
	st := SettingsOf(s)
	st.Method, st.Seats = r.Method, r.Seats
	doc.Data = derivedData(st, d)
	doc.Tree = func() *Tree { return &Tree{Root: derivedJSON(title, d)} }
	return doc
}

// derivedTable has one row per unit of a derived body, and a row of the
// seats a tie left unassigned when one did.
func derivedTable(d *analysis.DerivedBody) *Table {
	t := NewTable(Text("unit"), Numbers("population", "pop. share", "seats", "house share", "body seats", "body share", "body/pop"))
	for i, u := range d.Units {
		w := "-"
		if u.Weight != nil {
			w = analysis.Decimal(u.Weight)
		}
		t.Add(u.Name, d.Result.Units[i].Population.String(), analysis.Percent(u.PopShare), strconv.Itoa(u.Seats),
			analysis.Percent(u.HouseShare), strconv.Itoa(u.Body), analysis.Percent(u.BodyShare), w)
	}
	if n := d.Result.Unassigned; n > 0 {
		t.Add("(unassigned: tie)", "", "", strconv.Itoa(n), "", strconv.Itoa(n), "", "")
	}
	return t
}

// derivedData has one row a unit of a derived body: the seats added to
// every unit, the unit's population, shares and weights (exact fractions
// to six places), seats in the house and in the body, its tie and the
// house's unassigned seats.
func derivedData(st Settings, d *analysis.DerivedBody) *Table {
	t := NewTable(st.columns(true, true), Numbers("plus", "body_size"), Text("unit", "counted"), Numbers("population", "population_share", "seats",
		"house_share", "house_weight", "body_seats", "body_share", "body_weight"), Text("tied"), Numbers("unassigned"))
	r := d.Result
	lead := append(st.cells(true, true), strconv.Itoa(d.Plus), strconv.Itoa(d.Size))
	for i, u := range d.Units {
		hw, bw := "", ""
		if u.Weight != nil {
			hw, bw = analysis.Decimal(u.HouseWeight), analysis.Decimal(u.Weight)
		}
		t.Add(row(lead, u.Name, boolCell(u.Counted), r.Units[i].Population.String(), analysis.Decimal(u.PopShare),
			strconv.Itoa(u.Seats), analysis.Decimal(u.HouseShare), hw, strconv.Itoa(u.Body), analysis.Decimal(u.BodyShare), bw,
			boolCell(r.Units[i].Tied), strconv.Itoa(r.Unassigned))...)
	}
	return t
}

// derivedJSON builds the derived-body document.
func derivedJSON(title string, d *analysis.DerivedBody) *jsondoc.Value {
	v := header("derived-body", title)
	r := d.Result
	v.Set("method", jsondoc.Str(r.Method.String())).Set("method_name", jsondoc.Str(r.Method.Name()))
	v.Set("seats", jsondoc.Int(r.Seats)).Set("plus", jsondoc.Int(d.Plus)).Set("body_seats", jsondoc.Int(d.Size)).Set("total", jsondoc.Str(r.Total))
	units := jsondoc.NewArray()
	for i, u := range d.Units {
		x := jsondoc.NewObject().Set("name", jsondoc.Str(u.Name)).Set("population", jsondoc.Str(r.Units[i].Population.String()))
		x.Set("counted", jsondoc.Boolean(u.Counted))
		x.Set("population_share", jsondoc.Str(analysis.Decimal(u.PopShare)))
		x.Set("seats", jsondoc.Int(u.Seats)).Set("house_share", jsondoc.Str(analysis.Decimal(u.HouseShare)))
		x.Set("body_seats", jsondoc.Int(u.Body)).Set("body_share", jsondoc.Str(analysis.Decimal(u.BodyShare)))
		if u.Weight != nil {
			x.Set("house_weight", jsondoc.Str(analysis.Decimal(u.HouseWeight))).Set("body_weight", jsondoc.Str(analysis.Decimal(u.Weight)))
		} else {
			x.Set("house_weight", nil).Set("body_weight", nil)
		}
		units.Append(x)
	}
	v.Set("units", units)
	idx := func(a [3]float64) *jsondoc.Value {
		return jsondoc.NewObject().Set("loosemore_hanby", jsondoc.Float(round6(a[0]))).Set("gallagher", jsondoc.Float(round6(a[1]))).
			Set("sainte_lague", jsondoc.Float(round6(a[2])))
	}
	v.Set("ties", Ties(r)).Set("unassigned", jsondoc.Int(r.Unassigned))
	return v.Set("measures", jsondoc.NewObject().Set("house", idx(d.HouseIndices)).Set("body", idx(d.BodyIndices)))
}
