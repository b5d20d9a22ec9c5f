package report

import (
	"io"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/jsondoc"
)

// A SweepSet is one scenario swept over a range of house sizes by one or
// more methods, with the Alabama paradoxes found in each sweep.
type SweepSet struct {
	From, To int
	Methods  []engine.Method
	// Sweeps[k] is the sweep by Methods[k], or nil when that method can
	// apportion no size in the range; Errors[k] then says why.
	Sweeps    []*engine.SweepResult
	Errors    []error
	Paradoxes [][]analysis.Alabama
}

// SweepAll sweeps s from from to to by every method in ms (all methods
// when ms is empty).
func SweepAll(s engine.Scenario, ms []engine.Method, from, to int) *SweepSet {
	if len(ms) == 0 {
		ms = engine.Methods()
	}
	set := &SweepSet{From: from, To: to, Methods: ms, Sweeps: make([]*engine.SweepResult, len(ms)),
		Errors: make([]error, len(ms)), Paradoxes: make([][]analysis.Alabama, len(ms))}
	for k, m := range ms {
		s.Method = m
		set.Sweeps[k], set.Errors[k] = engine.Sweep(&s, from, to)
		if set.Sweeps[k] != nil {
			set.Paradoxes[k] = analysis.FindAlabama(set.Sweeps[k])
		}
	}
	return set
}

// First returns the first sweep that succeeded, or nil.
func (set *SweepSet) First() *engine.SweepResult {
	for _, sw := range set.Sweeps {
		if sw != nil {
			return sw
		}
	}
	return nil
}

// Unsettled reports whether a tie left seats unassigned at some size of
// some sweep.
func (set *SweepSet) Unsettled() bool {
	for _, sw := range set.Sweeps {
		if sw == nil {
			continue
		}
		for k := range sw.Sizes {
			if sw.Sizes[k].Unassigned > 0 {
				return true
			}
		}
	}
	return false
}

// Doc builds the sweep document (see the package documentation of
// seatsmith/engine/analysis for its schema).
func (set *SweepSet) Doc(title string) *jsondoc.Value {
	v := header("sweep", title)
	v.Set("from", jsondoc.Int(set.From)).Set("to", jsondoc.Int(set.To))
	methods := jsondoc.NewArray()
	for k, m := range set.Methods {
		x := jsondoc.NewObject().Set("method", jsondoc.Str(m.String())).Set("method_name", jsondoc.Str(m.Name()))
		if set.Errors[k] != nil {
			x.Set("error", jsondoc.Str(set.Errors[k].Error()))
		} else {
			x.Set("error", nil)
		}
		methods.Append(x)
	}
	v.Set("methods", methods)
	units := jsondoc.NewArray()
	if f := set.First(); f != nil {
		for i, n := range f.Names {
			units.Append(jsondoc.NewObject().Set("name", jsondoc.Str(n)).
				Set("population", jsondoc.Str(f.Populations[i].String())).Set("excluded", jsondoc.Boolean(f.Excluded[i])))
		}
	}
	v.Set("units", units)
	sizes := jsondoc.NewArray()
	for k, sw := range set.Sweeps {
		if sw == nil {
			continue
		}
		id := jsondoc.Str(set.Methods[k].String())
		for j := range sw.Sizes {
			z := &sw.Sizes[j]
			x := jsondoc.NewObject().Set("method", id).Set("seats", jsondoc.Int(z.House))
			us := jsondoc.NewArray()
			if z.Err == nil {
				for i, a := range z.Seats {
					us.Append(jsondoc.NewObject().Set("name", jsondoc.Str(sw.Names[i])).Set("seats", jsondoc.Int(a)))
				}
			}
			x.Set("units", us)
			if z.Err != nil {
				x.Set("unassigned", nil).Set("ties", jsondoc.NewArray()).Set("error", jsondoc.Str(z.Err.Error()))
			} else {
				x.Set("unassigned", jsondoc.Int(z.Unassigned)).Set("ties", tieList(z.Ties, sw.Names)).Set("error", nil)
			}
			sizes.Append(x)
		}
	}
	v.Set("sizes", sizes)
	par := jsondoc.NewArray()
	for k := range set.Methods {
		for j := range set.Paradoxes[k] {
			par.Append(AlabamaDoc(&set.Paradoxes[k][j]))
		}
	}
	return v.Set("paradoxes", par)
}

