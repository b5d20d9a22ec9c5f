package engine

import (
	"cmp"
	"math"
	"math/big"
	"math/rand/v2"
	"reflect"
	"slices"
	"strconv"
	"testing"

	"pgregory.net/rapid"
)

// The divisor procedure's fast form (from a divisor estimate) must give
// exactly what its sequential form (from the minimums, seat by seat) gives:
// the same seats, the same seats as handed out before a tie is settled, the
// same tie (units, seats, value, rule, winners), the same errors. These
// tests compare the two on random scenarios with bounds, thresholds,
// decimals and ties, and check every result by its divisor certificate.

// fastForm runs the divisor procedure from the standard divisor.
func (pr *problem) fastForm() (*divisorOutcome, error) { return pr.divisorSeats(false) }

// sequentialForm runs the divisor procedure from the minimums without
// recording the seat order.
func (pr *problem) sequentialForm() (*divisorOutcome, error) {
	out := new(divisorOutcome)
	if err := pr.divisor(out, divisorStart{sequential: true}, nil); err != nil {
		return nil, err
	}
	return out, nil
}

// genJumpScenario draws a divisor-method scenario: small and tie-prone,
// mid-sized with log-uniform populations, with huge populations (the
// math/big paths), or with many equal populations (ties at the cut).
func genJumpScenario(t *rapid.T, m Method) *Scenario {
	var s *Scenario
	switch rapid.IntRange(0, 4).Draw(t, "kind") {
	case 0:
		s = genScenario(t, m, 12, 60, 40, rapid.Bool().Draw(t, "bounds"))
	case 1:
		s = genScenario(t, m, 10, MaxCoefficient, 3000, rapid.Bool().Draw(t, "bounds"))
	case 2:
		// Many units and seats, populations spread over decades.
		n := rapid.IntRange(1, 300).Draw(t, "units")
		s = &Scenario{Method: m, Seats: rapid.IntRange(1, 20_000).Draw(t, "seats")}
		places := uint8(rapid.IntRange(0, 3).Draw(t, "places"))
		for i := 0; i < n; i++ {
			p := uint64(1)
			for k := rapid.IntRange(0, 9).Draw(t, "decades"); k > 0; k-- {
				p *= 10
			}
			p += rapid.Uint64Range(0, 9*p).Draw(t, "pop")
			u := Unit{Name: "u" + strconv.Itoa(i), Population: Decimal{Coef: p, Places: places}.trim()}
			if rapid.IntRange(0, 9).Draw(t, "hasMin") == 0 {
				v := rapid.IntRange(0, 30).Draw(t, "min")
				u.Min = &v
			}
			if rapid.IntRange(0, 9).Draw(t, "hasMax") == 0 {
				v := rapid.IntRange(0, 400).Draw(t, "max")
				u.Max = &v
			}
			s.Units = append(s.Units, u)
		}
		if rapid.IntRange(0, 3).Draw(t, "hasThreshold") == 0 {
			s.Threshold = Decimal{Coef: uint64(rapid.IntRange(1, 30).Draw(t, "share")), Places: 3}
		}
	case 3:
		// A few distinct populations repeated: equal priority values.
		n := rapid.IntRange(2, 60).Draw(t, "units")
		s = &Scenario{Method: m, Seats: rapid.IntRange(1, 400).Draw(t, "seats")}
		vals := []uint64{rapid.Uint64Range(1, 1000).Draw(t, "v0"), rapid.Uint64Range(1, 1000).Draw(t, "v1")}
		vals = append(vals, 2*vals[0], 3*vals[1])
		for i := 0; i < n; i++ {
			p := vals[rapid.IntRange(0, len(vals)-1).Draw(t, "which")]
			s.Units = append(s.Units, Unit{Name: "u" + strconv.Itoa(i), Population: Whole(p)})
		}
		if rapid.Bool().Draw(t, "defaultMin") {
			s.Min = 1
		}
	default:
		// Few seats for many units, or many seats for few.
		n := rapid.IntRange(1, 40).Draw(t, "units")
		s = &Scenario{Method: m, Seats: rapid.SampledFrom([]int{1, 2, n, n + 1, 2 * n, 100_000}).Draw(t, "seats")}
		for i := 0; i < n; i++ {
			p := rapid.Uint64Range(0, rapid.SampledFrom([]uint64{3, 1000, MaxCoefficient}).Draw(t, "scale")).Draw(t, "pop")
			s.Units = append(s.Units, Unit{Name: "u" + strconv.Itoa(i), Population: Whole(p)})
		}
		if rapid.Bool().Draw(t, "capped") {
			s.Max = rapid.IntRange(1, 50).Draw(t, "defaultMax")
		}
	}
	s.Tie = drawTieRule(t)
	return s
}

