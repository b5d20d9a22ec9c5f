package engine_test

import (
	"fmt"

	"seatsmith/engine"
)

// The invented town of Hollowmere fills a 5-seat board from four wards
// and compares three methods. Adams cannot: it gives every ward a first
// seat before any gets a second, and five seats are too few for that
// with the three seats the largest ward is owed. (Invented figures;
// not an official apportionment.)
func ExampleAllotMethods() {
	three := 3
	s := &engine.Scenario{
		Seats: 5,
		Units: []engine.Unit{
			{Name: "Mill Ward", Population: engine.Whole(5400), Min: &three},
			{Name: "Fenside", Population: engine.Whole(2100)},
			{Name: "Larch Hill", Population: engine.Whole(1300)},
			{Name: "Tollgate", Population: engine.Whole(700)},
		},
	}
	methods := []engine.Method{engine.Jefferson, engine.Webster, engine.Adams}
	results, errs := engine.AllotMethods(s, methods, engine.SeatsOnly)
	for k, m := range methods {
		if errs[k] != nil {
			fmt.Printf("%-9s %v\n", m, errs[k])
			continue
		}
		fmt.Printf("%-9s", m)
		for _, u := range results[k].Units {
			fmt.Printf(" %s %d", u.Name, u.Seats)
		}
		fmt.Println()
	}
	// Output:
	// jefferson Mill Ward 4 Fenside 1 Larch Hill 0 Tollgate 0
	// webster   Mill Ward 3 Fenside 1 Larch Hill 1 Tollgate 0
	// adams     seats: Adams gives every unit with people a seat before any unit gets two: 4 units with people (and the minimums) need 6 seats, more than the house size 5
}
