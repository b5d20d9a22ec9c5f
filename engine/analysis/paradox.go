package analysis

import (
	"errors"
	"math/big"
	"strconv"
	"strings"

	"seatsmith/engine"
)

// A SeatChange is one unit's seats before and after a change.
type SeatChange struct {
	Unit          int // index in the scenario the change starts from
	Name          string
	Before, After int
}

func changeText(cs []SeatChange) string {
	parts := make([]string, len(cs))
	for k, c := range cs {
		parts[k] = c.Name + " (" + itoa(c.Before) + " → " + itoa(c.After) + ")"
	}
	return strings.Join(parts, ", ")
}

// An Alabama finding is one occurrence of the Alabama paradox: a unit holds
// fewer seats at house size To = From+1 than at From, although its quota
// p·H/P rises with the house size.
type Alabama struct {
	Method        engine.Method
	Unit          int
	Name          string
	From, To      int // the house sizes
	Before, After int // the unit's seats at From and at To
	// QuotaBefore and QuotaAfter are the unit's exact standard quotas at
	// From and To.
	QuotaBefore, QuotaAfter *big.Rat
	// Gainers are the units with more seats at To than at From.
	Gainers []SeatChange
	// Tied is set when the unit is in a tie at either size, so that one
	// of the two seat counts is its outright seats (or the tie rule's
	// draw) rather than a settled result.
	Tied bool
}

// Text says what happened, in numbers.
func (f *Alabama) Text() string {
	s := f.Method.Name() + ": " + f.Name + " has " + plural(f.Before, "seat") + " in a house of " + itoa(f.From) +
		" but " + itoa(f.After) + " in a house of " + itoa(f.To) + ", although its quota rises from " +
		Decimal(f.QuotaBefore) + " to " + Decimal(f.QuotaAfter)
	if len(f.Gainers) > 0 {
		s += "; gaining: " + changeText(f.Gainers)
	}
	if f.Tied {
		s += " (a tie is involved: see the ties at these sizes)"
	}
	return s + "."
}

func tiedAt(z *engine.SweepSize, i int) bool {
	for _, t := range z.Ties {
		for _, u := range t.Units {
			if u == i {
				return true
			}
		}
	}
	return false
}

// FindAlabama lists every Alabama paradox in a sweep: each unit and pair of
// neighbouring house sizes where the unit's seats fall as the house grows.
// Sizes the sweep could not apportion are skipped. Divisor methods never
// show one, except by a tie rule that draws lots afresh at every size.
func FindAlabama(sw *engine.SweepResult) []Alabama {
	var out []Alabama
	total := totalOf(sw.Populations, sw.Excluded)
	for k := 1; k < len(sw.Sizes); k++ {
		prev, cur := &sw.Sizes[k-1], &sw.Sizes[k]
		if prev.Err != nil || cur.Err != nil {
			continue
		}
		var gainers []SeatChange
		for i := range cur.Seats {
			if cur.Seats[i] > prev.Seats[i] {
				gainers = append(gainers, SeatChange{i, sw.Names[i], prev.Seats[i], cur.Seats[i]})
			}
		}
		for i := range cur.Seats {
			if cur.Seats[i] >= prev.Seats[i] {
				continue
			}
			out = append(out, Alabama{
				Method: sw.Method, Unit: i, Name: sw.Names[i], From: prev.House, To: cur.House,
				Before: prev.Seats[i], After: cur.Seats[i],
				QuotaBefore: quotaOf(sw.Populations[i], total, prev.House, sw.Excluded[i]),
				QuotaAfter:  quotaOf(sw.Populations[i], total, cur.House, sw.Excluded[i]),
				Gainers:     gainers,
				Tied:        tiedAt(prev, i) || tiedAt(cur, i),
			})
		}
	}
	return out
}

// A QuotaViolation is a unit whose seats lie outside its lower and upper
// quota.
type QuotaViolation struct {
	Method engine.Method
	House  int
	Unit   int
	Name   string
	Seats  int
	Quota  *big.Rat
	// Lower and Upper are floor and ceiling of Quota.
	Lower, Upper int
	// Bounds is set when the minimums or maximums cause the violation:
	// apportioned by the same method at the same size without them, the
	// unit's seats would lie within its quota. A bound that holds a unit
	// where the method alone would put it (Adams's first seat for every
	// unit, say, against a minimum of one) does not count.
	Bounds bool
}

// Above reports whether the seats exceed the upper quota (otherwise they
// fall below the lower quota).
func (v *QuotaViolation) Above() bool { return v.Seats > v.Upper }

// Text says what happened, in numbers, naming the method.
func (v *QuotaViolation) Text() string {
	t := v.SizeText(true)
	return v.Method.Name() + ", h" + t[1:]
}