// compareJump checks jump and step against the sequential procedure on s.
func compareJump(t *rapid.T, s *Scenario) {
	t.Helper()
	pr, err := prepare(s)
	if err != nil {
		return
	}
	want, werr := pr.sequentialForm()
	got, gerr := pr.fastForm()
	if (werr == nil) != (gerr == nil) || (werr != nil && werr.Error() != gerr.Error()) {
		t.Fatalf("sequential error %v, jump error %v", werr, gerr)
	}
	if werr != nil {
		return
	}
	if !slices.Equal(got.seats, want.seats) {
		t.Fatalf("jump seats %v, sequential %v", got.seats, want.seats)
	}
	if !slices.Equal(got.full, want.full) {
		t.Fatalf("jump seats before the tie rule %v, sequential %v", got.full, want.full)
	}
	if got.free != want.free {
		t.Fatalf("jump free %d, sequential %d", got.free, want.free)
	}
	if !reflect.DeepEqual(got.tie, want.tie) {
		t.Fatalf("jump tie %+v, sequential %+v", got.tie, want.tie)
	}
	if !reflect.DeepEqual(got.tail, want.tail) {
		t.Fatalf("jump tail %+v, sequential %+v", got.tail, want.tail)
	}
}

func TestJumpMatchesSequential(t *testing.T) {
	forDivisorMethods(t, func(t *rapid.T, m Method) { compareJump(t, genJumpScenario(t, m)) })
}

// forDivisorMethods checks f on every divisor method, in a subtest each.
func forDivisorMethods(t *testing.T, f func(t *rapid.T, m Method)) {
	for _, m := range Methods() {
		if !m.IsDivisor() {
			continue
		}
		t.Run(m.String(), func(t *testing.T) {
			rapid.Check(t, func(t *rapid.T) { f(t, m) })
		})
	}
}

// TestJumpBigPath repeats the comparison with every comparison forced onto
// the math/big path.
func TestJumpBigPath(t *testing.T) {
	forDivisorMethods(t, func(t *rapid.T, m Method) {
		s := genJumpScenario(t, m)
		withBig(func() { compareJump(t, s) })
	})
}

// TestJumpAllot: Allot without the seat order (jump and step) explains the
// same result as Allot with it (the sequential procedure), field by field
// but for the order, and the result stands on its divisor certificate.
func TestJumpAllot(t *testing.T) {
	forDivisorMethods(t, func(t *rapid.T, m Method) {
		s := genJumpScenario(t, m)
		if len(s.Units) > 40 || s.Seats > 5000 {
			return // the seat order of a large house costs too much here
		}
		got, gerr := Allot(s, 0)
		want, werr := Allot(s, WithOrder)
		if (werr == nil) != (gerr == nil) {
			t.Fatalf("with order: %v; without: %v", werr, gerr)
		}
		if werr != nil {
			return
		}
		// The quota's fraction is filled only with some detail; it
		// does not depend on the procedure.
		want.Order = nil
		for i := range want.Units {
			want.Units[i].Quota = got.Units[i].Quota
		}
		if !reflect.DeepEqual(got, want) {
			t.Fatalf("without order %+v\nwith order %+v", got, want)
		}
		if s.Tie.Kind == TieReport {
			checkCertificate(t, s, got)
		}
	})
}

