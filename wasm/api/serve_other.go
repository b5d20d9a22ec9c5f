//go:build !(js && wasm)

package api

import "os"

// Serve explains that the program runs only as WebAssembly and exits: the
// API's packages build on the host so that their functions can be tested
// there, and so do the mains that call Serve.
func Serve(fns []Function, limits []Limit) {
	os.Stderr.WriteString("this is a seatsmith WebAssembly module: build it with GOOS=js GOARCH=wasm (see wasm/README.md)\n")
	os.Exit(2)
}
