package main

import (
	"flag"
	"strconv"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/format"
	"seatsmith/engine/input"
)

func init() {
	register(&command{name: "paradox", summary: "Alabama paradoxes and quota violations over a range of house sizes", run: runParadox})
}

const paradoxHelp = `Usage: seatsmith paradox [options] FILE

Sweeps the house sizes from -from to -to by each method and lists, in
numbers, every Alabama paradox (a unit with fewer seats when the house
grows by one, although its quota rises) and every quota violation (a unit
with more than its upper or fewer than its lower quota). Divisor methods
never show an Alabama paradox; Hamilton never breaks quota without bounds.
For the population paradox see "seatsmith growth", for the new-states
paradox "seatsmith admit".

JSON (-format json): {version, kind: "paradoxes", caution, title, from, to,
methods: [{method, method_name, error, alabama, quota_violations}],
paradoxes: [{kind: "alabama", method, unit, from, to, seats_before,
seats_after, quota_before, quota_after, gainers, tied, text} or {kind:
"quota", method, unit, house, seats, quota, quota_exact, lower_quota,
upper_quota, side, bounds_bind, text}]}.

Examples:
  seatsmith paradox -method hamilton -from 9 -to 120 testdata/demo/vessaria.csv
  seatsmith paradox -method jefferson,adams -from 20 -to 60 -limit 5 testdata/demo/vessaria.json
  seatsmith paradox -to 200 -format json testdata/demo/vessaria.csv

Options:
`

func runParadox(e *env, args []string) int {
	opts := newMethodsFlags(e, "paradox", paradoxHelp, methodListHelp, "text", "csv", "json", "markdown")
	fs := opts.fs
	from := fs.Int("from", 1, "smallest house size")
	to := fs.Int("to", 0, "largest house size (default: the house size)")
	limit := fs.Int("limit", 20, "findings of each kind listed per method in text and markdown (0: all)")
	ms, code, done := opts.parse(e, args)
	if done {
		return code
	}
	if *limit < 0 {
		return fail(e, "paradox", usageError("-limit: cannot be negative"))
	}
	set, src, code := sweepFromFlags(e, "paradox", fs, ms, *from, *to)
	if set == nil {
		return code
	}
	if err := opts.of.encode(e, format.Paradoxes(src.Title, set, *limit)); err != nil {
		return fail(e, "paradox", err)
	}
	return tieNote(e, "paradox", set.Unsettled())
}

// Limits on one run of sweep or paradox, over all the methods swept: every
// house size of every method is held in memory (about 80 bytes, and 8 a
// unit), so the run is refused up front, naming the limit, rather than
// grown without bound.
const (
	maxSweepResults = 10_000_000 // house sizes × units × methods
	maxSweepSizes   = 1_000_000  // house sizes × methods
)

// sweepSize checks a run of sizes house sizes of n units by k methods
// against the limits.
func sweepSize(sizes, n, k int) error {
	what := strconv.Itoa(sizes) + " house sizes"
	if k > 1 {
		what += " by " + strconv.Itoa(k) + " methods"
	}
	switch {
	case sizes > maxSweepSizes/k:
		return usageError("-from/-to: " + what + " is more than the limit of " + strconv.Itoa(maxSweepSizes) +
			" apportionments in one run (house sizes × methods); sweep a shorter range or fewer methods (-method)")
	case n > 0 && sizes > maxSweepResults/n/k:
		return usageError("-from/-to: " + what + " of " + strconv.Itoa(n) + " units is more than the limit of " +
			strconv.Itoa(maxSweepResults) + " seat counts in one run (house sizes × units × methods); sweep a shorter range or fewer methods (-method)")
	}
	return nil
}

// sweepFromFlags loads the one FILE argument with the scenario options and
// sweeps it from from to to (to defaulting to the house size). On failure
// it reports the error and returns a nil set with the exit status.
func sweepFromFlags(e *env, cmd string, fs *flag.FlagSet, ms []engine.Method, from, to int) (*analysis.SweepSet, *input.Source, int) {
	if from < 1 || from > engine.MaxSeats {
		return nil, nil, fail(e, cmd, usageError("-from: must be between 1 and "+strconv.Itoa(engine.MaxSeats)))
	}
	if given(fs, "to") && (to < from || to > engine.MaxSeats) {
		return nil, nil, fail(e, cmd, usageError("-to: must be between -from ("+strconv.Itoa(from)+") and "+strconv.Itoa(engine.MaxSeats)))
	}
	if fs.NArg() != 1 {
		return nil, nil, fail(e, cmd, usageError("expected one FILE argument (or - for standard input), got "+strconv.Itoa(fs.NArg())))
	}
	extra := map[string]string{}
	if given(fs, "to") && !given(fs, "seats") {
		extra["seats"] = strconv.Itoa(to)
	}
	src, err := loadFileWith(e, fs, false, fs.Arg(0), extra)
	if err != nil {
		return nil, nil, fail(e, cmd, err)
	}
	if !given(fs, "to") {
		to = src.Scenario.Seats
		if to == 0 && src.Given["seats"] {
			return nil, nil, fail(e, cmd, src.Locate(&engine.Error{Unit: -1, Field: "seats", Msg: "the house size must be at least 1, not 0"}))
		}
		if to < from {
			return nil, nil, fail(e, cmd, usageError("-to: the house size "+strconv.Itoa(to)+" is below -from "+strconv.Itoa(from)+"; give -to"))
		}
	}
	if err := sweepSize(to-from+1, len(src.Scenario.Units), len(ms)); err != nil {
		return nil, nil, fail(e, cmd, err)
	}
	set := analysis.SweepAll(src.Scenario, ms, from, to)
	if set.First() == nil {
		return nil, nil, fail(e, cmd, src.Locate(set.Errors[0]))
	}
	return set, src, exitOK
}
