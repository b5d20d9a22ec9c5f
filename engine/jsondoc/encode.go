package jsondoc

import (
	"strconv"
	"unicode/utf8"
)

// Marshal writes v as compact JSON.
func Marshal(v *Value) []byte { return appendValue(nil, v, "", "") }

// AppendMarshal appends v as compact JSON to b and returns the extended
// buffer, so that a caller writing many documents can reuse one buffer.
func AppendMarshal(b []byte, v *Value) []byte { return appendValue(b, v, "", "") }

// MarshalIndent writes v as JSON with one member or element a line, each
// level indented by indent.
func MarshalIndent(v *Value, indent string) []byte {
	b := appendValue(nil, v, "\n", indent)
	return append(b, '\n')
}

func appendValue(b []byte, v *Value, nl, indent string) []byte {
	if v == nil {
		return append(b, "null"...)
	}
	switch v.Kind {
	case Null:
		return append(b, "null"...)
	case Bool:
		return strconv.AppendBool(b, v.Bool)
	case Number:
		if v.Text == "" {
			return append(b, '0')
		}
		return append(b, v.Text...)
	case String:
		return AppendString(b, v.Text)
	case Raw:
		if v.Text == "" {
			return append(b, "null"...)
		}
		return append(b, v.Text...)
	case Array:
		if len(v.Items) == 0 {
			return append(b, "[]"...)
		}
		b = append(b, '[')
		inner := nl
		if nl != "" {
			inner = nl + indent
		}
		for i, x := range v.Items {
			if i > 0 {
				b = append(b, ',')
			}
			b = append(b, inner...)
			b = appendValue(b, x, inner, indent)
		}
		b = append(b, nl...)
		return append(b, ']')
	case Object:
		if len(v.Fields) == 0 {
			return append(b, "{}"...)
		}
		b = append(b, '{')
		inner := nl
		if nl != "" {
			inner = nl + indent
		}
		for i, f := range v.Fields {
			if i > 0 {
				b = append(b, ',')
			}
			b = append(b, inner...)
			b = AppendString(b, f.Key)
			b = append(b, ':')
			if nl != "" {
				b = append(b, ' ')
			}
			b = appendValue(b, f.Value, inner, indent)
		}
		b = append(b, nl...)
		return append(b, '}')
	}
	return append(b, "null"...)
}

// AppendString appends s as a quoted JSON string. The characters <, > and &
// are escaped so that the output is safe inside an HTML script element.
func AppendString(b []byte, s string) []byte {
	const hex = "0123456789abcdef"
	b = append(b, '"')
	for i := 0; i < len(s); {
		// Copy a run of characters that need no escape at once.
		if plainByte[s[i]] {
			j := i + 1
			for j < len(s) && plainByte[s[j]] {
				j++
			}
			b = append(b, s[i:j]...)
			i = j
			continue
		}
		c := s[i]
		if c < utf8.RuneSelf {
			switch {
			case c == '"' || c == '\\':
				b = append(b, '\\', c)
			case c == '\n':
				b = append(b, '\\', 'n')
			case c == '\r':
				b = append(b, '\\', 'r')
			case c == '\t':
				b = append(b, '\\', 't')
			case c < 0x20 || c == '<' || c == '>' || c == '&':
				b = append(b, '\\', 'u', '0', '0', hex[c>>4], hex[c&15])
			default:
				b = append(b, c)
			}
			i++
			continue
		}
		r, size := utf8.DecodeRuneInString(s[i:])
		switch {
		case r == utf8.RuneError && size == 1:
			b = append(b, `\ufffd`...)
		case r == '\u2028' || r == '\u2029':
			b = append(b, '\\', 'u', '2', '0', '2', hex[r&15])
		default:
			b = append(b, s[i:i+size]...)
		}
		i += size
	}
	return append(b, '"')
}

// plainByte marks the ASCII bytes AppendString copies as they are.
var plainByte = func() (t [256]bool) {
	for c := 0x20; c < utf8.RuneSelf; c++ {
		t[c] = c != '"' && c != '\\' && c != '<' && c != '>' && c != '&'
	}
	return t
}()
