package main

import (
	"strconv"

	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
)

// Limits of the browser build, below the engine's own: a page runs in one
// tab with a few gigabytes at most, and an allotment explains every seat.
const (
	// maxSeats is the largest house size the API apportions. The seat
	// order of an allotment grows with the house size; the command-line
	// tool takes the engine's full range.
	maxSeats = 100_000
	// maxUnits is the most units a scenario or CSV table may have.
	maxUnits = maxItems
	// maxText is the longest CSV text readCSV accepts, in bytes.
	maxText = 32 << 20
)

// scenarioArg reads a scenario document given as an API argument, within
// the limits of the browser build. API functions that take a scenario
// share it so that they read scenarios alike.
func scenarioArg(arg *jsondoc.Value) (*input.Source, error) {
	src, err := input.FromDoc("", arg)
	if err != nil {
		return nil, err
	}
	if s := src.Scenario.Seats; s > maxSeats {
		return nil, &input.Error{Field: "seats", Msg: "the house size " + strconv.Itoa(s) +
			" is larger than the " + strconv.Itoa(maxSeats) + " seats this page can apportion; the command-line tool takes larger houses"}
	}
	if n := len(src.Scenario.Units); n > maxUnits {
		return nil, &input.Error{Field: "units", Msg: strconv.Itoa(n) + " units is more than the " + strconv.Itoa(maxUnits) + " this page can apportion"}
	}
	return src, nil
}
