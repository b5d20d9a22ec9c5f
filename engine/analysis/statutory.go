package analysis

import (
	"math/big"
	"math/rand/v2"
	"strconv"

	"seatsmith/engine"
)

// Statutory house rules: a house size that follows from a fixed ratio of
// people to seats, and base seats for every unit with the rest of the house
// apportioned on top.

// A FixedRatio is an apportionment at a fixed divisor: one seat per Ratio
// people, every unit's seats the method's rounding of its population over
// the ratio (within its minimum and maximum); the house size is the result.
type FixedRatio struct {
	Method engine.Method
	Ratio  engine.Decimal
	// Seats is the house size: the seats the units hold outright (or were
	// given by the tie rule). Unassigned counts the seats left open where a
	// quotient sits exactly on a signpost and no rule settled it.
	Seats      int
	Unassigned int
	Tie        engine.TieRule
	Units      []RatioUnit
}

// A RatioUnit is one unit's part of a FixedRatio.
type RatioUnit struct {
	Name       string
	Population engine.Decimal
	// Quotient is population / ratio, exactly (a decimal to six places
	// unless exact, see Decimal).
	Quotient string
	// Rounded is the method's rounding of the quotient (the lower of the
	// two at a tie); Seats what the unit holds after its bounds and any
	// tie rule.
	Rounded int
	Seats   int
	// Lower and Upper are the signposts the quotient lies between (Upper
	// empty above the last one needed), written as the method writes them.
	Lower, Upper string
	// Min and Max are the unit's bounds (Max 0: no cap); AtMin and AtMax
	// say whether one holds it.
	Min, Max     int
	AtMin, AtMax bool
	// Tied: the quotient sits exactly on the signpost Upper, so the
	// rounding could give Rounded or Rounded+1; Won says which the tie
	// rule chose.
	Tied, Won bool
}

// ApplyRatio apportions the scenario's units at one seat per ratio people
// by the scenario's method (a divisor method), with its minimums and
// maximums; the scenario's house size is ignored. Comparisons are exact.
// A quotient exactly on a signpost is a tie: reported, and settled only by
// lot (TieByLot draws each tied unit's seat from the seed); input order
// has no meaning here and is refused.
func ApplyRatio(s *engine.Scenario, ratio engine.Decimal) (*FixedRatio, error) {
	m := s.Method
	if !m.IsDivisor() {
		return nil, &engine.Error{Unit: -1, Field: "method", Msg: "a fixed ratio rounds at a divisor, so it needs a divisor method, not " + m.Name()}
	}
	if ratio.IsZero() {
		return nil, &engine.Error{Unit: -1, Field: "ratio", Msg: "the ratio must be more than zero people per seat"}
	}
	if !s.Threshold.IsZero() {
		return nil, &engine.Error{Unit: -1, Field: "threshold", Msg: "a threshold has no share of a house that a fixed ratio has not yet made; leave it out"}
	}
	if s.Tie.Kind == engine.TieByOrder {
		return nil, &engine.Error{Unit: -1, Field: "tie", Msg: "a tie under a fixed ratio is between rounding up and down, not between units, so input order cannot settle it: use lot:SEED or report it"}
	}
	if len(s.Units) == 0 {
		return nil, &engine.Error{Unit: -1, Field: "units", Msg: "no units"}
	}
	var draw *rand.Rand
	if s.Tie.Kind == engine.TieByLot {
		draw = rand.New(rand.NewPCG(s.Tie.Seed, 0x5ea75a1d))
	}
	R := ratOf(ratio)
	f := &FixedRatio{Method: m, Ratio: ratio, Tie: s.Tie}
	limit := big.NewRat(engine.MaxSeats, 1)
	for k, u := range s.Units {
		p := ratOf(u.Population)
		q := new(big.Rat).Quo(p, R)
		if q.Cmp(limit) > 0 {
			// Refused before any counting: the seats would pass the limit
			// (and a float estimate this large no longer fits an int).
			return nil, &engine.Error{Unit: k, Name: u.Name, Field: "population", Msg: "alone would have about " + Decimal(q) +
				" seats at one seat per " + ratio.String() + " people, more than the limit of " + strconv.Itoa(engine.MaxSeats) + " seats a house"}
		}
		// a: the least seats with q ≤ s(a); q = s(a) is a tie.
		est, _ := q.Float64()
		a := max(0, int(est)-2)
		for cmpSignpost(m, q, a) > 0 {
			a++
		}
		ru := RatioUnit{Name: u.Name, Population: u.Population, Quotient: Decimal(q), Rounded: a}
		if p.Sign() > 0 && cmpSignpost(m, q, a) == 0 {
			// On the signpost between a and a+1.
			ru.Tied = true
		}
		ru.Upper = m.SignpostText(a)
		if a > 0 {
			ru.Lower = m.SignpostText(a - 1)
		}
		if ru.Tied {
			ru.Lower, ru.Upper = ru.Upper, ""
		}
		lo, hi := s.Min, s.Max
		if u.Min != nil {
			lo = *u.Min
		}
		if u.Max != nil {
			hi = *u.Max
		}
		if hi > 0 && hi < lo {
			return nil, &engine.Error{Unit: k, Name: u.Name, Field: "max", Msg: "its maximum is below its minimum"}
		}
		ru.Min, ru.Max = lo, hi
		seats := a
		if ru.Tied && draw != nil && draw.IntN(2) == 1 {
			seats, ru.Won = a+1, true
		}
		// open: the seat between Rounded and Rounded+1 is left open.
		open := ru.Tied && draw == nil
		if seats < lo {
			seats, ru.AtMin, open = lo, true, false
		}
		if hi > 0 && seats >= hi {
			ru.AtMax = seats > hi || open
			seats, open = hi, false
		}
		ru.Seats = seats
		if open {
			f.Unassigned++
		}
		f.Seats += seats
		if f.Seats > engine.MaxSeats {
			return nil, &engine.Error{Unit: -1, Field: "seats", Msg: "the house would have more than the limit of " + strconv.Itoa(engine.MaxSeats) + " seats"}
		}
		f.Units = append(f.Units, ru)
	}
	return f, nil
}

