package analysis

import "seatsmith/engine"

// A SweepSet is one scenario swept over a range of house sizes by one or
// more methods, with the Alabama paradoxes found in each sweep.
type SweepSet struct {
	// Scenario is the scenario swept (its house size and method are not
	// used): its bounds tell which quota violations they cause.
	Scenario engine.Scenario
	From, To int
	Methods  []engine.Method
	// Sweeps[k] is the sweep by Methods[k], or nil when that method can
	// apportion no size in the range; Errors[k] then says why.
	Sweeps    []*engine.SweepResult
	Errors    []error
	Paradoxes [][]Alabama

	violations [][]QuotaViolation
	found      []bool
}

// SweepAll sweeps s from from to to by every method in ms (all methods
// when ms is empty) and finds the Alabama paradoxes of each sweep.
func SweepAll(s engine.Scenario, ms []engine.Method, from, to int) *SweepSet {
	ms = methodsOr(ms)
	set := &SweepSet{Scenario: s, From: from, To: to, Methods: ms, Sweeps: make([]*engine.SweepResult, len(ms)),
		Errors: make([]error, len(ms)), Paradoxes: make([][]Alabama, len(ms)),
		violations: make([][]QuotaViolation, len(ms)), found: make([]bool, len(ms))}
	for k, m := range ms {
		s.Method = m
		set.Sweeps[k], set.Errors[k] = engine.Sweep(&s, from, to)
		if set.Sweeps[k] != nil {
			set.Paradoxes[k] = FindAlabama(set.Sweeps[k])
		}
	}
	return set
}

// First returns the first sweep that succeeded, or nil.
func (set *SweepSet) First() *engine.SweepResult { return firstOf(set.Sweeps) }

// Violations returns the quota violations of sweep k (see
// [FindQuotaViolations]), found the first time they are asked for.
func (set *SweepSet) Violations(k int) []QuotaViolation {
	if set.Sweeps[k] == nil {
		return nil
	}
	if !set.found[k] {
		s := set.Scenario
		s.Method = set.Methods[k]
		set.violations[k], set.found[k] = FindQuotaViolations(set.Sweeps[k], &s), true
	}
	return set.violations[k]
}

// Unsettled reports whether a tie left seats unassigned at some size of
// some sweep.
func (set *SweepSet) Unsettled() bool {
	for _, sw := range set.Sweeps {
		if sw == nil {
			continue
		}
		for k := range sw.Sizes {
			if sw.Sizes[k].Unassigned > 0 {
				return true
			}
		}
	}
	return false
}

// UnsettledSizes returns the house sizes of sweep sw at which a tie left
// seats unassigned.
func UnsettledSizes(sw *engine.SweepResult) []int {
	var hs []int
	for k := range sw.Sizes {
		if z := &sw.Sizes[k]; z.Err == nil && z.Unassigned > 0 {
			hs = append(hs, z.House)
		}
	}
	return hs
}
