package calc

import (
	"math/big"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/format"
	. "seatsmith/engine/render"
	"seatsmith/site/claim"
)

// A SweepOutcome is a sweep block's scenario apportioned at every house
// size of its range by each of its methods.
type SweepOutcome struct {
	// Set holds the sweeps and the Alabama paradoxes found in each.
	Set *analysis.SweepSet
	// Violations[k] lists the quota violations of Set.Sweeps[k].
	Violations [][]analysis.QuotaViolation
}

// maxListed is the most quota violations the list shows per method; the
// tables below it mark every one.
const maxListed = 4

func runSweep(o *Outcome, va *variation) {
	set := analysis.SweepAll(o.Scenario, va.Methods, va.From, va.To)
	if set.First() == nil {
		o.Problem = sweepProblem(set.Errors[0])
		return
	}
	so := &SweepOutcome{Set: set, Violations: make([][]analysis.QuotaViolation, len(set.Methods))}
	for k := range set.Sweeps {
		so.Violations[k] = set.Violations(k)
	}
	o.Sweep = so
	o.Verdicts = claim.CheckIn(o.Scenario, o.Block.Claims, o.Block.Count.claimWords(va.context()))
}

// sweepProblem places a sweep's error at the range's fields: a sweep has
// no house size of its own.
func sweepProblem(err error) *Problem {
	p := problemOf(err)
	if p.Field == "seats" {
		p.Field = "from"
		p.Msg = strings.TrimPrefix(p.Msg, fieldLabel("seats")+": ")
		p.Msg = placeLabel("from") + p.Msg
	}
	return p
}

// SweepCount says how many Alabama paradoxes and quota violations a sweep
// found, over every method.
func (so *SweepOutcome) SweepCount() (alabama, quota int) {
	for k := range so.Set.Methods {
		alabama += len(so.Set.Paradoxes[k])
		quota += len(so.Violations[k])
	}
	return alabama, quota
}

func sweepOutput(o *Outcome, out *Node) {
	so := o.Sweep
	out.Add(sweepSummary(o))
	out.Add(sweepChart(so, o.Block.ID))
	out.Add(alabamaList(so))
	out.Add(quotaList(so))
	out.Add(sweepTables(so))
}

func sweepSummary(o *Outcome) *Node {
	set := o.Sweep.Set
	f := set.First()
	p := El("p", "class", "sc-summary", "role", "status", "data-role", "summary")
	ok := 0
	for _, sw := range set.Sweeps {
		if sw != nil {
			ok++
		}
	}
	p.Add(Wrap("strong", plural(len(set.Methods), "method")))
	p.AddText(" at every house size from ")
	p.Add(Wrap("strong", strconv.Itoa(set.From)+" to "+strconv.Itoa(set.To)))
	p.AddText(": " + plural(len(f.Names), "unit") + " with " + o.Block.Count.Total(Group(totalText(f))) + ".")
	al, qv := o.Sweep.SweepCount()
	p.AddText(" Found: " + plural(al, "Alabama paradox") + " and " + plural(qv, "quota violation") + ".")
	if ok < len(set.Methods) {
		p.AddText(" " + plural(len(set.Methods)-ok, "method") + " cannot apportion any size in this range.")
	}
	if set.Unsettled() {
		p.AddText(" At some sizes a tie leaves seats open; the tables below say where.")
	}
	return p
}

// totalText is the total population of the units a sweep apportions,
// exactly.
func totalText(sw *engine.SweepResult) string {
	var ds []engine.Decimal
	for i, d := range sw.Populations {
		if !sw.Excluded[i] {
			ds = append(ds, d)
		}
	}
	return sumText(ds)
}

// sumText adds exact decimals.
func sumText(ds []engine.Decimal) string {
	sum := new(big.Rat)
	for _, d := range ds {
		r, ok := new(big.Rat).SetString(d.String())
		if ok {
			sum.Add(sum, r)
		}
	}
	if sum.IsInt() {
		return sum.Num().String()
	}
	return strings.TrimRight(strings.TrimRight(sum.FloatString(engine.MaxPlaces), "0"), ".")
}

