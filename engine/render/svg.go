package render

import (
	"strings"
	"unicode/utf8"
)

// SVG returns n, an <svg> element with its xmlns attribute, written as a
// standalone SVG file: an XML declaration, then every element in XML form
// (empty elements closed with "/>"), text and attribute values escaped,
// and characters XML does not allow (control characters, invalid UTF-8)
// written as U+FFFD.
func SVG(n *Node) string {
	var b strings.Builder
	b.WriteString(`<?xml version="1.0" encoding="UTF-8"?>` + "\n")
	writeNode(&b, n, true, true)
	b.WriteByte('\n')
	return b.String()
}

// escapeXML writes s escaped for XML character data, or for an attribute
// value in double quotes.
func escapeXML(b *strings.Builder, s string, attr bool) {
	for i := 0; i < len(s); {
		r, size := utf8.DecodeRuneInString(s[i:])
		i += size
		switch {
		case r == '&':
			b.WriteString("&amp;")
		case r == '<':
			b.WriteString("&lt;")
		case r == '>':
			b.WriteString("&gt;")
		case r == '"' && attr:
			b.WriteString("&#34;")
		case r == '\'' && attr:
			b.WriteString("&#39;")
		case r == utf8.RuneError && size == 1, r < 0x20 && r != '\t' && r != '\n' && r != '\r', r == 0xFFFE, r == 0xFFFF:
			b.WriteRune(utf8.RuneError)
		default:
			b.WriteRune(r)
		}
	}
}
