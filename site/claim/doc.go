// Package claim states and checks claims about apportionments: sentences
// an author writes beside a calculator ("Orlen gets 12 seats under
// Huntington–Hill", "Hamilton and Webster treat Sarrow differently") in a
// form the engine can verify.
//
// The same code runs when a site is built, where a claim that does not hold
// is an error, and in the browser, where each claim shows whether it still
// holds after the reader changes the numbers.
//
// # Claims in a scenario block
//
// A claim is a JSON object:
//
//	{"id": "orlen-hh", "kind": "seats", "unit": "Orlen", "seats": 12,
//	 "method": "huntington-hill", "house": 40,
//	 "text": "Under Huntington–Hill, Orlen gets 12 of the 40 seats."}
//
// id (required) names the claim; text is the sentence shown to readers
// (when absent, the claim is shown in a standard wording). method and house
// default to the scenario's own; from and to (the house sizes a ranged
// claim covers) default to the range of the sweep block the claim belongs
// to. The kinds are:
//
//	seats          unit gets exactly seats seats
//	differ         methods [A, B] give unit different seats
//	agree          methods [A, B] give unit the same seats
//	breaks-quota   unit gets less than its lower or more than its upper quota
//	meets-quota    unit gets its lower or its upper quota
//	gain-below     unit's gain margin is below below (people, or votes,
//	               students or applications: what the block counts)
//	lose-below     unit's lose margin is below below
//	alabama        unit gets fewer seats at house+1 than at house (the
//	               Alabama paradox)
//	excluded       unit falls below the threshold
//	included       unit clears the threshold
//	no-alabama     no unit (or unit, when given) gets fewer seats at any
//	               house size from..to than at the size before
//	no-quota-violation
//	               every unit (or unit) gets its lower or upper quota at
//	               every house size from..to
//	population-paradox
//	               with the later populations of a growth block, unit grew
//	               at least as fast as another (gainer, when given) yet
//	               loses a seat while the other gains one
//	no-population-paradox
//	               no unit (or unit) loses a seat that way
//	new-states     admitting the unit of an admit block with its added
//	               seats changes the seats of some old unit (or of unit)
//	no-new-states  it changes none of them (or not unit's)
//
// Claims of the last four kinds need what their block adds to the scenario
// (a [Context]); a seats claim with a house covers one size of a sweep.
// The Context also holds the words for what the units' numbers count, so
// that [Claim.StatementIn] and the verdicts speak of votes where the block
// counts votes.
// Growth rates, quotas and seats are compared exactly: a claim's verdict
// never rests on a rounded number.
package claim
