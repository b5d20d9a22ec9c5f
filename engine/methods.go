package engine

// AllotMethods apportions the scenario by each of the methods, ignoring
// its own, as [Allot] would with the scenario's Method set to each in
// turn, and returns the results and errors in the same order. The
// scenario is checked and converted once for all of them, which for a
// comparison of every method on a small scenario is most of the work.
func AllotMethods(s *Scenario, methods []Method, detail Detail) ([]*Result, []error) {
	results := make([]*Result, len(methods))
	errs := make([]error, len(methods))
	// Prepared under Jefferson, whose check of the bounds and house size
	// is the one every method shares: only methods that give every unit
	// with people a first seat ask more of the house size.
	base := *s
	base.Method = Jefferson
	pr, perr := prepare(&base)
	if perr == nil {
		pr.quotas = new(quotaMemo) // the quotas do not depend on the method
	}
	for k, m := range methods {
		if !m.Valid() {
			// The error Allot gives, which comes before any other.
			one := *s
			one.Method = m
			results[k], errs[k] = Allot(&one, detail)
			continue
		}
		if perr != nil {
			errs[k] = perr
			continue
		}
		p := *pr
		p.m = m
		if m.ZeroFirstSignpost() {
			if err := p.checkFeasible(); err != nil {
				errs[k] = err
				continue
			}
		}
		results[k], errs[k] = p.allot(detail)
	}
	return results, errs
}
