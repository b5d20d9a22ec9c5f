package main

// Browser tests of the study pages: the sweep chart of house sizes and the
// paradoxes explainer, in headless Chromium like TestBrowser.

import (
	"net/http/httptest"
	"strings"
	"testing"

	"github.com/chromedp/chromedp"
)

// typeInto replaces the value of the field sel by typing text.
func (tb *tab) typeInto(sel, text string) {
	tb.t.Helper()
	s := chromedp.CSS(sel)
	tb.do(chromedp.Focus(s), chromedp.Evaluate[chromedp.Void](`document.activeElement.select()`), chromedp.SendKeys(s, text))
}

// noOverflow fails when the page is wider than the viewport, which on a
// phone means the reader must scroll the whole page sideways.
func (tb *tab) noOverflow(what string) {
	tb.t.Helper()
	if w := eval[[]int](tb, `[document.documentElement.scrollWidth, window.innerWidth]`); w[0] > w[1] {
		tb.t.Errorf("%s: the page is %d pixels wide in a viewport of %d", what, w[0], w[1])
	}
}

// labelled fails for any control in root without a label.
func (tb *tab) labelled(root string) {
	tb.t.Helper()
	bad := eval[[]string](tb, `[...document.querySelectorAll('`+root+` input, `+root+` select, `+root+` button')]
		.filter(e => e.type !== 'hidden' && !(e.labels && e.labels.length) && !e.getAttribute('aria-label') && !e.textContent.trim())
		.map(e => e.outerHTML.slice(0, 80))`)
	for _, b := range bad {
		tb.t.Errorf("a control without a label: %s", b)
	}
}

