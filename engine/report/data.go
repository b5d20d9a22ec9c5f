package report

import (
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/projection"
)

// This file holds the CSV data tables: every CSV output is data, not a
// display. A column holds numbers or text, never both: numbers are plain
// (no marks, signs on positives, percent signs or arrows; negative numbers
// stay numbers), marks are columns of their own (true or false), an empty
// cell is a value that does not apply, and the settings the numbers
// depend on lead every row, so that the file alone says what it shows and
// a spreadsheet reads every number as a number. Text cells are guarded
// against formulas (see CSVSafe); numeric cells need no guard.

// Settings are a scenario's settings, stated in the leading columns of a
// CSV file.
type Settings struct {
	Method    engine.Method // zero when the file spans methods
	Seats     int           // 0 when the file spans house sizes
	Min, Max  int           // the default bounds (Max 0: no cap)
	Threshold engine.Decimal
	Tie       engine.TieRule
}

// SettingsOf returns the settings of s.
func SettingsOf(s *engine.Scenario) Settings {
	return Settings{Method: s.Method, Seats: s.Seats, Min: s.Min, Max: s.Max, Threshold: s.Threshold, Tie: s.Tie}
}

// A column of a data table: its name and whether it holds numbers.
type column struct {
	name string
	num  bool
}

func text(names ...string) []column {
	cs := make([]column, len(names))
	for i, n := range names {
		cs[i] = column{n, false}
	}
	return cs
}

func nums(names ...string) []column {
	cs := make([]column, len(names))
	for i, n := range names {
		cs[i] = column{n, true}
	}
	return cs
}

// dataTable returns an empty table with the columns.
func dataTable(groups ...[]column) *Table {
	t := &Table{}
	for _, g := range groups {
		for _, c := range g {
			t.Header = append(t.Header, c.name)
			t.Right = append(t.Right, c.num)
		}
	}
	return t
}

// lead returns the settings' columns: method (when method is set), house
// size (when seats is set), default minimum and maximum, threshold and tie
// rule.
func (st Settings) lead(method, seats bool) []column {
	var cs []column
	if method {
		cs = append(cs, column{"method", false})
	}
	if seats {
		cs = append(cs, column{"house_size", true})
	}
	return append(cs, column{"default_min", true}, column{"default_max", true}, column{"threshold", true}, column{"tie_rule", false})
}

// cells returns the values of the columns lead returns.
func (st Settings) cells(method, seats bool) []string {
	var cs []string
	if method {
		cs = append(cs, st.Method.String())
	}
	if seats {
		cs = append(cs, strconv.Itoa(st.Seats))
	}
	max := ""
	if st.Max > 0 {
		max = strconv.Itoa(st.Max)
	}
	return append(cs, strconv.Itoa(st.Min), max, st.Threshold.String(), st.Tie.String())
}

func boolCell(b bool) string { return strconv.FormatBool(b) }

// numValue writes a priority value or remainder as a number: "" where
// there is none or it is infinite (a unit's first seat under Adams, Dean
// and Huntington–Hill).
func numValue(v *engine.Value) string {
	if v == nil || v.Infinite {
		return ""
	}
	return v.Text
}

func numMargin(d *engine.Decimal) string {
	if d == nil {
		return ""
	}
	return d.String()
}

// numFloat writes a display value with six significant digits, never
// with an exponent.
func numFloat(f float64) string { return strconv.FormatFloat(round6(f), 'f', -1, 64) }

func maxCell(max int) string {
	if max < 0 {
		return ""
	}
	return strconv.Itoa(max)
}

