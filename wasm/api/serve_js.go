//go:build js && wasm

package main

import (
	"runtime/debug"

	"github.com/hack-pad/safejs"

	"seatsmith/engine/jsondoc"
	"seatsmith/engine/report"
)

func main() {
	// An answer for a calculator of fifty units allocates a few megabytes
	// and keeps almost none of it, and a collection in the middle of one
	// is what makes the slowest edits slow. So the collector waits until
	// the heap has grown seventeenfold, but never past a soft limit of
	// 64 MiB, which keeps a page's memory within bounds.
	debug.SetGCPercent(1600)
	debug.SetMemoryLimit(64 << 20)
	if err := install(); err != nil {
		if console, err2 := safejs.Global().Get("console"); err2 == nil {
			console.Call("error", "seatsmith: the engine could not start: "+err.Error())
		}
	}
	select {} // serve calls from JavaScript for as long as the page lives
}

// install puts the API object on globalThis.seatsmith.
func install() error {
	rt, err := newRuntime()
	if err != nil {
		return err
	}
	obj, err := rt.objectCtor.New()
	if err != nil {
		return err
	}
	if err := obj.Set("version", APIVersion); err != nil {
		return err
	}
	if err := obj.Set("caution", report.Caution); err != nil {
		return err
	}
	for _, name := range apiNames() {
		fn, err := safejs.FuncOf(rt.handler(name, api[name]))
		if err != nil {
			return err
		}
		if err := obj.Set(name, fn); err != nil {
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
func (rt *jsRuntime) handler(name string, f apiFunc) func(this safejs.Value, args []safejs.Value) any {
	return func(_ safejs.Value, args []safejs.Value) (result any) {
		defer func() {
			if p := recover(); p != nil {
				result = rt.errorValue(&internalError{"internal error: " + panicText(p)})
			}
		}()
		var out *jsondoc.Value
		switch len(args) {
		case 0:
			out = call(f, nil)
		case 1:
			arg, err := fromJS(rt.reader(args[0]))
			if err != nil {
				out = errorDoc(err)
			} else {
				out = call(f, arg)
			}
		default:
			out = errorDoc(&internalError{name + " takes one argument, not several"})
		}
		v, err := rt.value(out)
		if err != nil {
			return rt.errorValue(err)
		}
		return v
	}
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
