package api

import (
	"seatsmith/engine/analysis"
	"seatsmith/engine/format"
	"seatsmith/engine/jsondoc"
)

// compare apportions a scenario by every method and returns the comparison
// document (engine/format), the same content as "seatsmith compare -format
// json", for at most MaxCompareUnits units. The scenario's method, if any,
// is ignored. A method that cannot apportion the scenario carries its
// error in the document; when none can, the scenario itself is at fault
// and compare returns the first method's error instead.
func compare(arg, _ *jsondoc.Value) (*jsondoc.Value, error) {
	src, err := ScenarioArg(arg, MaxCompareUnits, "compare_units")
	if err != nil {
		return nil, err
	}
	c := analysis.CompareMethods(src.Scenario, nil, 0)
	if c.First() == nil {
		return nil, c.Errors[0]
	}
	return format.ComparisonJSON(src.Title, c), nil
}
