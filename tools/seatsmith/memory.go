package main

import (
	"runtime/debug"

	"seatsmith/engine"
)

// Large inputs: the collector's soft memory limit is set from the size of
// the scenario, so that the garbage made while apportioning and while
// writing a million units' results is collected before it doubles the
// process's memory, as the default rule (collect when the heap has
// doubled) would let it. Apportioning holds at most about 350 bytes a unit
// besides the names, the result about 290 (text fields in shared blocks,
// see engine.Prepare for why the input's units are gone by then); the
// limit leaves some room above the first. The margins and the seat order
// add their own parts when asked for.
const (
	limitFromUnits     = 100_000
	limitBase          = 16 << 20 // the runtime, the program, buffers
	limitBytesByUnit   = 380
	limitBytesByMargin = 48  // a unit's gain and lose margins
	limitBytesBySeat   = 128 // a seat in the seat order
)

// memoryLimit is the soft memory limit for apportioning s with the given
// detail, or 0 for none.
func memoryLimit(s *engine.Scenario, detail engine.Detail) int64 {
	n := int64(len(s.Units))
	if n < limitFromUnits {
		return 0
	}
	b := limitBase + n*limitBytesByUnit
	for i := range s.Units {
		b += int64(len(s.Units[i].Name))
	}
	if detail&engine.WithMargins != 0 {
		b += n * limitBytesByMargin
	}
	if detail&engine.WithOrder != 0 {
		b += int64(s.Seats) * limitBytesBySeat
	}
	return b
}

// limitMemory sets the soft memory limit for apportioning s.
func limitMemory(s *engine.Scenario, detail engine.Detail) {
	if b := memoryLimit(s, detail); b > 0 {
		debug.SetMemoryLimit(b)
	}
}
