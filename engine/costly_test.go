package engine

import "testing"

func TestCostlyMargins(t *testing.T) {
	one, zero := 1, 0
	units := func(min, max *int) []Unit {
		return []Unit{{Name: "A", Population: Whole(5), Min: min, Max: max}, {Name: "B", Population: Whole(7)}}
	}
	th, _ := ParseDecimal("0.05")
	for _, c := range []struct {
		name           string
		s              Scenario
		bounds, costly bool
	}{
		{"Webster", Scenario{Units: units(nil, nil), Seats: 3, Method: Webster}, false, false},
		{"Webster with a minimum", Scenario{Units: units(nil, nil), Seats: 3, Method: Webster, Min: 1}, true, false},
		{"Webster with a threshold", Scenario{Units: units(nil, nil), Seats: 3, Method: Webster, Threshold: th}, false, true},
		{"Hamilton", Scenario{Units: units(nil, nil), Seats: 3, Method: Hamilton}, false, false},
		{"Hamilton, a unit's minimum of zero", Scenario{Units: units(&zero, nil), Seats: 3, Method: Hamilton}, false, false},
		{"Hamilton, a unit's minimum", Scenario{Units: units(&one, nil), Seats: 3, Method: Hamilton}, true, true},
		{"Hamilton, a unit's maximum", Scenario{Units: units(nil, &one), Seats: 3, Method: Hamilton}, true, true},
		{"Droop with a cap", Scenario{Units: units(nil, nil), Seats: 3, Method: Droop, Max: 2}, true, true},
	} {
		if got := c.s.HasBounds(); got != c.bounds {
			t.Errorf("%s: HasBounds %v, want %v", c.name, got, c.bounds)
		}
		if got := c.s.CostlyMargins(); got != c.costly {
			t.Errorf("%s: CostlyMargins %v, want %v", c.name, got, c.costly)
		}
	}
}
