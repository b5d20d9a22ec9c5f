package engine

import (
	"math/rand/v2"
	"strconv"
	"testing"
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
