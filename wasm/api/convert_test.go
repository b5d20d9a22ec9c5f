package api

import (
	"errors"
	"math"
	"strings"
	"testing"

	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
)

// fake is a stand-in for a JavaScript value.
type fake struct {
	k       jsKind
	b       bool
	f       float64
	s       string
	items   []*fake
	keyList []string
	members map[string]*fake
	throw   error // thrown by every access, like a hostile getter
	n       int   // overrides len(items) when not zero
}

func (x *fake) kind() jsKind { return x.k }
func (x *fake) boolean() (bool, error) {
	return x.b, x.throw
}
func (x *fake) number() (float64, error) { return x.f, x.throw }
func (x *fake) text() (string, error)    { return x.s, x.throw }
func (x *fake) length() (int, error) {
	if x.n != 0 {
		return x.n, x.throw
	}
	return len(x.items), x.throw
}
func (x *fake) index(i int) (jsReader, error) {
	if x.throw != nil {
		return nil, x.throw
	}
	if i >= len(x.items) {
		return fakeUndef(), nil // a hole
	}
	return x.items[i], nil
}
func (x *fake) keys() ([]string, error) { return x.keyList, x.throw }
func (x *fake) get(k string) (jsReader, error) {
	if x.throw != nil {
		return nil, x.throw
	}
	if v, ok := x.members[k]; ok {
		return v, nil
	}
	return fakeUndef(), nil
}

func fakeUndef() *fake             { return &fake{k: jsUndefined} }
func fakeNull() *fake              { return &fake{k: jsNull} }
func fakeNum(f float64) *fake      { return &fake{k: jsNumber, f: f} }
func fakeStr(s string) *fake       { return &fake{k: jsString, s: s} }
func fakeArr(items ...*fake) *fake { return &fake{k: jsArray, items: items} }

// obj takes alternating keys and values.
func fakeObj(kv ...any) *fake {
	o := &fake{k: jsObject, members: map[string]*fake{}}
	for i := 0; i < len(kv); i += 2 {
		k := kv[i].(string)
		o.keyList = append(o.keyList, k)
		o.members[k] = kv[i+1].(*fake)
	}
	return o
}

func TestFromJS(t *testing.T) {
	deep := fakeArr()
	for i := 0; i < 70; i++ {
		deep = fakeObj("units", fakeArr(deep))
	}
	boom := errors.New("boom")
	for _, tc := range []struct {
		name  string
		in    *fake
		want  string // compact JSON, when it converts
		field string // the error's field, when it does not
		msg   string // a part of the error's message
	}{
		{name: "scalars", in: fakeArr(fakeNull(), fakeUndef(), &fake{k: jsBoolean, b: true}, fakeNum(12), fakeStr("x\"y")), want: `[null,null,true,12,"x\"y"]`},
		{name: "integers exactly", in: fakeArr(fakeNum(1e12), fakeNum(9007199254740993), fakeNum(1e21), fakeNum(math.Copysign(0, -1)), fakeNum(3)), want: `[1000000000000,9007199254740992,1000000000000000000000,0,3]`},
		{name: "decimals as JavaScript shows them", in: fakeArr(fakeNum(0.1), fakeNum(1250.75), fakeNum(1e-7), fakeNum(-2.5)), want: `[0.1,1250.75,0.0000001,-2.5]`},
		{name: "bigint digits", in: fakeObj("p", &fake{k: jsBigInt, s: "123456789012345678901"}), want: `{"p":123456789012345678901}`},
		{name: "undefined members left out", in: fakeObj("a", fakeNum(1), "b", fakeUndef(), "c", fakeStr("")), want: `{"a":1,"c":""}`},
		{name: "holes become null", in: &fake{k: jsArray, items: []*fake{fakeNum(1)}, n: 3}, want: `[1,null,null]`},
		{name: "member order kept", in: fakeObj("z", fakeNum(1), "a", fakeNum(2)), want: `{"z":1,"a":2}`},
		{name: "NaN", in: fakeObj("units", fakeArr(fakeObj("name", fakeStr("A"), "population", fakeNum(math.NaN())))), field: "units[0].population", msg: "NaN"},
		{name: "Infinity", in: fakeObj("seats", fakeNum(math.Inf(1))), field: "seats", msg: "Infinity"},
		{name: "-Infinity", in: fakeObj("seats", fakeNum(math.Inf(-1))), field: "seats", msg: "-Infinity"},
		{name: "function", in: fakeObj("units", &fake{k: jsFunction}), field: "units", msg: "a function"},
		{name: "symbol at the top", in: &fake{k: jsSymbol}, field: "", msg: "a symbol"},
		{name: "throwing getter", in: fakeObj("units", &fake{k: jsArray, throw: boom}), field: "units", msg: "boom"},
		{name: "throwing object", in: &fake{k: jsObject, throw: boom}, field: "", msg: "boom"},
		{name: "too deep", in: deep, field: "units", msg: "nested too deeply"},
		{name: "too long", in: &fake{k: jsArray, n: MaxValues + 1}, msg: "more than the limit"},
		{name: "too many members", in: &fake{k: jsObject, keyList: make([]string, MaxValues+1)}, msg: "more than the limit"},
		{name: "too many values in all", in: fakeArr(&fake{k: jsArray, n: MaxValues / 2}, &fake{k: jsArray, n: MaxValues / 2}), field: "[1]", msg: "more than the limit"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			v, err := fromJS(tc.in)
			if tc.want != "" {
				if err != nil {
					t.Fatalf("fromJS: %v", err)
				}
				if got := string(jsondoc.Marshal(v)); got != tc.want {
					t.Errorf("fromJS = %s, want %s", got, tc.want)
				}
				return
			}
			var ie *input.Error
			if !errors.As(err, &ie) {
				t.Fatalf("fromJS error = %v (%T), want an *input.Error", err, err)
			}
			if ie.Field != tc.field || !strings.Contains(ie.Msg, tc.msg) {
				t.Errorf("fromJS error: field %q, message %q; want field %q and a message containing %q", ie.Field, ie.Msg, tc.field, tc.msg)
			}
		})
	}
}

