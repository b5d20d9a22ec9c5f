package calc

import (
	"errors"
	"regexp"
	"strings"
	"testing"

	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	"seatsmith/engine/render"
)

func TestParseCount(t *testing.T) {
	cases := []struct {
		in, want string
		ok       bool
	}{
		{"", "population", true},
		{"population", "population", true},
		{" Votes ", "votes", true},
		{"students", "students", true},
		{"applications", "applications", true},
		{"people", "population", false},
		{"ballots", "population", false},
	}
	for _, c := range cases {
		got, ok := ParseCount(c.in)
		if ok != c.ok || got.String() != c.want {
			t.Errorf("ParseCount(%q) = %s, %v; want %s, %v", c.in, got, ok, c.want, c.ok)
		}
	}
}

func TestCountWords(t *testing.T) {
	cases := []struct {
		count                          string
		head, noun, nouns, people, tot string
	}{
		{"population", "Population", "population", "populations", "people", "a total population of 9,100"},
		{"votes", "Votes", "votes", "votes", "votes", "9,100 votes in all"},
		{"students", "Students", "students", "students", "students", "9,100 students in all"},
		{"applications", "Applications", "applications", "applications", "applications", "9,100 applications in all"},
	}
	for _, c := range cases {
		k, _ := ParseCount(c.count)
		got := []string{k.Head(), k.Noun(), k.Nouns(), k.People(), k.Total("9,100")}
		want := []string{c.head, c.noun, c.nouns, c.people, c.tot}
		for i := range got {
			if got[i] != want[i] {
				t.Errorf("%s: %q, want %q", c.count, got[i], want[i])
			}
		}
	}
}

// countBlock is an invented party-list council that counts votes; its
// claim is about a margin, which the claim states in votes.
const countBlock = `{"title": "Council (invented)", "count": "votes", "seats": 15, "method": "hamilton",
 "units": [{"name": "North", "population": 5200}, {"name": "South", "population": 3900}, {"name": "East", "population": 900}],
 "claims": [{"id": "north-near", "kind": "gain-below", "unit": "North", "below": 1000000}]}`

// visibleText is the text of a rendered tree and the attributes a reader
// sees or hears (labels), without the data the page keeps for itself.
func visibleText(n *render.Node) string {
	var b strings.Builder
	n.Walk(func(x *render.Node) {
		if x.Tag == "" {
			b.WriteString(x.Text + "\n")
		}
		for _, a := range x.Attrs {
			switch a.Key {
			case "aria-label", "data-label", "title":
				b.WriteString(a.Val + "\n")
			}
		}
	})
	return b.String()
}

func TestCountSpeaksVotes(t *testing.T) {
	for _, mode := range []string{"compact", "full"} {
		resp := live(request(countBlock, "mode", jsondoc.Str(mode), "editor", jsondoc.Boolean(true)))
		if resp.Get("state").Text != "live" {
			t.Fatalf("%s: %s", mode, jsondoc.Marshal(resp.Get("error")))
		}
		var text string
		for _, part := range []string{"output", "editor"} {
			n, ok := render.FromDoc(resp.Get(part))
			if !ok {
				t.Fatalf("%s: no %s", mode, part)
			}
			text += visibleText(n)
		}
		for _, w := range []string{"Votes", "10,000 votes in all", "the fewest extra votes that would win", "no change of its votes alone",
			"Units: names and votes", "North is fewer than 1,000,000 votes from gaining a seat"} {
			if !strings.Contains(text, w) {
				t.Errorf("%s: the calculator never says %q", mode, w)
			}
		}
		// Population survives only where it names the CSV table's column.
		text = strings.ReplaceAll(text, "name and population (here, the votes)", "")
		if m := regexp.MustCompile(`(?i)[^\n]*\b(population|people)\b[^\n]*`).FindString(text); m != "" {
			t.Errorf("%s: the calculator still speaks of population: %q", mode, m)
		}
	}
}

func TestCountProblemNamesVotes(t *testing.T) {
	doc, err := jsondoc.Parse([]byte(`{"seats": 15, "method": "hamilton", "units": [{"name": "North", "population": "lots"}]}`))
	if err != nil {
		t.Fatal(err)
	}
	resp := live(request(countBlock, "scenario", doc))
	msg := resp.Get("error").Get("message").Text
	if !strings.HasPrefix(msg, "Unit 1, votes: ") {
		t.Errorf("error message %q does not name the votes", msg)
	}
	if f := resp.Get("error").Get("field").Text; f != "units.0.population" {
		t.Errorf("error field %q", f)
	}
}

func TestCountBadMember(t *testing.T) {
	for _, bad := range []string{`"ballots"`, `7`, `["votes"]`} {
		v, err := jsondoc.Parse([]byte("{\"seats\": 3, \"method\": \"webster\",\n \"count\": " + bad + ",\n \"units\": [{\"name\": \"A\", \"population\": 1}]}"))
		if err != nil {
			t.Fatal(err)
		}
		_, err = ParseBlock("page.html", "c", Compact, v)
		var ie *input.Error
		if !errors.As(err, &ie) || ie.Field != "count" || ie.Line != 2 || ie.File != "page.html" || !strings.Contains(ie.Msg, "votes") {
			t.Errorf("count %s: %v", bad, err)
		}
	}
}

