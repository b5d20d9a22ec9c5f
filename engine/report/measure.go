package report

import (
	"io"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/jsondoc"
)

// A MeasureSet is one scenario apportioned by several methods, with the
// disproportionality measures of each result.
type MeasureSet struct {
	Comparison *Comparison
	Measures   []*analysis.Measures // nil where the method failed
}

// MeasureAll apportions s by every method in ms (all when empty) and
// measures each result.
func MeasureAll(s engine.Scenario, ms []engine.Method) *MeasureSet {
	c := Compare(s, ms, 0)
	set := &MeasureSet{Comparison: c, Measures: make([]*analysis.Measures, len(c.Methods))}
	for k, r := range c.Results {
		if r != nil {
			m := analysis.Measure(r)
			set.Measures[k] = &m
		}
	}
	return set
}

// Doc builds the measures document.
func (set *MeasureSet) Doc(title string) *jsondoc.Value {
	v := header("measures", title)
	c := set.Comparison
	if f := c.First(); f != nil {
		v.Set("seats", jsondoc.Int(f.Seats)).Set("total", jsondoc.Str(f.Total))
	}
	v.Set("note", jsondoc.Str("Measures are float64 approximations for display; they decide no seat. Shares are in percent."))
	arr := jsondoc.NewArray()
	for k, m := range c.Methods {
		x := jsondoc.NewObject().Set("method", jsondoc.Str(m.String())).Set("method_name", jsondoc.Str(m.Name()))
		ms := set.Measures[k]
		if ms == nil {
			x.Set("error", jsondoc.Str(c.Errors[k].Error()))
			arr.Append(x)
			continue
		}
		x.Set("error", nil).Set("unassigned", jsondoc.Int(c.Results[k].Unassigned))
		x.Set("loosemore_hanby", jsondoc.Float(round6(ms.LoosemoreHanby)))
		x.Set("gallagher", jsondoc.Float(round6(ms.Gallagher)))
		x.Set("sainte_lague", jsondoc.Float(round6(ms.SainteLague)))
		if ms.Largest > 0 {
			x.Set("largest_district", jsondoc.NewObject().Set("unit", jsondoc.Str(ms.LargestUnit)).Set("persons_per_seat", jsondoc.Float(round6(ms.Largest))))
			x.Set("smallest_district", jsondoc.NewObject().Set("unit", jsondoc.Str(ms.SmallestUnit)).Set("persons_per_seat", jsondoc.Float(round6(ms.Smallest))))
			x.Set("ratio", jsondoc.Float(round6(ms.Ratio)))
			x.Set("absolute_difference", jsondoc.Float(round6(ms.AbsoluteDifference)))
			x.Set("relative_difference", jsondoc.Float(round6(ms.RelativeDifference)))
		} else {
			x.Set("largest_district", nil).Set("smallest_district", nil).Set("ratio", nil).
				Set("absolute_difference", nil).Set("relative_difference", nil)
		}
		x.Set("unseated", jsondoc.Int(ms.Unseated))
		pw := jsondoc.NewObject()
		for _, t := range analysis.PairTests() {
			if n := ms.Pairwise[t]; n >= 0 {
				pw.Set(t.String(), jsondoc.Int(n))
			} else {
				pw.Set(t.String(), nil)
			}
		}
		x.Set("improving_transfers", pw)
		arr.Append(x)
	}
	return v.Set("methods", arr)
}

// round6 keeps six significant digits for display.
func round6(f float64) float64 {
	s := strconv.FormatFloat(f, 'g', 6, 64)
	g, _ := strconv.ParseFloat(s, 64)
	return g
}

func fmtG(f float64) string { return strconv.FormatFloat(f, 'f', 3, 64) }

func fmt1(f float64) string { return strconv.FormatFloat(f, 'f', 1, 64) }

