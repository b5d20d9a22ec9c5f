package projection

import (
	"math"
	"strconv"

	"seatsmith/engine/format"
	model "seatsmith/engine/projection"
	. "seatsmith/engine/render"
)

// Form is the block's controls: the target date, growth model, error
// model, relative standard error, draws, seed and the counts. enabled is
// false for the prerendered page, where the controls wait for the engine.
func Form(c *Config, id string, enabled bool) *Node {
	f := El("form", "class", "pj-form", "data-role", "projection-form", "novalidate", "", "aria-describedby", id+"-form-note")
	fs := El("fieldset", "class", "pj-fields")
	if !enabled {
		fs.Set("disabled", "")
	}
	fs.Add(Wrap("legend", "Projection and error model"))
	field := func(name, label, hint string, control *Node) {
		fid := id + "-" + name
		control.Set("id", fid).Set("name", name)
		wrap := El("div", "class", "pj-field")
		wrap.Add(Wrap("label", label, "for", fid))
		if hint != "" {
			control.Set("aria-describedby", fid+"-hint")
			wrap.Add(control, Wrap("small", hint, "id", fid+"-hint", "class", "pj-hint"))
		} else {
			wrap.Add(control)
		}
		fs.Add(wrap)
	}
	field("target", "Target date", "YYYY-MM-DD", El("input", "type", "text", "inputmode", "numeric", "autocomplete", "off", "value", c.Target.String(), "data-field", "target"))
	field("growth", "Growth", "", choice(c.Growth.String(), "growth", [][2]string{{"linear", "linear"}, {"geometric", "geometric"}}))
	field("error", "Count error", "", choice(c.Error.String(), "error", [][2]string{{"normal", "normal"}, {"lognormal", "log-normal"}}))
	rse := c.RSEText
	if rse == "" {
		rse = pctText(c.RSE)
	}
	field("rse", "Relative standard error", "for units without their own, e.g. 2%", El("input", "type", "text", "autocomplete", "off", "value", rse, "data-field", "rse"))
	field("draws", "Draws", "1 to "+strconv.Itoa(MaxDraws), El("input", "type", "text", "inputmode", "numeric", "autocomplete", "off", "value", strconv.Itoa(c.Draws), "data-field", "draws"))
	field("seed", "Seed", "the same seed gives the same numbers", El("input", "type", "text", "inputmode", "numeric", "autocomplete", "off", "value", strconv.FormatUint(c.Seed, 10), "data-field", "seed"))
	f.Add(fs)
	det := El("details", "class", "pj-counts")
	det.Add(Wrap("summary", "The dated counts (CSV: name, date, population, rse)"))
	cid := id + "-counts"
	det.Add(Wrap("label", "Counts", "for", cid, "class", "pj-counts-label"))
	ta := El("textarea", "id", cid, "name", "counts", "rows", "12", "spellcheck", "false", "data-field", "counts")
	if !enabled {
		ta.Set("disabled", "")
	}
	det.Add(ta.AddText(c.Counts))
	f.Add(det)
	bar := El("div", "class", "pj-actions")
	run := El("button", "type", "submit", "data-role", "projection-run").AddText("Run the draws")
	cancel := El("button", "type", "button", "data-role", "projection-cancel", "disabled", "").AddText("Cancel")
	if !enabled {
		run.Set("disabled", "")
	}
	bar.Add(run, cancel)
	f.Add(bar)
	prog := El("div", "class", "pj-progress", "data-role", "projection-progress", "role", "progressbar", "aria-label", "Draws made",
		"aria-valuemin", "0", "aria-valuemax", strconv.Itoa(c.Draws), "aria-valuenow", "0")
	prog.Add(El("span", "class", "pj-progress-bar", "data-role", "projection-progress-bar"))
	f.Add(prog)
	f.Add(Wrap("p", "", "class", "pj-status", "data-role", "projection-status", "aria-live", "polite"))
	f.Add(Wrap("p", "", "class", "pj-error", "data-role", "projection-error", "role", "alert", "hidden", ""))
	note := "The draws run in the background of this page, in your browser; nothing is sent anywhere."
	if !enabled {
		note = "The numbers below were computed when the page was built. With JavaScript on, the controls run the draws again in your browser."
	}
	f.Add(Wrap("p", note, "id", id+"-form-note", "class", "pj-hint"))
	return f
}

