package calc

import (
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/format"
	. "seatsmith/engine/render"
)

// State is the calculator's data-state for an outcome rendered live:
// "live", or "error" when the scenario cannot be apportioned.
func (o *Outcome) State() string {
	if o.Problem != nil {
		return "error"
	}
	return "live"
}

// Output lays out the results of o: the summary, any tie, the table of
// seats, the chart, the explanation, the comparison of methods and the
// claims, ending with the caution that results are not official.
func Output(o *Outcome) *Node {
	out := El("div", "class", "sc-output", "data-part", "output")
	if o.Problem != nil {
		box := El("div", "class", "sc-error", "role", "alert", "data-role", "error", "id", o.Block.ID+"-error")
		if o.Problem.Field != "" {
			box.Set("data-field", o.Problem.Field)
		}
		box.Add(Wrap("strong", "These numbers cannot be apportioned. "))
		box.Add(Wrap("span", o.Problem.Msg, "data-role", "error-message"))
		out.Add(box)
		out.Add(claimsView(o))
		out.Add(caution())
		return out
	}
	if vm := o.Block.vary; vm != nil {
		vm.output(o, out)
		out.Add(claimsView(o))
		out.Add(caution())
		return out
	}
	r := o.Result
	out.Add(summary(o))
	out.Add(tiesView(r))
	out.Add(resultsTable(o))
	out.Add(chart(r))
	out.Add(explanation(o))
	out.Add(comparisonView(o))
	out.Add(claimsView(o))
	out.Add(caution())
	return out
}

func caution() *Node {
	return Wrap("p", format.Caution, "class", "sc-caution", "data-role", "caution")
}

func plural(n int, w string) string {
	if n == 1 {
		return "1 " + w
	}
	if strings.HasSuffix(w, "s") || strings.HasSuffix(w, "x") {
		return strconv.Itoa(n) + " " + w + "es"
	}
	return strconv.Itoa(n) + " " + w + "s"
}

func summary(o *Outcome) *Node {
	r := o.Result
	p := El("p", "class", "sc-summary", "role", "status", "data-role", "summary")
	p.Add(Wrap("strong", r.Method.Name()))
	p.AddText(" divides ")
	p.Add(Wrap("strong", plural(r.Seats, "seat")))
	p.AddText(" among " + plural(len(r.Units), "unit") + " with " + o.Block.Count.Total(Group(r.Total)) + ".")
	excluded := 0
	for _, u := range r.Units {
		if u.Excluded {
			excluded++
		}
	}
	if excluded > 0 {
		p.AddText(" " + plural(excluded, "unit") + " below the threshold " + verb(excluded, "gets", "get") + " no seats and " + verb(excluded, "is", "are") + " left out of the total.")
	}
	if r.Unassigned > 0 {
		p.AddText(" " + plural(r.Unassigned, "seat") + " " + verb(r.Unassigned, "is", "are") + " left open by a tie.")
	}
	return p
}

func verb(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}

func tiesView(r *engine.Result) *Node {
	if len(r.Ties) == 0 {
		return nil
	}
	box := El("div", "class", "sc-tie", "role", "note", "data-role", "ties")
	box.Add(Wrap("h3", "A tie decides seats"))
	ul := El("ul")
	for _, t := range r.Ties {
		li := El("li", "data-tie-seats", strconv.Itoa(t.Seats))
		s := strings.Join(t.Names, ", ") + " have exactly equal claims (" + valueText(&t.Value) + ") on " + plural(t.Seats, "seat") + ". "
		if len(t.Winners) > 0 {
			var ws []string
			for _, w := range t.Winners {
				ws = append(ws, r.Units[w].Name)
			}
			s += "The chosen rule (" + format.TieRuleText(t.Rule) + ") gives " + verb(t.Seats, "it", "them") + " to " + strings.Join(ws, ", ") + "."
		} else {
			s += "No tie rule is chosen, so " + verb(t.Seats, "it is", "they are") + " left unassigned. The governing rule (often a drawing of lots) decides."
		}
		li.AddText(s)
		ul.Add(li)
	}
	box.Add(ul)
	return box
}

func valueText(v *engine.Value) string {
	switch {
	case v == nil:
		return "–"
	case v.Infinite:
		return "infinite"
	}
	return Group(v.Text)
}

