package engine

import (
	"strconv"
)

// This file sweeps a range of house sizes. Divisor methods are house
// monotone: the sequential procedure that hands out seat H+1 starts from the
// seats it handed out for a house of H. So one run of the procedure from the
// smallest house size to the largest gives every size in between, and the
// result at each size is exactly what [Allot] gives for that size, ties
// included. Largest-remainder methods are not house monotone (the Alabama
// paradox), so they are apportioned afresh at every size.

// MaxSweepCells is the largest number of results (house sizes times units)
// one sweep may hold.
const MaxSweepCells = 20_000_000

// A SweepResult holds the seats of every unit at every house size in a
// range, by one method.
type SweepResult struct {
	Method   Method
	From, To int // the house sizes swept, inclusive
	// Names and Populations describe the units, in input order; Excluded
	// marks the units below the threshold (they never hold seats).
	Names       []string
	Populations []Decimal
	Excluded    []bool
	// Sizes has one entry per house size, Sizes[k] for house size From+k.
	Sizes []SweepSize
}

// A SweepSize is the apportionment at one house size of a sweep: what
// [Allot] gives for that size, without the explanation.
type SweepSize struct {
	House int // the house size
	// Seats holds each unit's seats (outright, or given by the tie rule),
	// in input order; nil when Err is set.
	Seats []int
	// Ties lists the ties at this size, exactly as [Result] reports them;
	// Unassigned counts the seats an unsettled tie left open.
	Ties       []Tie
	Unassigned int
	// Err is set when this house size cannot be apportioned (too few seats
	// for the minimums, say); it is the error Allot returns for the size.
	Err error
}

// Size returns the entry for house size h, or nil when h is outside the
// sweep.
func (sw *SweepResult) Size(h int) *SweepSize {
	if h < sw.From || h > sw.To {
		return nil
	}
	return &sw.Sizes[h-sw.From]
}

// Sweep apportions the scenario at every house size from from to to
// (inclusive), by the scenario's method; the scenario's own Seats is
// ignored. Divisor methods run the sequential procedure once from the
// smallest house size to the largest; largest-remainder methods apportion
// each size afresh. At every size the seats, ties and unassigned seats are
// exactly those [Allot] reports for that size, and a size that Allot refuses
// carries Allot's error. Sweep itself returns an error when the scenario is
// invalid whatever the house size, when the range is empty or out of
// bounds, when it would hold more than [MaxSweepCells] results, or when no
// size in the range can be apportioned.
func Sweep(s *Scenario, from, to int) (*SweepResult, error) {
	if from < 1 || to > MaxSeats || from > to {
		return nil, scenarioError("seats", "the house sizes to sweep must run from at least 1 to at most "+
			strconv.Itoa(MaxSeats)+", lowest first; got "+strconv.Itoa(from)+" to "+strconv.Itoa(to))
	}
	sizes := to - from + 1
	if n := len(s.Units); n > 0 && sizes > MaxSweepCells/n {
		return nil, scenarioError("seats", strconv.Itoa(sizes)+" house sizes of "+strconv.Itoa(n)+
			" units is more than the limit of "+strconv.Itoa(MaxSweepCells)+" results in one sweep")
	}
	pr, err := prepareRange(s, from, to)
	if err != nil {
		return nil, err
	}
	n := pr.n()
	sw := &SweepResult{
		Method: pr.m, From: from, To: to,
		Names: pr.names, Populations: make([]Decimal, n), Excluded: make([]bool, n),
		Sizes: make([]SweepSize, sizes),
	}
	for i := range pr.pops {
		sw.Populations[i] = Decimal{Coef: pr.pops[i], Places: uint8(pr.places)}.trim()
		sw.Excluded[i] = !pr.eligible[i]
	}
	cells := make([]int, 0, sizes*n)
	record := func(h int, seats []int) []int {
		start := len(cells)
		cells = append(cells, seats...)
		return cells[start:len(cells):len(cells)]
	}
	for k := range sw.Sizes {
		sw.Sizes[k].House = from + k
	}
	if pr.m.IsDivisor() {
		pr.sweepDivisor(sw, record)
	} else {
		pr.sweepRemainder(sw, record)
	}
	return sw, nil
}

