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
	// Sweep shows every chosen method's seats across a range of house
	// sizes as a step chart, with the Alabama paradoxes and quota
	// violations found there.
	Sweep
	// Growth apportions the house with two population sets, a first and a
	// later one, and lists the population paradoxes between them.
	Growth
	// Admit apportions the house, admits a new unit with its fair share of
	// added seats and shows whose seats change (the new-states paradox).
	Admit
)

var modeIDs = [...]string{Compact: "compact", Full: "full", Sweep: "sweep", Growth: "growth", Admit: "admit"}

// ParseMode reads "compact", "full", "sweep", "growth" or "admit" (the
// empty string is compact).
func ParseMode(s string) (Mode, bool) {
	t := strings.TrimSpace(s)
	if t == "" {
		return Compact, true
	}
	for m, id := range modeIDs {
		if id == t {
			return Mode(m), true
		}
	}
	return Compact, false
}

// String returns the mode's id, as data-seatsmith takes it.
func (m Mode) String() string {
	if int(m) < len(modeIDs) {
		return modeIDs[m]
	}
	return "compact"
}

// IsVariation reports whether m is one of the variation modes, which
// apportion the scenario again with one thing varied: the house size
// (sweep), the populations (growth) or the units (admit).
func (m Mode) IsVariation() bool { return m == Sweep || m == Growth || m == Admit }

// A Block is one calculator: its scenario as the page gives it, its claims
// and the methods its comparison shows.
type Block struct {
	File string // the page that holds it, for messages
	ID   string // the calculator's id, unique on its page
	Mode Mode
	// Doc is the scenario document, without the claims and compare
	// members; a variation block's document keeps the members its mode adds
	// (from, to, methods; later populations; admit).
	Doc    *jsondoc.Value
	Source *input.Source
	Claims []claim.Claim
	// Compare lists the methods the comparison shows; for growth and
	// admit blocks, the methods whose findings are summarised.
	Compare []engine.Method
	// Count is what the units' numbers count (the block's count member):
	// the calculator speaks of votes, students or applications instead of
	// population where the block says so.
	Count Count

	// vary is the code of a variation block's mode; nil for a calculator.
	vary *variationMode
}

// NeedsAnalysis reports whether the block needs the WebAssembly analysis
// module rather than the calculator module: a variation block, or a block
// with a claim about paradoxes (see UseVariations).
func (b *Block) NeedsAnalysis() bool {
	if b.Mode.IsVariation() {
		return true
	}
	for _, c := range b.Claims {
		if c.Kind.IsParadox() {
			return true
		}
	}
	return false
}

// ParseBlock reads a calculator block from its JSON document. Errors are
// *input.Error values naming file, line and field, in the block's words
// once its count is known.
func ParseBlock(file, id string, mode Mode, v *jsondoc.Value) (_ *Block, err error) {
	b := &Block{File: file, ID: id, Mode: mode}
	defer func() { err = b.Count.speakErr(err) }()
	if v == nil || v.Kind != jsondoc.Object {
		return nil, &input.Error{File: file, Line: jsondoc.LineOf(v), Msg: "a calculator block holds one JSON object: a scenario with seats, method and units"}
	}
	doc := jsondoc.NewObject()
	doc.Line = v.Line
	for _, f := range v.Fields {
		switch f.Key {
		case "claims", "compare", "count":
		default:
			doc.Fields = append(doc.Fields, f)
		}
	}
	b.Doc = doc
	c, err := readCount(file, v.Get("count"))
	if err != nil {
		return nil, err
	}
	b.Count = c
	vm, ierr := variationOf(file, jsondoc.LineOf(v), mode)
	if ierr != nil {
		return nil, ierr
	}
	b.vary = vm
	if err := precheckUnits(file, doc); err != nil {
		return nil, err
	}
	sdoc, va, ierr := readVariation(file, doc, vm)
	if ierr != nil {
		return nil, ierr
	}
	src, err := input.FromDoc(file, sdoc)
	if err != nil {
		return nil, err
	}
	if err := checkBlockSize(src.Title, &src.Scenario); err != nil {
		e := err.(*input.Error)
		e.File, e.Line = file, jsondoc.LineOf(v)
		return nil, e
	}
	b.Source = src
	va.finish(&src.Scenario)
	if mode != Sweep {
		for _, need := range []string{"seats", "method"} {
			if !src.Given[need] {
				return nil, &input.Error{File: file, Line: jsondoc.LineOf(v), Field: need, Msg: "missing: a " + blockWord(mode) + " must give seats and method"}
			}
		}
		if _, err := engine.Allot(&src.Scenario, 0); err != nil {
			return nil, src.Locate(err)
		}
	}
	if mode == Sweep && !v.Get("compare").IsNull() {
		return nil, &input.Error{File: file, Line: jsondoc.LineOf(v.Get("compare")), Field: "compare", Msg: "a sweep block names the methods it sweeps in methods"}
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
	ctx := va.context()
	for i, c := range cs {
		at := func(field, msg string) error {
			return &input.Error{File: file, Line: c.Line, Field: "claims[" + strconv.Itoa(i) + "]" + field, Msg: "claim " + strconv.Quote(c.ID) + " " + msg}
		}
		for _, n := range []struct{ field, name string }{{".unit", c.Unit}, {".gainer", c.Gainer}} {
			if n.name != "" && !names[n.name] {
				return nil, at(n.field, "names "+strconv.Quote(n.name)+", which is not a unit of this scenario")
			}
		}
		if need := c.Missing(ctx); need != "" {
			return nil, at(".kind", "cannot be checked here: "+need)
		}
		if mode == Sweep {
			if !src.Given["method"] && !c.Method.Valid() && c.Kind != claim.Differ && c.Kind != claim.Agree {
				return nil, at(".method", "needs a method: this sweep block's scenario names none")
			}
			if !src.Given["seats"] && c.House == 0 && c.From == 0 && c.Kind != claim.NoAlabama && c.Kind != claim.NoQuotaViolation {
				return nil, at(".house", "needs a house size: this sweep block's scenario gives no seats")
			}
		}
	}
	if x := v.Get("compare"); !x.IsNull() {
		if x.Kind != jsondoc.Array || len(x.Items) == 0 {
			return nil, &input.Error{File: file, Line: jsondoc.LineOf(x), Field: "compare", Msg: "must be a non-empty array of method ids"}
		}
		for i, mv := range x.Items {
			if mv.Kind != jsondoc.String {
				return nil, &input.Error{File: file, Line: jsondoc.LineOf(mv), Field: "compare[" + strconv.Itoa(i) + "]", Msg: "must be a method id such as \"webster\""}
			}
			m, err := engine.ParseMethod(mv.Text)
			if err != nil {
				return nil, &input.Error{File: file, Line: jsondoc.LineOf(mv), Field: "compare[" + strconv.Itoa(i) + "]",
					Msg: "unknown method " + strconv.Quote(mv.Text) + "; known: " + strings.Join(engine.MethodIDs(), ", ")}
			}
			b.Compare = append(b.Compare, m)
		}
	} else {
		b.Compare = engine.Methods()
	}
	return b, nil
}

// blockWord names the kind of block a mode is, for messages.
func blockWord(m Mode) string {
	switch m {
	case Sweep:
		return "sweep block"
	case Growth:
		return "growth block"
	case Admit:
		return "admit block"
	}
	return "calculator block"
}
