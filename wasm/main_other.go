//go:build !(js && wasm)

package main

import "os"

// main explains that the program runs only as WebAssembly. The package
// builds on the host so that its conversion and API functions can be
// tested there.
func main() {
	os.Stderr.WriteString("this is the seatsmith WebAssembly module: build it with GOOS=js GOARCH=wasm (see wasm/README.md)\n")
	os.Exit(2)
}