func alabamaList(so *SweepOutcome) *Node {
	set := so.Set
	total, _ := so.SweepCount()
	sec := El("section", "class", "sc-findings", "data-role", "alabama", "aria-label", "Alabama paradoxes found")
	head := "Alabama paradoxes: none in this range"
	if total > 0 {
		head = "Alabama paradoxes: " + strconv.Itoa(total) + " found"
	}
	sec.Add(Wrap("h3", head))
	if total > 0 {
		ul := El("ul", "class", "sc-finding-list")
		for k, ps := range set.Paradoxes {
			for j := range ps {
				f := &ps[j]
				ul.Add(Wrap("li", f.Text(), "data-paradox", "alabama", "data-method", set.Methods[k].String(),
					"data-unit", f.Name, "data-house", strconv.Itoa(f.To)))
			}
		}
		sec.Add(ul)
	}
	var none []engine.Method
	divisorsOnly := true
	for k, sw := range set.Sweeps {
		if sw != nil && len(set.Paradoxes[k]) == 0 {
			none = append(none, set.Methods[k])
			divisorsOnly = divisorsOnly && set.Methods[k].IsDivisor()
		}
	}
	if len(none) > 0 {
		t := "None in this range under " + methodList(none) + "."
		if divisorsOnly {
			t += " Divisor methods never show it: one more seat can only lower the divisor, and a lower divisor can only raise each unit's quotient."
		}
		sec.Add(Wrap("p", t, "class", "sc-hint"))
	}
	return sec
}

func quotaList(so *SweepOutcome) *Node {
	set := so.Set
	_, total := so.SweepCount()
	sec := El("section", "class", "sc-findings", "data-role", "quota", "aria-label", "Quota violations found")
	head := "Quota violations: none in this range"
	if total > 0 {
		head = "Quota violations: " + strconv.Itoa(total) + " found"
	}
	sec.Add(Wrap("h3", head))
	bounds := false
	var none []engine.Method
	for k, vs := range so.Violations {
		if set.Sweeps[k] == nil {
			continue
		}
		if len(vs) == 0 {
			none = append(none, set.Methods[k])
			continue
		}
		m := set.Methods[k]
		allBound := true
		for j := range vs {
			allBound = allBound && vs[j].Bounds
		}
		head := El("p", "class", "sc-finding-head").Add(Wrap("strong", m.Name())).AddText(": " + plural(len(vs), "quota violation"))
		if allBound {
			head.AddText(", each caused by the minimums or maximums")
		}
		sec.Add(head)
		ul := El("ul", "class", "sc-finding-list")
		for j := range vs {
			v := &vs[j]
			bounds = bounds || v.Bounds
			if j == maxListed {
				ul.Add(Wrap("li", "… and "+strconv.Itoa(len(vs)-maxListed)+" more under "+m.Name()+", marked in the tables below.", "class", "sc-more-findings"))
				break
			}
			ul.Add(Wrap("li", v.SizeText(!allBound), "data-paradox", "quota", "data-method", m.String(), "data-unit", v.Name, "data-house", strconv.Itoa(v.House)))
		}
		sec.Add(ul)
	}
	if len(none) > 0 {
		sec.Add(Wrap("p", "None in this range under "+methodList(none)+": every unit gets its lower or its upper quota at every size.", "class", "sc-hint"))
	}
	if bounds {
		sec.Add(Wrap("p", "Where the minimums or maximums cause a violation, the unit would be within its quota without them, apportioned by the same method at the same size.", "class", "sc-hint"))
	}
	var fails []string
	for k, err := range set.Errors {
		if err != nil {
			fails = append(fails, set.Methods[k].Name()+": "+problemOf(err).Msg)
		}
	}
	if len(fails) > 0 {
		ul := El("ul", "class", "sc-hint")
		for _, f := range fails {
			ul.Add(Wrap("li", f))
		}
		sec.Add(Wrap("p", "Some methods cannot apportion any size in this range:", "class", "sc-hint"), ul)
	}
	return sec
}

