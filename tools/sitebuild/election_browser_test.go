package main

import (
	"net/http/httptest"
	"path/filepath"
	"strconv"
	"testing"

	"github.com/chromedp/chromedp"

	"seatsmith/site/election"
)

// TestElectionBrowser drives the elections page in headless Chromium: the
// analysis module's results for the page's own votes are the prerendered
// ones, an edit of the votes moves seats and claims, and a bad number
// shows an inline error while the last results stay.
func TestElectionBrowser(t *testing.T) {
	chromiumPath(t)
	dir := builtSite(t)
	h, err := siteHandler(dir)
	if err != nil {
		t.Fatal(err)
	}
	srv := httptest.NewServer(h)
	defer srv.Close()
	bctx := browser(t)

	p, bad, err := loadPage(filepath.Join(siteSrc, "pages", "elections.html"))
	if err != nil || len(bad) > 0 || len(p.Elections) != 1 {
		t.Fatalf("loading the page natively: %v %v", err, bad)
	}
	e := p.Elections[0]
	sel := "#" + e.ID
	tb := newTab(t, bctx)
	tb.do(chromedp.Navigate(srv.URL + "/elections.html"))
	tb.waitFor("the election live", `document.querySelector('`+sel+`').dataset.state === 'live'`)

	// The live results read as the prerendered ones (TestElectionLiveMatchesPrerender
	// holds the markup to it).
	native := election.Output(e.Config, e.Outcome, e.ID).TextContent()
	live := eval[string](tb, `document.querySelector('`+sel+` [data-role="election-output"]').textContent`)
	if live != native {
		t.Errorf("live results differ from the prerendered ones:\n%s", lineDiff(native, live))
	}

	// Moss and Stone polls far more in Varnholm: its seats there move, and
	// the claim about its seats stops holding.
	seatsJS := `document.querySelector('` + sel + ` tr[data-party="Moss and Stone"]').dataset.districts`
	before := eval[string](tb, seatsJS)
	row := -1
	for k, rc := range e.Config.Rows {
		if e.Config.Source.Scenario.Districts[rc.District].Name == "Varnholm" && e.Config.Parties[rc.Party] == "Moss and Stone" {
			row = k
		}
	}
	if row < 0 {
		t.Fatal("no Moss and Stone votes in Varnholm")
	}
	input := sel + ` input[data-row="` + strconv.Itoa(row) + `"]`
	type_ := func(v string) {
		tb.do(chromedp.SetValue(chromedp.CSS(input), v),
			chromedp.Evaluate[chromedp.Void](`document.querySelector('`+input+`').dispatchEvent(new Event('input', {bubbles: true}))`))
	}
	type_("90000")
	tb.waitFor("the seats to move", seatsJS+` !== `+strconv.Quote(before))
	tb.waitFor("the claim to fail", `document.querySelector('[data-claim-ref="moss"]').dataset.holds === 'false'`)

	// A bad number: an inline error, the last results kept.
	type_("12x")
	tb.waitFor("the error", `document.querySelector('`+sel+`').dataset.state === 'error'`)
	msg := eval[string](tb, `document.querySelector('`+sel+` [role="alert"]').textContent`)
	if msg == "" || eval[string](tb, seatsJS) == before {
		t.Errorf("error %q; seats %s", msg, eval[string](tb, seatsJS))
	}
	type_("18143")
	tb.waitFor("the page's own results again", `document.querySelector('`+sel+`').dataset.state === 'live' && `+seatsJS+` === `+strconv.Quote(before))
	if n := eval[int](tb, `document.querySelectorAll('[data-claim-ref][data-holds="false"]').length`); n != 0 {
		t.Errorf("%d claims do not hold with the page's own votes", n)
	}
}
