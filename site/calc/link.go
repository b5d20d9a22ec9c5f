package calc

import (
	"encoding/base64"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
)

// A calculator's link carries the scenario being edited and, when one is
// pinned, the baseline it is compared with, in the URL fragment as
// #ID=PAYLOAD. The payload is short and URL-safe:
//
//	~SIDE            the scenario, written against the block's own
//	~SIDE!SIDE       the baseline against the block's own, then the
//	                 proposal against the baseline
//
// A side lists only the members that differ from the document it is
// written against, separated by '*'. Known members have a one-letter code
// followed by the value: s seats, m method (itself a letter: h hamilton,
// d droop, j jefferson, w webster, a adams, e dean, u huntington-hill, s
// modified-sainte-lague), n min, x max, t threshold, r tie, f from, o to,
// M methods (a list separated by '~'), a admit (name~population~added),
// u units (separated by ','). Any other member of text is KEY:VALUE. A
// unit is name~population~min~max~later, each field empty when it equals
// the field of the unit at the same place in the other document, trailing
// empty fields left out: a proposal that changes one unit's count writes
// its units as ",,~1250,,". A value ' means the member or field is
// absent, '' the empty text; other text is percent-escaped except for
// letters, digits, '.', '-' and '_', with a space written as '_'.
//
// Links written as base64url of the scenario's JSON, the calculator's
// earlier form, are still read.

// MaxLinkBytes is the longest link payload a calculator reads.
const MaxLinkBytes = 1 << 20

// linkCodes maps the one-letter codes of members to their keys.
var linkCodes = map[byte]string{
	's': "seats", 'm': "method", 'n': "min", 'x': "max", 't': "threshold", 'r': "tie", 'f': "from", 'o': "to",
}

// methodCodes are the methods' one-letter codes in a link.
var methodCodes = map[engine.Method]byte{
	engine.Hamilton: 'h', engine.Droop: 'd', engine.Jefferson: 'j', engine.Webster: 'w',
	engine.Adams: 'a', engine.Dean: 'e', engine.HuntingtonHill: 'u', engine.ModifiedSainteLague: 's',
}

// unitFields and admitFields are the fields of a unit and of the admitted
// unit, in the order a link writes them.
var (
	unitFields  = []string{"name", "population", "min", "max", "later"}
	admitFields = []string{"name", "population", "added"}
)

// A LinkError says why a link cannot be read.
type LinkError struct{ Msg string }

func (e *LinkError) Error() string { return e.Msg }

func linkErr(msg string) error { return &LinkError{Msg: msg} }

// EncodeLink writes the link payload of scenario, against the block's own
// document block, with baseline (nil when none is pinned).
func EncodeLink(block, baseline, scenario *jsondoc.Value) string {
	if baseline.IsNull() {
		return "~" + encodeSide(block, scenario)
	}
	return "~" + encodeSide(block, baseline) + "!" + encodeSide(baseline, scenario)
}

// DecodeLink reads a link payload written by EncodeLink (or the earlier
// base64url JSON form) against the block's own document: the baseline (nil
// when the link has none) and the scenario. A damaged link is an error
// that says what is wrong; it never panics.
func DecodeLink(block *jsondoc.Value, s string) (baseline, scenario *jsondoc.Value, err error) {
	if len(s) > MaxLinkBytes {
		return nil, nil, linkErr("the link is longer than " + strconv.Itoa(MaxLinkBytes>>10) + " KiB")
	}
	if !strings.HasPrefix(s, "~") {
		v, err := decodeOldLink(s)
		return nil, v, err
	}
	sides := strings.Split(s[1:], "!")
	if len(sides) > 2 {
		return nil, nil, linkErr("the link is damaged (more than two scenarios)")
	}
	first, err := decodeSide(block, sides[0])
	if err != nil {
		return nil, nil, err
	}
	if len(sides) == 1 {
		return nil, first, nil
	}
	second, err := decodeSide(first, sides[1])
	if err != nil {
		return nil, nil, linkErr("the proposal: " + err.Error())
	}
	return first, second, nil
}

