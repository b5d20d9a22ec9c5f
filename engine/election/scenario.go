package election

import (
	"strconv"
	"strings"

	"seatsmith/engine"
)

// A System is a way of electing one house from districts and parties.
type System uint8

// The systems.
const (
	// Districts apportions each district's seats among its parties on their
	// own; a party's national total is the sum of its district seats.
	Districts System = iota + 1
	// Biproportional fixes every party's seats over the whole election (the
	// upper apportionment) and every district's seats, then finds district
	// divisors and party divisors such that the method's rounding of
	// votes / (district divisor × party divisor) meets every district's and
	// every party's total (the lower apportionment).
	Biproportional
	// TwoTier apportions the districts first, then places a fixed number of
	// compensatory seats so that each party's national total follows its
	// votes as closely as the method allows without taking a district seat
	// away.
	TwoTier
	// MixedMember gives each party a total that follows its list votes over
	// the whole house; its district wins count towards it and list seats
	// fill the rest. A party that won more districts than its total keeps
	// them (overhang), handled by an OverhangRule.
	MixedMember
)

var systemIDs = [...]string{Districts: "districts", Biproportional: "biproportional", TwoTier: "two-tier", MixedMember: "mixed-member"}

var systemNames = [...]string{Districts: "per-district", Biproportional: "biproportional", TwoTier: "two-tier (compensatory)", MixedMember: "mixed-member"}

// Systems returns every system.
func Systems() []System { return []System{Districts, Biproportional, TwoTier, MixedMember} }

// String returns the system's id, such as "two-tier".
func (s System) String() string {
	if s.Valid() {
		return systemIDs[s]
	}
	return "invalid-system"
}

// Name returns the system's display name.
func (s System) Name() string {
	if s.Valid() {
		return systemNames[s]
	}
	return "invalid system"
}

// Valid reports whether s is one of the defined systems.
func (s System) Valid() bool { return s >= Districts && s <= MixedMember }

// ParseSystem reads a system id. Case, spaces and underscores are not
// significant; "per-district", "compensatory", "mmp" and "doubly-proportional"
// are accepted too.
func ParseSystem(s string) (System, error) {
	switch normal(s) {
	case "districts", "district", "per-district":
		return Districts, nil
	case "biproportional", "bi-proportional", "doubly-proportional":
		return Biproportional, nil
	case "two-tier", "twotier", "compensatory":
		return TwoTier, nil
	case "mixed-member", "mixed", "mmp", "mixed-member-proportional":
		return MixedMember, nil
	}
	return 0, &Error{Index: -1, Field: "system", Msg: "unknown system " + strconv.Quote(s) + "; use districts, biproportional, two-tier or mixed-member"}
}

// An OverhangRule says what happens when a party wins more districts than
// the seats its list votes give it (mixed-member systems).
type OverhangRule uint8

// The overhang rules.
const (
	// Keep lets the party keep its district wins and enlarges the house by
	// the overhang; the other parties keep what the base house gave them.
	Keep OverhangRule = iota
	// Level enlarges the house, seat by seat, until the apportionment of the
	// larger house gives every party at least its district wins; every
	// party's total then follows its votes.
	Level
	// Fixed keeps the house size: the party keeps its district wins and the
	// other parties share the seats left, so they are not compensated.
	Fixed
)

// String returns the rule's id: "keep", "level" or "fixed".
func (r OverhangRule) String() string {
	switch r {
	case Keep:
		return "keep"
	case Level:
		return "level"
	case Fixed:
		return "fixed"
	}
	return "invalid-overhang"
}

// ParseOverhangRule reads "keep" (also "enlarge"), "level" (also
// "levelling", "compensate") or "fixed" (also "none", "uncompensated").
func ParseOverhangRule(s string) (OverhangRule, error) {
	switch normal(s) {
	case "keep", "kept", "enlarge":
		return Keep, nil
	case "level", "levelled", "leveled", "levelling", "leveling", "compensate", "compensated":
		return Level, nil
	case "fixed", "fixed-house", "none", "uncompensated", "not-compensated":
		return Fixed, nil
	}
	return 0, &Error{Index: -1, Field: "overhang", Msg: "unknown overhang rule " + strconv.Quote(s) + "; use keep, level or fixed"}
}

// A Scope says where a vote threshold is measured.
type Scope uint8

// The scopes.
const (
	// Election measures a party's share of the votes over the whole
	// election; below it the party takes no seat anywhere.
	Election Scope = iota
	// AnyDistrict qualifies a party for the whole election when it reaches
	// the share in at least one district.
	AnyDistrict
	// InDistrict measures the share in each district on its own: a party
	// below it in a district takes no seat there.
	InDistrict
)

// String returns the scope's id: "election", "any-district" or "district".
func (s Scope) String() string {
	switch s {
	case Election:
		return "election"
	case AnyDistrict:
		return "any-district"
	case InDistrict:
		return "district"
	}
	return "invalid-scope"
}

// ParseScope reads a scope id ("national" and "whole" also name Election).
func ParseScope(s string) (Scope, error) {
	switch normal(s) {
	case "election", "national", "whole", "whole-election", "":
		return Election, nil
	case "any-district", "one-district", "some-district":
		return AnyDistrict, nil
	case "district", "in-district", "each-district", "within-district":
		return InDistrict, nil
	}
	return 0, &Error{Index: -1, Field: "threshold", Msg: "unknown threshold scope " + strconv.Quote(s) + "; use election, any-district or district"}
}

// A Base is what a threshold share is a share of.
type Base uint8

// The bases.
const (
	// Lists is the votes cast for party lists (the votes in the scenario).
	Lists Base = iota
	// Valid is every valid vote: the votes for lists plus the other valid
	// votes the scenario records (blank ballots, say, where the law counts
	// them).
	Valid
)

