package main

import (
	"context"
	"flag"
	"io"
	"os"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/format"
	"seatsmith/engine/input"
	"seatsmith/engine/projection"
)

func init() {
	register(&command{name: "project", summary: "project dated counts and estimate each unit's chance to gain or lose a seat", run: runProject})
}

const projectHelp = `Usage: seatsmith project [options] FILE

Projects every unit's population to a target date from its dated counts,
apportions the projection exactly, and estimates how likely each unit is to
gain or lose a seat when the counts carry an error: it draws the
populations many times from the error model (seeded and reproducible), and
apportions every draw exactly.

FILE holds the counts, as CSV with one row per count:

  name,date,population,rse
  Orlen,2015-04-01,2550112,
  Orlen,2020-04-01,2694457,1.5%
  Tamsk,2015-04-01,2101334,
  Tamsk,2020-04-01,2079562,

(date as YYYY-MM-DD, YYYY-MM or YYYY; rse, min and max are optional and
may be given on any row of the unit) or as a JSON scenario whose units have
"counts": [{"date": ..., "population": ...}] and an optional "rse". A plain
scenario (name,population or a JSON scenario) works without -target: the
error model then applies around the counts as they are.

Projection (-target): linear growth fits a straight line to the counts
(least squares over all of them, or through the two latest with -fit
last2); geometric growth fits a constant yearly growth factor the same way
on the logarithms. Projections are rounded to whole people (or the finest
decimal step of the counts).

Error model: every unit's population at the target date (or its latest
count) is drawn as c·(1 + rse·Z) (normal, cut at zero) or
c·exp(s·Z - s²/2) with s² = ln(1 + rse²) (lognormal), for independent
standard normal Z, and rounded to whole people. A unit's own rse overrides
-rse. Gains and losses are counted against the apportionment of the latest
counts. The same -seed gives the same numbers for any -workers.

Examples:
  seatsmith project -seats 40 -method huntington-hill -min 1 -target 2030-04-01 -rse 2% testdata/demo/vessaria-counts.csv
  seatsmith project -rse 1.5% -draws 100000 -seed 7 testdata/demo/vessaria.json
  seatsmith project -target 2031 -growth geometric -fit last2 -error lognormal -rse 3% -format json -o outlook.json testdata/demo/vessaria-counts.json

Options:
`

func runProject(e *env, args []string) int {
	fs := flag.NewFlagSet("project", flag.ContinueOnError)
	fs.SetOutput(e.stderr)
	var sf scenarioFlags
	var of outputFlags
	sf.bind(fs, true)
	of.bind(fs, "text", "csv", "json", "markdown")
	target := fs.String("target", "", "project the counts to this date (YYYY-MM-DD, YYYY-MM or YYYY); none: use the latest counts")
	growth := fs.String("growth", "linear", "growth model: linear or geometric")
	fit := fs.String("fit", "all", "counts the growth model is fitted to: all (least squares) or last2 (the two latest)")
	errModel := fs.String("error", "normal", "error model: normal or lognormal")
	rse := fs.String("rse", "0", "relative standard error of every unit without its own, e.g. 0.02 or 2%; 0: no draws")
	draws := fs.Int("draws", projection.DefaultDraws, "number of random draws")
	seed := fs.Uint64("seed", 1, "seed of the random draws")
	workers := fs.Int("workers", 0, "goroutines making draws (0: one per CPU); the numbers do not depend on it")
	contest := fs.Int("contest", projection.DefaultContest, "seats tracked on each side of the cut: the last seats held and the first beyond")
	fs.Usage = helpFunc(fs, e.stdout, projectHelp)
	if code, done := parseArgs(fs, args); done {
		return code
	}
	if err := of.check("text", "csv", "json", "markdown"); err != nil {
		return fail(e, "project", err)
	}
	opt, err := projectOptions(*target, *growth, *fit, *errModel, *rse, *draws, *seed, *workers, *contest)
	if err != nil {
		return fail(e, "project", err)
	}
	c, err := readCounts(e, fs)
	if err != nil {
		return fail(e, "project", err)
	}
	if err := applyScenarioFlags(e, fs, &sf, c); err != nil {
		return fail(e, "project", err)
	}
	st, err := projection.New(c, opt)
	if err != nil {
		return fail(e, "project", err)
	}
	if err := st.RunAll(context.Background()); err != nil {
		return fail(e, "project", err)
	}
	s := st.Summary()
	err = of.encode(e, format.Projection(s, &c.Scenario))
	if err != nil {
		return fail(e, "project", err)
	}
	if s.Baseline.Unassigned > 0 || s.Central.Unassigned > 0 {
		io.WriteString(e.stderr, "seatsmith project: a tie left seats unassigned in the apportionment of the latest counts or of the projection; settle it with -tiebreak or by the governing rule\n")
		return exitTie
	}
	return exitOK
}

