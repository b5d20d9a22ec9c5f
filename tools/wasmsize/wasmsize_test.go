package main

import (
	"bytes"
	"strconv"
	"strings"
	"testing"

	"seatsmith/engine/jsondoc"
	"seatsmith/wasm/wasmbuild"
)

// uleb writes n as unsigned LEB128.
func uleb(n int) []byte {
	var b []byte
	for {
		c := byte(n & 0x7f)
		n >>= 7
		if n != 0 {
			b = append(b, c|0x80)
			continue
		}
		return append(b, c)
	}
}

func section(id byte, body []byte) []byte {
	return append(append([]byte{id}, uleb(len(body))...), body...)
}

func name(s string) []byte { return append(uleb(len(s)), s...) }

func TestReadModule(t *testing.T) {
	// One imported function, two bodies (3 and 200 bytes), a data section
	// and a name section naming the two defined functions.
	var imp []byte
	imp = append(imp, uleb(1)...)
	imp = append(imp, name("go")...)
	imp = append(imp, name("debug")...)
	imp = append(imp, 0, 0) // function, type 0
	var code []byte
	code = append(code, uleb(2)...)
	code = append(code, uleb(3)...)
	code = append(code, 0, 0, 0x0b)
	code = append(code, uleb(200)...)
	code = append(code, make([]byte, 200)...)
	var names []byte
	names = append(names, uleb(2)...)
	names = append(names, uleb(1)...)
	names = append(names, name("runtime.main")...)
	names = append(names, uleb(2)...)
	names = append(names, name("seatsmith_engine.Allot")...)
	custom := append(name("name"), section(1, names)...)
	mod := []byte("\x00asm\x01\x00\x00\x00")
	mod = append(mod, section(2, imp)...)
	mod = append(mod, section(10, code)...)
	mod = append(mod, section(11, make([]byte, 50))...)
	mod = append(mod, section(0, custom)...)

	m, err := readModule(mod)
	if err != nil {
		t.Fatal(err)
	}
	if len(m.funcs) != 2 || m.funcs[0] != (function{"runtime.main", 3}) || m.funcs[1] != (function{"seatsmith_engine.Allot", 200}) {
		t.Errorf("functions = %v", m.funcs)
	}
	if m.data != 50 {
		t.Errorf("data = %d, want 50", m.data)
	}
	for _, bad := range [][]byte{nil, []byte("\x00asm\x02\x00\x00\x00"), mod[:len(mod)-5], append([]byte("\x00asm\x01\x00\x00\x00\x0a"), 0xff, 0xff, 0xff, 0xff, 0xff, 0xff)} {
		if _, err := readModule(bad); err == nil {
			t.Errorf("readModule(%q) gave no error", bad)
		}
	}
}

func TestPackageOf(t *testing.T) {
	paths := map[string]string{}
	for _, p := range []string{"runtime", "math/big", "seatsmith/engine", "seatsmith/engine/format", "github.com/hack-pad/safejs", "github.com/hack-pad/safejs/internal/catch"} {
		paths[mangle.ReplaceAllString(p, "_")] = p
	}
	for _, tc := range []struct{ name, want string }{
		{"runtime.mallocgc", "runtime"},
		{"math_big.nat.divRecursiveStep", "math/big"},
		{"seatsmith_engine.__problem_.allot", "seatsmith/engine"},
		{"seatsmith_engine_format.unitDoc", "seatsmith/engine/format"},
		{"github.com_hack_pad_safejs.Value.Get", "github.com/hack-pad/safejs"},
		{"github.com_hack_pad_safejs_internal_catch.Try_go.shape.int_", "github.com/hack-pad/safejs/internal/catch"},
		{"type_.eq.main.x", "(type)"},
		{"", "(other)"},
	} {
		if got := packageOf(tc.name, paths); got != tc.want {
			t.Errorf("packageOf(%q) = %q, want %q", tc.name, got, tc.want)
		}
	}
}

