package engine

import (
	"slices"
	"testing"

	"pgregory.net/rapid"
)

// TestSeatsOnly checks that SeatsOnly gives the seats, quotas, bounds held
// and ties of the full explanation, leaves the rest out, and gives way to
// WithOrder.
func TestSeatsOnly(t *testing.T) {
	for _, m := range Methods() {
		t.Run(m.String(), func(t *testing.T) {
			rapid.Check(t, func(t *rapid.T) {
				s := genScenario(t, m, 12, 1_000_000, 200, rapid.Bool().Draw(t, "bounds"))
				full, ferr := Allot(s, WithOrder)
				only, oerr := Allot(s, SeatsOnly)
				if (ferr == nil) != (oerr == nil) {
					t.Fatalf("errors differ: %v and %v", ferr, oerr)
				}
				if ferr != nil {
					return
				}
				if !slices.Equal(seatsOf(full), seatsOf(only)) || len(full.Ties) != len(only.Ties) || full.Unassigned != only.Unassigned || full.Total != only.Total {
					t.Fatalf("seats only differs: seats %v and %v, ties %v and %v", seatsOf(full), seatsOf(only), full.Ties, only.Ties)
				}
				for i := range full.Units {
					f, b := &full.Units[i], &only.Units[i]
					if f.Quota.Text != b.Quota.Text || f.Lower != b.Lower || f.Upper != b.Upper || f.MeetsQuota != b.MeetsQuota ||
						f.Tied != b.Tied || f.Excluded != b.Excluded || (m.IsLargestRemainder() && (f.AtMin != b.AtMin || f.AtMax != b.AtMax)) {
						t.Fatalf("unit %d: %+v, seats only %+v", i, *f, *b)
					}
					if b.Last != nil || b.Next != nil || b.Remainder != nil || b.Gain != nil || b.Lose != nil {
						t.Fatalf("unit %d: seats only explains %+v", i, *b)
					}
				}
				if only.Divisor != nil || only.Order != nil || only.Beyond != nil {
					t.Fatal("seats only gives a divisor range, an order or the seats beyond")
				}
				if both, err := Allot(s, SeatsOnly|WithOrder); err != nil || (m.IsDivisor() && len(both.Order) != len(full.Order)) {
					t.Fatalf("SeatsOnly|WithOrder: %v, %d seats in order, want %d", err, len(both.Order), len(full.Order))
				}
			})
		})
	}
}
