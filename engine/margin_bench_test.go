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
			b.Run(m.String()+"/units="+strconv.Itoa(n), func(b *testing.B) { marginsAgainst(b, s, web) })
		}
	}
}

// BenchmarkBoundedMargins times every margin of n units (100 and 300, two
// seats a unit) by Hamilton with a minimum of one seat and a maximum of
// five, and by the Droop quota with a minimum of one, which are proven
// stretch by stretch (bounded.go), against Webster's with the same bounds
// in the same run, as BenchmarkMargins does.
func BenchmarkBoundedMargins(b *testing.B) {
	for _, n := range []int{100, 300} {
		for _, c := range []struct {
			name     string
			m        Method
			min, max int
		}{{"hamilton-min1-max5", Hamilton, 1, 5}, {"droop-min1", Droop, 1, 0}} {
			s, web := benchScenario(c.m, n, 2*n), benchScenario(Webster, n, 2*n)
			s.Min, s.Max, web.Min, web.Max = c.min, c.max, c.min, c.max
			b.Run(c.name+"/units="+strconv.Itoa(n), func(b *testing.B) { marginsAgainst(b, s, web) })
		}
	}
}

// marginsAgainst times Allot with WithMargins on s, each call followed by
// one on base timed apart, and reports the ratio as x-webster.
func marginsAgainst(b *testing.B, s, base *Scenario) {
	b.ReportAllocs()
	allot := func(s *Scenario) {
		if _, err := Allot(s, WithMargins); err != nil {
			b.Fatal(err)
		}
	}
	allot(s)
	allot(base)
	var spent time.Duration
	for b.Loop() {
		allot(s)
		b.StopTimer()
		t0 := time.Now()
		allot(base)
		spent += time.Since(t0)
		b.StartTimer()
	}
	b.ReportMetric(float64(b.Elapsed())/float64(spent), "x-webster")
}
