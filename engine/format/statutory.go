package format

import (
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/jsondoc"
)

// FixedRatio returns the document of a house whose size follows from a
// fixed ratio of people to seats: each unit's quotient, its rounding by
// the method, its seats, and the house size they add up to. s is the
// scenario apportioned (only its settings are read).
func FixedRatio(title string, f *analysis.FixedRatio, s *engine.Scenario) *Document {
	t := title
	if t == "" {
		t = "Fixed ratio"
	}
	d := &Document{Kind: "fixed-ratio", Title: t + ": one seat per " + f.Ratio.String() + " people gives " + Plural(f.Seats, "seat")}
	d.Body = []Block{Paragraph{f.Text()}, ratioTable(f), Paragraph{ratioLegend(f.Method)}}
	var ties []string
	for _, u := range f.Units {
		if !u.Tied {
			continue
		}
		s := "TIE: " + u.Name + "'s quotient " + u.Quotient + " is exactly on the signpost " + u.Lower + ": " +
			strconv.Itoa(u.Rounded) + " or " + strconv.Itoa(u.Rounded+1) + " seats"
		switch {
		case u.AtMin || u.AtMax:
			s += "; its bound decides (" + strconv.Itoa(u.Seats) + ")"
		case u.Won:
			s += "; settled by " + f.Tie.String() + ": rounded up to " + strconv.Itoa(u.Seats)
		case f.Tie.Kind == engine.TieByLot:
			s += "; settled by " + f.Tie.String() + ": rounded down to " + strconv.Itoa(u.Seats)
		default:
			s += "; not settled: 1 seat left open (the statute must say which way the rounding goes)"
		}
		ties = append(ties, s)
	}
	if len(ties) > 0 {
		d.Body = append(d.Body, List{Items: ties})
	}
	d.Data = ratioData(f, s)
	d.Tree = func() *Tree { return &Tree{Root: ratioJSON(title, f)} }
	return d
}

// ratioLegend says what the fixed-ratio table's columns mean.
func ratioLegend(m engine.Method) string {
	return "quotient: the unit's population over the ratio, exactly (six places unless shorter); " +
		"rounded: the seats " + m.Name() + " rounds it to, the number of its signposts the quotient passes; " +
		"between: the signposts it lies between, or the one it is exactly on (a tie); " +
		"seats: what the unit holds, within its minimum and maximum. The house size is the sum of the seats."
}

// ratioTable has one row a unit, and a row of the seats a tie left open
// when one did.
func ratioTable(f *analysis.FixedRatio) *Table {
	t := NewTable(Text("unit"), Numbers("population", "quotient", "rounded", "seats"), Text("between", "notes"))
	for _, u := range f.Units {
		var between string
		switch {
		case u.Upper == "":
			between = "on " + u.Lower
		case u.Lower == "":
			between = "below " + u.Upper
		default:
			between = u.Lower + " – " + u.Upper
		}
		t.Add(u.Name, u.Population.String(), u.Quotient, strconv.Itoa(u.Rounded), strconv.Itoa(u.Seats), between, ratioNotes(f, &u))
	}
	if f.Unassigned > 0 {
		t.Add("(open: tie)", "", "", "", strconv.Itoa(f.Unassigned), "", "")
	}
	return t
}

// ratioNotes are a unit's notes under a fixed ratio, in the words of
// UnitNotes.
func ratioNotes(f *analysis.FixedRatio, u *analysis.RatioUnit) string {
	var n []string
	if u.AtMin {
		n = append(n, "held up by its minimum of "+strconv.Itoa(u.Min))
	}
	if u.AtMax {
		n = append(n, "held down by its maximum of "+strconv.Itoa(u.Max))
	}
	if u.Tied {
		switch {
		case u.Won:
			n = append(n, "tied; rounded up by lot")
		case f.Tie.Kind == engine.TieByLot:
			n = append(n, "tied; rounded down by lot")
		default:
			n = append(n, "tied")
		}
	}
	return strings.Join(n, "; ")
}

// ratioData has one row a unit: the settings (method, ratio, the house
// size the ratio gives, default bounds, tie rule), then the unit's
// population, quotient, rounding, seats, signposts and marks.
func ratioData(f *analysis.FixedRatio, s *engine.Scenario) *Table {
	t := NewTable(Text("method"), Numbers("ratio", "house_size", "default_min", "default_max"), Text("tie_rule", "unit"),
		Numbers("population", "min", "max", "quotient", "rounded", "seats"), Text("lower_signpost", "upper_signpost", "at_min", "at_max", "tied", "rounded_up"),
		Numbers("unassigned"))
	lead := []string{f.Method.String(), f.Ratio.String(), strconv.Itoa(f.Seats), strconv.Itoa(s.Min), capCell(s.Max), f.Tie.String()}
	for _, u := range f.Units {
		t.Add(row(lead, u.Name, u.Population.String(), strconv.Itoa(u.Min), capCell(u.Max), u.Quotient, strconv.Itoa(u.Rounded), strconv.Itoa(u.Seats),
			u.Lower, u.Upper, boolCell(u.AtMin), boolCell(u.AtMax), boolCell(u.Tied), boolCell(u.Won), strconv.Itoa(f.Unassigned))...)
	}
	return t
}

