package jsondoc

import (
	"strconv"
	"unicode/utf16"
	"unicode/utf8"
)

// MaxDepth is the deepest nesting Parse accepts.
const MaxDepth = 64

// A SyntaxError reports malformed JSON at a line and column (both 1-based).
type SyntaxError struct {
	Line, Col int
	Msg       string
}

func (e *SyntaxError) Error() string {
	return "line " + strconv.Itoa(e.Line) + ", column " + strconv.Itoa(e.Col) + ": " + e.Msg
}

type parser struct {
	s          []byte
	i          int
	line, lcol int // current line and the offset where it starts
	max, n     int // the most values allowed (0: any number) and those read
}

// Parse reads one JSON document. A byte-order mark at the start is skipped.
// Duplicate object keys are refused.
func Parse(data []byte) (*Value, error) {
	return parse(data, 0)
}

// ParseLimit is Parse for text from an untrusted source: it refuses a
// document of more than max values (every number, string, literal, array
// and object counts one), which bounds the memory the tree takes, about a
// hundred bytes a value, whatever the text holds.
func ParseLimit(data []byte, max int) (*Value, error) {
	return parse(data, max)
}

func parse(data []byte, max int) (*Value, error) {
	p := &parser{s: data, line: 1, max: max}
	if len(data) >= 3 && data[0] == 0xEF && data[1] == 0xBB && data[2] == 0xBF {
		p.i = 3
		p.lcol = 3
	}
	p.space()
	v, err := p.value(0)
	if err != nil {
		return nil, err
	}
	p.space()
	if p.i < len(p.s) {
		return nil, p.errf("unexpected text after the document")
	}
	return v, nil
}

func (p *parser) errf(msg string) error {
	return &SyntaxError{Line: p.line, Col: p.i - p.lcol + 1, Msg: msg}
}

func (p *parser) space() {
	for p.i < len(p.s) {
		switch p.s[p.i] {
		case '\n':
			p.line++
			p.lcol = p.i + 1
		case ' ', '\t', '\r':
		default:
			return
		}
		p.i++
	}
}

func (p *parser) value(depth int) (*Value, error) {
	if depth > MaxDepth {
		return nil, p.errf("nested too deeply")
	}
	if p.n++; p.max > 0 && p.n > p.max {
		return nil, p.errf("more than " + strconv.Itoa(p.max) + " values, the limit")
	}
	if p.i >= len(p.s) {
		return nil, p.errf("unexpected end of input")
	}
	line := p.line
	switch c := p.s[p.i]; {
	case c == '{':
		return p.object(depth)
	case c == '[':
		return p.array(depth)
	case c == '"':
		s, err := p.str()
		if err != nil {
			return nil, err
		}
		return &Value{Kind: String, Text: s, Line: line}, nil
	case c == '-' || (c >= '0' && c <= '9'):
		return p.number()
	case p.lit("true"):
		return &Value{Kind: Bool, Bool: true, Line: line}, nil
	case p.lit("false"):
		return &Value{Kind: Bool, Line: line}, nil
	case p.lit("null"):
		return &Value{Kind: Null, Line: line}, nil
	}
	return nil, p.errf("unexpected character " + strconv.QuoteRune(rune(p.s[p.i])))
}

func (p *parser) lit(w string) bool {
	if len(p.s)-p.i >= len(w) && string(p.s[p.i:p.i+len(w)]) == w {
		p.i += len(w)
		return true
	}
	return false
}

func (p *parser) object(depth int) (*Value, error) {
	v := &Value{Kind: Object, Line: p.line}
	var keys map[string]bool // the keys, once there are many (a linear search each would be quadratic)
	p.i++
	p.space()
	if p.i < len(p.s) && p.s[p.i] == '}' {
		p.i++
		return v, nil
	}
	for {
		p.space()
		if p.i >= len(p.s) || p.s[p.i] != '"' {
			return nil, p.errf("expected a quoted member name")
		}
		k, err := p.str()
		if err != nil {
			return nil, err
		}
		if len(v.Fields) < 16 {
			if v.Get(k) != nil {
				return nil, p.errf("member " + strconv.Quote(k) + " appears twice")
			}
		} else {
			if keys == nil {
				keys = make(map[string]bool, 2*len(v.Fields))
				for _, f := range v.Fields {
					keys[f.Key] = true
				}
			}
			if keys[k] {
				return nil, p.errf("member " + strconv.Quote(k) + " appears twice")
			}
			keys[k] = true
		}
		p.space()
		if p.i >= len(p.s) || p.s[p.i] != ':' {
			return nil, p.errf("expected ':' after member name")
		}
		p.i++
		p.space()
		x, err := p.value(depth + 1)
		if err != nil {
			return nil, err
		}
		v.Fields = append(v.Fields, Field{k, x})
		p.space()
		if p.i >= len(p.s) {
			return nil, p.errf("unexpected end of input in an object")
		}
		switch p.s[p.i] {
		case ',':
			p.i++
		case '}':
			p.i++
			return v, nil
		default:
			return nil, p.errf("expected ',' or '}' in an object")
		}
	}
}

