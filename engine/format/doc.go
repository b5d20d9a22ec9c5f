// Package format holds seatsmith's result documents as data, and the
// small interface the formats write them through. It computes nothing:
// the results come from package engine and engine/analysis (comparisons,
// sweeps, paradoxes, measures) and engine/projection.
//
// A [Document] is built once per result, by [Allotment], [Comparison],
// [Sweep], [Paradoxes], [Growth], [Admit], [Diff], [Measures], [House],
// [FixedRatio], [BaseSeats], [Derived], [Bias], [Projection] or
// [Election], and holds every part any format
// shows: a title and a body of headings, paragraphs, lists and tables for
// people; a data table for CSV; the JSON tree; a chart. One [Encoder] a
// format writes it, each in a package of its own, in the style of a small
// root interface with a package per format:
//
//	engine/format/text      plain text for a terminal
//	engine/format/markdown  Markdown
//	engine/format/csv       the data table as CSV
//	engine/format/json      the JSON tree (large arrays streamed)
//	engine/format/svg       the chart as a standalone SVG file
//
// So a wording lives in one place whatever the format, and a tie, a
// skipped explanation or a unit's note reads the same in every format and
// on the pages, which use [UnitNotes], [MarginLegend], [TieText],
// [SeatChanges], [ShareText] and [Caution] too.
// Tables whose rows are many (a million units, a million house sizes) make
// each row as it is written; nothing here holds the output in memory.
//
// The package and its csv and json encoders use no reflection (no fmt,
// no encoding/json or encoding/csv), so that the WebAssembly engine can
// import them: the pages' exports are the command line's files.
//
// # CSV files are data
//
// Every CSV file is long and numeric: a column holds numbers or text,
// never both; numbers are plain (no marks, signs on positives, percent
// signs or arrows; a negative number stays a number; a growth rate is a
// fraction, 0.05 for five percent); marks are columns of their own, true
// or false; an empty cell is a value that does not apply (no cap, no
// margin, no error). The settings the numbers depend on lead every row:
// method (when the file holds one method), house_size (when it holds one
// size), default_min, default_max (empty: no cap), threshold (a share,
// 0 for none) and tie_rule ("none", "order" or "lot:SEED"); a unit's own
// bounds are its min and max columns. Multi-method files have one row a
// method and unit. An election's files lead with its own settings
// (system, methods, house size, base and compensatory seats, overhang
// rule, upper basis, each threshold with its scope and base, the district
// seats that qualify a party, tie rule); a fixed ratio's, its method,
// ratio and the house size it gives. Every file that apportions more than
// once has tied and unassigned columns, so that a column of seats never
// sums short in silence. Text cells a spreadsheet would run as formulas
// are guarded (see package csv).
//
// # The allotment document (JSON, version 1)
//
// [AllotmentJSON] builds one JSON object:
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
// # The comparison document (JSON, version 1)
//
// [ComparisonJSON] builds {version, kind: "comparison", caution, title,
// seats, total, methods: [ids], units: [{name, population, quota,
// lower_quota, upper_quota, seats: {method id: number|null}, differs,
// breaks_quota: [method ids]}], results: [{method, method_name, error,
// ties, unassigned, quota_violations}]}. A method that cannot apportion
// the scenario (Adams with fewer seats than units, say) carries its error
// and null seats.
//
// The other documents' schemas are in the documentation of package
// engine/analysis (sweep, paradoxes, population paradox, new states,
// measures, diff, house size, derived body, bias) and at [ProjectionJSON].
// A change of a member is a schema change: bump [Version] when it would
// break a reader.
package format