// sizeSide says on which side of the feasible house sizes an error from
// prepare lies: -1 when the house is too small for the minimums (or for a
// first seat each), +1 when the maximums cannot fill it, 0 when the error
// does not depend on the house size.
func sizeSide(err error) int {
	e, ok := err.(*Error)
	if !ok || e.Unit >= 0 {
		return 0
	}
	switch e.Field {
	case "min", "seats":
		return -1
	case "max":
		return +1
	}
	return 0
}

// prepareRange validates the scenario at some house size in [from, to] that
// can be apportioned. The house sizes that pass the feasibility check form
// one interval, so a search between the ends finds one when there is any.
func prepareRange(s *Scenario, from, to int) (*problem, error) {
	at := func(h int) (*problem, error) {
		c := *s
		c.Seats = h
		return prepare(&c)
	}
	pr, errTo := at(to)
	if errTo == nil {
		return pr, nil
	}
	sideTo := sizeSide(errTo)
	if sideTo <= 0 {
		// Too small even at the top (or invalid at any size).
		return nil, errTo
	}
	pr, errFrom := at(from)
	if errFrom == nil {
		return pr, nil
	}
	if sizeSide(errFrom) >= 0 {
		// Too large even at the bottom.
		return nil, errFrom
	}
	// Too small at from, too large at to: look in between.
	lo, hi := from, to
	for hi-lo > 1 {
		mid := lo + (hi-lo)/2
		pr, err := at(mid)
		if err == nil {
			return pr, nil
		}
		switch sizeSide(err) {
		case -1:
			lo = mid
		case +1:
			hi = mid
		default:
			return nil, err
		}
	}
	return nil, scenarioError("seats", "no house size from "+strconv.Itoa(from)+" to "+strconv.Itoa(to)+
		" can be apportioned: "+errFrom.Error()+"; and "+errTo.Error())
}

// feasibleAt reports the error Allot gives for house size h, if any, for the
// checks that depend on h alone.
func (pr *problem) feasibleAt(h int) error {
	q := *pr
	q.h = h
	return q.checkFeasible()
}

// sweepRemainder apportions every size afresh.
func (pr *problem) sweepRemainder(sw *SweepResult, record func(int, []int) []int) {
	for k := range sw.Sizes {
		z := &sw.Sizes[k]
		if z.Err = pr.feasibleAt(z.House); z.Err != nil {
			continue
		}
		q := *pr
		q.h = z.House
		o, err := q.run(false)
		if err != nil {
			z.Err = err
			continue
		}
		if o.tie != nil || o.lr.rounds > 1 {
			// Bounds or ties in play: take the ties exactly as Allot
			// reports them.
			res, err := q.allot(0)
			if err != nil {
				z.Err = err
				continue
			}
			z.Ties, z.Unassigned = res.Ties, res.Unassigned
			seats := make([]int, len(res.Units))
			for i := range res.Units {
				seats[i] = res.Units[i].Seats
			}
			z.Seats = record(z.House, seats)
			continue
		}
		z.Seats = record(z.House, o.seats)
	}
}

// sweepDivisor runs the divisor procedure's sequential form once, from the
// minimums up to the largest house size, and records the seats at every
// size in range, settling a tie at a size as the procedure does.
func (pr *problem) sweepDivisor(sw *SweepResult, record func(int, []int) []int) {
	n := pr.n()
	a := make([]int, n)
	given := 0
	for i := 0; i < n; i++ {
		if pr.eligible[i] {
			a[i] = pr.min[i]
			given += a[i]
		}
	}
	s := pr.newStepper(a, false, make([]int32, 0, n))
	var stuck error // set once no unit with people can take another seat
	house := given  // seats handed out so far
	for k := range sw.Sizes {
		z := &sw.Sizes[k]
		for house < z.House && stuck == nil {
			if _, ok := s.step(); !ok {
				stuck = errMaximums()
				break
			}
			house++
		}
		if z.Err = pr.feasibleAt(z.House); z.Err != nil {
			continue
		}
		if z.House < given {
			z.Err = errMinimums()
			continue
		}
		if stuck != nil {
			z.Err = stuck
			continue
		}
		if house == given || !s.tied() {
			z.Seats = record(z.House, a)
			continue
		}
		// The sequential form leaves the seats at the cut where settleCut
		// puts them, so a is the same afterwards.
		out := divisorOutcome{full: a}
		pr.settleCut(&out)
		z.Ties = []Tie{*out.tie}
		z.Seats = record(z.House, out.seats)
		for _, s := range z.Seats {
			z.Unassigned += s
		}
		z.Unassigned = z.House - z.Unassigned
	}
}
