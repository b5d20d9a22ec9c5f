package wasmbuild

import (
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

func TestBuild(t *testing.T) {
	dir := t.TempDir()
	wasm, execJS, err := Build(dir)
	if err != nil {
		t.Fatal(err)
	}
	if filepath.Base(wasm) != Calculator.File {
		t.Errorf("Build returned %s, not the calculator module", wasm)
	}
	for _, m := range Modules() {
		data, err := os.ReadFile(filepath.Join(dir, m.File))
		if err != nil {
			t.Fatal(err)
		}
		if !bytes.HasPrefix(data, []byte("\x00asm")) {
			t.Errorf("%s is not a WebAssembly module", m.File)
		}
	}
	js, err := os.ReadFile(execJS)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Contains(js, []byte("globalThis.Go")) {
		t.Errorf("%s does not look like wasm_exec.js", execJS)
	}
}

func deps(t *testing.T, pkg string) []string {
	t.Helper()
	cmd := exec.Command("go", "list", "-deps", pkg)
	cmd.Env = append(os.Environ(), "GOOS=js", "GOARCH=wasm")
	out, err := cmd.Output()
	if err != nil {
		t.Fatal(err)
	}
	return strings.Fields(string(out))
}

// The modules stay free of the reflection-heavy packages: their documents
// are jsondoc trees, not encoding/json values. (fmt and reflect come in
// through math/big and safejs.)
func TestNoReflectionHeavyPackages(t *testing.T) {
	forbidden := map[string]bool{
		"encoding/json": true, "encoding/xml": true, "encoding/gob": true, "encoding/asn1": true, "encoding/csv": true,
		"text/template": true, "html/template": true, "net/http": true, "net/rpc": true,
	}
	for _, m := range Modules() {
		for _, p := range deps(t, m.Package) {
			if forbidden[p] || strings.Contains(p, "json-experiment") {
				t.Errorf("the %s module depends on %s", m.Name, p)
			}
		}
	}
}

// The calculator module leaves the analysis code to the analysis module.
// (engine/report imports the analysis packages for the documents it
// builds; the linker leaves out their code the calculator never calls, as
// go run ./tools/wasmsize -packages shows.)
func TestCalculatorModuleIsLight(t *testing.T) {
	for _, p := range deps(t, Calculator.Package) {
		switch p {
		case "seatsmith/site/projection", "seatsmith/wasm/analysisapi":
			t.Errorf("the calculator module depends on %s", p)
		}
	}
}
