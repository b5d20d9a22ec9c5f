package api

import (
	"seatsmith/engine/jsondoc"
	"seatsmith/site/calc"
)

// calculator renders one of a page's calculator blocks for the bridge
// (js/bridge.js): it apportions the scenario being edited, compares the
// methods, checks the block's claims and returns the results as a render
// tree, the same markup the site build prerenders. Its argument is a
// calc.Request in its JSON form, as an object or as JSON text (one string
// crosses into the engine faster than an object read member by member);
// the answer is a calc.Response's Doc. It never fails: a request it cannot
// serve gets an answer with state "error" and a message.
func calculator(arg, _ *jsondoc.Value) (*jsondoc.Value, error) {
	if arg.Kind == jsondoc.String {
		if err := checkText("", arg.Text); err != nil {
			return fatal(err), nil
		}
		v, err := jsondoc.ParseLimit([]byte(arg.Text), MaxValues)
		if err != nil {
			return fatal(err), nil
		}
		arg = v
	}
	req, err := calc.DecodeRequest(arg)
	if err != nil {
		return fatal(err), nil
	}
	return calc.Answer(req).Doc(), nil
}

// fatal is the calculator's answer to a request it cannot read.
func fatal(err error) *jsondoc.Value {
	return (&calc.Response{Fatal: true, Problem: &calc.Problem{Msg: "the request cannot be read: " + err.Error()}}).Doc()
}