// The command as people run it: it builds both modules and the baselines
// and reports.
func TestRun(t *testing.T) {
	var out, errs bytes.Buffer
	if code := run([]string{"-json", "-packages", "5", "-funcs", "3"}, &out, &errs); code != 0 {
		t.Fatalf("wasmsize -json exited %d: %s", code, errs.String())
	}
	v, err := jsondoc.Parse(out.Bytes())
	if err != nil {
		t.Fatalf("output is not JSON: %v\n%s", err, out.String())
	}
	num := func(path ...string) float64 {
		x := v
		for _, p := range path {
			x = x.Get(p)
		}
		if x == nil {
			t.Fatalf("no %s in %s", strings.Join(path, "."), out.String())
		}
		f, _ := strconv.ParseFloat(x.Text, 64)
		return f
	}
	e, m := num("calculator", "gzip"), num("minimal", "gzip")
	if e <= m || m <= 0 || num("calculator", "bytes") <= e {
		t.Errorf("implausible sizes: calculator gzip %v, minimal gzip %v", e, m)
	}
	if a := num("analysis", "gzip"); a <= e {
		t.Errorf("the analysis module (%v gzipped), a superset, is not larger than the calculator module (%v)", a, e)
	}
	if r := num("ratio"); r < e/m-0.01 || r > e/m+0.01 {
		t.Errorf("ratio %v, want %v", r, e/m)
	}
	if r := num("calculator", "ratio"); r != num("ratio") {
		t.Errorf("calculator.ratio %v, ratio %v", r, num("ratio"))
	}
	if f := num("floor", "gzip"); f <= m || f >= e {
		t.Errorf("floor gzip %v: want between the minimal program's %v and the calculator module's %v", f, m, e)
	}
	if i, f := num("interop", "gzip"), num("floor", "gzip"); i <= m || i >= f {
		t.Errorf("interop gzip %v: want between the minimal program's %v and the floor's %v", i, m, f)
	}
	if r, f := num("room_beside_floor"), num("floor", "gzip"); r < Target*m-f-1 || r > Target*m-f+1 {
		t.Errorf("room_beside_floor %v, want %v", r, Target*m-f)
	}
	if r, f := num("own_ratio"), num("floor", "gzip"); r < (e-f)/m-0.01 || r > (e-f)/m+0.01 {
		t.Errorf("own_ratio %v, want %v", r, (e-f)/m)
	}
	// safejs imports fmt: the table names it.
	fmtBy := v.Get("importers").Get("fmt")
	if fmtBy == nil || !strings.Contains(string(jsondoc.Marshal(fmtBy)), "github.com/hack-pad/safejs") {
		t.Errorf("importers of fmt: %s", jsondoc.Marshal(v.Get("importers")))
	}
	if n := len(v.Get("packages").Items); n != 5 {
		t.Errorf("%d packages listed, want 5", n)
	}
	if n := len(v.Get("functions").Items); n != 3 {
		t.Errorf("%d functions listed, want 3", n)
	}
	if code := run([]string{"extra"}, &out, &errs); code != 2 {
		t.Errorf("wasmsize extra exited %d, want 2", code)
	}
	if code := run([]string{"-module", "viewer"}, &out, &errs); code != 2 {
		t.Errorf("wasmsize -module viewer exited %d, want 2", code)
	}
}

func TestImporters(t *testing.T) {
	deps := []dep{
		{"errors", nil},
		{"fmt", []string{"errors"}},
		{"reflect", []string{"errors"}},
		{"lib", []string{"fmt", "reflect"}},
		{"main", []string{"lib", "fmt", "os"}}, // os is not built in
	}
	got := importers(deps, heavyPackages)
	if len(got) != 2 || strings.Join(got["fmt"], ",") != "lib,main" || strings.Join(got["reflect"], ",") != "lib" {
		t.Errorf("importers = %v", got)
	}
}

func TestNamedFlags(t *testing.T) {
	for _, f := range namedFlags() {
		if strings.HasPrefix(f, "-ldflags=") && strings.Contains(" "+f+" ", " -s ") {
			t.Errorf("the named build strips names: %q", f)
		}
	}
	if len(namedFlags()) != len(wasmbuild.Flags) {
		t.Errorf("named flags %q against release flags %q", namedFlags(), wasmbuild.Flags)
	}
}
