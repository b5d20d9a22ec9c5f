package calc

import (
	"math"
	"strconv"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	. "seatsmith/engine/render"
)

// The sweep chart draws, for each method, a small panel with one step line
// per unit: its seats at each house size. A ring marks each Alabama
// paradox (where a unit's line steps down as the house grows), a short
// mark at the top each size with a tie, and a grey band each size the
// method cannot apportion. Every panel shares the seat scale, so the
// panels compare at a glance. Colours come from the stylesheet by class
// (sc-u0 … sc-u11, then the same colours dashed), so the chart needs no
// inline style. Floating-point numbers only place the marks.

// Panel geometry, in SVG user units. A panel is drawn about as wide as a
// phone, so that its text keeps its size there.
const (
	panelW      = 340.0
	panelH      = 214.0
	panelLeft   = 36.0
	panelRight  = 10.0
	panelTop    = 12.0
	panelBottom = 38.0
	unitColours = 12
)

// unitClass is the class of unit i's line and marks.
func unitClass(i int) string {
	c := "sc-u" + strconv.Itoa(i%unitColours)
	if d := (i / unitColours) % 4; d > 0 {
		c += " sc-dash" + strconv.Itoa(d)
	}
	return c
}

func sweepChart(so *SweepOutcome, id string) *Node {
	set := so.Set
	first := set.First()
	top := 1
	for _, sw := range set.Sweeps {
		if sw == nil {
			continue
		}
		for k := range sw.Sizes {
			for _, a := range sw.Sizes[k].Seats {
				top = max(top, a)
			}
		}
	}
	fig := El("figure", "class", "sc-sweep", "data-role", "sweep-chart", "aria-labelledby", id+"-sweep-caption")
	fig.Add(Wrap("figcaption", "Seats of each unit at every house size from "+strconv.Itoa(set.From)+" to "+strconv.Itoa(set.To)+
		", one panel a method. The tables below the lists hold the same numbers.", "id", id+"-sweep-caption", "class", "sc-sweep-caption"))
	fig.Add(sweepLegend(first, so))
	grid := El("div", "class", "sc-sweep-panels")
	for k, sw := range set.Sweeps {
		grid.Add(sweepPanel(set.Methods[k], sw, set.Paradoxes[k], so.Violations[k], set.Errors[k], top))
	}
	fig.Add(grid)
	return fig
}

