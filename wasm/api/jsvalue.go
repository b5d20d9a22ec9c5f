//go:build js && wasm

package api

import (
	"unsafe"

	"github.com/hack-pad/safejs"

	"seatsmith/engine/jsondoc"
)

// jsRuntime holds the JavaScript built-ins the bridge uses.
//
// Every access to a value that comes from the page goes through a function
// call (Reflect.get rather than a property read), because syscall/js
// catches exceptions only in calls: a throwing getter or a hostile Proxy
// read directly would unwind through the Go program.
type jsRuntime struct {
	reflectGet safejs.Value // Reflect.get
	isArray    safejs.Value // Array.isArray
	keysOf     safejs.Value // Object.keys
	freeze     safejs.Value // Object.freeze
	parse      safejs.Value // JSON.parse
	stringOf   safejs.Value // String
	stringify  safejs.Value // JSON.stringify
	clone      safejs.Value // structuredClone, or undefined where there is none
	objectCtor safejs.Value // Object
	out        []byte       // the buffer value writes answers into
}

func newRuntime() (*jsRuntime, error) {
	g := safejs.Global()
	rt := &jsRuntime{}
	for _, b := range []struct {
		dst       *safejs.Value
		obj, prop string
	}{
		{&rt.reflectGet, "Reflect", "get"},
		{&rt.isArray, "Array", "isArray"},
		{&rt.keysOf, "Object", "keys"},
		{&rt.freeze, "Object", "freeze"},
		{&rt.parse, "JSON", "parse"},
		{&rt.stringOf, "String", ""},
		{&rt.stringify, "JSON", "stringify"},
		{&rt.clone, "structuredClone", ""},
		{&rt.objectCtor, "Object", ""},
	} {
		v, err := g.Get(b.obj)
		if err == nil && b.prop != "" {
			v, err = v.Get(b.prop)
		}
		if err != nil {
			return nil, err
		}
		*b.dst = v
	}
	return rt, nil
}

// value makes the JavaScript value of a document: JSON.parse of its JSON
// text, so numbers become JavaScript numbers, and objects plain objects
// with their members in order.
//
// The text is written into a buffer kept from call to call and passed as a
// string that shares its bytes (syscall/js copies a string's bytes into
// JavaScript during the call and keeps no reference to them), so that an
// answer of a hundred kilobytes leaves no garbage of that size behind.
func (rt *jsRuntime) value(v *jsondoc.Value) (safejs.Value, error) {
	if v.Kind == jsondoc.Raw && len(v.Text) > maxKeptOutput {
		return rt.parse.Invoke(v.Text) // written already: no copy
	}
	rt.out = jsondoc.AppendMarshal(rt.out[:0], v)
	text := unsafe.String(unsafe.SliceData(rt.out), len(rt.out))
	r, err := rt.parse.Invoke(text)
	if cap(rt.out) > maxKeptOutput {
		rt.out = nil // an unusually large answer: do not keep its buffer
	}
	return r, err
}

// maxKeptOutput is the largest answer buffer kept for the next call.
const maxKeptOutput = 4 << 20

// convert converts an argument to a jsondoc tree. An object or array is
// first tried as JSON text: one JSON.stringify call, one string across the
// boundary and jsondoc.Parse, which for a scenario of a hundred thousand
// units is some hundred times faster than reading it member by member. The
// text is used only when it must mean what fromJS would read: the value
// holds no function or symbol (structuredClone refuses them), nothing
// JSON writes as null (NaN, Infinity, holes and undefined in arrays, null
// itself), no number JSON writes with an exponent, no BigInt or cycle
// (JSON.stringify refuses them), and is of the same kind; anything else is
// read member by member by fromJS, which names the value at fault.
// (Objects with a toJSON method, such as a Date, inside the value are read
// as JSON.stringify writes them.)
func (rt *jsRuntime) convert(v safejs.Value) (*jsondoc.Value, error) {
	r := rt.reader(v)
	if k := r.kind(); k == jsObject || k == jsArray {
		if doc := rt.viaJSON(v, k); doc != nil {
			return doc, nil
		}
	}
	return fromJS(r)
}

