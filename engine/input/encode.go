package input

import (
	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
)

// Encode writes a scenario as a version 1 scenario document; ReadJSON reads
// it back to the same scenario.
func Encode(title string, s *engine.Scenario) *jsondoc.Value {
	v := jsondoc.NewObject().Set("version", jsondoc.Int(Version))
	if title != "" {
		v.Set("title", jsondoc.Str(title))
	}
	if s.Seats > 0 {
		v.Set("seats", jsondoc.Int(s.Seats))
	}
	if s.Method.Valid() {
		v.Set("method", jsondoc.Str(s.Method.String()))
	}
	if s.Min > 0 {
		v.Set("min", jsondoc.Int(s.Min))
	}
	if s.Max > 0 {
		v.Set("max", jsondoc.Int(s.Max))
	}
	if !s.Threshold.IsZero() {
		v.Set("threshold", jsondoc.Str(s.Threshold.String()))
	}
	if s.Tie.Kind != engine.TieReport {
		v.Set("tie", jsondoc.Str(s.Tie.String()))
	}
	units := jsondoc.NewArray()
	for _, u := range s.Units {
		x := jsondoc.NewObject().Set("name", jsondoc.Str(u.Name)).Set("population", jsondoc.Num(u.Population.String()))
		if u.Min != nil {
			x.Set("min", jsondoc.Int(*u.Min))
		}
		if u.Max != nil {
			x.Set("max", jsondoc.Int(*u.Max))
		}
		units.Append(x)
	}
	return v.Set("units", units)
}