// AllotData returns the allotment's data table, one row a unit, made one
// at a time: the settings, then the unit's name, population, bounds,
// quota, seats and explanation. Without margins (left out on large inputs)
// their columns are left out too, so that an empty cell always means "no
// change of population can do it".
func AllotData(st Settings, res *engine.Result, margins bool) *Rows {
	st.Method, st.Seats = res.Method, res.Seats
	cols := [][]column{st.lead(true, true), text("unit"), nums("population", "min", "max"), text("excluded"),
		nums("quota", "lower_quota", "upper_quota", "seats"), text("meets_quota", "tied", "at_min", "at_max"), nums("unassigned")}
	div := res.Method.IsDivisor()
	if div {
		cols = append(cols, nums("last_priority", "next_priority"))
	} else {
		cols = append(cols, nums("remainder", "remainder_rank"), text("remainder_seat"))
	}
	if margins {
		cols = append(cols, nums("gain_margin", "lose_margin"))
	}
	t := dataTable(cols...)
	lead := st.cells(true, true)
	unassigned := strconv.Itoa(res.Unassigned)
	return &Rows{Header: t.Header, Right: t.Right, N: len(res.Units), Row: func(i int, row []string) []string {
		u := &res.Units[i]
		row = append(row[:0], lead...)
		row = append(row, u.Name, u.Population.String(), strconv.Itoa(u.Min), maxCell(u.Max), boolCell(u.Excluded),
			u.Quota.Text, strconv.Itoa(u.Lower), strconv.Itoa(u.Upper), strconv.Itoa(u.Seats),
			boolCell(u.MeetsQuota), boolCell(u.Tied), boolCell(u.AtMin), boolCell(u.AtMax), unassigned)
		if div {
			row = append(row, numValue(u.Last), numValue(u.Next))
		} else {
			rank, seat := "", ""
			if u.Remainder != nil {
				rank, seat = strconv.Itoa(u.RemainderRank), boolCell(u.RemainderSeat)
			}
			row = append(row, numValue(u.Remainder), rank, seat)
		}
		if margins {
			row = append(row, numMargin(u.Gain), numMargin(u.Lose))
		}
		return row
	}}
}

// ComparisonData returns the comparison's data table, one row a method and
// unit (methods in order, then units): the unit's quota and seats by that
// method, whether they meet quota, the unit's tie, the method's
// unassigned seats, whether the methods differ for the unit, and the
// method's error (its seats then empty).
func ComparisonData(st Settings, c *Comparison) *Table {
	t := dataTable(st.lead(false, true), text("method", "unit"), nums("population", "min", "max", "quota", "lower_quota", "upper_quota", "seats"),
		text("meets_quota", "tied"), nums("unassigned"), text("differs", "error"))
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
			row := append(append([]string(nil), lead...), m.String(), u.Name, u.Population.String(), strconv.Itoa(u.Min), maxCell(u.Max),
				u.Quota.Text, strconv.Itoa(u.Lower), strconv.Itoa(u.Upper))
			if r == nil {
				row = append(row, "", "", "", "", boolCell(c.Differs(i)), errText(c.Errors[k]))
			} else {
				ru := &r.Units[i]
				row = append(row, strconv.Itoa(ru.Seats), boolCell(ru.MeetsQuota), boolCell(ru.Tied), strconv.Itoa(r.Unassigned), boolCell(c.Differs(i)), "")
			}
			t.AddRow(row...)
		}
	}
	return t
}

// SweepData returns the sweep's data table, one row a method, house size
// and unit, made one at a time: the unit's seats, whether it is in a tie,
// the seats a tie left unassigned at that size, whether the unit holds
// fewer seats than at the size before (the Alabama paradox), and the
// size's error (its seats then empty). A method that can apportion no
// size has one row with its error.
func SweepData(st Settings, set *SweepSet) *Rows {
	t := dataTable(st.lead(false, false), text("method"), nums("house_size"), text("unit"), nums("seats"), text("tied"), nums("unassigned"),
		text("alabama", "error"))
	lead := st.cells(false, false)
	// Row i is found by walking the methods: each contributes its sizes
	// times its units rows, or one row when it failed.
	counts := make([]int, len(set.Methods))
	n := 0
	for k, sw := range set.Sweeps {
		counts[k] = 1
		if sw != nil {
			counts[k] = len(sw.Sizes) * len(sw.Names)
		}
		n += counts[k]
	}
	k, base := 0, 0
	return &Rows{Header: t.Header, Right: t.Right, N: n, Row: func(i int, row []string) []string {
		if i < base {
			k, base = 0, 0
		}
		for i >= base+counts[k] {
			base += counts[k]
			k++
		}
		row = append(row[:0], lead...)
		m := set.Methods[k]
		sw := set.Sweeps[k]
		if sw == nil {
			return append(row, m.String(), "", "", "", "", "", "", "cannot apportion any size in the range: "+errText(set.Errors[k]))
		}
		j, u := (i-base)/len(sw.Names), (i-base)%len(sw.Names)
		z := &sw.Sizes[j]
		row = append(row, m.String(), strconv.Itoa(z.House), sw.Names[u])
		if z.Err != nil {
			return append(row, "", "", "", "", z.Err.Error())
		}
		lost := j > 0 && sw.Sizes[j-1].Err == nil && z.Seats[u] < sw.Sizes[j-1].Seats[u]
		return append(row, strconv.Itoa(z.Seats[u]), boolCell(tiedIn(z.Ties, u)), strconv.Itoa(z.Unassigned), boolCell(lost), "")
	}}
}

