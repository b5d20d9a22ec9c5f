package main

import (
	"bytes"
	"flag"
	"io"

	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
	"seatsmith/engine/report"
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

Examples:
  seatsmith allot -method huntington-hill -seats 40 -min 1 testdata/demo/vessaria.csv
  seatsmith allot -format json testdata/demo/vessaria.json
  seatsmith allot -method dhondt -seats 20 -threshold 5% -tiebreak lot:7 votes.csv

Options:
`

const compareHelp = `Usage: seatsmith compare [options] FILE

Apportions the seats by every method and shows them side by side, marking
the units the methods treat differently (*) and seat counts outside the
unit's lower and upper quota (!).

Examples:
  seatsmith compare -seats 40 -min 1 testdata/demo/vessaria.csv
  seatsmith compare -format markdown testdata/demo/vessaria.json

Options:
`

func helpFunc(fs *flag.FlagSet, w io.Writer, text string) func() {
	return func() {
		io.WriteString(w, text)
		fs.SetOutput(w)
		fs.PrintDefaults()
		io.WriteString(w, "\nExit status: 0 done, 1 bad input, 2 bad command line, 3 a tie left seats unassigned.\n\n"+report.Wrap(report.Caution, 76)+"\n")
	}
}

func runAllot(e *env, args []string) int {
	fs := flag.NewFlagSet("allot", flag.ContinueOnError)
	fs.SetOutput(e.stderr)
	var sf scenarioFlags
	var of outputFlags
	sf.bind(fs, true)
	of.bind(fs, "text", "csv", "json", "markdown")
	order := fs.Bool("order", false, "list the whole seat order, not just the last and next seats (text format)")
	fs.Usage = helpFunc(fs, e.stdout, allotHelp)
	if err := fs.Parse(args); err != nil {
		if err == flag.ErrHelp {
			return exitOK
		}
		return exitUsage
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
	// The seat order grows with the house size; only the formats that show
	// it ask for it.
	detail := engine.WithMargins
	if of.format != "csv" {
		detail |= engine.WithOrder
	}
	res, err := engine.Allot(&src.Scenario, detail)
	if err != nil {
		return fail(e, "allot", src.Locate(err))
	}
	var b bytes.Buffer
	switch of.format {
	case "json":
		b.Write(jsondoc.MarshalIndent(report.Allotment(src.Title, res), "  "))
	case "csv":
		err = report.AllotTable(res).WriteCSV(&b)
	case "markdown":
		err = report.WriteAllotMarkdown(&b, src.Title, res)
	default:
		err = report.WriteAllotText(&b, src.Title, res, *order)
	}
	if err == nil {
		err = of.write(e, &b)
	}
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
	if err := fs.Parse(args); err != nil {
		if err == flag.ErrHelp {
			return exitOK
		}
		return exitUsage
	}
	if err := of.check("text", "csv", "json", "markdown"); err != nil {
		return fail(e, "compare", err)
	}
	src, err := sf.load(e, fs)
	if err != nil {
		return fail(e, "compare", err)
	}
	c := report.Compare(src.Scenario, nil, 0)
	if c.First() == nil {
		// Every method failed: the scenario itself is at fault.
		return fail(e, "compare", src.Locate(c.Errors[0]))
	}
	var b bytes.Buffer
	switch of.format {
	case "json":
		b.Write(jsondoc.MarshalIndent(c.Doc(src.Title), "  "))
	case "csv":
		err = report.ComparisonTable(c).WriteCSV(&b)
	case "markdown":
		err = report.WriteComparisonMarkdown(&b, src.Title, c)
	default:
		err = report.WriteComparisonText(&b, src.Title, c)
	}
	if err == nil {
		err = of.write(e, &b)
	}
	if err != nil {
		return fail(e, "compare", err)
	}
	for _, r := range c.Results {
		if r != nil && r.Unassigned > 0 {
			io.WriteString(e.stderr, "seatsmith compare: a tie left seats unassigned under at least one method; settle it with -tiebreak\n")
			return exitTie
		}
	}
	return exitOK
}
