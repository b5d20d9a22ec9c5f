package engine

import (
	"math"
	"math/rand/v2"
	"os"
	"sort"
	"strconv"
	"testing"
	"time"
)

// benchScenario draws n units with populations from a seeded generator
// (log-uniform between 10^3 and 10^8, like the units of a federation).
func benchScenario(m Method, n, seats int) *Scenario {
	r := rand.New(rand.NewPCG(2026, uint64(n)))
	s := &Scenario{Method: m, Seats: seats}
	for i := 0; i < n; i++ {
		p := uint64(1000)
		for k := r.IntN(6); k > 0; k-- {
			p *= 10
		}
		p += r.Uint64N(p * 9)
		s.Units = append(s.Units, Unit{Name: "u" + strconv.Itoa(i), Population: Whole(p)})
	}
	return s
}

func benchAllot(b *testing.B, s *Scenario, d Detail) {
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Allot(s, d); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkAllot50 is every method at 50 units and 435 seats.
func BenchmarkAllot50(b *testing.B) {
	for _, m := range Methods() {
		s := benchScenario(m, 50, 435)
		b.Run(m.String(), func(b *testing.B) { benchAllot(b, s, 0) })
	}
}

// BenchmarkAllot50Full adds the seat order and every margin.
func BenchmarkAllot50Full(b *testing.B) {
	for _, m := range Methods() {
		s := benchScenario(m, 50, 435)
		b.Run(m.String(), func(b *testing.B) { benchAllot(b, s, Full) })
	}
}

// BenchmarkAllotLarge is every method at 10^5 units and 10^6 seats.
func BenchmarkAllotLarge(b *testing.B) {
	for _, m := range Methods() {
		s := benchScenario(m, 100_000, 1_000_000)
		b.Run(m.String(), func(b *testing.B) { benchAllot(b, s, 0) })
	}
}

// The benchmarks below measure the procedures at scale, on prepared
// problems (no parsing, no explanation), against baselines timed in the
// same run: sort.Float64s on the same populations as float64 values, and
// the sequential divisor procedure. Their ratios are the figures to quote;
// times alone depend on the machine. Set SEATSMITH_BENCH_HUGE=1 to add 10^7
// units to the cost-growth table.

// benchProblem builds the prepared problem for n units with the
// populations of benchScenario, every unit taking part without bounds,
// directly (a scenario of 10^7 named units costs more to prepare than to
// apportion).
func benchProblem(m Method, n, seats int) *problem {
	r := rand.New(rand.NewPCG(2026, uint64(n)))
	pr := &problem{m: m, h: seats, names: make([]string, n), pops: make([]uint64, n),
		min: make([]int, n), max: make([]int, n), eligible: make([]bool, n)}
	for i := range pr.pops {
		p := uint64(1000)
		for k := r.IntN(6); k > 0; k-- {
			p *= 10
		}
		pr.pops[i] = p + r.Uint64N(p*9)
		pr.max[i], pr.eligible[i] = noCap, true
	}
	return pr
}

// sortTime is the best of three runs of sort.Float64s on the populations.
func sortTime(pops []uint64) time.Duration {
	f := make([]float64, len(pops))
	best := time.Duration(math.MaxInt64)
	for range 3 {
		for i, p := range pops {
			f[i] = float64(p)
		}
		t0 := time.Now()
		sort.Float64s(f)
		best = min(best, time.Since(t0))
	}
	return best
}

// reportSortRatio reports the time per operation as a multiple of the time
// sort.Float64s takes on the same populations, timed right after the loop.
func reportSortRatio(b *testing.B, pops []uint64) {
	per := float64(b.Elapsed().Nanoseconds()) / float64(b.N)
	b.ReportMetric(per/float64(sortTime(pops).Nanoseconds()), "sort-ratio")
}

// runLR runs the largest-remainder procedure: cut only (the seats and ties,
// as searches and the warm start need them) or with every remainder ranked
// (as the explanation shows them).
func runLR(b *testing.B, pr *problem, ranked bool) {
	b.Helper()
	var err error
	if ranked {
		_, err = pr.remainderSeats()
	} else {
		_, err = pr.remainderCut()
	}
	if err != nil {
		b.Fatal(err)
	}
}

// BenchmarkMillion apportions 10^8 seats among 10^6 units by every method;
// sort-ratio compares each with sort.Float64s on the same 10^6 values.
// Divisor methods run by jump and step (Allot without the seat order);
// largest-remainder methods find the cut by selection ("cut"), and "ranked"
// adds the full ranking of the remainders that the explanation shows.
func BenchmarkMillion(b *testing.B) {
	const n, seats = 1_000_000, 100_000_000
	b.Run("sort.Float64s", func(b *testing.B) {
		pr := benchProblem(Webster, n, seats)
		f := make([]float64, n)
		for b.Loop() {
			b.StopTimer()
			for i, p := range pr.pops {
				f[i] = float64(p)
			}
			b.StartTimer()
			sort.Float64s(f)
		}
	})
	for _, m := range Methods() {
		pr := benchProblem(m, n, seats)
		if m.IsDivisor() {
			b.Run(m.String(), func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					if _, err := pr.divisorSeats(false); err != nil {
						b.Fatal(err)
					}
				}
				reportSortRatio(b, pr.pops)
			})
			continue
		}
		for _, ranked := range []bool{false, true} {
			name := m.String() + "/cut"
			if ranked {
				name = m.String() + "/ranked"
			}
			b.Run(name, func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					runLR(b, pr, ranked)
				}
				reportSortRatio(b, pr.pops)
			})
		}
	}
}