// TestJumpLarge compares the two procedures on a few thousand units and a
// hundred thousand seats, every divisor method, with and without bounds.
func TestJumpLarge(t *testing.T) {
	for _, m := range Methods() {
		if !m.IsDivisor() {
			continue
		}
		for _, bounded := range []bool{false, true} {
			s := benchScenario(m, 2000, 100_000)
			if bounded {
				s.Min = 2
				for i := range s.Units {
					if i%7 == 0 {
						v := 20
						s.Units[i].Max = &v
					}
				}
			}
			pr, err := prepare(s)
			if err != nil {
				t.Fatal(err)
			}
			want, err := pr.sequentialForm()
			if err != nil {
				t.Fatal(err)
			}
			got, err := pr.fastForm()
			if err != nil {
				t.Fatal(err)
			}
			if !slices.Equal(got.seats, want.seats) || !reflect.DeepEqual(got.tie, want.tie) {
				t.Errorf("%s bounded=%v: jump and sequential differ", m, bounded)
			}
			// The result stands on its divisor certificate, re-rounded
			// by the reference.
			res, err := Allot(s, 0)
			if err != nil {
				t.Fatal(err)
			}
			if len(res.Ties) > 0 || res.Divisor.Certificate == "" {
				t.Fatalf("%s bounded=%v: tie or no certificate: %+v", m, bounded, res.Divisor)
			}
			d, _ := new(big.Rat).SetString(res.Divisor.Certificate)
			pops, lo, hi, elig := refBounds(s)
			if c := refSeatsAtDivisor(m, d, pops, lo, hi, elig); !slices.Equal(c, seatsOf(res)) || !slices.Equal(c, got.seats) {
				t.Errorf("%s bounded=%v: the certificate %s does not give the seats", m, bounded, res.Divisor.Certificate)
			}
		}
	}
}

// TestCutCompare checks the exact comparisons with a divisor against
// rational arithmetic, over divisors from tiny to huge, populations up to
// MaxCoefficient and seat counts up to MaxSeats.
func TestCutCompare(t *testing.T) {
	forDivisorMethods(t, func(t *rapid.T, m Method) {
		p := rapid.OneOf(rapid.Uint64Range(1, 1000), rapid.Uint64Range(1, MaxCoefficient), rapid.Uint64Range(MaxCoefficient-1000, MaxCoefficient)).Draw(t, "p")
		k := rapid.OneOf(rapid.IntRange(0, 3), rapid.IntRange(0, 100_000), rapid.IntRange(MaxSeats-10, MaxSeats)).Draw(t, "k")
		var d float64
		if rapid.Bool().Draw(t, "near") && m.signpost(k).n != 0 {
			// Near the priority value itself, where the comparison is
			// close.
			d = float64(p) / signpostFloat(m, k) * (1 + float64(rapid.IntRange(-1000, 1000).Draw(t, "ulps"))*0x1p-52)
		} else {
			d = math.Pow(10, rapid.Float64Range(-12, 30).Draw(t, "log"))
		}
		pr := &problem{m: m, pops: []uint64{p, rapid.Uint64Range(1, MaxCoefficient).Draw(t, "other")}}
		c := newCut(pr, d)
		// D as a rational, squared.
		var d2 *big.Rat
		if c.kind == cutGeneral {
			vp := new(big.Rat).SetInt(bigU(c.vp))
			d2 = new(big.Rat).Quo(new(big.Rat).Mul(vp, vp), refSignpostSq(m, c.vk))
		} else {
			x := new(big.Rat).SetInt(bigU(c.x))
			if c.s >= 0 {
				x.Quo(x, new(big.Rat).SetInt(new(big.Int).Lsh(big.NewInt(1), uint(c.s))))
			} else {
				x.Mul(x, new(big.Rat).SetInt(new(big.Int).Lsh(big.NewInt(1), uint(-c.s))))
			}
			d2 = new(big.Rat).Mul(x, x)
			if m == HuntingtonHill {
				d2 = x // the cut holds D^2
			}
		}
		// sign(p/s(k) - D) = sign(p^2 - D^2 s(k)^2).
		pp := new(big.Rat).SetInt(new(big.Int).Mul(bigU(p), bigU(p)))
		want := pp.Cmp(new(big.Rat).Mul(d2, refSignpostSq(m, k)))
		if got := c.cmp(p, k); got != want {
			t.Fatalf("cut %+v: cmp(%d, %d) = %d, want %d", c, p, k, got, want)
		}
		var viaBig int
		withBig(func() { viaBig = c.cmp(p, k) })
		if viaBig != want {
			t.Fatalf("cut %+v: big-path cmp(%d, %d) = %d, want %d", c, p, k, viaBig, want)
		}
	})
}

