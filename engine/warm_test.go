package engine

import (
	"math/rand/v2"
	"slices"
	"strconv"
	"testing"

	"pgregory.net/rapid"
)

// warmScenario draws a scenario for the warm-start checks: few units with
// small populations (so that ties are common), or larger ones, with bounds,
// thresholds and tie rules mixed in.
func warmScenario(t *rapid.T, m Method) *Scenario {
	n := rapid.IntRange(1, 9).Draw(t, "units")
	small := rapid.Bool().Draw(t, "small")
	places := uint8(0)
	if rapid.IntRange(0, 4).Draw(t, "decimal") == 0 {
		places = 1
	}
	s := &Scenario{Method: m, Seats: rapid.IntRange(1, 40).Draw(t, "seats")}
	for i := 0; i < n; i++ {
		var p uint64
		if small {
			p = rapid.Uint64Range(0, 40).Draw(t, "p")
		} else {
			p = rapid.Uint64Range(0, 5_000_000).Draw(t, "p")
		}
		u := Unit{Name: "u" + strconv.Itoa(i), Population: Decimal{Coef: p, Places: places}}
		if rapid.IntRange(0, 5).Draw(t, "bounded") == 0 {
			lo := rapid.IntRange(0, 3).Draw(t, "min")
			hi := lo + rapid.IntRange(0, 6).Draw(t, "max")
			u.Min, u.Max = &lo, &hi
		}
		s.Units = append(s.Units, u)
	}
	s.Min = rapid.IntRange(0, 1).Draw(t, "defaultMin")
	if rapid.IntRange(0, 4).Draw(t, "capped") == 0 {
		s.Max = rapid.IntRange(1, 12).Draw(t, "defaultMax")
	}
	if rapid.IntRange(0, 4).Draw(t, "threshold") == 0 {
		s.Threshold = Decimal{Coef: uint64(rapid.IntRange(1, 20).Draw(t, "share")), Places: 2}
	}
	s.Tie = drawTieRule(t)
	return s
}

// warmVariant draws new populations for the units of s: independent small
// ones, a perturbation of the baseline, or one unit moved a lot.
func warmVariant(t *rapid.T, base []uint64) []uint64 {
	out := slices.Clone(base)
	switch rapid.IntRange(0, 4).Draw(t, "variant") {
	case 0:
		for i := range out {
			out[i] = rapid.Uint64Range(0, 40).Draw(t, "q")
		}
	case 1:
		for i, p := range out {
			d := rapid.IntRange(-10, 10).Draw(t, "pct")
			out[i] = uint64(int64(p) + int64(p)*int64(d)/100)
		}
	case 2:
		i := rapid.IntRange(0, len(out)-1).Draw(t, "which")
		out[i] = rapid.Uint64Range(0, 2*out[i]+50).Draw(t, "q")
	case 3:
		// Very large populations take the math/big paths.
		for i := range out {
			out[i] = rapid.Uint64Range(0, MaxCoefficient).Draw(t, "huge")
		}
	case 4:
		// Equal or doubled populations make equal priority values.
		i := rapid.IntRange(0, len(out)-1).Draw(t, "from")
		j := rapid.IntRange(0, len(out)-1).Draw(t, "to")
		out[j] = out[i] * uint64(rapid.IntRange(1, 3).Draw(t, "times"))
	}
	return out
}

// checkWarm compares one warm-start result with Allot on the same
// populations.
func checkWarm(t *rapid.T, s *Scenario, w *WarmAllotter, r *WarmResult, pops []uint64, contest int) {
	t.Helper()
	v := *s
	v.Units = slices.Clone(s.Units)
	for i := range v.Units {
		v.Units[i].Population = Decimal{Coef: pops[i], Places: uint8(w.Places())}
	}
	want, werr := Allot(&v, WithOrder)
	gerr := w.Allot(pops, r)
	if (werr == nil) != (gerr == nil) {
		t.Fatalf("pops %v: Allot error %v, warm error %v", pops, werr, gerr)
	}
	if werr != nil {
		return
	}
	if got := r.Seats; !slices.Equal(got, seatsOf(want)) {
		t.Fatalf("pops %v: warm seats %v, Allot %v", pops, got, seatsOf(want))
	}
	if r.Unassigned != want.Unassigned {
		t.Fatalf("pops %v: unassigned %d, Allot %d", pops, r.Unassigned, want.Unassigned)
	}
	var tied []int
	seats := 0
	for _, tie := range want.Ties {
		seats += tie.Seats
		tied = append(tied, tie.Units...)
	}
	slices.Sort(tied)
	tied = slices.Compact(tied)
	if !slices.Equal(r.Tied, tied) || r.TieSeats != seats {
		t.Fatalf("pops %v: tie %v (%d seats), Allot %v (%d seats)", pops, r.Tied, r.TieSeats, want.Ties, seats)
	}
	var last, next []int
	if s.Method.IsDivisor() {
		for k := len(want.Order) - 1; k >= 0 && len(last) < contest; k-- {
			last = append(last, want.Order[k].Unit)
		}
		for k := 0; k < len(want.Beyond) && k < contest; k++ {
			next = append(next, want.Beyond[k].Unit)
		}
	} else {
		type ranked struct{ u, rank int }
		var won, lost []ranked
		for i, u := range want.Units {
			if u.RemainderRank == 0 {
				continue
			}
			if u.RemainderSeat {
				won = append(won, ranked{i, u.RemainderRank})
			} else {
				lost = append(lost, ranked{i, u.RemainderRank})
			}
		}
		slices.SortFunc(won, func(x, y ranked) int { return y.rank - x.rank })
		slices.SortFunc(lost, func(x, y ranked) int { return x.rank - y.rank })
		for k := 0; k < len(won) && k < contest; k++ {
			last = append(last, won[k].u)
		}
		for k := 0; k < len(lost) && k < contest; k++ {
			next = append(next, lost[k].u)
		}
	}
	if !slices.Equal(r.Last, last) || !slices.Equal(r.Next, next) {
		t.Fatalf("pops %v seats %v: last %v next %v, Allot last %v next %v", pops, r.Seats, r.Last, r.Next, last, next)
	}
}