// decodeOldLink reads the earlier form: base64url of the scenario's JSON.
func decodeOldLink(s string) (*jsondoc.Value, error) {
	b, err := base64.RawURLEncoding.DecodeString(strings.TrimRight(s, "="))
	if err != nil {
		return nil, linkErr("the link is damaged (it is neither a scenario link nor valid base64)")
	}
	v, err := parseJSON(string(b))
	if err != nil {
		return nil, linkErr("the link is damaged (not valid JSON)")
	}
	if v.Kind != jsondoc.Object {
		return nil, linkErr("the link does not hold a scenario")
	}
	return withoutLines(v), nil
}

// scalar returns the text of a string, number or boolean, and whether v is
// one.
func scalar(v *jsondoc.Value) (string, bool) {
	if v == nil {
		return "", false
	}
	switch v.Kind {
	case jsondoc.String, jsondoc.Number:
		return v.Text, true
	case jsondoc.Bool:
		return strconv.FormatBool(v.Bool), true
	}
	return "", false
}

// sameValue reports whether two members say the same (numbers and strings
// of the same text are the same).
func sameValue(a, b *jsondoc.Value) bool {
	if a.IsNull() || b.IsNull() {
		return a.IsNull() == b.IsNull()
	}
	if x, ok := scalar(a); ok {
		y, ok2 := scalar(b)
		return ok2 && x == y
	}
	if a.Kind != b.Kind {
		return false
	}
	switch a.Kind {
	case jsondoc.Array:
		if len(a.Items) != len(b.Items) {
			return false
		}
		for i := range a.Items {
			if !sameValue(a.Items[i], b.Items[i]) {
				return false
			}
		}
		return true
	case jsondoc.Object:
		if len(a.Fields) != len(b.Fields) {
			return false
		}
		for _, f := range a.Fields {
			if !sameValue(f.Value, b.Get(f.Key)) {
				return false
			}
		}
		return true
	}
	return false
}

// codeOf returns the one-letter code of a member's key, or 0.
func codeOf(key string) byte {
	for c, k := range linkCodes {
		if k == key {
			return c
		}
	}
	switch key {
	case "units":
		return 'u'
	case "admit":
		return 'a'
	case "methods":
		return 'M'
	}
	return 0
}

// encodeSide writes the members of doc that differ from ref.
func encodeSide(ref, doc *jsondoc.Value) string {
	var toks []string
	if doc == nil || doc.Kind != jsondoc.Object {
		doc = jsondoc.NewObject()
	}
	for _, f := range doc.Fields {
		was := ref.Get(f.Key)
		if sameValue(was, f.Value) || f.Value.IsNull() {
			continue
		}
		c := codeOf(f.Key)
		var val string
		switch {
		case c == 'u':
			if f.Value.Kind != jsondoc.Array {
				continue
			}
			val = encodeUnits(was, f.Value)
		case c == 'a':
			if f.Value.Kind != jsondoc.Object {
				continue
			}
			val = encodeEntry(was, f.Value, admitFields, false)
		case c == 'M':
			if f.Value.Kind != jsondoc.Array {
				continue
			}
			var ms []string
			for _, x := range f.Value.Items {
				t, _ := scalar(x)
				ms = append(ms, encodeMethod(t))
			}
			val = strings.Join(ms, "~")
		default:
			t, ok := scalar(f.Value)
			if !ok {
				continue // only the members above may be other than text
			}
			if c == 'm' {
				val = encodeMethod(t)
			} else {
				val = escapeValue(t)
			}
		}
		if c == 0 {
			toks = append(toks, escapeValue(f.Key)+":"+val)
		} else {
			toks = append(toks, string(c)+val)
		}
	}
	if ref != nil && ref.Kind == jsondoc.Object {
		for _, f := range ref.Fields {
			if f.Value.IsNull() || !doc.Get(f.Key).IsNull() {
				continue
			}
			if c := codeOf(f.Key); c != 0 {
				toks = append(toks, string(c)+"'")
			} else {
				toks = append(toks, escapeValue(f.Key)+":'")
			}
		}
	}
	return strings.Join(toks, "*")
}

