package analysisapi

import (
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/format"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	"seatsmith/wasm/api"
)

// MaxSweepCells is the most results (house sizes times units) one sweep
// holds, far below the engine's own limit: every result is kept, and a
// page runs in one tab.
const MaxSweepCells = 1_000_000

// sweep apportions a scenario at every house size of a range, by each of a
// list of methods, and returns the sweep document (engine/format): every
// unit's seats at every size, the ties, and every Alabama paradox found,
// the same content as "seatsmith sweep -format json". The argument is a
// scenario with three more members:
//
//	from     the smallest house size (default 1)
//	to       the largest (default: the scenario's seats)
//	methods  an array of method ids (default: every method)
//
// House sizes are whole numbers or strings of digits. The scenario's
// method is not used. A method that can apportion no size in the range
// carries its error in the document; when none can, the scenario is at
// fault and sweep returns the first method's error instead.
func sweep(arg, _ *jsondoc.Value) (*jsondoc.Value, error) {
	if arg.Kind != jsondoc.Object {
		return nil, &input.Error{Msg: "sweep takes a scenario with from, to and methods, not " + api.KindName(arg)}
	}
	scen := &jsondoc.Value{Kind: jsondoc.Object}
	for _, f := range arg.Fields {
		switch f.Key {
		case "from", "to", "methods":
		default:
			scen.Fields = append(scen.Fields, f)
		}
	}
	src, err := api.ScenarioArg(scen, api.MaxUnits, "units")
	if err != nil {
		return nil, err
	}
	from, err := houseArg(arg.Get("from"), "from", 1)
	if err != nil {
		return nil, err
	}
	to, err := houseArg(arg.Get("to"), "to", src.Scenario.Seats)
	if err != nil {
		return nil, err
	}
	if to == 0 {
		return nil, &input.Error{Field: "to", Msg: "missing: give the largest house size (the scenario gives no seats)"}
	}
	if to < from {
		return nil, &input.Error{Field: "to", Msg: "must not be below from (" + strconv.Itoa(from) + ")"}
	}
	if n := len(src.Scenario.Units); n > 0 && to-from+1 > MaxSweepCells/n {
		return nil, &input.Error{Field: "to", Msg: strconv.Itoa(to-from+1) + " house sizes of " + strconv.Itoa(n) +
			" units is more than the limit of " + strconv.Itoa(MaxSweepCells) + " results a sweep holds (limits().sweep_cells); the command-line tool takes more"}
	}
	var ms []engine.Method
	if x := arg.Get("methods"); !x.IsNull() {
		if x.Kind != jsondoc.Array || len(x.Items) == 0 {
			return nil, &input.Error{Field: "methods", Msg: "must be a non-empty array of method ids"}
		}
		for i, mv := range x.Items {
			m, err := engine.ParseMethod(mv.Text)
			if mv.Kind != jsondoc.String || err != nil {
				return nil, &input.Error{Field: "methods[" + strconv.Itoa(i) + "]",
					Msg: "unknown method " + strconv.Quote(mv.Text) + "; known: " + strings.Join(engine.MethodIDs(), ", ")}
			}
			ms = append(ms, m)
		}
	}
	set := analysis.SweepAll(src.Scenario, ms, from, to)
	if set.First() == nil {
		return nil, set.Errors[0]
	}
	return format.SweepJSON(src.Title, set), nil
}

// houseArg reads a house size: a whole number, or a string of digits, from
// 1 to api.MaxSeats; def when absent.
func houseArg(v *jsondoc.Value, field string, def int) (int, error) {
	if v.IsNull() {
		return def, nil
	}
	if v.Kind == jsondoc.Number || v.Kind == jsondoc.String {
		if n, err := strconv.Atoi(strings.TrimSpace(v.Text)); err == nil && n >= 1 && n <= api.MaxSeats {
			return n, nil
		}
	}
	return 0, &input.Error{Field: field, Msg: "must be a house size from 1 to " + strconv.Itoa(api.MaxSeats)}
}
