// Command wasmsize reports the download size of seatsmith's WebAssembly
// engine against the smallest useful js/wasm program built by the same
// toolchain with the same flags (GOOS=js GOARCH=wasm, -trimpath,
// -ldflags="-s -w"): one that sets a single global function and blocks.
// Both are compressed with gzip at its best compression, as a server or an
// inlined page would send them, and the ratio of the compressed sizes is
// the figure to watch (the target is at most 1.5).
//
// Two more baselines split what the engine is built on from what seatsmith
// adds. The interop program is the minimal program reaching the page
// through hack-pad/safejs (package seatsmith/tools/wasmsize/interop); the
// floor also uses math/big for exact arithmetic (package
// seatsmith/tools/wasmsize/floor). The interop program over the minimal
// one is what safejs costs by itself, and the target's room beside it is
// all that is left for math/big and seatsmith's code; the floor over the
// minimal program is what both libraries cost before any of seatsmith's
// own code; the engine over the floor is what seatsmith's own code costs.
//
// Usage:
//
//	go run ./tools/wasmsize [-json] [-packages N] [-funcs N] [-check]
//
// -packages N also lists the N Go packages with the most code in the
// engine, from the function names of a build that keeps them (the code is
// the same; only the name section differs), beside the same packages'
// code in the minimal program; -funcs N lists the N largest functions.
// (go tool nm does not read WebAssembly binaries, so wasmsize reads the
// code and name sections itself.) -check exits with status 1 when the ratio
// is above the target. It must run inside the seatsmith module.
package main

import (
	"bytes"
	"compress/gzip"
	"flag"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"sort"
	"strconv"
	"strings"

	"seatsmith/engine/jsondoc"
	"seatsmith/wasm/wasmbuild"
)

// Target is the largest acceptable ratio of the engine's gzipped size to
// the minimal program's.
const Target = 1.5

// minimalProgram is the baseline: one global function, then block.
const minimalProgram = `package main

import "syscall/js"

func main() {
	js.Global().Set("ping", js.FuncOf(func(this js.Value, args []js.Value) any { return "pong" }))
	select {}
}
`

// A build is one measured module.
type build struct {
	Name  string
	Path  string
	Bytes int
	Gzip  int
	Code  int // bytes of the code section
	Data  int // bytes of the data section
	// Packages maps a package path to the bytes of its function bodies,
	// and Funcs lists the functions, largest first (filled with -packages).
	Packages map[string]int
	Funcs    []function
}

func main() {
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}

func run(args []string, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("wasmsize", flag.ContinueOnError)
	fs.SetOutput(stderr)
	asJSON := fs.Bool("json", false, "print one JSON object instead of a table")
	top := fs.Int("packages", 0, "also list the `N` packages with the most code in the engine")
	funcs := fs.Int("funcs", 0, "also list the `N` largest functions in the engine")
	check := fs.Bool("check", false, "exit with status 1 when the gzipped ratio is above the target")
	if err := fs.Parse(args); err != nil {
		return 2
	}
	if fs.NArg() != 0 {
		io.WriteString(stderr, "wasmsize: no arguments expected\n")
		return 2
	}
	bs, err := measure(*top > 0 || *funcs > 0)
	if err != nil {
		io.WriteString(stderr, "wasmsize: "+err.Error()+"\n")
		return 1
	}
	ratio := float64(bs.engine.Gzip) / float64(bs.minimal.Gzip)
	if *asJSON {
		stdout.Write(jsondoc.MarshalIndent(report(bs, ratio, *top, *funcs), "  "))
	} else {
		writeTable(stdout, bs, ratio, *top, *funcs)
	}
	if *check && ratio > Target {
		return 1
	}
	return 0
}

// The import paths of the baselines built from the module's own packages.
const (
	interopPackage = "seatsmith/tools/wasmsize/interop"
	floorPackage   = "seatsmith/tools/wasmsize/floor"
)

// builds are the modules wasmsize measures: the engine and its baselines.
type builds struct {
	engine, minimal *build
	interop         *build // the minimal program with safejs
	floor           *build // ... and with math/big
}

