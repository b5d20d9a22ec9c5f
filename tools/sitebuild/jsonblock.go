package main

import (
	"errors"
	"regexp"
	"strings"

	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
)

// A jsonBlock is a block of a page source that the build prerenders: a
// <div> opened as its kind's pattern matches, holding only one
// <script type="application/json"> element with its document.
type jsonBlock struct {
	ID         string
	Line       int // the line of the <div
	Start, End int // byte offsets of the whole <div>…</div>
	Doc        *jsondoc.Value
}

// scanJSONBlocks finds every block that open matches in a page source and
// parses its document (with the page's line numbers). what names the kind
// in messages ("projection", "election"). Every block needs an id of its
// own; a mistake is an *input.Error naming the page, line and field.
func scanJSONBlocks(file, src string, open *regexp.Regexp, what string) ([]jsonBlock, error) {
	var out []jsonBlock
	ids := map[string]bool{}
	a := "a " + what + " block"
	if strings.IndexAny(what[:1], "aeiou") == 0 {
		a = "an " + what + " block"
	}
	for _, loc := range open.FindAllStringIndex(src, -1) {
		line := lineAt(src, loc[0])
		fail := func(field, msg string) error { return &input.Error{File: file, Line: line, Field: field, Msg: msg} }
		b := jsonBlock{Line: line, Start: loc[0]}
		for _, m := range attrRe.FindAllStringSubmatch(src[loc[0]+4:loc[1]-1], -1) {
			switch m[1] {
			case "id":
				b.ID = m[2] + m[3]
			case "data-state":
				return nil, fail("data-state", "the build sets data-state; leave it out of the page source")
			}
		}
		if !idRe.MatchString(b.ID) || ids[b.ID] {
			return nil, fail("id", a+" needs an id of its own on the page (a letter, then letters, digits, - or _)")
		}
		ids[b.ID] = true
		st := scriptTag.FindStringIndex(src[loc[1]:])
		if st == nil {
			return nil, fail("script", a+` holds one <script type="application/json"> element with its document`)
		}
		bodyStart := loc[1] + st[1]
		end := strings.Index(src[bodyStart:], "</script>")
		if end < 0 {
			return nil, fail("script", "the block's <script> element is never closed")
		}
		after := bodyStart + end + len("</script>")
		cd := closeDiv.FindStringIndex(src[after:])
		if cd == nil {
			return nil, &input.Error{File: file, Line: lineAt(src, after), Field: "div", Msg: a + " holds only its <script> element; close the <div> right after it"}
		}
		b.End = after + cd[1]
		jsonLine := lineAt(src, bodyStart)
		v, err := jsondoc.Parse([]byte(strings.Repeat("\n", jsonLine-1) + src[bodyStart:bodyStart+end]))
		if err != nil {
			var se *jsondoc.SyntaxError
			if errors.As(err, &se) {
				return nil, &input.Error{File: file, Line: se.Line, Msg: "the " + what + " block's JSON is malformed: " + se.Msg}
			}
			return nil, fail("", err.Error())
		}
		b.Doc = v
		out = append(out, b)
	}
	return out, nil
}

// blockJSON is a block's document as the prerendered page carries it: the
// markup goes into the page template's text, so no "{{" may stay, and the
// JSON may not close its element.
func blockJSON(v *jsondoc.Value) string {
	js := string(jsondoc.Marshal(v))
	return strings.ReplaceAll(strings.ReplaceAll(js, "</", `<\/`), "{{", `{\u007b`)
}

// spliceBlocks puts each block's prerendered markup in place of its source
// in src, keeping the page's line count so that later messages name the
// right lines.
func spliceBlocks(src string, blocks []jsonBlock, html []string) string {
	var out strings.Builder
	last := 0
	for i, b := range blocks {
		out.WriteString(src[last:b.Start])
		out.WriteString(strings.ReplaceAll(html[i], "{{", "{&#123;"))
		out.WriteString(strings.Repeat("\n", strings.Count(src[b.Start:b.End], "\n")))
		last = b.End
	}
	out.WriteString(src[last:])
	return out.String()
}
