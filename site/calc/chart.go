package calc

import (
	"math"
	"strconv"

	"seatsmith/engine"
	. "seatsmith/engine/render"
)

// maxChartUnits is the most units the chart draws; beyond it the table
// alone shows the result.
const maxChartUnits = 60

// chart draws each unit's seats as a bar against its quota (a mark) and
// the band from its lower to its upper quota, twice: a wide drawing with
// the names beside the bars, and a narrow one the stylesheet shows instead
// where the calculator is narrow (a phone, a narrow column), with each
// unit's name and seats on a line above its bar so that the bars take the
// chart's whole width and every label stays inside it. Only one of the two
// is ever shown (the other is display: none, out of the accessibility tree
// too). Floating-point numbers only place the marks; they decide nothing.
func chart(r *engine.Result) *Node {
	n := len(r.Units)
	if n == 0 || n > maxChartUnits {
		return nil
	}
	fig := El("figure", "class", "sc-chart", "data-role", "chart", "tabindex", "0", "aria-label", "Chart of seats against quota")
	fig.Add(wideBars(r), narrowBars(r))
	fig.Add(Wrap("figcaption", "Bars: seats (the number at the right). Dark mark: the unit's quota. Pale band: from its lower to its upper quota; a bar that ends outside its band breaks quota."))
	return fig
}

// barsSVG starts a bar chart's svg element of the given class and size.
func barsSVG(r *engine.Result, class string, width, height float64) *Node {
	svg := El("svg", "viewBox", "0 0 "+f1(width)+" "+f1(height), "role", "img", "class", "sc-svg "+class,
		"aria-label", "Bar chart: seats of each unit under "+r.Method.Name()+", with each unit's quota marked", "focusable", "false")
	svg.Add(Wrap("title", "Seats against quota, "+r.Method.Name()))
	return svg
}

// barsScale returns the chart's tick step and the top of its scale, with
// at most maxTicks steps.
func barsScale(r *engine.Result, maxTicks float64) (step, scaleMax float64) {
	top1 := 1.0
	for _, u := range r.Units {
		top1 = math.Max(top1, math.Max(float64(u.Seats), float64(u.Upper)))
	}
	step = tickStep(top1, maxTicks)
	return step, math.Ceil(top1/step) * step
}

// barMarks adds a unit's band, bar and quota mark, the bar from x0 at
// height by, to g.
func barMarks(g *Node, u *engine.UnitResult, x func(float64) float64, x0, by, barH float64) {
	if !u.Excluded {
		lo, hi := x(float64(u.Lower)), x(float64(u.Upper))
		if hi-lo < 2 {
			hi = lo + 2
		}
		g.Add(El("rect", "x", f1(lo), "y", f1(by-3), "width", f1(hi-lo), "height", f1(barH+6), "class", "sc-band"))
	}
	cls := "sc-bar"
	if !u.MeetsQuota && !u.Excluded {
		cls = "sc-bar sc-bar-off"
	}
	if u.Seats > 0 {
		g.Add(El("rect", "x", f1(x0), "y", f1(by), "width", f1(x(float64(u.Seats))-x0), "height", f1(barH), "class", cls))
	}
	if !u.Excluded {
		qx := f1(x(u.Quota.Approx))
		g.Add(El("line", "x1", qx, "x2", qx, "y1", f1(by-4), "y2", f1(by+barH+4), "class", "sc-quota-mark"))
	}
}

