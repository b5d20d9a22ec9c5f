package main

import (
	"seatsmith/engine/analysis"
	"seatsmith/engine/format"
)

func init() {
	register(&command{name: "measure", summary: "disproportionality measures of each method's result", run: runMeasure})
}

const measureHelp = `Usage: seatsmith measure [options] FILE

Apportions the house by each method and measures how far each result is
from proportionality: the Loosemore–Hanby index ½Σ|v−s|, the Gallagher
index √(½Σ(v−s)²), the Sainte-Laguë index Σ(s−v)²/v (shares v and s in
percent), the largest and smallest district size (persons per seat) and
their ratio, their absolute and relative difference, and Huntington's
pairwise tests: whether moving one seat between any two units would lower
their relative difference of district size (Huntington–Hill passes), their
absolute difference of district size (Dean) or of representation per
person (Webster). Measures are float64, for display; seats are exact.

JSON (-format json): {version, kind: "measures", caution, title, seats,
total, note, methods: [{method, method_name, error, unassigned,
loosemore_hanby, gallagher, sainte_lague, largest_district: {unit,
persons_per_seat}, smallest_district, ratio, absolute_difference,
relative_difference, unseated, improving_transfers: {relative_difference,
district_size_difference, representation_difference}}]}.

Examples:
  seatsmith measure -seats 40 testdata/demo/vessaria.csv
  seatsmith measure -method webster,huntington-hill -format json testdata/demo/vessaria.json

Options:
`

func runMeasure(e *env, args []string) int {
	opts := newMethodsFlags(e, "measure", measureHelp, methodListHelp, "text", "csv", "json", "markdown")
	fs := opts.fs
	ms, code, done := opts.parse(e, args)
	if done {
		return code
	}
	src, err := opts.sf.load(e, fs)
	if err != nil {
		return fail(e, "measure", err)
	}
	set := analysis.MeasureAll(src.Scenario, ms)
	if set.Comparison.First() == nil {
		return fail(e, "measure", src.Locate(set.Comparison.Errors[0]))
	}
	err = opts.of.encode(e, format.Measures(src.Title, set))
	if err != nil {
		return fail(e, "measure", err)
	}
	return tieNote(e, "measure", set.Comparison.Unsettled())
}
