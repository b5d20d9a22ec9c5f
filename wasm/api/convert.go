package api

// This file converts JavaScript values to jsondoc trees. It knows
// JavaScript only through the jsReader interface, so the same code runs
// (and is tested) on the host with plain Go stand-ins; jsvalue.go
// implements the interface with real JavaScript values in the browser.
//
// The other direction needs no code of its own: a result document is
// written with jsondoc.Marshal and read by JavaScript's JSON.parse, which
// makes plain objects in one step.

import (
	"strconv"

	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
)

// jsKind classifies a JavaScript value as the conversion sees it.
type jsKind uint8

const (
	jsUndefined jsKind = iota
	jsNull
	jsBoolean
	jsNumber
	jsString
	jsBigInt
	jsArray
	jsObject
	jsFunction
	jsSymbol
)

var jsKindNames = [...]string{
	jsUndefined: "undefined",
	jsNull:      "null",
	jsBoolean:   "a boolean",
	jsNumber:    "a number",
	jsString:    "a string",
	jsBigInt:    "a BigInt",
	jsArray:     "an array",
	jsObject:    "an object",
	jsFunction:  "a function",
	jsSymbol:    "a symbol",
}

func (k jsKind) String() string {
	if int(k) < len(jsKindNames) {
		return jsKindNames[k]
	}
	return "an unknown value"
}

// jsReader reads one JavaScript value. Every method that touches the value
// reports JavaScript exceptions (a throwing getter, a hostile Proxy) as
// errors.
type jsReader interface {
	kind() jsKind
	boolean() (bool, error)
	number() (float64, error)
	// text returns a string's contents, or the decimal digits of a BigInt.
	text() (string, error)
	// length returns an array's length, or a string's in UTF-16 code
	// units.
	length() (int, error)
	index(i int) (jsReader, error)
	// keys returns an object's own enumerable string keys, in JavaScript's
	// order.
	keys() ([]string, error)
	get(key string) (jsReader, error)
}

// fromJS converts a JavaScript value to a jsondoc tree, as JSON.stringify
// followed by jsondoc.Parse would, except that:
//
//   - numbers are written as plain decimals, never with an exponent
//     (1e21 becomes "1000000000000000000000", 1e-7 becomes "0.0000001"),
//     using the shortest text that identifies the number, which is the
//     text JavaScript itself shows; -0 becomes 0;
//   - a BigInt becomes a number with all its digits;
//   - NaN, Infinity, functions and symbols are errors rather than null or
//     silently dropped, and so are values of more than MaxValues values
//     in all (an array of that length, for one), strings
//     longer than MaxText and values nested deeper than MaxDepth (a cyclic
//     object, for one);
//   - object members whose value is undefined are left out, and undefined
//     array elements (and holes) become null, as JSON.stringify does.
//
// An error is an *input.Error whose Field is the path of the offending
// value, such as "units[2].population".
func fromJS(r jsReader) (*jsondoc.Value, error) {
	left := MaxValues
	return convertJS(r, "", 0, &left)
}