// TestWarmMatchesAllot checks the warm-start allotter against Allot on
// random scenarios and random new populations, for every method (the
// largest-remainder methods take the full procedure, but through the same
// interface).
func TestWarmMatchesAllot(t *testing.T) {
	for _, m := range Methods() {
		t.Run(m.String(), func(t *testing.T) {
			rapid.Check(t, func(t *rapid.T) {
				s := warmScenario(t, m)
				contest := rapid.IntRange(0, 5).Draw(t, "contest")
				w, err := NewWarmAllotter(s, contest)
				if _, aerr := Allot(s, 0); (aerr == nil) != (err == nil) {
					t.Fatalf("Allot error %v, NewWarmAllotter error %v", aerr, err)
				}
				if err != nil {
					return
				}
				var r WarmResult
				checkWarm(t, s, w, &r, w.Populations(), contest)
				c := w.Clone()
				for k := rapid.IntRange(1, 10).Draw(t, "draws"); k > 0; k-- {
					checkWarm(t, s, c, &r, warmVariant(t, w.Populations()), contest)
				}
			})
		})
	}
}

// TestWarmBigArithmetic repeats a short check with every comparison on the
// math/big path.
func TestWarmBigArithmetic(t *testing.T) {
	forceBig = true
	defer func() { forceBig = false }()
	for _, m := range []Method{HuntingtonHill, Dean, Webster} {
		t.Run(m.String(), func(t *testing.T) {
			rapid.Check(t, func(t *rapid.T) {
				s := warmScenario(t, m)
				w, err := NewWarmAllotter(s, 2)
				if err != nil {
					return
				}
				var r WarmResult
				checkWarm(t, s, w, &r, warmVariant(t, w.Populations()), 2)
			})
		})
	}
}

// warmCensus is the 2020 apportionment of the U.S. House as a scenario
// (Huntington–Hill, 435 seats, at least one each) and the seats of the
// states in input order, from loadCensus2020 (its source is named there).
func warmCensus(t testing.TB) (*Scenario, []int) {
	t.Helper()
	units, bySeats := loadCensus2020(t)
	s := &Scenario{Seats: 435, Method: HuntingtonHill, Min: 1, Units: units}
	seats := make([]int, len(units))
	for i, u := range units {
		seats[i] = bySeats[u.Name]
	}
	return s, seats
}

// TestWarmCensus2020 checks the warm start on the 2020 apportionment of
// the U.S. House (Huntington–Hill, 435 seats, at least one each, 2 U.S.C.
// §2a). Source: U.S. Census Bureau, 2020 Census Apportionment Results,
// Table 1; the 435th seat went to Minnesota and the 436th would have gone
// to New York (same release, widely reported). It then checks one
// thousand perturbed populations against Allot.
func TestWarmCensus2020(t *testing.T) {
	s, want := warmCensus(t)
	w, err := NewWarmAllotter(s, 3)
	if err != nil {
		t.Fatal(err)
	}
	var r WarmResult
	if err := w.Allot(w.Populations(), &r); err != nil {
		t.Fatal(err)
	}
	if !slices.Equal(r.Seats, want) {
		t.Fatalf("seats %v, want %v", r.Seats, want)
	}
	name := func(i int) string { return s.Units[i].Name }
	if len(r.Last) == 0 || name(r.Last[0]) != "Minnesota" {
		t.Errorf("last seat to %v, want Minnesota", r.Last)
	}
	if len(r.Next) == 0 || name(r.Next[0]) != "New York" {
		t.Errorf("seat 436 to %v, want New York", r.Next)
	}
	rng := rand.New(rand.NewPCG(2020, 435))
	base := w.Populations()
	pops := make([]uint64, len(base))
	n := 1000
	if testing.Short() {
		n = 200
	}
	for k := 0; k < n; k++ {
		for i, p := range base {
			pops[i] = uint64(float64(p) * (1 + 0.02*rng.NormFloat64()))
		}
		if err := w.Allot(pops, &r); err != nil {
			t.Fatal(err)
		}
		v := *s
		v.Units = slices.Clone(s.Units)
		for i := range v.Units {
			v.Units[i].Population = Whole(pops[i])
		}
		res, err := Allot(&v, 0)
		if err != nil {
			t.Fatal(err)
		}
		if !slices.Equal(r.Seats, seatsOf(res)) {
			t.Fatalf("draw %d: warm %v, Allot %v", k, r.Seats, seatsOf(res))
		}
		if res.Beyond[0].Unit != r.Next[0] {
			t.Fatalf("draw %d: next seat %d, Allot %d", k, r.Next[0], res.Beyond[0].Unit)
		}
	}
}

