package election

import (
	"bytes"
	"testing"
)

// FuzzRead: bad input never crashes; whatever reads is computed or refused
// with an error, never a panic.
//
//	go test -run XXX -fuzz FuzzRead ./engine/election
func FuzzRead(f *testing.F) {
	f.Add([]byte("district,party,votes\nN,A,10\nN,B,7\n\ndistrict,seats\nN,3\n"))
	f.Add([]byte(`{"kind": "election", "system": "biproportional", "method": "webster", "districts": [{"name": "N", "seats": 3}, {"name": "S", "seats": 2}], "votes": [{"district": "N", "party": "A", "votes": 5}, {"district": "S", "party": "B", "votes": 4}, {"district": "N", "party": "B", "votes": 1}]}`))
	f.Add([]byte(`{"kind": "election", "system": "mixed-member", "method": "dhondt", "seats": 10, "overhang": "level", "threshold": "5%", "alternative_wins": 1, "votes": [{"party": "A", "votes": 90, "wins": 8}, {"party": "B", "votes": 10}]}`))
	f.Add([]byte(`{"kind": "election", "system": "two-tier", "method": "adams", "compensatory": 4, "threshold": [{"share": "10%", "scope": "any-district", "base": "valid"}], "districts": [{"name": "N", "seats": 2, "other_votes": 3}], "votes": [{"district": "N", "party": "A", "votes": 5}, {"district": "N", "party": "B", "votes": 5}], "tie": "lot:3"}`))
	f.Add([]byte("party,wins,exempt\nA,1,yes\n\ndistrict,party,votes,wins\n,A,3,1\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		src, err := Read("fuzz", bytes.NewReader(data))
		if err != nil {
			return
		}
		s := &src.Scenario
		if s.System == 0 {
			s.System = Biproportional
		}
		if s.Method == 0 {
			s.Method = 4 // Webster
		}
		if s.Seats > 10000 || s.Compensatory > 10000 {
			return
		}
		for _, d := range s.Districts {
			if d.Seats > 10000 {
				return
			}
		}
		res, err := src.Compute()
		if err == nil && s.System == Biproportional {
			if err := Verify(res); err != nil {
				t.Fatalf("certificate: %v", err)
			}
		}
	})
}
