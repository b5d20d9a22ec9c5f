package main

// Embedding tests: calculators in a page that is not the site's, with its
// own styles. The page must look the same with a calculator as without one
// (nothing of the calculator's styles reaches it), the calculator must look
// its own (nothing of the page's reaches in but the custom properties that
// theme it), and a calculator that cannot start must say why in one line.

import (
	"encoding/json"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"testing"

	cdppage "github.com/chromedp/cdproto/page"
	"github.com/chromedp/chromedp"
)

// embedHost names the host page written into the built site: a council's
// own page with one calculator of each form. embedBare is the same page
// without them.
const (
	embedHost = "embed-host"
	embedBare = "embed-bare"
)

// hostCSS is the host page's own stylesheet: the rules a calculator used to
// be restyled by, and the rules its stylesheet used to restyle a page with.
const hostCSS = `html { font-size: 62.5%; }
* { box-sizing: content-box; }
body { margin: 25px; font: 19px/1.9 Georgia, "Times New Roman", serif; color: #2b2118; background: #fbf3e4; letter-spacing: 0.02em; text-align: justify; }
h1 { font-size: 2.4rem; margin: 0 0 1rem; color: #7a1f2b; }
h2 { font-size: 1.1rem; text-transform: uppercase; color: #7a1f2b; }
p { max-width: 32rem; color: #a00000; }
a { color: #0b6b4b; text-decoration: none; border-bottom: 1px dashed; }
ul { list-style: square; padding-left: 3rem; }
table { border: 3px double #777; border-collapse: separate; }
td { padding: 1rem; }
button { background: #f3d; border: 0; padding: 0.5rem 2rem; }
.box { padding: 1rem; border: 2px solid #999; width: 12rem; }
mark { background: #ffe08a; }
@media (max-width: 30rem) { body { margin: 1rem; } }
.themed { --seatsmith-accent: #7a1f2b; --seatsmith-font: Georgia, "Times New Roman", serif; }
`

// hostPage is the host page; calculators adds the script tag and the two
// blocks. Its policy is as strict as the site's.
func hostPage(calculators bool) string {
	script, harbour, school := "", "", ""
	if calculators {
		script = `<script type="module" src="embed/bridge.js"></script>`
		harbour = `<div class="seatsmith" id="harbour" data-seatsmith="compact">
<p class="fallback">The live calculator needs JavaScript and this page opened through a web server.</p>
<script type="application/json">{"title": "Harbour council (invented)", "seats": 15, "method": "webster",
 "units": [{"name": "North", "population": 5200}, {"name": "South", "population": 3900}],
 "claims": [{"id": "north-nine", "kind": "seats", "unit": "North", "seats": 9, "text": "North gets 9 of the 15 seats."}]}</script>
</div>`
		school = `<seatsmith-calculator id="school" mode="compact" class="themed">
<p class="fallback">The live calculator needs JavaScript and this page opened through a web server.</p>
<script type="application/json">{"title": "School board (invented)", "count": "students", "seats": 7, "method": "hamilton",
 "units": [{"name": "Upper", "population": 420}, {"name": "Lower", "population": 310}, {"name": "Annex", "population": 95}]}</script>
</seatsmith-calculator>`
	}
	return `<!doctype html><html lang="en"><head><meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="` + CSP + `">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>The harbour council</title>
<link rel="stylesheet" href="embed-host.css">
` + script + `</head><body>
<h1 data-probe="h1">The harbour council</h1>
<p data-probe="p1">The council has fifteen seats, shared by population. <a data-probe="a" href="#more">Read more</a>.</p>
<h2 data-probe="h2">How the seats fall</h2>
<p data-probe="p2">North gets <mark data-probe="mark" data-claim-ref="north-nine">nine of the fifteen seats</mark>.</p>
` + harbour + `
<ul data-probe="ul"><li data-probe="li">A list of the page's own.</li></ul>
<table data-probe="table"><tr><td data-probe="td">A table cell of the page's own</td></tr></table>
<button data-probe="button" type="button">A button of the page's own</button>
<div data-probe="div" class="box">A box of the page's own.</div>
` + school + `
<p id="more" data-probe="p3">The end of the page.</p>
</body></html>`
}

// writeHostPages writes the host pages and their stylesheet into the
// built site.
func writeHostPages(t testing.TB, dir string) {
	t.Helper()
	for name, text := range map[string]string{
		embedHost + ".html": hostPage(true),
		embedBare + ".html": hostPage(false),
		"embed-host.css":    hostCSS,
		"favicon.ico":       "", // the pages have no icon of their own; the browser asks for this one
	} {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
	}
}

