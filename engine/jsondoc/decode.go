package jsondoc

import (
	"strconv"
	"strings"
)

// A Member is one entry of the field table that [Decode] reads an object
// with: the member's key and the function that reads its value into the
// decoded type.
type Member struct {
	Key string
	// Read reads the member's value, which is never nil or null (a null
	// member counts as absent and is not read). An error it returns is
	// placed at the member: a plain error becomes a [MemberError] with the
	// member's path and line, and a MemberError from a nested Decode gets
	// the member's key put in front of its path.
	Read func(v *Value) error
}

// A MemberError is a member that cannot be read, or that the field table
// does not know, placed by its path in the document ("load.text",
// "methods[2]") and the line it was parsed from (0 when the document was
// not parsed from text).
type MemberError struct {
	Path string
	Line int
	Msg  string
}

func (e *MemberError) Error() string {
	s := e.Msg
	if e.Path != "" {
		s = e.Path + ": " + s
	}
	if e.Line > 0 {
		s = "line " + strconv.Itoa(e.Line) + ": " + s
	}
	return s
}

// Decode reads the object v member by member with the field table: each
// member present and not null is read by its entry's Read, in the order
// the object gives them. A member the table does not list is an error
// naming it and the members the table knows; so is v itself when it is
// not an object (what names v in that message, such as "the request").
//
// Decode is the one way the engine's faces read a typed request from a
// JSON tree: the table is the schema, and every error names the member
// and line at fault.
func Decode(v *Value, what string, table []Member) error {
	if v == nil || v.Kind != Object {
		k := "nothing"
		line := 0
		if v != nil {
			k, line = withArticle(v.Kind), v.Line
		}
		return &MemberError{Line: line, Msg: what + " must be an object, not " + k}
	}
	for _, f := range v.Fields {
		m := lookup(table, f.Key)
		if m == nil {
			return &MemberError{Path: f.Key, Line: lineOf(f.Value, v), Msg: "unknown member; " + what + " has " + keys(table)}
		}
		if f.Value.IsNull() {
			continue
		}
		if err := m.Read(f.Value); err != nil {
			return placed(err, f.Key, lineOf(f.Value, v))
		}
	}
	return nil
}

func lookup(table []Member, key string) *Member {
	for i := range table {
		if table[i].Key == key {
			return &table[i]
		}
	}
	return nil
}

func keys(table []Member) string {
	ks := make([]string, len(table))
	for i := range table {
		ks[i] = table[i].Key
	}
	return strings.Join(ks, ", ")
}

func lineOf(v, parent *Value) int {
	if v != nil && v.Line > 0 {
		return v.Line
	}
	return parent.Line
}

// placed puts err at the member key on line.
func placed(err error, key string, line int) error {
	if me, ok := err.(*MemberError); ok {
		p := key
		if me.Path != "" {
			if me.Path[0] == '[' {
				p += me.Path
			} else {
				p += "." + me.Path
			}
		}
		if me.Line == 0 {
			me.Line = line
		}
		me.Path = p
		return me
	}
	return &MemberError{Path: key, Line: line, Msg: err.Error()}
}

// ReadString returns a Read function that stores a string member in dst.
func ReadString(dst *string) func(*Value) error {
	return func(v *Value) error {
		if v.Kind != String {
			return kindError("a string", v)
		}
		*dst = v.Text
		return nil
	}
}

// ReadBool returns a Read function that stores a boolean member in dst.
func ReadBool(dst *bool) func(*Value) error {
	return func(v *Value) error {
		if v.Kind != Bool {
			return kindError("true or false", v)
		}
		*dst = v.Bool
		return nil
	}
}

// ReadInt returns a Read function that stores in dst a whole number from
// lo to hi, given as a JSON number or as a string of digits (form fields
// give numbers as text).
func ReadInt(dst *int, lo, hi int) func(*Value) error {
	return func(v *Value) error {
		if v.Kind != Number && v.Kind != String {
			return kindError("a whole number", v)
		}
		n, err := strconv.Atoi(strings.TrimSpace(v.Text))
		if err != nil || n < lo || n > hi {
			return &MemberError{Line: v.Line, Msg: "must be a whole number from " + strconv.Itoa(lo) + " to " + strconv.Itoa(hi)}
		}
		*dst = n
		return nil
	}
}

// ReadValue returns a Read function that keeps the member's value itself
// in dst, for a member read later or passed on as a tree.
func ReadValue(dst **Value) func(*Value) error {
	return func(v *Value) error {
		*dst = v
		return nil
	}
}

// ReadArray returns a Read function for an array of at most max items that
// reads each item with item; an error is placed at the item ("[2]").
func ReadArray(max int, item func(i int, v *Value) error) func(*Value) error {
	return func(v *Value) error {
		if v.Kind != Array {
			return kindError("an array", v)
		}
		if len(v.Items) > max {
			return &MemberError{Line: v.Line, Msg: "has " + strconv.Itoa(len(v.Items)) + " items, more than the limit of " + strconv.Itoa(max)}
		}
		for i, x := range v.Items {
			if err := item(i, x); err != nil {
				return placed(err, "["+strconv.Itoa(i)+"]", x.Line)
			}
		}
		return nil
	}
}

func kindError(want string, v *Value) error {
	return &MemberError{Line: v.Line, Msg: "must be " + want + ", not " + withArticle(v.Kind)}
}

// withArticle names a kind for a message: "an array", "a string", "null".
func withArticle(k Kind) string {
	switch k {
	case Null:
		return "null"
	case Array, Object:
		return "an " + k.String()
	}
	return "a " + k.String()
}
