package projection

import (
	"math"

	"seatsmith/engine"
)

// A Summary is what a study found.
type Summary struct {
	Title   string
	Method  engine.Method
	Seats   int
	Target  *Date // nil when the latest counts were not projected
	Growth  Growth
	Fit     Fit
	Error   Distribution
	RSE     float64 // the default relative standard error
	Seed    uint64
	Contest int

	// Draws is the number of draws made; Apportioned the draws that could
	// be apportioned (the rest, Failed, had populations for which no
	// apportionment exists, such as a unit drawn to zero under bounds that
	// need it). Shares are of the apportioned draws. Tied counts the draws
	// with a tie at the cut, Unassigned those in which a tie left seats
	// unassigned (the scenario has no tie rule): in those, each unit's
	// seats are the seats it held outright.
	Draws                                 int
	Apportioned, Failed, Tied, Unassigned int64

	// Baseline apportions the latest counts; gains and losses are measured
	// against it. Central apportions the central projection (the latest
	// counts again when there is no target).
	Baseline, Central *engine.Result
	Units             []UnitSummary
}

// A Share is a number of draws and its share of the apportioned draws.
type Share struct {
	Draws int64
	P     float64
}

// SE is the standard error of the share as an estimate of a probability
// from n draws: sqrt(p(1-p)/n).
func (s Share) SE(n int64) float64 {
	if n == 0 {
		return math.NaN()
	}
	return math.Sqrt(s.P * (1 - s.P) / float64(n))
}

// A SeatShare is the share of draws in which a unit held Seats seats.
type SeatShare struct {
	Seats int
	Share
}

// A UnitSummary is one unit's part of a [Summary].
type UnitSummary struct {
	Name    string
	Counts  int   // the counts the file gives for it
	Latest  Count // its most recent count
	Central engine.Decimal
	// Clamped reports a linear projection below zero, set to zero; Rate is
	// the fitted change per year (see [Projected]).
	Clamped bool
	Rate    float64
	RSE     float64 // the relative standard error its draws used

	BaselineSeats, CentralSeats int
	// Mean and SD are the mean and standard deviation of its seats over
	// the draws; Dist the share of draws for every seat count that
	// occurred, from the fewest seats up.
	Mean, SD float64
	Dist     []SeatShare
	// Gain and Lose: draws with more, or fewer, seats than at baseline.
	Gain, Lose Share
	// Last: draws in which it holds the last seat handed out; Next: draws
	// in which it would take the first seat beyond the house size. InLast
	// and InNext: draws in which it holds one of the last Contest seats, or
	// would take one of the first Contest seats beyond.
	Last, Next, InLast, InNext Share
	// Tied: draws in which it is one of the units in a tie.
	Tied Share
}

// Summary summarises the draws made so far.
func (st *Study) Summary() *Summary {
	t := st.tally
	o := st.opt
	s := &Summary{
		Title: st.counts.Title, Method: st.central.Method, Seats: st.central.Seats,
		Target: o.Target, Growth: o.Growth, Fit: o.Fit, Error: o.Error, RSE: o.RSE,
		Seed: o.Seed, Contest: o.Contest,
		Draws: st.done, Apportioned: t.apportioned, Failed: t.failed, Tied: t.tied, Unassigned: t.unassigned,
		Baseline: st.baseline, Central: st.central,
		Units: make([]UnitSummary, len(st.units)),
	}
	n := t.apportioned
	share := func(c int64) Share {
		if n == 0 {
			return Share{Draws: c}
		}
		return Share{Draws: c, P: float64(c) / float64(n)}
	}
	for i := range st.units {
		p := &st.units[i]
		u := &s.Units[i]
		u.Name = st.counts.Series[i].Name
		u.Counts, u.Latest = p.counts, p.latest
		u.Central, u.Clamped, u.Rate, u.RSE = p.projected.Population, p.projected.Clamped, p.projected.Rate, p.rse
		u.BaselineSeats, u.CentralSeats = st.baseline.Units[i].Seats, st.central.Units[i].Seats
		var sum, sq float64
		for k, c := range t.hist[i] {
			if c == 0 {
				continue
			}
			seats := t.lo[i] + k
			u.Dist = append(u.Dist, SeatShare{Seats: seats, Share: share(c)})
			sum += float64(seats) * float64(c)
			sq += float64(seats) * float64(seats) * float64(c)
		}
		if n > 0 {
			u.Mean = sum / float64(n)
			u.SD = math.Sqrt(max(0, sq/float64(n)-u.Mean*u.Mean))
		}
		u.Gain, u.Lose = share(t.gain[i]), share(t.lose[i])
		u.Last, u.Next = share(t.last[i]), share(t.next[i])
		u.InLast, u.InNext = share(t.inLast[i]), share(t.inNext[i])
		u.Tied = share(t.inTie[i])
	}
	return s
}
