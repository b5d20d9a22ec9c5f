//go:build js && wasm

// Command interop is the third baseline of wasmsize: the minimal js/wasm
// program (one global function, then block) that reaches the page through
// hack-pad/safejs, as the engine does, and uses nothing else. Its size over
// the minimal program is what safejs costs by itself; the target's room
// above it is all that is left for exact arithmetic and seatsmith's code.
package main

import "github.com/hack-pad/safejs"

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

// ping reads its argument's member "n" through the page's Reflect.get, as
// the engine reads every value, and answers with an object made by
// safejs.ValueOf, as the floor does.
func ping(this safejs.Value, args []safejs.Value) any {
	if len(args) == 0 {
		return "no argument"
	}
	get, err := safejs.Global().Get("Reflect")
	if err == nil {
		get, err = get.Get("get")
	}
	if err != nil {
		return err.Error()
	}
	v, err := get.Invoke(args[0], "n")
	if err != nil {
		return err.Error()
	}
	s, err := v.String()
	if err != nil {
		return err.Error()
	}
	o, err := safejs.ValueOf(map[string]any{"text": s, "length": len(s)})
	if err != nil {
		return err.Error()
	}
	return o
}
