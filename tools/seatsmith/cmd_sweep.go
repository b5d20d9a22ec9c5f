package main

import (
	"seatsmith/engine/format"
)

func init() {
	register(&command{name: "sweep", summary: "seats of every unit at every house size in a range", run: runSweep})
}

const sweepHelp = `Usage: seatsmith sweep [options] FILE

Apportions the seats at every house size from -from to -to and shows each
unit's seats at each size, what changed from one size to the next, the
ties, and every Alabama paradox (a unit that loses a seat when the house
grows by one). Divisor methods are computed in one pass of the priority
sequence over the whole range; largest-remainder methods size by size.

-to defaults to the house size (-seats, or "seats" in a JSON scenario);
-from defaults to 1. -format svg draws a step chart, one panel per method.

JSON (-format json): {version, kind: "sweep", caution, title, from, to,
methods: [{method, method_name, error}], units: [{name, population,
excluded}], sizes: [{method, seats, units: [{name, seats}], unassigned,
ties, error}], paradoxes: [{kind: "alabama", method, unit, from, to,
seats_before, seats_after, quota_before, quota_after, gainers, tied,
text}]}. "seats" in a size is the house size.

Examples:
  seatsmith sweep -method hamilton -from 30 -to 60 testdata/demo/vessaria.csv
  seatsmith sweep -method huntington-hill -from 9 -to 80 -format svg -o chart.svg testdata/demo/vessaria.csv
  seatsmith sweep -from 1 -to 40 -format json testdata/demo/vessaria.json

Options:
`

func runSweep(e *env, args []string) int {
	opts := newMethodsFlags(e, "sweep", sweepHelp, methodListHelp, "text", "csv", "json", "markdown", "svg")
	fs := opts.fs
	from := fs.Int("from", 1, "smallest house size")
	to := fs.Int("to", 0, "largest house size (default: the house size)")
	ms, code, done := opts.parse(e, args)
	if done {
		return code
	}
	set, src, code := sweepFromFlags(e, "sweep", fs, ms, *from, *to)
	if set == nil {
		return code
	}
	if err := opts.of.encode(e, format.Sweep(src.Title, set)); err != nil {
		return fail(e, "sweep", err)
	}
	return tieNote(e, "sweep", set.Unsettled())
}
