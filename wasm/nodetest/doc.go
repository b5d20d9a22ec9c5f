//go:build !js

// Package nodetest tests the seatsmith WebAssembly engine the way pages use
// it: it builds the module with package wasmbuild, runs it under Node with
// a small harness (testdata/harness.js) and checks that
// globalThis.seatsmith returns exactly the documents the native report
// packages build, and that bad input of every kind comes back as an error
// object, never as an exception, with the engine usable afterwards.
//
// The package has tests only. They need node on PATH.
package nodetest
