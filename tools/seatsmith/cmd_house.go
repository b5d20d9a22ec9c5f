package main

import (
	"flag"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/format"
)

func init() {
	register(&command{name: "house", summary: "choose the house size by a rule, or apply a statutory house rule (fixed ratio, base seats)", run: runHouse})
}

const houseHelp = `Usage: seatsmith house [options] -rule RULE FILE
       seatsmith house [options] -ratio PEOPLE -method METHOD FILE
       seatsmith house [options] -base N -seats SEATS -method METHOD FILE

With -rule, chooses the house size from the populations by a rule and
apportions at that size by each method:

  cube-root      the cube-root law of assembly size (Taagepera 1972): the
                 whole number nearest to the cube root of the total
                 population, found exactly
  smallest-unit  the smallest unit's population as the divisor: the whole
                 number nearest to total/smallest (halves up), so that the
                 smallest unit's quota is about one seat

The rule sets the house size; -seats is refused.

Two statutory house rules apportion by one method (-method, or the
method of a JSON scenario):

  -ratio PEOPLE  one seat per PEOPLE people: every unit's population over
                 PEOPLE, rounded by a divisor method at its signposts
                 (Jefferson drops fractions, Webster rounds halves up,
                 ...), within its minimum and maximum; the house size is
                 the sum. A quotient exactly on a signpost is a tie
                 between rounding down and up: reported, and settled only
                 by -tiebreak lot:SEED. -seats and -threshold are refused.
  -base N        every unit first receives N seats; the other seats of the
                 house (-seats) are apportioned by the method, with the
                 minimums, maximums, threshold and tie rule applying to
                 that part.

JSON (-format json): -rule gives {version, kind: "house-size", caution,
title, rule, total, value (the unrounded size), seats, smallest: {unit,
population} or null, comparison: the comparison document of "seatsmith
compare" at that size}. -ratio gives {version, kind: "fixed-ratio",
caution, title, method, method_name, ratio, seats (the house size),
tie_rule, unassigned, units: [{name, population, quotient, rounded,
seats, lower_signpost, upper_signpost, at_min, at_max, tied,
rounded_up}], text}. -base gives {version, kind: "base-seats", caution,
title, base, seats, units: [{name, population, base_seats,
proportional_seats, seats}], rest: the allotment document of the
proportional part (or null), unassigned, text}.

Examples:
  seatsmith house -rule cube-root testdata/demo/vessaria.csv
  seatsmith house -rule smallest-unit -method huntington-hill -format json testdata/demo/vessaria.json
  seatsmith house -ratio 200000 -method jefferson testdata/demo/vessaria.csv
  seatsmith house -base 2 -seats 40 -method hamilton testdata/demo/vessaria.csv

Options:
`