func TestWarmErrors(t *testing.T) {
	one := 1
	s := &Scenario{Seats: 3, Method: HuntingtonHill, Units: []Unit{
		{Name: "a", Population: Whole(10)}, {Name: "b", Population: Whole(20)}, {Name: "c", Population: Whole(30), Max: &one},
	}}
	if _, err := NewWarmAllotter(s, MaxWarmContest+1); err == nil {
		t.Error("contest beyond the limit accepted")
	}
	w, err := NewWarmAllotter(s, 1)
	if err != nil {
		t.Fatal(err)
	}
	var r WarmResult
	for _, tc := range []struct {
		pops  []uint64
		field string
	}{
		{[]uint64{1, 2}, "units"},
		{[]uint64{0, 0, 0}, "population"},
		{[]uint64{1, MaxCoefficient + 1, 1}, "population"},
		// c is capped at one seat and nobody else has people.
		{[]uint64{0, 0, 9}, "max"},
	} {
		err := w.Allot(tc.pops, &r)
		e, ok := err.(*Error)
		if !ok || e.Field != tc.field {
			t.Errorf("pops %v: error %v, want one about %s", tc.pops, err, tc.field)
		}
	}
}

// benchWarmPops draws perturbed census populations (relative standard
// error 2%) for the benchmarks.
func benchWarmPops(base []uint64, k int) [][]uint64 {
	rng := rand.New(rand.NewPCG(1, 2))
	out := make([][]uint64, k)
	for j := range out {
		out[j] = make([]uint64, len(base))
		for i, p := range base {
			out[j][i] = uint64(float64(p) * (1 + 0.02*rng.NormFloat64()))
		}
	}
	return out
}

// BenchmarkWarm measures apportionments per second for the 50 states, 435
// seats, Huntington–Hill, by the warm start (with and without the contest
// lists), by the sequential procedure from scratch, and by Allot (which
// adds the explanation), on the same perturbed populations.
func BenchmarkWarm(b *testing.B) {
	s, _ := warmCensus(b)
	w0, err := NewWarmAllotter(s, 0)
	if err != nil {
		b.Fatal(err)
	}
	draws := benchWarmPops(w0.Populations(), 1024)
	for _, contest := range []int{0, 3} {
		b.Run("warm/contest="+strconv.Itoa(contest), func(b *testing.B) {
			w, _ := NewWarmAllotter(s, contest)
			var r WarmResult
			k := 0
			for b.Loop() {
				if err := w.Allot(draws[k%len(draws)], &r); err != nil {
					b.Fatal(err)
				}
				k++
			}
			b.ReportMetric(float64(k)/b.Elapsed().Seconds(), "allots/s")
		})
	}
	// The sequential procedure alone, from scratch, on a prepared problem:
	// what the warm start saves without the explanation Allot adds.
	b.Run("sequential", func(b *testing.B) {
		pr, err := prepare(s)
		if err != nil {
			b.Fatal(err)
		}
		k := 0
		for b.Loop() {
			pr.pops = draws[k%len(draws)]
			if _, err := pr.divisorSeats(false); err != nil {
				b.Fatal(err)
			}
			k++
		}
		b.ReportMetric(float64(k)/b.Elapsed().Seconds(), "allots/s")
	})
	b.Run("allot", func(b *testing.B) {
		v := *s
		v.Units = slices.Clone(s.Units)
		k := 0
		for b.Loop() {
			for i, p := range draws[k%len(draws)] {
				v.Units[i].Population = Whole(p)
			}
			if _, err := Allot(&v, 0); err != nil {
				b.Fatal(err)
			}
			k++
		}
		b.ReportMetric(float64(k)/b.Elapsed().Seconds(), "allots/s")
	})
}
