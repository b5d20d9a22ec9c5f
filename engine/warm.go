package engine

import (
	"math"
	"strconv"
)

// This file holds the warm-start allotter: it apportions many variants of
// one scenario (new populations, everything else the same) exactly, each
// fast. For a divisor method it runs the divisor procedure (divisor.go)
// from the baseline's divisor scaled by the ratio of the new total
// population to the baseline's, instead of from the standard divisor: from
// a start that near, the estimate takes one pass and the exact steps are
// few. Largest-remainder methods have no divisor to start from; they are
// apportioned in full for every call.

// MaxWarmContest is the most seats on each side of the cut a
// [WarmAllotter] reports in [WarmResult.Last] and [WarmResult.Next].
const MaxWarmContest = 32

// A WarmAllotter apportions many variants of one scenario exactly and fast:
// the same units, bounds, method, house size, threshold and tie rule, with
// new populations for every call. Every result equals what [Allot] gives for
// the scenario with those populations: the same seats, the same ties, the
// same seats left unassigned.
//
// A WarmAllotter is not safe for concurrent use; give every goroutine its
// own with [WarmAllotter.Clone].
type WarmAllotter struct {
	sh   *warmShared
	pr   problem // the baseline problem with this call's populations
	elig []bool
	sc   divisorScratch
	out  divisorOutcome
	sel  []seatRef // contest scratch
	best []seatRef
}

// warmShared is the read-only part shared by clones.
type warmShared struct {
	base    *problem
	contest int
	// Divisor methods: a divisor inside the baseline's range and the
	// baseline's apportioned population (scaled units, floating point:
	// estimates only).
	d0, q0 float64
}

// A WarmResult is one apportionment made by a [WarmAllotter]. Its slices are
// reused by the next call that is given the same WarmResult.
type WarmResult struct {
	// Seats holds every unit's seats, in input order: outright, or given
	// by the scenario's tie rule.
	Seats []int
	// Unassigned counts the seats left open by a tie that no rule settled.
	Unassigned int
	// Tied lists the units (indexes, in input order) with exactly equal
	// claims on contested seats; TieSeats is the number of seats they
	// contest. Both are empty when there is no tie.
	Tied     []int
	TieSeats int
	// Last lists the units holding the last seats handed out, the last
	// first: for a divisor method the holders of the least priority values
	// among the seats held beyond the minimums (Last[0] holds the seat
	// numbered H minus Unassigned); for a largest-remainder method the units
	// whose remainders won the last seats in the final pass, the smallest
	// winning remainder first. Next lists the units that would take the
	// first seats beyond: for a divisor method seats H+1, H+2, ... (a unit
	// may appear more than once); for a largest-remainder method the largest
	// remainders that won no seat. Both have at most the contest length
	// given to [NewWarmAllotter].
	Last, Next []int
}

// NewWarmAllotter prepares to apportion variants of s. It apportions s
// itself to find the divisor that later calls start from, and returns an
// *[Error] when s is invalid or cannot be apportioned. contest (0 to
// [MaxWarmContest]) is how many seats on each side of the cut every result
// reports in Last and Next; 0 skips that work.
func NewWarmAllotter(s *Scenario, contest int) (*WarmAllotter, error) {
	if contest < 0 || contest > MaxWarmContest {
		return nil, scenarioError("contest", "the seats reported on each side of the cut must be between 0 and "+strconv.Itoa(MaxWarmContest)+", not "+strconv.Itoa(contest))
	}
	pr, err := prepare(s)
	if err != nil {
		return nil, err
	}
	sh := &warmShared{base: pr, contest: contest}
	o, err := pr.run(false)
	if err != nil {
		return nil, err
	}
	if pr.m.IsDivisor() {
		sh.setDivisor(o.full)
	}
	return sh.allotter(), nil
}

// setDivisor records the baseline's divisor estimate: a divisor inside the
// range of divisors that give its seats.
func (sh *warmShared) setDivisor(seats []int) {
	pr := sh.base
	sh.q0 = pr.eligibleTotal().float()
	low, lowOK, high, highOK := pr.divisorBounds(seats)
	lf, hf := 0.0, math.Inf(1)
	if lowOK {
		lf = pr.m.prioEstimate(low)
	}
	if highOK {
		hf = pr.m.prioEstimate(high)
	}
	switch {
	case lf > 0 && !math.IsInf(hf, 0):
		sh.d0 = math.Sqrt(lf * hf)
	case lf > 0:
		sh.d0 = lf * 1.05
	case !math.IsInf(hf, 0) && hf > 0:
		sh.d0 = hf * 0.95
	default:
		sh.d0 = sh.q0 / float64(pr.h)
	}
	if !(sh.d0 > 0) || math.IsInf(sh.d0, 0) {
		sh.d0 = 1
	}
}

func (sh *warmShared) allotter() *WarmAllotter {
	n := sh.base.n()
	return &WarmAllotter{sh: sh, pr: *sh.base, elig: make([]bool, n),
		sc: divisorScratch{idx: make([]int32, 0, n)}, sel: make([]seatRef, 0, sh.contest+1)}
}

