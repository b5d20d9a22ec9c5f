package projection

import (
	"context"
	"math/rand/v2"
	"runtime"
	"testing"
	"time"

	"seatsmith/engine"
)

// The benchmarks draw the 50 states of the 2020 census (435 seats,
// Huntington–Hill, at least one seat each) with a two percent relative
// standard error, and count draws per second: the warm start per core,
// the warm start on every core, and, as the baseline in the same run, a
// full engine.Allot for every draw.

func benchStudy(b *testing.B, workers, contest int) *Study {
	c, _ := census(b)
	st, err := New(c, Options{RSE: 0.02, Seed: 1, Workers: workers, Contest: contest})
	if err != nil {
		b.Fatal(err)
	}
	return st
}

// allotDraws makes draws [from, to) of st as the study does, but
// apportions each with engine.Allot from scratch.
func allotDraws(b *testing.B, st *Study, from, to int) {
	var src rand.PCG
	rng := rand.New(&src)
	sc := engine.Scenario{Seats: st.central.Seats, Method: st.central.Method, Min: 1}
	sc.Units = make([]engine.Unit, len(st.units))
	for j := range sc.Units {
		sc.Units[j].Name = st.counts.Series[j].Name
	}
	for i := from; i < to; i++ {
		seedDraw(&src, st.opt.Seed, i)
		for j := range st.units {
			sc.Units[j].Population = engine.Whole(st.units[j].pert.draw(rng.NormFloat64(), 1e18))
		}
		if _, err := engine.Allot(&sc, 0); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkDraws(b *testing.B) {
	for _, contest := range []int{0, DefaultContest} {
		name := "warm/contest=0"
		if contest > 0 {
			name = "warm/contest=3"
		}
		b.Run(name, func(b *testing.B) {
			st := benchStudy(b, 1, contest)
			b.ResetTimer()
			if err := st.Run(context.Background(), 0, b.N); err != nil {
				b.Fatal(err)
			}
			b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "draws/s")
		})
	}
	b.Run("warm/every-core", func(b *testing.B) {
		st := benchStudy(b, 0, DefaultContest)
		b.ResetTimer()
		if err := st.Run(context.Background(), 0, b.N); err != nil {
			b.Fatal(err)
		}
		rate := float64(b.N) / b.Elapsed().Seconds()
		b.ReportMetric(rate, "draws/s")
		b.ReportMetric(rate/float64(runtime.NumCPU()), "draws/s/core")
	})
	b.Run("allot", func(b *testing.B) {
		st := benchStudy(b, 1, DefaultContest)
		b.ResetTimer()
		allotDraws(b, st, 0, b.N)
		b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "draws/s")
	})
}

// BenchmarkWarmOverAllot times both in every iteration, one worker each,
// and reports how many times faster the warm start is.
func BenchmarkWarmOverAllot(b *testing.B) {
	st := benchStudy(b, 1, DefaultContest)
	const warmBatch, allotBatch = 20_000, 100
	var warm, full time.Duration
	for k := 0; b.Loop(); k++ {
		t0 := time.Now()
		if err := st.Run(context.Background(), k*warmBatch, (k+1)*warmBatch); err != nil {
			b.Fatal(err)
		}
		t1 := time.Now()
		allotDraws(b, st, k*allotBatch, (k+1)*allotBatch)
		warm += t1.Sub(t0)
		full += time.Since(t1)
	}
	w := float64(warmBatch*b.N) / warm.Seconds()
	f := float64(allotBatch*b.N) / full.Seconds()
	b.ReportMetric(w, "warm-draws/s")
	b.ReportMetric(f, "allot-draws/s")
	b.ReportMetric(w/f, "speedup")
}