func marginText(d *engine.Decimal, pending bool) string {
	if pending {
		return "…"
	}
	if d == nil {
		return "–"
	}
	return Group(d.String())
}

func quotaNote(u *engine.UnitResult) (text, class string) {
	switch {
	case u.Excluded:
		return "excluded", "sc-q-out"
	case u.MeetsQuota:
		return "within", "sc-q-ok"
	case u.Seats < u.Lower:
		return "below lower quota " + strconv.Itoa(u.Lower), "sc-q-low"
	}
	return "above upper quota " + strconv.Itoa(u.Upper), "sc-q-high"
}

func resultsTable(o *Outcome) *Node {
	r := o.Result
	full := o.Block.Mode == Full
	div := r.Method.IsDivisor()
	wrap := El("div", "class", "sc-scroll", "role", "region", "tabindex", "0", "aria-labelledby", o.Block.ID+"-results-caption")
	t := El("table", "class", "sc-results", "data-role", "results", "data-method", r.Method.String(), "data-house", strconv.Itoa(r.Seats))
	t.Add(Wrap("caption", "Seats by "+r.Method.Name()+", "+plural(r.Seats, "seat"), "id", o.Block.ID+"-results-caption"))
	head := El("tr")
	cols := []string{"Unit", "Seats", "Quota", "Quota check", o.Block.Count.Head()}
	// Remainders are the heart of a largest-remainder result, so every
	// calculator shows them; divisor priorities only the full one.
	extra := full || !div
	if extra {
		if div {
			cols = append(cols, "Last seat's priority", "Next seat's priority")
		} else {
			cols = append(cols, "Remainder", "Rank")
		}
	}
	cols = append(cols, "Gain margin", "Lose margin", "Notes")
	for _, c := range cols {
		head.Add(Wrap("th", c, "scope", "col"))
	}
	t.Add(El("thead").Add(head))
	body := El("tbody")
	for i := range r.Units {
		u := &r.Units[i]
		qn, qc := quotaNote(u)
		row := El("tr", "data-unit", u.Name, "data-seats", strconv.Itoa(u.Seats), "data-quota", u.Quota.Text, "class", qc)
		row.SetIf(u.Tied, "data-tied", "true")
		row.Add(Wrap("th", u.Name, "scope", "row"))
		row.Add(Wrap("td", strconv.Itoa(u.Seats), "class", "num sc-seats"))
		row.Add(Wrap("td", u.Quota.Text, "class", "num", "title", "exactly "+u.Quota.Num+"/"+u.Quota.Den))
		row.Add(Wrap("td", qn, "class", "sc-qcheck"))
		row.Add(Wrap("td", Group(u.Population.String()), "class", "num"))
		if extra {
			if div {
				row.Add(Wrap("td", valueText(u.Last), "class", "num"), Wrap("td", valueText(u.Next), "class", "num"))
			} else {
				rank := "–"
				if u.Remainder != nil {
					rank = strconv.Itoa(u.RemainderRank)
					if u.RemainderSeat {
						rank += " (+1 seat)"
					}
				}
				row.Add(Wrap("td", valueText(u.Remainder), "class", "num"), Wrap("td", rank, "class", "num"))
			}
		}
		row.Add(Wrap("td", marginText(u.Gain, o.MarginsPending), "class", "num"), Wrap("td", marginText(u.Lose, o.MarginsPending), "class", "num"))
		row.Add(Wrap("td", format.UnitNotes(u), "class", "sc-notes"))
		body.Add(row)
	}
	t.Add(body)
	foot := El("tr")
	foot.Add(Wrap("th", "Total", "scope", "row"), Wrap("td", strconv.Itoa(r.Seats-r.Unassigned), "class", "num sc-seats"),
		Wrap("td", strconv.Itoa(r.Seats), "class", "num"), El("td"), Wrap("td", Group(r.Total), "class", "num"))
	for k := 5; k < len(cols); k++ {
		foot.Add(El("td"))
	}
	t.Add(El("tfoot").Add(foot))
	wrap.Add(Stackable(t))
	legend := El("p", "class", "sc-hint")
	if o.MarginsAuto() {
		legend.Add(Wrap("strong", "Margins are computed when you pause typing. ", "data-role", "margins-pending"))
	}
	var ask *Node
	if o.MarginsPending && !o.MarginsAuto() {
		ask = El("p", "class", "sc-actions", "data-role", "margins-pending")
		ask.AddText("This method's margins take a search of many exact apportionments, which can take a while for these numbers. ")
		ask.Add(Wrap("button", "Compute the margins", "type", "button", "data-action", "margins"))
	}
	c := o.Block.Count
	legend.AddText(format.MarginLegendIn(c.Noun(), c.People(), c.who()))
	return El("div", "class", "sc-results-wrap").Add(wrap, ask, legend)
}

