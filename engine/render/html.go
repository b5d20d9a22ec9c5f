package render

import "strings"

// voidElements have no end tag in HTML.
var voidElements = map[string]bool{
	"area": true, "br": true, "col": true, "hr": true, "img": true,
	"input": true, "link": true, "meta": true, "source": true, "wbr": true,
}

// Allowed reports whether tag is one of the elements this package writes.
// The browser side refuses any other tag.
func Allowed(tag string) bool { return allowed[tag] }

var allowed = map[string]bool{}

func init() {
	for _, t := range strings.Fields(`a abbr button caption code col colgroup dd details div dl dt em fieldset
		figcaption figure form h2 h3 h4 input label legend li ol optgroup option output p section select
		small span strong summary table tbody td textarea tfoot th thead tr ul br hr mark b i sup sub
		svg g rect line text title desc path circle tspan`) {
		allowed[t] = true
	}
}

// HTML returns n written as HTML. Text and attribute values are escaped.
func HTML(n *Node) string {
	var b strings.Builder
	WriteHTML(&b, n)
	return b.String()
}

// WriteHTML writes n as HTML to b.
func WriteHTML(b *strings.Builder, n *Node) {
	writeNode(b, n, false, false)
}

// writeNode writes n as HTML, or as XML when xml is set (the SVG writer):
// inside <svg>, and everywhere in XML, an element without children is
// closed with "/>"; elsewhere in HTML void elements have no end tag.
func writeNode(b *strings.Builder, n *Node, inSVG, xml bool) {
	escape := escapeHTML
	if xml {
		escape = escapeXML
	}
	if n.Tag == "" {
		escape(b, n.Text, false)
		return
	}
	svg := inSVG || xml || n.Tag == "svg"
	b.WriteByte('<')
	b.WriteString(n.Tag)
	for _, a := range n.Attrs {
		b.WriteByte(' ')
		b.WriteString(a.Key)
		b.WriteString(`="`)
		escape(b, a.Val, true)
		b.WriteByte('"')
	}
	if svg && len(n.Kids) == 0 {
		b.WriteString("/>")
		return
	}
	b.WriteByte('>')
	if !svg && voidElements[n.Tag] {
		return
	}
	for _, k := range n.Kids {
		writeNode(b, k, svg, xml)
	}
	b.WriteString("</")
	b.WriteString(n.Tag)
	b.WriteByte('>')
}

// escapeHTML writes s escaped for HTML text, or for an attribute value
// in double quotes.
func escapeHTML(b *strings.Builder, s string, attr bool) {
	for i := 0; i < len(s); i++ {
		switch c := s[i]; {
		case c == '&':
			b.WriteString("&amp;")
		case c == '<':
			b.WriteString("&lt;")
		case c == '>':
			b.WriteString("&gt;")
		case c == '"' && attr:
			b.WriteString("&#34;")
		case c == '\'' && attr:
			b.WriteString("&#39;")
		default:
			b.WriteByte(c)
		}
	}
}