// tieList writes ties from a sweep: {units, seats, value, rule, winners}.
func tieList(ts []engine.Tie, names []string) *jsondoc.Value {
	arr := jsondoc.NewArray()
	for _, t := range ts {
		us := jsondoc.NewArray()
		for _, n := range t.Names {
			us.Append(jsondoc.Str(n))
		}
		ws := jsondoc.NewArray()
		for _, w := range t.Winners {
			ws.Append(jsondoc.Str(names[w]))
		}
		arr.Append(jsondoc.NewObject().Set("units", us).Set("seats", jsondoc.Int(t.Seats)).
			Set("value", valueDoc(&t.Value)).Set("rule", jsondoc.Str(t.Rule)).Set("winners", ws))
	}
	return arr
}

// AlabamaDoc writes one Alabama paradox: {kind: "alabama", method, unit,
// from, to, seats_before, seats_after, quota_before, quota_after,
// gainers: [{unit, before, after}], tied, text}.
func AlabamaDoc(f *analysis.Alabama) *jsondoc.Value {
	x := jsondoc.NewObject().Set("kind", jsondoc.Str("alabama")).Set("method", jsondoc.Str(f.Method.String()))
	x.Set("unit", jsondoc.Str(f.Name)).Set("from", jsondoc.Int(f.From)).Set("to", jsondoc.Int(f.To))
	x.Set("seats_before", jsondoc.Int(f.Before)).Set("seats_after", jsondoc.Int(f.After))
	x.Set("quota_before", jsondoc.Str(analysis.Decimal(f.QuotaBefore))).Set("quota_after", jsondoc.Str(analysis.Decimal(f.QuotaAfter)))
	x.Set("gainers", changesDoc(f.Gainers)).Set("tied", jsondoc.Boolean(f.Tied)).Set("text", jsondoc.Str(f.Text()))
	return x
}

func changesDoc(cs []analysis.SeatChange) *jsondoc.Value {
	arr := jsondoc.NewArray()
	for _, c := range cs {
		arr.Append(jsondoc.NewObject().Set("unit", jsondoc.Str(c.Name)).Set("before", jsondoc.Int(c.Before)).Set("after", jsondoc.Int(c.After)))
	}
	return arr
}

// SweepTable returns one row per house size of sw: the size, each unit's
// seats, what changed from the size before (+name for a unit that gained,
// -name for one that lost, the Alabama paradox) and notes on ties and
// refused sizes.
func SweepTable(sw *engine.SweepResult) *Table {
	t := &Table{Header: []string{"house"}, Right: []bool{true}}
	for _, n := range sw.Names {
		t.Header = append(t.Header, n)
		t.Right = append(t.Right, true)
	}
	open := false
	for k := range sw.Sizes {
		open = open || sw.Sizes[k].Unassigned > 0
	}
	if open {
		t.Header = append(t.Header, "unassigned")
		t.Right = append(t.Right, true)
	}
	t.Header = append(t.Header, "change", "notes")
	var prev []int
	for k := range sw.Sizes {
		z := &sw.Sizes[k]
		row := []string{strconv.Itoa(z.House)}
		if z.Err != nil {
			for range sw.Names {
				row = append(row, "-")
			}
			if open {
				row = append(row, "-")
			}
			row = append(row, "", "cannot apportion: "+z.Err.Error())
			t.AddRow(row...)
			prev = nil
			continue
		}
		for _, a := range z.Seats {
			row = append(row, strconv.Itoa(a))
		}
		if open {
			row = append(row, strconv.Itoa(z.Unassigned))
		}
		row = append(row, seatChanges(sw.Names, prev, z.Seats), sizeNotes(z))
		t.AddRow(row...)
		prev = z.Seats
	}
	return t
}

func seatChanges(names []string, prev, cur []int) string {
	if prev == nil {
		return ""
	}
	var up, down []string
	for i := range cur {
		switch d := cur[i] - prev[i]; {
		case d > 0:
			up = append(up, "+"+names[i]+countSuffix(d))
		case d < 0:
			down = append(down, "-"+names[i]+countSuffix(-d))
		}
	}
	return strings.Join(append(down, up...), " ")
}

func countSuffix(d int) string {
	if d == 1 {
		return ""
	}
	return "×" + strconv.Itoa(d)
}

func sizeNotes(z *engine.SweepSize) string {
	var n []string
	for _, t := range z.Ties {
		s := "TIE " + strings.Join(t.Names, ", ") + " for " + plural(t.Seats, "seat")
		if len(t.Winners) == 0 {
			s += " (unassigned)"
		} else {
			s += " (settled by " + t.Rule + ")"
		}
		n = append(n, s)
	}
	return strings.Join(n, "; ")
}