func explanation(o *Outcome) *Node {
	r := o.Result
	sec := El("section", "class", "sc-explain", "data-role", "explain", "aria-label", "How the seats were found")
	sec.Add(Wrap("h3", "How the seats were found"))
	if d := r.Divisor; d != nil {
		p := El("p", "data-role", "divisor")
		if d.Single {
			p.AddText("Only the divisor " + valueText(&d.Low) + " gives this result: units sit exactly on a signpost there, which is a tie.")
		} else {
			hi := "any larger number"
			if !d.High.Infinite {
				hi = valueText(&d.High)
			}
			p.AddText("Divide each unit's " + o.Block.Count.Noun() + " by any divisor D between ")
			p.Add(Wrap("strong", valueText(&d.Low), "data-role", "divisor-low"))
			p.AddText(" and ")
			p.Add(Wrap("strong", hi, "data-role", "divisor-high"))
			p.AddText(" (ends excluded) and round at the signposts of " + r.Method.Name() + ": every unit gets exactly the seats above. For example D = ")
			p.Add(Wrap("strong", Group(d.Certificate), "data-role", "divisor-example"))
			p.AddText(", checked exactly.")
		}
		sec.Add(p)
		sec.Add(Wrap("p", signpostText(r.Method, o.Block.Count), "class", "sc-hint"))
		if len(r.Beyond) > 0 {
			ul := El("ul", "class", "sc-beyond", "data-role", "beyond")
			for _, a := range r.Beyond {
				ul.Add(Wrap("li", "Seat "+strconv.Itoa(a.Seat)+" would go to "+a.Name+" (its seat "+strconv.Itoa(a.Nth)+", priority "+valueText(&a.Priority)+")"))
			}
			sec.Add(Wrap("p", "If the house grew, the next seats would go in this order:"), ul)
		}
		if o.Block.Mode == Full && orderLen(r) > 0 {
			sec.Add(orderTable(o))
		}
	} else if r.Quota != nil {
		name := "Hare quota"
		if r.Method == engine.Droop {
			name = "Droop quota"
		}
		p := El("p", "data-role", "lr-quota")
		p.AddText("The " + name + " is ")
		p.Add(Wrap("strong", valueText(r.Quota)))
		p.AddText(" " + o.Block.Count.People() + " per seat. Every unit first gets the whole part of its " + o.Block.Count.Noun() + " divided by the quota; the seats left over go to the largest remainders.")
		if r.Passes > 1 {
			p.AddText(" Units whose result broke a minimum or maximum were fixed at that bound and set aside; this took " + plural(r.Passes, "pass") + ".")
		}
		sec.Add(p)
		left := 0
		for _, u := range r.Units {
			if u.RemainderSeat {
				left++
			}
		}
		if left > 0 {
			var ws []string
			for _, u := range r.Units {
				if u.RemainderSeat {
					ws = append(ws, u.Name)
				}
			}
			sec.Add(Wrap("p", plural(left, "seat")+" went to the largest remainders: "+strings.Join(ws, ", ")+"."))
		}
	}
	return sec
}

