package report

import (
	"io"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/jsondoc"
)

// ParadoxDoc builds the paradoxes document of a sweep set: the Alabama
// paradoxes and quota violations of every method over the range. scen is
// the swept scenario (its bounds tell which violations a bound forces).
func ParadoxDoc(title string, set *SweepSet, scen *engine.Scenario) *jsondoc.Value {
	v := header("paradoxes", title)
	v.Set("from", jsondoc.Int(set.From)).Set("to", jsondoc.Int(set.To))
	methods := jsondoc.NewArray()
	all := jsondoc.NewArray()
	for k, m := range set.Methods {
		x := jsondoc.NewObject().Set("method", jsondoc.Str(m.String())).Set("method_name", jsondoc.Str(m.Name()))
		sw := set.Sweeps[k]
		if sw == nil {
			x.Set("error", jsondoc.Str(set.Errors[k].Error())).Set("alabama", nil).Set("quota_violations", nil)
			methods.Append(x)
			continue
		}
		qv := analysis.FindQuotaViolations(sw, scen)
		x.Set("error", nil).Set("alabama", jsondoc.Int(len(set.Paradoxes[k]))).Set("quota_violations", jsondoc.Int(len(qv)))
		methods.Append(x)
		for j := range set.Paradoxes[k] {
			all.Append(AlabamaDoc(&set.Paradoxes[k][j]))
		}
		for j := range qv {
			all.Append(QuotaDoc(&qv[j]))
		}
	}
	return v.Set("methods", methods).Set("paradoxes", all)
}

// QuotaDoc writes one quota violation: {kind: "quota", method, unit, house,
// seats, quota, quota_exact, lower_quota, upper_quota, side ("above" or
// "below"), bounds_bind, text}.
func QuotaDoc(q *analysis.QuotaViolation) *jsondoc.Value {
	side := "below"
	if q.Above() {
		side = "above"
	}
	return jsondoc.NewObject().Set("kind", jsondoc.Str("quota")).Set("method", jsondoc.Str(q.Method.String())).
		Set("unit", jsondoc.Str(q.Name)).Set("house", jsondoc.Int(q.House)).Set("seats", jsondoc.Int(q.Seats)).
		Set("quota", jsondoc.Str(analysis.Decimal(q.Quota))).Set("quota_exact", jsondoc.Str(analysis.Fraction(q.Quota))).
		Set("lower_quota", jsondoc.Int(q.Lower)).Set("upper_quota", jsondoc.Int(q.Upper)).
		Set("side", jsondoc.Str(side)).Set("bounds_bind", jsondoc.Boolean(q.Bounds)).Set("text", jsondoc.Str(q.Text()))
}

// ParadoxTable lists every finding of the set: method, kind, unit, house
// sizes, seats and quotas.
func ParadoxTable(set *SweepSet, scen *engine.Scenario) *Table {
	t := &Table{Header: []string{"method", "kind", "unit", "house", "seats", "quota", "detail"},
		Right: []bool{false, false, false, true, true, true, false}}
	for k, m := range set.Methods {
		sw := set.Sweeps[k]
		if sw == nil {
			t.AddRow(m.String(), "error", "", "", "", "", errText(set.Errors[k]))
			continue
		}
		for _, f := range set.Paradoxes[k] {
			detail := ""
			if len(f.Gainers) > 0 {
				var g []string
				for _, c := range f.Gainers {
					g = append(g, "+"+c.Name)
				}
				detail = strings.Join(g, " ")
			}
			if f.Tied {
				detail += " (tie involved)"
			}
			t.AddRow(m.String(), "alabama", f.Name, strconv.Itoa(f.From)+" → "+strconv.Itoa(f.To),
				strconv.Itoa(f.Before)+" → "+strconv.Itoa(f.After),
				analysis.Decimal(f.QuotaBefore)+" → "+analysis.Decimal(f.QuotaAfter), strings.TrimSpace(detail))
		}
		for _, q := range analysis.FindQuotaViolations(sw, scen) {
			d := "below lower quota " + strconv.Itoa(q.Lower)
			if q.Above() {
				d = "above upper quota " + strconv.Itoa(q.Upper)
			}
			if q.Bounds {
				d += " (bounds bind)"
			}
			t.AddRow(m.String(), "quota", q.Name, strconv.Itoa(q.House), strconv.Itoa(q.Seats), analysis.Decimal(q.Quota), d)
		}
	}
	return t
}

