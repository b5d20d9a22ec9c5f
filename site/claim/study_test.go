package claim

import (
	"strings"
	"testing"

	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
)

// vessaria is the invented federation of the site's pages: nine provinces,
// 40 seats, at least one each. The findings below are the engine's, not
// taken from a source: Hamilton's method takes a seat from Sarrow from 40
// to 41 seats; a later count with Sarrow +3.0% and Caldmoor +2.0% moves a
// seat from Sarrow to Caldmoor; admitting a tenth province of 350,000 with
// its 2 seats does the same.
func vessaria() engine.Scenario {
	pops := []uint64{2694457, 2079562, 1178082, 977496, 588225, 344546, 188940, 93288, 55971}
	names := []string{"Orlen", "Tamsk", "Brevia", "Caldmoor", "Pellin Reach", "Sarrow", "Upper Vell", "Keddle Isles", "Marrowgate"}
	s := engine.Scenario{Seats: 40, Method: engine.Hamilton, Min: 1}
	for i, p := range pops {
		s.Units = append(s.Units, engine.Unit{Name: names[i], Population: engine.Whole(p)})
	}
	return s
}

func laterCount() []engine.Decimal {
	s := vessaria()
	later := make([]engine.Decimal, len(s.Units))
	for i, u := range s.Units {
		later[i] = u.Population
	}
	later[3], later[5] = engine.Whole(997000), engine.Whole(354900)
	return later
}

func TestCheckStudies(t *testing.T) {
	sweep := Context{From: 30, To: 45}
	growth := Context{Later: laterCount()}
	admit := Context{Admit: &engine.Unit{Name: "Ostry Fen", Population: engine.Whole(350000)}, Added: -1}
	cases := []struct {
		claim string
		ctx   Context
		holds bool
		found string
	}{
		{`{"id": "a", "kind": "no-alabama", "method": "webster"}`, sweep, true, "no unit loses a seat as the house grows under Webster (Sainte-Laguë) from 30 to 45"},
		{`{"id": "a", "kind": "no-alabama"}`, sweep, false, "1 Alabama paradox from 30 to 45; the first: Hamilton (Hare quota): Sarrow has 2 seats in a house of 40 but 1 in a house of 41"},
		{`{"id": "a", "kind": "no-alabama", "method": "droop", "from": 36, "to": 44}`, Context{}, false, "2 Alabama paradoxes from 36 to 44"},
		{`{"id": "a", "kind": "no-alabama", "unit": "Orlen", "from": 30, "to": 45}`, Context{}, true, "Orlen never loses a seat"},
		{`{"id": "a", "kind": "no-alabama", "from": 41, "to": 45}`, sweep, true, "from 41 to 45"},
		{`{"id": "a", "kind": "no-quota-violation", "from": 30, "to": 45}`, Context{}, true, "every unit gets its lower or upper quota at every size under Hamilton"},
		{`{"id": "a", "kind": "no-quota-violation", "method": "adams"}`, sweep, false, "10 quota violations from 30 to 45; the first: Adams, house of 31: Orlen gets 9 seats"},
		{`{"id": "a", "kind": "no-quota-violation", "method": "adams", "unit": "Sarrow"}`, sweep, true, "Sarrow gets its lower or upper quota"},
		{`{"id": "a", "kind": "population-paradox", "unit": "Sarrow"}`, growth, true, "Sarrow grew 3.01% (344546 → 354900), faster than Caldmoor at 2.00%"},
		{`{"id": "a", "kind": "population-paradox", "unit": "Sarrow", "gainer": "Orlen"}`, growth, false, "Sarrow gets 2 seats with the first populations and 1 with the later ones"},
		{`{"id": "a", "kind": "population-paradox", "unit": "Sarrow", "method": "webster"}`, growth, false, "no population paradox"},
		{`{"id": "a", "kind": "no-population-paradox", "method": "huntington-hill"}`, growth, true, "no unit loses a seat to a unit that grew more slowly under Huntington–Hill at 40 seats"},
		{`{"id": "a", "kind": "no-population-paradox"}`, growth, false, "1 population paradox; the first"},
		{`{"id": "a", "kind": "no-population-paradox", "unit": "Orlen"}`, growth, true, "Orlen loses no seat"},
		{`{"id": "a", "kind": "new-states", "unit": "Sarrow"}`, admit, true, "Caldmoor (4 → 5), Sarrow (2 → 1) (the new-states paradox)"},
		{`{"id": "a", "kind": "new-states", "unit": "Orlen"}`, admit, false, "Sarrow (2 → 1)"},
		{`{"id": "a", "kind": "no-new-states", "method": "webster"}`, admit, true, "Ostry Fen receives 2 seats, and no other unit's seats change"},
		{`{"id": "a", "kind": "no-new-states"}`, admit, false, "the new-states paradox"},
		// A claim whose block lacks what it needs does not hold, and says why.
		{`{"id": "a", "kind": "no-alabama"}`, Context{}, false, "needs a range of house sizes"},
		{`{"id": "a", "kind": "population-paradox", "unit": "Sarrow"}`, sweep, false, "needs later populations"},
		{`{"id": "a", "kind": "new-states"}`, growth, false, "needs a unit to admit"},
		{`{"id": "a", "kind": "no-alabama", "unit": "Nowhere", "from": 1, "to": 5}`, Context{}, false, `no unit named "Nowhere"`},
		// Adams cannot give nine provinces a seat each in a house of 8.
		{`{"id": "a", "kind": "no-alabama", "method": "adams", "from": 1, "to": 8}`, Context{}, false, "cannot be swept by Adams from 1 to 8"},
	}
	for _, c := range cases {
		cs := parse(t, "["+c.claim+"]")
		v := CheckIn(vessaria(), cs, c.ctx)[0]
		if v.Holds != c.holds || !strings.Contains(v.Found, c.found) {
			t.Errorf("%s: holds %v, found %q; want %v and %q", c.claim, v.Holds, v.Found, c.holds, c.found)
		}
	}
}