func TestBrowserStudies(t *testing.T) {
	chromiumPath(t)
	dir := builtSite(t)
	h, err := siteHandler(dir)
	if err != nil {
		t.Fatal(err)
	}
	srv := httptest.NewServer(h)
	defer srv.Close()
	bctx := browser(t)
	origin := srv.URL + "/"

	t.Run("sweep chart", func(t *testing.T) {
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate(origin + "house-sizes.html"))
		tb.waitFor("live", allLive)
		if n := eval[int](tb, `document.querySelectorAll('#sweep [data-role=sweep-chart] svg[data-role=sweep-svg]').length`); n != 8 {
			t.Fatalf("%d chart panels, want 8", n)
		}
		if n := eval[int](tb, `document.querySelectorAll('#sweep [data-method=hamilton] path[data-sweep-unit]').length`); n != 9 {
			t.Errorf("%d step lines in the Hamilton panel, want 9", n)
		}
		if !eval[bool](tb, `!!document.querySelector('#sweep [data-method=hamilton] circle[data-paradox="Sarrow"][data-house="41"]')`) {
			t.Error("no ring at Sarrow's lost seat")
		}
		alabama := `document.querySelectorAll('#sweep li[data-paradox=alabama]').length`
		if n := eval[int](tb, alabama); n != 3 {
			t.Errorf("%d Alabama paradoxes listed, want 3", n)
		}
		if got := eval[string](tb, `document.querySelector('#sweep li[data-paradox=alabama]').textContent`); !strings.Contains(got, "Sarrow has 2 seats in a house of 40 but 1 in a house of 41") {
			t.Errorf("the first finding says %q", got)
		}
		tb.labelled(`#sweep`)

		// The keyboard alone takes the Droop quota out of the chart.
		tb.do(chromedp.Focus(chromedp.CSS(`#sweep-m-droop`)), chromedp.KeyEvent(" "))
		tb.waitFor("seven panels", `document.querySelectorAll('#sweep svg[data-role=sweep-svg]').length === 7`)
		if n := eval[int](tb, alabama); n != 1 {
			t.Errorf("%d Alabama paradoxes without the Droop quota, want 1", n)
		}
		// The link follows once the reader pauses.
		tb.waitFor("the edit in the link", `location.hash.includes("sweep=")`)

		// A population edit redraws the lines.
		before := eval[string](tb, `document.querySelector('#sweep [data-method=hamilton] path[data-sweep-unit="Sarrow"]').getAttribute('d')`)
		tb.do(chromedp.Click(chromedp.CSS(`#sweep .sc-units-more summary`)))
		tb.typeInto(`#sweep [data-field="units.5.population"]`, "420000")
		tb.waitFor("Sarrow's new line", `document.querySelector('#sweep [data-method=hamilton] path[data-sweep-unit="Sarrow"]').getAttribute('d') !== `+jsString(before))
		if got := eval[string](tb, `document.querySelector('[data-claim-ref="sarrow-alabama"]').dataset.holds`); got != "false" {
			t.Errorf("the inline Alabama claim shows holds=%s once Sarrow has 420,000 people", got)
		}

		// A range the chart cannot show is an inline error at its field;
		// fixing it brings the chart back.
		tb.typeInto(`#sweep [data-field="to"]`, "900")
		tb.waitFor("the error state", `document.querySelector('#sweep').dataset.state === 'error'`)
		msg := eval[string](tb, `document.querySelector('#sweep [data-role=error]').textContent`)
		if !strings.Contains(msg, "To (house size)") || !strings.Contains(msg, "at most 200") {
			t.Errorf("error message %q", msg)
		}
		if eval[string](tb, `document.querySelector('#sweep [data-field="to"]').getAttribute('aria-invalid')`) != "true" {
			t.Error("the bad field is not marked invalid")
		}
		if eval[bool](tb, `!!document.querySelector('#sweep [data-role=sweep-chart]')`) {
			t.Error("a chart is shown for a range that cannot be swept")
		}
		tb.typeInto(`#sweep [data-field="to"]`, "41")
		tb.waitFor("live again", `document.querySelector('#sweep').dataset.state === 'live' && !!document.querySelector('#sweep [data-role=sweep-chart]')`)
		if n := eval[int](tb, `document.querySelectorAll('#sweep tr[data-sweep-house]').length / 7`); n != 12 {
			t.Errorf("the tables hold %d sizes a method, want 12 (30 to 41)", n)
		}
		tb.checkClean(origin)
	})

	t.Run("sweep at phone width", func(t *testing.T) {
		tb := newTab(t, bctx)
		tb.do(chromedp.EmulateViewport(390, 844, chromedp.EmulateScale(2), chromedp.EmulateMobile))
		tb.do(chromedp.Navigate(origin + "house-sizes.html"))
		tb.waitFor("live", allLive)
		tb.noOverflow("house-sizes.html")
		// The chart's text stays readable: at least 10 CSS pixels tall.
		if px := eval[float64](tb, `document.querySelector('#sweep svg[data-role=sweep-svg] .sc-tick').getBoundingClientRect().height`); px < 10 {
			t.Errorf("the chart's tick labels are %.1f pixels tall at phone width", px)
		}
		tb.do(chromedp.Navigate(origin + "paradoxes.html"))
		tb.waitFor("live", allLive)
		tb.noOverflow("paradoxes.html")
		tb.checkClean(origin)
	})

	t.Run("paradox explainer", func(t *testing.T) {
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate(origin + "paradoxes.html"))
		tb.waitFor("live", allLive)
		if n := eval[int](tb, `document.querySelectorAll('[data-seatsmith]').length`); n != 4 {
			t.Fatalf("%d live examples, want 4", n)
		}
		for _, id := range []string{"alabama-sweep", "growth", "admit", "quota-sweep"} {
			tb.labelled("#" + id)
		}
		// Population paradox: with Sarrow's later count back at its first,
		// the paradox and the claim about it are gone.
		if n := eval[int](tb, `document.querySelectorAll('#growth li[data-paradox=population]').length`); n != 1 {
			t.Errorf("%d population paradoxes listed, want 1", n)
		}
		tb.typeInto(`#growth [data-field="units.5.later"]`, "344546")
		tb.waitFor("no population paradox", `document.querySelectorAll('#growth li[data-paradox=population]').length === 0`)
		if got := eval[string](tb, `document.querySelector('#growth [data-claim="population-sarrow"]').dataset.holds + ' ' + document.querySelector('[data-claim-ref="population-sarrow"]').dataset.holds`); got != "false false" {
			t.Errorf("the population claim shows %q after the edit", got)
		}
		// New states: a newcomer that cannot be read is an inline error.
		tb.typeInto(`#admit [data-field="admit.population"]`, "many")
		tb.waitFor("the error state", `document.querySelector('#admit').dataset.state === 'error'`)
		if msg := eval[string](tb, `document.querySelector('#admit [data-role=error]').textContent`); !strings.Contains(msg, "New unit's population") {
			t.Errorf("error message %q", msg)
		}
		if eval[string](tb, `document.querySelector('#admit [data-field="admit.population"]').getAttribute('aria-invalid')`) != "true" {
			t.Error("the newcomer's population is not marked invalid")
		}
		tb.typeInto(`#admit [data-field="admit.population"]`, "205000")
		tb.waitFor("live again", `document.querySelector('#admit').dataset.state === 'live'`)
		if got := eval[string](tb, `document.querySelector('#admit tr[data-admit-unit="Ostry Fen"]').dataset.after`); got != "1" {
			t.Errorf("a newcomer of 205,000 gets %s seats, want 1", got)
		}
		// Quota violations: ticking Dean adds its panel and its findings.
		tb.do(chromedp.Click(chromedp.CSS(`#quota-sweep-m-dean`)))
		tb.waitFor("the Dean panel", `!!document.querySelector('#quota-sweep [data-role=sweep-panel][data-method=dean] svg')`)
		if n := eval[int](tb, `document.querySelectorAll('#quota-sweep svg [data-quota]').length`); n == 0 {
			t.Error("no quota violation is marked on the chart")
		}
		tb.checkClean(origin)
	})
}

// jsString quotes s as a JavaScript string literal.
func jsString(s string) string {
	r := strings.NewReplacer(`\`, `\\`, `'`, `\'`, "\n", `\n`)
	return "'" + r.Replace(s) + "'"
}
