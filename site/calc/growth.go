package calc

import (
	"errors"
	"math/big"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	. "seatsmith/engine/render"
	"seatsmith/site/claim"
)

// A GrowthOutcome is a growth block's scenario apportioned with its first
// and its later populations, by each of the block's methods.
type GrowthOutcome struct {
	// Later holds each unit's later population, in unit order.
	Later   []engine.Decimal
	Methods []engine.Method
	// Results[k] is the outcome by Methods[k], or nil when Errors[k]
	// says why there is none.
	Results []*analysis.PopulationResult
	Errors  []error
	// Main is the index of the scenario's own method in Methods.
	Main int
}

// laterScenario is s with the later populations.
func laterScenario(s engine.Scenario, later []engine.Decimal) engine.Scenario {
	t := s
	t.Units = append([]engine.Unit(nil), s.Units...)
	for i := range t.Units {
		if i < len(later) {
			t.Units[i].Population = later[i]
		}
	}
	return t
}

// withOwn returns ms with m in it (appended when missing) and m's index.
func withOwn(ms []engine.Method, m engine.Method) ([]engine.Method, int) {
	for k, x := range ms {
		if x == m {
			return ms, k
		}
	}
	return append(append([]engine.Method(nil), ms...), m), len(ms)
}

func runGrowth(o *Outcome, va *variation) {
	s := o.Scenario
	if _, err := engine.Allot(&s, 0); err != nil {
		o.Problem = problemOf(err)
		return
	}
	t := laterScenario(s, va.Later)
	if _, err := engine.Allot(&t, 0); err != nil {
		o.Problem = laterProblem(err)
		return
	}
	g := &GrowthOutcome{Later: va.Later}
	g.Methods, g.Main = withOwn(o.Block.Compare, s.Method)
	for _, m := range g.Methods {
		s.Method, t.Method = m, m
		r, err := analysis.FindPopulation(&s, &t)
		g.Results = append(g.Results, r)
		g.Errors = append(g.Errors, err)
	}
	if g.Results[g.Main] == nil {
		o.Problem = laterProblem(g.Errors[g.Main])
		return
	}
	o.Growth = g
	o.Verdicts = claim.CheckIn(o.Scenario, o.Block.Claims, o.Block.Count.claimWords(va.context()))
}

// laterProblem places an error about the later populations at their
// fields.
func laterProblem(err error) *Problem {
	var ee *engine.Error
	if errors.As(err, &ee) && ee.Unit >= 0 && ee.Field == "population" {
		f := "units." + strconv.Itoa(ee.Unit) + ".later"
		return &Problem{Field: f, Msg: placeLabel(f) + ee.Msg}
	}
	p := problemOf(err)
	p.Msg = "With the later counts: " + p.Msg
	return p
}

