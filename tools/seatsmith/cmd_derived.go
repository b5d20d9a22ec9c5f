package main

import (
	"flag"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/format"
)

func init() {
	register(&command{name: "derived", summary: "a body of the house's seats plus a fixed number per unit", run: runDerived})
}

const derivedHelp = `Usage: seatsmith derived [options] -plus K FILE

Apportions the house by one method, then adds K seats to every unit (a
college of the house's seats plus K per unit) and shows each unit's share
of that body against its share of the population: body/pop above 1 means
the unit weighs more than its people. Units below a threshold get no
added seats.

JSON (-format json): {version, kind: "derived-body", caution, title,
method, method_name, seats, plus, body_seats, total, units: [{name,
population, counted, population_share, seats, house_share, body_seats,
body_share, house_weight, body_weight}], ties, unassigned, measures:
{house: {loosemore_hanby, gallagher, sainte_lague}, body: {...}}}. Shares
and weights are exact fractions written with six decimal places.

Examples:
  seatsmith derived -method huntington-hill -seats 40 -plus 2 testdata/demo/vessaria.csv
  seatsmith derived -plus 2 -format json testdata/demo/vessaria.json

Options:
`

func runDerived(e *env, args []string) int {
	fs := flag.NewFlagSet("derived", flag.ContinueOnError)
	fs.SetOutput(e.stderr)
	var sf scenarioFlags
	var of outputFlags
	sf.bind(fs, true)
	of.bind(fs, "text", "csv", "json", "markdown")
	plus := fs.Int("plus", 2, "seats added to every unit")
	fs.Usage = helpFunc(fs, e.stdout, derivedHelp)
	if code, done := parseArgs(fs, args); done {
		return code
	}
	if err := of.check("text", "csv", "json", "markdown"); err != nil {
		return fail(e, "derived", err)
	}
	if *plus < 0 {
		return fail(e, "derived", usageError("-plus: cannot be negative"))
	}
	src, err := sf.load(e, fs)
	if err != nil {
		return fail(e, "derived", err)
	}
	if !src.Scenario.Method.Valid() {
		return fail(e, "derived", usageError("no method: give -method (or \"method\" in a JSON scenario)"))
	}
	res, err := engine.Allot(&src.Scenario, 0)
	if err != nil {
		return fail(e, "derived", src.Locate(err))
	}
	d, err := analysis.Derive(res, *plus)
	if err != nil {
		return fail(e, "derived", usageError("-plus: "+err.Error()))
	}
	err = of.encode(e, format.Derived(src.Title, d, &src.Scenario))
	if err != nil {
		return fail(e, "derived", err)
	}
	return tieNote(e, "derived", res.Unassigned > 0)
}