func signpostText(m engine.Method, c Count) string {
	switch m {
	case engine.Jefferson:
		return "Jefferson (D'Hondt) rounds down: a unit's quotient must reach a + 1 before it gets a + 1 seats."
	case engine.Webster:
		return "Webster (Sainte-Laguë) rounds at one half: a unit gets a + 1 seats once its quotient passes a + ½."
	case engine.Adams:
		return "Adams rounds up: any quotient above a gives a + 1 seats, so every unit with " + c.People() + " gets a seat first."
	case engine.Dean:
		return "Dean rounds at the harmonic mean 2a(a+1)/(2a+1) of a and a + 1."
	case engine.HuntingtonHill:
		return "Huntington–Hill rounds at the geometric mean √(a(a+1)) of a and a + 1, so every unit with " + c.People() + " gets a seat first."
	case engine.ModifiedSainteLague:
		return "Modified Sainte-Laguë is Webster with the first signpost raised from ½ to 0.7, which makes a first seat harder to win."
	}
	return ""
}

// orderLen is the number of seats in r's seat order, whether or not the
// order was computed: every seat held beyond the unit's minimum.
func orderLen(r *engine.Result) int {
	n := 0
	for i := range r.Units {
		if u := &r.Units[i]; !u.Excluded {
			n += u.Seats - u.Min
		}
	}
	return n
}

func orderTable(o *Outcome) *Node {
	r := o.Result
	d := El("details", "class", "sc-order")
	d.Add(Wrap("summary", "Seat order ("+plural(orderLen(r), "seat")+" beyond the minimums)"))
	if o.OrderPending {
		// Laid out when the reader opens the section (the bridge asks
		// for it then): a long order is most of the work of an edit.
		return d.Add(Wrap("p", "Listing the seats in order…", "class", "sc-hint", "data-role", "order-pending"))
	}
	wrap := El("div", "class", "sc-scroll", "role", "region", "tabindex", "0", "aria-label", "Seat order")
	t := El("table", "class", "sc-seat-order")
	t.Add(El("thead").Add(El("tr").Add(Wrap("th", "Seat", "scope", "col"), Wrap("th", "Unit", "scope", "col"), Wrap("th", "Its seat", "scope", "col"), Wrap("th", "Priority", "scope", "col"))))
	body := El("tbody")
	for _, a := range r.Order {
		body.Add(El("tr").Add(Wrap("td", strconv.Itoa(a.Seat), "class", "num"), Wrap("td", a.Name), Wrap("td", strconv.Itoa(a.Nth), "class", "num"), Wrap("td", valueText(&a.Priority), "class", "num")))
	}
	t.Add(body)
	wrap.Add(Stackable(t))
	return d.Add(wrap)
}

func comparisonView(o *Outcome) *Node {
	c := o.Comparison
	first := c.First()
	if first == nil {
		return nil
	}
	cls := "sc-compare"
	if len(c.Methods) > 5 {
		// Too wide for a tablet: the picker takes over sooner.
		cls += " sc-compare-many"
	}
	sec := El("section", "class", cls, "data-role", "compare", "aria-label", "The methods compared")
	sec.Add(Wrap("h3", "The methods compared"))
	sec.Add(methodPicker(o.Block.ID, c.Methods, o.Result.Method))
	wrap := El("div", "class", "sc-scroll", "role", "region", "tabindex", "0", "aria-label", "Seats by each method")
	t := El("table", "class", "sc-comparison")
	head := El("tr").Add(Wrap("th", "Unit", "scope", "col"), Wrap("th", "Quota", "scope", "col"))
	for _, m := range c.Methods {
		th := Wrap("th", m.Name(), "scope", "col", "data-method", m.String())
		th.SetIf(m == o.Result.Method, "class", "sc-current")
		head.Add(th)
	}
	head.Add(Wrap("th", "Methods differ", "scope", "col", "class", "sc-differs-cell"))
	t.Add(El("thead").Add(head))
	body := El("tbody")
	for i := range first.Units {
		u := &first.Units[i]
		row := El("tr", "data-compare-unit", u.Name)
		differs := c.Differs(i)
		row.SetIf(differs, "class", "sc-differs")
		name := Wrap("th", u.Name, "scope", "row")
		if differs {
			// Where the picker shows one method, this note stands in
			// for the last column.
			name.Add(Wrap("small", " methods differ", "class", "sc-differs-note"))
		}
		row.Add(name, Wrap("td", u.Quota.Text, "class", "num"))
		for k, m := range c.Methods {
			res := c.Results[k]
			if res == nil {
				row.Add(Wrap("td", "–", "class", "num", "data-method", m.String()))
				continue
			}
			ru := &res.Units[i]
			td := El("td", "class", "num", "data-method", m.String(), "data-seats", strconv.Itoa(ru.Seats))
			td.AddText(strconv.Itoa(ru.Seats))
			if !ru.MeetsQuota && !ru.Excluded {
				td.Set("class", "num sc-breaks")
				if ru.Seats < ru.Lower {
					td.Add(Wrap("small", " below quota"))
				} else {
					td.Add(Wrap("small", " above quota"))
				}
			}
			row.Add(td)
		}
		row.Add(Wrap("td", yesNo(differs), "class", "sc-differs-cell"))
		body.Add(row)
	}
	t.Add(body)
	foot := El("tr").Add(Wrap("th", "Units outside quota", "scope", "row"), El("td"))
	for k := range c.Methods {
		m := c.Methods[k].String()
		if c.Results[k] == nil {
			foot.Add(Wrap("td", "cannot apportion", "class", "sc-cannot", "data-method", m))
			continue
		}
		foot.Add(Wrap("td", strconv.Itoa(c.QuotaViolations(k)), "class", "num", "data-method", m))
	}
	foot.Add(El("td", "class", "sc-differs-cell"))
	t.Add(El("tfoot").Add(foot))
	wrap.Add(t)
	sec.Add(wrap)
	var fails []string
	for k, m := range c.Methods {
		if c.Errors[k] != nil {
			fails = append(fails, m.Name()+": "+problemOf(c.Errors[k]).Msg)
		}
	}
	if len(fails) > 0 {
		ul := El("ul", "class", "sc-hint")
		for _, f := range fails {
			ul.Add(Wrap("li", f))
		}
		sec.Add(Wrap("p", "Some methods cannot apportion these numbers:", "class", "sc-hint"), ul)
	}
	return sec
}

