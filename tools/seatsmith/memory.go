package main

import "runtime/debug"

// Large inputs: the collector's soft memory limit is set from the number of
// units, so that the garbage made while writing a million units' results
// is collected before it doubles the process's memory, as the default rule
// (collect when the heap has doubled) would let it. The result itself
// takes about 350 bytes a unit; the limit leaves some room above that.
const (
	limitFromUnits   = 100_000
	limitBytesByUnit = 450
)

// limitMemory sets the soft memory limit for an input of n units.
func limitMemory(n int) {
	if n >= limitFromUnits {
		debug.SetMemoryLimit(int64(n) * limitBytesByUnit)
	}
}
