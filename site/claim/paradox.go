package claim

import (
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
)

// paradoxChecks holds the checks of the paradox kinds, by kind. They need
// the analysis package, so they are reached only through this table,
// which only [UseParadoxes] fills: a program that never calls it (the
// WebAssembly calculator module) carries none of that code.
var paradoxChecks [lastKind + 1]func(ch *checker, c *Claim, m engine.Method, h int) Verdict

// UseParadoxes makes the paradox kinds checkable: no-alabama,
// no-quota-violation, population-paradox, no-population-paradox,
// new-states and no-new-states. Until it is called, such a claim does not
// hold and says that the analysis module checks it.
func UseParadoxes() {
	rng := func(ch *checker, c *Claim, m engine.Method, _ int) Verdict { return ch.checkRange(c, m) }
	paradoxChecks[NoAlabama], paradoxChecks[NoQuotaViolation] = rng, rng
	paradoxChecks[PopulationParadox], paradoxChecks[NoPopulationParadox] = (*checker).checkGrowth, (*checker).checkGrowth
	paradoxChecks[NewStates], paradoxChecks[NoNewStates] = (*checker).checkAdmit, (*checker).checkAdmit
}

// IsParadox reports whether k is one of the kinds that need a search for
// paradoxes over house sizes, populations or units (see [UseParadoxes]).
func (k Kind) IsParadox() bool {
	switch k {
	case NoAlabama, NoQuotaViolation, PopulationParadox, NoPopulationParadox, NewStates, NoNewStates:
		return true
	}
	return false
}

// checkRange checks a no-alabama or no-quota-violation claim over its
// range of house sizes.
func (ch *checker) checkRange(c *Claim, m engine.Method) Verdict {
	from, to := ch.span(c)
	span := " from " + strconv.Itoa(from) + " to " + strconv.Itoa(to)
	sw, err := ch.sweep(m, from, to)
	if err != nil {
		return Verdict{Found: "the numbers cannot be swept by " + m.Name() + span + ": " + errText(err)}
	}
	var texts []string
	if c.Kind == NoAlabama {
		for _, f := range analysis.FindAlabama(sw) {
			if c.Unit == "" || f.Name == c.Unit {
				texts = append(texts, f.Text())
			}
		}
	} else {
		s := ch.base
		s.Method = m
		for _, v := range analysis.FindQuotaViolations(sw, &s) {
			if c.Unit == "" || v.Name == c.Unit {
				texts = append(texts, v.Text())
			}
		}
	}
	refused := 0
	for k := range sw.Sizes {
		if sw.Sizes[k].Err != nil {
			refused++
		}
	}
	if len(texts) == 0 {
		found := "no unit loses a seat as the house grows"
		if c.Kind == NoQuotaViolation {
			found = "every unit gets its lower or upper quota at every size"
		}
		if c.Unit != "" {
			found = c.Unit + " never loses a seat as the house grows"
			if c.Kind == NoQuotaViolation {
				found = c.Unit + " gets its lower or upper quota at every size"
			}
		}
		found += " under " + m.Name() + span
		if refused > 0 {
			found += " (" + plural(refused, "size") + " cannot be apportioned)"
		}
		return Verdict{Holds: true, Found: found}
	}
	what := "Alabama paradox"
	if c.Kind == NoQuotaViolation {
		what = "quota violation"
	}
	found := plural(len(texts), what) + span + "; the first: " + strings.TrimSuffix(texts[0], ".")
	return Verdict{Found: found}
}

// checkGrowth checks a population-paradox or no-population-paradox claim
// against the context's later populations.
func (ch *checker) checkGrowth(c *Claim, m engine.Method, h int) Verdict {
	s := ch.base
	s.Method, s.Seats = m, h
	t := ch.later()
	t.Method, t.Seats = m, h
	pr, err := analysis.FindPopulation(&s, &t)
	if err != nil {
		return Verdict{Found: "the first and the later " + ch.ctx.nouns() + " cannot both be apportioned by " + m.Name() + " at " + plural(h, "seat") + ": " + errText(err)}
	}
	var hits []analysis.Population
	for _, f := range pr.Findings {
		if (c.Unit == "" || f.Loser.Name == c.Unit) && (c.Gainer == "" || f.Gainer.Name == c.Gainer) {
			hits = append(hits, f)
		}
	}
	if c.Kind == PopulationParadox {
		if len(hits) > 0 {
			return Verdict{Holds: true, Found: strings.TrimSuffix(hits[0].Text(), ".")}
		}
		found := c.Unit + " gets " + plural(seatsOf(pr.Before, c.Unit), "seat") + " with the first " + ch.ctx.nouns() + " and " +
			strconv.Itoa(seatsOf(pr.After, c.Unit)) + " with the later ones under " + m.Name() + " at " + plural(h, "seat")
		if c.Gainer != "" {
			found += ", and " + c.Gainer + " gets " + strconv.Itoa(seatsOf(pr.Before, c.Gainer)) + " and " + strconv.Itoa(seatsOf(pr.After, c.Gainer))
		}
		return Verdict{Found: found + ": no population paradox"}
	}
	if len(hits) > 0 {
		return Verdict{Found: plural(len(hits), "population paradox") + "; the first: " + strings.TrimSuffix(hits[0].Text(), ".")}
	}
	who := "no unit loses a seat"
	if c.Unit != "" {
		who = c.Unit + " loses no seat"
	}
	return Verdict{Holds: true, Found: who + " to a unit that grew more slowly under " + m.Name() + " at " + plural(h, "seat") + ": there is no population paradox"}
}

// checkAdmit checks a new-states or no-new-states claim against the unit
// the context admits.
func (ch *checker) checkAdmit(c *Claim, m engine.Method, h int) Verdict {
	s := ch.base
	s.Method, s.Seats = m, h
	r, err := analysis.FindNewStates(&s, *ch.ctx.Admit, ch.ctx.Added)
	if err != nil {
		return Verdict{Found: "the unit cannot be admitted under " + m.Name() + " at " + plural(h, "seat") + ": " + errText(err)}
	}
	changed := false
	for _, x := range r.Changes {
		if c.Unit == "" || x.Name == c.Unit {
			changed = true
		}
	}
	return Verdict{Holds: changed == (c.Kind == NewStates), Found: strings.TrimSuffix(ch.ctx.NewStatesText(r), ".")}
}

// NewStatesText is [analysis.NewStates.Text] in the words of the context:
// the unit admitted with its votes rather than its population where the
// block counts votes.
func (ctx Context) NewStatesText(r *analysis.NewStates) string {
	s := r.Text()
	if ctx.noun() == "population" {
		return s
	}
	return strings.Replace(s, "(population "+r.People.String()+",", "("+r.People.String()+" "+ctx.people()+",", 1)
}
