package main

import (
	"strings"

	"golang.org/x/text/unicode/norm"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/format"
)

func init() {
	register(&command{name: "admit", summary: "new-states paradox: admit a unit with its fair share of added seats", run: runAdmit})
}

const admitHelp = `Usage: seatsmith admit [options] -name NAME -population P FILE

Apportions the house, then admits a new unit with its fair share of added
seats (its quota p·H/P at the old standard divisor, rounded to the nearest
whole number; -added chooses another number) and apportions the larger
house, by each method. When an old unit's seats change, that is the
new-states paradox; the output says which units and by how much.

JSON (-format json): {version, kind: "new-states", caution, title, unit:
{name, population}, fair_share, fair_share_exact, added, house_before,
house_after, results: [{method, method_name, error, new_unit_seats,
paradox, changes: [{unit, before, after}], units: [{name, before, after}],
unassigned_before, unassigned_after, text}]}.

Examples:
  seatsmith admit -seats 40 -name "Ostry Fen" -population 410000 testdata/demo/vessaria.csv
  seatsmith admit -method hamilton -name "Ostry Fen" -population 410000 -added 2 -format json testdata/demo/vessaria.json

Options:
`

func runAdmit(e *env, args []string) int {
	opts := newMethodsFlags(e, "admit", admitHelp, methodListHelp, "text", "csv", "json", "markdown")
	fs := opts.fs
	name := fs.String("name", "", "the new unit's name")
	pop := fs.String("population", "", "the new unit's population (a whole number or exact decimal)")
	added := fs.Int("added", -1, "seats added for the new unit (default: its fair share)")
	ms, code, done := opts.parse(e, args)
	if done {
		return code
	}
	if strings.TrimSpace(*name) == "" {
		return fail(e, "admit", usageError("-name: give the new unit's name"))
	}
	p, err := engine.ParseDecimal(*pop)
	if err != nil {
		return fail(e, "admit", usageError("-population: "+quote(*pop)+" is not a population: "+err.Error()))
	}
	if given(fs, "added") && (*added < 0 || *added > engine.MaxSeats) {
		return fail(e, "admit", usageError("-added: must be between 0 and the limit of seats"))
	}
	if fs.NArg() != 1 {
		return fail(e, "admit", usageError("expected one FILE argument (or - for standard input)"))
	}
	src, err := loadFileWith(e, fs, false, fs.Arg(0), nil)
	if err != nil {
		return fail(e, "admit", err)
	}
	newName := norm.NFC.String(strings.TrimSpace(*name))
	if msg := nameProblem(newName); msg != "" {
		return fail(e, "admit", usageError("-name: "+msg))
	}
	for _, u := range src.Scenario.Units {
		if u.Name == newName {
			return fail(e, "admit", usageError("-name: "+quote(newName)+" is already a unit of "+src.File))
		}
	}
	a := analysis.Admit(src.Scenario, engine.Unit{Name: newName, Population: p}, *added, ms)
	if a.First() == nil {
		return fail(e, "admit", src.Locate(a.Errors[0]))
	}
	err = opts.of.encode(e, format.Admit(src.Title, a))
	if err != nil {
		return fail(e, "admit", err)
	}
	return tieNote(e, "admit", a.Unsettled())
}
