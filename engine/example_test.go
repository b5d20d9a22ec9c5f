package engine_test

import (
	"fmt"

	"seatsmith/engine"
)

// The invented federation of Vessaria divides its 20-seat assembly among
// five provinces by Huntington–Hill, every province at least one seat.
// (Invented figures; an apportionment computed here is not an official
// one.)
func ExampleAllot() {
	pop := func(s string) engine.Decimal {
		d, err := engine.ParseDecimal(s)
		if err != nil {
			panic(err)
		}
		return d
	}
	s := &engine.Scenario{
		Method: engine.HuntingtonHill,
		Seats:  20,
		Min:    1,
		Units: []engine.Unit{
			{Name: "Orlen", Population: pop("412300")},
			{Name: "Tamsk", Population: pop("268950")},
			{Name: "Brevia", Population: pop("151200")},
			{Name: "Quillmarch", Population: pop("87640")},
			{Name: "Ostend Isles", Population: pop("19875")},
		},
	}
	res, err := engine.Allot(s, engine.WithMargins)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, u := range res.Units {
		fmt.Printf("%-12s seats %2d  quota %-8s gain margin %s\n", u.Name, u.Seats, u.Quota.Text, u.Gain)
	}
	fmt.Println("divisor certificate:", res.Divisor.Certificate)
	// Output:
	// Orlen        seats  8  quota 8.772667 gain margin 4356
	// Tamsk        seats  6  quota 5.722553 gain margin 88113
	// Brevia       seats  3  quota 3.217141 gain margin 18899
	// Quillmarch   seats  2  quota 1.864750 gain margin 32639
	// Ostend Isles seats  1  quota 0.422888 gain margin 49568
	// divisor certificate: 49000
}

func ExampleParseMethod() {
	for _, s := range []string{"D'Hondt", "Sainte-Laguë", "huntington hill", "plurality"} {
		m, err := engine.ParseMethod(s)
		if err != nil {
			fmt.Println("error:", err)
			continue
		}
		fmt.Printf("%s -> %s (%s)\n", s, m, m.Name())
	}
	// Output:
	// D'Hondt -> jefferson (Jefferson (D'Hondt))
	// Sainte-Laguë -> webster (Webster (Sainte-Laguë))
	// huntington hill -> huntington-hill (Huntington–Hill)
	// error: method: unknown method "plurality"; known: hamilton, droop, jefferson, webster, adams, dean, huntington-hill, modified-sainte-lague
}

func ExampleParseDecimal() {
	for _, s := range []string{"1250", "1250.750", "0.5", "-3", "1e6"} {
		d, err := engine.ParseDecimal(s)
		if err != nil {
			fmt.Printf("%s: %v\n", s, err)
			continue
		}
		fmt.Printf("%s: %s\n", s, d)
	}
	// Output:
	// 1250: 1250
	// 1250.750: 1250.75
	// 0.5: 0.5
	// -3: negative
	// 1e6: not a number
}

// Three equal districts of the invented Brevia school board share four
// seats: the fourth is a tie, reported and left open unless a rule settles
// it.
func ExampleTie() {
	s := &engine.Scenario{Method: engine.Webster, Seats: 4, Units: []engine.Unit{
		{Name: "North Varda", Population: engine.Whole(1200)},
		{Name: "Yssel Reach", Population: engine.Whole(1200)},
		{Name: "Corrin Vale", Population: engine.Whole(1200)},
	}}
	res, _ := engine.Allot(s, 0)
	t := res.Ties[0]
	fmt.Printf("%v tie for %d seat; %d unassigned\n", t.Names, t.Seats, res.Unassigned)
	s.Tie, _ = engine.ParseTieRule("lot:2026")
	res, _ = engine.Allot(s, 0)
	fmt.Printf("by %s: %s wins it\n", res.Ties[0].Rule, res.Units[res.Ties[0].Winners[0]].Name)
	// Output:
	// [North Varda Yssel Reach Corrin Vale] tie for 1 seat; 1 unassigned
	// by lot:2026: Yssel Reach wins it
}
