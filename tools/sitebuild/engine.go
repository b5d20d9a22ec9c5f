package main

import (
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
)

// buildEngine compiles the WebAssembly engine (package ./wasm of the
// module holding src) and returns its bytes. A prebuilt file is used
// instead when prebuilt is not empty.
func buildEngine(src, prebuilt string) ([]byte, error) {
	if prebuilt != "" {
		data, err := os.ReadFile(prebuilt)
		if err != nil {
			return nil, fmt.Errorf("-wasm: %v", err)
		}
		return data, nil
	}
	root, err := moduleRoot(src)
	if err != nil {
		return nil, err
	}
	tmp, err := os.MkdirTemp("", "sitebuild-engine-")
	if err != nil {
		return nil, err
	}
	defer os.RemoveAll(tmp)
	out := filepath.Join(tmp, "seatsmith.wasm")
	cmd := exec.Command("go", "build", "-trimpath", "-ldflags=-s -w", "-o", out, "./wasm")
	cmd.Dir = root
	cmd.Env = append(os.Environ(), "GOOS=js", "GOARCH=wasm")
	if msg, err := cmd.CombinedOutput(); err != nil {
		return nil, fmt.Errorf("building the WebAssembly engine: %v\n%s", err, msg)
	}
	return os.ReadFile(out)
}
