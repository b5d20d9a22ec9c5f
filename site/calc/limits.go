package calc

import (
	"strconv"
	"unicode/utf8"

	"seatsmith/engine"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
)

// Limits of a calculator block. A block is laid out as rows, fields and
// chart marks in a reader's page, so its size is bounded by what a page
// can show; the engine is checked against these before it apportions, and
// a block beyond one is refused with a message naming the limit.
const (
	// MaxUnits is the most units a calculator or variation block may
	// have (the scenario being edited included).
	MaxUnits = 5_000
	// MaxNameLength is the most characters a unit's name may have, and
	// MaxTitleLength a scenario's title: results repeat them.
	MaxNameLength  = 200
	MaxTitleLength = 1_000
	// MaxLoadBytes is the longest table or scenario file a reader may
	// load into a calculator, in bytes.
	MaxLoadBytes = 4 << 20
	// MaxValues is the most values (numbers, strings, arrays, objects) a
	// block's, a scenario's or a loaded file's JSON text may hold: read,
	// each takes about a hundred bytes.
	MaxValues = 200_000
)

// parseJSON reads JSON text of at most MaxValues values.
func parseJSON(text string) (*jsondoc.Value, error) {
	return jsondoc.ParseLimit([]byte(text), MaxValues)
}

// CheckNames checks a scenario's title and unit names against
// MaxTitleLength and MaxNameLength. The error is an *input.Error naming the
// field ("title", "units[3].name") without repeating the text.
func CheckNames(title string, s *engine.Scenario) error {
	if n := utf8.RuneCountInString(title); n > MaxTitleLength {
		return &input.Error{Field: "title", Msg: "a title of " + strconv.Itoa(n) + " characters is longer than the limit of " +
			strconv.Itoa(MaxTitleLength) + " characters"}
	}
	for i := range s.Units {
		name := s.Units[i].Name
		if len(name) <= MaxNameLength {
			continue // no more characters than bytes
		}
		if n := utf8.RuneCountInString(name); n > MaxNameLength {
			return &input.Error{Field: "units[" + strconv.Itoa(i) + "].name", Msg: "a name of " + strconv.Itoa(n) +
				" characters is longer than the limit of " + strconv.Itoa(MaxNameLength) + " characters"}
		}
	}
	return nil
}

// precheckUnits refuses a scenario document with more units than
// MaxUnits before it is read (reading builds every unit).
func precheckUnits(file string, doc *jsondoc.Value) error {
	if us := doc.Get("units"); us != nil && us.Kind == jsondoc.Array && len(us.Items) > MaxUnits {
		return tooManyUnits(file, us.Line, len(us.Items))
	}
	return nil
}

func tooManyUnits(file string, line, n int) error {
	return &input.Error{File: file, Line: line, Field: "units", Msg: strconv.Itoa(n) + " units is more than the limit of " +
		strconv.Itoa(MaxUnits) + " units a calculator lays out; the command-line tool takes more"}
}

// checkBlockSize checks a scenario read for a block against the limits.
func checkBlockSize(title string, s *engine.Scenario) error {
	if n := len(s.Units); n > MaxUnits {
		return tooManyUnits("", 0, n)
	}
	return CheckNames(title, s)
}
