//go:build !(js && wasm)

package main

import "os"

// main explains that the program is a WebAssembly baseline for wasmsize.
func main() {
	os.Stderr.WriteString("interop is a baseline for go run ./tools/wasmsize: build it with GOOS=js GOARCH=wasm\n")
	os.Exit(2)
}