// BenchmarkJumpVsSequential apportions 10^6 seats among 10^3 units by
// every divisor method, by jump and step and by the sequential procedure
// (one seat at a time); speedup is the sequential time, measured in the
// same sub-benchmark, over the jump-and-step time.
func BenchmarkJumpVsSequential(b *testing.B) {
	const n, seats = 1000, 1_000_000
	for _, m := range Methods() {
		if !m.IsDivisor() {
			continue
		}
		pr := benchProblem(m, n, seats)
		b.Run(m.String()+"/jump", func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := pr.fastForm(); err != nil {
					b.Fatal(err)
				}
			}
			per := float64(b.Elapsed().Nanoseconds()) / float64(b.N)
			seq := time.Duration(math.MaxInt64)
			for range 2 {
				t0 := time.Now()
				if _, err := pr.sequentialForm(); err != nil {
					b.Fatal(err)
				}
				seq = min(seq, time.Since(t0))
			}
			b.ReportMetric(float64(seq.Nanoseconds())/per, "speedup")
		})
		b.Run(m.String()+"/sequential", func(b *testing.B) {
			for b.Loop() {
				if _, err := pr.sequentialForm(); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkGrowth is the cost-growth table: 10^3 to 10^6 units (10^7 with
// SEATSMITH_BENCH_HUGE=1), 100 seats per unit, time and bytes allocated per
// apportionment, and each time over sort.Float64s on the same populations.
func BenchmarkGrowth(b *testing.B) {
	sizes := []int{1_000, 10_000, 100_000, 1_000_000}
	if os.Getenv("SEATSMITH_BENCH_HUGE") != "" {
		sizes = append(sizes, 10_000_000)
	}
	for _, n := range sizes {
		seats := min(100*n, MaxSeats)
		for _, m := range []Method{Webster, HuntingtonHill, Hamilton} {
			pr := benchProblem(m, n, seats)
			b.Run(m.String()+"/units="+strconv.Itoa(n), func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					if m.IsDivisor() {
						if _, err := pr.divisorSeats(false); err != nil {
							b.Fatal(err)
						}
					} else {
						runLR(b, pr, false)
					}
				}
				reportSortRatio(b, pr.pops)
			})
		}
	}
}