func TestStudyParseErrors(t *testing.T) {
	cases := []struct{ js, want string }{
		{`[{"id": "x", "kind": "alabama"}]`, "claims[0].unit: missing"},
		{`[{"id": "x", "kind": "population-paradox"}]`, "claims[0].unit: missing"},
		{`[{"id": "x", "kind": "no-alabama", "house": 40}]`, "claims[0].house: a no-alabama claim covers house sizes from and to"},
		{`[{"id": "x", "kind": "seats", "unit": "A", "seats": 1, "from": 3}]`, "claims[0].from: only no-alabama and no-quota-violation"},
		{`[{"id": "x", "kind": "no-alabama", "from": 3}]`, "claims[0].from: give both from and to"},
		{`[{"id": "x", "kind": "no-alabama", "from": 9, "to": 3}]`, "claims[0].from: must not be above to"},
		{`[{"id": "x", "kind": "no-alabama", "from": 0, "to": 3}]`, "claims[0].from: must be a house size"},
		{`[{"id": "x", "kind": "seats", "unit": "A", "seats": 1, "gainer": "B"}]`, "claims[0].gainer: only a population-paradox claim"},
		{`[{"id": "x", "kind": "population-paradox", "unit": "A", "gainer": ""}]`, "claims[0].gainer: must be a non-empty string"},
	}
	for _, c := range cases {
		v, err := jsondoc.Parse([]byte(c.js))
		if err != nil {
			t.Fatal(err)
		}
		_, err = Parse(v)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: got %v, want %q", c.js, err, c.want)
		}
	}
}

func TestStudyStatements(t *testing.T) {
	for js, want := range map[string]string{
		`{"id": "a", "kind": "no-alabama", "from": 30, "to": 45}`:                         "Under Hamilton (Hare quota), no unit loses a seat as the house grows from 30 to 45",
		`{"id": "a", "kind": "no-quota-violation", "unit": "Orlen"}`:                      "Under Hamilton (Hare quota), Orlen gets its lower or upper quota at every house size in the range swept",
		`{"id": "a", "kind": "population-paradox", "unit": "Sarrow", "gainer": "Brevia"}`: "Sarrow grows at least as fast as Brevia yet loses a seat to it under Hamilton (Hare quota) at 40 seats",
		`{"id": "a", "kind": "no-new-states", "method": "webster"}`:                       "Admitting the new unit with its added seats leaves every other unit's seats as they were under Webster (Sainte-Laguë) at 40 seats",
	} {
		c := parse(t, "["+js+"]")[0]
		if got := c.Statement(engine.Hamilton, 40); got != want {
			t.Errorf("%s:\n got %q\nwant %q", js, got, want)
		}
	}
}
