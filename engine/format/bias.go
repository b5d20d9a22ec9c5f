package format

import (
	"strconv"

	"seatsmith/engine/analysis"
	"seatsmith/engine/jsondoc"
)

// Bias returns the document of a bias study: each method's mean seat bias
// for the large units and the small, their difference and the side it
// favours.
func Bias(title string, st *analysis.BiasStudy) *Document {
	t := title
	if t == "" {
		t = "Seat bias study"
	}
	d := &Document{Kind: "bias", Title: t + ": " + strconv.Itoa(st.Config.Units) + " units, " + strconv.Itoa(st.Config.House) + " seats"}
	d.Body = []Block{
		List{Items: []string{"Population sets: " + biasDistribution(st.Config) + ".",
			"Classes: the " + strconv.Itoa(st.Class) + " largest and the " + strconv.Itoa(st.Class) + " smallest units of each set."}},
		biasTable(st),
		Paragraph{"Each figure is the mean, over the sets, of the class's seats minus its exact quotas; large − small above zero favours large units. " +
			"\"favours\" names a side only when the mean difference is more than two standard errors from zero. Means are float64, for display."},
		Paragraph{"A set with a tie has it settled by lot (seeded from the study's seed and the set's number), so every seat is assigned in every set."},
	}
	d.Data = biasData(st)
	d.Tree = func() *Tree { return &Tree{Root: biasJSON(title, st)} }
	return d
}

// biasDistribution describes in words how the study draws its population
// sets.
func biasDistribution(c analysis.BiasConfig) string {
	if c.Spread == analysis.Decades {
		return strconv.Itoa(c.Draws) + " sets of " + strconv.Itoa(c.Units) + " units; each population's decade (10^3 to 10^6) chosen uniformly, " +
			"then uniform within it; PCG seed " + strconv.FormatUint(c.Seed, 10)
	}
	return strconv.Itoa(c.Draws) + " sets of " + strconv.Itoa(c.Units) + " units with populations uniform on the simplex of total " +
		strconv.FormatUint(c.Total, 10) + " (gaps between sorted uniform cut points); PCG seed " + strconv.FormatUint(c.Seed, 10)
}

// biasTable has one row per method of a bias study.
func biasTable(st *analysis.BiasStudy) *Table {
	t := NewTable(Text("method"), Numbers("large units", "small units", "large − small", "std. error"), Text("favours"), Numbers("sets with a tie"))
	for _, b := range st.Methods {
		t.Add(b.Method.String(), signed(b.Large), signed(b.Small), signed(b.Difference), strconv.FormatFloat(b.StdErr, 'f', 4, 64), b.Leaning(),
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

// biasData has one row a method: the study's configuration, then the mean
// seat bias of the large and the small class, their difference and its
// standard error (float64, six significant digits; a positive difference
// favours large units), the side favoured ("large", "small" or
// "neither"), the sets in which each class was ahead, and the sets with a
// tie (settled by lot).
func biasData(st *analysis.BiasStudy) *Table {
	t := NewTable(Numbers("seed", "draws", "units", "house_size"), Text("spread"), Numbers("total", "class_size"), Text("method"),
		Numbers("large", "small", "difference", "std_error"), Text("favours"), Numbers("large_ahead", "small_ahead", "tied_sets"))
	c := st.Config
	lead := []string{strconv.FormatUint(c.Seed, 10), strconv.Itoa(c.Draws), strconv.Itoa(c.Units), strconv.Itoa(c.House), c.Spread.String(),
		strconv.FormatUint(c.Total, 10), strconv.Itoa(st.Class)}
	for _, b := range st.Methods {
		t.Add(row(lead, b.Method.String(), numFloat(b.Large), numFloat(b.Small), numFloat(b.Difference),
			numFloat(b.StdErr), b.Leaning(), strconv.Itoa(b.LargeAhead), strconv.Itoa(b.SmallAhead), strconv.Itoa(b.Ties))...)
	}
	return t
}

// biasJSON builds the bias-study document.
func biasJSON(title string, st *analysis.BiasStudy) *jsondoc.Value {
	v := header("bias", title)
	c := st.Config
	cfg := jsondoc.NewObject().Set("seed", jsondoc.Num(strconv.FormatUint(c.Seed, 10))).Set("draws", jsondoc.Int(c.Draws)).
		Set("units", jsondoc.Int(c.Units)).Set("seats", jsondoc.Int(c.House)).Set("spread", jsondoc.Str(c.Spread.String())).
		Set("total", jsondoc.Num(strconv.FormatUint(c.Total, 10))).Set("class_size", jsondoc.Int(st.Class))
	v.Set("config", cfg)
	v.Set("distribution", jsondoc.Str(biasDistribution(c)))
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
