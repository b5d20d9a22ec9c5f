package report

import (
	"math"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
)

// The sweep chart is a hand-written SVG document: for each method a panel
// with one step line per unit (its seats at each house size), rings where a
// unit loses a seat as the house grows (the Alabama paradox), marks at the
// sizes with a tie, and shaded sizes the method cannot apportion. It uses no
// script, no external style and no ids, so several charts can sit inline
// in one page.

// Chart geometry, in SVG user units.
const (
	chartWidth  = 800
	chartLeft   = 56  // room for the seat axis
	chartRight  = 190 // room for the legend
	chartTop    = 44  // panel heading
	chartBottom = 46  // house-size axis
	legendRow   = 16
)

// chartColors are the unit colours, in order; past the last the colours
// repeat with a dash pattern.
var chartColors = []string{
	"#1b6f8a", "#c2571a", "#5a4fa3", "#3f8f3a", "#b02e4c", "#8a6d1b",
	"#2a4d8f", "#7a3f8f", "#d0608a", "#a3441b", "#556b2f", "#6b4f3a",
}

var chartDashes = []string{"", "6 3", "2 3", "8 3 2 3"}

// SweepChart draws the set as an SVG step chart, one panel per method that
// could apportion some size in the range. Every text is escaped.
func SweepChart(title string, set *SweepSet) string {
	var panels []string
	y := 0.0
	if title == "" {
		title = "Seats by house size"
	}
	var body strings.Builder
	titleH := 30.0
	y = titleH
	for k, sw := range set.Sweeps {
		if sw == nil {
			continue
		}
		p, h := chartPanel(sw, set.Paradoxes[k], y)
		panels = append(panels, p)
		y += h
	}
	if len(panels) == 0 {
		y += 30
		body.WriteString(svgText(chartLeft, y-10, "No method can apportion any house size in this range.", "start", 13, "#222"))
	}
	for _, p := range panels {
		body.WriteString(p)
	}
	lines := strings.Split(Wrap(Caution, 120), "\n")
	capY := y + 18
	for i, l := range lines {
		body.WriteString(svgText(12, capY+float64(i)*14, l, "start", 11, "#444"))
	}
	height := capY + float64(len(lines))*14 + 8
	var b strings.Builder
	b.WriteString(`<svg xmlns="http://www.w3.org/2000/svg" role="img" width="` + num(chartWidth) + `" height="` + num(height) +
		`" viewBox="0 0 ` + num(chartWidth) + " " + num(height) + `" font-family="sans-serif">`)
	b.WriteString("<title>" + xmlEscape(title) + "</title>")
	b.WriteString("<desc>" + xmlEscape("Step chart of each unit's seats for house sizes "+strconv.Itoa(set.From)+" to "+
		strconv.Itoa(set.To)+". "+Caution) + "</desc>")
	b.WriteString(`<rect x="0" y="0" width="` + num(chartWidth) + `" height="` + num(height) + `" fill="#ffffff"/>`)
	b.WriteString(svgText(12, 20, title, "start", 16, "#111"))
	b.WriteString(body.String())
	b.WriteString("</svg>\n")
	return b.String()
}

