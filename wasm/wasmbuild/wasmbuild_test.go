package wasmbuild

import (
	"bytes"
	"os"
	"os/exec"
	"strings"
	"testing"
)

func TestBuild(t *testing.T) {
	dir := t.TempDir()
	wasm, execJS, err := Build(dir)
	if err != nil {
		t.Fatal(err)
	}
	data, err := os.ReadFile(wasm)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.HasPrefix(data, []byte("\x00asm")) {
		t.Errorf("%s is not a WebAssembly module", wasm)
	}
	js, err := os.ReadFile(execJS)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Contains(js, []byte("globalThis.Go")) {
		t.Errorf("%s does not look like wasm_exec.js", execJS)
	}
}

// The engine's module stays free of the reflection-heavy packages: its
// documents are jsondoc trees, not encoding/json values. (fmt and reflect
// come in through math/big, encoding/csv and safejs.)
func TestNoReflectionHeavyPackages(t *testing.T) {
	cmd := exec.Command("go", "list", "-deps", Package)
	cmd.Env = append(os.Environ(), "GOOS=js", "GOARCH=wasm")
	out, err := cmd.Output()
	if err != nil {
		t.Fatal(err)
	}
	forbidden := map[string]bool{
		"encoding/json": true, "encoding/xml": true, "encoding/gob": true, "encoding/asn1": true,
		"text/template": true, "html/template": true, "net/http": true, "net/rpc": true,
	}
	for _, p := range strings.Fields(string(out)) {
		if forbidden[p] || strings.Contains(p, "json-experiment") {
			t.Errorf("the WebAssembly engine depends on %s", p)
		}
	}
}
