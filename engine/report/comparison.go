package report

import (
	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
)

// A Comparison is one scenario apportioned by several methods.
type Comparison struct {
	Methods []engine.Method
	Results []*engine.Result // nil where the method failed
	Errors  []error          // the failure, where Results[i] is nil
}

// Compare apportions s by every method in ms (all methods when ms is empty).
// A method that cannot apportion s records its error instead of a result.
// detail is passed to [engine.Allot]; 0 means [engine.SeatsOnly], all that
// the comparison's document and tables show.
func Compare(s engine.Scenario, ms []engine.Method, detail engine.Detail) *Comparison {
	if len(ms) == 0 {
		ms = engine.Methods()
	}
	if detail == 0 {
		detail = engine.SeatsOnly
	}
	c := &Comparison{Methods: ms}
	c.Results, c.Errors = engine.AllotMethods(&s, ms, detail)
	return c
}

// First returns the first successful result, or nil.
func (c *Comparison) First() *engine.Result {
	for _, r := range c.Results {
		if r != nil {
			return r
		}
	}
	return nil
}

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

// Doc builds the comparison document.
func (c *Comparison) Doc(title string) *jsondoc.Value {
	v := header("comparison", title)
	first := c.First()
	ids := jsondoc.NewArray()
	for _, m := range c.Methods {
		ids.Append(jsondoc.Str(m.String()))
	}
	if first != nil {
		v.Set("seats", jsondoc.Int(first.Seats)).Set("total", jsondoc.Str(first.Total))
	}
	v.Set("methods", ids)
	units := jsondoc.NewArray()
	if first != nil {
		for i := range first.Units {
			u := &first.Units[i]
			x := jsondoc.NewObject().Set("name", jsondoc.Str(u.Name)).Set("population", jsondoc.Str(u.Population.String()))
			x.Set("quota", jsondoc.Str(u.Quota.Text)).Set("lower_quota", jsondoc.Int(u.Lower)).Set("upper_quota", jsondoc.Int(u.Upper))
			seats := jsondoc.NewObject()
			breaks := jsondoc.NewArray()
			for k, m := range c.Methods {
				r := c.Results[k]
				if r == nil {
					seats.Set(m.String(), nil)
					continue
				}
				seats.Set(m.String(), jsondoc.Int(r.Units[i].Seats))
				if !r.Units[i].MeetsQuota {
					breaks.Append(jsondoc.Str(m.String()))
				}
			}
			x.Set("seats", seats).Set("differs", jsondoc.Boolean(c.Differs(i))).Set("breaks_quota", breaks)
			units.Append(x)
		}
	}
	v.Set("units", units)
	results := jsondoc.NewArray()
	for k, m := range c.Methods {
		x := jsondoc.NewObject().Set("method", jsondoc.Str(m.String())).Set("method_name", jsondoc.Str(m.Name()))
		if r := c.Results[k]; r != nil {
			x.Set("error", nil).Set("ties", Ties(r)).Set("unassigned", jsondoc.Int(r.Unassigned))
			x.Set("quota_violations", jsondoc.Int(c.QuotaViolations(k)))
		} else {
			x.Set("error", jsondoc.Str(c.Errors[k].Error())).Set("ties", jsondoc.NewArray()).Set("unassigned", nil).Set("quota_violations", nil)
		}
		results.Append(x)
	}
	return v.Set("results", results)
}