// viaJSON reads v through JSON text, or returns nil when the text might
// not mean what fromJS reads (see convert).
func (rt *jsRuntime) viaJSON(v safejs.Value, k jsKind) *jsondoc.Value {
	if t, ok := typeOf(rt.clone); !ok || t != safejs.TypeFunction {
		return nil
	}
	if _, err := rt.clone.Invoke(v); err != nil {
		return nil
	}
	s, err := rt.stringify.Invoke(v)
	if err != nil {
		return nil
	}
	if t, ok := typeOf(s); !ok || t != safejs.TypeString {
		return nil
	}
	text, err := s.String()
	if err != nil || len(text) > MaxText {
		return nil
	}
	doc, err := jsondoc.ParseLimit([]byte(text), MaxValues)
	if err != nil || !plainJSON(doc) {
		return nil
	}
	if (k == jsArray) != (doc.Kind == jsondoc.Array) || (k == jsObject) != (doc.Kind == jsondoc.Object) {
		return nil
	}
	return doc
}

// reader wraps v for fromJS.
func (rt *jsRuntime) reader(v safejs.Value) jsReader { return &jsValue{v: v, rt: rt} }

// jsValue is a JavaScript value seen through jsReader.
type jsValue struct {
	v    safejs.Value
	rt   *jsRuntime
	k    jsKind
	kset bool
}

// typeOf returns v's type. syscall/js panics on a type it does not know,
// which is a BigInt: ok is false then.
func typeOf(v safejs.Value) (t safejs.Type, ok bool) {
	defer func() {
		if recover() != nil {
			ok = false
		}
	}()
	return v.Type(), true
}

func (x *jsValue) kind() jsKind {
	if !x.kset {
		x.k, x.kset = x.classify(), true
	}
	return x.k
}

func (x *jsValue) classify() jsKind {
	t, ok := typeOf(x.v)
	if !ok {
		return jsBigInt
	}
	switch t {
	case safejs.TypeUndefined:
		return jsUndefined
	case safejs.TypeNull:
		return jsNull
	case safejs.TypeBoolean:
		return jsBoolean
	case safejs.TypeNumber:
		return jsNumber
	case safejs.TypeString:
		return jsString
	case safejs.TypeSymbol:
		return jsSymbol
	case safejs.TypeFunction:
		return jsFunction
	}
	// Array.isArray throws only for a revoked Proxy; Object.keys then
	// throws too and reports it.
	if r, err := x.rt.isArray.Invoke(x.v); err == nil {
		if b, err := r.Bool(); err == nil && b {
			return jsArray
		}
	}
	return jsObject
}

func (x *jsValue) boolean() (bool, error)   { return x.v.Bool() }
func (x *jsValue) number() (float64, error) { return x.v.Float() }

func (x *jsValue) text() (string, error) {
	if x.kind() == jsString {
		return x.v.String()
	}
	s, err := x.rt.stringOf.Invoke(x.v)
	if err != nil {
		return "", err
	}
	return s.String()
}

func (x *jsValue) length() (int, error) {
	if x.kind() == jsString {
		return x.v.Length() // a primitive's own property: it cannot throw
	}
	n, err := x.rt.reflectGet.Invoke(x.v, "length")
	if err != nil {
		return 0, err
	}
	if n.Type() != safejs.TypeNumber {
		return 0, errNotLength
	}
	f, err := n.Float()
	if err != nil {
		return 0, err
	}
	if f != f || f < 0 || f > 1<<32 {
		return 0, errNotLength
	}
	return int(f), nil
}

var errNotLength = &internalError{"the array has no proper length"}

func (x *jsValue) index(i int) (jsReader, error) {
	v, err := x.rt.reflectGet.Invoke(x.v, i)
	if err != nil {
		return nil, err
	}
	return x.rt.reader(v), nil
}

func (x *jsValue) get(key string) (jsReader, error) {
	v, err := x.rt.reflectGet.Invoke(x.v, key)
	if err != nil {
		return nil, err
	}
	return x.rt.reader(v), nil
}

func (x *jsValue) keys() ([]string, error) {
	arr, err := x.rt.keysOf.Invoke(x.v)
	if err != nil {
		return nil, err
	}
	// Object.keys returns a genuine array of strings: reading it cannot
	// throw.
	n, err := arr.Length()
	if err != nil {
		return nil, err
	}
	if n > MaxValues {
		return make([]string, n), nil // the caller refuses it by its length
	}
	keys := make([]string, n)
	for i := range keys {
		k, err := arr.Index(i)
		if err == nil {
			keys[i], err = k.String()
		}
		if err != nil {
			return nil, err
		}
	}
	return keys, nil
}