// SizeText says what happened, in numbers, without naming the method:
// "House of 40: Orlen gets 12 seats, below its lower quota 13 (quota
// 13.142784)." bounds chooses whether it says when the bounds cause the
// violation.
func (v *QuotaViolation) SizeText(bounds bool) string {
	s := "House of " + itoa(v.House) + ": " + v.Name + " gets " + plural(v.Seats, "seat") + ", "
	if v.Above() {
		s += "above its upper quota " + itoa(v.Upper)
	} else {
		s += "below its lower quota " + itoa(v.Lower)
	}
	s += " (quota " + Decimal(v.Quota) + ")"
	if bounds && v.Bounds {
		s += "; the minimums or maximums cause it: without them it would be within quota"
	}
	return s + "."
}

// FindQuotaViolations lists every unit at every size of a sweep whose seats
// break quota. Jefferson can exceed the upper quota of large units and
// Adams fall below the lower quota of large units; Webster, Dean and
// Huntington–Hill can break it either way; Hamilton never does without
// bounds. s is the swept scenario: when it has minimums or maximums, the
// sizes with a violation are apportioned again without them, to tell
// which violations the bounds cause (see [QuotaViolation.Bounds]).
func FindQuotaViolations(sw *engine.SweepResult, s *engine.Scenario) []QuotaViolation {
	var out []QuotaViolation
	total := totalOf(sw.Populations, sw.Excluded)
	qt := newQuotaTest(sw.Populations, sw.Excluded)
	for k := range sw.Sizes {
		z := &sw.Sizes[k]
		if z.Err != nil {
			continue
		}
		for i, a := range z.Seats {
			if qt.within(i, a, z.House) {
				continue
			}
			q := quotaOf(sw.Populations[i], total, z.House, sw.Excluded[i])
			l, u := floorCeil(q)
			out = append(out, QuotaViolation{sw.Method, z.House, i, sw.Names[i], a, q, l, u, false})
		}
	}
	if len(out) > 0 && s.HasBounds() {
		markBounds(out, sw, s)
	}
	return out
}

// A quotaTest tells whether a unit's seats lie within its quota p·h/P
// without making the quota: with every population written with the same
// number of decimal places as a whole number, a < floor(q) exactly when
// (a+1)·P ≤ p·h, and a > ceil(q) exactly when (a−1)·P ≥ p·h. It reuses
// its numbers, so that a sweep of millions of sizes allocates only for
// the violations it finds.
type quotaTest struct {
	pops     []*big.Int // nil for an excluded unit
	total    big.Int
	ph, side big.Int
}

func newQuotaTest(pops []engine.Decimal, excluded []bool) *quotaTest {
	places := 0
	for _, p := range pops {
		places = max(places, int(p.Places))
	}
	t := &quotaTest{pops: make([]*big.Int, len(pops))}
	ten := big.NewInt(10)
	for i, p := range pops {
		if excluded != nil && excluded[i] {
			continue
		}
		x := new(big.Int).SetUint64(p.Coef)
		x.Mul(x, new(big.Int).Exp(ten, big.NewInt(int64(places-int(p.Places))), nil))
		t.pops[i] = x
		t.total.Add(&t.total, x)
	}
	return t
}

// within reports whether a seats of unit i lie within its quota at house
// size h (an excluded unit's quota is zero).
func (t *quotaTest) within(i, a, h int) bool {
	if t.pops[i] == nil || t.total.Sign() == 0 {
		return a == 0
	}
	t.ph.SetInt64(int64(h))
	t.ph.Mul(&t.ph, t.pops[i])
	t.side.SetInt64(int64(a + 1))
	t.side.Mul(&t.side, &t.total)
	if t.side.Cmp(&t.ph) <= 0 {
		return false // below the lower quota
	}
	t.side.SetInt64(int64(a - 1))
	t.side.Mul(&t.side, &t.total)
	return t.side.Cmp(&t.ph) < 0 // not above the upper quota
}

// markBounds sets Bounds on the violations that the bounds of s cause:
// those whose unit, apportioned without bounds at the same size, is within
// its quota (a unit in a tie there counts as within when either way of
// settling it is).
func markBounds(vs []QuotaViolation, sw *engine.SweepResult, s *engine.Scenario) {
	t := *s
	t.Method, t.Min, t.Max = sw.Method, 0, 0
	t.Units = make([]engine.Unit, len(s.Units))
	for i, u := range s.Units {
		t.Units[i] = engine.Unit{Name: u.Name, Population: u.Population}
	}
	free, err := engine.Sweep(&t, vs[0].House, vs[len(vs)-1].House)
	if err != nil {
		return
	}
	for j := range vs {
		v := &vs[j]
		z := &free.Sizes[v.House-free.From]
		if z.Err != nil {
			continue
		}
		a := z.Seats[v.Unit]
		within := a >= v.Lower && a <= v.Upper
		if tiedAt(z, v.Unit) {
			within = within || (a+1 >= v.Lower && a+1 <= v.Upper)
		}
		v.Bounds = within
	}
}