// WriteParadoxText writes the findings for a terminal: a summary per
// method, then each finding in words (at most limit of each kind per
// method; 0 for all).
func WriteParadoxText(w io.Writer, title string, set *SweepSet, scen *engine.Scenario, limit int, md bool) error {
	var b strings.Builder
	if title == "" {
		title = "Paradoxes"
	}
	heading(&b, title+": house sizes "+strconv.Itoa(set.From)+" to "+strconv.Itoa(set.To), md)
	bullet := bulletFor(md)
	for k, m := range set.Methods {
		sw := set.Sweeps[k]
		if sw == nil {
			b.WriteString(bullet + m.Name() + ": cannot apportion any size in the range: " + errText(set.Errors[k]) + "\n")
			continue
		}
		qv := analysis.FindQuotaViolations(sw, scen)
		ps := set.Paradoxes[k]
		line := m.Name() + ": " + countText(len(ps), "Alabama paradox", "Alabama paradoxes") + ", " +
			countText(len(qv), "quota violation", "quota violations")
		if t := sweepTieText(sw); t != "" {
			line += " among the seats assigned; " + t
		}
		b.WriteString(bullet + line + "\n")
		for j := range ps {
			if limit > 0 && j == limit {
				b.WriteString(bullet + "    … and " + strconv.Itoa(len(ps)-limit) + " more (see -format json)\n")
				break
			}
			b.WriteString(bullet + "    " + ps[j].Text() + "\n")
		}
		for j := range qv {
			if limit > 0 && j == limit {
				b.WriteString(bullet + "    … and " + strconv.Itoa(len(qv)-limit) + " more (see -format json)\n")
				break
			}
			b.WriteString(bullet + "    " + qv[j].Text() + "\n")
		}
	}
	b.WriteString("\n")
	caution(&b, md)
	return writeString(w, b.String())
}

func countText(n int, one, many string) string {
	switch n {
	case 0:
		return "no " + many
	case 1:
		return "1 " + one
	}
	return strconv.Itoa(n) + " " + many
}

func heading(b *strings.Builder, s string, md bool) {
	if md {
		b.WriteString("## " + s + "\n\n")
		return
	}
	b.WriteString(s + "\n" + strings.Repeat("=", len([]rune(s))) + "\n\n")
}

func caution(b *strings.Builder, md bool) {
	if md {
		b.WriteString("> " + Caution + "\n")
	} else {
		b.WriteString(Wrap(Caution, 76) + "\n")
	}
}

// A GrowthSet is the population paradox search by several methods.
type GrowthSet struct {
	Methods []engine.Method
	Results []*analysis.PopulationResult // nil where the method failed
	Errors  []error
}

// FindGrowth runs [analysis.FindPopulation] for every method in ms (all
// when empty), at s's house size, with later's populations.
func FindGrowth(s, later engine.Scenario, ms []engine.Method) (*GrowthSet, error) {
	if len(ms) == 0 {
		ms = engine.Methods()
	}
	g := &GrowthSet{Methods: ms, Results: make([]*analysis.PopulationResult, len(ms)), Errors: make([]error, len(ms))}
	for k, m := range ms {
		s.Method = m
		g.Results[k], g.Errors[k] = analysis.FindPopulation(&s, &later)
		if g.Errors[k] != nil && !isEngineError(g.Errors[k]) {
			return nil, g.Errors[k] // the two population sets do not match
		}
	}
	return g, nil
}

func isEngineError(err error) bool {
	_, ok := err.(*engine.Error)
	return ok
}

// First returns the first successful result, or nil.
func (g *GrowthSet) First() *analysis.PopulationResult {
	for _, r := range g.Results {
		if r != nil {
			return r
		}
	}
	return nil
}

