package api

import (
	"bytes"
	"unsafe"

	"seatsmith/engine"
	"seatsmith/engine/format"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
)

// allot apportions a scenario by its method and returns the allotment
// document (engine/format), the content of "seatsmith allot -format
// json". opts may ask for the costly parts of the explanation, which are
// otherwise left out beyond a small size and then listed in the
// document's skipped member:
//
//	margins  true: every gain and lose margin, for at most
//	         MaxMarginUnits units, and for at most MaxSearchedMargins
//	         where they are costly (engine.Scenario.CostlyMargins: a
//	         largest-remainder method with minimums or maximums, or a
//	         threshold); false: none. By default the others for at most
//	         AutoMarginUnits units, the costly ones for at most
//	         AutoSearchedMargins.
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
	return jsondoc.RawJSON(allotmentJSON(src.Title, res, skipped)), nil
}

// allotmentJSON writes the allotment document of res (format.AllotmentJSON,
// with the skipped member the command-line tool writes) as compact JSON. The
// units are laid out a chunk at a time, each chunk's tree made by
// format.AllotmentJSON on a result holding just those units and dropped once
// written, so that a hundred thousand units never stand as one tree.
// It gives the content of "seatsmith allot -format json", without the indentation.
func allotmentJSON(title string, res *engine.Result, skipped []string) string {
	head := *res
	head.Units, head.Ties = nil, nil // the ties name units by index
	doc := format.AllotmentJSON(title, &head)
	doc.Set("ties", format.Ties(res))
	if len(skipped) > 0 {
		arr := jsondoc.NewArray()
		for _, s := range skipped {
			arr.Append(jsondoc.Str(s))
		}
		doc.Set("skipped", arr)
	}
	text := jsondoc.Marshal(doc)
	const mark = `"units":[]`
	k := bytes.Index(text, []byte(mark))
	if k < 0 || len(res.Units) == 0 {
		return string(text)
	}
	b := append([]byte(nil), text[:k+len(mark)-1]...)
	const chunk = 256
	part := head
	part.Order, part.Beyond, part.Ties = nil, nil, nil
	for i := 0; i < len(res.Units); i += chunk {
		part.Units = res.Units[i:min(i+chunk, len(res.Units))]
		for j, u := range format.AllotmentJSON("", &part).Get("units").Items {
			if i+j > 0 {
				b = append(b, ',')
			}
			b = jsondoc.AppendMarshal(b, u)
		}
		if i == 0 && len(res.Units) > chunk {
			// Sized once from the first chunk, with a margin, the buffer
			// is not copied as it grows, which in WebAssembly is much of
			// what a large answer costs.
			need := len(text) + (len(b)/chunk+len(b)/chunk/8)*len(res.Units)
			b = append(make([]byte, 0, need), b...)
		}
	}
	b = append(b, text[k+len(mark)-1:]...)
	return unsafe.String(unsafe.SliceData(b), len(b)) // b is not written again
}

// allotDetail chooses what allot computes: what opts asked for (nil: not
// asked), or by the size of the scenario.
func allotDetail(s *engine.Scenario, margins, order *bool) (engine.Detail, []string, error) {
	var d engine.Detail
	var skipped []string
	n := len(s.Units)
	search := s.CostlyMargins()
	asked := margins != nil && *margins
	switch {
	case asked && search && n > MaxSearchedMargins:
		return 0, nil, &input.Error{Field: "margins", Msg: "these margins (a largest-remainder method with minimums or maximums, or a threshold) are proven stretch by stretch for every unit; " +
			tooManyText(n, MaxSearchedMargins, "units") + " (limits().searched_margin_units) for which allot computes them"}
	case asked && n > MaxMarginUnits:
		return 0, nil, &input.Error{Field: "margins", Msg: tooManyText(n, MaxMarginUnits, "units") +
			" (limits().margin_units) for which allot computes margins"}
	case asked, margins == nil && (search && n <= AutoSearchedMargins || !search && n <= AutoMarginUnits):
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