// projectOptions checks the projection options and turns them into
// projection.Options.
func projectOptions(target, growth, fit, errModel, rse string, draws int, seed uint64, workers, contest int) (projection.Options, error) {
	opt := projection.Options{Draws: draws, Seed: seed, Workers: workers, Contest: contest}
	bad := func(name, msg string) (projection.Options, error) { return opt, usageError("-" + name + ": " + msg) }
	if strings.TrimSpace(target) != "" {
		d, err := projection.ParseDate(target)
		if err != nil {
			return bad("target", err.Error())
		}
		opt.Target = &d
	}
	var err error
	if opt.Growth, err = projection.ParseGrowth(growth); err != nil {
		return bad("growth", err.Error())
	}
	if opt.Fit, err = projection.ParseFit(fit); err != nil {
		return bad("fit", err.Error())
	}
	if opt.Error, err = projection.ParseDistribution(errModel); err != nil {
		return bad("error", err.Error())
	}
	if opt.RSE, err = projection.ParseRSE(rse); err != nil {
		return bad("rse", err.Error())
	}
	switch {
	case draws < 1 || draws > projection.MaxDraws:
		return bad("draws", "must be between 1 and "+strconv.Itoa(projection.MaxDraws))
	case workers < 0:
		return bad("workers", "cannot be negative")
	case contest < 0 || contest > engine.MaxWarmContest:
		return bad("contest", "must be between 0 and "+strconv.Itoa(engine.MaxWarmContest))
	}
	return opt, nil
}

// readCounts reads the single FILE argument ("-" for standard input).
func readCounts(e *env, fs *flag.FlagSet) (*projection.Counts, error) {
	if fs.NArg() != 1 {
		return nil, usageError("expected one FILE argument (or - for standard input), got " + strconv.Itoa(fs.NArg()))
	}
	name := fs.Arg(0)
	if name == "-" {
		return projection.ReadCountsWith("stdin", e.stdin, readOptions)
	}
	f, err := os.Open(name)
	if err != nil {
		return nil, &input.Error{File: name, Msg: "cannot read: " + strings.TrimPrefix(err.Error(), "open "+name+": ")}
	}
	defer f.Close()
	return projection.ReadCountsWith(name, f, readOptions)
}

// applyScenarioFlags lets the scenario options override the file's own
// settings, as scenarioFlags.load does for scenario files.
func applyScenarioFlags(e *env, fs *flag.FlagSet, f *scenarioFlags, c *projection.Counts) error {
	over, err := f.overrides(fs)
	if err != nil {
		return err
	}
	if err := f.apply(over, &c.Scenario, c.Given); err != nil {
		return err
	}
	f.note(e, f.boundsNote(c.File, func(i int) (bool, bool) { return c.Series[i].Min != nil, c.Series[i].Max != nil }, len(c.Series)))
	if !c.Scenario.Method.Valid() {
		return usageError("no method: give -method (or \"method\" in a JSON file)")
	}
	return nil
}
