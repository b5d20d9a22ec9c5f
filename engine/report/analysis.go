package report

import (
	"io"
	"math/big"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/jsondoc"
)

// growthRat returns to/from − 1 exactly; from must not be zero.
func growthRat(from, to engine.Decimal) *big.Rat {
	g := new(big.Rat).Quo(decRat(to), decRat(from))
	return g.Sub(g, big.NewRat(1, 1))
}

func decRat(d engine.Decimal) *big.Rat {
	den := new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(d.Places)), nil)
	return new(big.Rat).SetFrac(new(big.Int).SetUint64(d.Coef), den)
}

// DiffDoc builds the scenario-comparison document of a baseline against a
// proposal.
func DiffDoc(title string, d *analysis.Diff) *jsondoc.Value {
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
	for i := range d.Units {
		u := &d.Units[i]
		x := jsondoc.NewObject().Set("name", jsondoc.Str(u.Name)).Set("status", jsondoc.Str(diffStatus(u)))
		pop := func(r *engine.UnitResult) *jsondoc.Value {
			if r == nil {
				return nil
			}
			return jsondoc.Str(r.Population.String())
		}
		seats := func(r *engine.UnitResult) *jsondoc.Value {
			if r == nil {
				return nil
			}
			return jsondoc.Int(r.Seats)
		}
		quota := func(r *engine.UnitResult) *jsondoc.Value {
			if r == nil {
				return nil
			}
			return jsondoc.Str(r.Quota.Text)
		}
		margin := func(r *engine.UnitResult, gain bool) *jsondoc.Value {
			if r == nil {
				return nil
			}
			if gain {
				return marginDoc(r.Gain)
			}
			return marginDoc(r.Lose)
		}
		x.Set("population_before", pop(u.Base)).Set("population_after", pop(u.Proposal))
		if g := u.Growth(); g != "" {
			x.Set("growth", jsondoc.Str(g))
		} else {
			x.Set("growth", nil)
		}
		x.Set("seats_before", seats(u.Base)).Set("seats_after", seats(u.Proposal)).Set("change", jsondoc.Int(u.SeatChange))
		x.Set("quota_before", quota(u.Base)).Set("quota_after", quota(u.Proposal))
		x.Set("gain_margin_before", margin(u.Base, true)).Set("gain_margin_after", margin(u.Proposal, true))
		x.Set("lose_margin_before", margin(u.Base, false)).Set("lose_margin_after", margin(u.Proposal, false))
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

// DiffTable returns one row per unit: a mark in the column "Δ" ("+" new,
// "-" gone, "~" seats differ, "." margins differ, blank for the same),
// populations, growth (where the population changes), seats, the change
// and both margins.
func DiffTable(d *analysis.Diff) *Table {
	t := &Table{
		Header: []string{"Δ", "unit", "population", "growth", "seats", "change", "gain margin", "lose margin"},
		Right:  []bool{false, false, true, true, true, true, true, true},
	}
	for i := range d.Units {
		u := &d.Units[i]
		mark := map[string]string{"removed": "-", "added": "+", "changed": "~", "margins": ".", "same": " "}[diffStatus(u)]
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
		t.AddRow(mark, u.Name, pop, growth, seats, ch, gain, lose)
	}
	if d.Base.Unassigned > 0 || d.Proposal.Unassigned > 0 {
		t.AddRow("", "(unassigned: tie)", "", "", seatsPair(d.Base.Unassigned, d.Proposal.Unassigned), "", "", "")
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

// WriteDiffText writes the comparison as a readable diff: the settings
// that change, a table of every unit, and one line per change.
func WriteDiffText(w io.Writer, title string, d *analysis.Diff, md bool) error {
	var b strings.Builder
	if title == "" {
		title = "Baseline against proposal"
	}
	heading(&b, title, md)
	bl := bulletFor(md)
	desc := func(name string, r *engine.Result) string {
		return name + ": " + r.Method.Name() + ", " + strconv.Itoa(r.Seats) + " seats, population " + r.Total
	}
	b.WriteString(bl + desc("baseline", d.Base) + "\n" + bl + desc("proposal", d.Proposal) + "\n\n")
	if err := writeString(w, b.String()); err != nil {
		return err
	}
	b.Reset()
	if err := DiffTable(d).Write(w, md); err != nil {
		return err
	}
	b.WriteString("\n")
	b.WriteString(bl + "Marks: + new in the proposal, - not in the proposal, ~ seats change, . margins change.\n")
	b.WriteString(bl + "Seats that change hands: " + strconv.Itoa(d.Moved()) + "\n")
	for _, l := range d.Text() {
		b.WriteString(bl + l + "\n")
	}
	for _, r := range []*engine.Result{d.Base, d.Proposal} {
		for _, t := range r.Ties {
			s := bl + "TIE (" + map[bool]string{true: "baseline", false: "proposal"}[r == d.Base] + "): " + strings.Join(t.Names, ", ") + " for " + plural(t.Seats, "seat")
			if len(t.Winners) == 0 {
				s += ", left unassigned: the seats compared are those held outright"
			}
			b.WriteString(s + "\n")
		}
	}
	b.WriteString(bl + "Gallagher index " + fmtG(d.BaseMeasures.Gallagher) + " → " + fmtG(d.ProposalMeasures.Gallagher) +
		"; Loosemore–Hanby " + fmtG(d.BaseMeasures.LoosemoreHanby) + "% → " + fmtG(d.ProposalMeasures.LoosemoreHanby) + "%\n\n")
	caution(&b, md)
	return writeString(w, b.String())
}

// HouseDoc builds the house-size document: the rule's house size and the
// apportionment at that size by each method of c.
func HouseDoc(title string, hs *analysis.HouseSize, c *Comparison) *jsondoc.Value {
	v := header("house-size", title)
	v.Set("rule", jsondoc.Str(hs.Rule.String())).Set("total", jsondoc.Str(analysis.Decimal(hs.Total)))
	v.Set("value", jsondoc.Str(hs.Text)).Set("seats", jsondoc.Int(hs.Size))
	if hs.Rule == analysis.SmallestUnit {
		v.Set("smallest", jsondoc.NewObject().Set("unit", jsondoc.Str(hs.Smallest)).Set("population", jsondoc.Str(hs.SmallestOf.String())))
	} else {
		v.Set("smallest", nil)
	}
	return v.Set("comparison", c.Doc(title))
}

// WriteHouseText writes the house size a rule gives and the apportionment
// at that size.
func WriteHouseText(w io.Writer, title string, hs *analysis.HouseSize, c *Comparison, md bool) error {
	var b strings.Builder
	if title == "" {
		title = "House size"
	}
	heading(&b, title+": "+hs.Rule.String()+" rule gives "+plural(hs.Size, "seat"), md)
	bl := bulletFor(md)
	switch hs.Rule {
	case analysis.CubeRoot:
		b.WriteString(bl + "Cube-root law: the cube root of the total population " + analysis.Decimal(hs.Total) + " is " + hs.Text +
			", nearest whole number " + strconv.Itoa(hs.Size) + ".\n\n")
	case analysis.SmallestUnit:
		b.WriteString(bl + "Smallest unit as the divisor: " + hs.Smallest + " has " + hs.SmallestOf.String() + " people; total " +
			analysis.Decimal(hs.Total) + " / " + hs.SmallestOf.String() + " = " + hs.Text + ", nearest whole number " + strconv.Itoa(hs.Size) + ".\n\n")
	}
	if err := writeString(w, b.String()); err != nil {
		return err
	}
	b.Reset()
	var err error
	if md {
		err = ComparisonTable(c).WriteMarkdown(w)
	} else {
		err = ComparisonTable(c).WriteText(w)
	}
	if err != nil {
		return err
	}
	b.WriteString("\n")
	comparisonNotes(&b, c, bl)
	b.WriteString("\n")
	caution(&b, md)
	return writeString(w, b.String())
}

// DerivedDoc builds the derived-body document.
func DerivedDoc(title string, d *analysis.DerivedBody) *jsondoc.Value {
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

// DerivedTable returns one row per unit of a derived body.
func DerivedTable(d *analysis.DerivedBody) *Table {
	t := &Table{
		Header: []string{"unit", "population", "pop. share", "seats", "house share", "body seats", "body share", "body/pop"},
		Right:  []bool{false, true, true, true, true, true, true, true},
	}
	for i, u := range d.Units {
		w := "-"
		if u.Weight != nil {
			w = analysis.Decimal(u.Weight)
		}
		t.AddRow(u.Name, d.Result.Units[i].Population.String(), analysis.Percent(u.PopShare), strconv.Itoa(u.Seats),
			analysis.Percent(u.HouseShare), strconv.Itoa(u.Body), analysis.Percent(u.BodyShare), w)
	}
	if n := d.Result.Unassigned; n > 0 {
		t.AddRow("(unassigned: tie)", "", "", strconv.Itoa(n), "", strconv.Itoa(n), "", "")
	}
	return t
}

// WriteDerivedText writes a derived body for a terminal or as Markdown.
func WriteDerivedText(w io.Writer, title string, d *analysis.DerivedBody, md bool) error {
	var b strings.Builder
	if title == "" {
		title = "Derived body"
	}
	heading(&b, title+": "+strconv.Itoa(d.Result.Seats)+" seats by "+d.Result.Method.Name()+" plus "+strconv.Itoa(d.Plus)+
		" per unit = "+strconv.Itoa(d.Size), md)
	if err := writeString(w, b.String()); err != nil {
		return err
	}
	b.Reset()
	var err error
	if md {
		err = DerivedTable(d).WriteMarkdown(w)
	} else {
		err = DerivedTable(d).WriteText(w)
	}
	if err != nil {
		return err
	}
	bl := bulletFor(md)
	b.WriteString("\n" + bl + "body/pop is the unit's share of the body over its share of the population: above 1 it weighs more than its people.\n")
	b.WriteString(bl + "Gallagher index: house " + fmtG(d.HouseIndices[1]) + ", body " + fmtG(d.BodyIndices[1]) +
		"; Loosemore–Hanby: house " + fmtG(d.HouseIndices[0]) + "%, body " + fmtG(d.BodyIndices[0]) + "% (float64, display only)\n")
	for _, t := range d.Result.Ties {
		s := bl + "TIE: " + strings.Join(t.Names, ", ") + " for " + plural(t.Seats, "seat")
		if len(t.Winners) == 0 {
			s += ", left unassigned in the house and in the body"
		} else {
			s += ", settled by " + t.Rule
		}
		b.WriteString(s + "\n")
	}
	b.WriteString("\n")
	caution(&b, md)
	return writeString(w, b.String())
}

// BiasDoc builds the bias-study document.
func BiasDoc(title string, st *analysis.BiasStudy) *jsondoc.Value {
	v := header("bias", title)
	c := st.Config
	cfg := jsondoc.NewObject().Set("seed", jsondoc.Num(strconv.FormatUint(c.Seed, 10))).Set("draws", jsondoc.Int(c.Draws)).
		Set("units", jsondoc.Int(c.Units)).Set("seats", jsondoc.Int(c.House)).Set("spread", jsondoc.Str(c.Spread.String())).
		Set("total", jsondoc.Num(strconv.FormatUint(c.Total, 10))).Set("class_size", jsondoc.Int(st.Class))
	v.Set("config", cfg)
	v.Set("distribution", jsondoc.Str(BiasDistribution(c)))
	v.Set("note", jsondoc.Str("Seat bias of a class is the sum over its units of seats minus exact quota; means are float64 (display only). "+
		"difference is large minus small: positive favours large units."))
	arr := jsondoc.NewArray()
	for _, b := range st.Methods {
		arr.Append(jsondoc.NewObject().Set("method", jsondoc.Str(b.Method.String())).Set("method_name", jsondoc.Str(b.Method.Name())).
			Set("large", jsondoc.Float(round6(b.Large))).Set("small", jsondoc.Float(round6(b.Small))).
			Set("difference", jsondoc.Float(round6(b.Difference))).Set("std_error", jsondoc.Float(round6(b.StdErr))).
			Set("leaning", jsondoc.Str(b.Leaning())).Set("large_ahead", jsondoc.Int(b.LargeAhead)).
			Set("small_ahead", jsondoc.Int(b.SmallAhead)).Set("ties", jsondoc.Int(b.Ties)))
	}
	return v.Set("methods", arr)
}

// BiasDistribution describes in words how the study draws its population
// sets.
func BiasDistribution(c analysis.BiasConfig) string {
	if c.Spread == analysis.Decades {
		return strconv.Itoa(c.Draws) + " sets of " + strconv.Itoa(c.Units) + " units; each population's decade (10^3 to 10^6) chosen uniformly, " +
			"then uniform within it; PCG seed " + strconv.FormatUint(c.Seed, 10)
	}
	return strconv.Itoa(c.Draws) + " sets of " + strconv.Itoa(c.Units) + " units with populations uniform on the simplex of total " +
		strconv.FormatUint(c.Total, 10) + " (gaps between sorted uniform cut points); PCG seed " + strconv.FormatUint(c.Seed, 10)
}

// BiasTable returns one row per method of a bias study.
func BiasTable(st *analysis.BiasStudy) *Table {
	t := &Table{
		Header: []string{"method", "large units", "small units", "large − small", "std. error", "favours", "sets with a tie"},
		Right:  []bool{false, true, true, true, true, false, true},
	}
	for _, b := range st.Methods {
		t.AddRow(b.Method.String(), signed(b.Large), signed(b.Small), signed(b.Difference), strconv.FormatFloat(b.StdErr, 'f', 4, 64), b.Leaning(),
			strconv.Itoa(b.Ties))
	}
	return t
}

func signed(f float64) string {
	s := strconv.FormatFloat(f, 'f', 4, 64)
	if f >= 0 {
		s = "+" + s
	}
	return s
}

// WriteBiasText writes a bias study for a terminal or as Markdown.
func WriteBiasText(w io.Writer, title string, st *analysis.BiasStudy, md bool) error {
	var b strings.Builder
	if title == "" {
		title = "Seat bias study"
	}
	heading(&b, title+": "+strconv.Itoa(st.Config.Units)+" units, "+strconv.Itoa(st.Config.House)+" seats", md)
	bl := bulletFor(md)
	b.WriteString(bl + "Population sets: " + BiasDistribution(st.Config) + ".\n")
	b.WriteString(bl + "Classes: the " + strconv.Itoa(st.Class) + " largest and the " + strconv.Itoa(st.Class) + " smallest units of each set.\n\n")
	if err := writeString(w, b.String()); err != nil {
		return err
	}
	b.Reset()
	var err error
	if md {
		err = BiasTable(st).WriteMarkdown(w)
	} else {
		err = BiasTable(st).WriteText(w)
	}
	if err != nil {
		return err
	}
	b.WriteString("\n")
	for _, s := range []string{
		"Each figure is the mean, over the sets, of the class's seats minus its exact quotas; large − small above zero favours large units.",
		"\"favours\" names a side only when the mean difference is more than two standard errors from zero. Means are float64, for display.",
		"A set with a tie has it settled by lot (seeded from the study's seed and the set's number), so every seat is assigned in every set.",
	} {
		if md {
			b.WriteString(bl + s + "\n")
		} else {
			b.WriteString(Wrap(s, 76) + "\n")
		}
	}
	b.WriteString("\n")
	caution(&b, md)
	return writeString(w, b.String())
}
