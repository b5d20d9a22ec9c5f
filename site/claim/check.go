package claim

import (
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/site/render"
)

// A Verdict says whether a claim holds for a scenario.
type Verdict struct {
	Claim *Claim
	Holds bool
	// Found says what the numbers give, in words ("Orlen gets 12 seats
	// under Huntington–Hill at 40 seats").
	Found string
}

// Check evaluates every claim against the scenario s. A claim about a
// method or house size other than the scenario's apportions s again with
// that method or house size; the populations and bounds stay as they are.
func Check(s engine.Scenario, claims []Claim) []Verdict {
	ch := &checker{base: s, cache: map[key]entry{}}
	out := make([]Verdict, len(claims))
	for i := range claims {
		out[i] = ch.check(&claims[i])
		out[i].Claim = &claims[i]
	}
	return out
}

type key struct {
	m       engine.Method
	h       int
	margins bool
}

type entry struct {
	res *engine.Result
	err error
}

type checker struct {
	base  engine.Scenario
	cache map[key]entry
}

func (ch *checker) result(m engine.Method, h int, margins bool) (*engine.Result, error) {
	k := key{m, h, margins}
	if e, ok := ch.cache[k]; ok {
		return e.res, e.err
	}
	s := ch.base
	s.Method, s.Seats = m, h
	d := engine.Detail(0)
	if margins {
		d = engine.WithMargins
	}
	r, err := engine.Allot(&s, d)
	ch.cache[k] = entry{r, err}
	return r, err
}

func (ch *checker) method(c *Claim) engine.Method {
	if c.Method.Valid() {
		return c.Method
	}
	return ch.base.Method
}

func (ch *checker) house(c *Claim) int {
	if c.House > 0 {
		return c.House
	}
	return ch.base.Seats
}

// Statement returns the claim in standard wording, for a scenario whose own
// method and house size are m and h.
func (c *Claim) Statement(m engine.Method, h int) string {
	if c.Method.Valid() {
		m = c.Method
	}
	if c.House > 0 {
		h = c.House
	}
	under := " under " + m.Name() + " at " + plural(h, "seat")
	switch c.Kind {
	case Seats:
		return c.Unit + " gets " + plural(c.Seats, "seat") + under
	case Differ:
		return c.Methods[0].Name() + " and " + c.Methods[1].Name() + " give " + c.Unit + " different numbers of seats at " + plural(h, "seat")
	case Agree:
		return c.Methods[0].Name() + " and " + c.Methods[1].Name() + " give " + c.Unit + " the same number of seats at " + plural(h, "seat")
	case BreaksQuota:
		return c.Unit + " breaks quota" + under
	case MeetsQuota:
		return c.Unit + " gets its lower or upper quota" + under
	case GainBelow:
		return c.Unit + " is fewer than " + render.Group(c.Below.String()) + " people from gaining a seat" + under
	case LoseBelow:
		return c.Unit + " can lose fewer than " + render.Group(c.Below.String()) + " people before it drops a seat" + under
	case Alabama:
		return c.Unit + " loses a seat when the house grows from " + strconv.Itoa(h) + " to " + strconv.Itoa(h+1) + " under " + m.Name()
	case Excluded:
		return c.Unit + " falls below the threshold"
	case Included:
		return c.Unit + " clears the threshold"
	}
	return c.ID
}

func (ch *checker) check(c *Claim) Verdict {
	m, h := ch.method(c), ch.house(c)
	fail := func(err error) Verdict {
		return Verdict{Found: "the numbers cannot be apportioned by " + m.Name() + " at " + plural(h, "seat") + ": " + errText(err)}
	}
	unit := func(r *engine.Result) *engine.UnitResult {
		for i := range r.Units {
			if r.Units[i].Name == c.Unit {
				return &r.Units[i]
			}
		}
		return nil
	}
	missing := Verdict{Found: "there is no unit named " + strconv.Quote(c.Unit)}
	switch c.Kind {
	case Differ, Agree:
		var got [2]int
		for j, mm := range c.Methods {
			r, err := ch.result(mm, h, false)
			if err != nil {
				m = mm
				return fail(err)
			}
			u := unit(r)
			if u == nil {
				return missing
			}
			got[j] = u.Seats
		}
		found := c.Unit + " gets " + plural(got[0], "seat") + " under " + c.Methods[0].Name() + " and " + strconv.Itoa(got[1]) + " under " + c.Methods[1].Name()
		return Verdict{Holds: (got[0] != got[1]) == (c.Kind == Differ), Found: found}
	case Alabama:
		r1, err := ch.result(m, h, false)
		if err != nil {
			return fail(err)
		}
		r2, err := ch.result(m, h+1, false)
		if err != nil {
			h++
			return fail(err)
		}
		u1, u2 := unit(r1), unit(r2)
		if u1 == nil || u2 == nil {
			return missing
		}
		found := c.Unit + " gets " + plural(u1.Seats, "seat") + " at " + strconv.Itoa(h) + " and " + strconv.Itoa(u2.Seats) + " at " + strconv.Itoa(h+1) + " under " + m.Name()
		return Verdict{Holds: u2.Seats < u1.Seats, Found: found}
	}
	margins := c.Kind == GainBelow || c.Kind == LoseBelow
	r, err := ch.result(m, h, margins)
	if err != nil {
		return fail(err)
	}
	u := unit(r)
	if u == nil {
		return missing
	}
	under := " under " + m.Name() + " at " + plural(h, "seat")
	switch c.Kind {
	case Seats:
		found := c.Unit + " gets " + plural(u.Seats, "seat") + under
		if u.Tied {
			found += ", and is in a tie"
		}
		return Verdict{Holds: u.Seats == c.Seats, Found: found}
	case BreaksQuota, MeetsQuota:
		found := c.Unit + " gets " + plural(u.Seats, "seat") + under + "; its quota is " + u.Quota.Text
		if u.MeetsQuota {
			found += ", within its lower and upper quota"
		} else {
			found += ", outside its lower quota " + strconv.Itoa(u.Lower) + " and upper quota " + strconv.Itoa(u.Upper)
		}
		return Verdict{Holds: u.MeetsQuota == (c.Kind == MeetsQuota), Found: found}
	case GainBelow, LoseBelow:
		d, word := u.Gain, "gain"
		if c.Kind == LoseBelow {
			d, word = u.Lose, "lose"
		}
		if d == nil {
			return Verdict{Found: c.Unit + " has no " + word + " margin" + under + ": no change of its population alone does it"}
		}
		return Verdict{Holds: d.Cmp(c.Below) < 0, Found: c.Unit + "'s " + word + " margin is " + render.Group(d.String()) + under}
	case Excluded, Included:
		found := c.Unit + " clears the threshold"
		if u.Excluded {
			found = c.Unit + " falls below the threshold"
		}
		if ch.base.Threshold.IsZero() {
			found = "there is no threshold"
		}
		return Verdict{Holds: u.Excluded == (c.Kind == Excluded), Found: found}
	}
	return Verdict{Found: "unknown kind of claim"}
}

func plural(n int, word string) string {
	s := strconv.Itoa(n) + " " + word
	if n != 1 {
		s += "s"
	}
	return s
}

func errText(err error) string {
	if e, ok := err.(*engine.Error); ok {
		return strings.TrimSpace(e.Error())
	}
	return err.Error()
}
