package calc

import (
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	"seatsmith/site/claim"
)

// A Mode is how much of the calculator a block shows.
type Mode uint8

const (
	// Compact is the calculator of an explainer page: the common options
	// up front, the rest folded away.
	Compact Mode = iota
	// Full is the staffer's calculator: every option, file loading and
	// the seat order.
	Full
)

// ParseMode reads "full" or "compact" (the empty string is compact).
func ParseMode(s string) (Mode, bool) {
	switch strings.TrimSpace(s) {
	case "", "compact":
		return Compact, true
	case "full":
		return Full, true
	}
	return Compact, false
}

// String returns "full" or "compact".
func (m Mode) String() string {
	if m == Full {
		return "full"
	}
	return "compact"
}

// A Block is one calculator: its scenario as the page gives it, its claims
// and the methods its comparison shows.
type Block struct {
	File string // the page that holds it, for messages
	ID   string // the calculator's id, unique on its page
	Mode Mode
	// Doc is the scenario document, without the claims and compare members.
	Doc     *jsondoc.Value
	Source  *input.Source
	Claims  []claim.Claim
	Compare []engine.Method
}

// ParseBlock reads a calculator block from its JSON document. Errors are
// *input.Error values naming file, line and field.
func ParseBlock(file, id string, mode Mode, v *jsondoc.Value) (*Block, error) {
	b := &Block{File: file, ID: id, Mode: mode}
	if v == nil || v.Kind != jsondoc.Object {
		return nil, &input.Error{File: file, Line: line(v), Msg: "a calculator block holds one JSON object: a scenario with seats, method and units"}
	}
	doc := jsondoc.NewObject()
	doc.Line = v.Line
	for _, f := range v.Fields {
		switch f.Key {
		case "claims", "compare":
		default:
			doc.Fields = append(doc.Fields, f)
		}
	}
	b.Doc = doc
	src, err := input.FromDoc(file, doc)
	if err != nil {
		return nil, err
	}
	b.Source = src
	for _, need := range []string{"seats", "method"} {
		if !src.Given[need] {
			return nil, &input.Error{File: file, Line: line(v), Field: need, Msg: "missing: a calculator block must give seats and method"}
		}
	}
	if _, err := engine.Allot(&src.Scenario, 0); err != nil {
		return nil, src.Locate(err)
	}
	cs, err := claim.Parse(v.Get("claims"))
	if err != nil {
		e := err.(*input.Error)
		e.File = file
		return nil, e
	}
	b.Claims = cs
	names := map[string]bool{}
	for _, u := range src.Scenario.Units {
		names[strings.TrimSpace(u.Name)] = true
	}
	for i, c := range cs {
		if !names[c.Unit] {
			return nil, &input.Error{File: file, Line: c.Line, Field: "claims[" + strconv.Itoa(i) + "].unit",
				Msg: "claim " + strconv.Quote(c.ID) + " names " + strconv.Quote(c.Unit) + ", which is not a unit of this scenario"}
		}
	}
	if x := v.Get("compare"); !x.IsNull() {
		if x.Kind != jsondoc.Array || len(x.Items) == 0 {
			return nil, &input.Error{File: file, Line: line(x), Field: "compare", Msg: "must be a non-empty array of method ids"}
		}
		for i, mv := range x.Items {
			if mv.Kind != jsondoc.String {
				return nil, &input.Error{File: file, Line: line(mv), Field: "compare[" + strconv.Itoa(i) + "]", Msg: "must be a method id such as \"webster\""}
			}
			m, err := engine.ParseMethod(mv.Text)
			if err != nil {
				return nil, &input.Error{File: file, Line: line(mv), Field: "compare[" + strconv.Itoa(i) + "]",
					Msg: "unknown method " + strconv.Quote(mv.Text) + "; known: " + strings.Join(engine.MethodIDs(), ", ")}
			}
			b.Compare = append(b.Compare, m)
		}
	} else {
		b.Compare = engine.Methods()
	}
	return b, nil
}

func line(v *jsondoc.Value) int {
	if v == nil {
		return 0
	}
	return v.Line
}
