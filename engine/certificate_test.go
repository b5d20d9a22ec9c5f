package engine

import (
	"testing"

	"pgregory.net/rapid"
)

// The certificate worked out in 128-bit arithmetic is the one math/big
// gives, for bounds of every size, from a few people to populations where
// the products no longer fit and the fast path steps aside.
func TestCertificateMatchesBig(t *testing.T) {
	var divisor []Method
	for _, m := range Methods() {
		if m.IsDivisor() {
			divisor = append(divisor, m)
		}
	}
	fast, all := 0, 0
	rapid.Check(t, func(t *rapid.T) {
		m := rapid.SampledFrom(divisor).Draw(t, "method")
		pop := rapid.OneOf(rapid.Uint64Range(1, 1000), rapid.Uint64Range(1, 1_000_000_000), rapid.Uint64Range(1, MaxCoefficient))
		seat := rapid.OneOf(rapid.IntRange(0, 5), rapid.IntRange(0, 100_000))
		pr := &problem{m: m, places: rapid.IntRange(0, 6).Draw(t, "places")}
		low := prio{pop.Draw(t, "low.p"), seat.Draw(t, "low.a")}
		high := prio{pop.Draw(t, "high.p"), seat.Draw(t, "high.a")}
		lowOK := rapid.Bool().Draw(t, "lowOK")
		if m.infinite(high) || (lowOK && m.cmpPrio(low, high) >= 0) {
			t.Skip("no open range")
		}
		got := pr.certificateText(low, lowOK, high, true)
		if _, _, ok := pr.certificate64(low, lowOK, high); ok {
			fast++
		}
		all++
		var want string
		withBig(func() { want = pr.certificateText(low, lowOK, high, true) })
		if got != want {
			t.Fatalf("%s, %d places, low %v (%v), high %v: certificate %q, math/big %q", m, pr.places, low, lowOK, high, got, want)
		}
	})
	if fast < all/2 {
		t.Errorf("the 128-bit path found %d of %d certificates; most should fit", fast, all)
	}
	t.Logf("128-bit path: %d of %d", fast, all)
}

func TestDecimalPower(t *testing.T) {
	for _, c := range []struct {
		f    uint64
		e    int
		want string
	}{
		{7, 0, "7"}, {7, 3, "7000"}, {15, -1, "1.5"}, {5, -3, "0.005"}, {120, -2, "1.2"}, {100, -2, "1"}, {3, -12, "0.000000000003"},
	} {
		if got := decimalPower(c.f, c.e); got != c.want {
			t.Errorf("decimalPower(%d, %d) = %q, want %q", c.f, c.e, got, c.want)
		}
	}
}