// wideBars is the chart with each unit's name beside its bar and its seats
// after it.
func wideBars(r *engine.Result) *Node {
	const (
		width  = 540.0
		labelW = 140.0
		left   = labelW + 8
		right  = 30.0
		top    = 30.0
		rowH   = 26.0
		barH   = 16.0
	)
	step, scaleMax := barsScale(r, 10)
	plotW := width - left - right
	x := func(v float64) float64 { return left + v/scaleMax*plotW }
	height := top + float64(len(r.Units))*rowH + 10
	svg := barsSVG(r, "sc-bars-wide", width, height)
	axis := El("g", "class", "sc-axis")
	for v := 0.0; v <= scaleMax+1e-9; v += step {
		xx := f1(x(v))
		axis.Add(El("line", "x1", xx, "x2", xx, "y1", f1(top-6), "y2", f1(height-10), "class", "sc-grid-line"))
		axis.Add(Wrap("text", strconv.Itoa(int(v)), "x", xx, "y", f1(top-12), "text-anchor", "middle", "class", "sc-tick"))
	}
	svg.Add(axis)
	for i := range r.Units {
		u := &r.Units[i]
		y := top + float64(i)*rowH
		g := El("g", "class", "sc-bar-row", "data-chart-unit", u.Name)
		g.Add(Wrap("text", shortName(u.Name, 17), "x", f1(labelW), "y", f1(y+barH-2), "text-anchor", "end", "class", "sc-label"))
		barMarks(g, u, x, left, y, barH)
		vx := x(float64(u.Seats))
		if !u.Excluded {
			vx = math.Max(vx, math.Max(x(float64(u.Upper)), x(u.Quota.Approx)+2))
		}
		g.Add(Wrap("text", strconv.Itoa(u.Seats), "x", f1(vx+6), "y", f1(y+barH-2), "class", "sc-value"))
		svg.Add(g)
	}
	return svg
}

// narrowBars is the chart with each unit's name and seats on a line above
// its bar, drawn about as wide as a phone; it scales with its box.
func narrowBars(r *engine.Result) *Node {
	const (
		width = 360.0
		left  = 8.0
		right = 12.0
		top   = 24.0
		rowH  = 42.0
		// Within a row: the baseline of the name and seats, then the bar.
		labelY = 13.0
		barY   = 20.0
		barH   = 14.0
	)
	step, scaleMax := barsScale(r, 7)
	plotW := width - left - right
	x := func(v float64) float64 { return left + v/scaleMax*plotW }
	height := top + float64(len(r.Units))*rowH + 4
	svg := barsSVG(r, "sc-bars sc-bars-narrow", width, height)
	axis := El("g", "class", "sc-axis")
	for v := 0.0; v <= scaleMax+1e-9; v += step {
		xx := f1(x(v))
		axis.Add(El("line", "x1", xx, "x2", xx, "y1", f1(top-4), "y2", f1(height-2), "class", "sc-grid-line"))
		// The end ticks are anchored inward so that they stay inside.
		anchor := "middle"
		switch {
		case v == 0:
			anchor = "start"
		case v+step > scaleMax+1e-9:
			anchor = "end"
		}
		axis.Add(Wrap("text", strconv.Itoa(int(v)), "x", xx, "y", f1(top-9), "text-anchor", anchor, "class", "sc-tick"))
	}
	svg.Add(axis)
	for i := range r.Units {
		u := &r.Units[i]
		y := top + float64(i)*rowH
		g := El("g", "class", "sc-bar-row", "data-chart-unit", u.Name)
		// Labels keep 2 units from the edges: their halo is that wide.
		g.Add(Wrap("text", shortName(u.Name, 28), "x", "2", "y", f1(y+labelY), "class", "sc-label"))
		g.Add(Wrap("text", strconv.Itoa(u.Seats), "x", f1(width-2), "y", f1(y+labelY), "text-anchor", "end", "class", "sc-value"))
		barMarks(g, u, x, left, y+barY, barH)
		svg.Add(g)
	}
	return svg
}

// tickStep returns a round step that divides 0..max into at most n steps
// (n of at least 5).
func tickStep(max, n float64) float64 {
	for _, s := range []float64{1, 2, 5, 10, 20, 25, 50, 100, 200, 250, 500, 1000, 2000, 5000, 10000} {
		if max/s <= n {
			return s
		}
	}
	return math.Pow(10, math.Ceil(math.Log10(max/n)))
}

// shortName cuts a unit's name to at most n characters, the last an
// ellipsis when it is cut.
func shortName(s string, n int) string {
	r := []rune(s)
	if len(r) > n {
		return string(r[:n-1]) + "…"
	}
	return s
}

func f1(v float64) string { return strconv.FormatFloat(v, 'f', 1, 64) }
