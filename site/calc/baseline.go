package calc

import (
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	. "seatsmith/engine/render"
)

// baselineView compares the pinned baseline (a scenario document) with the
// outcome o, the proposal, with analysis.Compare (the seatsmith command's
// diff): a summary line of the seats that move, then a row for each unit
// whose seats, presence or margins change, the change drawn as an arrow
// and said in words. A baseline that cannot be read or apportioned says so
// in place of the comparison.
func baselineView(o *Outcome, base *jsondoc.Value) *Node {
	b := o.Block
	sec := El("section", "class", "sc-baseline", "data-role", "baseline", "aria-labelledby", b.ID+"-baseline-head")
	sec.Add(Wrap("h3", "Pinned baseline against this proposal", "id", b.ID+"-baseline-head"))
	src, err := input.FromDoc(b.File, base)
	var d *analysis.Diff
	if err == nil {
		d, err = analysis.Compare(&src.Scenario, &o.Scenario)
	}
	if err != nil {
		msg := trimInput(err)
		if se, ok := err.(*analysis.SideError); ok {
			msg = se.Side + ": " + trimInput(se.Err)
		}
		sec.Add(Wrap("p", "The pinned baseline cannot be compared: "+b.Count.speak(msg), "class", "sc-error", "data-role", "baseline-error"))
		return sec
	}
	sec.Add(diffSummary(d))
	if s := settingsText(d.Settings); s != "" {
		sec.Add(Wrap("p", s, "class", "sc-hint", "data-role", "baseline-settings"))
	}
	var rows []*analysis.UnitDiff
	for i := range d.Units {
		if d.Units[i].Changed() {
			rows = append(rows, &d.Units[i])
		}
	}
	if len(rows) == 0 {
		return sec
	}
	c := b.Count
	wrap := El("div", "class", "sc-scroll", "role", "region", "tabindex", "0", "aria-labelledby", b.ID+"-baseline-caption")
	t := El("table", "class", "sc-diff", "data-role", "diff")
	t.Add(Wrap("caption", "Units whose seats or margins change", "id", b.ID+"-baseline-caption"))
	head := El("tr")
	for _, h := range []string{"Unit", "Baseline", "Proposal", "Change", c.Head(), "Gain margin", "Lose margin"} {
		head.Add(Wrap("th", h, "scope", "col"))
	}
	t.Add(El("thead").Add(head))
	body := El("tbody")
	for _, u := range rows {
		row := El("tr", "data-diff-unit", u.Name, "data-change", strconv.Itoa(u.SeatChange))
		row.Add(Wrap("th", u.Name, "scope", "row"))
		row.Add(Wrap("td", seatsOf(u.Base), "class", "num"), Wrap("td", seatsOf(u.Proposal), "class", "num"))
		row.Add(changeCell(u))
		row.Add(Wrap("td", fromTo(popOf(u.Base), popOf(u.Proposal)), "class", "num"))
		row.Add(Wrap("td", marginChange(u.Base, u.Proposal, u.GainChanged, true), "class", "num"))
		row.Add(Wrap("td", marginChange(u.Base, u.Proposal, u.LoseChanged, false), "class", "num"))
		body.Add(row)
	}
	t.Add(body)
	wrap.Add(Stackable(t))
	sec.Add(wrap)
	return sec
}

// diffSummary is the comparison's one line: how many seats move and to
// and from which units.
func diffSummary(d *analysis.Diff) *Node {
	p := El("p", "class", "sc-summary", "data-role", "baseline-summary", "data-moved", strconv.Itoa(d.Moved()))
	var up, down, gone, added []string
	for _, u := range d.Units {
		switch {
		case !u.InProposal:
			gone = append(gone, u.Name)
		case !u.InBase:
			added = append(added, u.Name)
		case u.SeatChange > 0:
			up = append(up, u.Name+" +"+strconv.Itoa(u.SeatChange))
		case u.SeatChange < 0:
			down = append(down, u.Name+" −"+strconv.Itoa(-u.SeatChange))
		}
	}
	if d.Moved() == 0 && len(gone) == 0 && len(added) == 0 {
		p.AddText("No unit's seats change against the baseline.")
		return p
	}
	p.Add(Wrap("strong", plural(d.Moved(), "seat")+" "+verb(d.Moved(), "moves", "move")))
	var parts []string
	if len(up) > 0 {
		parts = append(parts, "gaining: "+strings.Join(up, ", "))
	}
	if len(down) > 0 {
		parts = append(parts, "losing: "+strings.Join(down, ", "))
	}
	if len(added) > 0 {
		parts = append(parts, "new: "+strings.Join(added, ", "))
	}
	if len(gone) > 0 {
		parts = append(parts, "no longer in: "+strings.Join(gone, ", "))
	}
	p.AddText(" against the baseline; " + strings.Join(parts, "; ") + ".")
	return p
}

// settingLabels name the settings a comparison lists.
var settingLabels = map[string]string{"seats": "house size", "method": "method", "min": "minimum", "max": "cap", "threshold": "threshold", "tie": "tie rule"}

func settingsText(cs []analysis.SettingChange) string {
	var parts []string
	for _, c := range cs {
		before, after := c.Before, c.After
		if c.Name == "method" {
			before, after = methodName(before), methodName(after)
		}
		parts = append(parts, settingLabels[c.Name]+" "+before+" to "+after)
	}
	if len(parts) == 0 {
		return ""
	}
	return "Settings changed: " + strings.Join(parts, "; ") + "."
}

func methodName(id string) string {
	if m, err := engine.ParseMethod(id); err == nil {
		return m.Name()
	}
	return id
}

func seatsOf(u *engine.UnitResult) string {
	if u == nil {
		return "–"
	}
	return strconv.Itoa(u.Seats)
}

func popOf(u *engine.UnitResult) string {
	if u == nil {
		return "–"
	}
	return Group(u.Population.String())
}

// fromTo writes a value before and after, or the value once when it is the
// same.
func fromTo(a, b string) string {
	if a == b {
		return a
	}
	return a + " to " + b
}

// changeCell shows a seat change as a coloured arrow and a signed number,
// with words for screen readers.
func changeCell(u *analysis.UnitDiff) *Node {
	n := u.SeatChange
	td := El("td", "class", "num sc-shift")
	switch {
	case n > 0:
		td.Set("class", "num sc-shift sc-up")
		td.Add(Wrap("span", "▲", "aria-hidden", "true"), Text(" +"+strconv.Itoa(n)), Wrap("span", " "+verb(n, "seat", "seats")+" gained", "class", "sc-vh"))
	case n < 0:
		td.Set("class", "num sc-shift sc-down")
		td.Add(Wrap("span", "▼", "aria-hidden", "true"), Text(" −"+strconv.Itoa(-n)), Wrap("span", " "+verb(-n, "seat", "seats")+" lost", "class", "sc-vh"))
	default:
		td.Add(Text("0"), Wrap("span", " seats unchanged", "class", "sc-vh"))
	}
	return td
}

// marginChange writes a margin before and after when it changed.
func marginChange(b, p *engine.UnitResult, changed, gain bool) string {
	get := func(u *engine.UnitResult) string {
		if u == nil {
			return "–"
		}
		if gain {
			return marginText(u.Gain, false)
		}
		return marginText(u.Lose, false)
	}
	if !changed {
		return get(p)
	}
	return fromTo(get(b), get(p))
}
