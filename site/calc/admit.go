package calc

import (
	"errors"
	"strconv"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	. "seatsmith/engine/render"
	"seatsmith/site/claim"
)

// An AdmitOutcome is an admit block's scenario apportioned, then again
// with the new unit and its added seats, by each of the block's methods.
type AdmitOutcome struct {
	Unit engine.Unit
	// Added is the seats the block adds for the unit; negative for its
	// fair share (each result says how many that is).
	Added   int
	Methods []engine.Method
	// Results[k] is the outcome by Methods[k], or nil when Errors[k]
	// says why there is none.
	Results []*analysis.NewStates
	Errors  []error
	// Main is the index of the scenario's own method in Methods.
	Main int
}

func runAdmit(o *Outcome, va *variation) {
	s := o.Scenario
	if _, err := engine.Allot(&s, 0); err != nil {
		o.Problem = problemOf(err)
		return
	}
	a := &AdmitOutcome{Unit: *va.Admit, Added: va.Added}
	a.Methods, a.Main = withOwn(o.Block.Compare, s.Method)
	for _, m := range a.Methods {
		s.Method = m
		r, err := analysis.FindNewStates(&s, a.Unit, a.Added)
		a.Results = append(a.Results, r)
		a.Errors = append(a.Errors, err)
	}
	if a.Results[a.Main] == nil {
		o.Problem = admitProblem(a.Errors[a.Main], len(s.Units))
		return
	}
	o.Admit = a
	o.Verdicts = claim.CheckIn(o.Scenario, o.Block.Claims, o.Block.Count.claimWords(va.context()))
}

// admitProblem places an error about the admitted unit (unit n of the
// larger scenario) at the editor's fields for it.
func admitProblem(err error, n int) *Problem {
	var ee *engine.Error
	if errors.As(err, &ee) && ee.Unit == n {
		f := "admit.population"
		if ee.Field == "name" {
			f = "admit.name"
		}
		return &Problem{Field: f, Msg: placeLabel(f) + ee.Msg}
	}
	p := problemOf(err)
	if p.Field == "seats" {
		p.Field = "admit.added"
		p.Msg = "In the larger house: " + p.Msg
	}
	return p
}

func admitOutput(o *Outcome, out *Node) {
	a := o.Admit
	r := a.Results[a.Main]
	m := a.Methods[a.Main]

	p := El("p", "class", "sc-summary", "role", "status", "data-role", "summary")
	p.Add(Wrap("strong", m.Name()))
	p.AddText(": admitting ")
	p.Add(Wrap("strong", r.Name))
	p.AddText(" (" + o.Block.Count.Of(Group(r.People.String())) + ") with ")
	p.Add(Wrap("strong", plural(r.Added, "added seat")))
	p.AddText(" raises the house from " + strconv.Itoa(r.House) + " to " + strconv.Itoa(r.NewHouse) + ". Its fair share, its " + o.Block.Count.Noun() + " × " +
		strconv.Itoa(r.House) + " ÷ " + Group(unitsTotal(o.Scenario.Units)) + ", is " + analysis.Decimal(r.FairShare) + " seats")
	if a.Added < 0 {
		p.AddText(", which rounds to " + strconv.Itoa(r.Added) + ".")
	} else {
		p.AddText("; the number of added seats was chosen as " + strconv.Itoa(r.Added) + ".")
	}
	out.Add(p)

	changed := map[string]bool{}
	for _, c := range r.Changes {
		changed[c.Name] = true
	}
	wrap := El("div", "class", "sc-scroll", "role", "region", "tabindex", "0", "aria-labelledby", o.Block.ID+"-admit-caption")
	t := El("table", "class", "sc-admit", "data-role", "admit", "data-method", m.String())
	t.Add(Wrap("caption", "Seats by "+m.Name()+" before and after admitting "+r.Name, "id", o.Block.ID+"-admit-caption"))
	head := El("tr")
	for _, c := range []string{"Unit", "Seats in " + strconv.Itoa(r.House), "Seats in " + strconv.Itoa(r.NewHouse), "Change", o.Block.Count.Head()} {
		head.Add(Wrap("th", c, "scope", "col"))
	}
	t.Add(El("thead").Add(head))
	body := El("tbody")
	for i := range r.Before.Units {
		b, af := &r.Before.Units[i], &r.After.Units[i]
		row := El("tr", "data-admit-unit", b.Name, "data-before", strconv.Itoa(b.Seats), "data-after", strconv.Itoa(af.Seats))
		if changed[b.Name] {
			if af.Seats < b.Seats {
				row.Set("class", "sc-lost")
			} else {
				row.Set("class", "sc-won")
			}
		}
		row.Add(Wrap("th", b.Name, "scope", "row"),
			Wrap("td", strconv.Itoa(b.Seats), "class", "num"), Wrap("td", strconv.Itoa(af.Seats), "class", "num sc-seats"),
			Wrap("td", seatDelta(b.Seats, af.Seats), "class", "num sc-delta"), Wrap("td", Group(b.Population.String()), "class", "num"))
		body.Add(row)
	}
	nu := &r.After.Units[len(r.Before.Units)]
	body.Add(El("tr", "data-admit-unit", nu.Name, "data-before", "", "data-after", strconv.Itoa(nu.Seats), "class", "sc-new").Add(
		El("th", "scope", "row").AddText(nu.Name+" ").Add(Wrap("small", "(new)")),
		Wrap("td", "–", "class", "num"), Wrap("td", strconv.Itoa(nu.Seats), "class", "num sc-seats"),
		Wrap("td", seatDelta(0, nu.Seats), "class", "num sc-delta"), Wrap("td", Group(nu.Population.String()), "class", "num")))
	t.Add(body)
	wrap.Add(Stackable(t))
	out.Add(wrap)

	sec := El("section", "class", "sc-findings", "data-role", "new-states", "aria-label", "What admitting the unit does")
	if r.Paradox() {
		sec.Add(Wrap("h3", "The new-states paradox under "+m.Name()))
	} else {
		sec.Add(Wrap("h3", "No paradox under "+m.Name()))
	}
	f := Wrap("p", o.Block.Count.claimWords(claim.Context{}).NewStatesText(r), "data-paradox", "new-states", "data-holds", strconv.FormatBool(r.Paradox()))
	sec.Add(f)
	if r.Paradox() && r.NewSeats != r.Added {
		sec.Add(Wrap("p", r.Name+" itself receives "+plural(r.NewSeats, "seat")+", not the "+strconv.Itoa(r.Added)+" added for it, so the others must make up the difference. The paradox in its pure form is when the new unit receives exactly the seats added for it and the old units' seats still change.", "class", "sc-hint"))
	}
	out.Add(sec)
	out.Add(admitMethods(o))
}

