package api

import (
	"bytes"

	"seatsmith/engine"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	"seatsmith/engine/report"
)

// allot apportions a scenario by its method and returns the allotment
// document (engine/report), the content of "seatsmith allot -format
// json". opts may ask for the costly parts of the explanation, which are
// otherwise left out beyond a small size and then listed in the
// document's skipped member:
//
//	margins  true: every gain and lose margin, also those that need a
//	         search (largest-remainder methods, thresholds), for at most
//	         MaxSearchedMargins units; false: none. By default the
//	         closed-form margins (divisor methods without a threshold),
//	         and the searched ones for at most AutoSearchedMargins units.
//	order    true: the seat order of a divisor method; false: none. By
//	         default only for a house of at most AutoOrderSeats seats.
//
// The document is written unit by unit, never held as a tree of values.
func allot(arg, opts *jsondoc.Value) (*jsondoc.Value, error) {
	var margins, order *bool
	if !opts.IsNull() {
		if err := jsondoc.Decode(opts, "allot's options", []jsondoc.Member{
			{Key: "margins", Read: optionalBool(&margins)},
			{Key: "order", Read: optionalBool(&order)},
		}); err != nil {
			return nil, err
		}
	}
	src, err := ScenarioArg(arg, MaxUnits, "units")
	if err != nil {
		return nil, err
	}
	s := &src.Scenario
	detail, skipped, err := allotDetail(s, margins, order)
	if err != nil {
		return nil, err
	}
	res, err := engine.Allot(s, detail)
	if err != nil {
		return nil, err
	}
	var b bytes.Buffer
	if err := report.WriteAllotJSON(&b, src.Title, res, skipped); err != nil {
		return nil, err
	}
	return jsondoc.RawJSON(b.String()), nil
}

// allotDetail chooses what allot computes: what opts asked for (nil: not
// asked), or by the size of the scenario.
func allotDetail(s *engine.Scenario, margins, order *bool) (engine.Detail, []string, error) {
	var d engine.Detail
	var skipped []string
	n := len(s.Units)
	search := !s.Method.IsDivisor() || !s.Threshold.IsZero()
	switch {
	case margins != nil && *margins && search && n > MaxSearchedMargins:
		return 0, nil, &input.Error{Field: "margins", Msg: "these margins are a search for every unit; " + tooManyText(n, MaxSearchedMargins, "units") +
			" (limits().searched_margin_units) for which allot computes them"}
	case margins != nil && *margins, margins == nil && (!search || n <= AutoSearchedMargins):
		d |= engine.WithMargins
	default:
		skipped = append(skipped, "margins")
	}
	if s.Method.IsDivisor() {
		if (order != nil && *order) || (order == nil && s.Seats <= AutoOrderSeats) {
			d |= engine.WithOrder
		} else {
			skipped = append(skipped, "order")
		}
	}
	return d, skipped, nil
}

// optionalBool reads a boolean option into dst, which stays nil when the
// option is not given.
func optionalBool(dst **bool) func(*jsondoc.Value) error {
	return func(v *jsondoc.Value) error {
		var b bool
		if err := jsondoc.ReadBool(&b)(v); err != nil {
			return err
		}
		*dst = &b
		return nil
	}
}
