package engine

import (
	"math/rand/v2"
	"reflect"
	"strconv"
	"testing"
)

// TestAllotMethods checks on random invented scenarios, valid and not,
// that apportioning by every method at once gives exactly what Allot gives
// method by method: the same results and the same errors.
func TestAllotMethods(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 5))
	methods := append(Methods(), Method(0), Method(200))
	for k := 0; k < 1500; k++ {
		s := Scenario{Method: Methods()[r.IntN(len(Methods()))], Seats: r.IntN(40)}
		n := r.IntN(9)
		for i := 0; i < n; i++ {
			name := "U" + strconv.Itoa(i)
			if r.IntN(30) == 0 {
				name = "U0" // a repeated name
			}
			s.Units = append(s.Units, Unit{Name: name, Population: Decimal{Coef: uint64(r.IntN(5000)), Places: uint8(r.IntN(2))}})
		}
		if r.IntN(3) == 0 {
			s.Min = r.IntN(4)
		}
		if r.IntN(4) == 0 {
			s.Max = r.IntN(8)
		}
		if r.IntN(4) == 0 {
			s.Threshold = Decimal{Coef: uint64(r.IntN(30)), Places: 2}
		}
		if r.IntN(3) == 0 {
			s.Tie = TieRule{Kind: TieByLot, Seed: uint64(k)}
		}
		details := []Detail{SeatsOnly, 0}
		if k%20 == 0 {
			details = append(details, Full) // margins take a search
		}
		for _, detail := range details {
			before := s
			got, errs := AllotMethods(&s, methods, detail)
			if !reflect.DeepEqual(s, before) {
				t.Fatalf("the scenario was changed")
			}
			for j, m := range methods {
				one := s
				one.Method = m
				want, err := Allot(&one, detail)
				if !reflect.DeepEqual(errs[j], err) || !reflect.DeepEqual(got[j], want) {
					t.Fatalf("scenario %+v, method %v, detail %d:\n got %+v, %v\nwant %+v, %v", s, m, detail, got[j], errs[j], want, err)
				}
			}
		}
	}
}
