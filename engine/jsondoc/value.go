package jsondoc

import "strconv"

// A Kind is the type of a JSON value.
type Kind uint8

// The kinds of JSON values.
const (
	Null Kind = iota
	Bool
	Number
	String
	Array
	Object
	// Raw is JSON text made elsewhere, held in Text and written by Marshal
	// as it is. Parse never makes one; the maker vouches for the text.
	Raw
)

var kindNames = [...]string{"null", "boolean", "number", "string", "array", "object", "raw JSON"}

// String returns the JSON name of the kind, such as "number".
func (k Kind) String() string {
	if int(k) < len(kindNames) {
		return kindNames[k]
	}
	return "unknown"
}

// A Value is one node of a JSON document.
type Value struct {
	Kind Kind
	// Text holds a string's content or a number's exact literal text.
	Text   string
	Bool   bool
	Items  []*Value // array elements
	Fields []Field  // object members, in order
	Line   int      // the line the value starts on, when parsed (1-based)
}

// LineOf is the line v starts on, or 0 for a nil value or one not
// parsed.
func LineOf(v *Value) int {
	if v == nil {
		return 0
	}
	return v.Line
}

// A Field is one member of an object.
type Field struct {
	Key   string
	Value *Value
}

// The constructors and methods that documents call thousands of times are
// marked noinline: inlined at every call they grow the WebAssembly build
// by about 110 KB gzipped, for no measurable gain in speed.

// RawJSON returns a value that Marshal writes as text, which must be one
// complete JSON value. It lets a large document written by a faster path
// (see render.JSON) go into a tree without being rebuilt value by value.
func RawJSON(text string) *Value { return &Value{Kind: Raw, Text: text} }

// NewObject returns an empty object.
func NewObject() *Value { return &Value{Kind: Object} }

// NewArray returns an array of the given items.
//
//go:noinline
func NewArray(items ...*Value) *Value { return &Value{Kind: Array, Items: items} }

// Str returns a string value.
//
//go:noinline
func Str(s string) *Value { return &Value{Kind: String, Text: s} }

// Num returns a number value from its literal text, which must be a valid
// JSON number (such as an exact decimal "1250.75").
//
//go:noinline
func Num(text string) *Value { return &Value{Kind: Number, Text: text} }

// Int returns a number value for n.
//
//go:noinline
func Int(n int) *Value { return &Value{Kind: Number, Text: strconv.Itoa(n)} }

// Float returns a number value for f with the shortest exact-enough text.
// Infinities and NaN, which JSON cannot hold, become null.
//
//go:noinline
func Float(f float64) *Value {
	if f != f || f > 1.7976931348623157e308 || f < -1.7976931348623157e308 {
		return NullValue()
	}
	return &Value{Kind: Number, Text: strconv.FormatFloat(f, 'g', -1, 64)}
}

// Boolean returns a boolean value.
func Boolean(b bool) *Value { return &Value{Kind: Bool, Bool: b} }

// NullValue returns null.
func NullValue() *Value { return &Value{Kind: Null} }

// Set adds or replaces the member key of an object and returns the object.
//
//go:noinline
func (v *Value) Set(key string, x *Value) *Value {
	if x == nil {
		x = NullValue()
	}
	for i := range v.Fields {
		if v.Fields[i].Key == key {
			v.Fields[i].Value = x
			return v
		}
	}
	v.Fields = append(v.Fields, Field{key, x})
	return v
}

// Append adds items to an array and returns the array.
//
//go:noinline
func (v *Value) Append(items ...*Value) *Value {
	v.Items = append(v.Items, items...)
	return v
}

// Get returns the member key of an object, or nil when v is not an object
// or has no such member.
//
//go:noinline
func (v *Value) Get(key string) *Value {
	if v == nil || v.Kind != Object {
		return nil
	}
	for _, f := range v.Fields {
		if f.Key == key {
			return f.Value
		}
	}
	return nil
}

// IsNull reports whether v is missing or null.
func (v *Value) IsNull() bool { return v == nil || v.Kind == Null }

// ScalarText is the text of a string or a number (a number's exact
// literal), or "" for any other value or none.
func ScalarText(v *Value) string {
	if v == nil {
		return ""
	}
	switch v.Kind {
	case String, Number:
		return v.Text
	}
	return ""
}
