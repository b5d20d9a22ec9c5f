package chart

import (
	"strconv"
	"strings"

	"seatsmith/engine/analysis"
	"seatsmith/engine/render"
)

// Style holds, for a chart standing alone (a file written by the
// command-line tool), the rules the site's stylesheet gives the chart's
// classes, with its colours written out.
const Style = `.sc-plot { fill: #fafbfc; stroke: #c4cad2; stroke-width: 1; }
.sc-refused { fill: #e4e6ea; }
.sc-paradox-band { fill: #fbe3df; }
.sc-grid-line { stroke: #e6e8eb; stroke-width: 1; }
.sc-axis-line { stroke: #6b7684; stroke-width: 1; }
.sc-tick, .sc-axis-label, .sc-key { font: 11px sans-serif; fill: #4a5666; }
.sc-axis-label, .sc-key { fill: #1b2430; }
.sc-heading { font: bold 14px sans-serif; fill: #1b2430; }
.sc-chart-title { font: bold 16px sans-serif; fill: #1b2430; }
.sc-caution { font: 11px sans-serif; fill: #4a5666; }
.sc-step { fill: none; stroke-width: 2; stroke-linejoin: round; }
.sc-ring { fill: #fff; stroke-width: 2.5; }
.sc-off { fill: #fff; stroke-width: 2; stroke-linejoin: round; }
.sc-ring-key { stroke: #1b2430; }
.sc-tie-mark { stroke: #9b1c1c; stroke-width: 2; }
.sc-swatch .sc-step { stroke-width: 3; }
.sc-u0 { stroke: #1b6f8a; } .sc-u1 { stroke: #c2571a; } .sc-u2 { stroke: #5a4fa3; } .sc-u3 { stroke: #3f8f3a; }
.sc-u4 { stroke: #b02e4c; } .sc-u5 { stroke: #8a6d1b; } .sc-u6 { stroke: #2a4d8f; } .sc-u7 { stroke: #7a3f8f; }
.sc-u8 { stroke: #d0608a; } .sc-u9 { stroke: #a3441b; } .sc-u10 { stroke: #556b2f; } .sc-u11 { stroke: #6b4f3a; }
.sc-dash1 { stroke-dasharray: 6 3; } .sc-dash2 { stroke-dasharray: 2 3; } .sc-dash3 { stroke-dasharray: 8 3 2 3; }
`

// The standalone chart's layout, in SVG user units.
const (
	margin   = 16.0
	gap      = 24.0
	headRoom = 22.0 // a panel's heading above it
	keyRow   = 18.0
	keyWidth = 170.0
	lineRoom = 14.0
)

