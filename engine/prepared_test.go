package engine_test

import (
	"fmt"
	"reflect"
	"testing"

	"seatsmith/engine"
)

// A large table can be dropped once prepared: the Prepared keeps what the
// procedure needs, and the result what the output shows. (Invented
// figures.)
func ExamplePrepare() {
	s := &engine.Scenario{
		Method: engine.Webster,
		Seats:  12,
		Units: []engine.Unit{
			{Name: "Orlen", Population: engine.Whole(412300)},
			{Name: "Tamsk", Population: engine.Whole(268950)},
			{Name: "Brevia", Population: engine.Whole(151200)},
		},
	}
	p, err := engine.Prepare(s)
	if err != nil {
		fmt.Println(err)
		return
	}
	s.Units = nil // no longer needed
	res, err := p.Allot(engine.WithMargins)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, u := range res.Units {
		fmt.Printf("%-6s seats %d  next seat at %s\n", u.Name, u.Seats, u.Next.Text)
	}
	// Output:
	// Orlen  seats 6  next seat at 63430.769
	// Tamsk  seats 4  next seat at 59766.667
	// Brevia seats 2  next seat at 60480
}

func TestPreparedMatchesAllot(t *testing.T) {
	one, two := 1, 2
	units := func() []engine.Unit {
		return []engine.Unit{
			{Name: "Orlen", Population: engine.Whole(412300)},
			{Name: "Tamsk", Population: engine.Whole(268950), Min: &two},
			{Name: "Brevia", Population: engine.Decimal{Coef: 1512005, Places: 1}},
			{Name: "Quillmarch", Population: engine.Whole(87640), Max: &one},
			{Name: "Ostend Isles", Population: engine.Whole(19875)},
			{Name: "Vell", Population: engine.Whole(19875)},
		}
	}
	for _, c := range []struct {
		name string
		s    engine.Scenario
	}{
		{"jefferson", engine.Scenario{Method: engine.Jefferson, Seats: 25}},
		{"huntington-hill with a minimum", engine.Scenario{Method: engine.HuntingtonHill, Seats: 30, Min: 1}},
		{"webster tie reported", engine.Scenario{Method: engine.Webster, Seats: 23}},
		{"webster tie by lot", engine.Scenario{Method: engine.Webster, Seats: 66, Tie: engine.TieRule{Kind: engine.TieByLot, Seed: 7}}},
		{"hamilton", engine.Scenario{Method: engine.Hamilton, Seats: 21}},
		{"droop with a threshold", engine.Scenario{Method: engine.Droop, Seats: 18, Threshold: engine.Decimal{Coef: 5, Places: 2}}},
	} {
		for _, d := range []engine.Detail{0, engine.WithOrder, engine.WithMargins, engine.Full, engine.SeatsOnly} {
			s := c.s
			s.Units = units()
			want, werr := engine.Allot(&s, d)
			p, err := engine.Prepare(&s)
			if err != nil {
				t.Fatalf("%s: Prepare: %v", c.name, err)
			}
			for k := range s.Units {
				s.Units[k] = engine.Unit{} // the Prepared keeps no reference to them
			}
			s.Units = nil
			for run := 1; run <= 2; run++ {
				got, err := p.Allot(d)
				if fmt.Sprint(err) != fmt.Sprint(werr) || !reflect.DeepEqual(got, want) {
					t.Errorf("%s, detail %d, call %d: Prepared.Allot differs from Allot:\n%+v, %v\n%+v, %v", c.name, d, run, got, err, want, werr)
				}
			}
		}
	}
}

func TestPrepareErrors(t *testing.T) {
	for _, c := range []struct {
		name string
		s    engine.Scenario
	}{
		{"no method", engine.Scenario{Seats: 3, Units: []engine.Unit{{Name: "Orlen", Population: engine.Whole(5)}}}},
		{"duplicate name", engine.Scenario{Method: engine.Webster, Seats: 3, Units: []engine.Unit{
			{Name: "Orlen", Population: engine.Whole(5)}, {Name: "Orlen", Population: engine.Whole(6)}}}},
		{"too few seats for Adams", engine.Scenario{Method: engine.Adams, Seats: 1, Units: []engine.Unit{
			{Name: "Orlen", Population: engine.Whole(5)}, {Name: "Tamsk", Population: engine.Whole(6)}}}},
	} {
		_, want := engine.Allot(&c.s, 0)
		p, err := engine.Prepare(&c.s)
		if want == nil || p != nil || !reflect.DeepEqual(err, want) {
			t.Errorf("%s: Prepare = %v, %v; Allot's error %v", c.name, p, err, want)
		}
	}
}
