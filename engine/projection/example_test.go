package projection_test

import (
	"context"
	"fmt"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/projection"
)

// Three invented districts, counted in 2010 and 2020, share seven seats by
// Webster's method. Project them to 2030 and estimate, with
// a two percent error on every projection, how likely each is to gain or
// lose a seat against the seats it has now.
func Example() {
	counts, err := projection.ReadCounts("districts.csv", strings.NewReader(`name,date,population
Alder,2010,1000000
Alder,2020,1300000
Birch,2010,2000000
Birch,2020,1820000
Cedar,2010,900000
Cedar,2020,1000000
`))
	if err != nil {
		fmt.Println(err)
		return
	}
	counts.Scenario.Seats, counts.Scenario.Method = 7, engine.Webster
	target, _ := projection.ParseDate("2030")
	st, err := projection.New(counts, projection.Options{
		Target: &target, RSE: 0.02, Draws: 10_000, Seed: 1, Contest: 1,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	if err := st.RunAll(context.Background()); err != nil {
		fmt.Println(err)
		return
	}
	s := st.Summary()
	for _, u := range s.Units {
		fmt.Printf("%s: %s in 2030, seats now %d, projected %d, lose %.2f, gain %.2f\n",
			u.Name, u.Central, u.BaselineSeats, u.CentralSeats, u.Lose.P, u.Gain.P)
	}
	// Output:
	// Alder: 1600000 in 2030, seats now 2, projected 2, lose 0.00, gain 0.19
	// Birch: 1640000 in 2030, seats now 3, projected 3, lose 0.19, gain 0.00
	// Cedar: 1100000 in 2030, seats now 2, projected 2, lose 0.00, gain 0.00
}