// admitMethods summarises what admitting the unit does under every method.
func admitMethods(o *Outcome) *Node {
	a := o.Admit
	sec := El("section", "class", "sc-compare", "data-role", "admit-compare", "aria-label", "Every method with the new unit")
	sec.Add(Wrap("h3", "Every method with the new unit"))
	wrap := El("div", "class", "sc-scroll", "role", "region", "tabindex", "0", "aria-label", "The new unit under each method")
	t := El("table", "class", "sc-method-summary")
	t.Add(El("thead").Add(El("tr").Add(Wrap("th", "Method", "scope", "col"), Wrap("th", "New unit's seats", "scope", "col"),
		Wrap("th", "Other units' seats that change", "scope", "col"))))
	body := El("tbody")
	for k, m := range a.Methods {
		row := El("tr", "data-method", m.String())
		row.SetIf(k == a.Main, "class", "sc-current")
		row.Add(Wrap("th", m.Name(), "scope", "row"))
		r := a.Results[k]
		if r == nil {
			row.Add(Wrap("td", "cannot apportion", "class", "sc-cannot"), Wrap("td", problemOf(a.Errors[k]).Msg, "class", "sc-notes"))
			body.Add(row)
			continue
		}
		row.Add(Wrap("td", strconv.Itoa(r.NewSeats)+" of "+strconv.Itoa(r.Added)+" added", "class", "num"))
		row.Add(Wrap("td", changesText(r.Changes), "class", "sc-notes", "data-paradox", strconv.FormatBool(r.Paradox())))
		body.Add(row)
	}
	t.Add(body)
	wrap.Add(Stackable(t))
	sec.Add(wrap)
	sec.Add(Wrap("p", "Under a divisor method, a new unit that receives exactly the seats added for it leaves every other unit's seats as they were: the divisor that worked for them before still works. Largest-remainder methods make no such promise.", "class", "sc-hint"))
	return sec
}

// unitsTotal is the total population of every unit, exactly.
func unitsTotal(us []engine.Unit) string {
	ds := make([]engine.Decimal, len(us))
	for i, u := range us {
		ds[i] = u.Population
	}
	return sumText(ds)
}

func changesText(cs []analysis.SeatChange) string {
	if len(cs) == 0 {
		return "none"
	}
	s := ""
	for i, c := range cs {
		if i > 0 {
			s += ", "
		}
		s += c.Name + " " + strconv.Itoa(c.Before) + " → " + strconv.Itoa(c.After)
	}
	return s
}
