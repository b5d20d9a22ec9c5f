package main

// The engine in the browser never freezes or loses the page: it runs in a
// Web Worker, an edit supersedes long work, and an engine that stops is
// started afresh for the next edit.

import (
	"encoding/json"
	"net/http/httptest"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/cdproto/target"
	"github.com/chromedp/chromedp"
)

// workerTarget returns the target of the page's engine worker.
func (tb *tab) workerTarget() *target.Info {
	tb.t.Helper()
	for i := 0; i < 100; i++ {
		ts, err := chromedp.Targets(tb.ctx)
		if err != nil {
			tb.t.Fatal(err)
		}
		for _, x := range ts {
			if x.Type == "worker" {
				return x
			}
		}
		time.Sleep(100 * time.Millisecond)
	}
	tb.t.Fatal("the page runs no worker")
	return nil
}

// bigScenario is a calculator scenario of n units by method, each with at
// least min seats, as a link's fragment for calculator id.
func bigScenario(id string, n, seats int, method string, min int) string {
	type unit struct {
		Name       string `json:"name"`
		Population string `json:"population"`
	}
	s := struct {
		Seats  string `json:"seats"`
		Method string `json:"method"`
		Min    string `json:"min,omitempty"`
		Units  []unit `json:"units"`
	}{Seats: strconv.Itoa(seats), Method: method}
	if min > 0 {
		s.Min = strconv.Itoa(min)
	}
	for i := 0; i < n; i++ {
		s.Units = append(s.Units, unit{"District " + strconv.Itoa(i+1), strconv.Itoa(10000 + (i*7919)%90000)})
	}
	b, _ := json.Marshal(s)
	return "#" + id + "=" + b64url(string(b))
}