func tiedIn(ts []engine.Tie, u int) bool {
	for _, t := range ts {
		for _, x := range t.Units {
			if x == u {
				return true
			}
		}
	}
	return false
}

// ParadoxData returns one row a finding: an Alabama paradox (kind
// "alabama": the unit's seats at house_size and house_size_after), a
// quota violation (kind "quota"), a house size at which a tie left seats
// unassigned (kind "tie": any paradox there depends on how it is settled)
// or a method that cannot apportion the range (kind "error").
func ParadoxData(st Settings, set *SweepSet, scen *engine.Scenario) *Table {
	t := dataTable(st.lead(false, false), text("method", "kind"), nums("house_size", "house_size_after"), text("unit"),
		nums("seats", "seats_after", "quota", "quota_after", "lower_quota", "upper_quota"), text("side", "bounds_cause", "tie_involved"),
		nums("unassigned"), text("detail"))
	lead := st.cells(false, false)
	row := func(cells ...string) { t.AddRow(append(append([]string(nil), lead...), cells...)...) }
	for k, m := range set.Methods {
		sw := set.Sweeps[k]
		if sw == nil {
			row(m.String(), "error", "", "", "", "", "", "", "", "", "", "", "", "", "", errText(set.Errors[k]))
			continue
		}
		for _, f := range set.Paradoxes[k] {
			var g []string
			for _, c := range f.Gainers {
				g = append(g, c.Name+" "+strconv.Itoa(c.Before)+" to "+strconv.Itoa(c.After))
			}
			detail := ""
			if len(g) > 0 {
				detail = "gaining: " + strings.Join(g, ", ")
			}
			row(m.String(), "alabama", strconv.Itoa(f.From), strconv.Itoa(f.To), f.Name, strconv.Itoa(f.Before), strconv.Itoa(f.After),
				analysis.Decimal(f.QuotaBefore), analysis.Decimal(f.QuotaAfter), "", "", "", "", boolCell(f.Tied), "", detail)
		}
		for _, q := range analysis.FindQuotaViolations(sw, scen) {
			side := "below"
			if q.Above() {
				side = "above"
			}
			row(m.String(), "quota", strconv.Itoa(q.House), "", q.Name, strconv.Itoa(q.Seats), "", analysis.Decimal(q.Quota), "",
				strconv.Itoa(q.Lower), strconv.Itoa(q.Upper), side, boolCell(q.Bounds), "", "", "")
		}
		for j := range sw.Sizes {
			z := &sw.Sizes[j]
			if z.Err == nil && z.Unassigned > 0 {
				row(m.String(), "tie", strconv.Itoa(z.House), "", "", "", "", "", "", "", "", "", "", "true", strconv.Itoa(z.Unassigned), tieDetail(z.Ties))
			}
		}
	}
	return t
}

// tieDetail says which units tie for how many seats.
func tieDetail(ts []engine.Tie) string {
	var s []string
	for _, t := range ts {
		d := strings.Join(t.Names, ", ") + " tie for " + plural(t.Seats, "seat")
		if len(t.Winners) == 0 {
			d += ", left unassigned"
		} else {
			d += ", settled by " + t.Rule
		}
		s = append(s, d)
	}
	return strings.Join(s, "; ")
}

// GrowthData returns one row a method and unit: the populations, the
// growth rate (a fraction: 0.05 is five percent), the seats before and
// after and their change, the unit's ties and each apportionment's
// unassigned seats, and whether the unit loses or gains a seat in a
// population paradox.
func GrowthData(st Settings, g *GrowthSet) *Table {
	t := dataTable(st.lead(false, true), text("method", "unit"), nums("population_before", "population_after", "growth", "seats_before", "seats_after", "change"),
		text("tied_before", "tied_after"), nums("unassigned_before", "unassigned_after"), text("paradox_loser", "paradox_gainer", "error"))
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
			gr := ""
			if !bu.Population.IsZero() {
				gr = analysis.Decimal(growthRat(bu.Population, au.Population))
			}
			row := append(append([]string(nil), lead...), m.String(), bu.Name, bu.Population.String(), au.Population.String(), gr)
			if r == nil {
				row = append(row, "", "", "", "", "", "", "", "", "", errText(g.Errors[k]))
			} else {
				b, a := r.Before.Units[i].Seats, r.After.Units[i].Seats
				row = append(row, strconv.Itoa(b), strconv.Itoa(a), strconv.Itoa(a-b), boolCell(r.Before.Units[i].Tied), boolCell(r.After.Units[i].Tied),
					strconv.Itoa(r.Before.Unassigned), strconv.Itoa(r.After.Unassigned), boolCell(losers[i]), boolCell(gainers[i]), "")
			}
			t.AddRow(row...)
		}
	}
	return t
}

