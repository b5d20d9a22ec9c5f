package election

import (
	"strings"
	"testing"

	"seatsmith/engine/jsondoc"
	"seatsmith/engine/render"
)

// twoDistricts is an invented election: two districts, three parties.
const twoDistricts = `{"title": "Council (invented)", "threshold": "5%", "compensatory": 2,
 "districts": [{"name": "North", "seats": 5}, {"name": "South", "seats": 3}],
 "votes": [{"district": "North", "party": "Lark", "votes": 5200}, {"district": "North", "party": "Fern", "votes": 3100},
  {"district": "North", "party": "Moth", "votes": 900}, {"district": "South", "party": "Lark", "votes": 2100},
  {"district": "South", "party": "Fern", "votes": 2900}, {"district": "South", "party": "Moth", "votes": 300}]}`

func parse(t *testing.T, s string) (*Config, error) {
	t.Helper()
	v, err := jsondoc.Parse([]byte(s))
	if err != nil {
		t.Fatal(err)
	}
	return Parse("page.html", 3, v)
}

func TestParseErrors(t *testing.T) {
	cases := []struct{ name, from, to, want string }{
		{"unknown member", `"threshold"`, `"colour": 1, "threshold"`, "unknown member"},
		{"method given", `"threshold"`, `"method": "webster", "threshold"`, "leave method out"},
		{"threshold object", `"5%"`, `{"share": "5%"}`, "threshold"},
		{"compensatory", `"compensatory": 2`, `"compensatory": "two"`, "compensatory"},
		{"no districts", `"districts"`, `"x_districts"`, "unknown member"},
		{"bad claim", `"compensatory": 2`, `"compensatory": 2, "claims": [{"id": "a", "kind": "seats", "party": "Lark", "seats": 3}]`, "seats is an object"},
		{"claim system", `"compensatory": 2`, `"compensatory": 2, "claims": [{"id": "a", "kind": "no-ties", "system": "mixed-member"}]`, "not one of districts"},
		{"claim twice", `"compensatory": 2`, `"compensatory": 2, "claims": [{"id": "a", "kind": "no-ties"}, {"id": "a", "kind": "no-ties"}]`, "used twice"},
		{"claim district", `"compensatory": 2`, `"compensatory": 2, "claims": [{"id": "a", "kind": "district-sums", "district": "East"}]`, "not one of the districts"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := parse(t, strings.Replace(twoDistricts, c.from, c.to, 1))
			if err == nil || !strings.Contains(err.Error(), c.want) || !strings.Contains(err.Error(), "page.html") {
				t.Fatalf("got %v, want an error naming page.html with %q", err, c.want)
			}
		})
	}
}

// TestThreeSystems checks the invented election's seats under each system
// against the arithmetic worked by hand (common practice: D'Hondt and
// Sainte-Laguë as their definitions give them).
func TestThreeSystems(t *testing.T) {
	c, err := parse(t, twoDistricts)
	if err != nil {
		t.Fatal(err)
	}
	o, err := c.Run()
	if err != nil {
		t.Fatal(err)
	}
	// Moth has 1,200 of 14,500 votes (8.3%): above the 5% threshold.
	// North by D'Hondt, 5 seats: Lark 5200, 2600, 1733; Fern 3100, 1550;
	// Moth 900: Lark 3, Fern 2. South, 3 seats: Fern 2900, 1450; Lark
	// 2100: Fern 2, Lark 1.
	want := map[string][3]int{"Lark": {4, 0, 0}, "Fern": {4, 0, 0}, "Moth": {0, 0, 0}}
	for p, name := range c.Parties {
		if got := o.Results[0].Parties[p].Seats; got != want[name][0] {
			t.Errorf("districts: %s %d seats, want %d", name, got, want[name][0])
		}
	}
	for i, r := range o.Results {
		total := 0
		for _, p := range r.Parties {
			total += p.Seats
		}
		if total != r.Seats {
			t.Errorf("%s: %d of %d seats", Systems[i], total, r.Seats)
		}
	}
	if o.Results[1].Seats != 10 {
		t.Errorf("two-tier house %d, want 10", o.Results[1].Seats)
	}
	if o.Certificate != nil {
		t.Errorf("certificate: %v", o.Certificate)
	}
	html := render.HTML(Output(c, o, "b"))
	for _, w := range []string{`data-system="biproportional"`, "District divisor", "Party divisor", "Ties: none.", "Not an official"} {
		if !strings.Contains(html, w) {
			t.Errorf("output lacks %q", w)
		}
	}
}

// TestTieShown checks that a tie is reported, never hidden: two parties
// with equal votes for one seat.
func TestTieShown(t *testing.T) {
	c, err := parse(t, `{"districts": [{"name": "Isle", "seats": 1}],
 "votes": [{"district": "Isle", "party": "Lark", "votes": 100}, {"district": "Isle", "party": "Fern", "votes": 100}],
 "claims": [{"id": "t", "kind": "no-ties"}]}`)
	if err != nil {
		t.Fatal(err)
	}
	o, err := c.Run()
	if err != nil {
		t.Fatal(err)
	}
	if len(o.Results[0].Ties) == 0 || o.Results[0].Unassigned != 1 {
		t.Fatalf("ties %v, unassigned %d", o.Results[0].Ties, o.Results[0].Unassigned)
	}
	if v := c.Claims[0].Check(c, o); v.Holds {
		t.Errorf("no-ties holds despite a tie: %s", v.Found)
	}
	html := render.HTML(Output(c, o, "b"))
	if !strings.Contains(html, "TIE") || !strings.Contains(html, "left open by a tie") {
		t.Errorf("the tie is not shown:\n%.2000s", html)
	}
}