// encodeUnits writes units against the units ref (nil when none).
func encodeUnits(ref, units *jsondoc.Value) string {
	es := make([]string, len(units.Items))
	for i, u := range units.Items {
		var was *jsondoc.Value
		if ref != nil && ref.Kind == jsondoc.Array && i < len(ref.Items) {
			was = ref.Items[i]
		}
		es[i] = encodeEntry(was, u, unitFields, len(units.Items) == 1)
	}
	return strings.Join(es, ",")
}

// encodeEntry writes an object's fields (a unit, the admitted unit)
// against ref's, joined by '~', trailing empty fields left out. keep
// writes a lone unit that equals ref as "~" rather than "", which would
// read as no unit at all.
func encodeEntry(ref, v *jsondoc.Value, fields []string, keep bool) string {
	parts := make([]string, len(fields))
	for k, key := range fields {
		var was *jsondoc.Value
		if ref != nil && ref.Kind == jsondoc.Object {
			was = ref.Get(key)
		}
		now := v.Get(key)
		if v.Kind != jsondoc.Object {
			now = nil
		}
		if sameValue(was, now) {
			continue
		}
		t, ok := scalar(now)
		if !ok {
			parts[k] = "'"
			continue
		}
		parts[k] = escapeValue(t)
	}
	n := len(parts)
	for n > 0 && parts[n-1] == "" {
		n--
	}
	s := strings.Join(parts[:n], "~")
	if s == "" && keep {
		return "~"
	}
	return s
}

func encodeMethod(t string) string {
	if m, err := engine.ParseMethod(t); err == nil && m.String() == t {
		return string(methodCodes[m])
	}
	e := escapeValue(t)
	if len(e) == 1 {
		return "%" + string(hexDigits[e[0]>>4]) + string(hexDigits[e[0]&15])
	}
	return e
}

func decodeMethod(t string) (string, error) {
	if len(t) == 1 {
		for m, c := range methodCodes {
			if c == t[0] {
				return m.String(), nil
			}
		}
		return "", linkErr("the link is damaged (" + strconv.Quote(t) + " is not a method's code)")
	}
	return unescapeValue(t)
}

const hexDigits = "0123456789ABCDEF"

// plainByte reports whether a link writes c as it is.
func plainByte(c byte) bool {
	return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= '0' && c <= '9' || c == '.' || c == '-'
}

// escapeValue writes text for a link: letters, digits, '.' and '-' as
// they are, a space as '_', every other byte as %XX; the empty text as two
// apostrophes.
func escapeValue(s string) string {
	if s == "" {
		return "''"
	}
	var b strings.Builder
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case plainByte(c):
			b.WriteByte(c)
		case c == ' ':
			b.WriteByte('_')
		default:
			b.WriteByte('%')
			b.WriteByte(hexDigits[c>>4])
			b.WriteByte(hexDigits[c&15])
		}
	}
	return b.String()
}

// unescapeValue reads what escapeValue wrote (not the absent mark ').
func unescapeValue(s string) (string, error) {
	if s == "''" {
		return "", nil
	}
	var b strings.Builder
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case plainByte(c):
			b.WriteByte(c)
		case c == '_':
			b.WriteByte(' ')
		case c == '%':
			if i+2 >= len(s) {
				return "", linkErr("the link is damaged (a cut %-escape)")
			}
			n, err := strconv.ParseUint(s[i+1:i+3], 16, 8)
			if err != nil {
				return "", linkErr("the link is damaged (" + strconv.Quote(s[i:i+3]) + " is not a %-escape)")
			}
			b.WriteByte(byte(n))
			i += 2
		default:
			return "", linkErr("the link is damaged (it holds " + strconv.Quote(string(c)) + " where a value belongs)")
		}
	}
	return b.String(), nil
}