// A Population finding is one occurrence of the population paradox between
// two population sets at the same house size: unit Loser grew at least as
// fast as unit Gainer (by growth rate p'/p - 1) yet lost a seat while
// Gainer gained one.
type Population struct {
	Method engine.Method
	House  int
	Loser  PopulationChange
	Gainer PopulationChange
	// Faster is set when the loser's growth rate is strictly greater;
	// otherwise the two rates are equal.
	Faster bool
	// Tied is set when either unit is in a tie in either apportionment.
	Tied bool
}

// A PopulationChange is one unit's population and seats before and after.
type PopulationChange struct {
	Unit          int
	Name          string
	From, To      engine.Decimal // populations
	Growth        *big.Rat       // To/From - 1, exactly
	Before, After int            // seats
}

// Text says what happened, in numbers.
func (f *Population) Text() string {
	how := "faster than"
	if !f.Faster {
		how = "at the same rate as"
	}
	l, g := &f.Loser, &f.Gainer
	s := f.Method.Name() + ", house of " + itoa(f.House) + ": " + l.Name + " grew " + Percent(l.Growth) +
		" (" + l.From.String() + " → " + l.To.String() + "), " + how + " " + g.Name + " at " + Percent(g.Growth) +
		" (" + g.From.String() + " → " + g.To.String() + "), yet " + l.Name + " loses a seat (" + itoa(l.Before) + " → " + itoa(l.After) +
		") while " + g.Name + " gains one (" + itoa(g.Before) + " → " + itoa(g.After) + ")"
	if f.Tied {
		s += " (a tie is involved)"
	}
	return s + "."
}

// PopulationResult is the outcome of [FindPopulation].
type PopulationResult struct {
	Before, After *engine.Result
	Findings      []Population
}

// FindPopulation apportions s with its populations and again with the
// populations of later (matched by unit name; later's other settings are
// not used), and lists every pair of units where one grew at least as fast
// as the other but lost a seat to it. Growth rates are compared exactly by
// cross-multiplication. Pairs where either unit had no population before
// are skipped: their growth rate is undefined. Divisor methods are
// population monotone and never show the paradox; Hamilton can.
func FindPopulation(s, later *engine.Scenario) (*PopulationResult, error) {
	if len(later.Units) != len(s.Units) {
		return nil, errors.New("the later population set has " + itoa(len(later.Units)) + " units, the first " + itoa(len(s.Units)))
	}
	byName := map[string]int{}
	for j, u := range later.Units {
		byName[strings.TrimSpace(u.Name)] = j
	}
	t := *s
	t.Units = append([]engine.Unit(nil), s.Units...)
	for i, u := range s.Units {
		j, ok := byName[strings.TrimSpace(u.Name)]
		if !ok {
			return nil, errors.New("unit " + strconv.Quote(u.Name) + " is missing from the later population set")
		}
		t.Units[i].Population = later.Units[j].Population
	}
	before, err := engine.Allot(s, 0)
	if err != nil {
		return nil, err
	}
	after, err := engine.Allot(&t, 0)
	if err != nil {
		return nil, err
	}
	pr := &PopulationResult{Before: before, After: after}
	n := len(s.Units)
	for i := 0; i < n; i++ {
		bi, ai := before.Units[i].Seats, after.Units[i].Seats
		if ai >= bi || s.Units[i].Population.IsZero() {
			continue
		}
		for j := 0; j < n; j++ {
			bj, aj := before.Units[j].Seats, after.Units[j].Seats
			if j == i || aj <= bj || s.Units[j].Population.IsZero() {
				continue
			}
			// p'_i/p_i against p'_j/p_j.
			c := new(big.Rat).Mul(ratOf(t.Units[i].Population), ratOf(s.Units[j].Population)).Cmp(
				new(big.Rat).Mul(ratOf(t.Units[j].Population), ratOf(s.Units[i].Population)))
			if c < 0 {
				continue
			}
			pr.Findings = append(pr.Findings, Population{
				Method: s.Method, House: s.Seats,
				Loser:  popChange(i, s, &t, bi, ai),
				Gainer: popChange(j, s, &t, bj, aj),
				Faster: c > 0,
				Tied:   before.Units[i].Tied || after.Units[i].Tied || before.Units[j].Tied || after.Units[j].Tied,
			})
		}
	}
	return pr, nil
}

