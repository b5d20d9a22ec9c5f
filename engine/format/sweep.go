package format

import (
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/jsondoc"
	"seatsmith/engine/render"
	"seatsmith/engine/render/chart"
)

// Sweep returns the document of a sweep: for each method a table of every
// unit's seats at every house size, with what changed from the size
// before, the ties and the Alabama paradoxes found; a step chart of the
// same numbers.
func Sweep(title string, set *analysis.SweepSet) *Document {
	d := &Document{Kind: "sweep", Title: rangeTitle(title, "House sizes", set)}
	for k, m := range set.Methods {
		d.Body = append(d.Body, Heading{m.Name()})
		sw := set.Sweeps[k]
		if sw == nil {
			d.Body = append(d.Body, Paragraph{"Cannot apportion any house size in the range: " + errText(set.Errors[k])})
			continue
		}
		d.Body = append(d.Body, sweepTable(sw), sweepFindings(sw, set.Paradoxes[k]))
	}
	d.Data = SweepData(set)
	d.Tree = func() *Tree { return sweepTree(title, set) }
	d.Chart = func() *render.Node { return chart.Sweep(d.Title, set, strings.Split(Wrap(Caution, 110), "\n")) }
	return d
}

// rangeTitle is a document's title over a range of house sizes.
func rangeTitle(title, what string, set *analysis.SweepSet) string {
	r := strconv.Itoa(set.From) + " to " + strconv.Itoa(set.To)
	if title == "" {
		return what + " " + r
	}
	return title + ": " + strings.ToLower(what) + " " + r
}

// sweepFindings lists the Alabama paradoxes of a sweep, and never says
// there is none where a tie leaves seats unassigned.
func sweepFindings(sw *engine.SweepResult, ps []analysis.Alabama) List {
	tie := sweepTieText(sw)
	switch {
	case len(ps) == 0 && tie == "":
		return List{Items: []string{"No Alabama paradox: no unit loses a seat as the house grows in this range."}}
	case len(ps) == 0:
		return List{Items: []string{"No Alabama paradox among the seats assigned, but " + tie + "; how a tie is settled decides whether a unit loses a seat there."}}
	}
	l := List{Head: "Alabama paradoxes in this range: " + strconv.Itoa(len(ps))}
	for j := range ps {
		l.Items = append(l.Items, ps[j].Text())
	}
	if tie != "" {
		l.Items = append(l.Items, capital(tie)+"; settling a tie may change these findings.")
	}
	return l
}

// sweepTieText says at which house sizes of a sweep a tie leaves seats
// unassigned: "" when none does.
func sweepTieText(sw *engine.SweepResult) string {
	hs := analysis.UnsettledSizes(sw)
	switch len(hs) {
	case 0:
		return ""
	case 1:
		return "a tie leaves seats unassigned at house size " + strconv.Itoa(hs[0])
	}
	var sizes []string
	for i, h := range hs {
		if i == 8 {
			sizes = append(sizes, "…")
			break
		}
		sizes = append(sizes, strconv.Itoa(h))
	}
	return "ties leave seats unassigned at " + strconv.Itoa(len(hs)) + " house sizes (" + strings.Join(sizes, ", ") + ")"
}

// sweepTable has one row per house size of sw, made one at a time: the
// size, each unit's seats, the seats a tie left unassigned (when a tie
// did at some size), what changed from the size before (+name for a unit
// that gained, -name for one that lost: the Alabama paradox) and notes on
// ties and refused sizes.
func sweepTable(sw *engine.SweepResult) *Table {
	t := NewTable(Numbers("house"), Numbers(sw.Names...))
	open := len(analysis.UnsettledSizes(sw)) > 0
	if open {
		t.Columns = append(t.Columns, Numbers("unassigned")...)
	}
	t.Columns = append(t.Columns, Text("change", "notes")...)
	t.N = len(sw.Sizes)
	t.Row = func(k int, row []string) []string {
		z := &sw.Sizes[k]
		row = append(row[:0], strconv.Itoa(z.House))
		if z.Err != nil {
			for range sw.Names {
				row = append(row, "-")
			}
			if open {
				row = append(row, "-")
			}
			return append(row, "", "cannot apportion: "+z.Err.Error())
		}
		for _, a := range z.Seats {
			row = append(row, strconv.Itoa(a))
		}
		if open {
			row = append(row, strconv.Itoa(z.Unassigned))
		}
		var prev []int
		if k > 0 && sw.Sizes[k-1].Err == nil {
			prev = sw.Sizes[k-1].Seats
		}
		return append(row, SeatChanges(sw.Names, prev, z.Seats), TiesText(z.Ties, sweepName(sw)))
	}
	return t
}

// sweepRows indexes the rows of a set that has rows per method: counts[k]
// rows for method k (each a house size and unit, or one for a method
// that failed), found from a row number in order.
type sweepRows struct {
	counts  []int
	k, base int
}

func newSweepRows(set *analysis.SweepSet, per func(sw *engine.SweepResult) int) (*sweepRows, int) {
	r := &sweepRows{counts: make([]int, len(set.Methods))}
	n := 0
	for k, sw := range set.Sweeps {
		r.counts[k] = 1
		if sw != nil {
			r.counts[k] = per(sw)
		}
		n += r.counts[k]
	}
	return r, n
}