// AdmitData returns one row a method and unit, the new unit last (new
// true, its seats before empty): the house sizes, the seats added and the
// new unit's fair share, each unit's seats before and after and their
// change, ties and unassigned seats, and whether the method shows the
// new-states paradox.
func AdmitData(st Settings, a *AdmitSet) *Table {
	t := dataTable(st.lead(false, false), text("method"), nums("house_before", "house_after", "added", "fair_share"), text("unit", "new"),
		nums("population", "seats_before", "seats_after", "change"), text("tied_before", "tied_after"), nums("unassigned_before", "unassigned_after"),
		text("paradox", "error"))
	f := a.First()
	if f == nil {
		return t
	}
	lead := st.cells(false, false)
	for k, m := range a.Methods {
		r := a.Results[k]
		head := append(append([]string(nil), lead...), m.String(), strconv.Itoa(f.House), strconv.Itoa(f.NewHouse), strconv.Itoa(f.Added), analysis.Decimal(f.FairShare))
		for i := 0; i <= len(f.Before.Units); i++ {
			isNew := i == len(f.Before.Units)
			name, pop := f.Name, f.People.String()
			if !isNew {
				name, pop = f.Before.Units[i].Name, f.Before.Units[i].Population.String()
			}
			row := append(append([]string(nil), head...), name, boolCell(isNew), pop)
			switch {
			case r == nil:
				row = append(row, "", "", "", "", "", "", "", "", errText(a.Errors[k]))
			case isNew:
				row = append(row, "", strconv.Itoa(r.NewSeats), "", "", boolCell(r.After.Units[i].Tied),
					strconv.Itoa(r.Before.Unassigned), strconv.Itoa(r.After.Unassigned), boolCell(r.Paradox()), "")
			default:
				b, af := r.Before.Units[i].Seats, r.After.Units[i].Seats
				row = append(row, strconv.Itoa(b), strconv.Itoa(af), strconv.Itoa(af-b), boolCell(r.Before.Units[i].Tied), boolCell(r.After.Units[i].Tied),
					strconv.Itoa(r.Before.Unassigned), strconv.Itoa(r.After.Unassigned), boolCell(r.Paradox()), "")
			}
			t.AddRow(row...)
		}
	}
	return t
}

// MeasureData returns one row a method with its measures (float64,
// rounded to six significant digits), the transfers that would improve a
// pair under each of Huntington's tests (empty when not run), the seats a
// tie left unassigned, and the method's error.
func MeasureData(st Settings, set *MeasureSet) *Table {
	t := dataTable(st.lead(false, true), text("method"), nums("loosemore_hanby", "gallagher", "sainte_lague", "largest_district"),
		text("largest_district_unit"), nums("smallest_district"), text("smallest_district_unit"),
		nums("ratio", "absolute_difference", "relative_difference", "unseated", "relative_difference_transfers", "district_size_transfers",
			"representation_transfers", "unassigned"), text("error"))
	c := set.Comparison
	if f := c.First(); f != nil {
		st.Seats = f.Seats
	}
	lead := st.cells(false, true)
	for k, m := range c.Methods {
		row := append(append([]string(nil), lead...), m.String())
		ms := set.Measures[k]
		if ms == nil {
			t.AddRow(append(row, "", "", "", "", "", "", "", "", "", "", "", "", "", "", "", errText(c.Errors[k]))...)
			continue
		}
		row = append(row, numFloat(ms.LoosemoreHanby), numFloat(ms.Gallagher), numFloat(ms.SainteLague))
		if ms.Largest > 0 {
			row = append(row, numFloat(ms.Largest), ms.LargestUnit, numFloat(ms.Smallest), ms.SmallestUnit, numFloat(ms.Ratio),
				numFloat(ms.AbsoluteDifference), numFloat(ms.RelativeDifference))
		} else {
			row = append(row, "", "", "", "", "", "", "")
		}
		row = append(row, strconv.Itoa(ms.Unseated))
		for _, pt := range analysis.PairTests() {
			if n := ms.Pairwise[pt]; n >= 0 {
				row = append(row, strconv.Itoa(n))
			} else {
				row = append(row, "")
			}
		}
		t.AddRow(append(row, strconv.Itoa(c.Results[k].Unassigned), "")...)
	}
	return t
}

