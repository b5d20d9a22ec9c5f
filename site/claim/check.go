package claim

import (
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/render"
)

// A Verdict says whether a claim holds for a scenario.
type Verdict struct {
	Claim *Claim
	Holds bool
	// Found says what the numbers give, in words ("Orlen gets 12 seats
	// under Huntington–Hill at 40 seats").
	Found string
}

// A Context is what a block knows beyond its scenario, which some kinds of
// claim need: the range of house sizes a sweep block covers, the later
// populations of a growth block, the unit an admit block adds.
type Context struct {
	// From and To are the house sizes swept (zero: the block sweeps
	// none); no-alabama and no-quota-violation claims that give no range
	// of their own cover this one.
	From, To int
	// Later holds the later population of every unit, in the scenario's
	// order, for population-paradox and no-population-paradox claims; nil
	// when the block has none.
	Later []engine.Decimal
	// Admit is the unit that new-states and no-new-states claims admit,
	// with Added seats added for it (negative: its fair share); nil when
	// the block admits none.
	Admit *engine.Unit
	Added int
	// Noun, Nouns and People are the words for what the units' numbers
	// count: a unit's count after "its" ("population", "votes"), the
	// counts of several units ("populations", "votes") and what a margin
	// measures ("people", "votes"). Empty, they are "population",
	// "populations" and "people".
	Noun, Nouns, People string
}

func (ctx Context) noun() string {
	if ctx.Noun == "" {
		return "population"
	}
	return ctx.Noun
}

func (ctx Context) nouns() string {
	if ctx.Nouns == "" {
		return "populations"
	}
	return ctx.Nouns
}

func (ctx Context) people() string {
	if ctx.People == "" {
		return "people"
	}
	return ctx.People
}

// Missing says what a claim needs that the context lacks ("" when nothing):
// a range of house sizes, later populations or a unit to admit.
func (c *Claim) Missing(ctx Context) string {
	if c.Kind.IsParadox() && paradoxChecks[c.Kind] == nil {
		return "a " + c.Kind.String() + " claim is checked by the analysis module (seatsmith-analysis.wasm), not by this engine"
	}
	switch c.Kind {
	case NoAlabama, NoQuotaViolation:
		if c.From == 0 && ctx.From == 0 {
			return "a " + c.Kind.String() + " claim needs a range of house sizes: give from and to, or put it in a sweep block"
		}
	case PopulationParadox, NoPopulationParadox:
		if ctx.Later == nil {
			return "a " + c.Kind.String() + " claim needs later populations: put it in a growth block"
		}
	case NewStates, NoNewStates:
		if ctx.Admit == nil {
			return "a " + c.Kind.String() + " claim needs a unit to admit: put it in an admit block"
		}
	}
	return ""
}

// Check evaluates every claim against the scenario s. A claim about a
// method or house size other than the scenario's apportions s again with
// that method or house size; the populations and bounds stay as they are.
func Check(s engine.Scenario, claims []Claim) []Verdict {
	return CheckIn(s, claims, Context{})
}