func choice(cur, field string, opts [][2]string) *Node {
	s := El("select", "data-field", field)
	for _, o := range opts {
		op := El("option", "value", o[0]).AddText(o[1])
		op.SetIf(o[0] == cur, "selected", "")
		s.Add(op)
	}
	return s
}

// Output is the result of a study: the setup in words, the probability
// chart, the table of every unit with the same numbers, the claims with
// their verdicts and the caution.
func Output(c *Config, s *model.Summary, id string) *Node {
	out := El("div", "class", "pj-output", "data-role", "projection-output", "data-draws", strconv.Itoa(s.Draws),
		"data-apportioned", strconv.FormatInt(s.Apportioned, 10), "data-seed", strconv.FormatUint(s.Seed, 10))
	if c.Title != "" {
		out.Add(Wrap("h3", c.Title))
	}
	fit := "least squares over every count"
	if s.Fit == model.LastTwo {
		fit = "through the two latest counts"
	}
	setup := s.Method.Name() + ", " + strconv.Itoa(s.Seats) + " seats. Counts projected to " + s.Target.String() + " by " +
		s.Growth.String() + " growth (" + fit + "); " + s.Error.String() + " count error, relative standard error " + pctText(s.RSE)
	var own []string
	for _, u := range s.Units {
		if u.RSE != s.RSE {
			own = append(own, u.Name+" "+pctText(u.RSE))
		}
	}
	if len(own) > 0 {
		setup += " (own: " + join(own) + ")"
	}
	setup += ". " + strconv.Itoa(s.Draws) + " draws with seed " + strconv.FormatUint(s.Seed, 10) + ", " + strconv.FormatInt(s.Apportioned, 10) + " apportioned"
	if s.Failed > 0 {
		setup += ", " + strconv.FormatInt(s.Failed, 10) + " could not be"
	}
	setup += "."
	out.Add(Wrap("p", setup, "class", "pj-setup", "data-role", "projection-setup"))
	if s.Apportioned > 0 {
		out.Add(Wrap("p", "Each share is an estimate from the draws, within "+strconv.FormatFloat(50/math.Sqrt(float64(s.Apportioned)), 'f', 2, 64)+
			" percentage points (one standard error at most). Losing and gaining are against the seats of the latest counts.", "class", "pj-hint"))
	}
	out.Add(chart(s, id))
	out.Add(table(s, id))
	if len(c.Claims) > 0 {
		ul := El("ul", "class", "pj-claims", "data-role", "projection-claims", "aria-label", "Claims checked against these draws")
		for i := range c.Claims {
			cl := &c.Claims[i]
			v := cl.Check(s)
			text := cl.Text
			if text == "" {
				text = cl.Statement()
			}
			verdict := "holds"
			if !v.Holds {
				verdict = "does not hold"
			}
			li := El("li", "data-claim", cl.ID, "data-holds", strconv.FormatBool(v.Holds), "class", "pj-claim")
			li.Add(Wrap("span", verdict, "class", "pj-verdict"), Text(" "+text+" "), Wrap("small", "("+v.Found+")", "class", "pj-hint"))
			ul.Add(li)
		}
		out.Add(ul)
	}
	out.Add(Wrap("p", "A projection is an estimate from a growth model and an assumed error, not a forecast of record. "+format.Caution,
		"class", "pj-caution", "data-role", "caution"))
	return out
}

func join(xs []string) string {
	s := ""
	for i, x := range xs {
		if i > 0 {
			s += ", "
		}
		s += x
	}
	return s
}

