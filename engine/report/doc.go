// Package report turns engine results into the documents seatsmith shows:
// JSON trees (the same content for the command-line tool and the
// WebAssembly bridge) and tables written as aligned text, Markdown or CSV.
//
// # The allotment document (version 1)
//
// Allotment builds one JSON object:
//
//	version      1
//	kind         "allotment"
//	caution      the not-official caution, always present
//	title        the scenario's title, when it has one
//	method       the method id, e.g. "huntington-hill"
//	method_name  its display name
//	seats        the house size (number)
//	total        the population apportioned, exact decimal string
//	tie_rule     "none", "order" or "lot:SEED"
//	unassigned   seats left open by an unsettled tie (number, usually 0)
//	units        array, one object per unit, in input order:
//	  name, population (exact decimal string), seats (number),
//	  quota (decimal string, six places unless exact), quota_exact ("n/d"),
//	  lower_quota, upper_quota (numbers), meets_quota (boolean),
//	  min (number), max (number or null), excluded, at_min, at_max, tied
//	  (booleans), last_priority, next_priority (decimal strings, "infinite",
//	  or null; divisor methods), remainder (decimal string or null),
//	  remainder_rank (number or null), remainder_seat (boolean or null;
//	  largest-remainder methods), gain_margin, lose_margin (numbers, exact
//	  decimals, or null where no change of population can do it)
//	ties         array of {units: [names], seats, value, rule, winners: [names]};
//	             empty when there is no tie
//	divisor      {low, high, single, certificate} for divisor methods (high is
//	             null when unbounded; certificate null for a single point),
//	             null otherwise
//	order        seat order beyond the minimums: {seat, unit, nth, priority}
//	beyond       the next seats after the house size, same shape
//	quota        the largest-remainder quota in the final pass, or null
//	passes       the passes the bounds took, or null
//	skipped      only when parts of the explanation were not computed
//	             (the command line leaves them out on large inputs):
//	             ["margins"] (every gain_margin and lose_margin is then
//	             null), ["order"] (order is then empty), or both
//
// Priority values and divisors are written with three decimal places unless
// shorter and exact. Margins count whole people (or the smallest decimal
// step of the input).
//
// # The comparison document (version 1)
//
// Comparison builds {version, kind: "comparison", caution, title, seats,
// total, methods: [ids], units: [{name, population, quota, lower_quota,
// upper_quota, seats: {method id: number|null}, differs, breaks_quota:
// [method ids]}], results: [{method, method_name, error, ties, unassigned,
// quota_violations}]}. A method that cannot apportion the scenario (Adams
// with fewer seats than units, say) carries its error and null seats.
package report

// Caution is shown with every result.
const Caution = "Not an official apportionment. seatsmith computes what the chosen method gives for the numbers supplied; " +
	"the governing statute or constitution, the official counts and the responsible authority decide. " +
	"Rely on election officials and counsel, not on this tool."