// Sweep draws the sweeps of set as one standalone <svg> document: the
// title, a key to the units' lines and the marks, one panel a method in
// two columns (each drawn by [Panel], the pages' panel), and the caution,
// given in lines (it is also the document's description). render.SVG
// writes it as a file.
func Sweep(title string, set *analysis.SweepSet, caution []string) *render.Node {
	cols := 1
	if len(set.Methods) > 1 {
		cols = 2
	}
	width := 2*margin + float64(cols)*PanelWidth + float64(cols-1)*gap
	body := render.El("g")
	y := margin + 16
	body.Add(render.Wrap("text", title, "x", f1(margin), "y", f1(y), "class", "sc-chart-title"))
	y += 12

	// The key: one entry a unit, then the marks that occur.
	var keys []*render.Node
	first := set.First()
	if first != nil {
		for i, name := range first.Names {
			k := render.El("g")
			if first.Excluded[i] {
				k.Add(render.Wrap("text", clip(name, 18)+" (below the threshold)", "x", "0", "y", "4", "class", "sc-key"))
			} else {
				k.Add(render.El("line", "x1", "0", "y1", "0", "x2", "22", "y2", "0", "class", "sc-step "+UnitClass(i)))
				k.Add(render.Wrap("text", clip(name, 22), "x", "28", "y", "4", "class", "sc-key"))
			}
			keys = append(keys, k)
		}
	}
	al, qv, ties, refused := 0, 0, false, false
	for k, sw := range set.Sweeps {
		if sw == nil {
			continue
		}
		al += len(set.Paradoxes[k])
		qv += len(set.Violations(k))
		for j := range sw.Sizes {
			ties = ties || len(sw.Sizes[j].Ties) > 0
			refused = refused || sw.Sizes[j].Err != nil
		}
	}
	var marks []*render.Node
	mark := func(shape *render.Node, text string) {
		marks = append(marks, render.El("g").Add(shape, render.Wrap("text", text, "x", "28", "y", "4", "class", "sc-key")))
	}
	if al > 0 {
		mark(render.El("circle", "cx", "11", "cy", "0", "r", "4.5", "class", "sc-ring sc-ring-key"), "ring: a unit loses a seat as the house grows (Alabama paradox)")
	}
	if qv > 0 {
		mark(render.El("g").Add(render.El("path", "d", "M5 -4.5L9 3L1 3Z", "class", "sc-off sc-ring-key"), render.El("path", "d", "M17 4.5L21 -3L13 -3Z", "class", "sc-off sc-ring-key")),
			"triangle up: above the upper quota; down: below the lower quota")
	}
	if ties {
		mark(render.El("line", "x1", "11", "y1", "-5", "x2", "11", "y2", "5", "class", "sc-tie-mark"), "mark at the top: a tie at this house size")
	}
	if refused {
		mark(render.El("rect", "x", "1", "y", "-5", "width", "20", "height", "10", "class", "sc-refused"), "grey: sizes the method cannot apportion")
	}
	perRow := int((width - 2*margin) / keyWidth)
	for i, k := range keys {
		x := margin + float64(i%perRow)*keyWidth
		body.Add(k.Set("transform", "translate("+f1(x)+" "+f1(y+keyRow*float64(i/perRow)+8)+")"))
	}
	if len(keys) > 0 {
		y += keyRow*float64((len(keys)+perRow-1)/perRow) + 8
	}
	for _, k := range marks {
		body.Add(k.Set("transform", "translate("+f1(margin)+" "+f1(y+8)+")"))
		y += keyRow
	}
	y += gap / 2

	// The panels.
	top := Top(set)
	col := 0
	for k, m := range set.Methods {
		x := margin + float64(col)*(PanelWidth+gap)
		body.Add(render.Wrap("text", m.Name(), "x", f1(x), "y", f1(y+14), "class", "sc-heading"))
		sw := set.Sweeps[k]
		if sw == nil {
			body.Add(render.Wrap("text", clip("Cannot apportion any house size in this range: "+errText(set.Errors[k]), 60),
				"x", f1(x), "y", f1(y+headRoom+16), "class", "sc-key"))
		} else {
			p := Panel(m, sw, set.Paradoxes[k], set.Violations(k), top)
			p.Set("x", f1(x)).Set("y", f1(y+headRoom)).Set("width", f1(PanelWidth)).Set("height", f1(PanelHeight))
			body.Add(p)
		}
		col++
		if col == cols {
			col = 0
			y += headRoom + PanelHeight + gap
		}
	}
	if col > 0 {
		y += headRoom + PanelHeight + gap
	}
	for _, l := range caution {
		body.Add(render.Wrap("text", l, "x", f1(margin), "y", f1(y), "class", "sc-caution"))
		y += lineRoom
	}
	height := y + margin - lineRoom/2
	svg := render.El("svg", "xmlns", "http://www.w3.org/2000/svg", "width", f1(width), "height", f1(height),
		"viewBox", "0 0 "+f1(width)+" "+f1(height), "role", "img")
	svg.Add(render.Wrap("title", title))
	svg.Add(render.Wrap("desc", "Step chart of each unit's seats at every house size from "+strconv.Itoa(set.From)+" to "+strconv.Itoa(set.To)+
		", one panel a method. "+strings.Join(caution, " ")))
	svg.Add(render.Wrap("style", Style))
	svg.Add(render.El("rect", "x", "0", "y", "0", "width", f1(width), "height", f1(height), "fill", "#ffffff"))
	return svg.Add(body)
}

func clip(s string, n int) string {
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	return string(r[:n-1]) + "…"
}

func errText(err error) string {
	if err == nil {
		return ""
	}
	return err.Error()
}
