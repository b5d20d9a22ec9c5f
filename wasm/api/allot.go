package main

import (
	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
	"seatsmith/engine/report"
)

func init() { register("allot", allot) }

// allot apportions a scenario by its method with every explanation and
// returns the allotment document (engine/report), the same content as
// "seatsmith allot -format json".
func allot(arg *jsondoc.Value) (*jsondoc.Value, error) {
	src, err := scenarioArg(arg)
	if err != nil {
		return nil, err
	}
	res, err := engine.Allot(&src.Scenario, engine.Full)
	if err != nil {
		return nil, err
	}
	return report.Allotment(src.Title, res), nil
}