// probeJS returns, as JSON, the computed styles of the host page's own
// elements that a stylesheet of the calculator's could change.
const probeJS = `(() => {
  const props = ['display', 'margin-top', 'margin-right', 'margin-bottom', 'margin-left', 'padding-top', 'padding-left',
    'font-family', 'font-size', 'line-height', 'font-weight', 'color', 'background-color', 'box-sizing', 'max-width',
    'text-transform', 'text-decoration-line', 'letter-spacing', 'text-align', 'list-style-type', 'border-top-width',
    'border-top-style', 'border-bottom-style', 'border-collapse', 'outline-style', 'width'];
  const els = [['html', document.documentElement], ['body', document.body],
    ...[...document.querySelectorAll('[data-probe]')].map(e => [e.dataset.probe, e])];
  const out = {};
  for (const [k, e] of els) {
    const cs = getComputedStyle(e);
    out[k] = Object.fromEntries(props.filter(p => p !== 'width' || k === 'div').map(p => [p, cs.getPropertyValue(p)]));
  }
  return JSON.stringify(out);
})()`

func (tb *tab) probes() map[string]map[string]string {
	tb.t.Helper()
	var m map[string]map[string]string
	if err := json.Unmarshal([]byte(eval[string](tb, probeJS)), &m); err != nil {
		tb.t.Fatal(err)
	}
	return m
}

// inShadow is a JavaScript expression for the first element matching sel
// in the shadow root of the block with id.
func inShadow(id, sel string) string {
	return `document.getElementById('` + id + `').shadowRoot.querySelector('` + sel + `')`
}

