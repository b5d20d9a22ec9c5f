package main

import (
	"strconv"
	"strings"

	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
)

func init() { register("readCSV", readCSV) }

// readCSV reads a CSV table of units (engine/input: a header naming name,
// population and optional min and max) and returns {units: [{name,
// population, min, max}]} in the shape a scenario's units member takes.
// population is the exact decimal as a string; min and max are present
// only where the table gives them. Errors carry the table's line.
func readCSV(arg *jsondoc.Value) (*jsondoc.Value, error) {
	if arg.Kind != jsondoc.String {
		return nil, &input.Error{Msg: "readCSV takes the text of a CSV table (a string), not " + kindName(arg)}
	}
	if len(arg.Text) > maxText {
		return nil, &input.Error{Msg: "the table is longer than the limit of " + strconv.Itoa(maxText>>20) + " MiB"}
	}
	src, err := input.ReadCSV("", strings.NewReader(arg.Text))
	if err != nil {
		return nil, err
	}
	if n := len(src.Scenario.Units); n > maxUnits {
		return nil, &input.Error{Field: "units", Msg: strconv.Itoa(n) + " units is more than the " + strconv.Itoa(maxUnits) + " this page can apportion"}
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

// kindName names the JSON kind of v with its article, for messages.
func kindName(v *jsondoc.Value) string {
	switch v.Kind {
	case jsondoc.Null:
		return "null"
	case jsondoc.Array, jsondoc.Object:
		return "an " + v.Kind.String()
	}
	return "a " + v.Kind.String()
}