func growthOutput(o *Outcome, out *Node) {
	g := o.Growth
	r := g.Results[g.Main]
	m := g.Methods[g.Main]
	losers, gainers := map[string]bool{}, map[string]bool{}
	for _, f := range r.Findings {
		losers[f.Loser.Name], gainers[f.Gainer.Name] = true, true
	}

	p := El("p", "class", "sc-summary", "role", "status", "data-role", "summary")
	p.Add(Wrap("strong", m.Name()))
	p.AddText(" divides ")
	p.Add(Wrap("strong", plural(r.Before.Seats, "seat")))
	p.AddText(" among " + plural(len(r.Before.Units), "unit") + " twice: with the first " + o.Block.Count.Nouns() + ", totalling " + Group(r.Before.Total) +
		", and with the later ones, totalling " + Group(r.After.Total) + " (" + growthText(r.Before.Total, r.After.Total) + ").")
	out.Add(p)

	wrap := El("div", "class", "sc-scroll", "role", "region", "tabindex", "0", "aria-labelledby", o.Block.ID+"-growth-caption")
	t := El("table", "class", "sc-growth", "data-role", "growth", "data-method", m.String())
	t.Add(Wrap("caption", "Seats by "+m.Name()+" with the first and the later "+o.Block.Count.Nouns()+", "+plural(r.Before.Seats, "seat"), "id", o.Block.ID+"-growth-caption"))
	head := El("tr")
	for _, c := range []string{"Unit", "Seats, first", "Seats, later", "Change", "Growth", o.Block.Count.Head() + ", first", o.Block.Count.Head() + ", later"} {
		head.Add(Wrap("th", c, "scope", "col"))
	}
	t.Add(El("thead").Add(head))
	body := El("tbody")
	for i := range r.Before.Units {
		b, a := &r.Before.Units[i], &r.After.Units[i]
		row := El("tr", "data-growth-unit", b.Name, "data-before", strconv.Itoa(b.Seats), "data-after", strconv.Itoa(a.Seats))
		switch {
		case losers[b.Name]:
			row.Set("class", "sc-lost")
		case gainers[b.Name]:
			row.Set("class", "sc-won")
		}
		row.Add(Wrap("th", b.Name, "scope", "row"))
		row.Add(Wrap("td", strconv.Itoa(b.Seats), "class", "num"), Wrap("td", strconv.Itoa(a.Seats), "class", "num sc-seats"))
		row.Add(Wrap("td", tiedDelta(b, a, r), "class", "num sc-delta"))
		row.Add(Wrap("td", growthText(b.Population.String(), a.Population.String()), "class", "num"))
		row.Add(Wrap("td", Group(b.Population.String()), "class", "num"), Wrap("td", Group(a.Population.String()), "class", "num"))
		body.Add(row)
	}
	t.Add(body)
	t.Add(El("tfoot").Add(El("tr").Add(Wrap("th", "Total", "scope", "row"),
		Wrap("td", strconv.Itoa(r.Before.Seats-r.Before.Unassigned), "class", "num"), Wrap("td", strconv.Itoa(r.After.Seats-r.After.Unassigned), "class", "num"), El("td"),
		Wrap("td", growthText(r.Before.Total, r.After.Total), "class", "num"), Wrap("td", Group(r.Before.Total), "class", "num"), Wrap("td", Group(r.After.Total), "class", "num"))))
	wrap.Add(Stackable(t))
	out.Add(wrap)
	out.Add(Wrap("p", "Growth: the later "+o.Block.Count.Noun()+" divided by the first, less one, compared between units exactly (the percentages are rounded for display).", "class", "sc-hint"))

	sec := El("section", "class", "sc-findings", "data-role", "population", "aria-label", "Population paradoxes found")
	if len(r.Findings) == 0 {
		sec.Add(Wrap("h3", "Population paradoxes under "+m.Name()+": none"))
		sec.Add(Wrap("p", "No unit that grew at least as fast as another lost a seat while the other gained one."))
	} else {
		sec.Add(Wrap("h3", "Population paradoxes under "+m.Name()+": "+strconv.Itoa(len(r.Findings))))
		ul := El("ul", "class", "sc-finding-list")
		for j := range r.Findings {
			f := &r.Findings[j]
			ul.Add(Wrap("li", f.Text(), "data-paradox", "population", "data-unit", f.Loser.Name, "data-gainer", f.Gainer.Name))
		}
		sec.Add(ul)
	}
	out.Add(sec)
	if r.Before.Unassigned > 0 || r.After.Unassigned > 0 {
		out.Add(Wrap("p", "A tie leaves seats open in one of the two apportionments; a finding marked as involving a tie depends on how it is settled.", "class", "sc-hint"))
	}
	out.Add(growthMethods(o))
}

