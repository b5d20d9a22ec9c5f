package format

import (
	"strconv"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/jsondoc"
)

// Diff returns the document of a baseline against a proposal: the
// settings, a table of every unit, one line a change, the ties, and the
// disproportionality before and after. base and prop are the two
// scenarios compared (their settings lead the CSV form).
func Diff(title string, d *analysis.Diff, base, prop *engine.Scenario) *Document {
	doc := &Document{Kind: "diff", Title: title}
	if doc.Title == "" {
		doc.Title = "Baseline against proposal"
	}
	desc := func(name string, r *engine.Result) string {
		return name + ": " + r.Method.Name() + ", " + Plural(r.Seats, "seat") + ", population " + r.Total
	}
	lines := []string{"Marks: + new in the proposal, - not in the proposal, ~ seats change, . margins change.",
		"Seats that change hands: " + strconv.Itoa(d.Moved())}
	lines = append(lines, d.Text()...)
	for _, r := range []*engine.Result{d.Base, d.Proposal} {
		side := "baseline"
		if r == d.Proposal {
			side = "proposal"
		}
		for i := range r.Ties {
			s := "TIE (" + side + "): " + TieText(&r.Ties[i], unitName(r))
			if len(r.Ties[i].Winners) == 0 {
				s += " (the seats compared are those held outright)"
			}
			lines = append(lines, s)
		}
	}
	lines = append(lines, "Gallagher index "+fmtG(d.BaseMeasures.Gallagher)+" → "+fmtG(d.ProposalMeasures.Gallagher)+
		"; Loosemore–Hanby "+fmtG(d.BaseMeasures.LoosemoreHanby)+"% → "+fmtG(d.ProposalMeasures.LoosemoreHanby)+"%")
	doc.Body = []Block{List{Items: []string{desc("baseline", d.Base), desc("proposal", d.Proposal)}}, diffTable(d), List{Items: lines}}
	doc.Data = diffData(SettingsOf(base), SettingsOf(prop), d)
	doc.Tree = func() *Tree { return &Tree{Root: diffJSON(title, d)} }
	return doc
}

func diffStatus(u *analysis.UnitDiff) string {
	switch {
	case !u.InProposal:
		return "removed"
	case !u.InBase:
		return "added"
	case u.SeatChange != 0:
		return "changed"
	case u.GainChanged || u.LoseChanged:
		return "margins"
	}
	return "same"
}

// diffTable has one row per unit: a mark in the column "Δ" ("+" new, "-"
// gone, "~" seats differ, "." margins differ, blank for the same),
// populations, growth (where the population changes), seats, the change
// and both margins; and a row of the seats a tie left unassigned when one
// did.
func diffTable(d *analysis.Diff) *Table {
	t := NewTable(Text("Δ", "unit"), Numbers("population", "growth", "seats", "change", "gain margin", "lose margin"))
	marks := map[string]string{"removed": "-", "added": "+", "changed": "~", "margins": ".", "same": " "}
	for i := range d.Units {
		u := &d.Units[i]
		pop := pair(u.Base, u.Proposal, func(r *engine.UnitResult) string { return r.Population.String() })
		seats := pair(u.Base, u.Proposal, func(r *engine.UnitResult) string { return strconv.Itoa(r.Seats) })
		gain := pair(u.Base, u.Proposal, func(r *engine.UnitResult) string { return marginText(r.Gain) })
		lose := pair(u.Base, u.Proposal, func(r *engine.UnitResult) string { return marginText(r.Lose) })
		ch := ""
		if u.SeatChange > 0 {
			ch = "+" + strconv.Itoa(u.SeatChange)
		} else if u.SeatChange < 0 {
			ch = strconv.Itoa(u.SeatChange)
		}
		growth := ""
		if u.Base != nil && u.Proposal != nil && u.Base.Population.Cmp(u.Proposal.Population) != 0 {
			growth = u.Growth()
		}
		t.Add(marks[diffStatus(u)], u.Name, pop, growth, seats, ch, gain, lose)
	}
	if d.Base.Unassigned > 0 || d.Proposal.Unassigned > 0 {
		t.Add("", "(unassigned: tie)", "", "", seatsPair(d.Base.Unassigned, d.Proposal.Unassigned), "", "", "")
	}
	return t
}

// pair writes "a → b" when the two sides differ, "a" when they agree, and
// marks a missing side with "–".
func pair(a, b *engine.UnitResult, f func(*engine.UnitResult) string) string {
	x, y := "–", "–"
	if a != nil {
		x = f(a)
	}
	if b != nil {
		y = f(b)
	}
	if x == y {
		return x
	}
	return x + " → " + y
}

