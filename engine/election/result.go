package election

import "seatsmith/engine"

// A Result is an election's seats with what explains them.
type Result struct {
	System System
	Method engine.Method
	// UpperMethod apportioned the parties' seats over the election
	// (Biproportional) or the national tier (TwoTier); zero otherwise.
	UpperMethod engine.Method
	// Seats is the house size, after any overhang. BaseSeats is the house
	// before overhang (MixedMember) or the districts' seats (TwoTier;
	// Compensatory is added to them).
	Seats        int
	BaseSeats    int
	Compensatory int
	Overhang     OverhangRule
	UpperBasis   Basis
	TieRule      engine.TieRule
	// Thresholds and WinsThreshold are the scenario's, as applied.
	Thresholds    []Threshold
	WinsThreshold int

	Parties   []PartyResult
	Districts []DistrictResult
	// Cells holds one entry per vote row that names a district, in input
	// order: the party's votes and seats in that district.
	Cells []Cell

	// Ties lists every tie that decided seats, at every stage. Unassigned
	// counts the seats left unassigned because a tie was reported and no
	// rule settled it; each party's, district's and cell's Seats counts
	// only the seats held outright.
	Ties       []Tie
	Unassigned int
	// Pending says which part of the result is missing because a tie
	// before it was not settled (the lower apportionment needs every
	// party's seats); empty when the result is complete.
	Pending string

	// DistrictSeats is the apportionment of the districts' seats from
	// their populations, when the scenario asked for it.
	DistrictSeats *engine.Result
	// Upper is the apportionment of the parties' seats over the election
	// (Biproportional), the national tier (TwoTier) or the list
	// apportionment at the final house size (MixedMember).
	Upper *engine.Result
	// Entitlement is the mixed-member list apportionment of the house
	// before overhang, when it differs from Upper (rule Level).
	Entitlement *engine.Result
	// Certificate describes the divisors of a biproportional lower
	// apportionment.
	Certificate *Certificate
}

// A Certificate says how the divisors of a biproportional result were
// checked. Every cell's votes divided by its district's and its party's
// divisor was checked, exactly, to round to the cell's seats.
type Certificate struct {
	// Strict: every quotient lies strictly between its signposts, which
	// proves that no other lower apportionment exists. A tie leaves some
	// quotients on a signpost.
	Strict bool
	// Exact: the lower apportionment was found by the exact procedure
	// (tie-and-transfer in rational arithmetic) rather than proven from a
	// floating-point estimate; both are checked the same way.
	Exact bool
}

// A PartyResult is one party's part of a Result.
type PartyResult struct {
	Name string
	// Votes are the party's votes over the whole election.
	Votes engine.Decimal
	// Qualified says whether the party takes part in the apportionment
	// over the whole election; Reason says why (one of the Qualified* and
	// NotQualified* texts).
	Qualified bool
	Reason    string
	Exempt    bool
	// Seats is the party's total.
	Seats int
	// DistrictSeats: district-tier seats (TwoTier) or district wins
	// (MixedMember). ListSeats: compensatory seats (TwoTier) or list
	// seats (MixedMember).
	DistrictSeats int
	ListSeats     int
	// Entitlement is the seats the party's votes give it in the house
	// before overhang (MixedMember); Overhang the district wins beyond it.
	Entitlement int
	Overhang    int
	// Basis is what the upper apportionment divided (Biproportional): the
	// party's votes, or its voter number.
	Basis engine.Decimal
	// Divisor is the party divisor (Biproportional); empty when the party
	// takes no part in the lower apportionment.
	Divisor string
}

// A DistrictResult is one district's part of a Result.
type DistrictResult struct {
	Name       string
	Seats      int
	Votes      engine.Decimal // votes for the parties in the scenario
	OtherVotes engine.Decimal
	Population *engine.Decimal
	// Divisor is the district divisor (Biproportional), or the divisor
	// certificate of the district's own apportionment by a divisor method
	// (Districts and the district tier of TwoTier); empty otherwise.
	Divisor string
	// Result is the district's own apportionment (Districts, TwoTier);
	// Parties maps its units to the parties' indexes.
	Result  *engine.Result
	Parties []int
}

// A Cell is one party's votes and seats in one district.
type Cell struct {
	District, Party int
	Row             int // the vote row
	Votes           engine.Decimal
	Seats           int
	// Wins is the district seats the party's candidates won there
	// (MixedMember); Seats is the same number.
	Wins int
	// Excluded: the party may take no seat here (below a threshold, or
	// not qualified).
	Excluded bool
	Tied     bool
}

// A CellRef names a cell by district and party.
type CellRef struct{ District, Party int }

// The stages at which a tie can arise.
const (
	StageDistrictSeats = "district-seats" // the districts' seats from populations
	StageDistrict      = "district"       // one district's own apportionment
	StageUpper         = "upper"          // the parties' seats over the election
	StageNational      = "national"       // the two-tier national apportionment
	StageList          = "list"           // the mixed-member list apportionment
	StageLower         = "lower"          // the biproportional lower apportionment
)

// A Tie is a set of claims on seats that are exactly equal, so that the
// seats could go more than one way.
type Tie struct {
	Stage    string
	District int // the district, for StageDistrict; -1 otherwise
	// Districts are the tied districts (StageDistrictSeats); Parties the
	// tied parties (StageDistrict, StageUpper, StageNational, StageList);
	// Cells the tied cells (StageLower).
	Districts []int
	Parties   []int
	Cells     []CellRef
	Seats     int    // the seats contested
	Value     string // the equal priority value or remainder; empty for StageLower
	// Winners (indexes as in Districts or Parties) or WinnerCells were
	// given the contested seats by the tie rule; empty when the seats were
	// left unassigned.
	Winners     []int
	WinnerCells []CellRef
	Rule        string
}
