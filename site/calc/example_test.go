package calc_test

import (
	"fmt"

	"seatsmith/engine/jsondoc"
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

// A link to a proposal against a pinned baseline: the baseline raises the
// block's house to 16 seats; the proposal then gives South another 400
// people. The scenario is invented.
func ExampleEncodeLink() {
	parse := func(s string) *jsondoc.Value {
		v, _ := jsondoc.Parse([]byte(s))
		return v
	}
	block := parse(`{"seats": 15, "method": "webster", "units": [{"name": "North", "population": 5200}, {"name": "South", "population": 3900}]}`)
	base := parse(`{"seats": 16, "method": "webster", "units": [{"name": "North", "population": 5200}, {"name": "South", "population": 3900}]}`)
	prop := parse(`{"seats": 16, "method": "webster", "units": [{"name": "North", "population": 5200}, {"name": "South", "population": 4300}]}`)
	link := calc.EncodeLink(block, base, prop)
	fmt.Println(link)
	b, s, err := calc.DecodeLink(block, link)
	fmt.Println(string(jsondoc.Marshal(b.Get("seats"))), string(jsondoc.Marshal(s.Get("units").Items[1])), err)
	// Output:
	// ~s16!u,~4300
	// "16" {"name":"South","population":"4300"} <nil>
}
