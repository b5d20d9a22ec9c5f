//go:build !js

package nodetest

import (
	"os"
	"os/exec"
	"path/filepath"
	"sync"
	"testing"

	"seatsmith/wasm/wasmbuild"
)

// built holds the modules, built once for every test of the package.
var built struct {
	once sync.Once
	dir  string
	err  error
}

// modules builds both modules and wasm_exec.js once and returns the
// folder holding them, and the path of node.
func modules(t testing.TB) (dir, node string) {
	t.Helper()
	node, err := exec.LookPath("node")
	if err != nil {
		t.Fatal("these tests run the engine under Node; install node (the CI script does): ", err)
	}
	built.once.Do(func() {
		built.dir, built.err = os.MkdirTemp("", "nodetest-")
		if built.err == nil {
			_, _, built.err = wasmbuild.Build(built.dir)
		}
	})
	if built.err != nil {
		t.Fatal(built.err)
	}
	return built.dir, node
}

// TestMain removes the modules once every test has run.
func TestMain(m *testing.M) {
	code := m.Run()
	if built.dir != "" {
		os.RemoveAll(built.dir)
	}
	os.Exit(code)
}

// execJS is the path of wasm_exec.js beside the modules.
func execJS(dir string) string { return filepath.Join(dir, wasmbuild.ExecJSFile) }