func TestCountInStudies(t *testing.T) {
	withCount := func(block string) string { return strings.Replace(block, "{", `{"count": "votes", `, 1) }
	cases := []struct {
		mode, block string
		want        []string
	}{
		{"sweep", sweepBlock, []string{"8,200,567 votes in all", "The units and their votes (9)"}},
		{"growth", growthBlock, []string{"twice: with the first votes, totalling 8,200,567", "Votes, first", "Votes, later", "Growth: the later votes divided by the first"}},
		{"admit", admitBlock, []string{"(350,000 votes) with", "Its fair share, its votes ×", "Its votes"}},
	}
	for _, c := range cases {
		resp := live(studyRequest(c.mode, withCount(c.block), "editor", jsondoc.Boolean(true)))
		if resp.Get("state").Text != "live" {
			t.Fatalf("%s: %s", c.mode, jsondoc.Marshal(resp.Get("error")))
		}
		var text string
		for _, part := range []string{"output", "editor"} {
			n, _ := render.FromDoc(resp.Get(part))
			text += visibleText(n)
		}
		for _, w := range c.want {
			if !strings.Contains(text, w) {
				t.Errorf("%s: the calculator never says %q", c.mode, w)
			}
		}
	}
}

// A study block that counts students speaks of students in its findings
// and in its claims' verdicts, not only in its own sentences.
func TestCountInStudyFindings(t *testing.T) {
	withCount := func(block string) string { return strings.Replace(block, "{", `{"count": "students", `, 1) }
	cases := []struct {
		mode, block string
		want        []string
	}{
		{"admit", admitBlock, []string{"admitting Ostry Fen (350000 students, fair share 1.707199 seats"}},
		{"growth", strings.Replace(growthBlock, `"unit": "Sarrow", "gainer": "Caldmoor"`, `"unit": "Orlen"`, 1),
			[]string{"Orlen gets 13 seats with the first students and 13 with the later ones"}},
	}
	for _, c := range cases {
		resp := live(studyRequest(c.mode, withCount(c.block)))
		if resp.Get("state").Text != "live" {
			t.Fatalf("%s: %s", c.mode, jsondoc.Marshal(resp.Get("error")))
		}
		n, _ := render.FromDoc(resp.Get("output"))
		text := visibleText(n)
		for _, w := range c.want {
			if !strings.Contains(text, w) {
				t.Errorf("%s: the calculator never says %q", c.mode, w)
			}
		}
		if m := regexp.MustCompile(`[^\n]*\b(population \d|populations|people)\b[^\n]*`).FindString(text); m != "" {
			t.Errorf("%s: the calculator still speaks of population: %q", c.mode, m)
		}
	}
}

// Messages about a unit's count, from the calculator's own readers and
// from the scenario reader and the engine, speak of the block's count,
// whether the block itself is wrong or the reader's edit.
func TestCountInProblems(t *testing.T) {
	cases := []struct {
		mode, block, from, to string
		want                  string
	}{
		{"compact", countBlock, `"population": 5200`, `"population": "lots"`, `"lots" is not a number of votes: write a whole number`},
		{"compact", countBlock, `"population": 5200`, `"population": -5`, `"-5" is not a number of votes: votes cannot be negative`},
		{"compact", countBlock, `"population": 5200}, {"name": "South", "population": 3900}, {"name": "East", "population": 900}`,
			`"population": 0}, {"name": "South", "population": 0}, {"name": "East", "population": 0}`, "every unit has zero votes"},
		{"growth", growthBlock, `"later": 997000`, `"later": "lots"`, `"Caldmoor": "lots" is not a number of votes`},
		{"growth", growthBlock, `"later": 997000`, `"later": true`, `"Caldmoor": the later count must be a number`},
		{"admit", admitBlock, `"population": 350000`, `"population": -4`, `"-4" is not a number of votes: votes cannot be negative`},
	}
	for _, c := range cases {
		good := c.block
		if !strings.Contains(good, `"count"`) {
			good = strings.Replace(good, "{", `{"count": "votes", `, 1)
		}
		bad := strings.Replace(good, c.from, c.to, 1)
		if bad == good {
			t.Fatalf("%s: %s not in the block", c.mode, c.from)
		}
		// The block itself is wrong: the page shows why.
		msg := live(studyRequest(c.mode, bad)).Get("error").Get("message").Text
		// The reader's edit is wrong: the message is placed at its field.
		doc, err := jsondoc.Parse([]byte(bad))
		if err != nil {
			t.Fatal(err)
		}
		var keep []jsondoc.Field
		for _, f := range doc.Fields {
			if f.Key != "claims" && f.Key != "compare" && f.Key != "count" {
				keep = append(keep, f)
			}
		}
		doc.Fields = keep
		edited := live(studyRequest(c.mode, good, "scenario", doc)).Get("error").Get("message").Text
		for _, m := range []string{msg, edited} {
			if !strings.Contains(m, c.want) || strings.Contains(m, "is not a population") || strings.Contains(m, "population of zero") {
				t.Errorf("%s %s: message %q, want %q", c.mode, c.to, m, c.want)
			}
		}
	}
}