// String returns the base's id: "lists" or "valid".
func (b Base) String() string {
	if b == Valid {
		return "valid"
	}
	return "lists"
}

// ParseBase reads "lists" (also "list-votes") or "valid" (also "all",
// "valid-votes").
func ParseBase(s string) (Base, error) {
	switch normal(s) {
	case "lists", "list", "list-votes", "":
		return Lists, nil
	case "valid", "all", "valid-votes", "all-valid":
		return Valid, nil
	}
	return 0, &Error{Index: -1, Field: "threshold", Msg: "unknown threshold base " + strconv.Quote(s) + "; use lists or valid"}
}

// A Basis is what the upper apportionment of a biproportional election
// divides among the parties.
type Basis uint8

// The bases of the upper apportionment.
const (
	// Votes is each party's votes summed over the districts.
	Votes Basis = iota
	// Voters divides each party's votes in a district by the district's
	// seats (where every voter has as many votes as there are seats),
	// rounds to the nearest whole number (halves up) and sums over the
	// districts: the party's voter number.
	Voters
)

// String returns the basis id: "votes" or "voters".
func (b Basis) String() string {
	if b == Voters {
		return "voters"
	}
	return "votes"
}

// ParseBasis reads "votes" or "voters" (also "voter-numbers").
func ParseBasis(s string) (Basis, error) {
	switch normal(s) {
	case "votes", "":
		return Votes, nil
	case "voters", "voter-numbers", "voter-number":
		return Voters, nil
	}
	return 0, &Error{Index: -1, Field: "upper_basis", Msg: "unknown basis " + strconv.Quote(s) + "; use votes or voters"}
}

// A Threshold is a share of the votes a party must reach.
type Threshold struct {
	Share engine.Decimal // a share of the base, such as 0.05; at most 1
	Scope Scope
	Base  Base
}

// A District is one electoral district.
type District struct {
	Name string
	// Seats is the district's seats. Zero with a Population: the district's
	// seats are apportioned from the populations (see Scenario.Seats).
	Seats int
	// Population, when set, is what the districts' seats are apportioned
	// from when they are not given.
	Population *engine.Decimal
	// OtherVotes are valid votes cast in the district for no party in the
	// scenario (blank ballots, say); they count only in a threshold whose
	// Base is Valid.
	OtherVotes engine.Decimal
}

// A Party is one party (or list, or independent candidate) and what is
// known of it beyond its votes. Parties named only in the votes need no
// entry.
type Party struct {
	Name string
	// Wins is the number of districts the party's candidates won (mixed-member
	// systems); it may instead be given on the party's votes.
	Wins int
	// Exempt parties need not reach any threshold (a national minority's
	// party, say).
	Exempt bool
	// Independent marks a candidate or group without a party list: its
	// district wins are kept and taken off the house before the list seats
	// are apportioned, and it takes no list seat.
	Independent bool
}

// A Vote is one party's votes in one district. District may be empty in a
// mixed-member election, for list votes counted nationally.
type Vote struct {
	District string
	Party    string
	Votes    engine.Decimal
	// Wins is the number of district seats the party's candidates won in
	// this district (mixed-member systems).
	Wins int
}

// A Scenario is one election: districts, parties, votes and the rules that
// turn them into seats.
type Scenario struct {
	System System
	// Method apportions seats within districts (Districts, and the district
	// tier of TwoTier), the lower apportionment (Biproportional; a divisor
	// method) and the list seats (MixedMember).
	Method engine.Method
	// UpperMethod apportions the parties' seats over the whole election
	// (Biproportional) and the national tier (TwoTier). Zero means Method.
	UpperMethod engine.Method
	// DistrictMethod apportions the districts' seats from their populations
	// when the districts' seats are not given. Zero means UpperMethod.
	DistrictMethod engine.Method

	// Seats is the house size: for MixedMember the house before any
	// overhang; for the other systems the total of the districts' seats,
	// needed only when those are apportioned from populations (when they
	// are given, Seats may be zero or must equal their total).
	Seats int
	// Compensatory is the number of compensatory seats (TwoTier).
	Compensatory int
	// Overhang is the overhang rule (MixedMember).
	Overhang OverhangRule
	// UpperBasis is what the upper apportionment divides (Biproportional).
	UpperBasis Basis

	Districts []District
	// Parties lists facts about parties beyond their votes; optional. The
	// parties' order is the order of this list, then of first appearance
	// in the votes.
	Parties []Party
	Votes   []Vote

	// Thresholds: a party qualifies when it reaches any one of the
	// thresholds of scope Election or AnyDistrict, or has won at least
	// WinsThreshold district seats (when that is not zero), or is exempt.
	// With no such thresholds every party qualifies. Thresholds of scope
	// InDistrict apply in each district on their own.
	Thresholds    []Threshold
	WinsThreshold int
	// OtherVotes are valid votes for no party in the scenario that belong
	// to no district (a mixed-member election's national count); they count
	// only in a threshold whose Base is Valid.
	OtherVotes engine.Decimal

	// Tie says how ties are settled; the zero rule reports them and leaves
	// the contested seats unassigned.
	Tie engine.TieRule
}

func (s *Scenario) upperMethod() engine.Method {
	if s.UpperMethod != 0 {
		return s.UpperMethod
	}
	return s.Method
}

func (s *Scenario) districtMethod() engine.Method {
	if s.DistrictMethod != 0 {
		return s.DistrictMethod
	}
	return s.upperMethod()
}

func normal(s string) string {
	k := strings.ToLower(strings.TrimSpace(s))
	return strings.NewReplacer(" ", "-", "_", "-", "–", "-").Replace(k)
}
