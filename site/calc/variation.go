package calc

import (
	"slices"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	. "seatsmith/engine/render"
	"seatsmith/site/claim"
)

// MaxSweepSizes is the most house sizes one sweep block covers: enough to
// see the pattern, few enough for the chart to stay readable and the
// browser quick.
const MaxSweepSizes = 200

// A variation is what a variation block (sweep, growth or admit) adds to
// its scenario: the one thing it varies.
type variation struct {
	// Sweep blocks: the house sizes and the methods swept.
	From, To int
	Methods  []engine.Method
	// Growth blocks: each unit's later population, in unit order; a unit
	// that gives none (laterGiven false) keeps its population.
	Later      []engine.Decimal
	laterGiven []bool
	// Admit blocks: the unit admitted and the seats added for it
	// (negative: its fair share).
	Admit *engine.Unit
	Added int
}

// context is the claims' view of the variation.
func (va *variation) context() claim.Context {
	return claim.Context{From: va.From, To: va.To, Later: va.Later, Admit: va.Admit, Added: va.Added}
}

// A variationMode is the code of one variation mode: how it reads the
// members it adds, runs, lays out its results and controls, and exports.
// The modes are reached only through [variationModes], which only
// [UseVariations] fills, so that a program that never calls it (the
// WebAssembly calculator module) carries none of their code.
type variationMode struct {
	// members are the members the mode adds to the scenario document,
	// taken out of it before the scenario is read; a growth block's later
	// populations sit in its units and read takes them out itself.
	members []string
	// read reads the members from doc (the block's whole document) into
	// va; sdoc is the scenario document without them, which read may
	// change.
	read     func(file string, doc, sdoc *jsondoc.Value, va *variation) *input.Error
	run      func(o *Outcome, va *variation)
	output   func(o *Outcome, out *Node)
	controls func(fs *Node, b *Block, doc *jsondoc.Value, id func(string) string)
	// export is nil for a mode without downloads.
	export func(o *Outcome) (csv, js string)
}

var variationModes [Admit + 1]*variationMode

// UseVariations makes the variation modes available: sweep (every
// method's seats across a range of house sizes), growth (two population
// counts) and admit (a unit joins). Until it is called, a block of one of
// these modes is refused with a message that says so. The site build and
// the WebAssembly analysis module call it; the calculator module does not,
// and so stays free of the analysis code these modes need.
func UseVariations() {
	claim.UseParadoxes()
	variationModes[Sweep] = &variationMode{members: []string{"from", "to", "methods"},
		read: readSweep, run: runSweep, output: sweepOutput, controls: sweepControls, export: exportSweep}
	variationModes[Growth] = &variationMode{read: readGrowth, run: runGrowth, output: growthOutput, controls: growthControls}
	variationModes[Admit] = &variationMode{members: []string{"admit"},
		read: readAdmit, run: runAdmit, output: admitOutput, controls: admitControls}
}

// variationOf returns the code of mode m, nil for a calculator mode, or an
// error when m is a variation mode this program does not carry.
func variationOf(file string, line int, m Mode) (*variationMode, *input.Error) {
	if !m.IsVariation() {
		return nil, nil
	}
	if vm := variationModes[m]; vm != nil {
		return vm, nil
	}
	return nil, &input.Error{File: file, Line: line, Field: "mode", Msg: "this engine has no " + blockWord(m) +
		"s: they are in the analysis module (seatsmith-analysis.wasm)"}
}

// readVariation splits a block's document into the scenario document
// proper and the variation the mode adds to it, and reads the variation.
// Errors are *input.Error values naming the member at fault, as a scenario
// document's path ("from", "units[2].later", "admit.population").
func readVariation(file string, doc *jsondoc.Value, vm *variationMode) (*jsondoc.Value, *variation, *input.Error) {
	va := &variation{Added: -1}
	if vm == nil || doc == nil || doc.Kind != jsondoc.Object {
		return doc, va, nil
	}
	sdoc := jsondoc.NewObject()
	sdoc.Line = doc.Line
	for _, f := range doc.Fields {
		if !slices.Contains(vm.members, f.Key) {
			sdoc.Fields = append(sdoc.Fields, f)
		}
	}
	if err := vm.read(file, doc, sdoc, va); err != nil {
		return nil, nil, err
	}
	return sdoc, va, nil
}

// badMember places a message at a member of a block's document.
func badMember(file string, v *jsondoc.Value, field, msg string) *input.Error {
	return &input.Error{File: file, Line: jsondoc.LineOf(v), Field: field, Msg: msg}
}