func sweepPanel(m engine.Method, sw *engine.SweepResult, ps []analysis.Alabama, vs []analysis.QuotaViolation, err error, top int) *Node {
	panel := El("div", "class", "sc-sweep-panel", "data-role", "sweep-panel", "data-method", m.String())
	panel.Add(Wrap("h4", m.Name(), "class", "sc-panel-title"))
	if sw == nil {
		panel.Add(Wrap("p", "Cannot apportion any house size in this range: "+problemOf(err).Msg, "class", "sc-hint sc-panel-empty"))
		return panel
	}
	plotW := panelW - panelLeft - panelRight
	plotH := panelH - panelTop - panelBottom
	step := axisStep(float64(top), 5)
	yMax := math.Ceil(float64(top)/step) * step
	lo, hi := float64(sw.From)-0.5, float64(sw.To)+0.5
	xs := func(h float64) float64 { return panelLeft + (h-lo)/(hi-lo)*plotW }
	ys := func(a float64) float64 { return panelTop + plotH - a/yMax*(plotH-6) } // headroom for the top line

	label := m.Name() + ": seats of " + plural(len(sw.Names), "unit") + " at house sizes " + strconv.Itoa(sw.From) + " to " + strconv.Itoa(sw.To)
	switch len(ps) {
	case 0:
		label += "; no Alabama paradox"
	default:
		label += "; " + plural(len(ps), "Alabama paradox") + ", ringed"
	}
	if len(vs) > 0 {
		label += "; " + plural(len(vs), "quota violation") + ", marked by triangles"
	}
	svg := El("svg", "viewBox", "0 0 "+f1(panelW)+" "+f1(panelH), "class", "sc-svg sc-sweep-svg", "role", "img",
		"aria-label", label, "focusable", "false", "data-role", "sweep-svg")
	svg.Add(Wrap("title", label))

	svg.Add(El("rect", "x", f1(panelLeft), "y", f1(panelTop), "width", f1(plotW), "height", f1(plotH), "class", "sc-plot"))
	// Sizes the method cannot apportion, shaded.
	for k := 0; k < len(sw.Sizes); k++ {
		if sw.Sizes[k].Err == nil {
			continue
		}
		j := k
		for j+1 < len(sw.Sizes) && sw.Sizes[j+1].Err != nil {
			j++
		}
		xa, xb := xs(float64(sw.Sizes[k].House)-0.5), xs(float64(sw.Sizes[j].House)+0.5)
		svg.Add(El("rect", "x", f1(xa), "y", f1(panelTop), "width", f1(xb-xa), "height", f1(plotH), "class", "sc-refused"))
		k = j
	}
	// A pale column at each size where a unit loses a seat.
	for j := range ps {
		x := xs(float64(ps[j].To) - 0.5)
		svg.Add(El("rect", "x", f1(x), "y", f1(panelTop), "width", f1(xs(float64(ps[j].To)+0.5)-x), "height", f1(plotH), "class", "sc-paradox-band"))
	}
	axis := El("g", "class", "sc-axis")
	for v := 0.0; v <= yMax+1e-9; v += step {
		y := f1(ys(v))
		axis.Add(El("line", "x1", f1(panelLeft), "x2", f1(panelLeft+plotW), "y1", y, "y2", y, "class", "sc-grid-line"))
		axis.Add(Wrap("text", strconv.Itoa(int(v)), "x", f1(panelLeft-5), "y", f1(ys(v)+3.5), "text-anchor", "end", "class", "sc-tick"))
	}
	xstep := axisStep(float64(sw.To-sw.From), 6)
	for v := math.Ceil(float64(sw.From)/xstep) * xstep; v <= float64(sw.To)+1e-9; v += xstep {
		x := f1(xs(v))
		axis.Add(El("line", "x1", x, "x2", x, "y1", f1(panelTop+plotH), "y2", f1(panelTop+plotH+4), "class", "sc-axis-line"))
		axis.Add(Wrap("text", strconv.Itoa(int(v)), "x", x, "y", f1(panelTop+plotH+15), "text-anchor", "middle", "class", "sc-tick"))
	}
	axis.Add(Wrap("text", "house size", "x", f1(panelLeft+plotW/2), "y", f1(panelH-6), "text-anchor", "middle", "class", "sc-axis-label"))
	// Turned upright, the label's ascent reaches left of its x: 13 keeps
	// it inside at the larger text of a narrow page.
	axis.Add(Wrap("text", "seats", "x", "13", "y", f1(panelTop+plotH/2), "text-anchor", "middle", "class", "sc-axis-label",
		"transform", "rotate(-90 13 "+f1(panelTop+plotH/2)+")"))
	svg.Add(axis)
	// A short mark at the top of each size with a tie.
	for k := range sw.Sizes {
		if len(sw.Sizes[k].Ties) > 0 {
			x := f1(xs(float64(sw.Sizes[k].House)))
			svg.Add(El("line", "x1", x, "x2", x, "y1", f1(panelTop), "y2", f1(panelTop+7), "class", "sc-tie-mark"))
		}
	}
	// One step line per unit, each nudged a little so that units with
	// equal seats stay visible side by side.
	nudge := func(i int) float64 { return float64(i%5-2) * 1.3 }
	lines := El("g", "class", "sc-steps")
	for i, name := range sw.Names {
		if sw.Excluded[i] {
			continue
		}
		var d []byte
		open := false
		last := -1
		for k := range sw.Sizes {
			z := &sw.Sizes[k]
			if z.Err != nil {
				open = false
				continue
			}
			a := z.Seats[i]
			y := f1(ys(float64(a)) + nudge(i))
			xb := f1(xs(float64(z.House) + 0.5))
			switch {
			case !open:
				d = append(d, "M"+f1(xs(float64(z.House)-0.5))+" "+y+"H"+xb...)
				open = true
			case a != last:
				d = append(d, "V"+y+"H"+xb...)
			default:
				d = append(d, "H"+xb...)
			}
			last = a
		}
		if len(d) == 0 {
			continue
		}
		p := El("path", "d", string(d), "class", "sc-step "+unitClass(i), "data-sweep-unit", name)
		p.Add(Wrap("title", name))
		lines.Add(p)
	}
	svg.Add(lines)
	// Quota violations: a triangle pointing up above the upper quota, down
	// below the lower quota.
	for j := range vs {
		v := &vs[j]
		x, y := xs(float64(v.House)), ys(float64(v.Seats))+nudge(v.Unit)
		d := "M" + f1(x) + " " + f1(y-5.5) + "L" + f1(x+5) + " " + f1(y+3) + "L" + f1(x-5) + " " + f1(y+3) + "Z"
		side := "above"
		if !v.Above() {
			d = "M" + f1(x) + " " + f1(y+5.5) + "L" + f1(x+5) + " " + f1(y-3) + "L" + f1(x-5) + " " + f1(y-3) + "Z"
			side = "below"
		}
		t := El("path", "d", d, "class", "sc-off "+unitClass(v.Unit), "data-quota", side, "data-unit", v.Name, "data-house", strconv.Itoa(v.House))
		t.Add(Wrap("title", violationText(v, true)))
		svg.Add(t)
	}
	for j := range ps {
		f := &ps[j]
		c := El("circle", "cx", f1(xs(float64(f.To))), "cy", f1(ys(float64(f.After))+nudge(f.Unit)), "r", "6",
			"class", "sc-ring "+unitClass(f.Unit), "data-paradox", f.Name, "data-house", strconv.Itoa(f.To))
		c.Add(Wrap("title", f.Text()))
		svg.Add(c)
	}
	panel.Add(svg)
	return panel
}