// CheckIn is [Check] for the claims of a block with the context ctx: the
// range of a sweep, the later populations of a growth block, the unit an
// admit block adds. A claim whose context is missing does not hold.
func CheckIn(s engine.Scenario, claims []Claim, ctx Context) []Verdict {
	ch := &checker{base: s, ctx: ctx, cache: map[key]entry{}, sweeps: map[sweepKey]sweepEntry{}}
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

type sweepKey struct {
	m        engine.Method
	from, to int
}

type sweepEntry struct {
	sw  *engine.SweepResult
	err error
}

type checker struct {
	base   engine.Scenario
	ctx    Context
	cache  map[key]entry
	sweeps map[sweepKey]sweepEntry
}

func (ch *checker) sweep(m engine.Method, from, to int) (*engine.SweepResult, error) {
	k := sweepKey{m, from, to}
	if e, ok := ch.sweeps[k]; ok {
		return e.sw, e.err
	}
	s := ch.base
	s.Method = m
	sw, err := engine.Sweep(&s, from, to)
	ch.sweeps[k] = sweepEntry{sw, err}
	return sw, err
}

// span returns the house sizes a ranged claim covers.
func (ch *checker) span(c *Claim) (from, to int) {
	if c.From > 0 {
		return c.From, c.To
	}
	return ch.ctx.From, ch.ctx.To
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
	return c.StatementIn(m, h, Context{})
}

// StatementIn is [Claim.Statement] in the words of the context: a margin
// in votes for a block that counts votes.
func (c *Claim) StatementIn(m engine.Method, h int, ctx Context) string {
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
		return c.Unit + " is fewer than " + render.Group(c.Below.String()) + " " + ctx.people() + " from gaining a seat" + under
	case LoseBelow:
		return c.Unit + " can lose fewer than " + render.Group(c.Below.String()) + " " + ctx.people() + " before it drops a seat" + under
	case Alabama:
		return c.Unit + " loses a seat when the house grows from " + strconv.Itoa(h) + " to " + strconv.Itoa(h+1) + " under " + m.Name()
	case Excluded:
		return c.Unit + " falls below the threshold"
	case Included:
		return c.Unit + " clears the threshold"
	case NoAlabama, NoQuotaViolation:
		what := "no unit"
		if c.Unit != "" {
			what = c.Unit
		}
		span := ""
		if c.From > 0 {
			span = " from " + strconv.Itoa(c.From) + " to " + strconv.Itoa(c.To)
		} else {
			span = " in the range swept"
		}
		if c.Kind == NoAlabama {
			return "Under " + m.Name() + ", " + what + " loses a seat as the house grows" + span
		}
		if c.Unit == "" {
			return "Under " + m.Name() + ", every unit gets its lower or upper quota at every house size" + span
		}
		return "Under " + m.Name() + ", " + c.Unit + " gets its lower or upper quota at every house size" + span
	case PopulationParadox:
		who := "another unit"
		if c.Gainer != "" {
			who = c.Gainer
		}
		return c.Unit + " grows at least as fast as " + who + " yet loses a seat to it" + under
	case NoPopulationParadox:
		if c.Unit != "" {
			return c.Unit + " loses no seat to a unit that grew more slowly" + under
		}
		return "No unit loses a seat to a unit that grew more slowly" + under
	case NewStates:
		if c.Unit != "" {
			return "Admitting the new unit with its added seats changes " + c.Unit + "'s seats" + under
		}
		return "Admitting the new unit with its added seats changes other units' seats" + under
	case NoNewStates:
		if c.Unit != "" {
			return "Admitting the new unit with its added seats leaves " + c.Unit + "'s seats as they were" + under
		}
		return "Admitting the new unit with its added seats leaves every other unit's seats as they were" + under
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
	if c.Unit != "" && !ch.hasUnit(c.Unit) {
		return missing
	}
	if need := c.Missing(ch.ctx); need != "" {
		return Verdict{Found: need}
	}
	if pc := paradoxChecks[c.Kind]; pc != nil {
		return pc(ch, c, m, h)
	}
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
			return Verdict{Found: c.Unit + " has no " + word + " margin" + under + ": no change of its " + ch.ctx.noun() + " alone does it"}
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

func (ch *checker) hasUnit(name string) bool {
	for _, u := range ch.base.Units {
		if strings.TrimSpace(u.Name) == name {
			return true
		}
	}
	return false
}

// later returns the base scenario with the context's later populations.
func (ch *checker) later() engine.Scenario {
	t := ch.base
	t.Units = append([]engine.Unit(nil), ch.base.Units...)
	for i := range t.Units {
		if i < len(ch.ctx.Later) {
			t.Units[i].Population = ch.ctx.Later[i]
		}
	}
	return t
}

func seatsOf(r *engine.Result, name string) int {
	for i := range r.Units {
		if r.Units[i].Name == name {
			return r.Units[i].Seats
		}
	}
	return 0
}

func plural(n int, word string) string {
	s := strconv.Itoa(n) + " " + word
	switch {
	case n == 1:
	case strings.HasSuffix(word, "x"):
		s += "es"
	default:
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
