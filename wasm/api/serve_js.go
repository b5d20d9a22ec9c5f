//go:build js && wasm

package api

import (
	"runtime/debug"
	"strconv"

	"github.com/hack-pad/safejs"

	"seatsmith/engine/format"
	"seatsmith/engine/jsondoc"
)

// Serve installs the API object on globalThis.seatsmith, with the
// functions fns and a limits function listing limits, and serves calls
// from JavaScript for as long as the page (or worker) lives. It never
// returns.
func Serve(fns []Function, limits []Limit) {
	fns = append(fns[:len(fns):len(fns)], LimitsFunction(limits))
	// An answer for a calculator of fifty units allocates a few megabytes
	// and keeps almost none of it, and a collection in the middle of one
	// is what makes the slowest edits slow. So the collector waits until
	// the heap has grown fivefold; the soft limit of 256 MiB makes it work
	// harder before a large request (the limits allow about a hundred
	// megabytes) can take the heap near what a tab may hold.
	debug.SetGCPercent(400)
	debug.SetMemoryLimit(256 << 20)
	if err := install(fns); err != nil {
		if console, err2 := safejs.Global().Get("console"); err2 == nil {
			console.Call("error", "seatsmith: the engine could not start: "+err.Error())
		}
	}
	select {}
}

// install puts the API object on globalThis.seatsmith.
func install(fns []Function) error {
	rt, err := newRuntime()
	if err != nil {
		return err
	}
	obj, err := rt.objectCtor.New()
	if err != nil {
		return err
	}
	if err := obj.Set("version", Version); err != nil {
		return err
	}
	if err := obj.Set("caution", format.Caution); err != nil {
		return err
	}
	for _, f := range fns {
		fn, err := safejs.FuncOf(rt.handler(f))
		if err != nil {
			return err
		}
		if err := obj.Set(f.Name, fn); err != nil {
			return err
		}
	}
	if _, err := rt.freeze.Invoke(obj); err != nil {
		return err
	}
	return safejs.Global().Set("seatsmith", obj)
}

// handler wraps f as a JavaScript function that never throws: every
// failure, a recovered panic included, is returned as an error object.
func (rt *jsRuntime) handler(f Function) func(this safejs.Value, args []safejs.Value) any {
	return func(_ safejs.Value, args []safejs.Value) (result any) {
		defer func() {
			if p := recover(); p != nil {
				result = rt.errorValue(&internalError{"internal error: " + panicText(p)})
			}
		}()
		var out *jsondoc.Value
		max := 1
		if f.Options {
			max = 2
		}
		if len(args) > max {
			out = errorDoc(&internalError{f.Name + " takes " + argCount(max) + ", not " + strconv.Itoa(len(args))})
		} else {
			var in [2]*jsondoc.Value
			for i, a := range args {
				v, err := rt.convert(a)
				if err != nil {
					out = errorDoc(err)
					break
				}
				in[i] = v
			}
			if out == nil {
				out = Invoke(f, in[0], in[1])
			}
		}
		v, err := rt.value(out)
		if err != nil {
			return rt.errorValue(err)
		}
		return v
	}
}

func argCount(n int) string {
	if n == 1 {
		return "one argument"
	}
	return "at most " + strconv.Itoa(n) + " arguments"
}

// errorValue builds the JavaScript error object for err, or null if even
// that fails.
func (rt *jsRuntime) errorValue(err error) safejs.Value {
	v, err := rt.value(errorDoc(err))
	if err != nil {
		return safejs.Null()
	}
	return v
}

type internalError struct{ msg string }

func (e *internalError) Error() string { return e.msg }
