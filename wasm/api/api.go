package api

import (
	"errors"
	"strconv"

	"seatsmith/engine"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
)

// Version is the version of the globalThis.seatsmith object. It changes
// only when a function is removed or changes what it returns in a way that
// breaks pages; adding a function does not change it.
const Version = 1

// A Function is one function of the API object.
type Function struct {
	// Name is the member of globalThis.seatsmith that holds it.
	Name string
	// Call receives the JavaScript arguments as jsondoc trees: arg, and
	// opts for a function that takes options (both null when the caller
	// passed none). It returns a document or an error; it need not guard
	// against panics, which [Invoke] turns into error documents.
	Call func(arg, opts *jsondoc.Value) (*jsondoc.Value, error)
	// Options is set for a function that takes an options object as its
	// second argument; the others refuse a second argument.
	Options bool
}

// Calculator returns the functions of the calculator module, which every
// page with a calculator loads: methods, allot, compare, readCSV and
// calculator.
func Calculator() []Function {
	return []Function{
		{Name: "methods", Call: methods},
		{Name: "allot", Call: allot, Options: true},
		{Name: "compare", Call: compare},
		{Name: "readCSV", Call: readCSV},
		{Name: "calculator", Call: calculator},
	}
}

// Invoke runs f on its arguments and always returns a document: f's own,
// or an error document for an error or a panic.
func Invoke(f Function, arg, opts *jsondoc.Value) (out *jsondoc.Value) {
	defer func() {
		if p := recover(); p != nil {
			out = errorDoc(&input.Error{Msg: "internal error: " + panicText(p)})
		}
	}()
	if arg == nil {
		arg = jsondoc.NullValue()
	}
	if opts == nil {
		opts = jsondoc.NullValue()
	}
	if !f.Options && !opts.IsNull() {
		return errorDoc(&input.Error{Msg: f.Name + " takes one argument, not several"})
	}
	v, err := f.Call(arg, opts)
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
// CSV table), a *jsondoc.MemberError or an *engine.Error (prefixed with
// "units[i]." for a unit), line for CSV input.
func errorDoc(err error) *jsondoc.Value {
	var field, msg string
	line := 0
	var ie *input.Error
	var ee *engine.Error
	var me *jsondoc.MemberError
	switch {
	case errors.As(err, &ie):
		field, msg, line = ie.Field, ie.Msg, ie.Line
	case errors.As(err, &me):
		field, msg = me.Path, me.Msg
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

// KindName names the JSON kind of v with its article, for messages.
func KindName(v *jsondoc.Value) string {
	switch v.Kind {
	case jsondoc.Null:
		return "null"
	case jsondoc.Array, jsondoc.Object:
		return "an " + v.Kind.String()
	}
	return "a " + v.Kind.String()
}
