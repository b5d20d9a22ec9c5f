// Package wasmbuild builds seatsmith's WebAssembly modules for tools and
// tests: the site build, the size report and the tests under Node.
//
// There are two modules (see [Modules]): the calculator module, which
// every page with a calculator loads, and the analysis module, a superset
// with sweeps, paradoxes and projections, which only the blocks that need
// them load.
//
// Every build uses the release flags ([Flags]): GOOS=js GOARCH=wasm,
// -trimpath and -ldflags="-s -w". The go command on PATH does the work, so
// the calling process must run inside the seatsmith module (as go run and
// go test do).
package wasmbuild

import (
	"bytes"
	"errors"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
)

// A Module is one of seatsmith's WebAssembly modules.
type Module struct {
	Name    string // "calculator" or "analysis"
	Package string // the import path of its main package
	File    string // the file Build writes it to
}

// The modules.
var (
	Calculator = Module{Name: "calculator", Package: "seatsmith/wasm", File: "seatsmith.wasm"}
	Analysis   = Module{Name: "analysis", Package: "seatsmith/wasm/analysis", File: "seatsmith-analysis.wasm"}
)

// Modules lists the modules, the calculator module first.
func Modules() []Module { return []Module{Calculator, Analysis} }

// File names of what Build writes beside the modules.
const (
	// WasmFile is the calculator module's file.
	WasmFile   = "seatsmith.wasm"
	ExecJSFile = "wasm_exec.js"
)

// Package is the import path of the calculator module's main package.
const Package = "seatsmith/wasm"

// Flags are the go build flags of every build, after "go build".
var Flags = []string{"-trimpath", "-ldflags=-s -w"}

// Build compiles both modules into outDir (seatsmith.wasm and
// seatsmith-analysis.wasm) and copies the toolchain's wasm_exec.js (the
// JavaScript half of the Go runtime, which a page or worker loads first)
// beside them. It returns the calculator module's path. outDir is created
// if need be.
func Build(outDir string) (wasmPath, execJSPath string, err error) {
	if err := os.MkdirAll(outDir, 0o755); err != nil {
		return "", "", err
	}
	for _, m := range Modules() {
		if err := Compile("", m.Package, filepath.Join(outDir, m.File)); err != nil {
			return "", "", err
		}
	}
	wasmPath = filepath.Join(outDir, Calculator.File)
	src, err := ExecJS()
	if err != nil {
		return "", "", err
	}
	data, err := os.ReadFile(src)
	if err != nil {
		return "", "", err
	}
	execJSPath = filepath.Join(outDir, ExecJSFile)
	if err := os.WriteFile(execJSPath, data, 0o644); err != nil {
		return "", "", err
	}
	return wasmPath, execJSPath, nil
}

// Compile builds the main package pkg (an import path, or a directory such
// as ".") for js/wasm with the release flags and writes the module to out.
// dir is the go command's working directory; "" means the current one.
func Compile(dir, pkg, out string) error {
	return CompileWith(dir, pkg, out, Flags)
}

// CompileWith is Compile with other go build flags than the release
// flags: for measurements that compare builds.
func CompileWith(dir, pkg, out string, flags []string) error {
	out, err := filepath.Abs(out)
	if err != nil {
		return err
	}
	args := append([]string{"build"}, flags...)
	args = append(args, "-o", out, pkg)
	cmd := exec.Command("go", args...)
	cmd.Dir = dir
	cmd.Env = append(os.Environ(), "GOOS=js", "GOARCH=wasm", "CGO_ENABLED=0")
	var msg bytes.Buffer
	cmd.Stdout, cmd.Stderr = &msg, &msg
	if err := cmd.Run(); err != nil {
		return errors.New("building " + pkg + " for js/wasm: " + err.Error() + "\n" + strings.TrimSpace(msg.String()))
	}
	return nil
}

// GOROOT returns the root of the go command's toolchain.
func GOROOT() (string, error) {
	out, err := exec.Command("go", "env", "GOROOT").Output()
	if err != nil {
		return "", errors.New("go env GOROOT: " + err.Error())
	}
	root := strings.TrimSpace(string(out))
	if root == "" {
		return "", errors.New("go env GOROOT printed nothing")
	}
	return root, nil
}

// ExecJS returns the path of the toolchain's wasm_exec.js.
func ExecJS() (string, error) {
	root, err := GOROOT()
	if err != nil {
		return "", err
	}
	p := filepath.Join(root, "lib", "wasm", "wasm_exec.js")
	if _, err := os.Stat(p); err != nil {
		return "", errors.New("the Go toolchain has no wasm_exec.js: " + err.Error())
	}
	return p, nil
}
