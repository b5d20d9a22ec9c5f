package calc

import (
	"errors"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	"seatsmith/site/claim"
)

// MaxSweepSizes is the most house sizes one sweep block covers: enough to
// see the pattern, few enough for the chart to stay readable and the
// browser quick.
const MaxSweepSizes = 200

// A study is what a sweep, growth or admit block adds to its scenario.
type study struct {
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

// context is the claims' view of the study.
func (st *study) context() claim.Context {
	return claim.Context{From: st.From, To: st.To, Later: st.Later, Admit: st.Admit, Added: st.Added}
}

// studyMembers are the members each mode adds to a scenario document.
var studyMembers = map[Mode][]string{
	Sweep: {"from", "to", "methods"},
	Admit: {"admit"},
}

// readStudy splits a block's document into the scenario document proper
// and the study the mode adds to it, and reads the study. Errors are
// *input.Error values naming the member at fault, as a scenario document's
// path ("from", "units[2].later", "admit.population").
func readStudy(file string, doc *jsondoc.Value, mode Mode) (*jsondoc.Value, *study, *input.Error) {
	st := &study{Added: -1}
	if doc == nil || doc.Kind != jsondoc.Object || (mode != Sweep && mode != Growth && mode != Admit) {
		return doc, st, nil
	}
	bad := func(v *jsondoc.Value, field, msg string) *input.Error {
		return &input.Error{File: file, Line: line(v), Field: field, Msg: msg}
	}
	own := studyMembers[mode]
	sdoc := jsondoc.NewObject()
	sdoc.Line = doc.Line
	for _, f := range doc.Fields {
		if !contains(own, f.Key) {
			sdoc.Fields = append(sdoc.Fields, f)
		}
	}
	switch mode {
	case Sweep:
		for _, k := range []string{"from", "to"} {
			v := doc.Get(k)
			if v.IsNull() {
				return nil, nil, bad(doc, k, "missing: a sweep block gives the house sizes it covers, from and to")
			}
			n, ok := wholeOf(v)
			if !ok || n < 1 || n > engine.MaxSeats {
				return nil, nil, bad(v, k, "must be a house size, a whole number of seats of at least 1")
			}
			if k == "from" {
				st.From = n
			} else {
				st.To = n
			}
		}
		if st.To < st.From {
			return nil, nil, bad(doc.Get("to"), "to", "must not be below from ("+strconv.Itoa(st.From)+")")
		}
		if n := st.To - st.From + 1; n > MaxSweepSizes {
			return nil, nil, bad(doc.Get("to"), "to", "the range covers "+strconv.Itoa(n)+" house sizes; a sweep here covers at most "+
				strconv.Itoa(MaxSweepSizes)+" (the command-line tool takes more)")
		}
		ms := doc.Get("methods")
		if ms.IsNull() {
			st.Methods = engine.Methods()
			break
		}
		if ms.Kind != jsondoc.Array {
			return nil, nil, bad(ms, "methods", "must be an array of method ids")
		}
		if len(ms.Items) == 0 {
			return nil, nil, bad(ms, "methods", "choose at least one method")
		}
		seen := map[engine.Method]bool{}
		for i, mv := range ms.Items {
			m, err := engine.ParseMethod(mv.Text)
			if mv.Kind != jsondoc.String || err != nil {
				return nil, nil, bad(mv, "methods["+strconv.Itoa(i)+"]", "unknown method "+strconv.Quote(mv.Text)+"; known: "+strings.Join(engine.MethodIDs(), ", "))
			}
			if !seen[m] {
				seen[m] = true
				st.Methods = append(st.Methods, m)
			}
		}
	case Growth:
		us := doc.Get("units")
		if us == nil || us.Kind != jsondoc.Array {
			break // the scenario reader names the problem
		}
		units := jsondoc.NewArray()
		units.Line = us.Line
		st.Later = make([]engine.Decimal, len(us.Items))
		st.laterGiven = make([]bool, len(us.Items))
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
				return nil, nil, bad(later, field, strconv.Quote(name)+": the later population must be a number or a string holding one")
			}
			d, err := engine.ParseDecimal(later.Text)
			if err != nil {
				return nil, nil, bad(later, field, strconv.Quote(name)+": "+strconv.Quote(strings.TrimSpace(later.Text))+" is not a population: "+decimalProblem(err))
			}
			st.Later[i], st.laterGiven[i] = d, true
		}
		for i, f := range sdoc.Fields {
			if f.Key == "units" {
				sdoc.Fields[i].Value = units
			}
		}
	case Admit:
		a := doc.Get("admit")
		if a.IsNull() {
			return nil, nil, bad(doc, "admit", "missing: an admit block gives the unit it admits, {name, population}")
		}
		if a.Kind != jsondoc.Object {
			return nil, nil, bad(a, "admit", "must be an object: {name, population, added}")
		}
		for _, f := range a.Fields {
			if f.Key != "name" && f.Key != "population" && f.Key != "added" {
				return nil, nil, bad(f.Value, "admit."+f.Key, "unknown member; the unit admitted has name, population and added")
			}
		}
		name := strings.TrimSpace(str(a.Get("name")))
		if name == "" {
			return nil, nil, bad(a, "admit.name", "missing: name the unit admitted")
		}
		p := a.Get("population")
		if p.IsNull() {
			return nil, nil, bad(a, "admit.population", strconv.Quote(name)+": missing")
		}
		if p.Kind != jsondoc.Number && p.Kind != jsondoc.String {
			return nil, nil, bad(p, "admit.population", strconv.Quote(name)+": must be a number or a string holding one")
		}
		d, err := engine.ParseDecimal(p.Text)
		if err != nil {
			return nil, nil, bad(p, "admit.population", strconv.Quote(name)+": "+strconv.Quote(strings.TrimSpace(p.Text))+" is not a population: "+decimalProblem(err))
		}
		st.Admit = &engine.Unit{Name: name, Population: d}
		if x := a.Get("added"); !x.IsNull() {
			n, ok := wholeOf(x)
			if !ok || n > engine.MaxSeats {
				return nil, nil, bad(x, "admit.added", "must be a whole number of seats (leave it out for the unit's fair share)")
			}
			st.Added = n
		}
	}
	return sdoc, st, nil
}

// finish fills in what the study could only know once the scenario was
// read: the population of each unit that gives no later one.
func (st *study) finish(s *engine.Scenario) {
	if st.Later == nil {
		return
	}
	for i := range st.Later {
		if i < len(s.Units) && !st.laterGiven[i] {
			st.Later[i] = s.Units[i].Population
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

// decimalProblem says why a population could not be read, as the scenario
// reader does.
func decimalProblem(err error) string {
	switch {
	case errors.Is(err, engine.ErrEmpty):
		return "missing"
	case errors.Is(err, engine.ErrNegative):
		return "populations cannot be negative"
	case errors.Is(err, engine.ErrTooPrecise):
		return "at most 9 decimal places"
	case errors.Is(err, engine.ErrTooLarge):
		return "at most 10^18"
	}
	return "write a whole number or an exact decimal such as 1250.5, without separators or exponents"
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}