// TestBrowserEmbed holds a page with calculators embedded to the look it
// has without them, and the calculators to their own look and behaviour.
func TestBrowserEmbed(t *testing.T) {
	bctx, origin := servedSite(t)
	writeHostPages(t, builtSite(t))

	bare := newTab(t, bctx)
	bare.do(chromedp.Navigate(origin + embedBare + ".html"))
	bare.waitFor("the page", `document.readyState === 'complete'`)
	want := bare.probes()

	tb := newTab(t, bctx)
	tb.do(chromedp.Navigate(origin + embedHost + ".html"))
	tb.waitFor("every calculator live", allLive)
	got := tb.probes()
	var diffs []string
	for el, ps := range want {
		for p, v := range ps {
			if got[el][p] != v {
				diffs = append(diffs, el+" "+p+": "+v+" without a calculator, "+got[el][p]+" with")
			}
		}
	}
	sort.Strings(diffs)
	if len(diffs) > 0 {
		t.Errorf("the calculators changed the host page's styles:\n  %s", strings.Join(diffs, "\n  "))
	}
	t.Logf("%d host elements × %d properties the same with and without the calculators", len(want), len(want["body"]))

	// Both forms render live inside their shadow roots: Webster gives North
	// 9 and South 6 of 15; Hamilton gives 7 seats by quotas 3.56, 2.63 and
	// 0.81: the floors 3, 2 and 0, and the two seats left to the largest
	// remainders (Annex .81, Lower .63). Common practice, by hand.
	sameRows(t, "embedded", tb.rows(), []row{{"harbour", "North", "9"}, {"harbour", "South", "6"},
		{"school", "Upper", "3"}, {"school", "Lower", "3"}, {"school", "Annex", "1"}})
	for _, id := range []string{"harbour", "school"} {
		if !eval[bool](tb, inShadow(id, "table.sc-results")+` !== null`) {
			t.Errorf("%s: no results table in its shadow root", id)
		}
		if eval[bool](tb, `!!document.querySelector('#`+id+` > .fallback').checkVisibility()`) {
			t.Errorf("%s: the page's own fallback line still shows", id)
		}
		// The host's p { color: #a00000 }, letter-spacing and justified text
		// stop at the shadow root.
		inside := eval[string](tb, `(() => { const r = `+inShadow(id, ".seatsmith")+`; const p = r.querySelector('p'); const cs = getComputedStyle(p);
  const rs = getComputedStyle(r); return [cs.color, rs.letterSpacing, rs.textAlign, rs.boxSizing].join(' | '); })()`)
		if strings.Contains(inside, "rgb(160, 0, 0)") || !strings.Contains(inside, "| normal | start | border-box") {
			t.Errorf("%s: the page's styles reach inside: %s", id, inside)
		}
	}
	// The host's root font size (62.5%: ten pixels a rem) does not shrink
	// the calculators: they follow the reader's default font size.
	medium := eval[string](tb, `(() => { const s = document.createElement('span'); s.style.fontSize = 'medium'; document.body.append(s); const v = getComputedStyle(s).fontSize; s.remove(); return v; })()`)
	for _, id := range []string{"harbour", "school"} {
		if got := eval[string](tb, `getComputedStyle(`+inShadow(id, ".seatsmith")+`).fontSize`); got != medium {
			t.Errorf("%s: the calculator's font size is %s, want the reader's default %s", id, got, medium)
		}
		if got := eval[string](tb, `getComputedStyle(`+inShadow(id, "table.sc-results")+`).fontSize`); got == "9.3px" {
			t.Errorf("%s: the results table's font size follows the host's root: %s", id, got)
		}
	}
	// The themed calculator takes the host's accent and font; the other
	// keeps its own.
	if got := eval[string](tb, `getComputedStyle(`+inShadow("school", ".seatsmith")+`).borderTopColor`); got != "rgb(122, 31, 43)" {
		t.Errorf("the themed calculator's accent is %s", got)
	}
	if got := eval[string](tb, `getComputedStyle(`+inShadow("school", ".seatsmith")+`).fontFamily`); !strings.HasPrefix(got, "Georgia") {
		t.Errorf("the themed calculator's font is %s", got)
	}
	if got := eval[string](tb, `getComputedStyle(`+inShadow("harbour", ".seatsmith")+`).fontFamily`); strings.Contains(got, "Georgia") {
		t.Errorf("the page's font reaches the calculator: %s", got)
	}

	// The claim in the host's text holds, and follows an edit made with the
	// keyboard inside the shadow root.
	if got := eval[string](tb, `document.querySelector('[data-claim-ref="north-nine"]').dataset.holds`); got != "true" {
		t.Errorf("the claim in the page's text shows holds=%s", got)
	}
	// Tab from the page's link goes into the first calculator.
	tb.do(chromedp.Focus(chromedp.CSS(`[data-probe="a"]`)), chromedp.KeyEvent("\t"))
	if got := eval[string](tb, `document.activeElement.id + ' ' + (document.activeElement.shadowRoot && document.activeElement.shadowRoot.activeElement ? document.activeElement.shadowRoot.activeElement.localName : '')`); !strings.HasPrefix(got, "harbour ") || got == "harbour " {
		t.Errorf("Tab after the page's link focuses %q, want a control of the harbour calculator", got)
	}
	tb.do(chromedp.Evaluate[chromedp.Void](`{ const f = `+inShadow("harbour", `[data-field="seats"]`)+`; f.focus(); f.select(); }`), chromedp.KeyEvent("13"))
	tb.waitFor("13 seats", inShadow("harbour", "table.sc-results")+`.dataset.house === '13'`)
	if got := eval[string](tb, `document.activeElement.id + ' ' + `+inShadow("harbour", ":focus")+`.getAttribute('data-field')`); got != "harbour seats" {
		t.Errorf("focus after the edit: %q", got)
	}
	tb.waitFor("the claim in the text not to hold", `document.querySelector('[data-claim-ref="north-nine"]').dataset.holds === 'false'`)
	tb.checkClean(origin)

	for _, w := range []int64{390, 1280} {
		saveShot(t, tb, embedHost+"-"+strconv.FormatInt(w, 10)+".jpg", w)
	}
}

// linesJS counts, for each calculator, the lines it shows about not being
// live: the "not live" note and the alert saying why it could not start.
const linesJS = `JSON.stringify(Object.fromEntries([...document.querySelectorAll('[data-seatsmith], seatsmith-calculator')].map(h => {
  const r = h.shadowRoot || h;
  const lines = [...r.querySelectorAll('[data-role="static-note"], [data-role="not-live"], [data-role="engine-error"]')].filter(e => e.checkVisibility());
  return [h.id, lines.map(e => e.textContent)];
})))`

func (tb *tab) notLiveLines() map[string][]string {
	tb.t.Helper()
	var m map[string][]string
	if err := json.Unmarshal([]byte(eval[string](tb, linesJS)), &m); err != nil {
		tb.t.Fatal(err)
	}
	return m
}

// oneLine requires exactly one such line in every calculator, holding
// want.
func oneLine(t *testing.T, lines map[string][]string, want string) {
	t.Helper()
	if len(lines) == 0 {
		t.Fatal("no calculators")
	}
	for id, ls := range lines {
		if len(ls) != 1 || !strings.Contains(ls[0], want) {
			t.Errorf("%s shows %d lines about not being live, want one saying %q: %q", id, len(ls), want, ls)
		}
	}
}