// chartPanel draws one sweep starting at vertical offset top and returns
// the SVG and the panel's height.
func chartPanel(sw *engine.SweepResult, ps []analysis.Alabama, top float64) (string, float64) {
	n := len(sw.Names)
	plotH := math.Max(200, float64(n)*legendRow+24)
	plotW := float64(chartWidth - chartLeft - chartRight)
	x0, y0 := float64(chartLeft), top+chartTop
	maxSeats := 1
	for k := range sw.Sizes {
		for _, a := range sw.Sizes[k].Seats {
			maxSeats = max(maxSeats, a)
		}
	}
	lo, hi := float64(sw.From)-0.5, float64(sw.To)+0.5
	xs := func(h float64) float64 { return x0 + (h-lo)/(hi-lo)*plotW }
	ys := func(a float64) float64 { return y0 + plotH - a/float64(maxSeats)*plotH }
	var b strings.Builder
	b.WriteString("<g>")
	b.WriteString(svgText(x0, top+26, sw.Method.Name(), "start", 14, "#111"))
	b.WriteString(`<rect x="` + num(x0) + `" y="` + num(y0) + `" width="` + num(plotW) + `" height="` + num(plotH) +
		`" fill="#fafafa" stroke="#bbbbbb" stroke-width="1"/>`)
	// Refused sizes, shaded.
	for k := range sw.Sizes {
		z := &sw.Sizes[k]
		if z.Err == nil {
			continue
		}
		j := k
		for j+1 < len(sw.Sizes) && sw.Sizes[j+1].Err != nil {
			j++
		}
		if k > 0 && sw.Sizes[k-1].Err != nil {
			continue
		}
		xa, xb := xs(float64(z.House)-0.5), xs(float64(sw.Sizes[j].House)+0.5)
		b.WriteString(`<rect x="` + num(xa) + `" y="` + num(y0) + `" width="` + num(xb-xa) + `" height="` + num(plotH) + `" fill="#e4e4e4"/>`)
	}
	// Grid and axes.
	for _, t := range ticks(0, float64(maxSeats)) {
		yy := ys(t)
		b.WriteString(`<line x1="` + num(x0) + `" y1="` + num(yy) + `" x2="` + num(x0+plotW) + `" y2="` + num(yy) + `" stroke="#e0e0e0" stroke-width="1"/>`)
		b.WriteString(svgText(x0-6, yy+4, strconv.Itoa(int(t)), "end", 11, "#333"))
	}
	for _, t := range ticks(float64(sw.From), float64(sw.To)) {
		xx := xs(t)
		b.WriteString(`<line x1="` + num(xx) + `" y1="` + num(y0+plotH) + `" x2="` + num(xx) + `" y2="` + num(y0+plotH+5) + `" stroke="#333" stroke-width="1"/>`)
		b.WriteString(svgText(xx, y0+plotH+18, strconv.Itoa(int(t)), "middle", 11, "#333"))
	}
	b.WriteString(svgText(x0+plotW/2, y0+plotH+36, "house size", "middle", 12, "#333"))
	b.WriteString(`<text x="14" y="` + num(y0+plotH/2) + `" transform="rotate(-90 14 ` + num(y0+plotH/2) +
		`)" text-anchor="middle" font-size="12" fill="#333">seats</text>`)
	// Ties: a short mark above the plot at each size with a tie.
	for k := range sw.Sizes {
		if len(sw.Sizes[k].Ties) > 0 {
			xx := xs(float64(sw.Sizes[k].House))
			b.WriteString(`<line x1="` + num(xx) + `" y1="` + num(y0-6) + `" x2="` + num(xx) + `" y2="` + num(y0) + `" stroke="#b00020" stroke-width="1.5"/>`)
		}
	}
	// One step line per unit, each nudged a little up or down so that
	// units with equal seats stay visible side by side.
	for i := 0; i < n; i++ {
		nudge := float64(i%5-2) * 1.2
		ys := func(a float64) float64 { return ys(a) + nudge }
		var d strings.Builder
		open := false
		last := -1
		for k := range sw.Sizes {
			z := &sw.Sizes[k]
			if z.Err != nil {
				open = false
				continue
			}
			a := z.Seats[i]
			xa, xb := xs(float64(z.House)-0.5), xs(float64(z.House)+0.5)
			switch {
			case !open:
				d.WriteString("M" + num(xa) + " " + num(ys(float64(a))) + "H" + num(xb))
				open = true
			case a != last:
				d.WriteString("V" + num(ys(float64(a))) + "H" + num(xb))
			default:
				d.WriteString("H" + num(xb))
			}
			last = a
		}
		color, dash := unitStyle(i)
		b.WriteString(`<path d="` + d.String() + `" fill="none" stroke="` + color + `" stroke-width="1.6"`)
		if dash != "" {
			b.WriteString(` stroke-dasharray="` + dash + `"`)
		}
		b.WriteString(`><title>` + xmlEscape(sw.Names[i]) + `</title></path>`)
	}
	// Alabama paradoxes: a ring where the unit's seats fall.
	for j := range ps {
		f := &ps[j]
		color, _ := unitStyle(f.Unit)
		b.WriteString(`<circle cx="` + num(xs(float64(f.To))) + `" cy="` + num(ys(float64(f.After))) + `" r="4.5" fill="#ffffff" stroke="` +
			color + `" stroke-width="2"><title>` + xmlEscape(f.Text()) + `</title></circle>`)
	}
	// Legend.
	lx := x0 + plotW + 16
	for i := 0; i < n; i++ {
		ly := y0 + 8 + float64(i)*legendRow
		color, dash := unitStyle(i)
		b.WriteString(`<line x1="` + num(lx) + `" y1="` + num(ly) + `" x2="` + num(lx+22) + `" y2="` + num(ly) + `" stroke="` + color + `" stroke-width="2.5"`)
		if dash != "" {
			b.WriteString(` stroke-dasharray="` + dash + `"`)
		}
		b.WriteString("/>")
		b.WriteString(svgText(lx+28, ly+4, clip(sw.Names[i], 22), "start", 11, "#222"))
	}
	notes := []string{}
	if len(ps) > 0 {
		notes = append(notes, "○ a unit loses a seat as the house grows (Alabama paradox)")
	}
	for k := range sw.Sizes {
		if len(sw.Sizes[k].Ties) > 0 {
			notes = append(notes, "red marks above: sizes with a tie")
			break
		}
	}
	for k := range sw.Sizes {
		if sw.Sizes[k].Err != nil {
			notes = append(notes, "grey: sizes this method cannot apportion")
			break
		}
	}
	ny := y0 + plotH + chartBottom + 4
	for _, s := range notes {
		b.WriteString(svgText(x0, ny, s, "start", 11, "#333"))
		ny += 14
	}
	b.WriteString("</g>")
	return b.String(), chartTop + plotH + chartBottom + float64(len(notes))*14 + 12
}

