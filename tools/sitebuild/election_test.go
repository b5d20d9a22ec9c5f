package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"seatsmith/engine/jsondoc"
	"seatsmith/engine/render"
	"seatsmith/site/election"
)

// electionPage is a page holding one election block (an invented election
// of two districts) with claims.
func electionPage(claims string) string {
	return pageHead + `<div id="e" data-election>
<script type="application/json">
{"threshold": "5%", "compensatory": 2,
 "districts": [{"name": "North", "seats": 5}, {"name": "South", "seats": 3}],
 "votes": [{"district": "North", "party": "Lark", "votes": 5200}, {"district": "North", "party": "Fern", "votes": 3100},
  {"district": "North", "party": "Moth", "votes": 900}, {"district": "South", "party": "Lark", "votes": 2100},
  {"district": "South", "party": "Fern", "votes": 2900}, {"district": "South", "party": "Moth", "votes": 700}],
 "claims": [` + claims + `]}
</script>
</div>
{{end}}
`
}

// TestElectionClaims checks that the election block's claims are checked
// at build time: a false one stops the build naming page, line and claim,
// and a true one builds.
func TestElectionClaims(t *testing.T) {
	cases := []struct {
		name, claims string
		want         []string // in the error; none: the build succeeds
	}{
		{"true claims", `{"id": "sums", "kind": "district-sums"}, {"id": "cert", "kind": "certificate", "strict": true},
  {"id": "ties", "kind": "no-ties"}`, nil},
		{"false seats", `{"id": "lark", "kind": "seats", "party": "Lark", "seats": {"districts": 9, "biproportional": 4},
  "text": "Lark wins nine."}`, []string{"calculator.html:11:", `election "e", claim "lark"`, `"Lark wins nine."`, "Lark wins"}},
		{"false cell", `{"id": "c", "kind": "cell-seats", "system": "two-tier", "district": "South", "party": "Moth", "seats": 2}`,
			[]string{`claim "c"`, "Moth wins 0 seats in South under two-tier compensation"}},
		{"not excluded", `{"id": "x", "kind": "excluded", "party": "Fern"}`, []string{`claim "x"`, "Fern: threshold"}},
		{"same seats", `{"id": "d", "kind": "differ", "party": "Fern", "systems": ["districts", "districts"]}`, []string{`claim "d"`}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			dir := writeSite(t, electionPage(c.claims))
			_, err := Build(Options{Src: dir, Out: filepath.Join(t.TempDir(), "out"), Engines: fakeEngines})
			if len(c.want) == 0 {
				if err != nil {
					t.Fatal(err)
				}
				return
			}
			if err == nil {
				t.Fatal("a false claim did not fail the build")
			}
			for _, w := range c.want {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("message %q does not contain %q", err, w)
				}
			}
		})
	}
}

// TestBadElectionBlocks checks that mistakes in an election block are
// reported by page, line and field.
func TestBadElectionBlocks(t *testing.T) {
	cases := []struct {
		name, from, to string
		want           []string
	}{
		{"unknown member", `"compensatory": 2,`, `"compensatory": 2, "colour": "red",`, []string{"calculator.html:6:", "colour"}},
		{"system given", `"compensatory": 2,`, `"compensatory": 2, "system": "districts",`, []string{"system", "leave system out"}},
		{"bad votes", `"votes": 5200`, `"votes": "52x"`, []string{"calculator.html:8:", "votes"}},
		{"bad compensatory", `"compensatory": 2`, `"compensatory": -1`, []string{"compensatory"}},
		{"claim about no party", `"claims": [`, `"claims": [{"id": "q", "kind": "excluded", "party": "Owl"}`, []string{`"Owl"`, "not a party"}},
		{"bad claim kind", `"claims": [`, `"claims": [{"id": "q", "kind": "wins"}`, []string{`kind "wins"`}},
		{"no id", `<div id="e" data-election>`, `<div data-election>`, []string{"calculator.html:4:", "id"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			page := strings.Replace(electionPage(""), c.from, c.to, 1)
			dir := writeSite(t, page)
			out := filepath.Join(t.TempDir(), "out")
			_, err := Build(Options{Src: dir, Out: out, Engines: fakeEngines})
			if err == nil {
				t.Fatal("no error")
			}
			for _, w := range c.want {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("error %q does not contain %q", err, w)
				}
			}
			if _, serr := os.Stat(out); serr == nil {
				t.Error("the build wrote output despite the error")
			}
		})
	}
}

// TestElectionLiveMatchesPrerender holds the markup the analysis module's
// election function returns for a page's own numbers to the prerendered
// markup: the page reads the same with JavaScript on and off.
func TestElectionLiveMatchesPrerender(t *testing.T) {
	s, err := loadSite(siteSrc)
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, p := range s.Pages {
		for _, e := range p.Elections {
			pre := render.HTML(election.Output(e.Config, e.Outcome, e.ID))
			// The page script sends the block's document as JSON text.
			doc, err := jsondoc.Parse([]byte(extractJSON(t, p, e.ID)))
			if err != nil {
				t.Fatal(err)
			}
			cfg, err := election.Parse("", 0, doc)
			if err != nil {
				t.Fatal(err)
			}
			o, err := cfg.Run()
			if err != nil {
				t.Fatal(err)
			}
			if live := render.HTML(election.Output(cfg, o, e.ID)); live != pre {
				t.Errorf("%s/%s: live and prerendered results differ:\n%s", p.Name, e.ID, lineDiff(pre, live))
			}
			n++
		}
	}
	if n == 0 {
		t.Fatal("no election block on the site")
	}
}

// extractJSON returns the document the prerendered block id carries.
func extractJSON(t *testing.T, p *page, id string) string {
	t.Helper()
	i := strings.Index(p.Source, `id="`+id+`"`)
	if i < 0 {
		t.Fatalf("%s: no block %s", p.Name, id)
	}
	const open = `<script type="application/json">`
	j := strings.Index(p.Source[i:], open)
	k := strings.Index(p.Source[i+j:], "</script>")
	return strings.ReplaceAll(p.Source[i+j+len(open):i+j+k], `<\/`, "</")
}
