package format

import (
	"strconv"

	"seatsmith/engine"
)

// Settings are a scenario's settings, which lead every row of a CSV file
// so that the file alone says what its numbers are of.
type Settings struct {
	Method    engine.Method // zero when the file spans methods
	Seats     int           // 0 when the file spans house sizes
	Min, Max  int           // the default bounds (Max 0: no cap)
	Threshold engine.Decimal
	Tie       engine.TieRule
}

// SettingsOf returns the settings of s.
func SettingsOf(s *engine.Scenario) Settings {
	return Settings{Method: s.Method, Seats: s.Seats, Min: s.Min, Max: s.Max, Threshold: s.Threshold, Tie: s.Tie}
}

// columns returns the settings' columns: method (when method is set),
// house size (when seats is set), default minimum and maximum, threshold
// and tie rule.
func (st Settings) columns(method, seats bool) []Column {
	var cs []Column
	if method {
		cs = append(cs, Column{Name: "method"})
	}
	if seats {
		cs = append(cs, Column{Name: "house_size", Number: true})
	}
	return append(cs, Column{"default_min", true}, Column{"default_max", true}, Column{"threshold", true}, Column{"tie_rule", false})
}

// cells returns the values of the columns columns returns: the threshold
// as a share (0.05), no cap as an empty cell.
func (st Settings) cells(method, seats bool) []string {
	var cs []string
	if method {
		cs = append(cs, st.Method.String())
	}
	if seats {
		cs = append(cs, strconv.Itoa(st.Seats))
	}
	return append(cs, strconv.Itoa(st.Min), capCell(st.Max), st.Threshold.String(), st.Tie.String())
}

// The cells of CSV data.

func boolCell(b bool) string { return strconv.FormatBool(b) }

// numValue writes a priority value or remainder as a number: "" where
// there is none or it is infinite (a unit's first seat under Adams, Dean
// and Huntington–Hill).
func numValue(v *engine.Value) string {
	if v == nil || v.Infinite {
		return ""
	}
	return v.Text
}

func numMargin(d *engine.Decimal) string {
	if d == nil {
		return ""
	}
	return d.String()
}

// numFloat writes a display value with six significant digits, never
// with an exponent.
func numFloat(f float64) string { return strconv.FormatFloat(round6(f), 'f', -1, 64) }

// capCell writes a default or statutory cap, 0 for none, as a cell:
// empty for none.
func capCell(max int) string {
	if max <= 0 {
		return ""
	}
	return strconv.Itoa(max)
}

// maxCell writes a unit's maximum, -1 for none, as a cell: empty for
// none.
func maxCell(max int) string {
	if max < 0 {
		return ""
	}
	return strconv.Itoa(max)
}

// row returns a new row: lead, then cells.
func row(lead []string, cells ...string) []string {
	return append(append(make([]string, 0, len(lead)+len(cells)), lead...), cells...)
}
