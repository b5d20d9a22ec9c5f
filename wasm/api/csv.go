package api

import (
	"strings"

	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
)

// readCSV reads a CSV table of units (engine/input: a header naming name,
// population and optional min and max) and returns {units: [{name,
// population, min, max}]} in the shape a scenario's units member takes.
// population is the exact decimal as a string; min and max are present
// only where the table gives them. Errors carry the table's line. A table
// of more than MaxUnits rows, or with a name longer than MaxNameLength
// characters, is refused.
func readCSV(arg, _ *jsondoc.Value) (*jsondoc.Value, error) {
	if arg.Kind != jsondoc.String {
		return nil, &input.Error{Msg: "readCSV takes the text of a CSV table (a string), not " + KindName(arg)}
	}
	if err := checkText("", arg.Text); err != nil {
		return nil, err
	}
	// Count the lines before reading: the reader builds every row. (A
	// quoted name with line breaks in it counts as several lines.)
	if n := lines(arg.Text) - 1; n > MaxUnits {
		return nil, TooMany("", n, MaxUnits, "rows", "units")
	}
	src, err := input.ReadCSV("", strings.NewReader(arg.Text))
	if err != nil {
		return nil, err
	}
	if err := CheckScenario("", &src.Scenario, MaxUnits, "units"); err != nil {
		return nil, err
	}
	units := jsondoc.NewArray()
	for _, u := range src.Scenario.Units {
		x := []jsondoc.Field{{Key: "name", Value: jsondoc.Str(u.Name)}, {Key: "population", Value: jsondoc.Str(u.Population.String())}}
		if u.Min != nil {
			x = append(x, jsondoc.Field{Key: "min", Value: jsondoc.Int(*u.Min)})
		}
		if u.Max != nil {
			x = append(x, jsondoc.Field{Key: "max", Value: jsondoc.Int(*u.Max)})
		}
		units.Append(object(x...))
	}
	return object(jsondoc.Field{Key: "units", Value: units}), nil
}
