package main

import (
	"errors"
	"flag"
	"strconv"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/format"
	"seatsmith/engine/input"
)

func init() {
	register(&command{name: "diff", summary: "baseline against a proposal: seat changes and changed margins", run: runDiff})
}

const diffHelp = `Usage: seatsmith diff [options] BASELINE [PROPOSAL]

Apportions a baseline and a proposal and shows what changes: the settings,
each unit's seats (marked "~" when they change, "+" for a unit only in the
proposal, "-" for one only in the baseline), its gain and lose margins
("." when only the margins change), the seats that change hands and the
disproportionality before and after.

The baseline is BASELINE with the usual options (-seats, -method, -min,
-max, -threshold, -tiebreak). The proposal starts from the baseline's
settings; PROPOSAL, when given, supplies other units and populations (and
any settings it states itself), and the -new-* options change settings
last. Units are matched by name.

JSON (-format json): {version, kind: "diff", caution, title, baseline:
{method, method_name, seats, total, unassigned, ties}, proposal: {...},
settings: [{name, before, after}], moved, units: [{name, status ("same",
"changed", "margins", "added", "removed"), population_before,
population_after, growth, seats_before, seats_after, change, quota_before,
quota_after, gain_margin_before, gain_margin_after, lose_margin_before,
lose_margin_after, margins_changed}], measures: {baseline: {loosemore_hanby,
gallagher, sainte_lague, ratio}, proposal: {...}}, lines: [text]}.

Examples:
  seatsmith diff -method huntington-hill -seats 40 -new-method webster testdata/demo/vessaria.csv
  seatsmith diff -new-seats 45 testdata/demo/vessaria.json
  seatsmith diff -method hamilton -seats 40 testdata/demo/vessaria.csv testdata/demo/vessaria-later.csv
  seatsmith diff testdata/demo/vessaria.json testdata/demo/vessaria-proposal.csv

Options:
`

type proposalFlags struct {
	seats                  int
	method, threshold, tie string
	min, max               int
}

func runDiff(e *env, args []string) int {
	fs := flag.NewFlagSet("diff", flag.ContinueOnError)
	fs.SetOutput(e.stderr)
	var sf scenarioFlags
	var of outputFlags
	var pf proposalFlags
	sf.bind(fs, true)
	of.bind(fs, "text", "csv", "json", "markdown")
	fs.IntVar(&pf.seats, "new-seats", 0, "the proposal's house size")
	fs.StringVar(&pf.method, "new-method", "", "the proposal's method")
	fs.IntVar(&pf.min, "new-min", 0, "the proposal's default minimum seats per unit")
	fs.IntVar(&pf.max, "new-max", 0, "the proposal's default maximum seats per unit (0: no cap)")
	fs.StringVar(&pf.threshold, "new-threshold", "", "the proposal's threshold, e.g. 0.05 or 5% (0 for none)")
	fs.StringVar(&pf.tie, "new-tiebreak", "", "the proposal's tie rule: none, order, lot:SEED")
	fs.Usage = helpFunc(fs, e.stdout, diffHelp)
	if code, done := parseArgs(fs, args); done {
		return code
	}
	if err := of.check("text", "csv", "json", "markdown"); err != nil {
		return fail(e, "diff", err)
	}
	if fs.NArg() < 1 || fs.NArg() > 2 {
		return fail(e, "diff", usageError("expected BASELINE and optionally PROPOSAL, got "+strconv.Itoa(fs.NArg())+" files"))
	}
	base, err := loadFileWith(e, fs, true, fs.Arg(0), nil)
	if err != nil {
		return fail(e, "diff", err)
	}
	if !base.Scenario.Method.Valid() {
		return fail(e, "diff", usageError("no method: give -method (or \"method\" in a JSON scenario)"))
	}
	prop := base.Scenario
	propSrc := base
	if fs.NArg() == 2 {
		ps, err := readSource(e, fs.Arg(1))
		if err != nil {
			return fail(e, "diff", err)
		}
		propSrc = ps
		prop.Units = ps.Scenario.Units
		for k := range ps.Given {
			switch k {
			case "seats":
				prop.Seats = ps.Scenario.Seats
			case "method":
				prop.Method = ps.Scenario.Method
			case "min":
				prop.Min = ps.Scenario.Min
			case "max":
				prop.Max = ps.Scenario.Max
			case "threshold":
				prop.Threshold = ps.Scenario.Threshold
			case "tie":
				prop.Tie = ps.Scenario.Tie
			}
		}
	}
	if err := pf.apply(fs, &prop); err != nil {
		return fail(e, "diff", err)
	}
	d, err := analysis.Compare(&base.Scenario, &prop)
	if err != nil {
		var se *analysis.SideError
		if errors.As(err, &se) {
			if se.Side == "baseline" {
				return fail(e, "diff", base.Locate(se.Err))
			}
			located := propSrc.Locate(se.Err)
			if ie, ok := located.(*input.Error); ok {
				ie.Msg = "in the proposal: " + ie.Msg
			}
			return fail(e, "diff", located)
		}
		return fail(e, "diff", err)
	}
	err = of.encode(e, format.Diff(base.Title, d, &base.Scenario, &prop))
	if err != nil {
		return fail(e, "diff", err)
	}
	return tieNote(e, "diff", d.Base.Unassigned > 0 || d.Proposal.Unassigned > 0)
}

// apply sets the proposal's settings from the -new-* options given.
func (pf *proposalFlags) apply(fs *flag.FlagSet, s *engine.Scenario) error {
	if given(fs, "new-seats") {
		if pf.seats < 1 || pf.seats > engine.MaxSeats {
			return usageError("-new-seats: must be between 1 and " + strconv.Itoa(engine.MaxSeats))
		}
		s.Seats = pf.seats
	}
	if given(fs, "new-method") {
		m, err := engine.ParseMethod(pf.method)
		if err != nil {
			return usageError("-new-method: " + errMsg(err))
		}
		s.Method = m
	}
	if given(fs, "new-min") {
		if pf.min < 0 {
			return usageError("-new-min: cannot be negative")
		}
		s.Min = pf.min
	}
	if given(fs, "new-max") {
		if pf.max < 0 {
			return usageError("-new-max: cannot be negative")
		}
		s.Max = pf.max
	}
	if given(fs, "new-threshold") {
		th, err := input.ParseShare(pf.threshold)
		if err != nil {
			return usageError("-new-threshold: " + err.Error())
		}
		s.Threshold = th
	}
	if given(fs, "new-tiebreak") {
		t, err := engine.ParseTieRule(pf.tie)
		if err != nil {
			return usageError("-new-tiebreak: " + errMsg(err))
		}
		s.Tie = t
	}
	return nil
}
