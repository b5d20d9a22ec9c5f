package main

import (
	"flag"
	"io"
	"strconv"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/format"
)

func init() {
	register(&command{name: "allot", summary: "apportion by one method and explain every seat", run: runAllot})
	register(&command{name: "compare", summary: "apportion by every method side by side", run: runCompare})
}

const allotHelp = `Usage: seatsmith allot [options] FILE

Apportions the seats by one method and explains the result: each unit's
quota and whether it is met, the divisor range (divisor methods) or the
remainders (largest-remainder methods), the seat order and the next seats,
and how many people each unit is from gaining or losing a seat.

The margins and the seat order are the costly parts. On large inputs they
are left out unless asked for, with a note on standard error saying so:
the margins with more than 100,000 units (more than 1,000 for
largest-remainder methods with minimums or maximums, or with a threshold,
where each margin is proven stretch by stretch with complete
apportionments), the seat order with more than 100,000 seats. -margins and -order ask for them at any size; -margins=false and
-order=false leave them out at any size. CSV never needs the seat order.

Examples:
  seatsmith allot -method huntington-hill -seats 40 testdata/demo/vessaria.csv
  seatsmith allot -format json testdata/demo/vessaria.json
  seatsmith allot -method dhondt -seats 20 -threshold 5% -tiebreak lot:7 testdata/demo/party-votes.csv

Options:
`

const compareHelp = `Usage: seatsmith compare [options] FILE

Apportions the seats by every method and shows them side by side, marking
the units the methods treat differently (*) and seat counts outside the
unit's lower and upper quota (!).

Examples:
  seatsmith compare -seats 40 testdata/demo/vessaria.csv
  seatsmith compare -format markdown testdata/demo/vessaria.json

Options:
`

func helpFunc(fs *flag.FlagSet, w io.Writer, text string) func() {
	return func() {
		io.WriteString(w, text)
		fs.SetOutput(w)
		fs.PrintDefaults()
		io.WriteString(w, "\nExit status: 0 done, 1 bad input, 2 bad command line, 3 a tie left seats unassigned.\n\n"+format.Wrap(format.Caution, 76)+"\n")
	}
}

func runAllot(e *env, args []string) int {
	fs := flag.NewFlagSet("allot", flag.ContinueOnError)
	fs.SetOutput(e.stderr)
	var sf scenarioFlags
	var of outputFlags
	sf.bind(fs, true)
	of.bind(fs, "text", "csv", "json", "markdown")
	order := fs.Bool("order", false, "compute the seat order at any house size and list all of it, not just the last\nand next seats (text format)")
	margins := fs.Bool("margins", false, "compute every unit's gain and lose margins at any size (default: on small\ninputs only)")
	fs.Usage = helpFunc(fs, e.stdout, allotHelp)
	if code, done := parseArgs(fs, args); done {
		return code
	}
	if err := of.check("text", "csv", "json", "markdown"); err != nil {
		return fail(e, "allot", err)
	}
	src, err := sf.load(e, fs)
	if err != nil {
		return fail(e, "allot", err)
	}
	if !src.Scenario.Method.Valid() {
		return fail(e, "allot", usageError("no method: give -method (or \"method\" in a JSON scenario)"))
	}
	set := map[string]bool{}
	fs.Visit(func(f *flag.Flag) { set[f.Name] = true })
	if *order && src.Scenario.Seats > maxOrderSeats && src.Scenario.Method.IsDivisor() && of.format != "csv" {
		return fail(e, "allot", usageError("-order: the seat order lists every seat and is held in memory, so it is listed for at most "+
			strconv.Itoa(maxOrderSeats)+" seats, not "+strconv.Itoa(src.Scenario.Seats)+"; leave out -order for the last and next seats"))
	}
	plan := planDetail(&src.Scenario, of.format, set["margins"], *margins, set["order"], *order)
	for _, n := range plan.notes {
		io.WriteString(e.stderr, "seatsmith allot: "+n+"\n")
	}
	limitMemory(&src.Scenario, plan.detail)
	prep, err := engine.Prepare(&src.Scenario)
	if err != nil {
		return fail(e, "allot", src.Locate(err))
	}
	// The scenario's copy of the units is no longer needed: the prepared
	// problem holds what the procedure needs and the result will hold what
	// the output shows, so the units need not take room beside them.
	src.Scenario.Units = nil
	res, err := prep.Allot(plan.detail)
	if err != nil {
		return fail(e, "allot", src.Locate(err))
	}
	doc := format.Allotment(src.Title, res, &src.Scenario, format.AllotOptions{Order: *order, Skipped: plan.skipped})
	err = of.encode(e, doc)
	if err != nil {
		return fail(e, "allot", err)
	}
	if res.Unassigned > 0 {
		io.WriteString(e.stderr, "seatsmith allot: a tie left seats unassigned; settle it with -tiebreak or by the governing rule\n")
		return exitTie
	}
	return exitOK
}

