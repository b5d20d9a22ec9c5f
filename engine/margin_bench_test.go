package engine

import (
	"strconv"
	"testing"
	"time"
)

// BenchmarkMargins times every margin of n units (10^3, 3·10^3 and 10^4,
// ten seats a unit, the populations of benchScenario) by Hamilton and the
// Droop quota, Allot with WithMargins, against Webster's in the same run:
// x-webster is the time over Webster's, Allot with WithMargins on the same
// populations, each Hamilton or Droop call followed by one Webster call
// (timed apart, outside ns/op), so that the machine's load weighs on both
// alike. Both are run once before they are timed.
func BenchmarkMargins(b *testing.B) {
	for _, n := range []int{1_000, 3_000, 10_000} {
		web := benchScenario(Webster, n, 10*n)
		for _, m := range []Method{Hamilton, Droop} {
			s := benchScenario(m, n, 10*n)
			b.Run(m.String()+"/units="+strconv.Itoa(n), func(b *testing.B) {
				b.ReportAllocs()
				allot := func(s *Scenario) {
					if _, err := Allot(s, WithMargins); err != nil {
						b.Fatal(err)
					}
				}
				allot(s)
				allot(web)
				var base time.Duration
				for b.Loop() {
					allot(s)
					b.StopTimer()
					t0 := time.Now()
					allot(web)
					base += time.Since(t0)
					b.StartTimer()
				}
				b.ReportMetric(float64(b.Elapsed())/float64(base), "x-webster")
			})
		}
	}
}
