package main

import (
	"os"
	"strconv"
	"strings"

	"seatsmith/engine/analysis"
	"seatsmith/engine/format"
	"seatsmith/engine/input"
)

func init() {
	register(&command{name: "growth", summary: "population paradox between two population sets", run: runGrowth})
}

const growthHelp = `Usage: seatsmith growth [options] BEFORE AFTER

Apportions the house with the populations in BEFORE and again with those
in AFTER (same units, matched by name; only AFTER's populations are used),
by each method, and lists every population paradox: a pair of units where
one grew at least as fast as the other (growth rates compared exactly) yet
lost a seat while the other gained one. Divisor methods never show it;
largest-remainder methods can.

JSON (-format json): {version, kind: "population-paradox", caution, title,
seats, total_before, total_after, units: [{name, before, after, growth,
growth_exact}], results: [{method, method_name, error, seats_before: {unit:
seats}, seats_after, paradoxes, unassigned_before, unassigned_after}],
paradoxes: [{kind: "population", method, house, unit, loser: {unit, from,
to, growth, growth_exact, seats_before, seats_after}, gainer: {...},
faster, tied, text}]}.

Examples:
  seatsmith growth -seats 40 testdata/demo/vessaria.csv testdata/demo/vessaria-later.csv
  seatsmith growth -method hamilton -format json testdata/demo/vessaria.json testdata/demo/vessaria-later.csv

Options:
`

func runGrowth(e *env, args []string) int {
	opts := newMethodsFlags(e, "growth", growthHelp, methodListHelp, "text", "csv", "json", "markdown")
	fs := opts.fs
	ms, code, done := opts.parse(e, args)
	if done {
		return code
	}
	if fs.NArg() != 2 {
		return fail(e, "growth", usageError("expected two files, BEFORE and AFTER, got "+strconv.Itoa(fs.NArg())))
	}
	src, err := loadFileWith(e, fs, false, fs.Arg(0), nil)
	if err != nil {
		return fail(e, "growth", err)
	}
	later, err := readSource(e, fs.Arg(1))
	if err != nil {
		return fail(e, "growth", err)
	}
	g, err := analysis.FindGrowth(src.Scenario, later.Scenario, ms)
	if err != nil {
		return fail(e, "growth", &input.Error{File: later.File, Msg: err.Error()})
	}
	if g.First() == nil {
		return fail(e, "growth", src.Locate(g.Errors[0]))
	}
	err = opts.of.encode(e, format.Growth(src.Title, g))
	if err != nil {
		return fail(e, "growth", err)
	}
	return tieNote(e, "growth", g.Unsettled())
}

// readSource reads a scenario file (or standard input for "-") without
// applying any option.
func readSource(e *env, name string) (*input.Source, error) {
	if name == "-" {
		return readOptions.Read("stdin", e.stdin)
	}
	f, err := os.Open(name)
	if err != nil {
		return nil, &input.Error{File: name, Msg: "cannot read: " + strings.TrimPrefix(err.Error(), "open "+name+": ")}
	}
	defer f.Close()
	return readOptions.Read(name, f)
}
