package calc_test

import (
	"fmt"

	"seatsmith/site/calc"
)

// A page's calculator block, answered as the browser asks for it. The
// scenario is invented.
func ExampleAnswer() {
	block := `{"seats": 15, "method": "webster",
	  "units": [{"name": "North", "population": 5200}, {"name": "South", "population": 3900}],
	  "claims": [{"id": "north-nine", "kind": "seats", "unit": "North", "seats": 9}]}`
	resp := calc.Answer(&calc.Request{BlockText: block, ID: "council"})
	fmt.Println(resp.Outcome.State())
	for _, v := range resp.Outcome.Verdicts {
		fmt.Println(v.Claim.ID, v.Holds, v.Found)
	}
	// Output:
	// live
	// north-nine true North gets 9 seats under Webster (Sainte-Laguë) at 15 seats
}
