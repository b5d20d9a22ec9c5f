package calc_test

import (
	"fmt"

	"seatsmith/engine/jsondoc"
	"seatsmith/site/calc"
)

// A page's calculator block, answered as the browser asks for it. The
// scenario is invented.
func ExampleLive() {
	block := `{"seats": 15, "method": "webster",
	  "units": [{"name": "North", "population": 5200}, {"name": "South", "population": 3900}],
	  "claims": [{"id": "north-nine", "kind": "seats", "unit": "North", "seats": 9}]}`
	req := jsondoc.NewObject().Set("block_text", jsondoc.Str(block)).Set("id", jsondoc.Str("council"))
	resp := calc.Live(req)
	fmt.Println(resp.Get("state").Text)
	for _, c := range resp.Get("claims").Items {
		fmt.Println(c.Get("id").Text, c.Get("holds").Bool, c.Get("found").Text)
	}
	// Output:
	// live
	// north-nine true North gets 9 seats under Webster (Sainte-Laguë) at 15 seats
}