func runHouse(e *env, args []string) int {
	opts := newMethodsFlags(e, "house", houseHelp, methodListHelp+"; with -ratio or -base, one method", "text", "csv", "json", "markdown")
	fs := opts.fs
	rule := fs.String("rule", "", "house-size rule: cube-root or smallest-unit")
	ratio := fs.String("ratio", "", "one seat per this many people (a statutory ratio); the house size is the result")
	base := fs.Int("base", 0, "seats every unit receives before the rest of -seats is apportioned")
	ms, code, done := opts.parse(e, args)
	if done {
		return code
	}
	n := 0
	for _, f := range []string{"rule", "ratio", "base"} {
		if given(fs, f) {
			n++
		}
	}
	if n != 1 {
		return fail(e, "house", usageError("give one of -rule, -ratio or -base"))
	}
	if fs.NArg() != 1 {
		return fail(e, "house", usageError("expected one FILE argument (or - for standard input)"))
	}
	switch {
	case given(fs, "ratio"):
		return houseRatio(e, fs, &opts.of, *ratio, ms)
	case given(fs, "base"):
		return houseBase(e, fs, &opts.of, *base, ms)
	}
	r, err := analysis.ParseSizeRule(*rule)
	if err != nil {
		return fail(e, "house", usageError("-rule: "+err.Error()))
	}
	if given(fs, "seats") {
		return fail(e, "house", usageError("-seats: the rule chooses the house size; leave -seats out"))
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
	err = opts.of.encode(e, format.House(src.Title, hs, c))
	if err != nil {
		return fail(e, "house", err)
	}
	return tieNote(e, "house", c.Unsettled())
}

// oneMethod is the method a statutory rule apportions by: the one -method
// names, or the scenario's own.
func oneMethod(fs *flag.FlagSet, opt string, ms []engine.Method, own engine.Method) (engine.Method, error) {
	if given(fs, "method") {
		if len(ms) != 1 {
			return 0, usageError("-method: " + opt + " apportions by one method; name one, such as -method " + ms[0].String())
		}
		return ms[0], nil
	}
	if own.Valid() {
		return own, nil
	}
	return 0, usageError(opt + " apportions by one method: give -method (" + strings.Join(engine.MethodIDs(), ", ") + ")")
}

// houseRatio applies a fixed ratio of people to seats.
func houseRatio(e *env, fs *flag.FlagSet, of *outputFlags, text string, ms []engine.Method) int {
	ratio, err := engine.ParseDecimal(strings.TrimSpace(text))
	if err != nil || ratio.IsZero() {
		return fail(e, "house", usageError("-ratio: "+quote(text)+" is not a number of people above zero, such as 30000"))
	}
	for _, f := range []string{"seats", "threshold"} {
		if given(fs, f) {
			return fail(e, "house", usageError("-"+f+": a fixed ratio makes the house size; leave -"+f+" out"))
		}
	}
	src, err := loadFileWith(e, fs, false, fs.Arg(0), map[string]string{"seats": "1"})
	if err != nil {
		return fail(e, "house", err)
	}
	s := src.Scenario
	if s.Method, err = oneMethod(fs, "-ratio", ms, s.Method); err != nil {
		return fail(e, "house", err)
	}
	if !s.Method.IsDivisor() {
		return fail(e, "house", usageError("-method: a fixed ratio rounds each unit's quotient at a divisor method's signposts; "+
			s.Method.Name()+" is a largest-remainder method"))
	}
	if s.Tie.Kind == engine.TieByOrder {
		return fail(e, "house", usageError("-tiebreak: a tie under a fixed ratio is between rounding one unit's quotient down or up, "+
			"so input order cannot settle it; use lot:SEED, or none to report it"))
	}
	if !s.Threshold.IsZero() {
		return fail(e, "house", src.Locate(&engine.Error{Field: "threshold", Msg: "a fixed ratio makes the house size, so a threshold has no share to be measured against; leave it out"}))
	}
	f, err := analysis.ApplyRatio(&s, ratio)
	if err != nil {
		return fail(e, "house", src.Locate(err))
	}
	if err := of.encode(e, format.FixedRatio(src.Title, f, &s)); err != nil {
		return fail(e, "house", err)
	}
	return tieNote(e, "house", f.Unassigned > 0)
}

// houseBase gives every unit base seats and apportions the rest.
func houseBase(e *env, fs *flag.FlagSet, of *outputFlags, base int, ms []engine.Method) int {
	if base < 0 || base > engine.MaxSeats {
		return fail(e, "house", usageError("-base: must be between 0 and "+strconv.Itoa(engine.MaxSeats)))
	}
	src, err := loadFileWith(e, fs, false, fs.Arg(0), nil)
	if err != nil {
		return fail(e, "house", err)
	}
	s := src.Scenario
	if s.Method, err = oneMethod(fs, "-base", ms, s.Method); err != nil {
		return fail(e, "house", err)
	}
	b, err := analysis.ApplyBase(&s, base)
	if err != nil {
		return fail(e, "house", src.Locate(err))
	}
	if err := of.encode(e, format.BaseSeats(src.Title, b, &s)); err != nil {
		return fail(e, "house", err)
	}
	return tieNote(e, "house", b.Rest != nil && b.Rest.Unassigned > 0)
}
