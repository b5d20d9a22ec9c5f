// Command wasmsize reports the download size of seatsmith's WebAssembly
// modules, the calculator module (seatsmith.wasm, which every page with a
// calculator loads) and the analysis module (seatsmith-analysis.wasm),
// against the smallest useful js/wasm program built by the same toolchain
// with the same flags (wasmbuild.Flags): one that sets a single global
// function with syscall/js and blocks. Each is compressed with gzip at its
// best compression, as a server or an inlined page would send it, and the
// ratio of the compressed sizes is the figure to watch: the calculator
// module's target is at most 1.8.
//
// Two more baselines split what the engine is built on from what seatsmith
// adds. The interop program is the minimal program reaching the page
// through hack-pad/safejs (package seatsmith/tools/wasmsize/interop); the
// floor also uses math/big for exact arithmetic (package
// seatsmith/tools/wasmsize/floor). The interop program over the minimal
// one is what safejs costs by itself (with fmt, reflect and os, which it
// imports); the floor over the minimal program is what both libraries cost
// before any of seatsmith's own code (math/big imports fmt as well); a
// module over the floor is what seatsmith's own code costs.
//
// Usage:
//
//	go run ./tools/wasmsize [-module calculator|analysis] [-packages N] [-funcs N] [-json] [-check]
//
// -packages N also lists the N Go packages with the most code in the
// module named by -module (the calculator module unless told), sorted, from
// the function names of a build that keeps them (the same flags without
// -s: the code is the same, only the name section differs), beside the
// same packages' code in the minimal program, and says which of the
// module's packages import the reflection-heavy ones (fmt, reflect,
// encoding/json, encoding/csv, text/template, html/template) and os;
// -funcs N lists the N largest functions. (go tool nm does not read
// WebAssembly binaries, so wasmsize reads the code and name sections
// itself.) -check exits with status 1 when the calculator module's ratio
// is above the target. It must run inside the seatsmith module.
package main

import (
	"bytes"
	"compress/gzip"
	"flag"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"seatsmith/engine/jsondoc"
	"seatsmith/wasm/wasmbuild"
)

// Target is the largest acceptable ratio of the calculator module's
// gzipped size to the minimal program's.
const Target = 1.8

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
	// Importers maps each heavy package the module links to the module's
	// packages that import it (filled with -packages).
	Importers map[string][]string
}

func main() {
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}

func run(args []string, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("wasmsize", flag.ContinueOnError)
	fs.SetOutput(stderr)
	asJSON := fs.Bool("json", false, "print one JSON object instead of a table")
	module := fs.String("module", wasmbuild.Calculator.Name, "the module whose packages and functions -packages and -funcs list: calculator or analysis")
	top := fs.Int("packages", 0, "also list the `N` packages with the most code in the module")
	funcs := fs.Int("funcs", 0, "also list the `N` largest functions in the module")
	check := fs.Bool("check", false, "exit with status 1 when the calculator module's gzipped ratio is above the target")
	if err := fs.Parse(args); err != nil {
		return 2
	}
	if fs.NArg() != 0 {
		io.WriteString(stderr, "wasmsize: no arguments expected\n")
		return 2
	}
	var mod wasmbuild.Module
	for _, m := range wasmbuild.Modules() {
		if m.Name == *module {
			mod = m
		}
	}
	if mod.Name == "" {
		io.WriteString(stderr, "wasmsize: -module: "+strconv.Quote(*module)+" is not a module (calculator or analysis)\n")
		return 2
	}
	bs, err := measure(mod, *top > 0 || *funcs > 0)
	if err != nil {
		io.WriteString(stderr, "wasmsize: "+err.Error()+"\n")
		return 1
	}
	if *asJSON {
		stdout.Write(jsondoc.MarshalIndent(report(bs, *top, *funcs), "  "))
	} else {
		writeTable(stdout, bs, *top, *funcs)
	}
	if *check && bs.ratio(bs.calculator) > Target {
		return 1
	}
	return 0
}

// The import paths of the baselines built from the module's own packages.
const (
	interopPackage = "seatsmith/tools/wasmsize/interop"
	floorPackage   = "seatsmith/tools/wasmsize/floor"
)

// builds are the modules wasmsize measures and their baselines.
type builds struct {
	calculator, analysis *build
	minimal              *build
	interop              *build // the minimal program with safejs
	floor                *build // ... and with math/big
	// listed is the module -packages and -funcs describe.
	listed *build
}

// ratio is x's gzipped size over the minimal program's.
func (bs *builds) ratio(x *build) float64 { return float64(x.Gzip) / float64(bs.minimal.Gzip) }

