// Package election computes the seats of elections with districts: votes
// in a table of districts by parties, turned into seats by one of four
// systems, exactly, with every tie reported.
//
// Compute takes a typed Scenario and returns a Result; Read, ReadJSON,
// FromDoc and Source.AddCSV read scenarios from files with errors located
// by file, line and field; Verify re-checks a biproportional result's divisors. The package does no
// other I/O and uses no fmt or reflection, so the WebAssembly engine can
// import it. Its result becomes a document (text, Markdown, CSV, JSON) in
// engine/format: format.Election and format.ElectionJSON.
//
// # Systems
//
//   - Districts: every district's seats are apportioned among its parties
//     on their own (engine.Allot, by any method); national totals are sums.
//   - Biproportional: the upper apportionment gives every party its seats
//     over the whole election (by the upper method, on the parties' votes or
//     their voter numbers) and every district its seats (given, or
//     apportioned from populations); the lower apportionment then finds a
//     divisor for every district and every party such that the method's
//     rounding of votes / (district divisor × party divisor) meets every
//     district's and every party's seats. Only divisor methods round that
//     way.
//   - TwoTier: the districts are apportioned first; then a fixed number of
//     compensatory seats go to the qualifying parties so that each party's
//     national total is the upper method's apportionment of the house with
//     its district seats as a minimum: as close to its votes as the method
//     allows, never taking a district seat away. Parties that do not
//     qualify keep their district seats, which come off the national house.
//   - MixedMember: each qualifying party's total is the method's
//     apportionment of the house (less the district wins of parties without
//     lists, which they keep) by list votes; its district wins count towards
//     it and list seats fill the rest. A party that won more districts than
//     that keeps them, and the OverhangRule decides: Keep enlarges the house
//     by the overhang; Level enlarges it to the smallest size at which every
//     party's apportionment covers its wins; Fixed keeps the size and lets
//     the other parties share what is left.
//
// Qualification: a party qualifies when it reaches any one threshold of
// scope Election (its share of the whole election's votes) or AnyDistrict
// (in at least one district), or has won at least WinsThreshold district
// seats, or is exempt. Shares are compared exactly, on the votes for lists
// (Base Lists) or on every valid vote (Base Valid: the lists' votes plus
// the other valid votes the scenario records, such as blank ballots).
// Thresholds of scope InDistrict apply within each district instead.
//
// # Exactness and the certificate
//
// No float decides a seat. The biproportional lower apportionment is
// estimated by alternating scaling in floating point and then proven: party
// divisors and district divisors are chosen as short decimals inside their
// exact ranges, and every cell is checked in exact integer arithmetic to
// round strictly to its seats, which also proves that no other lower
// apportionment exists. When the estimate cannot be proven, tie-and-transfer
// runs in exact rational arithmetic. The two divisor sets are the
// certificate, written in the result as exact decimals (at a tie, where
// the tied cells pin divisors to each other, possibly as exact fractions);
// Compute checks it again with Verify before returning.
//
// # Ties
//
// A tie is a set of claims on seats that are exactly equal. At every
// stage (the districts' seats, each district, the upper, national or list
// apportionment, the lower apportionment) a tie is reported with the
// seats it contests. Without a tie rule those seats are left unassigned:
// every Seats counts only seats held outright and Result.Unassigned counts
// the open ones; when the parties' seats of a biproportional election are
// open, its lower apportionment waits (Result.Pending). A tie rule (by
// input order, or by lot from a seed) settles them and the tie is still
// reported with its winners. In the lower apportionment a tie is a cycle
// of cells on their signposts; the cells the rule favours are those of the
// earliest vote rows (or a seeded shuffle of them).
//
// # The scenario document (JSON, version 1)
//
//	{
//	  "version": 1,
//	  "kind": "election",
//	  "title": "Council of Arvelle (invented)",
//	  "system": "biproportional",       // districts, biproportional, two-tier, mixed-member
//	  "method": "webster",              // any engine method id or alias
//	  "upper_method": "webster",        // parties' seats (biproportional), national tier (two-tier)
//	  "district_method": "webster",     // districts' seats from populations
//	  "seats": 60,                      // the house (mixed-member: before overhang)
//	  "compensatory": 10,               // two-tier
//	  "overhang": "keep",               // keep, level, fixed (mixed-member)
//	  "upper_basis": "votes",           // votes or voters (biproportional)
//	  "threshold": {"share": "5%", "scope": "election", "base": "lists"},
//	  "alternative_wins": 3,            // qualify with this many district seats won
//	  "other_votes": 1200,              // valid votes for no party, outside districts
//	  "tie": "none",                    // none, order, lot:SEED
//	  "districts": [{"name": "North", "seats": 12, "population": 41200, "other_votes": 80}],
//	  "parties": [{"name": "Lantern", "wins": 3, "exempt": false, "independent": false}],
//	  "votes": [{"district": "North", "party": "Lantern", "votes": 10432, "wins": 1}]
//	}
//
// Only kind, system, method (or options given otherwise), and votes are
// needed; districts are needed by every system but mixed-member. threshold
// is a share ("5%", "0.05", 0.05), an object {share, scope: election |
// any-district | district, base: lists | valid}, or an array of them.
// Counts (votes, populations, other votes) are JSON numbers or strings
// holding exact decimals, kept digit for digit. A district's seats may be
// left out when every district has a population: the districts' seats are
// then apportioned from the populations by district_method. Parties need no
// entry unless they have wins, are exempt or independent; their order is
// that of the parties list, then of first appearance in the votes. Unknown
// members are errors.
//
// # CSV
//
// A long table of vote rows, and small tables beside it, as sections of one
// file (separated by a blank line) or in separate files; each section
// starts with its header, in any column order, and is recognised by it:
//
//	district,party,votes         vote rows (also wins, for mixed-member)
//	North,Lantern,10432
//	North,Harbour,8120
//	South,Lantern,9310
//
//	district,seats               districts (also population, other_votes)
//	North,12
//	South,9
//
//	party,wins,exempt            parties (also independent; yes/no)
//	Lantern,3,no
//
// A line of commas counts as blank, as spreadsheets write it; empty cells
// after the header's columns are ignored. A vote row without a district is
// a national count (mixed-member). The scenario's settings (system, method,
// thresholds, ...) come from the command line.
//
// # The result document (JSON, version 1)
//
// format.ElectionJSON builds one object (its version and kind are
// ResultVersion and ResultKind):
//
//	version        1
//	kind           "election-result"
//	caution        the not-official caution, always present
//	title          when the scenario has one
//	system, system_name, method, method_name
//	upper_method   method id, or null where the system has none
//	seats          the house size, after any overhang
//	base_seats     mixed-member: the house before overhang; two-tier: the
//	               districts' seats; null otherwise
//	compensatory   two-tier: the compensatory seats; null otherwise
//	overhang_rule  mixed-member: keep, level or fixed; null otherwise
//	upper_basis    biproportional: votes or voters; null otherwise
//	thresholds     [{share (exact decimal), scope, base}], as applied
//	alternative_wins  district seats that qualify a party, or null
//	tie_rule       none, order or lot:SEED
//	unassigned     seats left open by an unsettled tie (number)
//	pending        why part of the result waits for a tie to be settled, or null
//	parties        one object per party: name, votes (exact decimal),
//	               qualified, reason ("threshold", "district seats",
//	               "exempt", "no threshold", "below threshold", "no list"),
//	               exempt, seats, district_seats and list_seats (two-tier:
//	               district tier and compensatory; mixed-member: wins and list
//	               seats; else null), entitlement and overhang (mixed-member,
//	               qualifying parties; else null), basis (biproportional: what
//	               the upper apportionment divided; else null), divisor
//	               (biproportional: the party divisor, an exact decimal
//	               string; else null)
//	districts      one object per district: name, seats, votes, other_votes,
//	               population (or null), divisor (biproportional: the district
//	               divisor; per-district and two-tier by a divisor method: the
//	               district apportionment's divisor certificate; else null)
//	cells          one object per vote row that names a district, in input
//	               order: district, party, votes, seats, excluded (below a
//	               threshold or not qualified), tied
//	ties           {stage ("district-seats", "district", "upper", "national",
//	               "list", "lower"), district (name or null), districts,
//	               parties (names), cells ([{district, party}], lower stage),
//	               seats, value (the equal priority or remainder, or null),
//	               rule, winners (names, or cells at the lower stage; empty
//	               when the seats were left open)}
//	certificate    biproportional: {checked: true, strict (no quotient on a
//	               signpost: the lower apportionment is the only one), exact
//	               (found by the exact procedure)}; null otherwise
//
// Every divisor is exact: rounding each cell's votes divided by its district
// divisor and its party divisor at the method's signposts gives its seats.
package election
