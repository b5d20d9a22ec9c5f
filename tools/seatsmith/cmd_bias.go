package main

import (
	"flag"
	"strconv"

	"seatsmith/engine/analysis"
	"seatsmith/engine/format"
)

func init() {
	register(&command{name: "bias", summary: "seat bias of each method for large against small units", run: runBias})
}

const biasHelp = `Usage: seatsmith bias [options]

Draws many random population sets (seeded and reproducible: the same seed
draws the same sets everywhere), apportions each by every method, and
averages the seats beyond their exact quotas that the largest third of the
units receive against the smallest third. A positive difference favours
large units. Balinski and Young's ordering shows: Adams favours small
units most, then Dean and Huntington–Hill; Webster is unbiased; Jefferson
favours large units.

Spreads: simplex (population shares uniform on the simplex: the gaps
between sorted uniform cut points of -total) or decades (each population's
decade, 10^3 to 10^6, chosen uniformly, then uniform within it). Keep
-seats well above the number of units: with quotas under one seat the
methods that give every unit a seat favour small units heavily.

JSON (-format json): {version, kind: "bias", caution, config: {seed,
draws, units, seats, spread, total, class_size}, distribution, note,
methods: [{method, method_name, large, small, difference, std_error,
leaning ("large", "small" or "neither"), large_ahead, small_ahead,
ties}]}. Means are float64, for display.

Examples:
  seatsmith bias
  seatsmith bias -units 20 -seats 400 -draws 5000 -seed 7
  seatsmith bias -spread decades -seats 2000 -method webster,huntington-hill -format json

Options:
`

func runBias(e *env, args []string) int {
	fs := flag.NewFlagSet("bias", flag.ContinueOnError)
	fs.SetOutput(e.stderr)
	var of outputFlags
	of.bind(fs, "text", "csv", "json", "markdown")
	method := fs.String("method", "all", methodListHelp)
	seed := fs.Uint64("seed", 1, "seed of the random population sets")
	draws := fs.Int("draws", 2000, "number of population sets")
	units := fs.Int("units", 12, "units in each set")
	seats := fs.Int("seats", 0, "house size (default: 20 seats per unit)")
	spread := fs.String("spread", "simplex", "distribution of populations: simplex or decades")
	total := fs.Uint64("total", 100_000_000, "total population of each set (simplex)")
	fs.Usage = helpFunc(fs, e.stdout, biasHelp)
	if code, done := parseArgs(fs, args); done {
		return code
	}
	if err := of.check("text", "csv", "json", "markdown"); err != nil {
		return fail(e, "bias", err)
	}
	if fs.NArg() != 0 {
		return fail(e, "bias", usageError("bias takes no file; got "+strconv.Itoa(fs.NArg())+" arguments"))
	}
	ms, err := methodList(*method)
	if err != nil {
		return fail(e, "bias", err)
	}
	sp, err := analysis.ParseSpread(*spread)
	if err != nil {
		return fail(e, "bias", usageError("-spread: "+err.Error()))
	}
	if *seed == 0 {
		return fail(e, "bias", usageError("-seed: use a seed of 1 or more"))
	}
	if given(fs, "draws") && *draws < 1 || given(fs, "units") && *units < 2 || given(fs, "seats") && *seats < 1 || given(fs, "total") && *total < 1 {
		return fail(e, "bias", usageError("-draws, -units, -seats and -total must be positive (-units at least 2)"))
	}
	st, err := analysis.StudyBias(analysis.BiasConfig{Seed: *seed, Draws: *draws, Units: *units, House: *seats, Spread: sp, Total: *total, Methods: ms})
	if err != nil {
		return fail(e, "bias", usageError(err.Error()))
	}
	err = of.encode(e, format.Bias("", st))
	if err != nil {
		return fail(e, "bias", err)
	}
	return exitOK
}