// ratioJSON builds the fixed-ratio document.
func ratioJSON(title string, f *analysis.FixedRatio) *jsondoc.Value {
	v := header("fixed-ratio", title)
	v.Set("method", jsondoc.Str(f.Method.String())).Set("method_name", jsondoc.Str(f.Method.Name()))
	v.Set("ratio", jsondoc.Str(f.Ratio.String())).Set("seats", jsondoc.Int(f.Seats))
	v.Set("tie_rule", jsondoc.Str(f.Tie.String())).Set("unassigned", jsondoc.Int(f.Unassigned))
	units := jsondoc.NewArray()
	for _, u := range f.Units {
		x := jsondoc.NewObject().Set("name", jsondoc.Str(u.Name)).Set("population", jsondoc.Str(u.Population.String()))
		x.Set("quotient", jsondoc.Str(u.Quotient)).Set("rounded", jsondoc.Int(u.Rounded)).Set("seats", jsondoc.Int(u.Seats))
		x.Set("lower_signpost", strOrNull(u.Lower)).Set("upper_signpost", strOrNull(u.Upper))
		x.Set("at_min", jsondoc.Boolean(u.AtMin)).Set("at_max", jsondoc.Boolean(u.AtMax))
		x.Set("tied", jsondoc.Boolean(u.Tied)).Set("rounded_up", jsondoc.Boolean(u.Won))
		units.Append(x)
	}
	v.Set("units", units)
	return v.Set("text", jsondoc.Str(f.Text()))
}

func strOrNull(s string) *jsondoc.Value {
	if s == "" {
		return nil
	}
	return jsondoc.Str(s)
}

// BaseSeats returns the document of a house in which every unit first
// receives base seats and the rest are apportioned: each unit's base,
// proportional and total seats, and how the proportional part was found.
// s is the scenario apportioned (only its settings are read).
func BaseSeats(title string, b *analysis.BaseSeats, s *engine.Scenario) *Document {
	t := title
	if t == "" {
		t = "Base seats"
	}
	d := &Document{Kind: "base-seats", Title: t + ": " + Plural(b.Base, "base seat") + " a unit, " + Plural(b.Seats, "seat") + " in all"}
	d.Body = []Block{Paragraph{b.Text()}, baseTable(b),
		Paragraph{"base: the seats every unit receives first; proportional: its seats in the apportionment of the rest by the method, " +
			"with the minimums, maximums, threshold and tie rule applied to that part; quota: its exact share of the rest."}}
	if b.Rest != nil {
		d.Body = append(d.Body, Heading{"The proportional part"})
		d.Body = append(d.Body, explanation(b.Rest, false)...)
	}
	d.Data = baseData(b, s)
	d.Tree = func() *Tree { return &Tree{Root: baseJSON(title, b)} }
	return d
}

// baseTable has one row a unit, and a row of the seats a tie left
// unassigned when one did.
func baseTable(b *analysis.BaseSeats) *Table {
	t := NewTable(Text("unit"), Numbers("population", "base", "quota", "proportional", "seats"), Text("notes"))
	for k, u := range b.Units {
		quota, notes := "", ""
		if b.Rest != nil {
			quota, notes = b.Rest.Units[k].Quota.Text, UnitNotes(&b.Rest.Units[k])
		}
		t.Add(u.Name, u.Population.String(), strconv.Itoa(u.Base), quota, strconv.Itoa(u.Proportional), strconv.Itoa(u.Seats), notes)
	}
	if b.Rest != nil && b.Rest.Unassigned > 0 {
		n := strconv.Itoa(b.Rest.Unassigned)
		t.Add("(unassigned: tie)", "", "", "", n, n, "")
	}
	return t
}

// baseData has one row a unit: the settings (method, house size, base
// seats, default bounds, threshold, tie rule), then the unit's
// population, seats and marks.
func baseData(b *analysis.BaseSeats, s *engine.Scenario) *Table {
	st := SettingsOf(s)
	st.Seats = b.Seats
	t := NewTable(st.columns(true, true), Numbers("base"), Text("unit"), Numbers("population", "base_seats", "quota", "proportional_seats", "seats"),
		Text("excluded", "at_min", "at_max", "tied"), Numbers("unassigned"))
	lead := append(st.cells(true, true), strconv.Itoa(b.Base))
	un := "0"
	if b.Rest != nil {
		un = strconv.Itoa(b.Rest.Unassigned)
	}
	for k, u := range b.Units {
		quota, ex, lo, hi, tied := "", false, false, false, false
		if b.Rest != nil {
			r := &b.Rest.Units[k]
			quota, ex, lo, hi, tied = r.Quota.Text, r.Excluded, r.AtMin, r.AtMax, r.Tied
		}
		t.Add(row(lead, u.Name, u.Population.String(), strconv.Itoa(u.Base), quota, strconv.Itoa(u.Proportional), strconv.Itoa(u.Seats),
			boolCell(ex), boolCell(lo), boolCell(hi), boolCell(tied), un)...)
	}
	return t
}

// baseJSON builds the base-seats document.
func baseJSON(title string, b *analysis.BaseSeats) *jsondoc.Value {
	v := header("base-seats", title)
	v.Set("base", jsondoc.Int(b.Base)).Set("seats", jsondoc.Int(b.Seats))
	units := jsondoc.NewArray()
	for _, u := range b.Units {
		units.Append(jsondoc.NewObject().Set("name", jsondoc.Str(u.Name)).Set("population", jsondoc.Str(u.Population.String())).
			Set("base_seats", jsondoc.Int(u.Base)).Set("proportional_seats", jsondoc.Int(u.Proportional)).Set("seats", jsondoc.Int(u.Seats)))
	}
	v.Set("units", units)
	un := 0
	if b.Rest != nil {
		un = b.Rest.Unassigned
		v.Set("rest", AllotmentJSON("", b.Rest))
	} else {
		v.Set("rest", nil)
	}
	v.Set("unassigned", jsondoc.Int(un))
	return v.Set("text", jsondoc.Str(b.Text()))
}
