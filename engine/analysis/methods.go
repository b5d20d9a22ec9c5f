package analysis

import "seatsmith/engine"

// A Comparison is one scenario apportioned by several methods.
type Comparison struct {
	// Scenario is the scenario compared (its method is not used).
	Scenario engine.Scenario
	Methods  []engine.Method
	Results  []*engine.Result // nil where the method failed
	Errors   []error          // the failure, where Results[k] is nil
}

// CompareMethods apportions s by every method in ms (all methods when ms
// is empty). A method that cannot apportion s records its error instead
// of a result. detail is passed to [engine.AllotMethods]; 0 means
// [engine.SeatsOnly], all that a comparison shows.
func CompareMethods(s engine.Scenario, ms []engine.Method, detail engine.Detail) *Comparison {
	if len(ms) == 0 {
		ms = engine.Methods()
	}
	if detail == 0 {
		detail = engine.SeatsOnly
	}
	c := &Comparison{Scenario: s, Methods: ms}
	c.Results, c.Errors = engine.AllotMethods(&s, ms, detail)
	return c
}

// First returns the first successful result, or nil.
func (c *Comparison) First() *engine.Result { return firstOf(c.Results) }

// Differs reports whether the methods that succeeded give unit i different
// seats.
func (c *Comparison) Differs(i int) bool {
	seen := -1
	for _, r := range c.Results {
		if r == nil {
			continue
		}
		if seen >= 0 && r.Units[i].Seats != seen {
			return true
		}
		seen = r.Units[i].Seats
	}
	return false
}

// QuotaViolations counts the units whose seats break quota under result k.
func (c *Comparison) QuotaViolations(k int) int {
	r := c.Results[k]
	if r == nil {
		return 0
	}
	n := 0
	for _, u := range r.Units {
		if !u.MeetsQuota {
			n++
		}
	}
	return n
}

// Unsettled reports whether a tie left seats unassigned under any method.
func (c *Comparison) Unsettled() bool {
	for _, r := range c.Results {
		if r != nil && r.Unassigned > 0 {
			return true
		}
	}
	return false
}

// firstOf returns the first result that is not nil.
func firstOf[T any](rs []*T) *T {
	for _, r := range rs {
		if r != nil {
			return r
		}
	}
	return nil
}

// methodsOr returns ms, or every method when ms is empty.
func methodsOr(ms []engine.Method) []engine.Method {
	if len(ms) == 0 {
		return engine.Methods()
	}
	return ms
}

// A MeasureSet is one scenario apportioned by several methods, with the
// disproportionality measures of each result.
type MeasureSet struct {
	Comparison *Comparison
	Measures   []*Measures // nil where the method failed
}

// MeasureAll apportions s by every method in ms (all when empty) and
// measures each result.
func MeasureAll(s engine.Scenario, ms []engine.Method) *MeasureSet {
	c := CompareMethods(s, ms, 0)
	set := &MeasureSet{Comparison: c, Measures: make([]*Measures, len(c.Methods))}
	for k, r := range c.Results {
		if r != nil {
			m := Measure(r)
			set.Measures[k] = &m
		}
	}
	return set
}
