package projection

import (
	"context"
	"errors"
	"math/rand/v2"
	"runtime"
	"strconv"
	"sync"
	"sync/atomic"

	"seatsmith/engine"
	"seatsmith/engine/input"
)

// Defaults for the options a caller leaves open.
const (
	DefaultDraws   = 10_000
	DefaultContest = 3
	// MaxDraws is the most draws one study makes.
	MaxDraws = 100_000_000
)

// chunk is the number of draws a worker takes at a time; progress is
// reported and cancellation noticed between chunks.
const chunk = 256

// Options configure a [Study].
type Options struct {
	// Target is the date the counts are projected to. Nil apportions the
	// latest counts themselves, with the error model around them.
	Target *Date
	Growth Growth // the growth model; zero means Linear
	Fit    Fit    // the counts the growth model is fitted to

	// Error is the error model's distribution; zero means Normal. RSE is
	// the relative standard error of every unit that has none of its own
	// (0.02 for two percent). With no relative standard error anywhere the
	// study makes no draws.
	Error Distribution
	RSE   float64
	// Draws is the number of draws [Study.RunAll] makes, Seed the seed of
	// their random streams.
	Draws int
	Seed  uint64
	// Workers is the number of goroutines that make draws; 0 means one
	// per CPU. The numbers do not depend on it.
	Workers int
	// Contest is how many seats on each side of the cut are tracked: the
	// last seats handed out and the first seats beyond (0 to
	// engine.MaxWarmContest).
	Contest int
	// Progress, when set, is called on the goroutine that called Run (or
	// RunAll) after every few hundred draws, with the number of the draws
	// done so far and the number Run is to reach.
	Progress func(done, total int)
}

// A Study is a projection of dated counts to a target date, apportioned,
// with the uncertainty of the result estimated by seeded, reproducible
// random draws. Draw number i uses a random stream derived from the seed
// and i alone, so any split of the draws among workers, and any split of a
// run into chunks, gives the same numbers.
type Study struct {
	counts *Counts
	opt    Options
	units  []unitPlan

	baseline, central *engine.Result
	baseSeats         []int
	warm              *engine.WarmAllotter
	exact             []uint64 // central populations, scaled
	noisy             bool

	tally *tally
	done  int
}

type unitPlan struct {
	latest    Count
	counts    int
	projected Projected
	rse       float64
	pert      perturb
}

// New prepares a study of the counts c: it projects every unit to the
// target date (or takes its latest count), apportions the latest counts
// (the baseline that gains and losses are measured against) and the
// central projection, and readies the draws. Errors about the counts or
// the scenario are *input.Error values naming file, line and field.
func New(c *Counts, opt Options) (*Study, error) {
	if opt.Growth == 0 {
		opt.Growth = Linear
	}
	if opt.Error == 0 {
		opt.Error = Normal
	}
	switch {
	case opt.Draws < 0 || opt.Draws > MaxDraws:
		return nil, errors.New("draws: must be between 0 and " + strconv.Itoa(MaxDraws))
	case !(opt.RSE >= 0 && opt.RSE <= 1):
		return nil, errors.New("rse: must be between 0 and 1 (100%)")
	case opt.Contest < 0 || opt.Contest > engine.MaxWarmContest:
		return nil, errors.New("contest: must be between 0 and " + strconv.Itoa(engine.MaxWarmContest))
	case opt.Workers < 0:
		return nil, errors.New("workers: cannot be negative")
	case opt.Growth > Geometric || opt.Error > LogNormal || opt.Fit > LastTwo:
		return nil, errors.New("unknown growth model, fit or error model")
	}
	if len(c.Series) == 0 {
		return nil, &input.Error{File: c.File, Field: "units", Msg: "no units"}
	}
	places := 0
	for _, s := range c.Series {
		for _, k := range s.Counts {
			places = max(places, int(k.Population.Places))
		}
	}
	st := &Study{counts: c, opt: opt, units: make([]unitPlan, len(c.Series))}
	latest, central := c.Scenario, c.Scenario
	latest.Units = make([]engine.Unit, len(c.Series))
	central.Units = make([]engine.Unit, len(c.Series))
	for i := range c.Series {
		s := &c.Series[i]
		u := &st.units[i]
		u.latest, u.counts = s.Latest(), len(s.Counts)
		u.rse = opt.RSE
		if s.RSE != nil {
			u.rse = *s.RSE
		}
		u.projected = Projected{Population: u.latest.Population}
		if opt.Target != nil {
			p, err := Project(s, *opt.Target, opt.Growth, opt.Fit, places)
			if err != nil {
				return nil, &input.Error{File: c.File, Line: s.Line, Field: "counts", Msg: strconv.Quote(s.Name) + ": " + err.Error()}
			}
			u.projected = p
		}
		latest.Units[i] = engine.Unit{Name: s.Name, Population: u.latest.Population, Min: s.Min, Max: s.Max}
		central.Units[i] = engine.Unit{Name: s.Name, Population: u.projected.Population, Min: s.Min, Max: s.Max}
		if u.rse > 0 {
			st.noisy = true
		}
	}
	var err error
	if st.baseline, err = engine.Allot(&latest, engine.WithOrder); err != nil {
		return nil, c.Locate(err)
	}
	if st.central, err = engine.Allot(&central, engine.WithOrder); err != nil {
		return nil, c.Locate(err)
	}
	st.baseSeats = make([]int, len(c.Series))
	for i, u := range st.baseline.Units {
		st.baseSeats[i] = u.Seats
	}
	if st.warm, err = engine.NewWarmAllotter(&central, opt.Contest); err != nil {
		return nil, c.Locate(err)
	}
	st.exact = st.warm.Populations()
	for i := range st.units {
		u := &st.units[i]
		u.pert = newPerturb(opt.Error, float64(st.exact[i]), u.rse)
	}
	st.tally = newTally(len(c.Series))
	return st, nil
}