// Doc builds the population-paradox document.
func (g *GrowthSet) Doc(title string) *jsondoc.Value {
	v := header("population-paradox", title)
	f := g.First()
	units := jsondoc.NewArray()
	if f != nil {
		v.Set("seats", jsondoc.Int(f.Before.Seats)).Set("total_before", jsondoc.Str(f.Before.Total)).Set("total_after", jsondoc.Str(f.After.Total))
		for i := range f.Before.Units {
			bu, au := &f.Before.Units[i], &f.After.Units[i]
			x := jsondoc.NewObject().Set("name", jsondoc.Str(bu.Name)).Set("before", jsondoc.Str(bu.Population.String())).
				Set("after", jsondoc.Str(au.Population.String()))
			gr, exact := growthTexts(bu.Population, au.Population)
			x.Set("growth", gr).Set("growth_exact", exact)
			units.Append(x)
		}
	}
	v.Set("units", units)
	results := jsondoc.NewArray()
	all := jsondoc.NewArray()
	for k, m := range g.Methods {
		x := jsondoc.NewObject().Set("method", jsondoc.Str(m.String())).Set("method_name", jsondoc.Str(m.Name()))
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

func growthTexts(from, to engine.Decimal) (*jsondoc.Value, *jsondoc.Value) {
	if from.IsZero() {
		return nil, nil
	}
	g := growthRat(from, to)
	return jsondoc.Str(analysis.Percent(g)), jsondoc.Str(analysis.Fraction(g))
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

// GrowthTable returns one row per unit: populations, growth and the seats
// before and after under each method.
func GrowthTable(g *GrowthSet) *Table {
	t := &Table{Header: []string{"unit", "before", "after", "growth"}, Right: []bool{false, true, true, true}}
	for _, m := range g.Methods {
		t.Header = append(t.Header, m.String())
		t.Right = append(t.Right, true)
	}
	f := g.First()
	if f == nil {
		return t
	}
	for i := range f.Before.Units {
		bu, au := &f.Before.Units[i], &f.After.Units[i]
		gr := "-"
		if !bu.Population.IsZero() {
			gr = analysis.Percent(growthRat(bu.Population, au.Population))
		}
		row := []string{bu.Name, bu.Population.String(), au.Population.String(), gr}
		for _, r := range g.Results {
			if r == nil {
				row = append(row, "error")
				continue
			}
			a, b := r.Before.Units[i].Seats, r.After.Units[i].Seats
			row = append(row, seatsPair(a, b))
		}
		t.AddRow(row...)
	}
	var before, after []*engine.Result
	for _, r := range g.Results {
		if r == nil {
			before, after = append(before, nil), append(after, nil)
			continue
		}
		before, after = append(before, r.Before), append(after, r.After)
	}
	if row := unassignedPairRow(before, after, 4); row != nil {
		t.AddRow(row...)
	}
	return t
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
// change: "0 → 1" where a tie leaves seats unassigned on either side.
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

// tieLines say, for a result, how a tie leaves seats unassigned: "" when
// none does. where names the apportionment ("the later apportionment").
func tieText(where string, r *engine.Result) string {
	if r == nil || r.Unassigned == 0 {
		return ""
	}
	var ts []string
	for _, t := range r.Ties {
		if len(t.Winners) == 0 {
			ts = append(ts, strings.Join(t.Names, ", ")+" tie for "+plural(t.Seats, "seat"))
		}
	}
	return "a tie leaves " + plural(r.Unassigned, "seat") + " unassigned in " + where + " (" + strings.Join(ts, "; ") + ")"
}

// WriteGrowthText writes the population-paradox search for a terminal or
// as Markdown.
func WriteGrowthText(w io.Writer, title string, g *GrowthSet, md bool) error {
	var b strings.Builder
	if title == "" {
		title = "Population paradox"
	}
	f := g.First()
	if f != nil {
		title += ": house of " + strconv.Itoa(f.Before.Seats) + ", population " + f.Before.Total + " → " + f.After.Total
	}
	heading(&b, title, md)
	if err := writeString(w, b.String()); err != nil {
		return err
	}
	b.Reset()
	if err := GrowthTable(g).Write(w, md); err != nil {
		return err
	}
	b.WriteString("\n")
	bullet := bulletFor(md)
	for k, m := range g.Methods {
		r := g.Results[k]
		if r == nil {
			b.WriteString(bullet + m.Name() + ": cannot apportion: " + errText(g.Errors[k]) + "\n")
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
			b.WriteString(bullet + m.Name() + ": no population paradox.\n")
		case len(r.Findings) == 0:
			b.WriteString(bullet + m.Name() + ": no population paradox among the seats held outright, but " + strings.Join(ties, ", and ") +
				"; how the tie is settled decides whether there is one.\n")
		default:
			for j := range r.Findings {
				b.WriteString(bullet + r.Findings[j].Text() + "\n")
			}
			if len(ties) > 0 {
				b.WriteString(bullet + m.Name() + ": " + strings.Join(ties, ", and ") + "; settling the tie may change these findings.\n")
			}
		}
	}
	b.WriteString("\n")
	caution(&b, md)
	return writeString(w, b.String())
}

// An AdmitSet is the new-states test by several methods.
type AdmitSet struct {
	Methods []engine.Method
	Results []*analysis.NewStates
	Errors  []error
	Unit    engine.Unit
}

// Admit runs [analysis.FindNewStates] for every method in ms (all when
// empty).
func Admit(s engine.Scenario, u engine.Unit, added int, ms []engine.Method) *AdmitSet {
	if len(ms) == 0 {
		ms = engine.Methods()
	}
	a := &AdmitSet{Methods: ms, Results: make([]*analysis.NewStates, len(ms)), Errors: make([]error, len(ms)), Unit: u}
	for k, m := range ms {
		s.Method = m
		a.Results[k], a.Errors[k] = analysis.FindNewStates(&s, u, added)
	}
	return a
}

// First returns the first successful result, or nil.
func (a *AdmitSet) First() *analysis.NewStates {
	for _, r := range a.Results {
		if r != nil {
			return r
		}
	}
	return nil
}

// Doc builds the new-states document.
func (a *AdmitSet) Doc(title string) *jsondoc.Value {
	v := header("new-states", title)
	v.Set("unit", jsondoc.NewObject().Set("name", jsondoc.Str(strings.TrimSpace(a.Unit.Name))).Set("population", jsondoc.Str(a.Unit.Population.String())))
	if f := a.First(); f != nil {
		v.Set("fair_share", jsondoc.Str(analysis.Decimal(f.FairShare))).Set("fair_share_exact", jsondoc.Str(analysis.Fraction(f.FairShare)))
		v.Set("added", jsondoc.Int(f.Added)).Set("house_before", jsondoc.Int(f.House)).Set("house_after", jsondoc.Int(f.NewHouse))
	}
	results := jsondoc.NewArray()
	for k, m := range a.Methods {
		x := jsondoc.NewObject().Set("method", jsondoc.Str(m.String())).Set("method_name", jsondoc.Str(m.Name()))
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

// AdmitTable returns one row per old unit with its seats before and after
// under each method, and a last row for the new unit.
func AdmitTable(a *AdmitSet) *Table {
	t := &Table{Header: []string{"unit", "population"}, Right: []bool{false, true}}
	for _, m := range a.Methods {
		t.Header = append(t.Header, m.String())
		t.Right = append(t.Right, true)
	}
	f := a.First()
	if f == nil {
		return t
	}
	for i := range f.Before.Units {
		row := []string{f.Before.Units[i].Name, f.Before.Units[i].Population.String()}
		for _, r := range a.Results {
			if r == nil {
				row = append(row, "error")
				continue
			}
			x, y := r.Before.Units[i].Seats, r.After.Units[i].Seats
			s := strconv.Itoa(x)
			if x != y {
				s += " → " + strconv.Itoa(y) + " !"
			}
			row = append(row, s)
		}
		t.AddRow(row...)
	}
	row := []string{f.Name + " (new)", f.People.String()}
	for _, r := range a.Results {
		if r == nil {
			row = append(row, "error")
			continue
		}
		row = append(row, "+"+strconv.Itoa(r.NewSeats))
	}
	t.AddRow(row...)
	var before, after []*engine.Result
	for _, r := range a.Results {
		if r == nil {
			before, after = append(before, nil), append(after, nil)
			continue
		}
		before, after = append(before, r.Before), append(after, r.After)
	}
	if row := unassignedPairRow(before, after, 2); row != nil {
		t.AddRow(row...)
	}
	return t
}

// WriteAdmitText writes the new-states test for a terminal or as Markdown.
func WriteAdmitText(w io.Writer, title string, a *AdmitSet, md bool) error {
	var b strings.Builder
	if title == "" {
		title = "New unit admitted"
	}
	if f := a.First(); f != nil {
		title += ": " + f.Name + " with " + plural(f.Added, "seat") + " (fair share " + analysis.Decimal(f.FairShare) +
			"), house " + strconv.Itoa(f.House) + " → " + strconv.Itoa(f.NewHouse)
	}
	heading(&b, title, md)
	if err := writeString(w, b.String()); err != nil {
		return err
	}
	b.Reset()
	if err := AdmitTable(a).Write(w, md); err != nil {
		return err
	}
	b.WriteString("\n")
	bullet := bulletFor(md)
	b.WriteString(bullet + "\"!\" marks an old unit whose seats change: the new-states paradox.\n")
	for k, m := range a.Methods {
		if r := a.Results[k]; r != nil {
			b.WriteString(bullet + r.Text() + "\n")
		} else {
			b.WriteString(bullet + m.Name() + ": cannot apportion: " + errText(a.Errors[k]) + "\n")
		}
	}
	b.WriteString("\n")
	caution(&b, md)
	return writeString(w, b.String())
}
