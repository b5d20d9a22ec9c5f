package analysis

import (
	"math/big"

	"seatsmith/engine"
)

// A GrowthSet is the population paradox search by several methods.
type GrowthSet struct {
	// Scenario is the first scenario (its method is not used).
	Scenario engine.Scenario
	Methods  []engine.Method
	Results  []*PopulationResult // nil where the method failed
	Errors   []error
}

// FindGrowth runs [FindPopulation] for every method in ms (all when
// empty), at s's house size, with later's populations. An error that is
// not the engine's (the two population sets do not match) is returned.
func FindGrowth(s, later engine.Scenario, ms []engine.Method) (*GrowthSet, error) {
	ms = methodsOr(ms)
	g := &GrowthSet{Scenario: s, Methods: ms, Results: make([]*PopulationResult, len(ms)), Errors: make([]error, len(ms))}
	for k, m := range ms {
		s.Method = m
		g.Results[k], g.Errors[k] = FindPopulation(&s, &later)
		if _, ok := g.Errors[k].(*engine.Error); g.Errors[k] != nil && !ok {
			return nil, g.Errors[k]
		}
	}
	return g, nil
}

// First returns the first successful result, or nil.
func (g *GrowthSet) First() *PopulationResult { return firstOf(g.Results) }

// Unsettled reports whether a tie left seats unassigned in either
// apportionment by any method.
func (g *GrowthSet) Unsettled() bool {
	for _, r := range g.Results {
		if r != nil && (r.Before.Unassigned > 0 || r.After.Unassigned > 0) {
			return true
		}
	}
	return false
}

// An AdmitSet is the new-states test by several methods.
type AdmitSet struct {
	// Scenario is the scenario the unit joins (its method is not used).
	Scenario engine.Scenario
	Unit     engine.Unit
	Methods  []engine.Method
	Results  []*NewStates // nil where the method failed
	Errors   []error
}

// Admit runs [FindNewStates] for every method in ms (all when empty).
func Admit(s engine.Scenario, u engine.Unit, added int, ms []engine.Method) *AdmitSet {
	ms = methodsOr(ms)
	a := &AdmitSet{Scenario: s, Unit: u, Methods: ms, Results: make([]*NewStates, len(ms)), Errors: make([]error, len(ms))}
	for k, m := range ms {
		s.Method = m
		a.Results[k], a.Errors[k] = FindNewStates(&s, u, added)
	}
	return a
}

// First returns the first successful result, or nil.
func (a *AdmitSet) First() *NewStates { return firstOf(a.Results) }

// Unsettled reports whether a tie left seats unassigned before or after
// the admission by any method.
func (a *AdmitSet) Unsettled() bool {
	for _, r := range a.Results {
		if r != nil && (r.Before.Unassigned > 0 || r.After.Unassigned > 0) {
			return true
		}
	}
	return false
}

// Growth returns to/from − 1 exactly, or nil when from is zero.
func Growth(from, to engine.Decimal) *big.Rat {
	if from.IsZero() {
		return nil
	}
	g := new(big.Rat).Quo(ratOf(to), ratOf(from))
	return g.Sub(g, big.NewRat(1, 1))
}