// Done returns the number of draws made so far.
func (st *Study) Done() int { return st.done }

// Noisy reports whether any unit has a relative standard error above zero,
// so that draws can vary.
func (st *Study) Noisy() bool { return st.noisy }

// RunAll makes the draws not yet made up to Options.Draws.
func (st *Study) RunAll(ctx context.Context) error {
	if !st.noisy || st.done >= st.opt.Draws {
		return nil
	}
	return st.Run(ctx, st.done, st.opt.Draws)
}

// Run makes draws number from to to-1 and adds them to the study. from must
// be [Study.Done], so that a caller (a page's worker, say) can make the
// draws in chunks, reporting progress between them. If ctx is cancelled
// before the draws are complete, Run returns its error and the study is
// unchanged.
func (st *Study) Run(ctx context.Context, from, to int) error {
	switch {
	case !st.noisy:
		return errors.New("no error model: every relative standard error is zero, so every draw would be the same")
	case from != st.done:
		return errors.New("draws must continue from draw " + strconv.Itoa(st.done) + ", not " + strconv.Itoa(from))
	case to < from || to > MaxDraws:
		return errors.New("draws: cannot run to " + strconv.Itoa(to))
	case to == from:
		return nil
	}
	workers := st.opt.Workers
	if workers == 0 {
		workers = runtime.NumCPU()
	}
	chunks := (to - from + chunk - 1) / chunk
	workers = max(1, min(workers, chunks))
	var next atomic.Int64
	tallies := make([]*tally, workers)
	progress := make(chan int, workers)
	var wg sync.WaitGroup
	for k := range tallies {
		wg.Add(1)
		go func() {
			defer wg.Done()
			// Each worker allocates its own tally, away from the others'
			// (counters of different workers on one cache line would slow
			// every draw).
			t := newTally(len(st.units))
			st.work(ctx, t, &next, from, to, progress)
			tallies[k] = t
		}()
	}
	go func() {
		wg.Wait()
		close(progress)
	}()
	done := from
	for n := range progress {
		done += n
		if st.opt.Progress != nil {
			st.opt.Progress(done, to)
		}
	}
	if err := ctx.Err(); err != nil && done < to {
		return err
	}
	for _, t := range tallies {
		st.tally.merge(t)
	}
	st.done = to
	return nil
}

// work makes chunks of draws until none is left or ctx is cancelled.
func (st *Study) work(ctx context.Context, t *tally, next *atomic.Int64, from, to int, progress chan<- int) {
	w := st.warm.Clone()
	var src rand.PCG
	rng := rand.New(&src)
	pops := make([]uint64, len(st.units))
	var r engine.WarmResult
	const limit = float64(engine.MaxCoefficient)
	for ctx.Err() == nil {
		lo := from + int(next.Add(1)-1)*chunk
		if lo >= to {
			return
		}
		hi := min(lo+chunk, to)
		for i := lo; i < hi; i++ {
			seedDraw(&src, st.opt.Seed, i)
			for j := range st.units {
				u := &st.units[j]
				z := rng.NormFloat64()
				if u.rse == 0 {
					pops[j] = st.exact[j]
				} else {
					pops[j] = u.pert.draw(z, limit)
				}
			}
			if err := w.Allot(pops, &r); err != nil {
				t.failed++
				continue
			}
			t.add(&r, st.baseSeats)
		}
		progress <- hi - lo
	}
}
