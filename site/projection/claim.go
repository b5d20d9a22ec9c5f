package projection

import (
	"strconv"

	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	model "seatsmith/engine/projection"
)

// A Claim is a sentence about a unit's chances that the study can check:
//
//	kind          members           holds when
//	lose-above    unit, p           the unit loses a seat in more than a share p of the draws
//	lose-below    unit, p           … in less than a share p
//	gain-above    unit, p           the unit gains a seat in more than a share p
//	gain-below    unit, p           … in less than a share p
//	seats-above   unit, seats, p    the unit gets exactly that many seats in more than a share p
//
// Losing and gaining are against the apportionment of the latest counts.
// p is a share from 0 to 1 or a percentage ("30%"). Shares are of the
// apportioned draws, with the block's seed: a claim checked at build time
// is a statement about those draws, each share an estimate with standard
// error at most 0.5/sqrt(N).
type Claim struct {
	ID, Kind, Unit string
	Seats          int
	P              float64
	PText          string
	Text           string // the author's sentence (optional)
}

// A Verdict is a claim checked against a study's summary.
type Verdict struct {
	Holds bool
	Found string // what the draws show, for messages
}

var claimKinds = map[string]bool{"lose-above": true, "lose-below": true, "gain-above": true, "gain-below": true, "seats-above": true}

func parseClaims(file string, line int, v *jsondoc.Value) ([]Claim, error) {
	bad := func(l int, msg string) error { return &input.Error{File: file, Line: l, Field: "claims", Msg: msg} }
	if v.Kind != jsondoc.Array {
		return nil, bad(line, "claims is an array of claims")
	}
	ids := map[string]bool{}
	var out []Claim
	for _, x := range v.Items {
		l := line
		if x.Line > 0 && line == 0 {
			l = x.Line
		} else if x.Line > 0 {
			l = x.Line
		}
		if x.Kind != jsondoc.Object {
			return nil, bad(l, "a claim is an object with id, kind, unit and p")
		}
		var c Claim
		hasP, hasSeats := false, false
		for _, f := range x.Fields {
			t := jsondoc.ScalarText(f.Value)
			switch f.Key {
			case "id":
				c.ID = t
			case "kind":
				c.Kind = t
			case "unit":
				c.Unit = t
			case "text":
				c.Text = t
			case "seats":
				n, err := strconv.Atoi(t)
				if err != nil || n < 0 {
					return nil, bad(l, "claim "+strconv.Quote(c.ID)+": seats "+strconv.Quote(t)+" is not a whole number")
				}
				c.Seats, hasSeats = n, true
			case "p":
				p, err := model.ParseRSE(t)
				if err != nil {
					return nil, bad(l, "claim "+strconv.Quote(c.ID)+": p "+strconv.Quote(t)+" is not a share from 0 to 1 or a percentage")
				}
				c.P, c.PText, hasP = p, t, true
			default:
				return nil, bad(l, "claim "+strconv.Quote(c.ID)+": unknown member "+strconv.Quote(f.Key))
			}
		}
		switch {
		case c.ID == "":
			return nil, bad(l, "a claim needs an id")
		case ids[c.ID]:
			return nil, bad(l, "claim id "+strconv.Quote(c.ID)+" is used twice")
		case !claimKinds[c.Kind]:
			return nil, bad(l, "claim "+strconv.Quote(c.ID)+": kind "+strconv.Quote(c.Kind)+" is not one of lose-above, lose-below, gain-above, gain-below, seats-above")
		case c.Unit == "":
			return nil, bad(l, "claim "+strconv.Quote(c.ID)+" names no unit")
		case !hasP:
			return nil, bad(l, "claim "+strconv.Quote(c.ID)+" gives no p")
		case c.Kind == "seats-above" && !hasSeats:
			return nil, bad(l, "claim "+strconv.Quote(c.ID)+" (seats-above) gives no seats")
		}
		ids[c.ID] = true
		out = append(out, c)
	}
	return out, nil
}

// Statement is the claim in words, for a claim with no text of its own.
func (c *Claim) Statement() string {
	p := pctText(c.P)
	switch c.Kind {
	case "lose-above":
		return c.Unit + " loses a seat with a probability above " + p + "."
	case "lose-below":
		return c.Unit + " loses a seat with a probability below " + p + "."
	case "gain-above":
		return c.Unit + " gains a seat with a probability above " + p + "."
	case "gain-below":
		return c.Unit + " gains a seat with a probability below " + p + "."
	}
	return c.Unit + " gets " + strconv.Itoa(c.Seats) + " seats with a probability above " + p + "."
}

// Check checks the claim against a summary.
func (c *Claim) Check(s *model.Summary) Verdict {
	var u *model.UnitSummary
	for i := range s.Units {
		if s.Units[i].Name == c.Unit {
			u = &s.Units[i]
		}
	}
	if u == nil {
		return Verdict{Found: c.Unit + " is not a unit of the counts"}
	}
	if s.Apportioned == 0 {
		return Verdict{Found: "no draw could be apportioned"}
	}
	var sh model.Share
	what := ""
	switch c.Kind {
	case "lose-above", "lose-below":
		sh, what = u.Lose, "loses a seat"
	case "gain-above", "gain-below":
		sh, what = u.Gain, "gains a seat"
	default:
		what = "gets " + strconv.Itoa(c.Seats) + " seats"
		for _, d := range u.Dist {
			if d.Seats == c.Seats {
				sh = d.Share
			}
		}
	}
	holds := sh.P > c.P
	if c.Kind == "lose-below" || c.Kind == "gain-below" {
		holds = sh.P < c.P
	}
	return Verdict{Holds: holds, Found: c.Unit + " " + what + " in " + strconv.FormatInt(sh.Draws, 10) + " of " +
		strconv.FormatInt(s.Apportioned, 10) + " draws (" + pctText(sh.P) + ")"}
}

// pctText writes a share as a percentage with at most two decimals.
func pctText(p float64) string {
	s := strconv.FormatFloat(100*p, 'f', 2, 64)
	for len(s) > 1 && s[len(s)-1] == '0' {
		s = s[:len(s)-1]
	}
	if s[len(s)-1] == '.' {
		s = s[:len(s)-1]
	}
	return s + "%"
}
