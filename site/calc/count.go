package calc

import (
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
	ctx.Noun, ctx.People = c.Noun(), c.People()
	return ctx
}

// relabel names the count in a problem placed at a unit's count:
// "Unit 3, votes: …" rather than "Unit 3, population: …".
func (c Count) relabel(p *Problem) *Problem {
	if p == nil || c.people() {
		return p
	}
	from := placeLabel(p.Field)
	if !strings.Contains(from, "population") || !strings.HasPrefix(p.Msg, from) {
		return p
	}
	q := *p
	q.Msg = strings.Replace(from, "population", c.Noun(), 1) + strings.TrimPrefix(p.Msg, from)
	return &q
}
