package main

import (
	"encoding/json"
	"net/http/httptest"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/chromedp"
)

// TestProjectionBrowser drives the projection page in headless Chromium: the
// worker's run with the page's seed gives the native numbers, progress
// advances, cancel stops a run, and bad input shows an inline error.
func TestProjectionBrowser(t *testing.T) {
	chromiumPath(t)
	dir := builtSite(t)
	h, err := siteHandler(dir)
	if err != nil {
		t.Fatal(err)
	}
	srv := httptest.NewServer(h)
	defer srv.Close()
	origin := srv.URL + "/"
	bctx := browser(t)

	p, bad, err := loadPage(filepath.Join(siteSrc, "pages", "projection.html"))
	if err != nil || len(bad) > 0 || len(p.Projections) != 1 {
		t.Fatalf("loading the page natively: %v %v", err, bad)
	}
	native := p.Projections[0].Summary
	sel := "#" + p.Projections[0].ID

	tb := newTab(t, bctx)
	tb.do(chromedp.Navigate(origin + "projection.html"))
	tb.waitFor("the projection live", `document.querySelector('`+sel+`').dataset.state === 'live'`)

	type unitRow struct {
		Unit, Now, Lose, Gain string
		Dist                  []string
	}
	rowsJS := `JSON.stringify([...document.querySelectorAll('` + sel + ` tr[data-unit]')].map(r => ({Unit: r.dataset.unit, Now: r.dataset.now,
		Lose: r.dataset.lose, Gain: r.dataset.gain, Dist: [...r.querySelectorAll('[data-seats]')].map(s => s.dataset.seats + ':' + s.dataset.draws)})))`
	var live []unitRow
	if err := json.Unmarshal([]byte(eval[string](tb, rowsJS)), &live); err != nil {
		t.Fatal(err)
	}
	if len(live) != len(native.Units) {
		t.Fatalf("the live table has %d units, natively %d", len(live), len(native.Units))
	}
	for i, u := range native.Units {
		want := unitRow{u.Name, strconv.Itoa(u.BaselineSeats), strconv.FormatInt(u.Lose.Draws, 10), strconv.FormatInt(u.Gain.Draws, 10), nil}
		for _, d := range u.Dist {
			want.Dist = append(want.Dist, strconv.Itoa(d.Seats)+":"+strconv.FormatInt(d.Draws, 10))
		}
		g := live[i]
		if g.Unit != want.Unit || g.Now != want.Now || g.Lose != want.Lose || g.Gain != want.Gain || strings.Join(g.Dist, " ") != strings.Join(want.Dist, " ") {
			t.Errorf("seed %d: the browser's %+v, natively %+v", native.Seed, g, want)
		}
	}
	if n := eval[int](tb, `document.querySelectorAll('[data-claim-ref][data-holds="false"], `+sel+` [data-claim][data-holds="false"]').length`); n != 0 {
		t.Errorf("%d claims do not hold in the browser", n)
	}
	if eval[int](tb, `document.querySelectorAll('`+sel+` [data-role=caution]').length`) != 1 {
		t.Error("the result shows no caution")
	}
	if eval[int](tb, `document.querySelectorAll('`+sel+` svg.pj-svg rect.pj-seg').length`) < len(native.Units) {
		t.Error("the chart has fewer segments than units")
	}

	// A long run: progress advances, and cancel stops it with the previous
	// result still shown.
	setField := func(field, value string) {
		t.Helper()
		tb.do(chromedp.Evaluate[chromedp.Void](`(() => { const e = document.querySelector('` + sel + ` [data-field="` + field + `"]'); e.value = ` + strconv.Quote(value) + `; })()`))
	}
	setField("draws", "200000")
	tb.do(chromedp.Click(chromedp.CSS(sel + ` [data-role=projection-run]`)))
	tb.waitFor("progress", `+document.querySelector('`+sel+`').dataset.progress >= 500`)
	if eval[string](tb, `document.querySelector('`+sel+`').dataset.state`) != "running" {
		t.Fatal("the long run is not running")
	}
	// Keyboard: the cancel button is reached and pressed by keys.
	tb.do(chromedp.Focus(chromedp.CSS(sel + ` [data-role=projection-cancel]`)))
	tb.do(chromedp.KeyEvent("\r"))
	tb.waitFor("cancelled", `document.querySelector('`+sel+`').dataset.state === 'cancelled'`)
	stopped := eval[string](tb, `document.querySelector('`+sel+`').dataset.progress`)
	time.Sleep(400 * time.Millisecond)
	if again := eval[string](tb, `document.querySelector('`+sel+`').dataset.progress`); again != stopped {
		t.Errorf("the draws went on after cancel: %s, then %s", stopped, again)
	}
	if n, _ := strconv.Atoi(stopped); n >= 200000 {
		t.Errorf("cancel came after every draw (%d)", n)
	}
	if d := eval[string](tb, `document.querySelector('`+sel+` [data-role=projection-output]').dataset.draws`); d != "2000" {
		t.Errorf("after cancel the result shows %s draws, want the previous run's 2000", d)
	}

	// Bad input: an inline error naming the field, and the page still works.
	setField("draws", "2000")
	setField("target", "2030-13-45")
	tb.do(chromedp.Click(chromedp.CSS(sel + ` [data-role=projection-run]`)))
	tb.waitFor("an error", `document.querySelector('`+sel+`').dataset.state === 'error'`)
	if msg := eval[string](tb, `document.querySelector('`+sel+` [role=alert]').textContent`); !strings.Contains(msg, "target") {
		t.Errorf("the error says %q; want it to name the target", msg)
	}
	setField("target", "2030-04-01")
	setField("counts", "name,date,population\nOrlen,2010-04-01,many\n")
	tb.do(chromedp.Click(chromedp.CSS(sel + ` [data-role=projection-run]`)))
	tb.waitFor("an error", `document.querySelector('`+sel+`').dataset.state === 'error' && /line 2/.test(document.querySelector('`+sel+` [role=alert]').textContent)`)
	tb.do(chromedp.Navigate(origin + "projection.html"))
	tb.waitFor("live again", `document.querySelector('`+sel+`').dataset.state === 'live'`)
	tb.screenshot("projection-live-desktop.png", 1280, 900, false)
	tb.screenshot("projection-live-phone.png", 390, 844, true)
	tb.checkClean(origin)
}