func (p *parser) array(depth int) (*Value, error) {
	v := &Value{Kind: Array, Line: p.line}
	p.i++
	p.space()
	if p.i < len(p.s) && p.s[p.i] == ']' {
		p.i++
		return v, nil
	}
	for {
		p.space()
		x, err := p.value(depth + 1)
		if err != nil {
			return nil, err
		}
		v.Items = append(v.Items, x)
		p.space()
		if p.i >= len(p.s) {
			return nil, p.errf("unexpected end of input in an array")
		}
		switch p.s[p.i] {
		case ',':
			p.i++
		case ']':
			p.i++
			return v, nil
		default:
			return nil, p.errf("expected ',' or ']' in an array")
		}
	}
}

func (p *parser) number() (*Value, error) {
	start, line := p.i, p.line
	if p.s[p.i] == '-' {
		p.i++
	}
	digits := func() int {
		n := 0
		for p.i < len(p.s) && p.s[p.i] >= '0' && p.s[p.i] <= '9' {
			p.i++
			n++
		}
		return n
	}
	if p.i < len(p.s) && p.s[p.i] == '0' {
		p.i++
	} else if digits() == 0 {
		return nil, p.errf("malformed number")
	}
	if p.i < len(p.s) && p.s[p.i] == '.' {
		p.i++
		if digits() == 0 {
			return nil, p.errf("malformed number")
		}
	}
	if p.i < len(p.s) && (p.s[p.i] == 'e' || p.s[p.i] == 'E') {
		p.i++
		if p.i < len(p.s) && (p.s[p.i] == '+' || p.s[p.i] == '-') {
			p.i++
		}
		if digits() == 0 {
			return nil, p.errf("malformed number")
		}
	}
	return &Value{Kind: Number, Text: string(p.s[start:p.i]), Line: line}, nil
}

func (p *parser) str() (string, error) {
	p.i++ // opening quote
	var b []byte
	for {
		if p.i >= len(p.s) {
			return "", p.errf("unterminated string")
		}
		c := p.s[p.i]
		switch {
		case c == '"':
			p.i++
			return string(b), nil
		case c == '\\':
			p.i++
			if p.i >= len(p.s) {
				return "", p.errf("unterminated string")
			}
			e := p.s[p.i]
			p.i++
			switch e {
			case '"', '\\', '/':
				b = append(b, e)
			case 'b':
				b = append(b, '\b')
			case 'f':
				b = append(b, '\f')
			case 'n':
				b = append(b, '\n')
			case 'r':
				b = append(b, '\r')
			case 't':
				b = append(b, '\t')
			case 'u':
				r, ok := p.hex4()
				if !ok {
					return "", p.errf("malformed \\u escape")
				}
				if utf16.IsSurrogate(r) {
					r2 := rune(utf8.RuneError)
					if p.i+1 < len(p.s) && p.s[p.i] == '\\' && p.s[p.i+1] == 'u' {
						p.i += 2
						if x, ok := p.hex4(); ok {
							r2 = x
						}
					}
					r = utf16.DecodeRune(r, r2)
				}
				b = utf8.AppendRune(b, r)
			default:
				return "", p.errf("unknown escape \\" + string(rune(e)))
			}
		case c < 0x20:
			return "", p.errf("control character in a string")
		default:
			r, size := utf8.DecodeRune(p.s[p.i:])
			if r == utf8.RuneError && size == 1 {
				return "", p.errf("invalid UTF-8 in a string")
			}
			b = append(b, p.s[p.i:p.i+size]...)
			p.i += size
		}
	}
}

func (p *parser) hex4() (rune, bool) {
	if len(p.s)-p.i < 4 {
		return 0, false
	}
	n, err := strconv.ParseUint(string(p.s[p.i:p.i+4]), 16, 32)
	if err != nil {
		return 0, false
	}
	p.i += 4
	return rune(n), true
}