// Clone returns a WarmAllotter for the same scenario with its own scratch
// space, for use by another goroutine.
func (w *WarmAllotter) Clone() *WarmAllotter { return w.sh.allotter() }

// Places is the number of decimal places of the scaled populations that
// [WarmAllotter.Allot] takes: a population x is passed as x·10^Places, a
// whole number.
func (w *WarmAllotter) Places() int { return w.sh.base.places }

// Populations returns the scenario's own populations, scaled as Allot takes
// them.
func (w *WarmAllotter) Populations() []uint64 {
	return append([]uint64(nil), w.sh.base.pops...)
}

// Allot apportions the scenario with the populations pops (one per unit,
// in input order, scaled by 10^Places and at most [MaxCoefficient]) and
// stores the result in r. It returns an *[Error] when no apportionment
// exists for these populations (for example when a unit drops to zero and
// the bounds can no longer be met); r is then undefined. Allot does not
// modify pops.
func (w *WarmAllotter) Allot(pops []uint64, r *WarmResult) error {
	base := w.sh.base
	n := base.n()
	if len(pops) != n {
		return scenarioError("units", strconv.Itoa(len(pops))+" populations for "+strconv.Itoa(n)+" units")
	}
	var total u128
	same := true // the same units have people as in the scenario
	for i, p := range pops {
		if p > MaxCoefficient {
			return unitError(i, base.names[i], "population", "out of range")
		}
		total, _ = total.add64(p)
		same = same && (p == 0) == (base.pops[i] == 0)
	}
	if total.hi == 0 && total.lo == 0 {
		return scenarioError("population", "every unit has a population of zero")
	}
	pr := &w.pr
	pr.pops = pops
	if th := base.threshold; !th.IsZero() {
		for i, p := range pops {
			w.elig[i] = !belowShare(p, total, th)
		}
		pr.eligible = w.elig
	}
	// Feasibility depends on the populations only through which units have
	// people and which pass the threshold; the scenario itself passed.
	if !same || !base.threshold.IsZero() {
		if err := pr.checkFeasible(); err != nil {
			return err
		}
	}
	r.reset(n)
	if !pr.m.IsDivisor() {
		return w.remainder(r)
	}
	return w.divisor(r)
}

func (r *WarmResult) reset(n int) {
	if cap(r.Seats) >= n {
		r.Seats = r.Seats[:n]
	} else {
		r.Seats = make([]int, n)
	}
	r.Unassigned, r.TieSeats = 0, 0
	r.Tied, r.Last, r.Next = r.Tied[:0], r.Last[:0], r.Next[:0]
}

// divisor runs the divisor procedure from the baseline's divisor, which
// it scales to this call's population taking part.
func (w *WarmAllotter) divisor(r *WarmResult) error {
	sh, pr := w.sh, &w.pr
	w.sc.a = r.Seats
	o := &w.out
	if err := pr.divisor(o, divisorStart{d: sh.d0, at: sh.q0}, &w.sc); err != nil {
		return err
	}
	if o.tie != nil {
		copy(r.Seats, o.seats)
		r.Tied = append(r.Tied, o.tie.Units...)
		r.TieSeats = o.tie.Seats
		if o.tie.Winners == nil {
			r.Unassigned = o.tie.Seats
		}
	}
	if k := sh.contest; k > 0 {
		w.best, w.sel = pr.bestSeats(r.Seats, true, k, w.best[:0], w.sel)
		for _, s := range w.best {
			r.Last = append(r.Last, s.u)
		}
		w.best, w.sel = pr.bestSeats(r.Seats, false, k, w.best[:0], w.sel)
		for _, s := range w.best {
			r.Next = append(r.Next, s.u)
		}
	}
	return nil
}

// remainder apportions by a largest-remainder method in full; the passes
// find their cut by selection, and only the remainders the contest lists
// name are ranked.
func (w *WarmAllotter) remainder(r *WarmResult) error {
	pr := &w.pr
	o, err := pr.remainderCut()
	if err != nil {
		return err
	}
	sum := 0
	for i, s := range o.seats {
		r.Seats[i] = s
		sum += s
	}
	r.Unassigned = pr.h - sum
	ties := o.early
	if o.tie != nil {
		ties = append(ties[:len(ties):len(ties)], *o.tie)
	}
	if len(ties) > 0 {
		in := make([]bool, pr.n())
		for _, t := range ties {
			r.TieSeats += t.Seats
			for _, u := range t.Units {
				in[u] = true
			}
		}
		for u, ok := range in {
			if ok {
				r.Tied = append(r.Tied, u)
			}
		}
	}
	if k := w.sh.contest; k > 0 && o.final != nil {
		f := o.final
		f.rankNear(k)
		for j := f.extra - 1; j >= 0 && j >= f.extra-k; j-- {
			r.Last = append(r.Last, f.units[f.ranked[j]])
		}
		for j := f.extra; j < len(f.ranked) && j < f.extra+k; j++ {
			r.Next = append(r.Next, f.units[f.ranked[j]])
		}
	}
	return nil
}
