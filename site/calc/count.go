package calc

import (
	"errors"
	"strings"

	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	"seatsmith/site/claim"
)

// A Count is what a block's units are counted by, and so the words the
// calculator uses wherever it speaks of a unit's number: in column
// headers, labels, notes, the explanation and claims. A block chooses it
// with its count member ("votes" for a party-list election); the zero
// Count is a population of people.
type Count struct {
	id string
}

// counts lists the counts a block may choose, the default first.
var counts = []string{"population", "votes", "students", "applications"}

// ParseCount reads a count's id: "population" (also ""), "votes",
// "students" or "applications".
func ParseCount(s string) (Count, bool) {
	t := strings.ToLower(strings.TrimSpace(s))
	if t == "" || t == counts[0] {
		return Count{}, true
	}
	for _, c := range counts[1:] {
		if t == c {
			return Count{c}, true
		}
	}
	return Count{}, false
}

// readCount reads a block's count member, or says where it is wrong.
func readCount(file string, v *jsondoc.Value) (Count, error) {
	if v == nil {
		return Count{}, nil
	}
	if v.Kind == jsondoc.String {
		if c, ok := ParseCount(v.Text); ok {
			return c, nil
		}
	}
	return Count{}, &input.Error{File: file, Line: v.Line, Field: "count",
		Msg: "must be one of " + strings.Join(counts, ", ") + ": what the units' numbers count"}
}

// String returns the count's id, as the count member takes it.
func (c Count) String() string {
	if c.id == "" {
		return counts[0]
	}
	return c.id
}

func (c Count) people() bool { return c.id == "" }

// Head is the count as a column's header: "Population", "Votes".
func (c Count) Head() string {
	s := c.String()
	return strings.ToUpper(s[:1]) + s[1:]
}

// Noun is a unit's count in a sentence, after "its": "population",
// "votes".
func (c Count) Noun() string { return c.String() }

// Nouns is the counts of several units: "populations", "votes".
func (c Count) Nouns() string {
	if c.people() {
		return "populations"
	}
	return c.id
}

// People is what the count counts, in the plural, as a margin or a quota
// measures it: "people", "votes".
func (c Count) People() string {
	if c.people() {
		return "people"
	}
	return c.id
}

// who is the relative pronoun for People: "people who", "students
// who", "votes that".
func (c Count) who() string {
	if c.people() || c.id == "students" {
		return "who"
	}
	return "that"
}

// Total writes a total in a sentence: "a total population of 8,200,567",
// "914,000 votes in all" (n is written as given).
func (c Count) Total(n string) string {
	if c.people() {
		return "a total population of " + n
	}
	return n + " " + c.id + " in all"
}

// Of writes one unit's count in a sentence: "population 93,288",
// "12,000 votes".
func (c Count) Of(n string) string {
	if c.people() {
		return "population " + n
	}
	return n + " " + c.id
}

// claimWords are the words claims use for this count.
func (c Count) claimWords(ctx claim.Context) claim.Context {
	ctx.Noun, ctx.Nouns, ctx.People = c.Noun(), c.Nouns(), c.People()
	return ctx
}

// Statement returns claim c in standard wording, in the block's words
// (a margin in votes for a block that counts votes), for the block's own
// method and house size.
func (b *Block) Statement(c *claim.Claim) string {
	return c.StatementIn(b.Source.Scenario.Method, b.Source.Scenario.Seats, b.Count.claimWords(claim.Context{}))
}

// speak rewrites the phrases of the scenario readers' and the engine's
// messages that speak of population in the count's words: "\"x\" is not a
// number of votes" rather than "\"x\" is not a population".
func (c Count) speak(msg string) string {
	if c.people() {
		return msg
	}
	return strings.NewReplacer(
		"is not a population", "is not a number of "+c.id,
		"populations cannot be negative", c.id+" cannot be negative",
		"every unit has a population of zero", "every unit has zero "+c.id,
		"every unit taking part has a population of zero", "every unit taking part has zero "+c.id,
		"have no population", "have no "+c.id,
		"every population is written", "every count is written",
		"the later population", "the later count",
		"too few people", "too few "+c.id,
		"units with people", "units with "+c.id,
	).Replace(msg)
}

// speakErr is speak for an error of the scenario readers, which keeps its
// file, line and field.
func (c Count) speakErr(err error) error {
	var ie *input.Error
	if c.people() || !errors.As(err, &ie) {
		return err
	}
	e := *ie
	e.Msg = c.speak(e.Msg)
	return &e
}

// relabel names the count in a problem: "Unit 3, votes: \"x\" is not a
// number of votes" rather than "Unit 3, population: \"x\" is not a
// population".
func (c Count) relabel(p *Problem) *Problem {
	if p == nil || c.people() {
		return p
	}
	q := *p
	msg, label := p.Msg, ""
	if from := placeLabel(p.Field); from != "" && strings.HasPrefix(msg, from) {
		label = strings.NewReplacer("later population", "later count", "population", c.Noun()).Replace(from)
		msg = strings.TrimPrefix(msg, from)
	}
	q.Msg = label + c.speak(msg)
	return &q
}
