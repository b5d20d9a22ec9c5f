package main

import (
	"errors"
	"sort"
	"strconv"

	"seatsmith/engine"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
)

// APIVersion is the version of the globalThis.seatsmith object. It changes
// only when a function is removed or changes what it returns in a way that
// breaks pages; adding a function does not change it.
const APIVersion = 1

// An apiFunc is one function of the API. It receives its JavaScript
// argument as a jsondoc tree (null when the caller passed none) and returns
// a document or an error. It need not guard against panics: call does.
type apiFunc func(arg *jsondoc.Value) (*jsondoc.Value, error)

var api = map[string]apiFunc{}

// register adds a function to the API under name. Each function's file
// calls it from an init function. A name registered twice, or one that
// clashes with the object's own members, is a programming error and
// panics when the program starts (and so in the host tests).
func register(name string, f apiFunc) {
	if name == "" || name == "version" || name == "caution" {
		panic("wasm: reserved API name " + strconv.Quote(name))
	}
	if _, dup := api[name]; dup {
		panic("wasm: API function " + strconv.Quote(name) + " registered twice")
	}
	api[name] = f
}

// apiNames returns the registered names in sorted order.
func apiNames() []string {
	names := make([]string, 0, len(api))
	for n := range api {
		names = append(names, n)
	}
	sort.Strings(names)
	return names
}

// call runs f on arg and always returns a document: f's own, or an error
// document for an error or a panic.
func call(f apiFunc, arg *jsondoc.Value) (out *jsondoc.Value) {
	defer func() {
		if p := recover(); p != nil {
			out = errorDoc(&input.Error{Msg: "internal error: " + panicText(p)})
		}
	}()
	if arg == nil {
		arg = jsondoc.NullValue()
	}
	v, err := f(arg)
	if err != nil {
		return errorDoc(err)
	}
	if v == nil {
		return jsondoc.NullValue()
	}
	return v
}

// panicText describes a recovered panic value without package fmt.
func panicText(p any) string {
	switch x := p.(type) {
	case error:
		return x.Error()
	case string:
		return x
	}
	return "unexpected failure"
}

// errorDoc builds the error document {error: {message, field, line}}.
// field and line are present only when known: field from an *input.Error
// (a path such as "units[2].population" for a scenario, or a column for a
// CSV table) or an *engine.Error (prefixed with "units[i]." for a unit),
// line for CSV input.
func errorDoc(err error) *jsondoc.Value {
	var field, msg string
	line := 0
	var ie *input.Error
	var ee *engine.Error
	switch {
	case errors.As(err, &ie):
		field, msg, line = ie.Field, ie.Msg, ie.Line
	case errors.As(err, &ee):
		field, msg = ee.Field, ee.Msg
		if ee.Unit >= 0 {
			field = unitPath(ee.Unit, ee.Field)
			if ee.Name != "" {
				msg = strconv.Quote(ee.Name) + ": " + msg
			}
		}
	default:
		msg = err.Error()
	}
	text := msg
	if field != "" {
		text = field + ": " + text
	}
	if line > 0 {
		text = "line " + strconv.Itoa(line) + ": " + text
	}
	e := []jsondoc.Field{{Key: "message", Value: jsondoc.Str(text)}}
	if field != "" {
		e = append(e, jsondoc.Field{Key: "field", Value: jsondoc.Str(field)})
	}
	if line > 0 {
		e = append(e, jsondoc.Field{Key: "line", Value: jsondoc.Int(line)})
	}
	return object(jsondoc.Field{Key: "error", Value: object(e...)})
}

// object builds an object from its members, which must have distinct
// keys. Building members as a list keeps the WebAssembly code smaller than
// a chain of inlined Set calls.
func object(fields ...jsondoc.Field) *jsondoc.Value {
	return &jsondoc.Value{Kind: jsondoc.Object, Fields: fields}
}

// unitPath names field of unit i the way scenario documents do:
// "units[2].population", or "units[2]" alone.
func unitPath(i int, field string) string {
	p := "units[" + strconv.Itoa(i) + "]"
	if field != "" {
		p += "." + field
	}
	return p
}

// noArgument refuses an argument given to a function that takes none, so
// that a mistaken call is not silently ignored.
func noArgument(name string, arg *jsondoc.Value) error {
	if arg.IsNull() {
		return nil
	}
	return &input.Error{Msg: name + " takes no argument"}
}
