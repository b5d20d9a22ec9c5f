package markdown_test

import (
	"os"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/format"
	"seatsmith/engine/format/markdown"
)

// Three invented schools share seven places by two methods.
func Example() {
	s := engine.Scenario{Seats: 7, Units: []engine.Unit{
		{Name: "Harbour School", Population: engine.Whole(580)},
		{Name: "Ridge School", Population: engine.Whole(330)},
		{Name: "Fen School", Population: engine.Whole(90)},
	}}
	c := analysis.CompareMethods(s, []engine.Method{engine.Jefferson, engine.Adams}, 0)
	markdown.Encoder{}.Encode(os.Stdout, format.Comparison("Schools (invented)", c))
	// Output:
	// ## Schools (invented)
	//
	// 2 methods, 7 seats, population 1000.
	//
	// | unit | population | quota | jefferson | adams | differs |
	// | --- | ---: | ---: | ---: | ---: | --- |
	// | Harbour School | 580 | 4.06 | 5 | 4 | * |
	// | Ridge School | 330 | 2.31 | 2 | 2 |  |
	// | Fen School | 90 | 0.63 | 0 | 1 | * |
	//
	// - "!" marks seats outside the unit's lower and upper quota; "*" marks units the methods treat differently.
	//
	// > Not an official apportionment. seatsmith computes what the chosen method gives for the numbers supplied; the governing statute or constitution, the official counts and the responsible authority decide. Rely on election officials and counsel, not on this tool.
}