// sweepTables lays out every sweep as a table: one row a house size, one
// column a unit, with what changed from the size before. They hold the
// chart's numbers for readers who cannot see it or want them exactly.
func sweepTables(so *SweepOutcome) *Node {
	set := so.Set
	d := El("details", "class", "sc-sweep-numbers", "data-role", "sweep-tables")
	d.Add(Wrap("summary", "The seats at every house size, method by method (tables)"))
	for k, sw := range set.Sweeps {
		if sw == nil {
			continue
		}
		m := set.Methods[k]
		lost := map[[2]int]bool{} // {size index, unit} where seats fell
		for _, f := range set.Paradoxes[k] {
			lost[[2]int{f.To - set.From, f.Unit}] = true
		}
		off := map[[2]int]string{} // {size index, unit} outside quota
		for _, v := range so.Violations[k] {
			if v.Above() {
				off[[2]int{v.House - set.From, v.Unit}] = "above quota"
			} else {
				off[[2]int{v.House - set.From, v.Unit}] = "below quota"
			}
		}
		wrap := El("div", "class", "sc-scroll", "role", "region", "tabindex", "0", "aria-label", "Seats by "+m.Name()+" at each house size")
		t := El("table", "class", "sc-sweep-table", "data-method", m.String())
		t.Add(Wrap("caption", m.Name()))
		head := El("tr").Add(Wrap("th", "House size", "scope", "col"))
		for _, n := range sw.Names {
			head.Add(Wrap("th", n, "scope", "col", "class", "num"))
		}
		head.Add(Wrap("th", "Change", "scope", "col"), Wrap("th", "Notes", "scope", "col"))
		t.Add(El("thead").Add(head))
		body := El("tbody")
		var prev []int
		for j := range sw.Sizes {
			z := &sw.Sizes[j]
			row := El("tr", "data-sweep-house", strconv.Itoa(z.House))
			row.Add(Wrap("th", strconv.Itoa(z.House), "scope", "row", "class", "num"))
			if z.Err != nil {
				for range sw.Names {
					row.Add(Wrap("td", "–", "class", "num"))
				}
				row.Add(El("td"), Wrap("td", "cannot apportion: "+problemOf(z.Err).Msg, "class", "sc-notes"))
				body.Add(row)
				prev = nil
				continue
			}
			for i, a := range z.Seats {
				td := Wrap("td", strconv.Itoa(a), "class", "num")
				var notes []string
				if lost[[2]int{j, i}] {
					td.Set("class", "num sc-fell")
					notes = append(notes, "fell")
				}
				if q := off[[2]int{j, i}]; q != "" {
					td.Set("class", "num sc-breaks")
					notes = append(notes, q)
				}
				if len(notes) > 0 {
					td.Add(Wrap("small", " "+strings.Join(notes, ", ")))
				}
				row.Add(td)
			}
			row.Add(Wrap("td", format.SeatChanges(sw.Names, prev, z.Seats), "class", "sc-change"))
			row.Add(Wrap("td", format.TiesText(z.Ties, func(i int) string { return sw.Names[i] }), "class", "sc-notes"))
			body.Add(row)
			prev = z.Seats
		}
		t.Add(body)
		wrap.Add(Stackable(t))
		d.Add(wrap)
	}
	return d
}

// methodList names methods in a sentence: "A, B and C".
func methodList(ms []engine.Method) string {
	names := make([]string, len(ms))
	for i, m := range ms {
		names[i] = m.Name()
	}
	switch len(names) {
	case 0:
		return ""
	case 1:
		return names[0]
	}
	return strings.Join(names[:len(names)-1], ", ") + " and " + names[len(names)-1]
}
