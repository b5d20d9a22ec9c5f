package main

import (
	"encoding/csv"
	"encoding/json"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	cdppage "github.com/chromedp/cdproto/page"
	"github.com/chromedp/chromedp"
)

// embedPage writes a page of the built site holding one calculator block
// (invented numbers) and returns its name. Its content has the side
// padding of a host page's, into which a calculator on a phone reaches by
// 0.3rem. The page styles calculators itself (it loads the calculators' stylesheet
// and sets --seatsmith-styled), so its calculator stays in the page, where
// the tests' selectors reach it; TestBrowserEmbed covers the shadow root.
func embedPage(t *testing.T, dir, name, id, block string) string {
	t.Helper()
	html := `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>` + name + `</title>
<link rel="stylesheet" href="embed/seatsmith.css"><style>main { padding: 0 1rem; } :root { --seatsmith-styled: 1; }</style>
<script type="module" src="embed/bridge.js"></script></head><body><main>
<h1>` + name + `</h1>
<div class="seatsmith" id="` + id + `" data-seatsmith="compact">
<script type="application/json">` + block + `</script>
</div></main></body></html>`
	if err := os.WriteFile(filepath.Join(dir, name+".html"), []byte(html), 0o644); err != nil {
		t.Fatal(err)
	}
	os.WriteFile(filepath.Join(dir, "favicon.ico"), nil, 0o644)
	return name + ".html"
}

// shootPart saves a screenshot of the element sel at width w (a phone
// below 800 px), clipped to it, as artifact name.
func (tb *tab) shootPart(name, sel string, w int64) {
	tb.t.Helper()
	tb.setWidth(w)
	tb.settle()
	var box []float64
	if err := json.Unmarshal([]byte(eval[string](tb, `JSON.stringify((() => { const r = document.querySelector(`+strconv.Quote(sel)+`).getBoundingClientRect();
  return [r.left + scrollX, r.top + scrollY, r.width, r.height]; })())`)), &box); err != nil || len(box) != 4 {
		tb.t.Fatalf("the box of %s: %v", sel, err)
	}
	beyond := true
	res, err := chromedp.Call(tb.ctx, cdppage.CaptureScreenshot, cdppage.CaptureScreenshotParams{
		Clip:                  &cdppage.Viewport{X: box[0], Y: box[1], Width: box[2], Height: box[3], Scale: 1},
		CaptureBeyondViewport: &beyond,
	})
	if err != nil {
		tb.t.Fatalf("screenshot of %s: %v", sel, err)
	}
	artifact(tb.t, name, res.Data)
}

// unitsJS lists a calculator's units as the scenario holds them:
// "name=count" joined by "; ".
func unitsJS(sel string) string {
	return `[...document.querySelectorAll('` + sel + ` [data-field$=".name"]')].map((n) =>
  n.value + '=' + document.querySelector('` + sel + ` [data-field="' + n.dataset.field.replace('.name', '.population') + '"]').value).join('; ')`
}

