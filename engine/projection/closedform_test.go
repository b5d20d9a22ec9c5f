package projection

import (
	"context"
	"math"
	"strconv"
	"testing"

	"seatsmith/engine"
)

// twoUnits builds counts for two undated units A and B.
func twoUnits(pa, pb uint64, seats int, m engine.Method) *Counts {
	return &Counts{
		File:     "two.csv",
		Scenario: engine.Scenario{Seats: seats, Method: m},
		Series: []Series{
			{Name: "A", Counts: []Count{{Population: engine.Whole(pa)}}, Line: 2},
			{Name: "B", Counts: []Count{{Population: engine.Whole(pb)}}, Line: 3},
		},
	}
}

// phi is the standard normal distribution function, Φ(x) = (1 + erf(x/√2))/2.
func phi(x float64) float64 { return 0.5 * (1 + math.Erf(x/math.Sqrt2)) }

// signpostValue is s(a) of a divisor method as a real number, from the
// table of signposts in the project's trade notes: Jefferson a+1, Webster
// a+1/2, Adams a, Dean 2a(a+1)/(2a+1), Huntington–Hill sqrt(a(a+1)).
func signpostValue(m engine.Method, a int) float64 {
	f := float64(a)
	switch m {
	case engine.Jefferson:
		return f + 1
	case engine.Webster:
		return f + 0.5
	case engine.Adams:
		return f
	case engine.Dean:
		return 2 * f * (f + 1) / (2*f + 1)
	case engine.HuntingtonHill:
		return math.Sqrt(f * (f + 1))
	}
	panic("no signpost")
}

// closedForm returns the probabilities that unit A gains a seat and that it
// loses one, against its seats a at the central counts (B holds b = H - a),
// when both counts carry independent normal errors with relative standard
// error sigma.
//
// Derivation. With two units, a divisor method hands out seats in the order
// of the priority values p/s(k) (the sequential form in the trade notes).
// A holds at least a+1 of the H seats exactly when its (a+1)-th priority
// beats B's b-th: q_A/s(a) > q_B/s(b-1), that is when
//
//	L = q_A·s(b-1) - q_B·s(a) > 0.
//
// With q_A = p_A(1 + σZ_A) and q_B = p_B(1 + σZ_B) for independent standard
// normals Z_A and Z_B, L is a linear combination of independent normals and
// so is itself normal (the reproductive property of the normal
// distribution: common practice, stated in probability texts such as
// Feller, An Introduction to Probability Theory and Its Applications,
// vol. II; cited from memory), with mean
// μ = p_A·s(b-1) - p_B·s(a) and variance σ²·((p_A·s(b-1))² + (p_B·s(a))²).
// Hence P(gain) = P(L > 0) = Φ(μ/sd). Symmetrically A drops to a-1 seats
// exactly when B's (b+1)-th priority beats A's a-th:
// q_B·s(a-1) - q_A·s(b) > 0, which gives P(lose) the same way.
//
// Two things set the simulated model apart from this formula, both far
// below the Monte Carlo error: draws are rounded to whole people (an error
// of at most half a person against standard deviations of thousands) and
// cut at zero (ten standard deviations away for σ = 0.1).
func closedForm(m engine.Method, pa, pb float64, a, b int, sigma float64) (gain, lose float64) {
	sg := func(k int) float64 { return signpostValue(m, k) }
	mu := pa*sg(b-1) - pb*sg(a)
	sd := sigma * math.Hypot(pa*sg(b-1), pb*sg(a))
	gain = phi(mu / sd)
	mu = pb*sg(a-1) - pa*sg(b)
	sd = sigma * math.Hypot(pb*sg(a-1), pa*sg(b))
	lose = phi(mu / sd)
	return gain, lose
}

// runTwo runs a study of two units and returns A's summary.
func runTwo(t *testing.T, m engine.Method, pa, pb uint64, seats int, sigma float64, draws int, seed uint64) (UnitSummary, *Summary) {
	t.Helper()
	st, err := New(twoUnits(pa, pb, seats, m), Options{RSE: sigma, Draws: draws, Seed: seed, Contest: 1})
	if err != nil {
		t.Fatal(err)
	}
	if err := st.RunAll(context.Background()); err != nil {
		t.Fatal(err)
	}
	s := st.Summary()
	return s.Units[0], s
}