func popChange(i int, s, t *engine.Scenario, before, after int) PopulationChange {
	from, to := s.Units[i].Population, t.Units[i].Population
	g := new(big.Rat).Quo(ratOf(to), ratOf(from))
	g.Sub(g, big.NewRat(1, 1))
	return PopulationChange{Unit: i, Name: strings.TrimSpace(s.Units[i].Name), From: from, To: to, Growth: g, Before: before, After: after}
}

// NewStates is the outcome of admitting a new unit with its fair share of
// added seats ([FindNewStates]).
type NewStates struct {
	Method engine.Method
	Name   string         // the new unit
	People engine.Decimal // its population
	// House and NewHouse are the house sizes before and after; Added is
	// NewHouse - House, the seats added for the new unit.
	House, NewHouse, Added int
	// FairShare is the new unit's exact quota at the old standard divisor
	// P/H: p·H/P. Added is it rounded to the nearest whole number (halves
	// up) unless chosen by the caller.
	FairShare *big.Rat
	// NewSeats is what the new unit receives in the larger house.
	NewSeats int
	Before   *engine.Result // the old units in the old house
	After    *engine.Result // every unit in the new house, the new one last
	// Changes lists the old units whose seats differ: the paradox when not
	// empty.
	Changes []SeatChange
}

// Paradox reports whether admitting the unit changed the other units'
// seats.
func (r *NewStates) Paradox() bool { return len(r.Changes) > 0 }

// Text says what happened, in numbers. When a tie leaves seats
// unassigned in either house, the seats compared are those held outright
// and the text says so: settling the tie may change the finding.
func (r *NewStates) Text() string {
	s := r.Method.Name() + ": admitting " + r.Name + " (population " + r.People.String() + ", fair share " +
		Decimal(r.FairShare) + " seats at the old standard divisor) with " + plural(r.Added, "added seat") +
		" raises the house from " + itoa(r.House) + " to " + itoa(r.NewHouse) + "; " + r.Name + " receives " + plural(r.NewSeats, "seat")
	var tie []string
	if r.Before.Unassigned > 0 {
		tie = append(tie, plural(r.Before.Unassigned, "seat")+" in the house of "+itoa(r.House))
	}
	if r.After.Unassigned > 0 {
		tie = append(tie, plural(r.After.Unassigned, "seat")+" in the house of "+itoa(r.NewHouse))
	}
	tail := ""
	if len(tie) > 0 {
		tail = "; a tie leaves " + strings.Join(tie, " and ") + " unassigned, so these are the seats held outright and settling the tie may change them"
	}
	switch {
	case !r.Paradox() && tail == "":
		return s + ", and no other unit's seats change."
	case !r.Paradox():
		return s + ", and no other unit's seats held outright change" + tail + "."
	}
	return s + ", and the other units' seats change: " + changeText(r.Changes) + " (the new-states paradox)" + tail + "."
}

// FairShare returns the whole number nearest to p·H/P (halves round up)
// for a unit of population p joining scenario s, and the exact p·H/P.
func FairShare(s *engine.Scenario, p engine.Decimal) (int, *big.Rat) {
	pops := make([]engine.Decimal, len(s.Units))
	for i, u := range s.Units {
		pops[i] = u.Population
	}
	q := quotaOf(p, totalOf(pops, nil), s.Seats, false)
	twice := new(big.Rat).Mul(q, big.NewRat(2, 1))
	twice.Add(twice, big.NewRat(1, 1))
	k := new(big.Int).Quo(twice.Num(), twice.Denom())
	k.Quo(k, big.NewInt(2))
	return int(k.Int64()), q
}

// FindNewStates apportions s, then admits unit u with added seats (its
// fair share, see [FairShare], when added < 0) and apportions again, and
// reports which of the old units' seats changed. The standard divisor is
// taken over all units of s (a threshold, if any, still applies in both
// apportionments).
func FindNewStates(s *engine.Scenario, u engine.Unit, added int) (*NewStates, error) {
	share, exact := FairShare(s, u.Population)
	if added < 0 {
		added = share
	}
	before, err := engine.Allot(s, 0)
	if err != nil {
		return nil, err
	}
	t := *s
	t.Units = append(append([]engine.Unit(nil), s.Units...), u)
	t.Seats = s.Seats + added
	after, err := engine.Allot(&t, 0)
	if err != nil {
		return nil, err
	}
	r := &NewStates{
		Method: s.Method, Name: strings.TrimSpace(u.Name), People: u.Population,
		House: s.Seats, NewHouse: t.Seats, Added: added, FairShare: exact,
		NewSeats: after.Units[len(s.Units)].Seats, Before: before, After: after,
	}
	for i := range s.Units {
		if b, a := before.Units[i].Seats, after.Units[i].Seats; a != b {
			r.Changes = append(r.Changes, SeatChange{i, before.Units[i].Name, b, a})
		}
	}
	return r, nil
}