// measure builds and measures the engine and the baselines; with names it
// also attributes the engine's and the minimal program's code to packages.
func measure(names bool) (*builds, error) {
	dir, err := os.MkdirTemp("", "wasmsize-")
	if err != nil {
		return nil, err
	}
	defer os.RemoveAll(dir)
	wasm, _, err := wasmbuild.Build(filepath.Join(dir, "engine"))
	if err != nil {
		return nil, err
	}
	src := filepath.Join(dir, "minimal")
	if err := os.MkdirAll(src, 0o755); err != nil {
		return nil, err
	}
	if err := os.WriteFile(filepath.Join(src, "main.go"), []byte(minimalProgram), 0o644); err != nil {
		return nil, err
	}
	if err := os.WriteFile(filepath.Join(src, "go.mod"), []byte("module minimal\n\ngo 1.21\n"), 0o644); err != nil {
		return nil, err
	}
	minWasm := filepath.Join(dir, "minimal.wasm")
	if err := wasmbuild.Compile(src, ".", minWasm); err != nil {
		return nil, err
	}
	bs := &builds{}
	for _, x := range []struct {
		dst       **build
		name, pkg string
	}{{&bs.interop, "interop", interopPackage}, {&bs.floor, "floor", floorPackage}} {
		out := filepath.Join(dir, x.name+".wasm")
		if err := wasmbuild.Compile("", x.pkg, out); err != nil {
			return nil, err
		}
		if *x.dst, err = measureFile(x.name, out); err != nil {
			return nil, err
		}
	}
	if bs.engine, err = measureFile("engine", wasm); err != nil {
		return nil, err
	}
	if bs.minimal, err = measureFile("minimal", minWasm); err != nil {
		return nil, err
	}
	if names {
		if err := attribute(bs.engine, "", wasmbuild.Package, filepath.Join(dir, "engine-named.wasm")); err != nil {
			return nil, err
		}
		if err := attribute(bs.minimal, src, ".", filepath.Join(dir, "minimal-named.wasm")); err != nil {
			return nil, err
		}
	}
	return bs, nil
}

func measureFile(name, path string) (*build, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	m, err := readModule(data)
	if err != nil {
		return nil, err
	}
	gz, err := gzipSize(data)
	if err != nil {
		return nil, err
	}
	return &build{Name: name, Path: path, Bytes: len(data), Gzip: gz, Code: m.sections["code"], Data: m.data}, nil
}

// gzipSize is the size of data compressed by gzip at best compression.
func gzipSize(data []byte) (int, error) {
	var buf bytes.Buffer
	w, err := gzip.NewWriterLevel(&buf, gzip.BestCompression)
	if err != nil {
		return 0, err
	}
	if _, err := w.Write(data); err != nil {
		return 0, err
	}
	if err := w.Close(); err != nil {
		return 0, err
	}
	return buf.Len(), nil
}

// attribute builds pkg again keeping function names (-ldflags=-w, no -s)
// and adds up the code of each package into b.Packages.
func attribute(b *build, dir, pkg, out string) error {
	args := []string{"build", "-trimpath", "-ldflags=-w", "-o", out, pkg}
	cmd := exec.Command("go", args...)
	cmd.Dir = dir
	cmd.Env = append(os.Environ(), "GOOS=js", "GOARCH=wasm", "CGO_ENABLED=0")
	if msg, err := cmd.CombinedOutput(); err != nil {
		return &buildError{pkg, err, msg}
	}
	data, err := os.ReadFile(out)
	if err != nil {
		return err
	}
	m, err := readModule(data)
	if err != nil {
		return err
	}
	paths, err := packagePaths(dir, pkg)
	if err != nil {
		return err
	}
	b.Packages = map[string]int{}
	for _, f := range m.funcs {
		b.Packages[packageOf(f.name, paths)] += f.size
	}
	b.Funcs = append([]function(nil), m.funcs...)
	sort.SliceStable(b.Funcs, func(i, j int) bool { return b.Funcs[i].size > b.Funcs[j].size })
	return nil
}

