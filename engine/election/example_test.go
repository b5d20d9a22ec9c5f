package election_test

import (
	"fmt"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/election"
)

// A biproportional election in two invented districts: the parties' seats
// over the whole election first, then the seats within the districts, with
// the divisors that certify them.
func ExampleCompute() {
	s := &election.Scenario{
		System: election.Biproportional,
		Method: engine.Webster,
		Districts: []election.District{
			{Name: "Northmarch", Seats: 6},
			{Name: "Southmarch", Seats: 4},
		},
		Votes: []election.Vote{
			{District: "Northmarch", Party: "Lantern", Votes: engine.Whole(5100)},
			{District: "Northmarch", Party: "Harbour", Votes: engine.Whole(2900)},
			{District: "Southmarch", Party: "Lantern", Votes: engine.Whole(1700)},
			{District: "Southmarch", Party: "Harbour", Votes: engine.Whole(2800)},
		},
	}
	res, err := election.Compute(s)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, p := range res.Parties {
		fmt.Printf("%s: %d seats, divisor %s\n", p.Name, p.Seats, p.Divisor)
	}
	for _, d := range res.Districts {
		fmt.Printf("%s: divisor %s\n", d.Name, d.Divisor)
	}
	for _, c := range res.Cells {
		fmt.Printf("%s in %s: %d\n", res.Parties[c.Party].Name, res.Districts[c.District].Name, c.Seats)
	}
	fmt.Println("unique:", res.Certificate.Strict)
	// Output:
	// Lantern: 5 seats, divisor 1.1
	// Harbour: 5 seats, divisor 1
	// Northmarch: divisor 1300
	// Southmarch: divisor 1100
	// Lantern in Northmarch: 4
	// Harbour in Northmarch: 2
	// Lantern in Southmarch: 1
	// Harbour in Southmarch: 3
	// unique: true
}

// Reading an election from CSV: vote rows, then the districts' seats
// after a blank line.
func ExampleRead() {
	csv := "district,party,votes\nNorthmarch,Lantern,5100\nNorthmarch,Harbour,2900\n\ndistrict,seats\nNorthmarch,6\n"
	src, err := election.Read("votes.csv", strings.NewReader(csv))
	if err != nil {
		fmt.Println(err)
		return
	}
	src.Scenario.System, src.Scenario.Method = election.Districts, engine.Jefferson
	res, err := src.Compute()
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, p := range res.Parties {
		fmt.Println(p.Name, p.Seats)
	}
	// Output:
	// Lantern 4
	// Harbour 2
}
