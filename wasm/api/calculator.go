package main

import (
	"seatsmith/engine/jsondoc"
	"seatsmith/site/calc"
)

func init() { register("calculator", calculator) }

// calculator renders one of a page's calculator blocks for the bridge
// (bridge.js): it apportions the scenario being edited, compares the
// methods, checks the block's claims and returns the results as a render
// tree, the same markup the site build prerenders. See calc.Live for the
// request and the answer. It never fails: a request it cannot serve gets
// an answer with state "error" and a message.
func calculator(arg *jsondoc.Value) (*jsondoc.Value, error) {
	return calc.Live(arg), nil
}