// Text says how the house size came about.
func (f *FixedRatio) Text() string {
	s := "One seat per " + f.Ratio.String() + " people, each unit's population over " + f.Ratio.String() +
		" rounded by " + f.Method.Name() + ": a house of " + strconv.Itoa(f.Seats) + " seats."
	if f.Unassigned > 0 {
		s += " " + plural(f.Unassigned, "quotient") + " exactly on a signpost, where the rounding could go either way: the statute must say which (" + plural(f.Unassigned, "seat") + " left open)."
	}
	return s
}

// BaseSeats is an apportionment that gives every unit a number of base
// seats and apportions the rest of the house among the units by the
// method.
type BaseSeats struct {
	Base  int
	Seats int // the house size
	// Rest is the apportionment of the seats beyond the base seats, with
	// the scenario's method, bounds, threshold and tie rule.
	Rest  *engine.Result
	Units []BaseUnit
}

// A BaseUnit is one unit's part of a BaseSeats.
type BaseUnit struct {
	Name         string
	Population   engine.Decimal
	Base         int
	Proportional int // its seats in Rest
	Seats        int // Base + Proportional
}

// ApplyBase gives every unit base seats and apportions the scenario's
// house size less the base seats by the scenario's method; the scenario's
// minimums, maximums and threshold apply to that proportional part.
func ApplyBase(s *engine.Scenario, base int) (*BaseSeats, error) {
	if base < 0 {
		return nil, &engine.Error{Unit: -1, Field: "base", Msg: "the base seats cannot be negative"}
	}
	n := len(s.Units)
	if n == 0 {
		return nil, &engine.Error{Unit: -1, Field: "units", Msg: "no units"}
	}
	if base > 0 && s.Seats/base < n {
		return nil, &engine.Error{Unit: -1, Field: "seats", Msg: strconv.Itoa(n) + " units with " + strconv.Itoa(base) + " base seats each need " + strconv.Itoa(n*base) + " seats, more than the house size " + strconv.Itoa(s.Seats)}
	}
	rest := *s
	rest.Seats = s.Seats - n*base
	b := &BaseSeats{Base: base, Seats: s.Seats}
	if rest.Seats == 0 {
		need := 0
		for _, u := range s.Units {
			lo := s.Min
			if u.Min != nil {
				lo = *u.Min
			}
			need += lo
		}
		if need > 0 {
			return nil, &engine.Error{Unit: -1, Field: "min", Msg: "the base seats fill the house, leaving none for the minimums, which need " + plural(need, "seat") + " beyond them"}
		}
	}
	if rest.Seats > 0 {
		res, err := engine.Allot(&rest, 0)
		if err != nil {
			if ee, ok := err.(*engine.Error); ok {
				e := *ee
				e.Msg = "in the apportionment of the " + plural(rest.Seats, "seat") + " beyond the base seats: " + ee.Msg
				return nil, &e
			}
			return nil, err
		}
		b.Rest = res
	}
	for k, u := range s.Units {
		bu := BaseUnit{Name: u.Name, Population: u.Population, Base: base}
		if b.Rest != nil {
			bu.Proportional = b.Rest.Units[k].Seats
		}
		bu.Seats = base + bu.Proportional
		b.Units = append(b.Units, bu)
	}
	return b, nil
}

// Text says how the house was divided.
func (b *BaseSeats) Text() string {
	n := len(b.Units)
	s := "Every unit first receives " + plural(b.Base, "base seat") + " (" + strconv.Itoa(n*b.Base) + " in all); the other " +
		strconv.Itoa(b.Seats-n*b.Base) + " seats are apportioned"
	if b.Rest != nil {
		s += " by " + b.Rest.Method.Name()
		if b.Rest.Unassigned > 0 {
			s += " (" + plural(b.Rest.Unassigned, "seat") + " left open by a tie)"
		}
	}
	return s + "."
}

// cmpSignpost compares q ≥ 0 with the method's signpost s(a), exactly
// (Huntington–Hill through squares).
func cmpSignpost(m engine.Method, q *big.Rat, a int) int {
	n, d, sq, _ := m.Signpost(a)
	sp := new(big.Rat).SetFrac(new(big.Int).SetUint64(n), new(big.Int).SetUint64(d))
	if sq {
		return new(big.Rat).Mul(q, q).Cmp(sp)
	}
	return q.Cmp(sp)
}