type buildError struct {
	pkg string
	err error
	msg []byte
}

func (e *buildError) Error() string {
	return "building " + e.pkg + " with names: " + e.err.Error() + "\n" + strings.TrimSpace(string(e.msg))
}

// The linker writes function names with every character other than
// letters, digits, '_' and '.' replaced by '_' (cmd/link's wasm writer).
var mangle = regexp.MustCompile(`[^\w.]`)

// packagePaths returns the packages pkg is built from, keyed by their
// mangled path.
func packagePaths(dir, pkg string) (map[string]string, error) {
	cmd := exec.Command("go", "list", "-deps", pkg)
	cmd.Dir = dir
	cmd.Env = append(os.Environ(), "GOOS=js", "GOARCH=wasm")
	out, err := cmd.Output()
	if err != nil {
		return nil, &buildError{pkg, err, nil}
	}
	paths := map[string]string{}
	list := strings.Fields(string(out))
	for _, p := range list {
		paths[mangle.ReplaceAllString(p, "_")] = p
	}
	if len(list) > 0 {
		paths["main"] = list[len(list)-1] // the program's own package comes last
	}
	return paths, nil
}

// packageOf returns the package of a mangled function name: the longest
// known package path that, followed by '.', begins the name. Functions of
// no package (type equality and hash functions, wrappers) are grouped by
// their prefix.
func packageOf(name string, paths map[string]string) string {
	best := ""
	for i := 0; i < len(name); i++ {
		if name[i] != '.' {
			continue
		}
		if p, ok := paths[name[:i]]; ok && len(p) > len(best) {
			best = p
		}
	}
	if best != "" {
		return best
	}
	if i := strings.IndexAny(name, "._"); i > 0 {
		return "(" + name[:i] + ")"
	}
	return "(other)"
}

type pkgSize struct {
	path             string
	engine, baseline int
}

func topPackages(engine, minimal *build, n int) []pkgSize {
	var ps []pkgSize
	for p, size := range engine.Packages {
		ps = append(ps, pkgSize{p, size, minimal.Packages[p]})
	}
	sort.Slice(ps, func(i, j int) bool {
		if ps[i].engine != ps[j].engine {
			return ps[i].engine > ps[j].engine
		}
		return ps[i].path < ps[j].path
	})
	if len(ps) > n {
		ps = ps[:n]
	}
	return ps
}

func writeTable(w io.Writer, bs *builds, ratio float64, top, funcs int) {
	engine, minimal := bs.engine, bs.minimal
	var b strings.Builder
	row := func(cells ...string) {
		b.WriteString(pad(cells[0], 16, false))
		for _, c := range cells[1:] {
			b.WriteString(pad(c, 12, true))
		}
		b.WriteString("\n")
	}
	row("", "bytes", "gzip -9", "code", "data")
	for _, x := range []*build{engine, minimal, bs.interop, bs.floor} {
		row(x.Name, itoa(x.Bytes), itoa(x.Gzip), itoa(x.Code), itoa(x.Data))
	}
	row("ratio", ftoa(float64(engine.Bytes)/float64(minimal.Bytes)), ftoa(ratio),
		ftoa(float64(engine.Code)/float64(minimal.Code)), ftoa(float64(engine.Data)/float64(minimal.Data)))
	verdict := "within"
	if ratio > Target {
		verdict = "ABOVE"
	}
	over := func(x *build) string { return ftoa(float64(x.Gzip) / float64(minimal.Gzip)) }
	b.WriteString("\ngzipped engine / gzipped minimal = " + ftoa(ratio) + ": " + verdict + " the target of " + ftoa(Target) + "\n")
	b.WriteString("gzipped interop / gzipped minimal = " + over(bs.interop) + " (safejs alone); the target leaves " +
		itoa(room(bs)) + " bytes gzipped beside it for math/big and seatsmith's code\n")
	b.WriteString("gzipped floor / gzipped minimal = " + over(bs.floor) + " (safejs and math/big alone)\n")
	b.WriteString("(engine - floor) / minimal, gzipped = " + ftoa(float64(engine.Gzip-bs.floor.Gzip)/float64(minimal.Gzip)) + " (seatsmith's own code)\n")
	if top > 0 {
		b.WriteString("\ncode by package (function bodies, bytes)\n")
		b.WriteString(pad("package", 44, false) + pad("engine", 10, true) + pad("minimal", 10, true) + pad("added", 10, true) + "\n")
		for _, p := range topPackages(engine, minimal, top) {
			b.WriteString(pad(p.path, 44, false) + pad(itoa(p.engine), 10, true) + pad(itoa(p.baseline), 10, true) + pad(itoa(p.engine-p.baseline), 10, true) + "\n")
		}
	}
	if funcs > 0 {
		b.WriteString("\nlargest functions in the engine (names as the linker writes them, bytes)\n")
		for _, f := range engine.Funcs[:min(funcs, len(engine.Funcs))] {
			b.WriteString(pad(itoa(f.size), 10, true) + "  " + f.name + "\n")
		}
	}
	io.WriteString(w, b.String())
}

