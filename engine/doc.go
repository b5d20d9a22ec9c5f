// Package engine computes apportionments exactly and explains every seat.
//
// An apportionment divides a fixed number of indivisible seats (the house
// size) among units (states, districts, parties, schools) in proportion to
// their populations. The package implements the two standard families:
//
//   - Largest-remainder methods: Hamilton (Hare quota) and the Droop quota.
//     Every unit receives the whole part of its population divided by the
//     quota; the seats left over go to the largest remainders.
//   - Divisor methods: Jefferson (D'Hondt), Webster (Sainte-Laguë), Adams,
//     Dean, Huntington–Hill (equal proportions) and modified Sainte-Laguë.
//     A unit receives round(p/D) seats for a common divisor D, where each
//     method rounds at its own signpost s(a) between a and a+1.
//
// # Exactness
//
// Populations are exact non-negative decimals ([Decimal]); they are scaled to
// a common number of decimal places and handled as integers. No floating-point
// value ever decides a seat: priority values p/s(a) are compared by
// cross-multiplication in 128-bit arithmetic (math/bits) with a math/big path
// for products that do not fit. Huntington–Hill signposts are square roots;
// they are compared through their squares. Floating-point numbers appear only
// in display strings.
//
// # Ties
//
// When two or more units have exactly equal claims on the last seats (equal
// priority values at the cut, or equal remainders), the result reports a
// [Tie] naming the units and the number of seats they contest. Unless the
// scenario names a [TieRule], the contested seats are left unassigned: each
// unit's Seats counts only the seats it holds outright. A tie rule (by lot
// from a seed, or by input order) assigns them and the tie is still reported.
//
// # Explanation
//
// [Allot] returns a [Result] that explains itself: standard quotas and
// whether quota is satisfied; for divisor methods the exact divisor interval,
// a divisor certificate from inside it, the seat order and the next seats
// beyond the house size; for largest-remainder methods the remainders and
// their rank at the cut; and for every unit the gain and lose margins, all
// other units fixed: the fewest extra people who would win it one more seat
// outright, and the fewest people whose loss would cost it a seat or leave
// its last seat tied.
//
// The package does no I/O. Readers and writers for CSV and JSON live in the
// format packages beside it.
package engine