func runCompare(e *env, args []string) int {
	fs := flag.NewFlagSet("compare", flag.ContinueOnError)
	fs.SetOutput(e.stderr)
	var sf scenarioFlags
	var of outputFlags
	sf.bind(fs, false)
	of.bind(fs, "text", "csv", "json", "markdown")
	fs.Usage = helpFunc(fs, e.stdout, compareHelp)
	if code, done := parseArgs(fs, args); done {
		return code
	}
	if err := of.check("text", "csv", "json", "markdown"); err != nil {
		return fail(e, "compare", err)
	}
	src, err := sf.load(e, fs)
	if err != nil {
		return fail(e, "compare", err)
	}
	c := analysis.CompareMethods(src.Scenario, nil, 0)
	if c.First() == nil {
		// Every method failed: the scenario itself is at fault.
		return fail(e, "compare", src.Locate(c.Errors[0]))
	}
	err = of.encode(e, format.Comparison(src.Title, c))
	if err != nil {
		return fail(e, "compare", err)
	}
	if c.Unsettled() {
		io.WriteString(e.stderr, "seatsmith compare: a tie left seats unassigned under at least one method; settle it with -tiebreak\n")
		return exitTie
	}
	return exitOK
}

// Sizes above which allot leaves out the costly parts of the explanation
// unless asked for them.
const (
	// autoMarginUnits: margins in closed form or counted (divisor methods,
	// largest remainders without bounds; no threshold) cost about a pass
	// over the units each.
	autoMarginUnits = 100_000
	// autoSearchUnits: the costly margins (engine.Scenario.CostlyMargins)
	// are proven stretch by stretch, each stretch with complete
	// apportionments, so their cost grows faster than the square of the
	// number of units.
	autoSearchUnits = 1_000
	// autoOrderSeats: the seat order holds one entry per seat.
	autoOrderSeats = 100_000
	// maxOrderSeats: the most seats -order lists (about 128 bytes a seat
	// in memory).
	maxOrderSeats = 1_000_000
)

// detailPlan is what allot computes and what it leaves out.
type detailPlan struct {
	detail  engine.Detail
	skipped []string // "margins", "order"
	notes   []string // why, and how to ask for it
}

// planDetail chooses the explanation for the scenario and format: what was
// asked for on the command line (asked reports that the option was given),
// or by the size of the input.
func planDetail(s *engine.Scenario, format string, marginsAsked, margins, orderAsked, order bool) detailPlan {
	var p detailPlan
	n := len(s.Units)
	search := s.CostlyMargins()
	switch {
	case marginsAsked && margins:
		p.detail |= engine.WithMargins
	case marginsAsked:
		p.skipped = append(p.skipped, "margins")
	case search && n > autoSearchUnits:
		p.skipped = append(p.skipped, "margins")
		p.notes = append(p.notes, strconv.Itoa(n)+" units: gain and lose margins left out (each is proven stretch by stretch with complete apportionments, "+
			"for every unit); give -margins to compute them")
	case n > autoMarginUnits:
		p.skipped = append(p.skipped, "margins")
		p.notes = append(p.notes, strconv.Itoa(n)+" units: gain and lose margins left out; give -margins to compute them")
	default:
		p.detail |= engine.WithMargins
	}
	// Only divisor methods have a seat order, and only the formats that
	// print it need it.
	if !s.Method.IsDivisor() || format == "csv" {
		return p
	}
	switch {
	case orderAsked && order:
		p.detail |= engine.WithOrder
	case orderAsked:
		p.skipped = append(p.skipped, "order")
	case s.Seats > autoOrderSeats:
		p.skipped = append(p.skipped, "order")
		p.notes = append(p.notes, strconv.Itoa(s.Seats)+" seats: the seat order left out; give -order to list it")
	default:
		p.detail |= engine.WithOrder
	}
	return p
}