// convertJS converts r, which may hold at most *left values, and takes
// those it holds from *left.
func convertJS(r jsReader, path string, depth int, left *int) (*jsondoc.Value, error) {
	if depth > MaxDepth {
		return nil, pathError(topMember(path), "nested too deeply (more than "+strconv.Itoa(MaxDepth)+" levels, limits().depth, or an object that contains itself)")
	}
	if *left <= 0 {
		return nil, pathError(path, tooManyValues)
	}
	*left--
	switch k := r.kind(); k {
	case jsUndefined, jsNull:
		return jsondoc.NullValue(), nil
	case jsBoolean:
		b, err := r.boolean()
		if err != nil {
			return nil, jsError(path, err)
		}
		return jsondoc.Boolean(b), nil
	case jsNumber:
		f, err := r.number()
		if err != nil {
			return nil, jsError(path, err)
		}
		t, ok := numberText(f)
		if !ok {
			return nil, pathError(path, numberName(f)+" is not a number a scenario can hold")
		}
		return jsondoc.Num(t), nil
	case jsBigInt:
		t, err := r.text()
		if err != nil {
			return nil, jsError(path, err)
		}
		return jsondoc.Num(t), nil
	case jsString:
		// A string longer than the limit is refused before it is copied.
		if n, err := r.length(); err == nil && n > MaxText {
			return nil, pathError(path, "a text of "+strconv.Itoa(n)+" characters is longer than the limit of "+strconv.Itoa(MaxText)+" bytes (limits().text_bytes)")
		}
		t, err := r.text()
		if err != nil {
			return nil, jsError(path, err)
		}
		if len(t) > MaxText {
			return nil, pathError(path, "a text of "+strconv.Itoa(len(t))+" bytes is longer than the limit of "+strconv.Itoa(MaxText)+" bytes (limits().text_bytes)")
		}
		return jsondoc.Str(t), nil
	case jsArray:
		n, err := r.length()
		if err != nil {
			return nil, jsError(path, err)
		}
		if n < 0 || n > *left {
			return nil, pathError(path, "an array of "+strconv.Itoa(n)+" elements: "+tooManyValues)
		}
		arr := &jsondoc.Value{Kind: jsondoc.Array, Items: make([]*jsondoc.Value, 0, min(n, 1024))}
		for i := 0; i < n; i++ {
			p := path + "[" + strconv.Itoa(i) + "]"
			x, err := r.index(i)
			if err != nil {
				return nil, jsError(p, err)
			}
			v, err := convertJS(x, p, depth+1, left)
			if err != nil {
				return nil, err
			}
			arr.Items = append(arr.Items, v)
		}
		return arr, nil
	case jsObject:
		keys, err := r.keys()
		if err != nil {
			return nil, jsError(path, err)
		}
		if len(keys) > *left {
			return nil, pathError(path, "an object of "+strconv.Itoa(len(keys))+" members: "+tooManyValues)
		}
		obj := &jsondoc.Value{Kind: jsondoc.Object, Fields: make([]jsondoc.Field, 0, len(keys))}
		for _, key := range keys {
			p := key
			if path != "" {
				p = path + "." + key
			}
			x, err := r.get(key)
			if err != nil {
				return nil, jsError(p, err)
			}
			if x.kind() == jsUndefined {
				continue
			}
			v, err := convertJS(x, p, depth+1, left)
			if err != nil {
				return nil, err
			}
			obj.Fields = append(obj.Fields, jsondoc.Field{Key: key, Value: v})
		}
		return obj, nil
	default:
		return nil, pathError(path, k.String()+" is not a value a scenario can hold")
	}
}

// topMember returns the first member of a path: "units" for
// "units[0].units[0]...". A path too deep to convert is too long to show.
func topMember(path string) string {
	for i := 0; i < len(path); i++ {
		if path[i] == '.' || path[i] == '[' {
			return path[:i]
		}
	}
	return path
}

// numberText writes a finite number as a plain decimal: the shortest text
// that reads back as the same float64, without an exponent. It reports
// false for NaN and the infinities.
func numberText(f float64) (string, bool) {
	switch {
	case f != f || f > maxFloat || f < -maxFloat:
		return "", false
	case f == 0:
		return "0", true // also for -0
	}
	return strconv.FormatFloat(f, 'f', -1, 64), true
}

const maxFloat = 1.7976931348623157e308

func numberName(f float64) string {
	switch {
	case f != f:
		return "NaN"
	case f > 0:
		return "Infinity"
	}
	return "-Infinity"
}

// tooManyValues says that an argument holds more values than MaxValues.
var tooManyValues = "the argument holds more than the limit of " + strconv.Itoa(MaxValues) + " values (limits().values)"

func pathError(path, msg string) error {
	return &input.Error{Field: path, Msg: msg}
}

// jsError reports an exception thrown while reading the value at path.
func jsError(path string, err error) error {
	return &input.Error{Field: path, Msg: "could not be read: " + err.Error()}
}

// plainJSON reports whether a tree parsed from JSON.stringify's text holds
// exactly what fromJS would read from the value: no null (which stands for
// NaN, Infinity, holes, undefined in arrays, functions and symbols in
// arrays, or null), no number written with an exponent (fromJS writes
// every number as a plain decimal).
// It clears the line numbers on the way: they are the text's, which the
// caller never saw.
func plainJSON(v *jsondoc.Value) bool {
	v.Line = 0
	switch v.Kind {
	case jsondoc.Null:
		return false
	case jsondoc.Number:
		for i := 0; i < len(v.Text); i++ {
			if c := v.Text[i]; c == 'e' || c == 'E' {
				return false
			}
		}
	case jsondoc.Array:
		for _, x := range v.Items {
			if !plainJSON(x) {
				return false
			}
		}
	case jsondoc.Object:
		for _, f := range v.Fields {
			if !plainJSON(f.Value) {
				return false
			}
		}
	}
	return true
}
