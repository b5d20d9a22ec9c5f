package engine

import (
	"errors"
	"math/big"
	"strconv"
	"strings"
)

// Limits on the size of a scenario. Larger inputs are refused as absurd.
const (
	MaxSeats = 1_000_000_000 // largest house size
	MaxUnits = 10_000_000    // most units in one scenario
)

// A Unit is one claimant: a state, district, party or school.
type Unit struct {
	Name       string
	Population Decimal
	// Min and Max override the scenario's default bounds for this unit
	// when set.
	Min, Max *int
}

// A Scenario is one apportionment problem.
type Scenario struct {
	Units  []Unit
	Seats  int    // the house size H
	Method Method // the apportionment method

	// Min is the default minimum number of seats per unit (0 for none).
	Min int
	// Max is the default maximum number of seats per unit; 0 means no cap.
	Max int
	// Threshold excludes every unit whose share of the total population is
	// below it (for example 0.05 for five percent). Zero means none.
	// Excluded units receive no seats, whatever their minimum.
	Threshold Decimal
	// Tie says how ties at the cut are settled; the zero TieRule reports
	// them and leaves the contested seats unassigned.
	Tie TieRule
}

// HasBounds reports whether some unit of s has a minimum above zero or a
// maximum, its own or the scenario's.
func (s *Scenario) HasBounds() bool {
	if s.Min > 0 || s.Max > 0 {
		return true
	}
	for _, u := range s.Units {
		if (u.Min != nil && *u.Min > 0) || u.Max != nil {
			return true
		}
	}
	return false
}

// An Error describes what is wrong with a scenario. Unit is the index of the
// unit at fault, or -1 when the error concerns the scenario as a whole; Field
// names the offending field ("population", "name", "min", "max", "seats",
// "method", "threshold", "tie", "units").
type Error struct {
	Unit  int
	Name  string // the unit's name, when Unit >= 0
	Field string
	Msg   string
}

func (e *Error) Error() string {
	var b strings.Builder
	if e.Unit >= 0 {
		b.WriteString("unit ")
		b.WriteString(strconv.Itoa(e.Unit + 1))
		if e.Name != "" {
			b.WriteString(" (")
			b.WriteString(strconv.Quote(e.Name))
			b.WriteString(")")
		}
		b.WriteString(": ")
	}
	if e.Field != "" {
		b.WriteString(e.Field)
		b.WriteString(": ")
	}
	b.WriteString(e.Msg)
	return b.String()
}

// ErrorMsg is err's message without its place: an *Error's Msg, or else
// err's text.
func ErrorMsg(err error) string {
	var e *Error
	if errors.As(err, &e) {
		return e.Msg
	}
	return err.Error()
}

func scenarioError(field, msg string) *Error { return &Error{Unit: -1, Field: field, Msg: msg} }

func unitError(i int, name, field, msg string) *Error {
	return &Error{Unit: i, Name: name, Field: field, Msg: msg}
}

// noCap stands for "no maximum".
const noCap = int(^uint(0) >> 1)

// problem is a validated scenario in the form the procedures work on.
type problem struct {
	m         Method
	h         int
	names     []string
	pops      []uint64 // populations scaled to places decimal places
	places    int
	min, max  []int  // bounds; max is noCap when uncapped
	eligible  []bool // false when excluded by the threshold
	tie       TieRule
	threshold Decimal
	quotas    *quotaMemo // nil but in AllotMethods
	trace     *lrTrace   // nil but in the margins' searches
	// probe is set in the margins' copies of the problem, whose
	// apportionments only count seats: the passes leave out their quotas
	// as rationals, which only the explanation reads.
	probe bool
}

func (pr *problem) n() int { return len(pr.pops) }