// decodeSide reads a side against ref: a copy of ref with the side's
// members set or removed.
func decodeSide(ref *jsondoc.Value, side string) (*jsondoc.Value, error) {
	out := jsondoc.NewObject()
	if ref != nil && ref.Kind == jsondoc.Object {
		for _, f := range ref.Fields {
			out.Set(f.Key, f.Value)
		}
	}
	if side == "" {
		return out, nil
	}
	drop := map[string]bool{}
	for _, tok := range strings.Split(side, "*") {
		if tok == "" {
			return nil, linkErr("the link is damaged (an empty member)")
		}
		var key, val string
		if k := strings.IndexByte(tok, ':'); k >= 0 {
			var err error
			if key, err = unescapeValue(tok[:k]); err != nil {
				return nil, err
			}
			val = tok[k+1:]
		} else {
			c := tok[0]
			val = tok[1:]
			switch {
			case linkCodes[c] != "":
				key = linkCodes[c]
			case c == 'u':
				key = "units"
			case c == 'a':
				key = "admit"
			case c == 'M':
				key = "methods"
			default:
				return nil, linkErr("the link is damaged (" + strconv.Quote(string(c)) + " is not a member's code)")
			}
		}
		if val == "'" {
			drop[key] = true
			continue
		}
		delete(drop, key)
		var x *jsondoc.Value
		var err error
		switch key {
		case "units":
			x, err = decodeUnits(ref.Get("units"), val)
		case "admit":
			x, err = decodeEntry(ref.Get("admit"), val, admitFields)
		case "methods":
			arr := jsondoc.NewArray()
			for _, m := range strings.Split(val, "~") {
				t, merr := decodeMethod(m)
				if merr != nil {
					return nil, merr
				}
				arr.Append(jsondoc.Str(t))
			}
			x = arr
		case "method":
			var t string
			t, err = decodeMethod(val)
			x = jsondoc.Str(t)
		default:
			var t string
			t, err = unescapeValue(val)
			x = jsondoc.Str(t)
		}
		if err != nil {
			return nil, err
		}
		out.Set(key, x)
	}
	if len(drop) == 0 {
		return out, nil
	}
	kept := jsondoc.NewObject()
	for _, f := range out.Fields {
		if !drop[f.Key] {
			kept.Set(f.Key, f.Value)
		}
	}
	return kept, nil
}

// decodeUnits reads a units list against the units ref.
func decodeUnits(ref *jsondoc.Value, val string) (*jsondoc.Value, error) {
	arr := jsondoc.NewArray()
	if val == "" {
		return arr, nil
	}
	if n := strings.Count(val, ",") + 1; n > MaxUnits {
		return nil, linkErr("the link holds " + strconv.Itoa(n) + " units, more than the " + strconv.Itoa(MaxUnits) + " a calculator lays out")
	}
	for i, e := range strings.Split(val, ",") {
		var was *jsondoc.Value
		if ref != nil && ref.Kind == jsondoc.Array && i < len(ref.Items) {
			was = ref.Items[i]
		}
		u, err := decodeEntry(was, e, unitFields)
		if err != nil {
			return nil, linkErr("unit " + strconv.Itoa(i+1) + ": " + err.Error())
		}
		arr.Append(u)
	}
	return arr, nil
}

// decodeEntry reads an entry's fields against ref's.
func decodeEntry(ref *jsondoc.Value, e string, fields []string) (*jsondoc.Value, error) {
	parts := strings.Split(e, "~")
	if len(parts) > len(fields) {
		return nil, linkErr("the link is damaged (" + strconv.Itoa(len(parts)) + " fields where at most " + strconv.Itoa(len(fields)) + " belong)")
	}
	out := jsondoc.NewObject()
	for k, key := range fields {
		p := ""
		if k < len(parts) {
			p = parts[k]
		}
		if p == "" {
			if ref != nil && ref.Kind == jsondoc.Object {
				if was := ref.Get(key); !was.IsNull() {
					out.Set(key, was)
				}
			}
			continue
		}
		if p == "'" {
			continue
		}
		t, err := unescapeValue(p)
		if err != nil {
			return nil, err
		}
		out.Set(key, jsondoc.Str(t))
	}
	return out, nil
}