func unitStyle(i int) (color, dash string) {
	return chartColors[i%len(chartColors)], chartDashes[(i/len(chartColors))%len(chartDashes)]
}

// ticks returns round values from lo to hi, about five of them, on whole
// numbers.
func ticks(lo, hi float64) []float64 {
	span := hi - lo
	if span <= 0 {
		return []float64{lo}
	}
	// The smallest of 1, 2, 5, 10, 20, 50, ... that gives at most six
	// intervals.
	step, k := 1.0, 0
	for span/step > 6 {
		k++
		step = []float64{1, 2, 5}[k%3] * math.Pow(10, float64(k/3))
	}
	var out []float64
	for t := math.Ceil(lo/step) * step; t <= hi+1e-9; t += step {
		out = append(out, t)
	}
	return out
}

func clip(s string, n int) string {
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	return string(r[:n-1]) + "…"
}

func svgText(x, y float64, s, anchor string, size int, fill string) string {
	return `<text x="` + num(x) + `" y="` + num(y) + `" text-anchor="` + anchor + `" font-size="` + strconv.Itoa(size) +
		`" fill="` + fill + `">` + xmlEscape(s) + "</text>"
}

func num(f float64) string {
	s := strconv.FormatFloat(f, 'f', 1, 64)
	return strings.TrimSuffix(s, ".0")
}

// xmlEscape escapes text for SVG character data and attribute values.
func xmlEscape(s string) string {
	var b strings.Builder
	for _, r := range s {
		switch r {
		case '&':
			b.WriteString("&amp;")
		case '<':
			b.WriteString("&lt;")
		case '>':
			b.WriteString("&gt;")
		case '"':
			b.WriteString("&quot;")
		case '\'':
			b.WriteString("&#39;")
		default:
			if r < 0x20 && r != '\t' && r != '\n' || r == 0xFFFE || r == 0xFFFF {
				b.WriteRune(0xFFFD) // not allowed in XML
				continue
			}
			b.WriteRune(r)
		}
	}
	return b.String()
}