// at returns the method of row i and the row's index within the method.
func (r *sweepRows) at(i int) (k, j int) {
	if i < r.base {
		r.k, r.base = 0, 0
	}
	for i >= r.base+r.counts[r.k] {
		r.base += r.counts[r.k]
		r.k++
	}
	return r.k, i - r.base
}

// SweepData is the sweep's data table, one row a method, house size and
// unit, made one at a time: the unit's seats, whether it is in a tie, the
// seats a tie left unassigned at that size, whether the unit holds fewer
// seats than at the size before (the Alabama paradox), and the size's
// error (its seats then empty). A method that can apportion no size has
// one row with its error.
func SweepData(set *analysis.SweepSet) *Table {
	st := SettingsOf(&set.Scenario)
	t := NewTable(st.columns(false, false), Text("method"), Numbers("house_size"), Text("unit"), Numbers("seats"), Text("tied"), Numbers("unassigned"),
		Text("alabama", "error"))
	lead := st.cells(false, false)
	idx, n := newSweepRows(set, func(sw *engine.SweepResult) int { return len(sw.Sizes) * len(sw.Names) })
	t.N = n
	t.Row = func(i int, row []string) []string {
		k, r := idx.at(i)
		row = append(row[:0], lead...)
		m, sw := set.Methods[k], set.Sweeps[k]
		if sw == nil {
			return append(row, m.String(), "", "", "", "", "", "", "cannot apportion any size in the range: "+errText(set.Errors[k]))
		}
		j, u := r/len(sw.Names), r%len(sw.Names)
		z := &sw.Sizes[j]
		row = append(row, m.String(), strconv.Itoa(z.House), sw.Names[u])
		if z.Err != nil {
			return append(row, "", "", "", "", z.Err.Error())
		}
		lost := j > 0 && sw.Sizes[j-1].Err == nil && z.Seats[u] < sw.Sizes[j-1].Seats[u]
		return append(row, strconv.Itoa(z.Seats[u]), boolCell(tiedIn(z.Ties, u)), strconv.Itoa(z.Unassigned), boolCell(lost), "")
	}
	return t
}

// sweepName gives the names of a sweep's units by index.
func sweepName(sw *engine.SweepResult) func(int) string {
	return func(i int) string { return sw.Names[i] }
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

// SweepJSON returns the sweep document (JSON), built whole; see the
// package documentation of seatsmith/engine/analysis for its schema.
func SweepJSON(title string, set *analysis.SweepSet) *jsondoc.Value {
	return sweepTree(title, set).Value()
}

// sweepTree is the sweep document with its sizes made one at a time.
func sweepTree(title string, set *analysis.SweepSet) *Tree {
	v := header("sweep", title)
	v.Set("from", jsondoc.Int(set.From)).Set("to", jsondoc.Int(set.To))
	methods := jsondoc.NewArray()
	for k, m := range set.Methods {
		x := methodDoc(m)
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
	v.Set("sizes", jsondoc.NewArray())
	v.Set("paradoxes", jsondoc.NewArray())
	var ps []*analysis.Alabama
	for k := range set.Methods {
		for j := range set.Paradoxes[k] {
			ps = append(ps, &set.Paradoxes[k][j])
		}
	}
	// Methods that failed have no sizes.
	idx, n := newSweepRows(set, func(sw *engine.SweepResult) int { return len(sw.Sizes) })
	for k, sw := range set.Sweeps {
		if sw == nil {
			n -= idx.counts[k]
			idx.counts[k] = 0
		}
	}
	sizes := Stream{Key: "sizes", N: n, Item: func(i int) *jsondoc.Value {
		k, j := idx.at(i)
		sw := set.Sweeps[k]
		z := &sw.Sizes[j]
		x := jsondoc.NewObject().Set("method", jsondoc.Str(set.Methods[k].String())).Set("seats", jsondoc.Int(z.House))
		us := jsondoc.NewArray()
		if z.Err == nil {
			for i, a := range z.Seats {
				us.Append(jsondoc.NewObject().Set("name", jsondoc.Str(sw.Names[i])).Set("seats", jsondoc.Int(a)))
			}
		}
		x.Set("units", us)
		if z.Err != nil {
			return x.Set("unassigned", nil).Set("ties", jsondoc.NewArray()).Set("error", jsondoc.Str(z.Err.Error()))
		}
		return x.Set("unassigned", jsondoc.Int(z.Unassigned)).Set("ties", tieList(z.Ties, sweepName(sw))).Set("error", nil)
	}}
	paradoxes := Stream{Key: "paradoxes", N: len(ps), Item: func(i int) *jsondoc.Value { return alabamaDoc(ps[i]) }}
	return &Tree{Root: v, Streams: []Stream{sizes, paradoxes}}
}

// alabamaDoc writes one Alabama paradox: {kind: "alabama", method, unit,
// from, to, seats_before, seats_after, quota_before, quota_after,
// gainers: [{unit, before, after}], tied, text}.
func alabamaDoc(f *analysis.Alabama) *jsondoc.Value {
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