// prepare validates s and converts it to a problem.
func prepare(s *Scenario) (*problem, error) {
	if !s.Method.Valid() {
		return nil, scenarioError("method", "no method chosen; known: "+strings.Join(MethodIDs(), ", "))
	}
	if s.Seats <= 0 {
		return nil, scenarioError("seats", "the house size must be at least 1, not "+strconv.Itoa(s.Seats))
	}
	if s.Seats > MaxSeats {
		return nil, scenarioError("seats", "the house size "+strconv.Itoa(s.Seats)+" is larger than the limit of "+strconv.Itoa(MaxSeats))
	}
	n := len(s.Units)
	if n == 0 {
		return nil, scenarioError("units", "no units")
	}
	if n > MaxUnits {
		return nil, scenarioError("units", strconv.Itoa(n)+" units is more than the limit of "+strconv.Itoa(MaxUnits))
	}
	if s.Min < 0 || s.Min > MaxSeats {
		return nil, scenarioError("min", "the default minimum must be between 0 and the house size")
	}
	if s.Max < 0 || s.Max > MaxSeats {
		return nil, scenarioError("max", "the default maximum must be between 0 (no cap) and the house size")
	}
	if err := s.Tie.validate(); err != nil {
		return nil, err
	}
	one := Decimal{Coef: 1}
	if s.Threshold.Cmp(one) > 0 {
		return nil, scenarioError("threshold", "a threshold is a share of the total between 0 and 1, not "+s.Threshold.String())
	}
	pr := &problem{
		m: s.Method, h: s.Seats, tie: s.Tie, threshold: s.Threshold,
		names: make([]string, n), pops: make([]uint64, n),
		min: make([]int, n), max: make([]int, n), eligible: make([]bool, n),
	}
	seen := make(map[string]int, n)
	for i, u := range s.Units {
		name := strings.TrimSpace(u.Name)
		if name == "" {
			return nil, unitError(i, "", "name", "empty")
		}
		if j, dup := seen[name]; dup {
			return nil, unitError(i, name, "name", "the same name as unit "+strconv.Itoa(j+1))
		}
		seen[name] = i
		pr.names[i] = name
		if int(u.Population.Places) > pr.places {
			pr.places = int(u.Population.Places)
		}
		if u.Population.Places > MaxPlaces || u.Population.Coef > MaxCoefficient {
			return nil, unitError(i, name, "population", "out of range")
		}
		lo, hi := s.Min, noCap
		if s.Max > 0 {
			hi = s.Max
		}
		if u.Min != nil {
			lo = *u.Min
		}
		if u.Max != nil {
			hi = *u.Max
		}
		if lo < 0 || lo > MaxSeats {
			return nil, unitError(i, name, "min", "must be between 0 and the house size, not "+strconv.Itoa(lo))
		}
		if hi < 0 || (hi > MaxSeats && hi != noCap) {
			return nil, unitError(i, name, "max", "must be between 0 and the house size, not "+strconv.Itoa(hi))
		}
		if lo > hi {
			return nil, unitError(i, name, "min", "the minimum "+strconv.Itoa(lo)+" is above the maximum "+strconv.Itoa(hi))
		}
		pr.min[i], pr.max[i] = lo, hi
	}
	for i, u := range s.Units {
		scale := pow10(pr.places - int(u.Population.Places))
		hi, lo := mulWide(u.Population.Coef, scale)
		if hi != 0 || lo > MaxCoefficient {
			return nil, unitError(i, pr.names[i], "population",
				u.Population.String()+" has too many digits once every population is written with "+strconv.Itoa(pr.places)+" decimal places (at most 18 digits)")
		}
		pr.pops[i] = lo
	}
	total := sum128(pr.pops)
	if total.hi == 0 && total.lo == 0 {
		return nil, scenarioError("population", "every unit has a population of zero")
	}
	// Threshold: excluded when p_i/P < c/10^k.
	th := s.Threshold
	for i, p := range pr.pops {
		pr.eligible[i] = th.IsZero() || !belowShare(p, total, th)
	}
	if err := pr.checkFeasible(); err != nil {
		return nil, err
	}
	return pr, nil
}

// belowShare reports whether p/total < th exactly.
func belowShare(p uint64, total u128, th Decimal) bool {
	left, ok1 := mul128(p, pow10(int(th.Places))).mulSmall(1)
	right, ok2 := total.mulSmall(th.Coef)
	if ok1 && ok2 && !forceBig {
		return left.cmp(right) < 0
	}
	l := new(big.Int).Mul(bigU(p), bigU(pow10(int(th.Places))))
	r := new(big.Int).Mul(total.big(), bigU(th.Coef))
	return l.Cmp(r) < 0
}

// checkFeasible refuses bounds and house sizes that no apportionment meets.
func (pr *problem) checkFeasible() error { return pr.checkFeasibleWith(-1, 0) }

// checkFeasibleWith is checkFeasible with unit u's population taken as p
// (none when u < 0), the units taking part as they are.
func (pr *problem) checkFeasibleWith(u int, p uint64) error {
	var sumMin, sumCapPopulated uint64
	populated, firstSeat := 0, uint64(0)
	anyEligible := false
	for i, pi := range pr.pops {
		if !pr.eligible[i] {
			continue
		}
		if i == u {
			pi = p
		}
		anyEligible = true
		lo := uint64(pr.min[i])
		sumMin += lo
		if pi > 0 {
			populated++
			if pr.max[i] == noCap {
				sumCapPopulated = MaxSeats + 1
			} else if sumCapPopulated <= MaxSeats {
				sumCapPopulated += uint64(pr.max[i])
			}
			if pr.m.ZeroFirstSignpost() && lo == 0 && pr.max[i] > 0 {
				lo = 1
			}
		} else {
			sumCapPopulated += lo
		}
		firstSeat += lo
	}
	h := uint64(pr.h)
	if !anyEligible {
		return scenarioError("threshold", "the threshold excludes every unit")
	}
	if populated == 0 {
		return scenarioError("population", "every unit taking part has a population of zero")
	}
	if sumMin > h {
		return scenarioError("min", "the minimums add up to "+strconv.FormatUint(sumMin, 10)+" seats, more than the house size "+strconv.Itoa(pr.h))
	}
	if pr.m.ZeroFirstSignpost() && firstSeat > h {
		return scenarioError("seats", pr.m.Name()+" gives every unit with people a seat before any unit gets two: "+
			strconv.Itoa(populated)+" units with people (and the minimums) need "+strconv.FormatUint(firstSeat, 10)+
			" seats, more than the house size "+strconv.Itoa(pr.h))
	}
	if sumCapPopulated < h {
		return scenarioError("max", "the maximums allow units with people only "+strconv.FormatUint(sumCapPopulated, 10)+
			" seats in all, fewer than the house size "+strconv.Itoa(pr.h))
	}
	return nil
}
