package format

import (
	"strconv"
	"strings"

	"seatsmith/engine/analysis"
	"seatsmith/engine/jsondoc"
)

// Paradoxes returns the document of the Alabama paradoxes and quota
// violations of every method of a sweep set: a summary line a method (that
// never says there is none where a tie leaves seats unassigned), then at
// most limit findings of each kind a method (0: all) in the body; every
// finding in the data and the JSON form.
func Paradoxes(title string, set *analysis.SweepSet, limit int) *Document {
	t := title
	if t == "" {
		t = "Paradoxes"
	}
	d := &Document{Kind: "paradoxes", Title: t + ": house sizes " + strconv.Itoa(set.From) + " to " + strconv.Itoa(set.To)}
	for k, m := range set.Methods {
		sw := set.Sweeps[k]
		if sw == nil {
			d.Body = append(d.Body, List{Items: []string{m.Name() + ": cannot apportion any size in the range: " + errText(set.Errors[k])}})
			continue
		}
		qv := set.Violations(k)
		ps := set.Paradoxes[k]
		head := m.Name() + ": " + countText(len(ps), "Alabama paradox", "Alabama paradoxes") + ", " + countText(len(qv), "quota violation", "quota violations")
		if tie := sweepTieText(sw); tie != "" {
			head += " among the seats assigned; " + tie
		}
		l := List{Head: head}
		for j := range ps {
			if limit > 0 && j == limit {
				l.Items = append(l.Items, "… and "+strconv.Itoa(len(ps)-limit)+" more (see -format json or csv)")
				break
			}
			l.Items = append(l.Items, ps[j].Text())
		}
		for j := range qv {
			if limit > 0 && j == limit {
				l.Items = append(l.Items, "… and "+strconv.Itoa(len(qv)-limit)+" more (see -format json or csv)")
				break
			}
			l.Items = append(l.Items, qv[j].Text())
		}
		d.Body = append(d.Body, l)
	}
	d.Data = paradoxData(set)
	d.Tree = func() *Tree { return paradoxTree(title, set) }
	return d
}

// paradoxData has one row a finding: an Alabama paradox (kind "alabama":
// the unit's seats at house_size and house_size_after), a quota violation
// (kind "quota"), a house size at which a tie left seats unassigned (kind
// "tie": any paradox there depends on how it is settled) or a method that
// cannot apportion the range (kind "error").
func paradoxData(set *analysis.SweepSet) *Table {
	st := SettingsOf(&set.Scenario)
	t := NewTable(st.columns(false, false), Text("method", "kind"), Numbers("house_size", "house_size_after"), Text("unit"),
		Numbers("seats", "seats_after", "quota", "quota_after", "lower_quota", "upper_quota"), Text("side", "bounds_cause", "tie_involved"),
		Numbers("unassigned"), Text("detail"))
	lead := st.cells(false, false)
	for k, m := range set.Methods {
		sw := set.Sweeps[k]
		if sw == nil {
			t.Add(row(lead, m.String(), "error", "", "", "", "", "", "", "", "", "", "", "", "", "", errText(set.Errors[k]))...)
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
			t.Add(row(lead, m.String(), "alabama", strconv.Itoa(f.From), strconv.Itoa(f.To), f.Name, strconv.Itoa(f.Before), strconv.Itoa(f.After),
				analysis.Decimal(f.QuotaBefore), analysis.Decimal(f.QuotaAfter), "", "", "", "", boolCell(f.Tied), "", detail)...)
		}
		for _, q := range set.Violations(k) {
			side := "below"
			if q.Above() {
				side = "above"
			}
			t.Add(row(lead, m.String(), "quota", strconv.Itoa(q.House), "", q.Name, strconv.Itoa(q.Seats), "", analysis.Decimal(q.Quota), "",
				strconv.Itoa(q.Lower), strconv.Itoa(q.Upper), side, boolCell(q.Bounds), "", "", "")...)
		}
		for j := range sw.Sizes {
			z := &sw.Sizes[j]
			if z.Err == nil && z.Unassigned > 0 {
				t.Add(row(lead, m.String(), "tie", strconv.Itoa(z.House), "", "", "", "", "", "", "", "", "", "", "true", strconv.Itoa(z.Unassigned), TiesText(z.Ties, sweepName(sw)))...)
			}
		}
	}
	return t
}

// ParadoxJSON returns the paradoxes document (JSON) of a sweep set, built
// whole: the Alabama paradoxes and quota violations of every method over
// the range.
func ParadoxJSON(title string, set *analysis.SweepSet) *jsondoc.Value {
	return paradoxTree(title, set).Value()
}

// paradoxTree is the paradoxes document with its findings made one at a
// time.
func paradoxTree(title string, set *analysis.SweepSet) *Tree {
	v := header("paradoxes", title)
	v.Set("from", jsondoc.Int(set.From)).Set("to", jsondoc.Int(set.To))
	methods := jsondoc.NewArray()
	var all []func() *jsondoc.Value
	for k, m := range set.Methods {
		x := methodDoc(m)
		if set.Sweeps[k] == nil {
			x.Set("error", jsondoc.Str(set.Errors[k].Error())).Set("alabama", nil).Set("quota_violations", nil)
			methods.Append(x)
			continue
		}
		qv := set.Violations(k)
		x.Set("error", nil).Set("alabama", jsondoc.Int(len(set.Paradoxes[k]))).Set("quota_violations", jsondoc.Int(len(qv)))
		methods.Append(x)
		for j := range set.Paradoxes[k] {
			f := &set.Paradoxes[k][j]
			all = append(all, func() *jsondoc.Value { return alabamaDoc(f) })
		}
		for j := range qv {
			q := &qv[j]
			all = append(all, func() *jsondoc.Value { return quotaDoc(q) })
		}
	}
	v.Set("methods", methods).Set("paradoxes", jsondoc.NewArray())
	return &Tree{Root: v, Streams: []Stream{{Key: "paradoxes", N: len(all), Item: func(i int) *jsondoc.Value { return all[i]() }}}}
}

// quotaDoc writes one quota violation: {kind: "quota", method, unit, house,
// seats, quota, quota_exact, lower_quota, upper_quota, side ("above" or
// "below"), bounds_bind, text}.
func quotaDoc(q *analysis.QuotaViolation) *jsondoc.Value {
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