// sweepLegend names each unit's line and the chart's marks, in HTML so
// that it wraps at any width.
func sweepLegend(sw *engine.SweepResult, so *SweepOutcome) *Node {
	ul := El("ul", "class", "sc-sweep-legend", "data-role", "legend", "aria-label", "Key to the chart")
	swatch := func(kid *Node) *Node {
		return El("svg", "viewBox", "0 0 26 12", "class", "sc-swatch", "aria-hidden", "true", "focusable", "false").Add(kid)
	}
	for i, name := range sw.Names {
		li := El("li")
		if sw.Excluded[i] {
			li.Add(Wrap("span", name+" (below the threshold: no seats)", "class", "sc-legend-text"))
		} else {
			li.Add(swatch(El("line", "x1", "1", "y1", "6", "x2", "25", "y2", "6", "class", "sc-step "+unitClass(i))))
			li.Add(Wrap("span", name, "class", "sc-legend-text"))
		}
		ul.Add(li)
	}
	al, _ := so.SweepCount()
	if al > 0 {
		ul.Add(El("li", "class", "sc-legend-mark").Add(swatch(El("circle", "cx", "13", "cy", "6", "r", "4.5", "class", "sc-ring sc-ring-key")),
			Wrap("span", "ring and pale column: a unit loses a seat as the house grows (Alabama paradox)", "class", "sc-legend-text")))
	}
	_, qv := so.SweepCount()
	if qv > 0 {
		ul.Add(El("li", "class", "sc-legend-mark").Add(
			swatch(El("g").Add(El("path", "d", "M7 1.5L11 9L3 9Z", "class", "sc-off sc-ring-key"), El("path", "d", "M19 10.5L23 3L15 3Z", "class", "sc-off sc-ring-key"))),
			Wrap("span", "triangle up: above the upper quota; down: below the lower quota", "class", "sc-legend-text")))
	}
	ties, refused := false, false
	for _, s := range so.Set.Sweeps {
		if s == nil {
			continue
		}
		for k := range s.Sizes {
			ties = ties || len(s.Sizes[k].Ties) > 0
			refused = refused || s.Sizes[k].Err != nil
		}
	}
	if ties {
		ul.Add(El("li", "class", "sc-legend-mark").Add(swatch(El("line", "x1", "13", "y1", "1", "x2", "13", "y2", "11", "class", "sc-tie-mark")),
			Wrap("span", "a tie at this house size", "class", "sc-legend-text")))
	}
	if refused {
		ul.Add(El("li", "class", "sc-legend-mark").Add(swatch(El("rect", "x", "3", "y", "1", "width", "20", "height", "10", "class", "sc-refused")),
			Wrap("span", "sizes the method cannot apportion", "class", "sc-legend-text")))
	}
	return ul
}

// axisStep is the smallest of 1, 2, 5, 10, 20, 25, 50, … that divides span
// into at most n intervals.
func axisStep(span float64, n int) float64 {
	for _, s := range []float64{1, 2, 5, 10, 20, 25, 50, 100, 200, 250, 500, 1000, 2000, 2500, 5000, 10000} {
		if span/s <= float64(n) {
			return s
		}
	}
	return math.Pow(10, math.Ceil(math.Log10(span/float64(n))))
}
