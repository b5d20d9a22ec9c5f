package main

import (
	"fmt"
	"os"
	"path/filepath"

	"seatsmith/wasm/wasmbuild"
)

// Engines are the WebAssembly modules a site carries: the calculator
// module every page with a calculator loads, and the analysis module
// (a superset) that only pages with variation or projection blocks load.
type Engines struct {
	Calculator, Analysis []byte
}

// buildEngines compiles both modules with the release flags and returns
// their bytes. When prebuilt is not empty it names a folder holding them
// already, as wasmbuild.Build writes them (seatsmith.wasm and
// seatsmith-analysis.wasm).
func buildEngines(prebuilt string) (*Engines, error) {
	dir := prebuilt
	if dir == "" {
		tmp, err := os.MkdirTemp("", "sitebuild-engine-")
		if err != nil {
			return nil, err
		}
		defer os.RemoveAll(tmp)
		dir = filepath.Join(tmp, "engine")
		if _, _, err := wasmbuild.Build(dir); err != nil {
			return nil, fmt.Errorf("building the WebAssembly modules: %v", err)
		}
	}
	var e Engines
	for _, m := range []struct {
		dst  *[]byte
		file string
	}{{&e.Calculator, wasmbuild.Calculator.File}, {&e.Analysis, wasmbuild.Analysis.File}} {
		data, err := os.ReadFile(filepath.Join(dir, m.file))
		if err != nil {
			if prebuilt != "" {
				return nil, fmt.Errorf("-wasm: %v", err)
			}
			return nil, err
		}
		*m.dst = data
	}
	return &e, nil
}

// wasmExecJS returns Go's wasm_exec.js, the runtime support the engine
// needs in the browser.
func wasmExecJS() ([]byte, error) {
	p, err := wasmbuild.ExecJS()
	if err != nil {
		return nil, err
	}
	data, err := os.ReadFile(p)
	if err != nil {
		return nil, fmt.Errorf("cannot read Go's wasm_exec.js: %v", err)
	}
	return data, nil
}
