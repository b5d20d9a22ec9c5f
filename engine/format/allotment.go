package format

import (
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
)

// Version is the version of the JSON documents this package builds.
const Version = 1

// AllotOptions say what an allotment document holds beyond the result.
type AllotOptions struct {
	// Order lists the whole seat order in the body, not only the last
	// seats and the next.
	Order bool
	// Skipped names the parts of the explanation that were not computed
	// ("margins", "order"); the body says so, the JSON form has a skipped
	// member, and the CSV form leaves out the margins' columns.
	Skipped []string
}

func (o AllotOptions) skipped(part string) bool {
	for _, s := range o.Skipped {
		if s == part {
			return true
		}
	}
	return false
}

// Allotment returns the document of one apportionment: res, of scenario
// s (whose units may have been dropped: only its settings are read).
func Allotment(title string, res *engine.Result, s *engine.Scenario, opt AllotOptions) *Document {
	d := &Document{Kind: "allotment", Title: title}
	if d.Title == "" {
		d.Title = "Apportionment"
	}
	d.Body = append(d.Body, Paragraph{allotHead(res) + "."})
	if n := skippedNote(opt.Skipped); n != "" {
		d.Body = append(d.Body, Paragraph{n})
	}
	d.Body = append(d.Body, allotTable(res))
	for _, l := range allotLegend(res) {
		d.Body = append(d.Body, Paragraph{l})
	}
	d.Body = append(d.Body, explanation(res, opt.Order)...)
	d.Data = AllotmentData(res, s, !opt.skipped("margins"))
	d.Tree = func() *Tree {
		root := allotment(title, res, jsondoc.NewArray(), jsondoc.NewArray())
		if len(opt.Skipped) > 0 {
			arr := jsondoc.NewArray()
			for _, s := range opt.Skipped {
				arr.Append(jsondoc.Str(s))
			}
			root.Set("skipped", arr)
		}
		// The units and the seat order (a million seats with -order) are
		// made one at a time as they are written.
		return &Tree{Root: root, Streams: []Stream{
			{Key: "units", N: len(res.Units), Item: func(i int) *jsondoc.Value { return unitDoc(&res.Units[i], res.Method) }},
			{Key: "order", N: len(res.Order), Item: func(i int) *jsondoc.Value { return awardDoc(&res.Order[i]) }},
		}}
	}
	return d
}

// AllotmentJSON returns the allotment document (JSON) of res: the tree
// the command line writes with -format json, built whole.
func AllotmentJSON(title string, res *engine.Result) *jsondoc.Value {
	units := jsondoc.NewArray()
	for i := range res.Units {
		units.Append(unitDoc(&res.Units[i], res.Method))
	}
	return allotment(title, res, units, awardsDoc(res.Order))
}

// allotHead is the line under an allotment's title: method, house size
// (and the seats a tie left unassigned), population.
func allotHead(res *engine.Result) string {
	s := res.Method.Name() + ", " + Plural(res.Seats, "seat")
	if res.Unassigned > 0 {
		s += " (" + strconv.Itoa(res.Unassigned) + " left unassigned by a tie)"
	}
	return s + ", population " + res.Total
}

// allotLegend says what the allotment table's columns mean.
func allotLegend(res *engine.Result) []string {
	l := []string{MarginLegend, "quota ok: whether the seats are the unit's lower or upper quota (NO: outside them)."}
	if res.Method.IsDivisor() {
		l = append(l, "last priority: the priority (population ÷ signpost) at which the unit won its last seat; "+
			"next priority: the one its next seat needs; the seats go to the highest priorities.")
	} else {
		l = append(l, "remainder: what is left of the unit's quota once its whole seats are given; "+
			"rank: its place among the remainders, +1 when it won a seat.")
	}
	return l
}

// skippedNote says which parts of the explanation were left out, so that
// a dash in the margin columns is not read as "cannot happen".
func skippedNote(skipped []string) string {
	var parts []string
	for _, k := range skipped {
		switch k {
		case "margins":
			parts = append(parts, "the gain and lose margins were not computed (a dash in their columns means not computed here)")
		case "order":
			parts = append(parts, "the full seat order was not computed")
		}
	}
	if len(parts) == 0 {
		return ""
	}
	return capital(strings.Join(parts, ", and ") + ".")
}

