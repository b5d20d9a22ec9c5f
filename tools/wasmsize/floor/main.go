//go:build js && wasm

// Command floor is the second baseline of wasmsize: the minimal js/wasm
// program (one global function, then block) that also uses the two
// libraries seatsmith's engine is built on, hack-pad/safejs for every
// access to the page and math/big for the exact arithmetic behind the
// seats, in the ways the engine uses them. Its size is the least any
// engine with those libraries can weigh; the engine's size above it is
// seatsmith's own code.
package main

import (
	"math/big"

	"github.com/hack-pad/safejs"
)

func main() {
	f, err := safejs.FuncOf(ping)
	if err != nil {
		return
	}
	if err := safejs.Global().Set("ping", f); err != nil {
		return
	}
	select {}
}

// ping reads a number from its argument's member "n", through the page's
// Reflect.get as the engine does, and answers with exact arithmetic on it.
func ping(this safejs.Value, args []safejs.Value) any {
	if len(args) == 0 {
		return "no argument"
	}
	get, err := safejs.Global().Get("Reflect")
	if err == nil {
		get, err = get.Get("get")
	}
	var v safejs.Value
	if err == nil {
		v, err = get.Invoke(args[0], "n")
	}
	var n int
	if err == nil {
		n, err = v.Int()
	}
	if err != nil {
		return err.Error()
	}
	a := new(big.Int).Mul(big.NewInt(int64(n)), big.NewInt(1_000_000_007))
	a.Quo(a, big.NewInt(3))
	a.Sqrt(a)
	r := new(big.Rat).SetFrac(a, big.NewInt(7))
	r.Add(r, big.NewRat(1, 2))
	if r.Cmp(big.NewRat(1, 3)) < 0 {
		return "small"
	}
	x, _ := new(big.Float).SetRat(r).Float64()
	o, err := safejs.ValueOf(map[string]any{"exact": r.FloatString(3), "digits": a.String(), "approx": x})
	if err != nil {
		return err.Error()
	}
	return o
}
