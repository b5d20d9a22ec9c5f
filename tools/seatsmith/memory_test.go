package main

import (
	"strconv"
	"testing"

	"seatsmith/engine"
)

func TestMemoryLimit(t *testing.T) {
	units := func(n int) []engine.Unit {
		us := make([]engine.Unit, n)
		for i := range us {
			us[i] = engine.Unit{Name: "d" + strconv.Itoa(i%10), Population: engine.Whole(1000)} // two-byte names
		}
		return us
	}
	n := int64(limitFromUnits)
	for _, c := range []struct {
		name   string
		s      engine.Scenario
		detail engine.Detail
		want   int64
	}{
		{"small input: no limit", engine.Scenario{Units: units(limitFromUnits - 1), Seats: 10}, engine.Full, 0},
		{"units and names", engine.Scenario{Units: units(limitFromUnits), Seats: 10}, 0, limitBase + n*(limitBytesByUnit+2)},
		{"with margins", engine.Scenario{Units: units(limitFromUnits), Seats: 10}, engine.WithMargins,
			limitBase + n*(limitBytesByUnit+2+limitBytesByMargin)},
		{"with the seat order", engine.Scenario{Units: units(limitFromUnits), Seats: 1_000_000}, engine.WithOrder,
			limitBase + n*(limitBytesByUnit+2) + 1_000_000*limitBytesBySeat},
	} {
		if got := memoryLimit(&c.s, c.detail); got != c.want {
			t.Errorf("%s: limit %d, want %d", c.name, got, c.want)
		}
	}
}