// methodPicker lets a reader on a narrow screen choose which method's
// column the comparison shows: radio buttons that the stylesheet alone
// obeys (no script), shown only where the whole table would not fit. The
// calculator's own method is chosen first.
func methodPicker(id string, ms []engine.Method, cur engine.Method) *Node {
	shown := ms[0]
	for _, m := range ms {
		if m == cur {
			shown = m
		}
	}
	f := El("fieldset", "class", "sc-picker", "data-role", "method-picker")
	f.Add(Wrap("legend", "Method shown"))
	for _, m := range ms {
		rid := id + "-shown-" + m.String()
		in := El("input", "type", "radio", "name", id+"-shown", "id", rid, "value", m.String()).SetIf(m == shown, "checked", "")
		f.Add(El("label", "class", "sc-check", "for", rid).Add(in, Text(m.Name())))
	}
	return f
}

func yesNo(b bool) string {
	if b {
		return "yes"
	}
	return "no"
}

func claimsView(o *Outcome) *Node {
	b := o.Block
	if len(b.Claims) == 0 {
		return nil
	}
	sec := El("section", "class", "sc-claims", "data-role", "claims", "aria-label", "Claims on this page, checked")
	sec.Add(Wrap("h3", "What the text claims, checked against these numbers"))
	ul := El("ul")
	for i := range b.Claims {
		c := &b.Claims[i]
		text := c.Text
		if text == "" {
			text = b.Statement(c) + "."
		}
		li := El("li", "data-claim", c.ID, "id", b.ID+"-claim-"+c.ID)
		if o.Verdicts == nil {
			li.Set("data-holds", "unknown")
			li.Add(Wrap("span", "Cannot check", "class", "sc-verdict"))
			li.Add(Wrap("span", text, "class", "sc-claim-text"))
			ul.Add(li)
			continue
		}
		v := o.Verdicts[i]
		if v.Holds {
			li.Set("data-holds", "true")
			li.Add(Wrap("span", "Holds", "class", "sc-verdict"))
		} else {
			li.Set("data-holds", "false")
			li.Add(Wrap("span", "Does not hold", "class", "sc-verdict"))
		}
		li.Add(Wrap("span", text, "class", "sc-claim-text"))
		li.Add(Wrap("span", "Now: "+v.Found+".", "class", "sc-found"))
		ul.Add(li)
	}
	sec.Add(ul)
	return sec
}