// TestClosedFormTwoUnits compares the simulated probabilities that the
// contested seat changes hands with the closed form above, within four
// standard errors of the estimate (fixed seeds, so the test is
// deterministic).
func TestClosedFormTwoUnits(t *testing.T) {
	cases := []struct {
		m      engine.Method
		pa, pb uint64
		seats  int
		sigma  float64
	}{
		{engine.Webster, 61000, 39000, 10, 0.1},
		{engine.HuntingtonHill, 61000, 39000, 10, 0.1},
		{engine.Jefferson, 55500, 44500, 8, 0.06},
		{engine.Jefferson, 57000, 43000, 8, 0.05},
		{engine.Adams, 70500, 29500, 12, 0.08},
		{engine.Dean, 43000, 57000, 9, 0.08},
	}
	const draws = 40_000
	for _, c := range cases {
		t.Run(c.m.String()+"/"+strconv.FormatUint(c.pa, 10), func(t *testing.T) {
			u, s := runTwo(t, c.m, c.pa, c.pb, c.seats, c.sigma, draws, 7)
			a, b := u.BaselineSeats, s.Units[1].BaselineSeats
			gain, lose := closedForm(c.m, float64(c.pa), float64(c.pb), a, b, c.sigma)
			n := s.Apportioned
			if n != draws || s.Failed != 0 {
				t.Fatalf("apportioned %d of %d draws, %d failed", n, draws, s.Failed)
			}
			for _, chk := range []struct {
				what string
				got  Share
				want float64
			}{{"gain", u.Gain, gain}, {"lose", u.Lose, lose}} {
				se := max(math.Sqrt(chk.want*(1-chk.want)/float64(n)), 1/float64(n))
				if d := math.Abs(chk.got.P - chk.want); d > 4*se {
					t.Errorf("A (%d seats, B %d): P(%s) = %.4f, closed form %.4f, off by %.1f standard errors",
						a, b, chk.what, chk.got.P, chk.want, d/se)
				}
				t.Logf("A %d seats, B %d: P(%s) = %.4f, closed form %.4f (se %.4f)", a, b, chk.what, chk.got.P, chk.want, se)
			}
			// The seats A can hold add up: every draw is in its
			// distribution, and its gains and losses are its draws away
			// from a.
			var total, away int64
			for _, d := range u.Dist {
				total += d.Draws
				if d.Seats != a {
					away += d.Draws
				}
			}
			if total != n || away != u.Gain.Draws+u.Lose.Draws {
				t.Errorf("distribution %v does not match %d draws, gain %d, lose %d", u.Dist, n, u.Gain.Draws, u.Lose.Draws)
			}
		})
	}
}

// TestClosedFormLogNormal does the same for log-normal errors. A draw is
// q = p·exp(sZ - s²/2) with s² = ln(1 + σ²), so A gains exactly when
// ln q_A - ln q_B > ln(s(a)/s(b-1)); the left side is normal with mean
// ln(p_A/p_B) (the -s²/2 terms cancel) and standard deviation s·√2, so
//
//	P(gain) = Φ(ln(p_A·s(b-1) / (p_B·s(a))) / (s·√2)),
//
// and P(lose) = Φ(ln(p_B·s(a-1) / (p_A·s(b))) / (s·√2)) likewise.
func TestClosedFormLogNormal(t *testing.T) {
	m, pa, pb, seats, sigma := engine.HuntingtonHill, 58000.0, 42000.0, 10, 0.08
	st, err := New(twoUnits(uint64(pa), uint64(pb), seats, m), Options{RSE: sigma, Error: LogNormal, Draws: 40_000, Seed: 11})
	if err != nil {
		t.Fatal(err)
	}
	if err := st.RunAll(context.Background()); err != nil {
		t.Fatal(err)
	}
	s := st.Summary()
	a, b := s.Units[0].BaselineSeats, s.Units[1].BaselineSeats
	sd := math.Sqrt(2 * math.Log1p(sigma*sigma))
	sg := func(k int) float64 { return signpostValue(m, k) }
	gain := phi(math.Log(pa*sg(b-1)/(pb*sg(a))) / sd)
	lose := phi(math.Log(pb*sg(a-1)/(pa*sg(b))) / sd)
	n := float64(s.Apportioned)
	for _, chk := range []struct {
		what      string
		got, want float64
	}{{"gain", s.Units[0].Gain.P, gain}, {"lose", s.Units[0].Lose.P, lose}} {
		se := max(math.Sqrt(chk.want*(1-chk.want)/n), 1/n)
		t.Logf("A %d seats, B %d: P(%s) = %.4f, closed form %.4f (se %.4f)", a, b, chk.what, chk.got, chk.want, se)
		if math.Abs(chk.got-chk.want) > 4*se {
			t.Errorf("P(%s) = %.4f, closed form %.4f", chk.what, chk.got, chk.want)
		}
	}
}

// TestConvergence checks that the Monte Carlo error against the closed
// form shrinks like 1/sqrt(N): over ten fixed seeds, the root-mean-square
// error at N = 10^3, 10^4 and 10^5 draws stays near its theoretical value
// sqrt(p(1-p)/N), and shrinks by about sqrt(10) from one N to the next.
// The bounds are loose (a root-mean-square over ten seeds is itself uncertain
// by about a quarter), and the seeds fixed, so the test is deterministic.
func TestConvergence(t *testing.T) {
	const seeds = 10
	m, pa, pb, seats, sigma := engine.Webster, uint64(61000), uint64(39000), 10, 0.1
	gain, _ := closedForm(m, float64(pa), float64(pb), 6, 4, sigma)
	var rms []float64
	for _, n := range []int{1_000, 10_000, 100_000} {
		var sum float64
		for seed := uint64(1); seed <= seeds; seed++ {
			u, _ := runTwo(t, m, pa, pb, seats, sigma, n, seed*1000+uint64(n))
			d := u.Gain.P - gain
			sum += d * d
		}
		r := math.Sqrt(sum / seeds)
		theory := math.Sqrt(gain * (1 - gain) / float64(n))
		t.Logf("N = %6d: rms error %.5f, theory %.5f (ratio %.2f)", n, r, theory, r/theory)
		if r < 0.4*theory || r > 1.8*theory {
			t.Errorf("N = %d: rms error %.5f is far from sqrt(p(1-p)/N) = %.5f", n, r, theory)
		}
		rms = append(rms, r)
	}
	for k := 1; k < len(rms); k++ {
		if ratio := rms[k-1] / rms[k]; ratio < 1.3 || ratio > 8 {
			t.Errorf("error ratio between N = 10^%d and 10^%d is %.2f, want about sqrt(10) = 3.16", k+2, k+3, ratio)
		}
	}
	if ratio := rms[0] / rms[2]; ratio < 4 || ratio > 25 {
		t.Errorf("error ratio between N = 10^3 and 10^5 is %.2f, want about 10", ratio)
	}
}