// MeasureTable returns one row per method with its measures.
func MeasureTable(set *MeasureSet) *Table {
	t := &Table{
		Header: []string{"method", "Loosemore–Hanby %", "Gallagher", "Sainte-Laguë", "largest district", "smallest district", "ratio", "abs. difference", "rel. difference", "pairwise tests passed"},
		Right:  []bool{false, true, true, true, true, true, true, true, true, false},
	}
	c := set.Comparison
	open := false
	for _, r := range c.Results {
		open = open || (r != nil && r.Unassigned > 0)
	}
	if open {
		t.Header = append(t.Header, "unassigned (tie)")
		t.Right = append(t.Right, true)
	}
	for k, m := range c.Methods {
		ms := set.Measures[k]
		if ms == nil {
			row := []string{m.String(), "error: " + errText(c.Errors[k]), "", "", "", "", "", "", "", ""}
			if open {
				row = append(row, "")
			}
			t.AddRow(row...)
			continue
		}
		row := []string{m.String(), fmtG(ms.LoosemoreHanby), fmtG(ms.Gallagher), fmtG(ms.SainteLague)}
		if ms.Largest > 0 {
			row = append(row, fmt1(ms.Largest)+" ("+ms.LargestUnit+")", fmt1(ms.Smallest)+" ("+ms.SmallestUnit+")",
				strconv.FormatFloat(ms.Ratio, 'f', 4, 64), fmt1(ms.AbsoluteDifference),
				strconv.FormatFloat(ms.RelativeDifference*100, 'f', 2, 64)+"%")
		} else {
			row = append(row, "-", "-", "-", "-", "-")
		}
		var passed []string
		for _, pt := range analysis.PairTests() {
			switch ms.Pairwise[pt] {
			case 0:
				passed = append(passed, pairName(pt))
			case -1:
				passed = append(passed, "(not run)")
			}
		}
		if len(passed) == 0 {
			passed = []string{"none"}
		}
		row = append(row, strings.Join(passed, ", "))
		if open {
			row = append(row, strconv.Itoa(c.Results[k].Unassigned))
		}
		t.AddRow(row...)
	}
	return t
}

// measureTie reports whether a tie left seats unassigned under any method.
func measureTie(set *MeasureSet) bool {
	for _, r := range set.Comparison.Results {
		if r != nil && r.Unassigned > 0 {
			return true
		}
	}
	return false
}

func pairName(t analysis.PairTest) string {
	switch t {
	case analysis.RelativeDifference:
		return "relative"
	case analysis.DistrictSizeDifference:
		return "district size"
	}
	return "representation"
}

// WriteMeasureText writes the measures for a terminal or as Markdown,
// with the formulas.
func WriteMeasureText(w io.Writer, title string, set *MeasureSet, md bool) error {
	var b strings.Builder
	if title == "" {
		title = "Disproportionality"
	}
	if f := set.Comparison.First(); f != nil {
		title += ": " + strconv.Itoa(f.Seats) + " seats, population " + f.Total
	}
	heading(&b, title, md)
	if err := writeString(w, b.String()); err != nil {
		return err
	}
	b.Reset()
	if err := MeasureTable(set).Write(w, md); err != nil {
		return err
	}
	bl := bulletFor(md)
	b.WriteString("\n")
	notes := []string{
		"With population shares v and seat shares s in percent: Loosemore–Hanby = ½ Σ|v − s|; Gallagher = √(½ Σ(v − s)²); Sainte-Laguë = Σ(s − v)²/v.",
		"District size is persons per seat; ratio = largest/smallest; abs. difference = largest − smallest; rel. difference = (largest − smallest)/smallest.",
		"Pairwise tests (Huntington): no transfer of one seat between two units lowers their relative difference of district size (passed by Huntington–Hill), their absolute difference of district size (Dean), or of representation per person (Webster).",
		"Measures are float64 approximations for display; no seat depends on them.",
	}
	if measureTie(set) {
		notes = append(notes, "Where a tie leaves seats unassigned, the measures are of the seats held outright: the seat shares sum short of the house.")
	}
	for _, s := range notes {
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
