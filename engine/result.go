package engine

// A Result is an apportionment with its explanation.
type Result struct {
	Method Method
	Seats  int // the house size
	// Total is the population of the units that were apportioned (after
	// the threshold), exactly.
	Total string
	Units []UnitResult
	// Ties lists every tie that decided seats. Unassigned counts the seats
	// left unassigned because a tie was reported and no rule settled it.
	Ties       []Tie
	Unassigned int
	Tie        TieRule

	// Divisor methods only.
	Divisor *DivisorRange
	// Order lists the seats handed out by priority (beyond the minimums),
	// in order; filled when asked for with [WithOrder].
	Order []SeatAward
	// Beyond lists the next seats after the house size, up to five.
	Beyond []SeatAward

	// Largest-remainder methods only: the quota in the final pass (Hare
	// quota P/H in people per seat, or the Droop quota) and the number of
	// passes the bounds took.
	Quota  *Value
	Passes int
}

// A UnitResult is one unit's part of a [Result].
type UnitResult struct {
	Name       string
	Population Decimal
	Seats      int // seats held (outright, or given by the tie rule)
	Min        int
	Max        int  // -1 when uncapped
	Excluded   bool // below the threshold
	AtMin      bool // the minimum holds it up
	AtMax      bool // the maximum holds it down
	Tied       bool // one of the units in a tie
	// MeetsQuota reports whether Seats is the lower or the upper quota
	// (kept beside the other flags, as RemainderSeat is, so that a
	// million units' results are 16 bytes a unit smaller).
	MeetsQuota bool
	// RemainderSeat: see Remainder below.
	RemainderSeat bool

	// Quota is the standard quota p·H/P over the apportioned units, with
	// its lower and upper quota.
	Quota        Fraction
	Lower, Upper int

	// Divisor methods: the priority value of the last seat held beyond the
	// minimum and of the next seat; nil where there is none.
	Last, Next *Value

	// Largest-remainder methods: the remainder in the final pass and its
	// rank there (1 for the largest; 0 when the unit was fixed at a bound
	// or excluded); RemainderSeat above reports whether it won a seat.
	Remainder     *Value
	RemainderRank int

	// Gain is the fewest extra people who would win the unit one more seat
	// outright (not merely a tie for it), all other units fixed; Lose the
	// fewest people whose loss would leave it no longer holding all its
	// seats outright (a tie for its last seat already counts). Nil where it
	// cannot happen. Filled when asked for with [WithMargins].
	Gain, Lose *Decimal
}

// A Fraction is an exact rational number with a decimal rendering.
type Fraction struct {
	Num, Den string  // lowest terms
	Text     string  // decimal, rounded to six places unless exact
	Approx   float64 // nearest float64
}

// A SeatAward is one seat handed out by priority.
type SeatAward struct {
	Seat     int // the seat's number in the house, 1-based
	Unit     int // the unit's index
	Name     string
	Nth      int   // the unit's seat count with this seat
	Priority Value // p/s(Nth-1)
}

// A DivisorRange is the exact set of divisors that yield the result: every D
// with Low < D < High gives it (at Low or High a unit sits on a signpost and
// ties). Low is zero and High infinite when nothing bounds them.
type DivisorRange struct {
	Low, High Value
	// Single is true when Low equals High: the result stands only at a tie.
	Single bool
	// Certificate is a short decimal strictly inside the range, verified
	// exactly: rounding every population by it at the method's signposts,
	// within the bounds, gives every unit its seats. Empty when Single.
	Certificate string
}

// Detail says how much explanation [Allot] computes.
type Detail uint8

const (
	// WithOrder records the seat order of divisor methods.
	WithOrder Detail = 1 << iota
	// WithMargins computes every unit's gain and lose margins.
	WithMargins
	// SeatsOnly leaves out the rest of the explanation too: the divisor
	// range, each unit's priorities, the remainders and their ranks, the
	// seats beyond the house size, and the quotas' fractions in lowest
	// terms (Quota.Num and Quota.Den may be empty). The result keeps its
	// seats, quotas (as text, with lower and upper quota), bounds and
	// ties, which is what a comparison of methods shows. It gives way to
	// WithOrder and WithMargins when combined with them.
	SeatsOnly
	// Full is every explanation.
	Full = WithOrder | WithMargins
)
