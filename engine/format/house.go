package format

import (
	"strconv"

	"seatsmith/engine/analysis"
	"seatsmith/engine/jsondoc"
)

// House returns the document of the house size a rule gives and the
// apportionment at that size by each method of c.
func House(title string, hs *analysis.HouseSize, c *analysis.Comparison) *Document {
	t := title
	if t == "" {
		t = "House size"
	}
	d := &Document{Kind: "house-size", Title: t + ": " + hs.Rule.String() + " rule gives " + Plural(hs.Size, "seat")}
	var how string
	switch hs.Rule {
	case analysis.CubeRoot:
		how = "Cube-root law: the cube root of the total population " + analysis.Decimal(hs.Total) + " is " + hs.Text +
			", nearest whole number " + strconv.Itoa(hs.Size) + "."
	case analysis.SmallestUnit:
		how = "Smallest unit as the divisor: " + hs.Smallest + " has " + hs.SmallestOf.String() + " people; total " +
			analysis.Decimal(hs.Total) + " / " + hs.SmallestOf.String() + " = " + hs.Text + ", nearest whole number " + strconv.Itoa(hs.Size) + "."
	}
	d.Body = []Block{Paragraph{how}, comparisonTable(c), List{Items: comparisonNotes(c)}}
	data := ComparisonData(c)
	d.Data = NewTable([]Column{{Name: "rule"}, {Name: "rule_value", Number: true}}, data.Columns)
	for i := 0; i < data.Len(); i++ {
		d.Data.Add(row([]string{hs.Rule.String(), hs.Text}, data.At(i, nil)...)...)
	}
	d.Tree = func() *Tree { return &Tree{Root: houseJSON(title, hs, c)} }
	return d
}

// houseJSON builds the house-size document: the rule's house size and the
// comparison at that size.
func houseJSON(title string, hs *analysis.HouseSize, c *analysis.Comparison) *jsondoc.Value {
	v := header("house-size", title)
	v.Set("rule", jsondoc.Str(hs.Rule.String())).Set("total", jsondoc.Str(analysis.Decimal(hs.Total)))
	v.Set("value", jsondoc.Str(hs.Text)).Set("seats", jsondoc.Int(hs.Size))
	if hs.Rule == analysis.SmallestUnit {
		v.Set("smallest", jsondoc.NewObject().Set("unit", jsondoc.Str(hs.Smallest)).Set("population", jsondoc.Str(hs.SmallestOf.String())))
	} else {
		v.Set("smallest", nil)
	}
	return v.Set("comparison", ComparisonJSON(title, c))
}