func table(s *model.Summary, id string) *Node {
	t := El("table", "class", "pj-table", "data-role", "projection-table")
	t.Add(Wrap("caption", "Every unit: its latest count, the projection, its seats now and at the projection, and the share of draws in which it loses or gains a seat or gets each seat count."))
	head := El("tr")
	for _, h := range []string{"Unit", "Latest count", "Projected", "Seats now", "At projection", "Loses a seat", "Gains a seat", "Seats in the draws"} {
		head.Add(Wrap("th", h, "scope", "col"))
	}
	t.Add(El("thead").Add(head))
	body := El("tbody")
	n := s.Apportioned
	for _, u := range s.Units {
		tr := El("tr", "data-unit", u.Name, "data-now", strconv.Itoa(u.BaselineSeats), "data-central", strconv.Itoa(u.CentralSeats),
			"data-lose", strconv.FormatInt(u.Lose.Draws, 10), "data-gain", strconv.FormatInt(u.Gain.Draws, 10))
		tr.Add(Wrap("th", u.Name, "scope", "row"))
		latest := Group(u.Latest.Population.String())
		if u.Latest.Dated {
			latest += " (" + u.Latest.Date.String() + ")"
		}
		proj := Group(u.Central.String())
		if u.Clamped {
			proj += " (line below 0)"
		}
		tr.Add(Wrap("td", latest, "class", "num"), Wrap("td", proj, "class", "num"), Wrap("td", strconv.Itoa(u.BaselineSeats), "class", "num"),
			Wrap("td", strconv.Itoa(u.CentralSeats), "class", "num"), Wrap("td", format.ShareText(u.Lose, n), "class", "num"),
			Wrap("td", format.ShareText(u.Gain, n), "class", "num"))
		dist := El("td", "class", "pj-dist")
		for k, d := range u.Dist {
			if k > 0 {
				dist.AddText(" ")
			}
			dist.Add(Wrap("span", strconv.Itoa(d.Seats)+": "+format.ShareText(d.Share, n), "data-seats", strconv.Itoa(d.Seats), "data-draws", strconv.FormatInt(d.Draws, 10)))
		}
		tr.Add(dist)
		body.Add(tr)
	}
	return Stackable(t.Add(body))
}

// Chart geometry, in SVG user units: about a phone's width, so that its
// text keeps a readable size there.
const (
	chartW    = 420.0
	labelW    = 104.0
	barX      = 110.0
	barW      = 228.0
	rowH      = 30.0
	chartTop  = 26.0
	chartFoot = 30.0
)

// chart draws one bar a unit, split into the seat counts the draws gave it,
// each as wide as its share: fewer seats than now, the same, or more (by
// class, with the seat count written in every segment wide enough), with
// the shares of losing and gaining a seat. It is drawn twice and the
// stylesheet shows one: the names and shares beside the bars where there
// is room, and above them in a narrow block (a phone).
func chart(s *model.Summary, id string) *Node {
	fig := El("figure", "class", "pj-chart", "data-role", "projection-chart")
	cap := id + "-chart-caption"
	fig.Add(Wrap("figcaption", "Seats each unit gets across the draws: every bar is all the draws, split by seat count; the number in a segment is the seat count. The table below holds the same numbers.", "id", cap))
	return fig.Add(wideChart(s, id, cap), narrowChart(s, id, cap))
}

// segments adds the bar of unit u, from x0 and y, w wide and h high, to g.
func segments(g *Node, u *model.UnitSummary, n int64, x0, y, w, h float64) {
	g.Add(El("rect", "x", num(x0), "y", num(y), "width", num(w), "height", num(h), "class", "pj-track"))
	x := x0
	for _, d := range u.Dist {
		sw := w * d.P
		cls := "pj-same"
		switch {
		case d.Seats < u.BaselineSeats:
			cls = "pj-fewer"
		case d.Seats > u.BaselineSeats:
			cls = "pj-more"
		}
		seg := El("rect", "x", num(x), "y", num(y), "width", num(sw), "height", num(h), "class", "pj-seg "+cls)
		seg.Add(Wrap("title", u.Name+": "+strconv.Itoa(d.Seats)+" seats in "+format.ShareText(d.Share, n)+" of the draws"))
		g.Add(seg)
		if sw >= 16 {
			g.Add(Wrap("text", strconv.Itoa(d.Seats), "x", num(x+sw/2), "y", num(y+h/2+4), "text-anchor", "middle", "class", "pj-seglabel "+cls))
		}
		x += sw
	}
}

// legend adds the key to the bars' colours, from x and y, to svg.
func legend(svg *Node, x, y float64) {
	leg := El("g", "class", "pj-legend")
	for _, l := range [][2]string{{"pj-fewer", "fewer than now"}, {"pj-same", "as now"}, {"pj-more", "more than now"}} {
		leg.Add(El("rect", "x", num(x), "y", num(y), "width", "12", "height", "12", "class", "pj-seg "+l[0]))
		leg.Add(Wrap("text", l[1], "x", num(x+16), "y", num(y+10)))
		x += 16 + 7*float64(len(l[1])) + 10
	}
	svg.Add(leg)
}

