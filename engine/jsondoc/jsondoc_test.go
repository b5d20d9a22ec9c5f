package jsondoc

import (
	"strconv"
	"strings"
	"testing"
)

func TestRoundTrip(t *testing.T) {
	in := `{"a": 1.50, "b": [true, false, null, "x\"y\u00e9"], "c": {"d": -2e3}}`
	v, err := Parse([]byte(in))
	if err != nil {
		t.Fatal(err)
	}
	if got := v.Get("a").Text; got != "1.50" {
		t.Errorf("number text = %q, want exact 1.50", got)
	}
	out := string(Marshal(v))
	want := `{"a":1.50,"b":[true,false,null,"x\"yé"],"c":{"d":-2e3}}`
	if out != want {
		t.Errorf("Marshal = %s, want %s", out, want)
	}
}

func TestErrors(t *testing.T) {
	for _, tc := range []struct{ in, want string }{
		{"{\n\"a\": 1,\n\"a\": 2}", "line 3"},
		{"[1,\n2,\n]", "line 3"},
		{`{"a" 1}`, "expected ':'"},
		{`"abc`, "unterminated"},
		{`01`, "after the document"},
		{``, "end of input"},
		{strings.Repeat("[", 100), "deeply"},
	} {
		_, err := Parse([]byte(tc.in))
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("Parse(%q) error = %v, want one containing %q", tc.in, err, tc.want)
		}
	}
}

func TestHTMLSafe(t *testing.T) {
	got := string(Marshal(Str("</script><b>&")))
	if strings.ContainsAny(got, "<>&") {
		t.Errorf("Marshal = %s: not safe inside a script element", got)
	}
}

func FuzzParse(f *testing.F) {
	for _, s := range []string{`{"units":[{"name":"A","population":12}]}`, `[1,2,{"x":null}]`, `"\ud83d\ude00"`} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		v, err := Parse(data)
		if err != nil {
			return
		}
		again, err := Parse(Marshal(v))
		if err != nil {
			t.Fatalf("re-parse of %s: %v", Marshal(v), err)
		}
		if string(Marshal(again)) != string(Marshal(v)) {
			t.Fatalf("round trip changed %s", Marshal(v))
		}
	})
}

// TestAppendString checks every kind of character AppendString writes:
// runs copied as they are, escapes, HTML-sensitive characters, line and
// paragraph separators, multi-byte UTF-8 and invalid bytes.
func TestAppendString(t *testing.T) {
	for _, tc := range []struct{ in, want string }{
		{"", `""`},
		{"plain text 123", `"plain text 123"`},
		{`a"b\c`, `"a\"b\\c"`},
		{"tab\tnew\nret\r", `"tab\tnew\nret\r"`},
		{"\x00\x1f", `"\u0000\u001f"`},
		{"<b>&amp;", `"\u003cb\u003e\u0026amp;"`},
		{"Sainte-Laguë – ok", `"Sainte-Laguë – ok"`},
		{"line\u2028para\u2029", `"line\u2028para\u2029"`},
		{"bad\xffbyte", `"bad\ufffdbyte"`},
		{"\xe2\x82", `"\ufffd\ufffd"`},
	} {
		if got := string(AppendString(nil, tc.in)); got != tc.want {
			t.Errorf("AppendString(%q) = %s, want %s", tc.in, got, tc.want)
		}
	}
}

// TestAppendMarshal checks that AppendMarshal extends a buffer with what
// Marshal writes, and can reuse it.
func TestAppendMarshal(t *testing.T) {
	v := NewObject().Set("a", Int(1)).Set("b", NewArray(Str("x"), NullValue()))
	buf := AppendMarshal([]byte("pre:"), v)
	if got, want := string(buf), "pre:"+string(Marshal(v)); got != want {
		t.Fatalf("AppendMarshal = %s, want %s", got, want)
	}
	again := AppendMarshal(buf[:0], Str("y"))
	if string(again) != `"y"` || &again[0] != &buf[0] {
		t.Errorf("reuse: %s (same buffer: %v)", again, &again[0] == &buf[0])
	}
}

// TestRawJSON checks that raw JSON text is written as it is, compact or
// indented, and that an empty one is null.
func TestRawJSON(t *testing.T) {
	v := NewObject().Set("a", RawJSON(`[1,{"b":2}]`)).Set("c", RawJSON(""))
	if got := string(Marshal(v)); got != `{"a":[1,{"b":2}],"c":null}` {
		t.Errorf("Marshal = %s", got)
	}
	if got := string(MarshalIndent(v, " ")); got != "{\n \"a\": [1,{\"b\":2}],\n \"c\": null\n}\n" {
		t.Errorf("MarshalIndent = %q", got)
	}
	if Raw.String() != "raw JSON" {
		t.Errorf("Raw.String() = %q", Raw.String())
	}
}

func TestParseLimit(t *testing.T) {
	for _, tc := range []struct {
		text string
		max  int
		ok   bool
	}{
		{`[1, 2, 3]`, 4, true},
		{`[1, 2, 3]`, 3, false},
		{`{"a": [true, null], "b": "x"}`, 5, true},
		{`{"a": [true, null], "b": "x"}`, 4, false},
		{`[` + strings.Repeat(`[],`, 1000) + `[]]`, 1002, true},
		{`[` + strings.Repeat(`[],`, 1000) + `[]]`, 1001, false},
	} {
		_, err := ParseLimit([]byte(tc.text), tc.max)
		if (err == nil) != tc.ok {
			t.Errorf("ParseLimit(%.40s, %d) = %v", tc.text, tc.max, err)
		}
		if err != nil && !strings.Contains(err.Error(), "values, the limit") {
			t.Errorf("ParseLimit(%.40s, %d): %v", tc.text, tc.max, err)
		}
	}
}

// Duplicate keys are found in objects of any size, in linear time.
func TestParseDuplicateKeys(t *testing.T) {
	var b strings.Builder
	b.WriteString("{")
	for i := 0; i < 100_000; i++ {
		b.WriteString(`"k` + strconv.Itoa(i) + `": 1, `)
	}
	if _, err := Parse([]byte(b.String() + `"last": 2}`)); err != nil {
		t.Fatal(err)
	}
	if _, err := Parse([]byte(b.String() + `"k99999": 2}`)); err == nil || !strings.Contains(err.Error(), "appears twice") {
		t.Fatalf("a repeated key: %v", err)
	}
}

func TestLineOf(t *testing.T) {
	v, err := Parse([]byte("{\n  \"a\": 1,\n  \"b\":\n    [2]\n}"))
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		v    *Value
		want int
	}{
		{v, 1},
		{v.Get("a"), 2},
		{v.Get("b"), 4},
		{v.Get("missing"), 0},
		{Int(3), 0},
	} {
		if got := LineOf(c.v); got != c.want {
			t.Errorf("LineOf(%v) = %d, want %d", c.v, got, c.want)
		}
	}
}

func TestScalarText(t *testing.T) {
	for _, c := range []struct {
		v    *Value
		want string
	}{
		{Str("North"), "North"},
		{Num("1.50"), "1.50"},
		{Boolean(true), ""},
		{NullValue(), ""},
		{NewArray(Int(1)), ""},
		{nil, ""},
	} {
		if got := ScalarText(c.v); got != c.want {
			t.Errorf("ScalarText(%v) = %q, want %q", c.v, got, c.want)
		}
	}
}
