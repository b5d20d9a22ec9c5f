package svg_test

import (
	"bytes"
	"fmt"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/format"
	"seatsmith/engine/format/svg"
)

// A sweep's chart written as a file: an SVG document with the pages'
// panels and its own style.
func Example() {
	s := engine.Scenario{Units: []engine.Unit{
		{Name: "Tarrow", Population: engine.Whole(940)},
		{Name: "Ulm", Population: engine.Whole(9030)},
		{Name: "Vesk", Population: engine.Whole(10030)},
	}}
	set := analysis.SweepAll(s, []engine.Method{engine.Hamilton}, 195, 205)
	var b bytes.Buffer
	svg.Encoder{}.Encode(&b, format.Sweep("Wards (invented)", set))
	out := b.String()
	fmt.Println(strings.SplitN(out, "\n", 2)[0])
	fmt.Println(strings.Count(out, `class="sc-ring sc-u`), "rings")
	// Output:
	// <?xml version="1.0" encoding="UTF-8"?>
	// 2 rings
}
