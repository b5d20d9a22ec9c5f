package engine

import (
	"testing"
)

// FuzzAllot turns bytes into a small scenario; Allot must return an *Error
// or a valid result, never panic.
func FuzzAllot(f *testing.F) {
	f.Add([]byte{3, 10, 0, 5, 0, 200, 1, 44, 2, 9})
	f.Add([]byte{7, 4, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0})
	f.Add([]byte{5, 2, 3, 1, 100, 1, 100, 1, 100})
	f.Add([]byte{1, 255, 2, 255, 255, 255, 255, 255, 255, 255, 255})
	f.Fuzz(func(t *testing.T, b []byte) {
		next := func() byte {
			if len(b) == 0 {
				return 0
			}
			c := b[0]
			b = b[1:]
			return c
		}
		s := &Scenario{Method: Method(next() % 10), Seats: int(next()) - 3}
		flags := next()
		if flags&1 != 0 {
			s.Min = int(next() % 3)
		}
		if flags&2 != 0 {
			s.Max = int(next() % 8)
		}
		if flags&4 != 0 {
			s.Threshold = Decimal{Coef: uint64(next()), Places: 2}
		}
		s.Tie = TieRule{Kind: TieKind(flags >> 4 % 4), Seed: uint64(flags)}
		for len(b) > 0 && len(s.Units) < 8 {
			c := uint64(next())
			if c >= 250 {
				c = MaxCoefficient - uint64(next())
			} else {
				c = c*c*uint64(next()) + uint64(next())
			}
			u := Unit{Name: testNames[len(s.Units)], Population: Decimal{Coef: c, Places: next() % 11}}
			if k := next(); k&0x80 != 0 {
				v := int(k%5) - 1
				u.Min = &v
			} else if k&0x40 != 0 {
				v := int(k % 9)
				u.Max = &v
			}
			s.Units = append(s.Units, u)
		}
		res, err := Allot(s, Full)
		if err != nil {
			if _, ok := err.(*Error); !ok {
				t.Fatalf("error %v (%T) is not an *Error", err, err)
			}
			return
		}
		sum := 0
		for i, u := range res.Units {
			sum += u.Seats
			if u.Excluded {
				if u.Seats != 0 {
					t.Fatalf("excluded unit %d has %d seats", i, u.Seats)
				}
				continue
			}
			if u.Seats < u.Min || (u.Max >= 0 && u.Seats > u.Max) {
				t.Fatalf("unit %d: %d seats outside [%d, %d]", i, u.Seats, u.Min, u.Max)
			}
		}
		if sum+res.Unassigned != s.Seats || res.Unassigned < 0 {
			t.Fatalf("seats %d + unassigned %d != %d", sum, res.Unassigned, s.Seats)
		}
		if res.Unassigned > 0 && (s.Tie.Kind != TieReport || len(res.Ties) == 0) {
			t.Fatalf("unassigned %d with rule %v and ties %v", res.Unassigned, s.Tie, res.Ties)
		}
	})
}

// FuzzParseDecimal: whatever parses formats back to a string that parses to
// the same value, and the value compares equal to itself written with
// trailing zeros.
func FuzzParseDecimal(f *testing.F) {
	for _, s := range []string{"0", "12.50", "-0", "+7", "0.000000001", "1000000000000000000", "1e3", " 3.14 ", ".5", "-2", "1.2.3", "99999999999999999999"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		d, err := ParseDecimal(s)
		if err != nil {
			return
		}
		if d.Coef > MaxCoefficient || d.Places > MaxPlaces {
			t.Fatalf("%q parsed to out-of-range %+v", s, d)
		}
		back, err := ParseDecimal(d.String())
		if err != nil || back != d {
			t.Fatalf("%q -> %+v -> %q -> %+v, %v", s, d, d.String(), back, err)
		}
		if d.Places < MaxPlaces {
			padded := Decimal{Coef: d.Coef * 10, Places: d.Places + 1}
			if d.Coef*10/10 == d.Coef && d.Cmp(padded) != 0 {
				t.Fatalf("%v != %v", d, padded)
			}
		}
	})
}