func TestBrowserEngine(t *testing.T) {
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

	t.Run("an edit while long work runs", func(t *testing.T) {
		tb := newTabFor(t, bctx, 3*time.Minute)
		// Two thousand units by Hamilton's method with a minimum of one
		// seat: their margins are proven stretch by stretch for every
		// unit, minutes of work.
		tb.do(chromedp.Navigate(origin + "calculator.html" + bigScenario("workbench", 2000, 4000, "hamilton", 1)))
		tb.waitFor("live", allLive)
		tb.waitFor("the margins button", `!!document.querySelector('#workbench [data-action="margins"]')`)
		tb.do(chromedp.Click(chromedp.CSS(`#workbench [data-action="margins"]`)))
		tb.waitFor("work or its end", `!!document.querySelector('#workbench [data-role="busy"]') || !document.querySelector('#workbench [data-role=margins-pending]')`)
		if eval[bool](tb, `!!document.querySelector('#workbench [data-role="busy"]')`) {
			// The page answers while the engine works: the line counts the
			// seconds, and the reader can type.
			first := eval[string](tb, `document.querySelector('#workbench [data-role="busy"] span').textContent`)
			tb.waitFor("the clock to move", `(() => { const s = document.querySelector('#workbench [data-role="busy"] span'); return !s || s.textContent !== `+strconv.Quote(first)+`; })()`)
			// The work may end meanwhile: scroll to the busy line only if
			// it is still there.
			tb.do(chromedp.Evaluate[chromedp.Void](`document.querySelector('#workbench [data-role="busy"]')?.scrollIntoView()`))
			png, err := chromedp.Run(tb.ctx, chromedp.CaptureScreenshot())
			if err != nil {
				t.Fatal(err)
			}
			artifact(t, "calculator-working-desktop.png", png)
		} else {
			t.Log("the margins took less than the bridge's long-work threshold: nothing long to supersede")
		}
		sel := chromedp.CSS(`#workbench [data-field="seats"]`)
		tb.do(chromedp.Focus(sel), chromedp.Evaluate[chromedp.Void](`document.activeElement.select()`), chromedp.SendKeys(sel, "4100"))
		if got := eval[string](tb, `document.querySelector('#workbench [data-field="seats"]').value`); got != "4100" {
			t.Errorf("the seats field holds %q while the engine works", got)
		}
		// The edit supersedes the margins: its results come, without them.
		tb.waitFor("the edited house", `document.querySelector('#workbench table.sc-results').dataset.house === '4100' && !document.querySelector('#workbench').dataset.busy`)
		if !eval[bool](tb, `!!document.querySelector('#workbench [data-role=margins-pending]')`) {
			t.Error("the superseded margins were shown")
		}
		if got := eval[string](tb, `document.activeElement.getAttribute('data-field')`); got != "seats" {
			t.Errorf("focus moved to %q", got)
		}
		// Stop ends long work and keeps the results.
		tb.do(chromedp.Click(chromedp.CSS(`#workbench [data-action="margins"]`)))
		tb.waitFor("work or its end", `!!document.querySelector('#workbench [data-role="busy"]') || !document.querySelector('#workbench [data-role=margins-pending]')`)
		if eval[bool](tb, `!!document.querySelector('#workbench [data-role="busy"]')`) {
			tb.do(chromedp.Click(chromedp.CSS(`#workbench [data-action="stop"]`)))
			tb.waitFor("the work to stop", `!document.querySelector('#workbench [data-role="busy"]') && !document.querySelector('#workbench').dataset.busy`)
			if note := eval[string](tb, `document.querySelector('#workbench [data-role=notice]').textContent`); !strings.Contains(note, "Stopped") {
				t.Errorf("notice after Stop: %q", note)
			}
			if got := eval[string](tb, `document.querySelector('#workbench table.sc-results').dataset.house`); got != "4100" {
				t.Errorf("after Stop the results are for %s seats", got)
			}
		}
		// The engine, started afresh, answers the next edit.
		tb.do(chromedp.Focus(sel), chromedp.Evaluate[chromedp.Void](`document.activeElement.select()`), chromedp.SendKeys(sel, "4200"))
		tb.waitFor("the next edit", `document.querySelector('#workbench table.sc-results').dataset.house === '4200'`)
		tb.checkClean(origin)
	})

	t.Run("an engine that stops", func(t *testing.T) {
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate(origin + "devices.html"))
		tb.waitFor("live", allLive)
		// Stop the Go program in the worker, as a fatal error would.
		w := tb.workerTarget()
		wctx, cancel := chromedp.NewContext(tb.ctx, chromedp.WithTargetID(w.TargetID))
		defer cancel()
		if _, err := chromedp.Run(wctx, chromedp.Evaluate[chromedp.Void](`go.exited = true`)); err != nil {
			t.Fatalf("reaching the worker: %v", err)
		}
		sel := chromedp.CSS(`#carts [data-field="units.0.population"]`)
		tb.do(chromedp.Focus(sel), chromedp.Evaluate[chromedp.Void](`document.activeElement.select()`), chromedp.SendKeys(sel, "470"))
		tb.waitFor("the message", `!!document.querySelector('#carts [data-role="engine-error"]')`)
		msg := eval[string](tb, `document.querySelector('#carts [data-role="engine-error"]').textContent`)
		if !strings.Contains(msg, "engine stopped") || !strings.Contains(msg, "next edit") {
			t.Errorf("message %q", msg)
		}
		// The next edit gets a fresh engine.
		tb.do(chromedp.Focus(sel), chromedp.Evaluate[chromedp.Void](`document.activeElement.select()`), chromedp.SendKeys(sel, "471"))
		tb.waitFor("the new total", `document.querySelector("#carts [data-role=summary]").textContent.includes("3,926") && !document.querySelector('#carts [data-role="engine-error"]')`)
		if st := eval[string](tb, `document.querySelector('#carts').dataset.state`); st != "live" {
			t.Errorf("state %q after the fresh engine answered", st)
		}
	})

	t.Run("the offline file runs its engine in a worker", func(t *testing.T) {
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate("file://" + dir + "/offline.html"))
		tb.waitFor("live", allLive)
		if w := tb.workerTarget(); !strings.HasPrefix(w.URL, "blob:") {
			t.Errorf("the offline file's worker comes from %s", w.URL)
		}
	})
}