// room is what the target leaves, in gzipped bytes, beside safejs: the
// target's size less the interop baseline's.
func room(bs *builds) int { return int(Target*float64(bs.minimal.Gzip)) - bs.interop.Gzip }

func report(bs *builds, ratio float64, top, funcs int) *jsondoc.Value {
	engine, minimal, floor := bs.engine, bs.minimal, bs.floor
	one := func(x *build) *jsondoc.Value {
		return jsondoc.NewObject().Set("bytes", jsondoc.Int(x.Bytes)).Set("gzip", jsondoc.Int(x.Gzip)).
			Set("code", jsondoc.Int(x.Code)).Set("data", jsondoc.Int(x.Data))
	}
	v := jsondoc.NewObject().Set("engine", one(engine)).Set("minimal", one(minimal)).Set("interop", one(bs.interop)).Set("floor", one(floor))
	v.Set("interop_ratio", jsondoc.Num(ftoa(float64(bs.interop.Gzip)/float64(minimal.Gzip))))
	v.Set("room_beside_interop", jsondoc.Int(room(bs)))
	v.Set("floor_ratio", jsondoc.Num(ftoa(float64(floor.Gzip)/float64(minimal.Gzip))))
	v.Set("own_ratio", jsondoc.Num(ftoa(float64(engine.Gzip-floor.Gzip)/float64(minimal.Gzip))))
	v.Set("ratio", jsondoc.Num(ftoa(ratio))).Set("raw_ratio", jsondoc.Num(ftoa(float64(engine.Bytes)/float64(minimal.Bytes))))
	v.Set("target", jsondoc.Num(ftoa(Target))).Set("within_target", jsondoc.Boolean(ratio <= Target))
	if top > 0 {
		arr := jsondoc.NewArray()
		for _, p := range topPackages(engine, minimal, top) {
			arr.Append(jsondoc.NewObject().Set("package", jsondoc.Str(p.path)).Set("engine", jsondoc.Int(p.engine)).
				Set("minimal", jsondoc.Int(p.baseline)))
		}
		v.Set("packages", arr)
	}
	if funcs > 0 {
		arr := jsondoc.NewArray()
		for _, f := range engine.Funcs[:min(funcs, len(engine.Funcs))] {
			arr.Append(jsondoc.NewObject().Set("name", jsondoc.Str(f.name)).Set("bytes", jsondoc.Int(f.size)))
		}
		v.Set("functions", arr)
	}
	return v
}

func itoa(n int) string { return strconv.Itoa(n) }

func ftoa(f float64) string { return strconv.FormatFloat(f, 'f', 2, 64) }

func pad(s string, n int, right bool) string {
	if len(s) >= n {
		return s + " "
	}
	if right {
		return strings.Repeat(" ", n-len(s)) + s
	}
	return s + strings.Repeat(" ", n-len(s))
}