// allotTable is the table of an allotment for people, one row a unit,
// made one at a time.
func allotTable(res *engine.Result) *Table {
	div := res.Method.IsDivisor()
	t := NewTable(Text("unit"), Numbers("population", "quota", "seats"), Text("quota ok"))
	if div {
		t.Columns = append(t.Columns, Numbers("last priority", "next priority")...)
	} else {
		t.Columns = append(t.Columns, Numbers("remainder", "rank")...)
	}
	t.Columns = append(t.Columns, Numbers("gain margin", "lose margin")...)
	t.Columns = append(t.Columns, Text("notes")...)
	t.N = len(res.Units)
	t.Row = func(i int, row []string) []string {
		u := &res.Units[i]
		row = append(row[:0], u.Name, u.Population.String(), u.Quota.Text, strconv.Itoa(u.Seats), yesNo(u.MeetsQuota))
		if div {
			row = append(row, valueText(u.Last), valueText(u.Next))
		} else {
			rank := ""
			if u.Remainder != nil {
				rank = strconv.Itoa(u.RemainderRank)
				if u.RemainderSeat {
					rank += " +1"
				}
			}
			row = append(row, valueText(u.Remainder), rank)
		}
		return append(row, marginText(u.Gain), marginText(u.Lose), UnitNotes(u))
	}
	return t
}

func yesNo(b bool) string {
	if b {
		return "yes"
	}
	return "NO"
}

func valueText(v *engine.Value) string {
	switch {
	case v == nil:
		return "-"
	case v.Infinite:
		return "infinite"
	}
	return v.Text
}

func marginText(d *engine.Decimal) string {
	if d == nil {
		return "-"
	}
	return d.String()
}

// explanation says how the seats were found: the ties, the divisor range
// or the quota, and the seat order (all of it with order, otherwise the
// last five seats) and the next seats.
func explanation(res *engine.Result, order bool) []Block {
	var lines []string
	for i := range res.Ties {
		s := "TIE: " + TieText(&res.Ties[i], unitName(res))
		if len(res.Ties[i].Winners) == 0 {
			s += " (choose a tie rule, or follow the law's own rule)"
		}
		lines = append(lines, s)
	}
	if d := res.Divisor; d != nil {
		if d.Single {
			lines = append(lines, "Divisor: only "+d.Low.Text+" gives this result (a tie)")
		} else {
			hi := d.High.Text
			if d.High.Infinite {
				hi = "unbounded"
			}
			lines = append(lines, "Divisor range: every divisor D with "+d.Low.Text+" < D < "+hi+" gives this result; "+
				d.Certificate+" is one (checked exactly)")
		}
	}
	if res.Quota != nil {
		name := "Hare quota (people per seat)"
		if res.Method == engine.Droop {
			name = "Droop quota"
		}
		s := name + ": " + res.Quota.Text
		if res.Passes > 1 {
			s += " in the last of " + strconv.Itoa(res.Passes) + " passes (units held at a bound were set aside)"
		}
		lines = append(lines, s)
	}
	var out []Block
	if len(lines) > 0 {
		out = append(out, List{Items: lines})
	}
	if len(res.Order) > 0 {
		from, head := 0, "Seat order (beyond the minimums):"
		if !order && len(res.Order) > 5 {
			from, head = len(res.Order)-5, "Last seats in the house:"
		}
		out = append(out, List{Head: head, Items: awards(res.Order[from:])})
	}
	if len(res.Beyond) > 0 {
		out = append(out, List{Head: "Next seats beyond the house size:", Items: awards(res.Beyond)})
	}
	return out
}

func awards(as []engine.SeatAward) []string {
	out := make([]string, len(as))
	for i, a := range as {
		p := a.Priority.Text
		if a.Priority.Infinite {
			p = "infinite"
		}
		out[i] = "seat " + strconv.Itoa(a.Seat) + ": " + a.Name + " (its seat " + strconv.Itoa(a.Nth) + "), priority " + p
	}
	return out
}

