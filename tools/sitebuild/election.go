package main

import (
	"errors"
	"regexp"
	"strconv"
	"strings"

	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	"seatsmith/site/election"
)

// An electionRef is an election block of a page: a <div data-election>
// holding one <script type="application/json"> element with its document
// (see site/election.Parse). The build computes it under the block's three
// systems natively, checks its claims and puts the prerendered block in
// place of the source.
type electionRef struct {
	ID      string
	Line    int
	Config  *election.Config
	Outcome *election.Outcome
}

var electionOpen = regexp.MustCompile(`<div\b[^>]*\bdata-election\b[^>]*>`)

// expandElections replaces every election block in p.Source by its
// prerendered markup (keeping the page's line count) and records the
// blocks in p.Elections. It returns a message for every claim that does
// not hold; bad input is an *input.Error naming page, line and field.
func expandElections(p *page) ([]string, error) {
	src := p.Source
	var out strings.Builder
	var bad []string
	last := 0
	ids := map[string]bool{}
	for _, loc := range electionOpen.FindAllStringIndex(src, -1) {
		line := lineAt(src, loc[0])
		fail := func(field, msg string) error { return &input.Error{File: p.File, Line: line, Field: field, Msg: msg} }
		id := ""
		for _, m := range attrRe.FindAllStringSubmatch(src[loc[0]+4:loc[1]-1], -1) {
			switch m[1] {
			case "id":
				id = m[2] + m[3]
			case "data-state":
				return nil, fail("data-state", "the build sets data-state; leave it out of the page source")
			}
		}
		if !idRe.MatchString(id) || ids[id] {
			return nil, fail("id", "an election block needs an id of its own on the page (a letter, then letters, digits, - or _)")
		}
		ids[id] = true
		st := scriptTag.FindStringIndex(src[loc[1]:])
		if st == nil {
			return nil, fail("script", `an election block holds one <script type="application/json"> element with its document`)
		}
		bodyStart := loc[1] + st[1]
		end := strings.Index(src[bodyStart:], "</script>")
		if end < 0 {
			return nil, fail("script", "the block's <script> element is never closed")
		}
		after := bodyStart + end + len("</script>")
		cd := closeDiv.FindStringIndex(src[after:])
		if cd == nil {
			return nil, &input.Error{File: p.File, Line: lineAt(src, after), Field: "div", Msg: "an election block holds only its <script> element; close the <div> right after it"}
		}
		blockEnd := after + cd[1]
		jsonLine := lineAt(src, bodyStart)
		v, err := jsondoc.Parse([]byte(strings.Repeat("\n", jsonLine-1) + src[bodyStart:bodyStart+end]))
		if err != nil {
			var se *jsondoc.SyntaxError
			if errors.As(err, &se) {
				return nil, &input.Error{File: p.File, Line: se.Line, Msg: "the election block's JSON is malformed: " + se.Msg}
			}
			return nil, fail("", err.Error())
		}
		cfg, err := election.Parse(p.File, line, v)
		if err != nil {
			return nil, err
		}
		o, err := cfg.Run()
		if err != nil {
			return nil, err
		}
		for i := range cfg.Claims {
			c := &cfg.Claims[i]
			if vd := c.Check(cfg, o); !vd.Holds {
				says := c.Text
				if says == "" {
					says = c.Statement()
				}
				bad = append(bad, p.File+":"+strconv.Itoa(c.Line)+": election "+strconv.Quote(id)+", claim "+strconv.Quote(c.ID)+
					" does not hold: it says "+strconv.Quote(says)+", but "+vd.Found)
			}
		}
		js := string(jsondoc.Marshal(v))
		// The markup goes into the page template's text: no "{{" may stay,
		// and the JSON may not close its element.
		js = strings.ReplaceAll(strings.ReplaceAll(js, "</", `<\/`), "{{", `{\u007b`)
		html := strings.ReplaceAll(election.Prerender(cfg, id, js, o), "{{", "{&#123;")
		out.WriteString(src[last:loc[0]])
		out.WriteString(html)
		out.WriteString(strings.Repeat("\n", strings.Count(src[loc[0]:blockEnd], "\n")))
		last = blockEnd
		p.Elections = append(p.Elections, &electionRef{ID: id, Line: line, Config: cfg, Outcome: o})
	}
	if last == 0 {
		return nil, nil
	}
	out.WriteString(src[last:])
	p.Source = out.String()
	return bad, nil
}

// electionGolden writes what a page's election blocks show: under each
// system every party's seats and every district's seats by party, the
// biproportional divisors, the ties, then every claim's verdict.
func electionGolden(p *page) string {
	var b strings.Builder
	for _, e := range p.Elections {
		c := e.Config
		b.WriteString("\nelection " + e.ID + ": " + strconv.Itoa(len(c.Source.Scenario.Districts)) + " districts, " +
			strconv.Itoa(len(c.Parties)) + " parties, threshold " + strconv.Quote(c.Threshold) + ", compensatory " + strconv.Itoa(c.Compensatory) + "\n")
		for i, sys := range election.Systems {
			r := e.Outcome.Results[i]
			b.WriteString("  " + sys.String() + ": " + strconv.Itoa(r.Seats) + " seats, unassigned " + strconv.Itoa(r.Unassigned) + "\n")
			for _, pr := range r.Parties {
				line := "    " + pr.Name + "\t" + strconv.Itoa(pr.Seats)
				if sys == election.Systems[1] {
					line += "\t(" + strconv.Itoa(pr.DistrictSeats) + "+" + strconv.Itoa(pr.ListSeats) + ")"
				}
				if !pr.Qualified {
					line += "\t" + pr.Reason
				}
				if pr.Divisor != "" {
					line += "\tdivisor " + pr.Divisor
				}
				b.WriteString(line + "\n")
			}
			m := election.Matrix(r, len(c.Parties))
			for d, dr := range r.Districts {
				line := "    " + dr.Name + "\t" + strconv.Itoa(dr.Seats) + ":"
				for _, k := range m.Seats[d] {
					line += " " + strconv.Itoa(k)
				}
				if dr.Divisor != "" {
					line += "\tdivisor " + dr.Divisor
				}
				b.WriteString(line + "\n")
			}
			for _, t := range r.Ties {
				b.WriteString("    tie " + t.Stage + " seats " + strconv.Itoa(t.Seats) + "\n")
			}
		}
		if e.Outcome.Certificate != nil {
			b.WriteString("  certificate: " + e.Outcome.Certificate.Error() + "\n")
		}
		for i := range c.Claims {
			cl := &c.Claims[i]
			v := cl.Check(c, e.Outcome)
			verdict := "holds"
			if !v.Holds {
				verdict = "does not hold"
			}
			b.WriteString("  claim " + cl.ID + ": " + verdict + ": " + v.Found + "\n")
		}
	}
	return b.String()
}
