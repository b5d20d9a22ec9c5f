package main

import (
	"errors"
	"regexp"
	"strconv"
	"strings"

	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	"seatsmith/site/calc"
)

// A blockRef is a calculator block found in a page source.
type blockRef struct {
	Start, End int    // byte offsets of the whole <div>…</div>
	Line       int    // the line of the <div
	Class      string // the author's class attribute
	Block      *calc.Block
	JSON       string // the block's JSON, compact
}

var (
	divOpen   = regexp.MustCompile(`<div\b[^>]*\bdata-seatsmith\b[^>]*>`)
	attrRe    = regexp.MustCompile(`([a-zA-Z][a-zA-Z0-9-]*)(?:\s*=\s*(?:"([^"]*)"|'([^']*)'))?`)
	scriptTag = regexp.MustCompile(`^\s*<script\s+type\s*=\s*["']application/json["']\s*>`)
	closeDiv  = regexp.MustCompile(`^\s*</div\s*>`)
	idRe      = regexp.MustCompile(`^[A-Za-z][A-Za-z0-9_-]*$`)
)

func lineAt(src string, off int) int { return strings.Count(src[:off], "\n") + 1 }

// scanBlocks finds every calculator block in a page source and reads it.
func scanBlocks(file, src string) ([]blockRef, error) {
	var out []blockRef
	ids := map[string]bool{}
	for _, loc := range divOpen.FindAllStringIndex(src, -1) {
		line := lineAt(src, loc[0])
		bad := func(field, msg string) error {
			return &input.Error{File: file, Line: line, Field: field, Msg: msg}
		}
		ref := blockRef{Start: loc[0], Line: line}
		tag := src[loc[0]+4 : loc[1]-1]
		var id, mode string
		for _, m := range attrRe.FindAllStringSubmatch(tag, -1) {
			v := m[2] + m[3]
			switch m[1] {
			case "id":
				id = v
			case "class":
				ref.Class = v
			case "data-seatsmith":
				mode = v
			case "data-state":
				return nil, bad("data-state", "the build sets data-state; leave it out of the page source")
			}
		}
		md, ok := calc.ParseMode(mode)
		if !ok {
			return nil, bad("data-seatsmith", strconv.Quote(mode)+" is not a calculator mode; use \"compact\" or \"full\"")
		}
		if id == "" {
			id = "calculator-" + strconv.Itoa(len(out)+1)
		}
		if !idRe.MatchString(id) {
			return nil, bad("id", strconv.Quote(id)+" is not a usable id: start with a letter, then letters, digits, - or _")
		}
		if ids[id] {
			return nil, bad("id", strconv.Quote(id)+" is the id of another calculator on this page")
		}
		ids[id] = true
		rest := src[loc[1]:]
		st := scriptTag.FindStringIndex(rest)
		if st == nil {
			return nil, bad("script", `a calculator block holds one <script type="application/json"> element with its scenario`)
		}
		bodyStart := loc[1] + st[1]
		end := strings.Index(src[bodyStart:], "</script>")
		if end < 0 {
			return nil, bad("script", "the scenario's <script> element is never closed")
		}
		jsonText := src[bodyStart : bodyStart+end]
		after := bodyStart + end + len("</script>")
		cd := closeDiv.FindStringIndex(src[after:])
		if cd == nil {
			return nil, &input.Error{File: file, Line: lineAt(src, after), Field: "div", Msg: "a calculator block holds only its <script> element; close the <div> right after it"}
		}
		ref.End = after + cd[1]
		// Pad with newlines so that the parser's lines are the page's lines.
		jsonLine := lineAt(src, bodyStart)
		v, err := jsondoc.Parse([]byte(strings.Repeat("\n", jsonLine-1) + jsonText))
		if err != nil {
			var se *jsondoc.SyntaxError
			if errors.As(err, &se) {
				return nil, &input.Error{File: file, Line: se.Line, Msg: "the calculator's JSON is malformed: " + se.Msg}
			}
			return nil, &input.Error{File: file, Line: jsonLine, Msg: err.Error()}
		}
		b, err := calc.ParseBlock(file, id, md, v)
		if err != nil {
			return nil, err
		}
		ref.Block = b
		ref.JSON = string(jsondoc.Marshal(v))
		out = append(out, ref)
	}
	// A data-seatsmith attribute outside a div is a mistake worth naming.
	if n := strings.Count(src, "data-seatsmith"); n > len(out) {
		for off := 0; ; {
			k := strings.Index(src[off:], "data-seatsmith")
			if k < 0 {
				break
			}
			pos := off + k
			inside := false
			for _, r := range out {
				if pos >= r.Start && pos < r.End {
					inside = true
				}
			}
			inTag := strings.LastIndex(src[:pos], "<") > strings.LastIndex(src[:pos], ">")
			if !inside && inTag && !strings.HasPrefix(src[pos:], "data-seatsmith-") {
				return nil, &input.Error{File: file, Line: lineAt(src, pos), Field: "data-seatsmith", Msg: "a calculator block is a <div data-seatsmith> element"}
			}
			off = pos + len("data-seatsmith")
		}
	}
	return out, nil
}
