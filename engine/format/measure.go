package format

import (
	"strconv"
	"strings"

	"seatsmith/engine/analysis"
	"seatsmith/engine/jsondoc"
)

// Measures returns the document of the disproportionality measures of
// each method's result, with their formulas.
func Measures(title string, set *analysis.MeasureSet) *Document {
	t := title
	if t == "" {
		t = "Disproportionality"
	}
	if f := set.Comparison.First(); f != nil {
		t += ": " + Plural(f.Seats, "seat") + ", population " + f.Total
	}
	d := &Document{Kind: "measures", Title: t}
	notes := []string{
		"With population shares v and seat shares s in percent: Loosemore–Hanby = ½ Σ|v − s|; Gallagher = √(½ Σ(v − s)²); Sainte-Laguë = Σ(s − v)²/v.",
		"District size is persons per seat; ratio = largest/smallest; abs. difference = largest − smallest; rel. difference = (largest − smallest)/smallest.",
		"Pairwise tests (Huntington): no transfer of one seat between two units lowers their relative difference of district size (passed by Huntington–Hill), their absolute difference of district size (Dean), or of representation per person (Webster).",
		"Measures are float64 approximations for display; no seat depends on them.",
	}
	if set.Comparison.Unsettled() {
		notes = append(notes, "Where a tie leaves seats unassigned, the measures are of the seats held outright: the seat shares sum short of the house.")
	}
	d.Body = []Block{measureTable(set)}
	for _, n := range notes {
		d.Body = append(d.Body, Paragraph{n})
	}
	d.Data = measureData(set)
	d.Tree = func() *Tree { return &Tree{Root: measureJSON(title, set)} }
	return d
}

func fmtG(f float64) string { return strconv.FormatFloat(f, 'f', 3, 64) }

func fmt1(f float64) string { return strconv.FormatFloat(f, 'f', 1, 64) }

// measureTable has one row per method with its measures, and a column of
// the seats a tie left unassigned when one did.
func measureTable(set *analysis.MeasureSet) *Table {
	t := NewTable(Text("method"), Numbers("Loosemore–Hanby %", "Gallagher", "Sainte-Laguë", "largest district", "smallest district", "ratio",
		"abs. difference", "rel. difference"), Text("pairwise tests passed"))
	c := set.Comparison
	open := c.Unsettled()
	if open {
		t.Columns = append(t.Columns, Numbers("unassigned (tie)")...)
	}
	for k, m := range c.Methods {
		ms := set.Measures[k]
		if ms == nil {
			cells := []string{m.String(), "error: " + errText(c.Errors[k]), "", "", "", "", "", "", "", ""}
			if open {
				cells = append(cells, "")
			}
			t.Add(cells...)
			continue
		}
		cells := []string{m.String(), fmtG(ms.LoosemoreHanby), fmtG(ms.Gallagher), fmtG(ms.SainteLague)}
		if ms.Largest > 0 {
			cells = append(cells, fmt1(ms.Largest)+" ("+ms.LargestUnit+")", fmt1(ms.Smallest)+" ("+ms.SmallestUnit+")",
				strconv.FormatFloat(ms.Ratio, 'f', 4, 64), fmt1(ms.AbsoluteDifference),
				strconv.FormatFloat(ms.RelativeDifference*100, 'f', 2, 64)+"%")
		} else {
			cells = append(cells, "-", "-", "-", "-", "-")
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
		cells = append(cells, strings.Join(passed, ", "))
		if open {
			cells = append(cells, strconv.Itoa(c.Results[k].Unassigned))
		}
		t.Add(cells...)
	}
	return t
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

// measureData has one row a method with its measures (float64, six
// significant digits), the transfers that would improve a pair under each
// of Huntington's tests (empty when not run), the seats a tie left
// unassigned, and the method's error.
func measureData(set *analysis.MeasureSet) *Table {
	c := set.Comparison
	st := SettingsOf(&c.Scenario)
	t := NewTable(st.columns(false, true), Text("method"), Numbers("loosemore_hanby", "gallagher", "sainte_lague", "largest_district"),
		Text("largest_district_unit"), Numbers("smallest_district"), Text("smallest_district_unit"),
		Numbers("ratio", "absolute_difference", "relative_difference", "unseated", "relative_difference_transfers", "district_size_transfers",
			"representation_transfers", "unassigned"), Text("error"))
	if f := c.First(); f != nil {
		st.Seats = f.Seats
	}
	lead := st.cells(false, true)
	for k, m := range c.Methods {
		cells := row(lead, m.String())
		ms := set.Measures[k]
		if ms == nil {
			t.Add(append(cells, "", "", "", "", "", "", "", "", "", "", "", "", "", "", "", errText(c.Errors[k]))...)
			continue
		}
		cells = append(cells, numFloat(ms.LoosemoreHanby), numFloat(ms.Gallagher), numFloat(ms.SainteLague))
		if ms.Largest > 0 {
			cells = append(cells, numFloat(ms.Largest), ms.LargestUnit, numFloat(ms.Smallest), ms.SmallestUnit, numFloat(ms.Ratio),
				numFloat(ms.AbsoluteDifference), numFloat(ms.RelativeDifference))
		} else {
			cells = append(cells, "", "", "", "", "", "", "")
		}
		cells = append(cells, strconv.Itoa(ms.Unseated))
		for _, pt := range analysis.PairTests() {
			if n := ms.Pairwise[pt]; n >= 0 {
				cells = append(cells, strconv.Itoa(n))
			} else {
				cells = append(cells, "")
			}
		}
		t.Add(append(cells, strconv.Itoa(c.Results[k].Unassigned), "")...)
	}
	return t
}

// measureJSON builds the measures document.
func measureJSON(title string, set *analysis.MeasureSet) *jsondoc.Value {
	v := header("measures", title)
	c := set.Comparison
	if f := c.First(); f != nil {
		v.Set("seats", jsondoc.Int(f.Seats)).Set("total", jsondoc.Str(f.Total))
	}
	v.Set("note", jsondoc.Str("Measures are float64 approximations for display; they decide no seat. Shares are in percent."))
	arr := jsondoc.NewArray()
	for k, m := range c.Methods {
		x := methodDoc(m)
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
