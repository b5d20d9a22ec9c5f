package engine

import (
	"math/big"
	"testing"

	"pgregory.net/rapid"
)

// TestQuotaText checks the six-place quota text against math/big's
// rounding of the same fraction, on both sides of the point where the
// remainder times 10^6 stops fitting in 64 bits.
func TestQuotaText(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		den := rapid.OneOf(rapid.Uint64Range(1, 1000), rapid.Uint64Range(1, 1<<44), rapid.Uint64Range(1, 1<<63)).Draw(t, "den")
		rem := rapid.Uint64Range(0, den-1).Draw(t, "rem")
		q := rapid.Uint64Range(0, 1<<40).Draw(t, "q")
		r := new(big.Rat).SetFrac(new(big.Int).SetUint64(rem), new(big.Int).SetUint64(den))
		r.Add(r, new(big.Rat).SetInt(new(big.Int).SetUint64(q)))
		want, ok := exactDecimal(r, 6)
		if !ok {
			want = r.FloatString(6)
		}
		if got := quotaTextIn(nil, q, rem, den); got != want {
			t.Fatalf("quotaTextIn(%d, %d, %d) = %s, want %s", q, rem, den, got, want)
		}
	})
}