// TestBrowserData holds the calculator's data in and out and the baseline
// against a proposal to what a reader does: paste cells from a spreadsheet,
// load a semicolon file, drop a file with grouped thousands, export a tie,
// pin a baseline, edit, share the link.
func TestBrowserData(t *testing.T) {
	chromiumPath(t)
	dir := builtSite(t)
	bctx, origin := servedSite(t)

	t.Run("spreadsheet paste", func(t *testing.T) {
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate(origin + "calculator.html"))
		tb.waitFor("live", allLive)
		before := eval[string](tb, `document.querySelector('#workbench [data-role=summary]').textContent`)
		paste := "District\tInhabitants\nAlder Reach\t1,204,000\nBirchmoor\t803,500\nCopse End\t412,250\n"
		tb.do(chromedp.Click(chromedp.CSS(`#workbench .sc-csv summary`)),
			chromedp.SetValue(chromedp.CSS(`#workbench [data-field="csv"]`), paste),
			chromedp.Click(chromedp.CSS(`#workbench [data-action="use-csv"]`)))
		tb.waitFor("the column chooser", `!!document.querySelector('#workbench [data-role=chooser]')`)
		if got := eval[string](tb, `[...document.querySelectorAll('#workbench [data-role=chooser] select')].map((s) => s.dataset.column + '=' + s.value).join(' ')`); got != "name=0 count=1 min=-1 max=-1" {
			t.Errorf("the chooser guessed %s", got)
		}
		if got := eval[string](tb, `document.querySelector('#workbench [data-role=chooser] label[for$="col-count"]').textContent`); got != "Population" {
			t.Errorf("the count's column is called %q", got)
		}
		// The chooser fits a phone and passes axe-core.
		tb.shootPart("chooser-phone.png", "#workbench [data-role=chooser]", 390)
		tb.setWidth(320)
		tb.settle()
		if found := tb.overflowing(); len(found) > 0 {
			t.Errorf("at 320 px %d elements stick out:%s", len(found), offenderReport(found))
		}
		if vs := tb.axe(axeSource(t)); len(vs) > 0 {
			t.Errorf("axe-core with the chooser open: %d rules broken:%s", len(vs), axeReport(vs))
		}
		tb.setWidth(1280)
		tb.do(chromedp.Click(chromedp.CSS(`#workbench [data-action="use-columns"]`)))
		tb.waitFor("three units", `document.querySelectorAll('#workbench tr[data-unit]').length === 3`)
		if got := eval[string](tb, unitsJS("#workbench")); got != "Alder Reach=1204000; Birchmoor=803500; Copse End=412250" {
			t.Errorf("units %s", got)
		}
		if after := eval[string](tb, `document.querySelector('#workbench [data-role=summary]').textContent`); after == before || !strings.Contains(after, "2,419,750") {
			t.Errorf("the summary after the paste: %q", after)
		}
		tb.checkClean(origin)
	})

	t.Run("semicolon file", func(t *testing.T) {
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate(origin + "party-list.html"))
		tb.waitFor("live", allLive)
		f := filepath.Join(t.TempDir(), "stimmen.csv")
		os.WriteFile(f, []byte("Partei;Stimmen\nAmsel;1.012.500\nBussard;8.250\nDohle;300\n"), 0o644)
		tb.do(chromedp.Click(chromedp.CSS(`#council .sc-csv summary`)),
			chromedp.SetUploadFiles(chromedp.CSS(`#council input[type=file]`), []string{f}))
		// A header over every column: loaded at once.
		tb.waitFor("three parties", `document.querySelectorAll('#council tr[data-unit]').length === 3`)
		if got := eval[string](tb, unitsJS("#council")); got != "Amsel=1012500; Bussard=8250; Dohle=300" {
			t.Errorf("units %s", got)
		}
		if got := eval[string](tb, `document.querySelector('#council [data-role=summary]').textContent`); !strings.Contains(got, "among 3 units") {
			t.Errorf("summary %q", got)
		}
		// A file without a header asks, in the count's words.
		os.WriteFile(f, []byte("Amsel;7\nBussard;5\n"), 0o644)
		tb.do(chromedp.SetUploadFiles(chromedp.CSS(`#council input[type=file]`), []string{f}))
		tb.waitFor("the column chooser", `!!document.querySelector('#council [data-role=chooser]')`)
		if got := eval[string](tb, `document.querySelector('#council [data-role=chooser] label[for$="col-count"]').textContent`); got != "Votes" {
			t.Errorf("the count's column is called %q", got)
		}
		// A bad choice is reported by line and column, inline.
		tb.do(chromedp.SetValue(chromedp.CSS(`#council [data-column=count]`), "0"),
			chromedp.SetValue(chromedp.CSS(`#council [data-column=name]`), "1"),
			chromedp.Click(chromedp.CSS(`#council [data-action="use-columns"]`)))
		tb.waitFor("the error", `(document.querySelector('#council [data-role=notice][data-error]') || {}).textContent?.includes('could not be read')`)
		if note := eval[string](tb, `document.querySelector('#council [data-role=notice]').textContent`); !strings.Contains(note, "line 1") || !strings.Contains(note, "column 1") {
			t.Errorf("the error %q does not name the line and the column", note)
		}
		tb.waitFor("the chooser again", `!!document.querySelector('#council [data-role=chooser]')`)
		tb.checkClean(origin)
	})

	t.Run("thousands file dropped", func(t *testing.T) {
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate(origin + "calculator.html"))
		tb.waitFor("live", allLive)
		tb.do(chromedp.Evaluate[chromedp.Void](`(() => {
  const dt = new DataTransfer();
  dt.items.add(new File(['Alder Reach\t1 204 000\nBirchmoor\t803 500\nCopse End\t12 250\n'], 'counts.txt', {type: 'text/plain'}));
  const target = document.querySelector('#workbench [data-field="seats"]');
  target.dispatchEvent(new DragEvent('dragover', {dataTransfer: dt, bubbles: true, cancelable: true}));
  target.dispatchEvent(new DragEvent('drop', {dataTransfer: dt, bubbles: true, cancelable: true}));
})()`))
		// No header: the reader confirms the guess.
		tb.chooseColumns("#workbench")
		tb.waitFor("three units", `document.querySelectorAll('#workbench tr[data-unit]').length === 3`)
		if got := eval[string](tb, unitsJS("#workbench")); got != "Alder Reach=1204000; Birchmoor=803500; Copse End=12250" {
			t.Errorf("units %s", got)
		}
		tb.checkClean(origin)
	})

	t.Run("tie export", func(t *testing.T) {
		// Jefferson, 3 seats, 2000 : 1000 : 1000: four equal priorities of
		// 1000 for the last two seats, left open (worked by hand).
		name := embedPage(t, dir, "tie-export-test", "tied", `{"seats": 3, "method": "jefferson", "units": [{"name": "Amber", "population": 2000}, {"name": "Birch", "population": 1000}, {"name": "Cobalt, \"the third\"", "population": 1000}]}`)
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate(origin + name))
		tb.waitFor("live", allLive)
		tb.do(chromedp.Evaluate[chromedp.Void](`window.__blobs = []; const o = URL.createObjectURL; URL.createObjectURL = (b) => { window.__blobs.push(b); return o.call(URL, b); }; HTMLAnchorElement.prototype.click = function () {};`))
		tb.do(chromedp.Click(chromedp.CSS(`#tied [data-action="export-csv"]`)))
		tb.waitFor("the CSV export", `window.__blobs.length === 1`)
		text := eval[string](tb, `window.__blobs[0].text()`)
		rows, err := csv.NewReader(strings.NewReader(text)).ReadAll()
		if err != nil || len(rows) != 4 {
			t.Fatalf("the export is not a CSV table of three units (%v):\n%s", err, text)
		}
		col := map[string]int{}
		for j, h := range rows[0] {
			col[h] = j
		}
		numeric := []string{"house_size", "default_min", "population", "min", "quota", "lower_quota", "upper_quota", "seats", "unassigned", "next_priority", "gain_margin"}
		tied := 0
		for _, r := range rows[1:] {
			for _, k := range numeric {
				j, ok := col[k]
				if !ok {
					t.Fatalf("no %s column: %v", k, rows[0])
				}
				if _, err := strconv.ParseFloat(r[j], 64); err != nil {
					t.Errorf("%s of %s is %q, not a number", k, r[col["unit"]], r[j])
				}
			}
			if r[col["method"]] != "jefferson" || r[col["tie_rule"]] != "none" {
				t.Errorf("settings %s, %s", r[col["method"]], r[col["tie_rule"]])
			}
			if r[col["tied"]] == "true" {
				tied++
			}
		}
		if tied != 3 || rows[1][col["unassigned"]] != "2" || rows[3][col["unit"]] != `Cobalt, "the third"` {
			t.Errorf("the tie is not marked (%d tied rows):\n%s", tied, text)
		}
		tb.checkClean(origin)
	})

	t.Run("baseline against proposal", func(t *testing.T) {
		name := embedPage(t, dir, "baseline-test", "council", `{"seats": 10, "method": "jefferson", "count": "votes", "units": [{"name": "Amber List", "population": 4000}, {"name": "Birch Party", "population": 3000}, {"name": "Cobalt Alliance", "population": 2000}, {"name": "Dune Group", "population": 650}]}`)
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate(origin + name))
		tb.waitFor("live", allLive)
		tb.do(chromedp.Click(chromedp.CSS(`#council [data-action="pin"]`)))
		tb.waitFor("the comparison", `!!document.querySelector('#council [data-role=baseline]') && !!document.querySelector('#council [data-action=unpin]')`)
		if got := eval[string](tb, `document.querySelector('#council [data-role=baseline-summary]').textContent`); !strings.Contains(got, "No unit's seats change") {
			t.Errorf("just pinned: %q", got)
		}
		// One committed edit: on a loaded machine each keystroke's answer
		// may outlast the next keystroke, which then restarts the engine.
		tb.do(chromedp.SetValue(chromedp.CSS(`#council [data-field="units.2.population"]`), "2900"),
			chromedp.Evaluate[chromedp.Void](`document.querySelector('#council [data-field="units.2.population"]').dispatchEvent(new Event('change', {bubbles: true}))`))
		tb.waitFor("a seat to move", `!!document.querySelector('#council tr[data-diff-unit="Cobalt Alliance"][data-change="1"]')`)
		summary := eval[string](tb, `document.querySelector('#council [data-role=baseline-summary]').textContent`)
		if !strings.Contains(summary, "1 seat moves") || !strings.Contains(summary, "Cobalt Alliance +1") || !strings.Contains(summary, "Amber List −1") {
			t.Errorf("summary %q", summary)
		}
		if got := eval[string](tb, `document.querySelector('#council tr[data-diff-unit="Cobalt Alliance"] .sc-shift').textContent`); got != "▲ +1 seat gained" {
			t.Errorf("the change reads %q", got)
		}
		view := eval[string](tb, `document.querySelector('#council [data-role=baseline]').textContent`)
		tb.waitFor("the link to hold both", `/council=~[^&]*![^&]+/.test(location.hash)`)
		link := eval[string](tb, `location.href`)
		frag := link[strings.Index(link, "#"):]
		t.Logf("the link's fragment: %s (%d characters)", frag, len(frag))

		tb.shootPart("baseline-desktop.png", "#council", 1280)
		tb.shootPart("baseline-phone.png", "#council [data-role=baseline]", 390)
		tb.setWidth(320)
		tb.settle()
		if found := tb.overflowing(); len(found) > 0 {
			t.Errorf("at 320 px %d elements stick out:%s", len(found), offenderReport(found))
		}
		if vs := tb.axe(axeSource(t)); len(vs) > 0 {
			t.Errorf("axe-core at 320 px: %d rules broken:%s", len(vs), axeReport(vs))
		}
		tb.setWidth(1280)
		if vs := tb.axe(axeSource(t)); len(vs) > 0 {
			t.Errorf("axe-core at 1280 px: %d rules broken:%s", len(vs), axeReport(vs))
		}

		// The link reopens the same view: baseline, proposal, comparison.
		tb2 := newTab(t, bctx)
		tb2.do(chromedp.Navigate(link))
		tb2.waitFor("the comparison", allLive+` && !!document.querySelector('#council [data-role=baseline]')`)
		if got := eval[string](tb2, `document.querySelector('#council [data-role=baseline]').textContent`); got != view {
			t.Errorf("the link reopens\n%s\nnot\n%s", got, view)
		}
		if got := eval[string](tb2, `document.querySelector('#council [data-field="units.2.population"]').value`); got != "2900" {
			t.Errorf("the reopened proposal has %s", got)
		}
		// Unpinning clears it.
		tb2.do(chromedp.Click(chromedp.CSS(`#council [data-action="unpin"]`)))
		tb2.waitFor("no comparison", `!document.querySelector('#council [data-role=baseline]') && !!document.querySelector('#council [data-action=pin]')`)
		tb2.waitFor("the link without a baseline", `/council=~[^&!]*$/.test(location.hash)`)
		// A damaged link says so inline and shows the block's numbers.
		tb3 := newTab(t, bctx)
		tb3.do(chromedp.Navigate(origin + name + "#council=~u1%25~!q"))
		tb3.waitFor("live", allLive)
		if note := eval[string](tb3, `(document.querySelector('#council [data-role=notice][data-error]') || {}).textContent || ''`); !strings.Contains(note, "could not be read") {
			t.Errorf("a damaged link: notice %q", note)
		}
		tb.checkClean(origin)
		tb2.checkClean(origin)
		tb3.checkClean(origin)
	})
}
