package main

import (
	"fmt"
	"os"
	"path/filepath"

	"seatsmith/wasm/wasmbuild"
)

// buildEngine compiles the WebAssembly engine (package seatsmith/wasm)
// with the release flags and returns its bytes. A prebuilt file is used
// instead when prebuilt is not empty.
func buildEngine(prebuilt string) ([]byte, error) {
	if prebuilt != "" {
		data, err := os.ReadFile(prebuilt)
		if err != nil {
			return nil, fmt.Errorf("-wasm: %v", err)
		}
		return data, nil
	}
	tmp, err := os.MkdirTemp("", "sitebuild-engine-")
	if err != nil {
		return nil, err
	}
	defer os.RemoveAll(tmp)
	wasm, _, err := wasmbuild.Build(filepath.Join(tmp, "engine"))
	if err != nil {
		return nil, fmt.Errorf("building the WebAssembly engine: %v", err)
	}
	return os.ReadFile(wasm)
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