// wideChart is the chart with each unit's name and seats now at the left
// of its bar and its shares of losing and gaining a seat at the right.
func wideChart(s *model.Summary, id, cap string) *Node {
	h := chartTop + rowH*float64(len(s.Units)) + chartFoot
	svg := El("svg", "viewBox", "0 0 "+num(chartW)+" "+num(h), "role", "img", "aria-labelledby", id+"-chart-title "+cap, "class", "pj-svg pj-svg-wide")
	svg.Add(Wrap("title", "Chance of each seat count, by unit", "id", id+"-chart-title"))
	hd := El("g", "class", "pj-axis")
	hd.Add(Wrap("text", "seats now", "x", num(labelW), "y", "14", "text-anchor", "end"))
	hd.Add(Wrap("text", "share of draws", "x", num(barX), "y", "14"))
	hd.Add(Wrap("text", "lose / gain", "x", num(chartW), "y", "14", "text-anchor", "end"))
	svg.Add(hd)
	n := s.Apportioned
	for i := range s.Units {
		u := &s.Units[i]
		y := chartTop + rowH*float64(i)
		g := El("g", "class", "pj-row", "data-unit", u.Name)
		g.Add(Wrap("text", u.Name+" "+strconv.Itoa(u.BaselineSeats), "x", num(labelW), "y", num(y+rowH/2+4), "text-anchor", "end", "class", "pj-name"))
		segments(g, u, n, barX, y+4, barW, rowH-8)
		g.Add(Wrap("text", format.ShareText(u.Lose, n)+" / "+format.ShareText(u.Gain, n), "x", num(chartW-2), "y", num(y+rowH/2+4), "text-anchor", "end", "class", "pj-odds"))
		svg.Add(g)
	}
	legend(svg, barX, chartTop+rowH*float64(len(s.Units))+10)
	return svg
}

// Narrow chart geometry: a header line, then each row holds a line of
// text (the unit and its seats now, its shares of losing and gaining a
// seat) above its bar.
const (
	narrowW    = 320.0
	narrowTop  = 20.0
	narrowRowH = 42.0
	narrowBarY = 19.0
	narrowBarH = 18.0
)

// narrowChart is the chart with each unit's name and seats now and its
// shares of losing and gaining a seat on a line above its bar, so that the
// bars take the chart's whole width; drawn about as wide as a phone.
func narrowChart(s *model.Summary, id, cap string) *Node {
	h := narrowTop + narrowRowH*float64(len(s.Units)) + chartFoot
	svg := El("svg", "viewBox", "0 0 "+num(narrowW)+" "+num(h), "role", "img", "aria-labelledby", id+"-chart-title-narrow "+cap, "class", "pj-svg pj-svg-narrow")
	svg.Add(Wrap("title", "Chance of each seat count, by unit", "id", id+"-chart-title-narrow"))
	hd := El("g", "class", "pj-axis")
	hd.Add(Wrap("text", "unit, seats now", "x", "2", "y", "12"))
	hd.Add(Wrap("text", "lose / gain", "x", num(narrowW-2), "y", "12", "text-anchor", "end"))
	svg.Add(hd)
	n := s.Apportioned
	for i := range s.Units {
		u := &s.Units[i]
		y := narrowTop + narrowRowH*float64(i)
		g := El("g", "class", "pj-row", "data-unit", u.Name)
		g.Add(Wrap("text", shortName(u.Name, 18)+" "+strconv.Itoa(u.BaselineSeats), "x", "2", "y", num(y+13), "class", "pj-name"))
		g.Add(Wrap("text", format.ShareText(u.Lose, n)+" / "+format.ShareText(u.Gain, n), "x", num(narrowW-2), "y", num(y+13), "text-anchor", "end", "class", "pj-odds"))
		segments(g, u, n, 2, y+narrowBarY, narrowW-4, narrowBarH)
		svg.Add(g)
	}
	legend(svg, 2, narrowTop+narrowRowH*float64(len(s.Units))+6)
	return svg
}

// shortName cuts a unit's name to at most n characters, the last an
// ellipsis when it is cut.
func shortName(name string, n int) string {
	r := []rune(name)
	if len(r) > n {
		return string(r[:n-1]) + "…"
	}
	return name
}

// num writes a coordinate with at most two decimals.
func num(f float64) string {
	return strconv.FormatFloat(math.Round(f*100)/100, 'f', -1, 64)
}
