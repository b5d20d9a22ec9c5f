package main

import (
	"flag"

	"seatsmith/engine/analysis"
	"seatsmith/engine/format"
)

func init() {
	register(&command{name: "house", summary: "choose the house size by a rule and apportion at it", run: runHouse})
}

const houseHelp = `Usage: seatsmith house [options] -rule RULE FILE

Chooses the house size from the populations by a rule and apportions at
that size by each method:

  cube-root      the cube-root law of assembly size (Taagepera 1972): the
                 whole number nearest to the cube root of the total
                 population, found exactly
  smallest-unit  the smallest unit's population as the divisor: the whole
                 number nearest to total/smallest (halves up), so that the
                 smallest unit's quota is about one seat

The rule sets the house size; -seats is refused.

JSON (-format json): {version, kind: "house-size", caution, title, rule,
total, value (the unrounded size), seats, smallest: {unit, population} or
null, comparison: the comparison document of "seatsmith compare" at that
size}.

Examples:
  seatsmith house -rule cube-root testdata/demo/vessaria.csv
  seatsmith house -rule smallest-unit -method huntington-hill -format json testdata/demo/vessaria.json

Options:
`

func runHouse(e *env, args []string) int {
	fs := flag.NewFlagSet("house", flag.ContinueOnError)
	fs.SetOutput(e.stderr)
	var sf scenarioFlags
	var of outputFlags
	sf.bind(fs, false)
	of.bind(fs, "text", "csv", "json", "markdown")
	method := fs.String("method", "all", methodListHelp)
	rule := fs.String("rule", "", "house-size rule: cube-root or smallest-unit")
	fs.Usage = helpFunc(fs, e.stdout, houseHelp)
	if code, done := parseArgs(fs, args); done {
		return code
	}
	if err := of.check("text", "csv", "json", "markdown"); err != nil {
		return fail(e, "house", err)
	}
	ms, err := methodList(*method)
	if err != nil {
		return fail(e, "house", err)
	}
	r, err := analysis.ParseSizeRule(*rule)
	if err != nil {
		return fail(e, "house", usageError("-rule: "+err.Error()))
	}
	if given(fs, "seats") {
		return fail(e, "house", usageError("-seats: the rule chooses the house size; leave -seats out"))
	}
	if fs.NArg() != 1 {
		return fail(e, "house", usageError("expected one FILE argument (or - for standard input)"))
	}
	src, err := loadFileWith(e, fs, false, fs.Arg(0), map[string]string{"seats": "1"})
	if err != nil {
		return fail(e, "house", err)
	}
	hs, err := analysis.ChooseSize(r, src.Scenario.Units)
	if err != nil {
		return fail(e, "house", src.Locate(err))
	}
	s := src.Scenario
	s.Seats = hs.Size
	c := analysis.CompareMethods(s, ms, 0)
	if c.First() == nil {
		return fail(e, "house", src.Locate(c.Errors[0]))
	}
	err = of.encode(e, format.House(src.Title, hs, c))
	if err != nil {
		return fail(e, "house", err)
	}
	return tieNote(e, "house", c.Unsettled())
}
