// Package projection projects dated population counts to a target date,
// apportions the projection exactly, and estimates by seeded random draws
// how likely every unit is to gain or lose a seat when the counts carry an
// error.
//
// # Counts
//
// [ReadCounts] reads a CSV table with one row per count (long form):
//
//	name,date,population,rse,min,max
//	Orlen,2015-04-01,2550112,,,
//	Orlen,2020-04-01,2694457,1.5%,2,
//	Tamsk,2015-04-01,2101334,,,
//
// name and population are required; date (YYYY-MM-DD, YYYY-MM or YYYY) is
// required for projections; rse (the unit's own relative standard error,
// 0.015 or 1.5%), min and max are optional and may stand on any one row of
// the unit (on several rows they must agree). Without a date column every
// unit has one undated count, so an ordinary name,population table works
// too. Or it reads a JSON document: a seatsmith scenario document (the
// members version, title, seats, method, min, max, threshold, tie) whose
// units carry either a population or counts, and optionally an rse:
//
//	{"seats": 40, "method": "huntington-hill", "min": 1, "units": [
//	  {"name": "Orlen", "rse": "1.5%", "counts": [
//	    {"date": "2015-04-01", "population": 2550112},
//	    {"date": "2020-04-01", "population": 2694457}]},
//	  {"name": "Tamsk", "population": 2079562}]}
//
// Bad input is refused with an *input.Error naming file, line and field.
//
// # Projection
//
// Times are decimal years: Year + (day of year - 1)/(days in the year).
// Linear growth fits p(t) = a + b·t by ordinary least squares over the
// counts (or through the two latest, [LastTwo]):
// b = Σ(t_k - t̄)(p_k - p̄)/Σ(t_k - t̄)² and p(T) = p̄ + b·(T - t̄), computed
// exactly in rational arithmetic; a line that falls below zero gives zero.
// Geometric growth fits ln p(t) the same way, so that
// p(T) = exp(mean(ln p_k) + b·(T - t̄)); through two counts
// p(T) = p_2·(p_2/p_1)^((T - t_2)/(t_2 - t_1)). Projections are rounded to
// whole people (or the finest decimal step among the counts), halves up.
// See [Project].
//
// # Error model and draws
//
// Around every unit's central population c (its projection, or its latest
// count without a target) a draw is c·(1 + σZ), cut at zero ([Normal]), or
// c·exp(sZ - s²/2) with s² = ln(1 + σ²) ([LogNormal], mean c and standard
// deviation σc exactly), for independent standard normal Z and the unit's
// relative standard error σ, rounded to whole people. Draw number i takes
// its normal variates, one per unit in input order, from a PCG generator
// (math/rand/v2) seeded by SplitMix64 from the study's seed and i alone, so
// the numbers are the same for any number of workers and any split of the
// draws into runs.
//
// Every draw is apportioned exactly by an engine.WarmAllotter, which starts
// from the central apportionment's divisor and checks every seat with exact
// integer comparisons; its results equal engine.Allot's. Floating point
// only generates the random populations and estimates divisors; it decides
// no seat. A draw for which no apportionment exists (bounds that cannot be
// met once a unit is drawn to zero, say) is counted as failed.
//
// # Results
//
// [Study.Summary] reports, for every unit: its latest count and projection,
// its seats at baseline (the apportionment of the latest counts) and at the
// central projection, the share of draws giving it each seat count, the
// shares in which it gains or loses against the baseline, holds the last
// seat or would take the first seat beyond the house size, holds one of
// the last Contest seats or would take one of the next Contest, and is part
// of a tie. Shares are of the apportioned draws; each estimates a
// probability with standard error sqrt(p(1-p)/N), at most 0.5/sqrt(N).
//
// # The projection document (version 1)
//
// format.ProjectionJSON writes a summary as JSON:
//
//	{version: 1, kind: "projection", caution, title, method, method_name,
//	 seats, target: "YYYY-MM-DD"|null, growth: "linear"|"geometric"|null,
//	 fit: "all"|"last2"|null, error: {model: "normal"|"lognormal", rse}|null,
//	 seed, contest, draws, apportioned, failed, tied, unassigned,
//	 max_standard_error: number|null,
//	 baseline: {total, unassigned, ties},
//	 central: {total, unassigned, ties, divisor: {low, high, certificate}|null},
//	 units: [{name, counts, latest_date: "YYYY-MM-DD"|null, latest, projected,
//	          clamped, rate_per_year: number|null, rse, baseline_seats,
//	          central_seats, mean_seats: number|null, sd_seats: number|null,
//	          distribution: [{seats, draws, share}],
//	          gain, lose, last_seat, next_seat, in_last, in_next, tied:
//	            {draws, share}}]}
//
// Populations (latest, projected, total) are exact decimal strings; draws
// are whole numbers; shares and rates are numbers. The full description is
// on format.ProjectionJSON.
//
// # Running in chunks
//
// A page's worker (or any caller that must report progress and stay
// cancellable) makes the draws in chunks: New, then Run(ctx, Done(),
// Done()+k) repeatedly, reading Summary between chunks if it likes.
// Options.Progress is called every few hundred draws; a cancelled Run
// leaves the study as it was.
//
// Results are estimates under an assumed growth and error model, not
// official figures: the governing law, the official counts and the
// responsible authority decide any apportionment.
package projection