// measure builds and measures the modules and the baselines; with names it
// also attributes the code of the module listed and of the minimal program
// to packages.
func measure(listed wasmbuild.Module, names bool) (*builds, error) {
	dir, err := os.MkdirTemp("", "wasmsize-")
	if err != nil {
		return nil, err
	}
	defer os.RemoveAll(dir)
	if _, _, err := wasmbuild.Build(filepath.Join(dir, "engine")); err != nil {
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
	if bs.calculator, err = measureFile(wasmbuild.Calculator.Name, filepath.Join(dir, "engine", wasmbuild.Calculator.File)); err != nil {
		return nil, err
	}
	if bs.analysis, err = measureFile(wasmbuild.Analysis.Name, filepath.Join(dir, "engine", wasmbuild.Analysis.File)); err != nil {
		return nil, err
	}
	if bs.minimal, err = measureFile("minimal", minWasm); err != nil {
		return nil, err
	}
	bs.listed = bs.calculator
	if listed.Name == wasmbuild.Analysis.Name {
		bs.listed = bs.analysis
	}
	if names {
		if err := attribute(bs.listed, "", listed.Package, filepath.Join(dir, "named.wasm")); err != nil {
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

func writeTable(w io.Writer, bs *builds, top, funcs int) {
	var b strings.Builder
	row := func(cells ...string) {
		b.WriteString(pad(cells[0], 12, false))
		for _, c := range cells[1:] {
			b.WriteString(pad(c, 12, true))
		}
		b.WriteString("\n")
	}
	row("", "bytes", "gzip -9", "÷ minimal", "code", "data")
	for _, x := range []*build{bs.calculator, bs.analysis, bs.minimal, bs.interop, bs.floor} {
		row(x.Name, itoa(x.Bytes), itoa(x.Gzip), ftoa(bs.ratio(x)), itoa(x.Code), itoa(x.Data))
	}
	ratio := bs.ratio(bs.calculator)
	verdict := "within"
	if ratio > Target {
		verdict = "ABOVE"
	}
	b.WriteString("\ngzipped calculator / gzipped minimal = " + ftoa(ratio) + ": " + verdict + " the target of " + ftoa(Target) + "\n")
	b.WriteString("gzipped analysis / gzipped minimal = " + ftoa(bs.ratio(bs.analysis)) + "\n")
	b.WriteString("gzipped interop / gzipped minimal = " + ftoa(bs.ratio(bs.interop)) + " (safejs alone, with the fmt, reflect and os it imports)\n")
	b.WriteString("gzipped floor / gzipped minimal = " + ftoa(bs.ratio(bs.floor)) + " (safejs and math/big alone); the target leaves " +
		itoa(room(bs)) + " bytes gzipped beside the floor for seatsmith's own code\n")
	b.WriteString("(calculator - floor) / minimal, gzipped = " + ftoa(float64(bs.calculator.Gzip-bs.floor.Gzip)/float64(bs.minimal.Gzip)) + " (seatsmith's own code)\n")
	if top > 0 {
		b.WriteString("\ncode by package in the " + bs.listed.Name + " module (function bodies, bytes)\n")
		b.WriteString(pad("package", 44, false) + pad(bs.listed.Name, 12, true) + pad("minimal", 10, true) + pad("added", 10, true) + "\n")
		for _, p := range topPackages(bs.listed, bs.minimal, top) {
			b.WriteString(pad(p.path, 44, false) + pad(itoa(p.module), 12, true) + pad(itoa(p.baseline), 10, true) + pad(itoa(p.module-p.baseline), 10, true) + "\n")
		}
		b.WriteString("\nheavy packages in the " + bs.listed.Name + " module and the packages that import them\n")
		for _, h := range heavyPackages {
			if imp, ok := bs.listed.Importers[h]; ok {
				b.WriteString(pad(h, 16, false) + itoa(bs.listed.Packages[h]) + " bytes; imported by " + strings.Join(imp, ", ") + "\n")
			}
		}
	}
	if funcs > 0 {
		b.WriteString("\nlargest functions in the " + bs.listed.Name + " module (names as the linker writes them, bytes)\n")
		for _, f := range bs.listed.Funcs[:min(funcs, len(bs.listed.Funcs))] {
			b.WriteString(pad(itoa(f.size), 10, true) + "  " + f.name + "\n")
		}
	}
	io.WriteString(w, b.String())
}

// room is what the target leaves, in gzipped bytes, beside the floor: the
// target's size less the floor's.
func room(bs *builds) int { return int(Target*float64(bs.minimal.Gzip)) - bs.floor.Gzip }

func report(bs *builds, top, funcs int) *jsondoc.Value {
	one := func(x *build) *jsondoc.Value {
		return jsondoc.NewObject().Set("bytes", jsondoc.Int(x.Bytes)).Set("gzip", jsondoc.Int(x.Gzip)).
			Set("ratio", jsondoc.Num(ftoa(bs.ratio(x)))).
			Set("code", jsondoc.Int(x.Code)).Set("data", jsondoc.Int(x.Data))
	}
	v := jsondoc.NewObject()
	for _, x := range []*build{bs.calculator, bs.analysis, bs.minimal, bs.interop, bs.floor} {
		v.Set(x.Name, one(x))
	}
	ratio := bs.ratio(bs.calculator)
	v.Set("room_beside_floor", jsondoc.Int(room(bs)))
	v.Set("own_ratio", jsondoc.Num(ftoa(float64(bs.calculator.Gzip-bs.floor.Gzip)/float64(bs.minimal.Gzip))))
	v.Set("ratio", jsondoc.Num(ftoa(ratio)))
	v.Set("target", jsondoc.Num(ftoa(Target))).Set("within_target", jsondoc.Boolean(ratio <= Target))
	if top > 0 || funcs > 0 {
		v.Set("listed", jsondoc.Str(bs.listed.Name))
	}
	if top > 0 {
		arr := jsondoc.NewArray()
		for _, p := range topPackages(bs.listed, bs.minimal, top) {
			arr.Append(jsondoc.NewObject().Set("package", jsondoc.Str(p.path)).Set("module", jsondoc.Int(p.module)).
				Set("minimal", jsondoc.Int(p.baseline)))
		}
		v.Set("packages", arr)
		imp := jsondoc.NewObject()
		for _, h := range heavyPackages {
			if by, ok := bs.listed.Importers[h]; ok {
				list := jsondoc.NewArray()
				for _, p := range by {
					list.Append(jsondoc.Str(p))
				}
				imp.Set(h, list)
			}
		}
		v.Set("importers", imp)
	}
	if funcs > 0 {
		arr := jsondoc.NewArray()
		for _, f := range bs.listed.Funcs[:min(funcs, len(bs.listed.Funcs))] {
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