// diffData has one row a unit: both sides' settings lead (suffixed
// _before and _after), then the unit's status, populations, growth rate
// (a fraction), seats and change, quotas, margins, ties and each side's
// unassigned seats. A side the unit is missing from has empty cells.
func diffData(base, prop Settings, d *analysis.Diff) *Table {
	var lead []Column
	for _, c := range base.columns(true, true) {
		lead = append(lead, Column{c.Name + "_before", c.Number}, Column{c.Name + "_after", c.Number})
	}
	t := NewTable(lead, Text("unit", "status"), Numbers("population_before", "population_after", "growth", "seats_before", "seats_after", "change",
		"quota_before", "quota_after", "gain_margin_before", "gain_margin_after", "lose_margin_before", "lose_margin_after"),
		Text("margins_changed", "tied_before", "tied_after"), Numbers("unassigned_before", "unassigned_after"))
	base.Method, base.Seats = d.Base.Method, d.Base.Seats
	prop.Method, prop.Seats = d.Proposal.Method, d.Proposal.Seats
	bc, pc := base.cells(true, true), prop.cells(true, true)
	var cells []string
	for i := range bc {
		cells = append(cells, bc[i], pc[i])
	}
	side := func(r *engine.UnitResult, f func(*engine.UnitResult) string) string {
		if r == nil {
			return ""
		}
		return f(r)
	}
	pop := func(r *engine.UnitResult) string { return r.Population.String() }
	seats := func(r *engine.UnitResult) string { return strconv.Itoa(r.Seats) }
	quota := func(r *engine.UnitResult) string { return r.Quota.Text }
	gain := func(r *engine.UnitResult) string { return numMargin(r.Gain) }
	lose := func(r *engine.UnitResult) string { return numMargin(r.Lose) }
	tied := func(r *engine.UnitResult) string { return boolCell(r.Tied) }
	for i := range d.Units {
		u := &d.Units[i]
		growth := ""
		if u.Base != nil && u.Proposal != nil {
			growth = growthNumber(u.Base.Population, u.Proposal.Population)
		}
		t.Add(row(cells, u.Name, diffStatus(u), side(u.Base, pop), side(u.Proposal, pop), growth,
			side(u.Base, seats), side(u.Proposal, seats), strconv.Itoa(u.SeatChange), side(u.Base, quota), side(u.Proposal, quota),
			side(u.Base, gain), side(u.Proposal, gain), side(u.Base, lose), side(u.Proposal, lose),
			boolCell(u.GainChanged || u.LoseChanged), side(u.Base, tied), side(u.Proposal, tied),
			strconv.Itoa(d.Base.Unassigned), strconv.Itoa(d.Proposal.Unassigned))...)
	}
	return t
}

// diffJSON builds the scenario-comparison document.
func diffJSON(title string, d *analysis.Diff) *jsondoc.Value {
	v := header("diff", title)
	side := func(r *engine.Result) *jsondoc.Value {
		return jsondoc.NewObject().Set("method", jsondoc.Str(r.Method.String())).Set("method_name", jsondoc.Str(r.Method.Name())).
			Set("seats", jsondoc.Int(r.Seats)).Set("total", jsondoc.Str(r.Total)).Set("unassigned", jsondoc.Int(r.Unassigned)).
			Set("ties", Ties(r))
	}
	v.Set("baseline", side(d.Base)).Set("proposal", side(d.Proposal))
	settings := jsondoc.NewArray()
	for _, s := range d.Settings {
		settings.Append(jsondoc.NewObject().Set("name", jsondoc.Str(s.Name)).Set("before", jsondoc.Str(s.Before)).Set("after", jsondoc.Str(s.After)))
	}
	v.Set("settings", settings).Set("moved", jsondoc.Int(d.Moved()))
	units := jsondoc.NewArray()
	opt := func(r *engine.UnitResult, f func(*engine.UnitResult) *jsondoc.Value) *jsondoc.Value {
		if r == nil {
			return nil
		}
		return f(r)
	}
	pop := func(r *engine.UnitResult) *jsondoc.Value { return jsondoc.Str(r.Population.String()) }
	seats := func(r *engine.UnitResult) *jsondoc.Value { return jsondoc.Int(r.Seats) }
	quota := func(r *engine.UnitResult) *jsondoc.Value { return jsondoc.Str(r.Quota.Text) }
	gain := func(r *engine.UnitResult) *jsondoc.Value { return marginDoc(r.Gain) }
	lose := func(r *engine.UnitResult) *jsondoc.Value { return marginDoc(r.Lose) }
	for i := range d.Units {
		u := &d.Units[i]
		x := jsondoc.NewObject().Set("name", jsondoc.Str(u.Name)).Set("status", jsondoc.Str(diffStatus(u)))
		x.Set("population_before", opt(u.Base, pop)).Set("population_after", opt(u.Proposal, pop))
		if g := u.Growth(); g != "" {
			x.Set("growth", jsondoc.Str(g))
		} else {
			x.Set("growth", nil)
		}
		x.Set("seats_before", opt(u.Base, seats)).Set("seats_after", opt(u.Proposal, seats)).Set("change", jsondoc.Int(u.SeatChange))
		x.Set("quota_before", opt(u.Base, quota)).Set("quota_after", opt(u.Proposal, quota))
		x.Set("gain_margin_before", opt(u.Base, gain)).Set("gain_margin_after", opt(u.Proposal, gain))
		x.Set("lose_margin_before", opt(u.Base, lose)).Set("lose_margin_after", opt(u.Proposal, lose))
		x.Set("margins_changed", jsondoc.Boolean(u.GainChanged || u.LoseChanged))
		units.Append(x)
	}
	v.Set("units", units)
	ms := func(m *analysis.Measures) *jsondoc.Value {
		return jsondoc.NewObject().Set("loosemore_hanby", jsondoc.Float(round6(m.LoosemoreHanby))).
			Set("gallagher", jsondoc.Float(round6(m.Gallagher))).Set("sainte_lague", jsondoc.Float(round6(m.SainteLague))).
			Set("ratio", jsondoc.Float(round6(m.Ratio)))
	}
	v.Set("measures", jsondoc.NewObject().Set("baseline", ms(&d.BaseMeasures)).Set("proposal", ms(&d.ProposalMeasures)))
	lines := jsondoc.NewArray()
	for _, l := range d.Text() {
		lines.Append(jsondoc.Str(l))
	}
	return v.Set("lines", lines)
}