// AllotmentData is the data table of the allotment document of res, of
// scenario s (only its settings are read), one row a unit, made one at a
// time: the settings, then the unit's name, population, bounds, quota,
// seats and explanation. Without margins their columns are left out, so
// that an empty cell always means "no change of population can do it".
// It is what the pages' CSV export writes, without the rest of the
// document.
func AllotmentData(res *engine.Result, s *engine.Scenario, margins bool) *Table {
	st := SettingsOf(s)
	st.Method, st.Seats, st.Tie = res.Method, res.Seats, res.Tie
	t := NewTable(st.columns(true, true), Text("unit"), Numbers("population", "min", "max"), Text("excluded"),
		Numbers("quota", "lower_quota", "upper_quota", "seats"), Text("meets_quota", "tied", "at_min", "at_max"), Numbers("unassigned"))
	div := res.Method.IsDivisor()
	if div {
		t.Columns = append(t.Columns, Numbers("last_priority", "next_priority")...)
	} else {
		t.Columns = append(t.Columns, Numbers("remainder", "remainder_rank")...)
		t.Columns = append(t.Columns, Text("remainder_seat")...)
	}
	if margins {
		t.Columns = append(t.Columns, Numbers("gain_margin", "lose_margin")...)
	}
	lead := st.cells(true, true)
	unassigned := strconv.Itoa(res.Unassigned)
	t.N = len(res.Units)
	t.Row = func(i int, row []string) []string {
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
	}
	return t
}

// The JSON form.

// allotment builds the allotment document with the given units and seat
// order arrays (empty ones when they are streamed).
func allotment(title string, res *engine.Result, units, order *jsondoc.Value) *jsondoc.Value {
	v := header("allotment", title)
	v.Set("method", jsondoc.Str(res.Method.String()))
	v.Set("method_name", jsondoc.Str(res.Method.Name()))
	v.Set("seats", jsondoc.Int(res.Seats))
	v.Set("total", jsondoc.Str(res.Total))
	v.Set("tie_rule", jsondoc.Str(res.Tie.String()))
	v.Set("unassigned", jsondoc.Int(res.Unassigned))
	v.Set("units", units)
	v.Set("ties", Ties(res))
	if d := res.Divisor; d != nil {
		v.Set("divisor", divisorDoc(d, true))
	} else {
		v.Set("divisor", nil)
	}
	v.Set("order", order)
	v.Set("beyond", awardsDoc(res.Beyond))
	if res.Quota != nil {
		v.Set("quota", jsondoc.Str(res.Quota.Text))
		v.Set("passes", jsondoc.Int(res.Passes))
	} else {
		v.Set("quota", nil)
		v.Set("passes", nil)
	}
	return v
}

// divisorDoc writes a divisor range: {low, high, single, certificate}
// (single only when withSingle).
func divisorDoc(d *engine.DivisorRange, withSingle bool) *jsondoc.Value {
	dv := jsondoc.NewObject().Set("low", valueDoc(&d.Low)).Set("high", valueDoc(&d.High))
	if withSingle {
		dv.Set("single", jsondoc.Boolean(d.Single))
	}
	if d.Certificate != "" {
		dv.Set("certificate", jsondoc.Str(d.Certificate))
	} else {
		dv.Set("certificate", nil)
	}
	return dv
}

// header starts every JSON document: version, kind, caution and title.
func header(kind, title string) *jsondoc.Value {
	v := jsondoc.NewObject().Set("version", jsondoc.Int(Version)).Set("kind", jsondoc.Str(kind))
	v.Set("caution", jsondoc.Str(Caution))
	if title != "" {
		v.Set("title", jsondoc.Str(title))
	}
	return v
}

