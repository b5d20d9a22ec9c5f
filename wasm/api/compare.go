package main

import (
	"seatsmith/engine/jsondoc"
	"seatsmith/engine/report"
)

func init() { register("compare", compare) }

// compare apportions a scenario by every method and returns the comparison
// document (engine/report), the same content as "seatsmith compare -format
// json". The scenario's method, if any, is ignored. A method that cannot
// apportion the scenario carries its error in the document; when none can,
// the scenario itself is at fault and compare returns the first method's
// error instead.
func compare(arg *jsondoc.Value) (*jsondoc.Value, error) {
	src, err := scenarioArg(arg)
	if err != nil {
		return nil, err
	}
	c := report.Compare(src.Scenario, nil, 0)
	if c.First() == nil {
		return nil, c.Errors[0]
	}
	return c.Doc(src.Title), nil
}
