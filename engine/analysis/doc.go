// Package analysis studies apportionments across many of them: paradoxes,
// disproportionality, comparisons of scenarios, house-size rules, derived
// bodies and seat bias.
//
//   - Paradoxes. [FindAlabama] lists every Alabama paradox in a sweep of
//     house sizes (see engine.Sweep); [FindQuotaViolations] every unit
//     outside its lower and upper quota; [FindPopulation] every pair of
//     units where one grew at least as fast as the other yet lost a seat
//     to it (growth rates compared exactly); [FindNewStates] whether
//     admitting a unit with its fair share of added seats changes the
//     others' seats. Every finding has a Text method that says what
//     happened, in numbers.
//   - Measures. [Measure] computes the Loosemore–Hanby, Gallagher and
//     Sainte-Laguë indices, district sizes and their differences (in
//     float64, for display: no seat depends on them), and counts the seat
//     transfers that would improve a pair under Huntington's pairwise
//     tests ([ImprovingTransfers], exact).
//   - Comparison. [Compare] lines up a baseline and a proposal by unit
//     name: seat changes, changed margins, changed settings.
//   - Many methods. [CompareMethods] apportions one scenario by several
//     methods, [SweepAll] sweeps it over a range of house sizes by each
//     (with the Alabama paradoxes, and the quota violations on demand),
//     [FindGrowth] and [Admit] run the population and new-states tests by
//     each, [MeasureAll] measures each result. Their results are what the
//     documents of package engine/format show.
//   - House size. [ChooseSize] applies the cube-root law or makes the
//     smallest unit's population the divisor; [Derive] adds a fixed number
//     of seats per unit to an apportionment. Statutory house rules:
//     [ApplyRatio] gives one seat per so many people (the house size is
//     the result), [ApplyBase] gives every unit base seats and apportions
//     the rest.
//   - Bias. [StudyBias] averages, over seeded random population sets, how
//     many seats beyond their quotas large units receive against small
//     ones.
//
// Quotas, shares and growth rates are exact rationals (math/big); their
// decimal texts come from [Decimal], [Fraction] and [Percent].
//
// # JSON documents
//
// The documents are built by seatsmith/engine/format from these results
// and printed by the seatsmith command-line tool with -format json. Every
// document is one object that starts with version (1), kind, caution (the
// not-official caution, always present) and title (when the scenario has
// one). Populations and exact values are strings holding exact decimals;
// seat counts and house sizes are numbers; "null" marks what does not
// apply. Units appear in input order, methods in the order asked for.
//
// Sweep (kind "sweep", seatsmith sweep):
//
//	from, to      the house sizes swept (numbers)
//	methods       [{method, method_name, error}]; error is null, or why
//	              the method could apportion no size in the range
//	units         [{name, population, excluded}]
//	sizes         one entry per method and house size, methods in order and
//	              sizes ascending: {method, seats (the house size), units:
//	              [{name, seats}], unassigned (number, or null when the size
//	              is refused), ties: [{units: [names], seats, value, rule,
//	              winners: [names]}], error (null, or why the size cannot be
//	              apportioned; units is then empty)}
//	paradoxes     the Alabama paradoxes: [{kind: "alabama", method, unit,
//	              from, to (house sizes, to = from+1), seats_before,
//	              seats_after, quota_before, quota_after, gainers: [{unit,
//	              before, after}], tied, text}]
//
// Paradoxes over a range (kind "paradoxes", seatsmith paradox): from, to;
// methods: [{method, method_name, error, alabama (count),
// quota_violations (count)}]; paradoxes: the Alabama findings as above and
// quota violations {kind: "quota", method, unit, house, seats, quota,
// quota_exact ("n/d"), lower_quota, upper_quota, side ("above" or
// "below"), bounds_bind (the minimums or maximums cause the violation:
// without them the unit's seats at that size would be within its quota),
// text}.
//
// Population paradox (kind "population-paradox", seatsmith growth): seats,
// total_before, total_after; units: [{name, before, after, growth (percent
// text), growth_exact ("n/d")}]; results: [{method, method_name, error,
// seats_before: {unit: seats}, seats_after, paradoxes (count),
// unassigned_before, unassigned_after}]; paradoxes: [{kind: "population",
// method, house, unit (the loser), loser: {unit, from, to, growth,
// growth_exact, seats_before, seats_after}, gainer: {same}, faster (false
// when the growth rates are equal), tied, text}].
//
// New-states paradox (kind "new-states", seatsmith admit): unit: {name,
// population}; fair_share, fair_share_exact (p·H/P at the old standard
// divisor); added; house_before; house_after; results: [{method,
// method_name, error, new_unit_seats, paradox (boolean), changes: [{unit,
// before, after}], units: [{name, before, after}], unassigned_before,
// unassigned_after, text}].
//
// Measures (kind "measures", seatsmith measure): seats, total, note;
// methods: [{method, method_name, error, unassigned, loosemore_hanby,
// gallagher, sainte_lague (numbers, percent scale), largest_district and
// smallest_district ({unit, persons_per_seat} or null), ratio,
// absolute_difference, relative_difference (a fraction), unseated,
// improving_transfers: {relative_difference, district_size_difference,
// representation_difference} (counts; 0 passes the test; null when not
// run)}].
//
// Scenario comparison (kind "diff", seatsmith diff): baseline and proposal
// ({method, method_name, seats, total, unassigned, ties}); settings:
// [{name, before, after}]; moved (seats that change hands); units: [{name,
// status ("same", "changed", "margins", "added", "removed"),
// population_before, population_after, growth, seats_before, seats_after,
// change, quota_before, quota_after, gain_margin_before, gain_margin_after,
// lose_margin_before, lose_margin_after, margins_changed}]; measures:
// {baseline: {loosemore_hanby, gallagher, sainte_lague, ratio}, proposal};
// lines: [text].
//
// House size (kind "house-size", seatsmith house): rule ("cube-root" or
// "smallest-unit"), total, value (the unrounded size as text), seats,
// smallest ({unit, population} or null), comparison (the comparison
// document at that size).
//
// Fixed ratio (kind "fixed-ratio", seatsmith house -ratio, from
// [ApplyRatio]): method, method_name, ratio, seats (the house size the
// ratio gives), tie_rule, unassigned; units: [{name, population, quotient
// (population over the ratio, six places unless exact), rounded, seats,
// lower_signpost, upper_signpost (null where there is none), at_min,
// at_max, tied, rounded_up}]; text.
//
// Base seats (kind "base-seats", seatsmith house -base, from
// [ApplyBase]): base, seats; units: [{name, population, base_seats,
// proportional_seats, seats}]; rest (the allotment document of the
// proportional part, or null when the base seats fill the house);
// unassigned; text.
//
// Derived body (kind "derived-body", seatsmith derived): method,
// method_name, seats, plus, body_seats, total; units: [{name, population,
// counted, population_share, seats, house_share, body_seats, body_share,
// house_weight, body_weight}] (shares and weights exact, six places);
// ties; unassigned; measures: {house: {loosemore_hanby, gallagher,
// sainte_lague}, body: {same}}.
//
// Bias study (kind "bias", seatsmith bias): config: {seed, draws, units,
// seats, spread, total, class_size}; distribution (in words); note;
// methods: [{method, method_name, large, small, difference, std_error,
// leaning ("large", "small" or "neither"), large_ahead, small_ahead,
// ties}].
package analysis
