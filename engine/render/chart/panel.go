package chart

import (
	"math"
	"strconv"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/render"
)

// Panel geometry, in SVG user units. A panel is drawn about as wide as a
// phone, so that its text keeps its size there.
const (
	PanelWidth  = 340.0
	PanelHeight = 214.0
	panelLeft   = 36.0
	panelRight  = 10.0
	panelTop    = 12.0
	panelBottom = 38.0
	unitColours = 12
)

// UnitClass is the class of unit i's line and marks: its colour, and past
// the twelfth colour a dash pattern.
func UnitClass(i int) string {
	c := "sc-u" + strconv.Itoa(i%unitColours)
	if d := (i / unitColours) % 4; d > 0 {
		c += " sc-dash" + strconv.Itoa(d)
	}
	return c
}

// Top is the most seats any unit holds at any size of any sweep of the
// set (at least 1): the panels share it as their scale, so that they
// compare at a glance.
func Top(set *analysis.SweepSet) int {
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
	return top
}

// Panel draws one method's sweep sw as an <svg> element, with its Alabama
// paradoxes ps and quota violations vs, on a scale of top seats.
func Panel(m engine.Method, sw *engine.SweepResult, ps []analysis.Alabama, vs []analysis.QuotaViolation, top int) *render.Node {
	plotW := PanelWidth - panelLeft - panelRight
	plotH := PanelHeight - panelTop - panelBottom
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
	if n := len(analysis.UnsettledSizes(sw)); n > 0 {
		label += "; " + plural(n, "house size") + " where a tie leaves seats unassigned, marked at the top"
	}
	svg := render.El("svg", "viewBox", "0 0 "+f1(PanelWidth)+" "+f1(PanelHeight), "class", "sc-svg sc-sweep-svg", "role", "img",
		"aria-label", label, "focusable", "false", "data-role", "sweep-svg")
	svg.Add(render.Wrap("title", label))

	svg.Add(render.El("rect", "x", f1(panelLeft), "y", f1(panelTop), "width", f1(plotW), "height", f1(plotH), "class", "sc-plot"))
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
		svg.Add(render.El("rect", "x", f1(xa), "y", f1(panelTop), "width", f1(xb-xa), "height", f1(plotH), "class", "sc-refused"))
		k = j
	}
	// A pale column at each size where a unit loses a seat.
	for j := range ps {
		x := xs(float64(ps[j].To) - 0.5)
		svg.Add(render.El("rect", "x", f1(x), "y", f1(panelTop), "width", f1(xs(float64(ps[j].To)+0.5)-x), "height", f1(plotH), "class", "sc-paradox-band"))
	}
	axis := render.El("g", "class", "sc-axis")
	for v := 0.0; v <= yMax+1e-9; v += step {
		y := f1(ys(v))
		axis.Add(render.El("line", "x1", f1(panelLeft), "x2", f1(panelLeft+plotW), "y1", y, "y2", y, "class", "sc-grid-line"))
		axis.Add(render.Wrap("text", strconv.Itoa(int(v)), "x", f1(panelLeft-5), "y", f1(ys(v)+3.5), "text-anchor", "end", "class", "sc-tick"))
	}
	xstep := axisStep(float64(sw.To-sw.From), 6)
	for v := math.Ceil(float64(sw.From)/xstep) * xstep; v <= float64(sw.To)+1e-9; v += xstep {
		x := f1(xs(v))
		axis.Add(render.El("line", "x1", x, "x2", x, "y1", f1(panelTop+plotH), "y2", f1(panelTop+plotH+4), "class", "sc-axis-line"))
		axis.Add(render.Wrap("text", strconv.Itoa(int(v)), "x", x, "y", f1(panelTop+plotH+15), "text-anchor", "middle", "class", "sc-tick"))
	}
	axis.Add(render.Wrap("text", "house size", "x", f1(panelLeft+plotW/2), "y", f1(PanelHeight-6), "text-anchor", "middle", "class", "sc-axis-label"))
	// Turned upright, the label's ascent reaches left of its x: 13 keeps
	// it inside at the larger text of a narrow page.
	axis.Add(render.Wrap("text", "seats", "x", "13", "y", f1(panelTop+plotH/2), "text-anchor", "middle", "class", "sc-axis-label",
		"transform", "rotate(-90 13 "+f1(panelTop+plotH/2)+")"))
	svg.Add(axis)
	// A short mark at the top of each size with a tie.
	for k := range sw.Sizes {
		if len(sw.Sizes[k].Ties) > 0 {
			x := f1(xs(float64(sw.Sizes[k].House)))
			svg.Add(render.El("line", "x1", x, "x2", x, "y1", f1(panelTop), "y2", f1(panelTop+7), "class", "sc-tie-mark"))
		}
	}
	// One step line per unit, each nudged a little so that units with
	// equal seats stay visible side by side.
	nudge := func(i int) float64 { return float64(i%5-2) * 1.3 }
	lines := render.El("g", "class", "sc-steps")
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
		p := render.El("path", "d", string(d), "class", "sc-step "+UnitClass(i), "data-sweep-unit", name)
		p.Add(render.Wrap("title", name))
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
		t := render.El("path", "d", d, "class", "sc-off "+UnitClass(v.Unit), "data-quota", side, "data-unit", v.Name, "data-house", strconv.Itoa(v.House))
		t.Add(render.Wrap("title", v.SizeText(true)))
		svg.Add(t)
	}
	for j := range ps {
		f := &ps[j]
		c := render.El("circle", "cx", f1(xs(float64(f.To))), "cy", f1(ys(float64(f.After))+nudge(f.Unit)), "r", "6",
			"class", "sc-ring "+UnitClass(f.Unit), "data-paradox", f.Name, "data-house", strconv.Itoa(f.To))
		c.Add(render.Wrap("title", f.Text()))
		svg.Add(c)
	}
	return svg
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

func f1(v float64) string { return strconv.FormatFloat(v, 'f', 1, 64) }

func plural(n int, w string) string {
	if n == 1 {
		return "1 " + w
	}
	if w[len(w)-1] == 'x' || w[len(w)-1] == 's' {
		return strconv.Itoa(n) + " " + w + "es"
	}
	return strconv.Itoa(n) + " " + w + "s"
}
