package render

import "strings"

// Stackable marks t as a table that turns into one card a row where its
// columns no longer fit (a phone, a narrow column of someone else's page):
// every cell of its body and foot gets its column's header as data-label,
// which the stylesheet shows beside the value once the header row is out of
// sight, and the table gets the class sc-stack. A column whose header is
// visually hidden (a row's remove button) gets no label. Cells are matched
// to headers by position, so t must use no colspan.
func Stackable(t *Node) *Node {
	var labels []string
	for _, part := range t.Kids {
		if part.Tag != "thead" || len(part.Kids) == 0 {
			continue
		}
		for _, th := range part.Kids[0].Kids {
			if visuallyHidden(th) {
				labels = append(labels, "")
				continue
			}
			labels = append(labels, strings.TrimSpace(th.TextContent()))
		}
	}
	for _, part := range t.Kids {
		if part.Tag != "tbody" && part.Tag != "tfoot" {
			continue
		}
		for _, row := range part.Kids {
			for i, cell := range row.Kids {
				if i < len(labels) && labels[i] != "" && (cell.Tag == "td" || cell.Tag == "th") {
					cell.Set("data-label", labels[i])
				}
			}
		}
	}
	c, _ := t.Attr("class")
	return t.Set("class", strings.TrimSpace(c+" sc-stack"))
}

// visuallyHidden reports whether a header cell's text is for screen readers only.
func visuallyHidden(th *Node) bool {
	for _, k := range th.Kids {
		if c, _ := k.Attr("class"); c == "sc-vh" {
			return true
		}
	}
	return false
}