// TestBrowserFallbacks opens calculators where they cannot start: a page
// opened from a file, with JavaScript off and in a browser without
// WebAssembly. Each keeps what it showed and says why in one line.
func TestBrowserFallbacks(t *testing.T) {
	bctx, origin := servedSite(t)
	dir := builtSite(t)
	writeHostPages(t, dir)
	const site = "devices"
	prerendered := len(goldenRows(t, site))
	hostFallback := `JSON.stringify([...document.querySelectorAll('.fallback')].map(p => p.checkVisibility()))`

	t.Run("from a file", func(t *testing.T) {
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate("file://" + filepath.ToSlash(filepath.Join(dir, site+".html"))))
		tb.waitFor("the page", `document.readyState === 'complete'`)
		if n := len(tb.rows()); n != prerendered {
			t.Errorf("%d result rows from a file, %d prerendered", n, prerendered)
		}
		oneLine(t, tb.notLiveLines(), "opened through a web server")
		saveShot(t, tb, site+"-file-390.jpg", 390)

		th := newTab(t, bctx)
		th.do(chromedp.Navigate("file://" + filepath.ToSlash(filepath.Join(dir, embedHost+".html"))))
		th.waitFor("the page", `document.readyState === 'complete'`)
		if got := eval[string](th, hostFallback); got != "[true,true]" {
			t.Errorf("the page's own lines in the blocks show: %s", got)
		}
	})

	t.Run("without JavaScript", func(t *testing.T) {
		tb := openPage(t, bctx, origin, site, 390, false)
		if n := len(tb.rows()); n != prerendered {
			t.Errorf("%d result rows without JavaScript, %d prerendered", n, prerendered)
		}
		oneLine(t, tb.notLiveLines(), "needs JavaScript")
		th := openPage(t, bctx, origin, embedHost, 390, false)
		if got := eval[string](th, hostFallback); got != "[true,true]" {
			t.Errorf("the page's own lines in the blocks show: %s", got)
		}
		if eval[bool](th, `[...document.querySelectorAll('script[type="application/json"]')].some(s => s.checkVisibility())`) {
			t.Error("a block's JSON shows")
		}
		saveShot(t, th, embedHost+"-noscript-390.jpg", 390)
	})

	t.Run("without WebAssembly", func(t *testing.T) {
		open := func(name string) *tab {
			tb := newTab(t, bctx)
			if _, err := chromedp.Call(tb.ctx, cdppage.AddScriptToEvaluateOnNewDocument, cdppage.AddScriptToEvaluateOnNewDocumentParams{Source: `delete globalThis.WebAssembly;`}); err != nil {
				t.Fatalf("removing WebAssembly: %v", err)
			}
			tb.setWidth(390)
			tb.do(chromedp.Navigate(origin + name + ".html"))
			// A shadow root shows its calculator once the stylesheet is in.
			tb.waitFor("every calculator to give up", `[...document.querySelectorAll('[data-seatsmith], seatsmith-calculator')].every(e => e.dataset.state === 'error' && (!e.shadowRoot || e.shadowRoot.querySelector('.seatsmith[data-state="error"]')))`)
			return tb
		}
		tb := open(site)
		if n := len(tb.rows()); n != prerendered {
			t.Errorf("%d result rows without WebAssembly, %d prerendered", n, prerendered)
		}
		oneLine(t, tb.notLiveLines(), "no WebAssembly")
		oneLine(t, tb.notLiveLines(), "computed when the page was built")
		tb.checkClean(origin)

		th := open(embedHost)
		oneLine(t, th.notLiveLines(), "no WebAssembly")
		units := eval[string](th, `JSON.stringify(['harbour', 'school'].map(id => [...`+`document.getElementById(id).shadowRoot.querySelectorAll('[data-role="fallback-units"] tbody th')].map(th => th.textContent).join(',')))`)
		if units != `["North,South","Upper,Lower,Annex"]` {
			t.Errorf("the plain tables show the units %s", units)
		}
		th.checkClean(origin)
		saveShot(t, th, embedHost+"-nowasm-390.jpg", 390)
	})
}

// saveShot writes a screenshot of the page at width w to the artifacts.
func saveShot(t *testing.T, tb *tab, name string, w int64) {
	t.Helper()
	tb.setWidth(w)
	tb.settle()
	shot, err := chromedp.Run(tb.ctx, chromedp.FullScreenshot(85))
	if err != nil {
		t.Fatalf("screenshot: %v", err)
	}
	saveArtifact(t, name, shot)
	t.Logf("screenshot %s", filepath.Join(artifactsDir(t), name))
}