// readSweep reads a sweep block's from, to and methods.
func readSweep(file string, doc, sdoc *jsondoc.Value, va *variation) *input.Error {
	bad := func(v *jsondoc.Value, field, msg string) *input.Error { return badMember(file, v, field, msg) }
	for _, k := range []string{"from", "to"} {
		v := doc.Get(k)
		if v.IsNull() {
			return bad(doc, k, "missing: a sweep block gives the house sizes it covers, from and to")
		}
		n, ok := wholeOf(v)
		if !ok || n < 1 || n > engine.MaxSeats {
			return bad(v, k, "must be a house size, a whole number of seats of at least 1")
		}
		if k == "from" {
			va.From = n
		} else {
			va.To = n
		}
	}
	if va.To < va.From {
		return bad(doc.Get("to"), "to", "must not be below from ("+strconv.Itoa(va.From)+")")
	}
	if n := va.To - va.From + 1; n > MaxSweepSizes {
		return bad(doc.Get("to"), "to", "the range covers "+strconv.Itoa(n)+" house sizes; a sweep here covers at most "+
			strconv.Itoa(MaxSweepSizes)+" (the command-line tool takes more)")
	}
	ms := doc.Get("methods")
	if ms.IsNull() {
		va.Methods = engine.Methods()
		return nil
	}
	if ms.Kind != jsondoc.Array {
		return bad(ms, "methods", "must be an array of method ids")
	}
	if len(ms.Items) == 0 {
		return bad(ms, "methods", "choose at least one method")
	}
	seen := map[engine.Method]bool{}
	for i, mv := range ms.Items {
		m, err := engine.ParseMethod(mv.Text)
		if mv.Kind != jsondoc.String || err != nil {
			return bad(mv, "methods["+strconv.Itoa(i)+"]", "unknown method "+strconv.Quote(mv.Text)+"; known: "+strings.Join(engine.MethodIDs(), ", "))
		}
		if !seen[m] {
			seen[m] = true
			va.Methods = append(va.Methods, m)
		}
	}
	return nil
}

// readGrowth takes each unit's later population out of its units.
func readGrowth(file string, doc, sdoc *jsondoc.Value, va *variation) *input.Error {
	bad := func(v *jsondoc.Value, field, msg string) *input.Error { return badMember(file, v, field, msg) }
	us := doc.Get("units")
	if us == nil || us.Kind != jsondoc.Array {
		return nil // the scenario reader names the problem
	}
	units := jsondoc.NewArray()
	units.Line = us.Line
	va.Later = make([]engine.Decimal, len(us.Items))
	va.laterGiven = make([]bool, len(us.Items))
	for i, u := range us.Items {
		if u == nil || u.Kind != jsondoc.Object {
			units.Append(u)
			continue
		}
		cu := jsondoc.NewObject()
		cu.Line = u.Line
		var later *jsondoc.Value
		for _, f := range u.Fields {
			if f.Key == "later" {
				later = f.Value
				continue
			}
			cu.Fields = append(cu.Fields, f)
		}
		units.Append(cu)
		if later.IsNull() {
			continue // the unit keeps its population
		}
		field := "units[" + strconv.Itoa(i) + "].later"
		name := strings.TrimSpace(str(u.Get("name")))
		if later.Kind != jsondoc.Number && later.Kind != jsondoc.String {
			return bad(later, field, strconv.Quote(name)+": the later population must be a number or a string holding one")
		}
		d, err := engine.ParseDecimal(later.Text)
		if err != nil {
			return bad(later, field, input.PopulationProblem(name, later.Text, err))
		}
		va.Later[i], va.laterGiven[i] = d, true
	}
	for i, f := range sdoc.Fields {
		if f.Key == "units" {
			sdoc.Fields[i].Value = units
		}
	}
	return nil
}

// readAdmit reads an admit block's unit admitted.
func readAdmit(file string, doc, sdoc *jsondoc.Value, va *variation) *input.Error {
	bad := func(v *jsondoc.Value, field, msg string) *input.Error { return badMember(file, v, field, msg) }
	a := doc.Get("admit")
	if a.IsNull() {
		return bad(doc, "admit", "missing: an admit block gives the unit it admits, {name, population}")
	}
	if a.Kind != jsondoc.Object {
		return bad(a, "admit", "must be an object: {name, population, added}")
	}
	for _, f := range a.Fields {
		if f.Key != "name" && f.Key != "population" && f.Key != "added" {
			return bad(f.Value, "admit."+f.Key, "unknown member; the unit admitted has name, population and added")
		}
	}
	name := strings.TrimSpace(str(a.Get("name")))
	if name == "" {
		return bad(a, "admit.name", "missing: name the unit admitted")
	}
	p := a.Get("population")
	if p.IsNull() {
		return bad(a, "admit.population", strconv.Quote(name)+": missing")
	}
	if p.Kind != jsondoc.Number && p.Kind != jsondoc.String {
		return bad(p, "admit.population", strconv.Quote(name)+": must be a number or a string holding one")
	}
	d, err := engine.ParseDecimal(p.Text)
	if err != nil {
		return bad(p, "admit.population", input.PopulationProblem(name, p.Text, err))
	}
	va.Admit = &engine.Unit{Name: name, Population: d}
	if x := a.Get("added"); !x.IsNull() {
		n, ok := wholeOf(x)
		if !ok || n > engine.MaxSeats {
			return bad(x, "admit.added", "must be a whole number of seats (leave it out for the unit's fair share)")
		}
		va.Added = n
	}
	return nil
}

// finish fills in what the variation could only know once the scenario was
// read: the population of each unit that gives no later one.
func (va *variation) finish(s *engine.Scenario) {
	if va.Later == nil {
		return
	}
	for i := range va.Later {
		if i < len(s.Units) && !va.laterGiven[i] {
			va.Later[i] = s.Units[i].Population
		}
	}
}

// wholeOf reads a whole number given as a JSON number or as a string of
// digits (the browser sends every number as a string).
func wholeOf(v *jsondoc.Value) (int, bool) {
	if v == nil || (v.Kind != jsondoc.Number && v.Kind != jsondoc.String) {
		return 0, false
	}
	t := strings.TrimSpace(v.Text)
	if t == "" || len(t) > 10 {
		return 0, false
	}
	n := 0
	for i := 0; i < len(t); i++ {
		if t[i] < '0' || t[i] > '9' {
			return 0, false
		}
		n = n*10 + int(t[i]-'0')
	}
	return n, true
}
