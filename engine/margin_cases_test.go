package engine

import "testing"

// Scenarios whose margins once took the engine minutes, or came out
// different from the reference search (margin_ref_test.go), each named for
// what it shows. Each must finish (a hang is caught by go test -timeout)
// and its margins must equal the search's, or counting where the search
// is known to be wrong (checkMarginsMatchSearch).

// marginCase is one scenario of TestMarginCases.
type marginCase struct {
	name      string
	m         Method
	seats     int
	min, max  int     // the scenario's default bounds
	threshold Decimal // zero for none
	tie       TieRule
	units     []caseUnit
}

// caseUnit is a unit of a marginCase: its population as text, and its own
// bounds (-1 for the scenario's).
type caseUnit struct {
	pop      string
	min, max int
}

// unitPop is a unit of a marginCase with the scenario's bounds.
func unitPop(pop string) caseUnit { return caseUnit{pop: pop, min: -1, max: -1} }

// scenario builds the case's scenario; the units are named by position.
func (c *marginCase) scenario(t *testing.T) *Scenario {
	s := &Scenario{Method: c.m, Seats: c.seats, Min: c.min, Max: c.max, Threshold: c.threshold, Tie: c.tie}
	for k, x := range c.units {
		p, err := ParseDecimal(x.pop)
		if err != nil {
			t.Fatal(err)
		}
		un := Unit{Name: "unit " + string(rune('A'+k%26)) + suffix(k), Population: p}
		if x.min >= 0 {
			un.Min = &x.min
		}
		if x.max >= 0 {
			un.Max = &x.max
		}
		s.Units = append(s.Units, un)
	}
	return s
}

var marginCases = []marginCase{
	{
		// The second pass (41 seats) has one large unit beside units of a
		// few people: its quota moves every 42 people while that unit's
		// whole part stays 126 people short of the next one. The largest
		// population with the smallest quota, a pair that never occurs,
		// would give it one more; proving the passes over populations and
		// quotas taken apart cut its gain into stretches of 126 people
		// over 5·10^12.
		name: "droop whole part a few people short of the next all along",
		m:    Droop, seats: 209, max: 84,
		units: []caseUnit{unitPop("0"), unitPop("1"), {pop: "6", min: -1, max: 173}, unitPop("153105302"),
			unitPop("6993930165"), unitPop("4865485723"), unitPop("3"), unitPop("62"), unitPop("14")},
	},
	{
		// Units of equal population, one at its maximum of none, tie at
		// the cut with units free of their bounds. The one at its maximum
		// ranks last among them all along; holding every tie against it
		// as a change of pass cut every stretch to one quota's width.
		name: "droop tie at the cut between units at their maximum and free units",
		m:    Droop, seats: 4, tie: TieRule{Kind: TieByOrder},
		units: []caseUnit{{pop: "6299165.0029", min: -1, max: 0}, unitPop("6299165.0029"), unitPop("311.1292"),
			unitPop("6299165.0029"), {pop: "6299165.0029", min: -1, max: 4}, {pop: "6299165.0029", min: -1, max: 2},
			unitPop("4.0858"), unitPop("6299165.0029"), unitPop("0"), unitPop("147637.0068"),
			{pop: "0", min: -1, max: 4}, unitPop("32.0005")},
	},
	{
		// A unit that needs its seat to reach its minimum ties at the cut
		// with a free one of the same population: it takes the seat all
		// along, while the large unit's loss runs through ten million
		// people.
		name: "droop tie at the cut between a unit that needs the seat and a free one",
		m:    Droop, seats: 37, tie: TieRule{Kind: TieByLot},
		units: []caseUnit{{pop: "1", min: -1, max: 31}, unitPop("1"), {pop: "31505", min: 1, max: -1},
			unitPop("1"), unitPop("1"), unitPop("11263745"), unitPop("31505"), {pop: "1", min: 1, max: -1},
			unitPop("9"), unitPop("1"), unitPop("1")},
	},
	{
		// A unit at its maximum loses from 1.5·10^9 people down through
		// every whole part of the first pass, each crossed many times as
		// the quota steps: the stretches are looked for from where a
		// whole part is next due to change.
		name: "droop unit at its maximum losing through many quota steps",
		m:    Droop, seats: 868, max: 436, tie: TieRule{Kind: TieByLot},
		units: []caseUnit{unitPop("100000000"), unitPop("91"), {pop: "100000000", min: -1, max: 69},
			unitPop("33"), {pop: "33", min: -1, max: 10}, unitPop("13881"), unitPop("436"),
			{pop: "1539430237", min: 0, max: -1}, unitPop("5708"), unitPop("32"), unitPop("29"), unitPop("1662")},
	},
}

func TestMarginCases(t *testing.T) {
	for _, c := range marginCases {
		t.Run(c.name, func(t *testing.T) {
			s := c.scenario(t)
			if _, err := Allot(s, Full); err != nil {
				t.Fatal(err)
			}
			checkMarginsMatchSearch(t, s)
		})
	}
}

// A unit whose seat drops only at no people, where the others' maximums
// cannot fill the house, has no lose margin: there is no apportionment in
// which it loses the seat (a case the brute-force property test found).
func TestLoseMarginNeedsApportionment(t *testing.T) {
	c := marginCase{
		m: ModifiedSainteLague, seats: 5, tie: TieRule{Kind: TieByLot, Seed: 3},
		units: []caseUnit{{pop: "0.1", min: -1, max: 2}, {pop: "0.1", min: -1, max: 2}, unitPop("0"), unitPop("0.1")},
	}
	res, err := Allot(c.scenario(t), WithMargins)
	if err != nil {
		t.Fatal(err)
	}
	if u := res.Units[3]; u.Lose != nil {
		t.Errorf("%s holds %d seats and has a lose margin of %s; without people the others cannot be apportioned", u.Name, u.Seats, u.Lose)
	}
}