// DiffData returns one row a unit: both sides' settings lead (suffixed
// _before and _after), then the unit's status, populations, growth rate
// (a fraction), seats and change, quotas, margins, ties and each side's
// unassigned seats. A side the unit is missing from has empty cells.
func DiffData(base, prop Settings, d *analysis.Diff) *Table {
	var lead []column
	for _, c := range base.lead(true, true) {
		lead = append(lead, column{c.name + "_before", c.num}, column{c.name + "_after", c.num})
	}
	t := dataTable(lead, text("unit", "status"), nums("population_before", "population_after", "growth", "seats_before", "seats_after", "change",
		"quota_before", "quota_after", "gain_margin_before", "gain_margin_after", "lose_margin_before", "lose_margin_after"),
		text("margins_changed", "tied_before", "tied_after"), nums("unassigned_before", "unassigned_after"))
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
	for i := range d.Units {
		u := &d.Units[i]
		growth := ""
		if u.Base != nil && u.Proposal != nil && !u.Base.Population.IsZero() {
			growth = analysis.Decimal(growthRat(u.Base.Population, u.Proposal.Population))
		}
		pop := func(r *engine.UnitResult) string { return r.Population.String() }
		seats := func(r *engine.UnitResult) string { return strconv.Itoa(r.Seats) }
		quota := func(r *engine.UnitResult) string { return r.Quota.Text }
		gain := func(r *engine.UnitResult) string { return numMargin(r.Gain) }
		lose := func(r *engine.UnitResult) string { return numMargin(r.Lose) }
		tied := func(r *engine.UnitResult) string { return boolCell(r.Tied) }
		row := append(append([]string(nil), cells...), u.Name, diffStatus(u), side(u.Base, pop), side(u.Proposal, pop), growth,
			side(u.Base, seats), side(u.Proposal, seats), strconv.Itoa(u.SeatChange), side(u.Base, quota), side(u.Proposal, quota),
			side(u.Base, gain), side(u.Proposal, gain), side(u.Base, lose), side(u.Proposal, lose),
			boolCell(u.GainChanged || u.LoseChanged), side(u.Base, tied), side(u.Proposal, tied),
			strconv.Itoa(d.Base.Unassigned), strconv.Itoa(d.Proposal.Unassigned))
		t.AddRow(row...)
	}
	return t
}

// DerivedData returns one row a unit of a derived body: the seats added
// to every unit, the unit's population, shares and weights (exact
// fractions to six places), seats in the house and in the body, its tie
// and the house's unassigned seats.
func DerivedData(st Settings, d *analysis.DerivedBody) *Table {
	t := dataTable(st.lead(true, true), nums("plus", "body_size"), text("unit", "counted"), nums("population", "population_share", "seats",
		"house_share", "house_weight", "body_seats", "body_share", "body_weight"), text("tied"), nums("unassigned"))
	r := d.Result
	st.Method, st.Seats = r.Method, r.Seats
	lead := append(st.cells(true, true), strconv.Itoa(d.Plus), strconv.Itoa(d.Size))
	for i, u := range d.Units {
		hw, bw := "", ""
		if u.Weight != nil {
			hw, bw = analysis.Decimal(u.HouseWeight), analysis.Decimal(u.Weight)
		}
		t.AddRow(append(append([]string(nil), lead...), u.Name, boolCell(u.Counted), r.Units[i].Population.String(), analysis.Decimal(u.PopShare),
			strconv.Itoa(u.Seats), analysis.Decimal(u.HouseShare), hw, strconv.Itoa(u.Body), analysis.Decimal(u.BodyShare), bw,
			boolCell(r.Units[i].Tied), strconv.Itoa(r.Unassigned))...)
	}
	return t
}