func unitDoc(u *engine.UnitResult, m engine.Method) *jsondoc.Value {
	x := jsondoc.NewObject()
	x.Set("name", jsondoc.Str(u.Name))
	x.Set("population", jsondoc.Str(u.Population.String()))
	x.Set("seats", jsondoc.Int(u.Seats))
	x.Set("quota", jsondoc.Str(u.Quota.Text))
	x.Set("quota_exact", jsondoc.Str(u.Quota.Num+"/"+u.Quota.Den))
	x.Set("lower_quota", jsondoc.Int(u.Lower))
	x.Set("upper_quota", jsondoc.Int(u.Upper))
	x.Set("meets_quota", jsondoc.Boolean(u.MeetsQuota))
	x.Set("min", jsondoc.Int(u.Min))
	if u.Max >= 0 {
		x.Set("max", jsondoc.Int(u.Max))
	} else {
		x.Set("max", nil)
	}
	x.Set("excluded", jsondoc.Boolean(u.Excluded))
	x.Set("at_min", jsondoc.Boolean(u.AtMin))
	x.Set("at_max", jsondoc.Boolean(u.AtMax))
	x.Set("tied", jsondoc.Boolean(u.Tied))
	if m.IsDivisor() {
		x.Set("last_priority", valueDoc(u.Last))
		x.Set("next_priority", valueDoc(u.Next))
		x.Set("remainder", nil)
		x.Set("remainder_rank", nil)
		x.Set("remainder_seat", nil)
	} else {
		x.Set("last_priority", nil)
		x.Set("next_priority", nil)
		x.Set("remainder", valueDoc(u.Remainder))
		if u.Remainder != nil {
			x.Set("remainder_rank", jsondoc.Int(u.RemainderRank))
			x.Set("remainder_seat", jsondoc.Boolean(u.RemainderSeat))
		} else {
			x.Set("remainder_rank", nil)
			x.Set("remainder_seat", nil)
		}
	}
	x.Set("gain_margin", marginDoc(u.Gain))
	x.Set("lose_margin", marginDoc(u.Lose))
	return x
}

func marginDoc(d *engine.Decimal) *jsondoc.Value {
	if d == nil {
		return nil
	}
	return jsondoc.Num(d.String())
}

// valueDoc writes a priority value or divisor: its decimal text, "infinite",
// or null when v is nil.
func valueDoc(v *engine.Value) *jsondoc.Value {
	switch {
	case v == nil:
		return nil
	case v.Infinite:
		return jsondoc.Str("infinite")
	}
	return jsondoc.Str(v.Text)
}

func awardsDoc(as []engine.SeatAward) *jsondoc.Value {
	arr := jsondoc.NewArray()
	for i := range as {
		arr.Append(awardDoc(&as[i]))
	}
	return arr
}

// awardDoc writes one seat of the seat order: {seat, unit, nth, priority}.
func awardDoc(a *engine.SeatAward) *jsondoc.Value {
	return jsondoc.NewObject().Set("seat", jsondoc.Int(a.Seat)).Set("unit", jsondoc.Str(a.Name)).
		Set("nth", jsondoc.Int(a.Nth)).Set("priority", valueDoc(&a.Priority))
}

// unitName gives the names of res's units by index.
func unitName(res *engine.Result) func(int) string {
	return func(i int) string { return res.Units[i].Name }
}

// Ties returns the ties array of a result: {units, seats, value, rule,
// winners}, empty when there is none.
func Ties(res *engine.Result) *jsondoc.Value {
	return tieList(res.Ties, unitName(res))
}

// tieList writes ties: {units: [names], seats, value, rule, winners:
// [names]}.
func tieList(ts []engine.Tie, name func(int) string) *jsondoc.Value {
	arr := jsondoc.NewArray()
	for _, t := range ts {
		names := jsondoc.NewArray()
		for _, n := range t.Names {
			names.Append(jsondoc.Str(n))
		}
		winners := jsondoc.NewArray()
		for _, w := range t.Winners {
			winners.Append(jsondoc.Str(name(w)))
		}
		arr.Append(jsondoc.NewObject().Set("units", names).Set("seats", jsondoc.Int(t.Seats)).
			Set("value", valueDoc(&t.Value)).Set("rule", jsondoc.Str(t.Rule)).Set("winners", winners))
	}
	return arr
}

// methodDoc starts a method's entry in a document: {method, method_name}.
func methodDoc(m engine.Method) *jsondoc.Value {
	return jsondoc.NewObject().Set("method", jsondoc.Str(m.String())).Set("method_name", jsondoc.Str(m.Name()))
}
