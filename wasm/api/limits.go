package api

import (
	"errors"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	"seatsmith/site/calc"
)

// Limits of the WebAssembly API, below the engine's own. A page runs in
// one tab with one engine: every function checks its request against them
// before it computes anything, and refuses a request beyond one with an
// error value naming the limit, so that no request can exhaust the
// engine's memory. (The command-line tool takes the engine's full range.)
const (
	// MaxUnits is the most units a scenario given to allot, or a CSV
	// table given to readCSV, may have.
	MaxUnits = 100_000
	// MaxCompareUnits is the most units compare takes: it apportions the
	// scenario by every method and holds all their results at once.
	MaxCompareUnits = 20_000
	// MaxSeats is the largest house size any function apportions.
	MaxSeats = 100_000
	// MaxNameLength is the most characters a unit's name may have, and
	// MaxTitleLength a scenario's title: results repeat them.
	MaxNameLength  = calc.MaxNameLength
	MaxTitleLength = calc.MaxTitleLength
	// MaxText is the longest string any argument may hold, in bytes
	// (UTF-8): a CSV table, a scenario's or a block's JSON text.
	MaxText = 32 << 20
	// MaxValues is the most values (numbers, strings, arrays, objects...)
	// an argument may hold in all, also when it is given as JSON text:
	// each takes about a hundred bytes as the engine reads it. MaxDepth
	// is the deepest nesting.
	MaxValues = 1_000_000
	MaxDepth  = jsondoc.MaxDepth
	// MaxMarginUnits is the most units for which allot computes the
	// margins on request, and AutoMarginUnits the most for which it
	// computes them unasked. (The closed-form margins take the engine
	// about 0.1 s natively at 20,000 units by Hamilton's method, 0.003 s
	// by Webster's.)
	MaxMarginUnits  = 20_000
	AutoMarginUnits = 10_000
	// MaxSearchedMargins is the most units for which allot computes, on
	// request, the costly margins (engine.Scenario.CostlyMargins: a
	// largest-remainder method with minimums or maximums, or a
	// threshold), whose time grows much faster than the units: by
	// Hamilton's method with minimum 1 and maximum 5, about 0.06 s natively
	// at 100 units and 0.3 s at 300, several times that in WebAssembly.
	MaxSearchedMargins = 300
	// AutoSearchedMargins is the most units for which allot computes
	// those margins without being asked; AutoOrderSeats the largest house
	// for which it lists the seat order without being asked.
	AutoSearchedMargins = 100
	AutoOrderSeats      = 1_000
)

// Limit is one limit as limits() lists it.
type Limit struct {
	Key   string
	Value int
}

// Limits lists the limits of the calculator module's functions, as the
// limits function returns them; modules with more functions add theirs.
func Limits() []Limit {
	return []Limit{
		{"units", MaxUnits}, {"compare_units", MaxCompareUnits}, {"seats", MaxSeats},
		{"name_length", MaxNameLength}, {"title_length", MaxTitleLength}, {"text_bytes", MaxText},
		{"values", MaxValues}, {"depth", MaxDepth},
		{"margin_units", MaxMarginUnits}, {"auto_margin_units", AutoMarginUnits},
		{"searched_margin_units", MaxSearchedMargins}, {"auto_searched_margin_units", AutoSearchedMargins},
		{"auto_order_seats", AutoOrderSeats},
		{"calculator_units", calc.MaxUnits},
	}
}

// LimitsFunction returns the limits function: it takes no argument and
// returns {name: value} for every limit of ls.
func LimitsFunction(ls []Limit) Function {
	return Function{Name: "limits", Call: func(arg, _ *jsondoc.Value) (*jsondoc.Value, error) {
		if err := noArgument("limits", arg); err != nil {
			return nil, err
		}
		v := &jsondoc.Value{Kind: jsondoc.Object}
		for _, l := range ls {
			v.Fields = append(v.Fields, jsondoc.Field{Key: l.Key, Value: jsondoc.Int(l.Value)})
		}
		return v, nil
	}}
}

// TooMany is the error for a count beyond a limit: "120000 units is more
// than the limit of 100000 units (limits().units)".
func TooMany(field string, n, limit int, what, key string) error {
	return &input.Error{Field: field, Msg: tooManyText(n, limit, what) + " (limits()." + key + "); the command-line tool takes more"}
}

func tooManyText(n, limit int, what string) string {
	return strconv.Itoa(n) + " " + what + " is more than the limit of " + strconv.Itoa(limit) + " " + what
}

// ScenarioArg reads a scenario document given as an argument and checks
// it against the limits: at most units units, MaxSeats seats, names of at
// most MaxNameLength characters and a title of at most MaxTitleLength.
// Functions that take a scenario share it so that they read scenarios
// alike.
func ScenarioArg(arg *jsondoc.Value, units int, unitsKey string) (*input.Source, error) {
	if arg.Kind == jsondoc.Object {
		// Count before reading: the reader builds every unit.
		if us := arg.Get("units"); us != nil && us.Kind == jsondoc.Array && len(us.Items) > units {
			return nil, TooMany("units", len(us.Items), units, "units", unitsKey)
		}
	}
	src, err := input.FromDoc("", arg)
	if err != nil {
		return nil, err
	}
	if err := CheckScenario(src.Title, &src.Scenario, units, unitsKey); err != nil {
		return nil, err
	}
	return src, nil
}

// CheckScenario checks a scenario that has been read against the limits
// (see [ScenarioArg]).
func CheckScenario(title string, s *engine.Scenario, units int, unitsKey string) error {
	if n := len(s.Units); n > units {
		return TooMany("units", n, units, "units", unitsKey)
	}
	if s.Seats > MaxSeats {
		return &input.Error{Field: "seats", Msg: "the house size " + strconv.Itoa(s.Seats) +
			" is larger than the limit of " + strconv.Itoa(MaxSeats) + " seats (limits().seats); the command-line tool takes larger houses"}
	}
	if err := calc.CheckNames(title, s); err != nil {
		// Name the limit as limits() does.
		var ie *input.Error
		if errors.As(err, &ie) {
			key := "name_length"
			if ie.Field == "title" {
				key = "title_length"
			}
			return &input.Error{Field: ie.Field, Msg: ie.Msg + " (limits()." + key + ")"}
		}
		return err
	}
	return nil
}

// checkText refuses a string argument longer than MaxText.
func checkText(field, s string) error {
	if len(s) > MaxText {
		return &input.Error{Field: field, Msg: "a text of " + strconv.Itoa(len(s)) + " bytes is longer than the limit of " +
			strconv.Itoa(MaxText) + " bytes (limits().text_bytes)"}
	}
	return nil
}

// lines counts the lines of a text (a last line without a newline
// included).
func lines(s string) int {
	n := strings.Count(s, "\n")
	if s != "" && !strings.HasSuffix(s, "\n") {
		n++
	}
	return n
}