// BiasData returns one row a method: the study's configuration, then the
// mean seat bias of the large and the small class, their difference and
// its standard error (float64, six significant digits; a positive
// difference favours large units), the side favoured ("large", "small" or
// "neither"), the sets in which each class was ahead, and the sets with a
// tie (settled by lot).
func BiasData(st *analysis.BiasStudy) *Table {
	t := dataTable(nums("seed", "draws", "units", "house_size"), text("spread"), nums("total", "class_size"), text("method"),
		nums("large", "small", "difference", "std_error"), text("favours"), nums("large_ahead", "small_ahead", "tied_sets"))
	c := st.Config
	lead := []string{strconv.FormatUint(c.Seed, 10), strconv.Itoa(c.Draws), strconv.Itoa(c.Units), strconv.Itoa(c.House), c.Spread.String(),
		strconv.FormatUint(c.Total, 10), strconv.Itoa(st.Class)}
	for _, b := range st.Methods {
		t.AddRow(append(append([]string(nil), lead...), b.Method.String(), numFloat(b.Large), numFloat(b.Small), numFloat(b.Difference),
			numFloat(b.StdErr), b.Leaning(), strconv.Itoa(b.LargeAhead), strconv.Itoa(b.SmallAhead), strconv.Itoa(b.Ties))...)
	}
	return t
}

// ProjectionData returns one row a unit of a projection: the settings and
// the projection's (target date, growth model and fit, error model,
// default relative standard error, draws made and apportioned, seed), then
// the unit's latest count, projection, its own relative standard error,
// its seats and ties at baseline and at the central projection with each
// apportionment's unassigned seats, and, with draws, the mean seats and
// the shares of draws (fractions of one) in which it loses or gains a
// seat, holds the last seat, takes the next, and so on, and the seat
// distribution in words.
func ProjectionData(st Settings, s *projection.Summary) *Table {
	t := dataTable(st.lead(true, true), text("target", "growth", "fit", "error_model"), nums("default_rse", "draws", "apportioned", "seed"),
		text("unit", "latest_date"), nums("latest", "projected", "rse", "baseline_seats", "central_seats"), text("baseline_tied", "central_tied"),
		nums("baseline_unassigned", "central_unassigned", "mean_seats", "p_lose", "p_gain", "p_last_seat", "p_next_seat", "p_in_last", "p_in_next", "p_tied"),
		text("seat_distribution"))
	st.Method, st.Seats = s.Method, s.Seats
	target, growth, fit, model := "", "", "", ""
	if s.Target != nil {
		target, growth, fit = s.Target.String(), s.Growth.String(), s.Fit.String()
	}
	if s.Draws > 0 {
		model = s.Error.String()
	}
	lead := append(st.cells(true, true), target, growth, fit, model, numFloat(s.RSE), strconv.Itoa(s.Draws),
		strconv.FormatInt(s.Apportioned, 10), strconv.FormatUint(s.Seed, 10))
	for i, u := range s.Units {
		date := ""
		if u.Latest.Dated {
			date = u.Latest.Date.String()
		}
		row := append(append([]string(nil), lead...), u.Name, date, u.Latest.Population.String(), u.Central.String(), numFloat(u.RSE),
			strconv.Itoa(u.BaselineSeats), strconv.Itoa(u.CentralSeats), boolCell(s.Baseline.Units[i].Tied), boolCell(s.Central.Units[i].Tied),
			strconv.Itoa(s.Baseline.Unassigned), strconv.Itoa(s.Central.Unassigned))
		if s.Draws > 0 {
			var dist []string
			for _, d := range u.Dist {
				dist = append(dist, plural(d.Seats, "seat")+": "+fixed(d.P, 4))
			}
			row = append(row, numFloat(u.Mean), fixed(u.Lose.P, 4), fixed(u.Gain.P, 4), fixed(u.Last.P, 4), fixed(u.Next.P, 4),
				fixed(u.InLast.P, 4), fixed(u.InNext.P, 4), fixed(u.Tied.P, 4), strings.Join(dist, "; "))
		} else {
			row = append(row, "", "", "", "", "", "", "", "", "")
		}
		t.AddRow(row...)
	}
	return t
}

// HouseData returns the comparison's data table at the house size a rule
// chose, led by the rule and its unrounded value.
func HouseData(st Settings, hs *analysis.HouseSize, c *Comparison) *Table {
	t := ComparisonData(st, c)
	t.Header = append([]string{"rule", "rule_value"}, t.Header...)
	t.Right = append([]bool{false, true}, t.Right...)
	for i := range t.Rows {
		t.Rows[i] = append([]string{hs.Rule.String(), hs.Text}, t.Rows[i]...)
	}
	return t
}
