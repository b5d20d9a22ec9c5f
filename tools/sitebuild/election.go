package main

import (
	"regexp"
	"strconv"
	"strings"

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
	blocks, err := scanJSONBlocks(p.File, p.Source, electionOpen, "election")
	if err != nil || len(blocks) == 0 {
		return nil, err
	}
	var bad, html []string
	for _, b := range blocks {
		cfg, err := election.Parse(p.File, b.Line, b.Doc)
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
				bad = append(bad, p.File+":"+strconv.Itoa(c.Line)+": election "+strconv.Quote(b.ID)+", claim "+strconv.Quote(c.ID)+
					" does not hold: it says "+strconv.Quote(says)+", but "+vd.Found)
			}
		}
		html = append(html, election.Prerender(cfg, b.ID, blockJSON(b.Doc), o))
		p.Elections = append(p.Elections, &electionRef{ID: b.ID, Line: b.Line, Config: cfg, Outcome: o})
	}
	p.Source = spliceBlocks(p.Source, blocks, html)
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
