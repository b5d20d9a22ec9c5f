package election_test

import (
	"fmt"

	"seatsmith/engine/jsondoc"
	"seatsmith/site/election"
)

// An invented council of two districts under the block's three systems.
func Example() {
	doc, _ := jsondoc.Parse([]byte(`{"compensatory": 2,
 "districts": [{"name": "North", "seats": 5}, {"name": "South", "seats": 3}],
 "votes": [{"district": "North", "party": "Lark", "votes": 5200}, {"district": "North", "party": "Fern", "votes": 3100},
  {"district": "North", "party": "Moth", "votes": 900}, {"district": "South", "party": "Lark", "votes": 2100},
  {"district": "South", "party": "Fern", "votes": 2900}, {"district": "South", "party": "Moth", "votes": 300}],
 "claims": [{"id": "cert", "kind": "certificate"}]}`))
	c, err := election.Parse("council.json", 1, doc)
	if err != nil {
		fmt.Println(err)
		return
	}
	o, err := c.Run()
	if err != nil {
		fmt.Println(err)
		return
	}
	for i, sys := range election.Systems {
		fmt.Print(election.SystemTitle(sys), ":")
		for _, p := range o.Results[i].Parties {
			fmt.Print(" ", p.Name, " ", p.Seats)
		}
		fmt.Println()
	}
	fmt.Println(c.Claims[0].Check(c, o).Holds)
	// Output:
	// Per-district D'Hondt: Lark 4 Fern 4 Moth 0
	// Two-tier compensation: Lark 5 Fern 4 Moth 1
	// Biproportional Sainte-Laguë: Lark 4 Fern 3 Moth 1
	// true
}