// TestJumpRandomLarge draws a few larger scenarios with a plain generator
// (no shrinking): hundreds of units, tens of thousands of seats, bounds.
func TestJumpRandomLarge(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 11))
	for trial := 0; trial < 12; trial++ {
		for _, m := range Methods() {
			if !m.IsDivisor() {
				continue
			}
			n := 50 + r.IntN(400)
			s := &Scenario{Method: m, Seats: n * (1 + r.IntN(60))}
			for i := 0; i < n; i++ {
				p := uint64(1 + r.IntN(1000))
				if r.IntN(3) == 0 {
					p *= uint64(1 + r.IntN(100_000))
				}
				s.Units = append(s.Units, Unit{Name: "u" + strconv.Itoa(i), Population: Whole(p)})
			}
			if trial%3 == 1 {
				s.Min = 1
				s.Max = 10 + r.IntN(200)
			}
			pr, err := prepare(s)
			if err != nil {
				continue
			}
			want, werr := pr.sequentialForm()
			got, gerr := pr.fastForm()
			if (werr == nil) != (gerr == nil) {
				t.Fatalf("%s trial %d: sequential %v, jump %v", m, trial, werr, gerr)
			}
			if werr == nil && (!slices.Equal(got.seats, want.seats) || !slices.Equal(got.full, want.full) || !reflect.DeepEqual(got.tie, want.tie)) {
				t.Fatalf("%s trial %d: jump and sequential differ", m, trial)
			}
		}
	}
}

// firstSeats leaves at the front the values a full sort would.
func TestFirstSeats(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		n := rapid.IntRange(0, 80).Draw(t, "n")
		seats := make([]nearSeat, n)
		for i := range seats {
			seats[i] = nearSeat{float64(rapid.IntRange(0, 20).Draw(t, "v")), int32(i)}
		}
		m := rapid.IntRange(1, 40).Draw(t, "m")
		desc := rapid.Bool().Draw(t, "desc")
		want := slices.Clone(seats)
		slices.SortFunc(want, func(x, y nearSeat) int {
			if desc {
				return cmp.Compare(y.v, x.v)
			}
			return cmp.Compare(x.v, y.v)
		})
		got := slices.Clone(seats)
		firstSeats(got, m, desc)
		for k := 0; k < min(m, n); k++ {
			if got[k].v != want[k].v {
				t.Fatalf("seat %d of the first %d: %v, want %v (all %v)", k, m, got[k].v, want[k].v, got)
			}
		}
		sortByUnit := func(s []nearSeat) { slices.SortFunc(s, func(x, y nearSeat) int { return int(x.u - y.u) }) }
		sortByUnit(got)
		sortByUnit(seats)
		if !slices.Equal(got, seats) {
			t.Fatal("firstSeats lost or changed a seat")
		}
	})
}
