package calc

import (
	"strconv"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	. "seatsmith/engine/render"
	charts "seatsmith/engine/render/chart"
)

// The sweep chart is drawn by package engine/render/chart, the same
// panels the command-line tool writes as SVG; this file lays them out in
// a figure with a legend in HTML, so that it wraps at any width.

func sweepChart(so *SweepOutcome, id string) *Node {
	set := so.Set
	first := set.First()
	top := charts.Top(set)
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
	return panel.Add(charts.Panel(m, sw, ps, vs, top))
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
			li.Add(swatch(El("line", "x1", "1", "y1", "6", "x2", "25", "y2", "6", "class", "sc-step "+charts.UnitClass(i))))
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