// SweepCSVTable returns every sweep of the set in one table: method,
// house, each unit's seats, unassigned seats and notes.
func SweepCSVTable(set *SweepSet) *Table {
	t := &Table{Header: []string{"method", "house"}}
	f := set.First()
	if f != nil {
		t.Header = append(t.Header, f.Names...)
	}
	t.Header = append(t.Header, "unassigned", "notes")
	for k, sw := range set.Sweeps {
		if sw == nil {
			row := []string{set.Methods[k].String(), ""}
			if f != nil {
				row = append(row, make([]string, len(f.Names))...)
			}
			t.AddRow(append(row, "", "cannot apportion any size: "+set.Errors[k].Error())...)
			continue
		}
		for j := range sw.Sizes {
			z := &sw.Sizes[j]
			row := []string{set.Methods[k].String(), strconv.Itoa(z.House)}
			if z.Err != nil {
				row = append(row, make([]string, len(sw.Names))...)
				t.AddRow(append(row, "", "cannot apportion: "+z.Err.Error())...)
				continue
			}
			for _, a := range z.Seats {
				row = append(row, strconv.Itoa(a))
			}
			t.AddRow(append(row, strconv.Itoa(z.Unassigned), sizeNotes(z))...)
		}
	}
	return t
}

// WriteSweepText writes the set for a terminal: one table per method, then
// the Alabama paradoxes found.
func WriteSweepText(w io.Writer, title string, set *SweepSet) error {
	return writeSweep(w, title, set, false)
}

// WriteSweepMarkdown writes the set as Markdown sections.
func WriteSweepMarkdown(w io.Writer, title string, set *SweepSet) error {
	return writeSweep(w, title, set, true)
}

func writeSweep(w io.Writer, title string, set *SweepSet, md bool) error {
	var b strings.Builder
	head := func(s string, level int) {
		if md {
			b.WriteString(strings.Repeat("#", level) + " " + s + "\n\n")
		} else {
			b.WriteString(s + "\n")
			if level <= 2 {
				b.WriteString(strings.Repeat("=", len([]rune(s))) + "\n")
			}
			b.WriteString("\n")
		}
	}
	h := "House sizes " + strconv.Itoa(set.From) + " to " + strconv.Itoa(set.To)
	if title != "" {
		h = title + ": house sizes " + strconv.Itoa(set.From) + " to " + strconv.Itoa(set.To)
	}
	head(h, 2)
	for k, m := range set.Methods {
		head(m.Name(), 3)
		sw := set.Sweeps[k]
		if sw == nil {
			b.WriteString("Cannot apportion any house size in the range: " + errText(set.Errors[k]) + "\n\n")
			continue
		}
		if err := writeString(w, b.String()); err != nil {
			return err
		}
		b.Reset()
		if err := SweepTable(sw).Write(w, md); err != nil {
			return err
		}
		b.WriteString("\n")
		ps := set.Paradoxes[k]
		tie := sweepTieText(sw)
		switch {
		case len(ps) == 0 && tie == "":
			b.WriteString(bulletFor(md) + "No Alabama paradox: no unit loses a seat as the house grows in this range.\n\n")
		case len(ps) == 0:
			b.WriteString(bulletFor(md) + "No Alabama paradox among the seats assigned, but " + tie + "; how a tie is settled decides whether a unit loses a seat there.\n\n")
		default:
			b.WriteString(bulletFor(md) + "Alabama paradoxes in this range: " + strconv.Itoa(len(ps)) + "\n")
			for j := range ps {
				b.WriteString(bulletFor(md) + "  " + ps[j].Text() + "\n")
			}
			if tie != "" {
				b.WriteString(bulletFor(md) + Capital(tie) + "; settling a tie may change these findings.\n")
			}
			b.WriteString("\n")
		}
	}
	if md {
		b.WriteString("> " + Caution + "\n")
	} else {
		b.WriteString(Wrap(Caution, 76) + "\n")
	}
	return writeString(w, b.String())
}

// sweepTieText says at which house sizes of a sweep a tie leaves seats
// unassigned: "" when none does.
func sweepTieText(sw *engine.SweepResult) string {
	var sizes []string
	for k := range sw.Sizes {
		if z := &sw.Sizes[k]; z.Err == nil && z.Unassigned > 0 {
			sizes = append(sizes, strconv.Itoa(z.House))
		}
	}
	switch len(sizes) {
	case 0:
		return ""
	case 1:
		return "a tie leaves seats unassigned at house size " + sizes[0]
	}
	n := len(sizes)
	if n > 8 {
		sizes = append(sizes[:8], "…")
	}
	return "ties leave seats unassigned at " + strconv.Itoa(n) + " house sizes (" + strings.Join(sizes, ", ") + ")"
}

// Capital returns s with its first letter in upper case.
func Capital(s string) string {
	if s == "" || s[0] < 'a' || s[0] > 'z' {
		return s
	}
	return string(s[0]-'a'+'A') + s[1:]
}

func bulletFor(md bool) string {
	if md {
		return "- "
	}
	return ""
}