// growthMethods summarises every method's findings.
func growthMethods(o *Outcome) *Node {
	g := o.Growth
	sec := El("section", "class", "sc-compare", "data-role", "growth-compare", "aria-label", "Every method with these "+o.Block.Count.Nouns())
	sec.Add(Wrap("h3", "Every method with these two sets of "+o.Block.Count.Nouns()))
	wrap := El("div", "class", "sc-scroll", "role", "region", "tabindex", "0", "aria-label", "Population paradoxes by method")
	t := El("table", "class", "sc-method-summary")
	t.Add(El("thead").Add(El("tr").Add(Wrap("th", "Method", "scope", "col"), Wrap("th", "Paradoxes", "scope", "col"),
		Wrap("th", "Seats that change", "scope", "col"))))
	body := El("tbody")
	for k, m := range g.Methods {
		row := El("tr", "data-method", m.String())
		row.SetIf(k == g.Main, "class", "sc-current")
		row.Add(Wrap("th", m.Name(), "scope", "row"))
		r := g.Results[k]
		if r == nil {
			row.Add(Wrap("td", "cannot apportion", "class", "sc-cannot"), Wrap("td", problemOf(g.Errors[k]).Msg, "class", "sc-notes"))
			body.Add(row)
			continue
		}
		row.Add(Wrap("td", strconv.Itoa(len(r.Findings)), "class", "num", "data-paradoxes", strconv.Itoa(len(r.Findings))))
		row.Add(Wrap("td", movesText(r.Before, r.After), "class", "sc-notes"))
		body.Add(row)
	}
	t.Add(body)
	wrap.Add(Stackable(t))
	sec.Add(wrap)
	sec.Add(Wrap("p", "Divisor methods never show the population paradox: with one divisor for everybody, a unit that grows faster than another cannot lose a seat to it. Largest-remainder methods can.", "class", "sc-hint"))
	return sec
}

// movesText lists the units whose seats differ between two results of the
// same units: "Sarrow 2 → 1, Caldmoor 4 → 5", or "none".
func movesText(before, after *engine.Result) string {
	var parts []string
	for i := range before.Units {
		if i < len(after.Units) && before.Units[i].Seats != after.Units[i].Seats {
			p := before.Units[i].Name + " " + strconv.Itoa(before.Units[i].Seats) + " → " + strconv.Itoa(after.Units[i].Seats)
			if (before.Units[i].Tied && before.Unassigned > 0) || (after.Units[i].Tied && after.Unassigned > 0) {
				p += " (a tie, not settled)"
			}
			parts = append(parts, p)
		}
	}
	if len(parts) == 0 {
		return "none"
	}
	return strings.Join(parts, ", ")
}

// growthText is the growth from one exact decimal to another as a signed
// percentage rounded to two places: "+3.00%"; "–" from zero.
func growthText(from, to string) string {
	a, ok1 := new(big.Rat).SetString(from)
	b, ok2 := new(big.Rat).SetString(to)
	if !ok1 || !ok2 || a.Sign() == 0 {
		return "–"
	}
	g := new(big.Rat).Quo(b, a)
	g.Sub(g, big.NewRat(1, 1))
	s := analysis.Percent(g)
	switch g.Sign() {
	case 1:
		s = "+" + s
	case -1:
		s = "−" + strings.TrimPrefix(s, "-")
	}
	return s
}

// tiedDelta is seatDelta for a unit before (b) and after (a), saying
// "tied" where a tie leaves one of its seats unassigned: its change is
// then not settled.
func tiedDelta(b, a *engine.UnitResult, r *analysis.PopulationResult) string {
	d := seatDelta(b.Seats, a.Seats)
	if !(b.Tied && r.Before.Unassigned > 0) && !(a.Tied && r.After.Unassigned > 0) {
		return d
	}
	if d == "" {
		return "tied"
	}
	return d + ", tied"
}

// seatDelta writes a change of seats: "+1", "−1" or "".
func seatDelta(before, after int) string {
	switch d := after - before; {
	case d > 0:
		return "+" + strconv.Itoa(d)
	case d < 0:
		return "−" + strconv.Itoa(-d)
	}
	return ""
}