// A scenario converted from JavaScript reads as the same scenario written
// as JSON text.
func TestFromJSReadsAsScenario(t *testing.T) {
	js := fakeObj("title", fakeStr("Quillfield school board (invented)"), "seats", fakeNum(7), "method", fakeStr("webster"),
		"threshold", fakeStr("5%"), "units", fakeArr(
			fakeObj("name", fakeStr("North"), "population", fakeNum(1204)),
			fakeObj("name", fakeStr("South"), "population", fakeStr("880.125"), "max", fakeNum(3)),
			fakeObj("name", fakeStr("East"), "population", fakeNum(77.5), "min", fakeNum(1)),
		))
	text := `{"title":"Quillfield school board (invented)","seats":7,"method":"webster","threshold":"5%",
	"units":[{"name":"North","population":1204},{"name":"South","population":"880.125","max":3},{"name":"East","population":77.5,"min":1}]}`
	v, err := fromJS(js)
	if err != nil {
		t.Fatal(err)
	}
	a, err := input.FromDoc("", v)
	if err != nil {
		t.Fatal(err)
	}
	w, err := jsondoc.Parse([]byte(text))
	if err != nil {
		t.Fatal(err)
	}
	b, err := input.FromDoc("", w)
	if err != nil {
		t.Fatal(err)
	}
	ga := string(jsondoc.Marshal(input.Encode(a.Title, &a.Scenario)))
	gb := string(jsondoc.Marshal(input.Encode(b.Title, &b.Scenario)))
	if ga != gb {
		t.Errorf("from JavaScript: %s\nfrom JSON text:  %s", ga, gb)
	}
}

func TestNumberText(t *testing.T) {
	for _, tc := range []struct {
		f    float64
		want string
		ok   bool
	}{
		{0, "0", true}, {math.Copysign(0, -1), "0", true}, {1, "1", true}, {-1, "-1", true},
		{123456789012, "123456789012", true}, {0.5, "0.5", true}, {1e21, "1000000000000000000000", true},
		{5e-324, "0." + strings.Repeat("0", 323) + "5", true},
		{math.MaxFloat64, "17976931348623157" + strings.Repeat("0", 292), true},
		{math.NaN(), "", false}, {math.Inf(1), "", false}, {math.Inf(-1), "", false},
	} {
		got, ok := numberText(tc.f)
		if got != tc.want || ok != tc.ok {
			t.Errorf("numberText(%v) = %q, %v; want %q, %v", tc.f, got, ok, tc.want, tc.ok)
		}
	}
}
