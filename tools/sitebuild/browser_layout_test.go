package main

// Layout tests: every page at phone and desktop widths, with its
// calculators prerendered (JavaScript off) and live. Nothing a calculator
// shows may reach past the calculator's box, and nothing drawn in a chart
// past the chart: a reader on a phone must never scroll sideways or miss a
// label. Screenshots of every page at every width (JPEG, live, as the page
// opens; prerendered at 390 px) are written to the folder SEATSMITH_ARTIFACTS names (a fresh temporary
// folder otherwise; the test logs which).

import (
	"context"
	"encoding/json"
	"fmt"
	"net/http/httptest"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/chromedp/cdproto/emulation"
	"github.com/chromedp/chromedp"
	"github.com/chromedp/chromedp/kb"
)

// layoutWidths are the viewport widths every page is held to: a small
// phone, a common phone and a laptop.
var layoutWidths = []int64{320, 390, 1280}

// widthsToTest are layoutWidths, or the widths SEATSMITH_LAYOUT_WIDTHS
// lists (comma-separated) for a look at others.
func widthsToTest(t testing.TB) []int64 {
	s := os.Getenv("SEATSMITH_LAYOUT_WIDTHS")
	if s == "" {
		return layoutWidths
	}
	var ws []int64
	for _, f := range strings.Split(s, ",") {
		w, err := strconv.ParseInt(strings.TrimSpace(f), 10, 64)
		if err != nil || w < 200 {
			t.Fatalf("SEATSMITH_LAYOUT_WIDTHS: %q is not a width in pixels", f)
		}
		ws = append(ws, w)
	}
	return ws
}

var (
	artifactsOnce sync.Once
	artifactsPath string
	artifactsErr  error
)

// artifactsDir is the folder screenshots go to: SEATSMITH_ARTIFACTS, or a
// temporary folder made once per run and left for the reader to look at.
func artifactsDir(t testing.TB) string {
	t.Helper()
	artifactsOnce.Do(func() {
		if d := os.Getenv("SEATSMITH_ARTIFACTS"); d != "" {
			artifactsPath, artifactsErr = d, os.MkdirAll(d, 0o755)
			return
		}
		artifactsPath, artifactsErr = os.MkdirTemp("", "seatsmith-artifacts-")
	})
	if artifactsErr != nil {
		t.Fatalf("artifacts folder: %v", artifactsErr)
	}
	return artifactsPath
}

// saveArtifact writes one file to the artifacts folder.
func saveArtifact(t testing.TB, name string, data []byte) {
	t.Helper()
	if err := os.WriteFile(filepath.Join(artifactsDir(t), name), data, 0o644); err != nil {
		t.Fatal(err)
	}
}

// calcRoots selects every calculator on a page: the calculator blocks (in
// either form), the projection blocks and the election blocks.
const calcRoots = `[data-seatsmith], seatsmith-calculator, [data-projection], [data-election]`

// rootsJS is a JavaScript expression for every calculator's root: the
// block itself, or the root in its shadow root.
const rootsJS = `[...document.querySelectorAll('` + calcRoots + `')].flatMap(r => r.shadowRoot ? [...r.shadowRoot.querySelectorAll('.seatsmith')] : [r])`

// overflowJS lists every visible element of a calculator that reaches past
// the calculator's box, every element of a chart that reaches past its
// chart, every calculator wider than the page, every box inside a
// calculator whose content needs scrolling sideways and every select too
// narrow for the option it shows. Each offender comes
// with a selector that names its calculator and its nearest ancestors.
const overflowJS = `(() => {
  const slack = 0.5;
  const vw = document.documentElement.clientWidth;
  const name = (el) => {
    let s = el.localName;
    if (el.id) return s + '#' + el.id;
    for (const c of el.classList) s += '.' + c;
    for (const a of ['data-role', 'data-part', 'data-method', 'data-field', 'data-action']) {
      if (el.hasAttribute(a)) { s += '[' + a + '="' + el.getAttribute(a) + '"]'; break; }
    }
    return s;
  };
  const path = (el, root) => {
    const parts = [];
    for (let e = el; e && e !== root && parts.length < 4; e = e.parentElement) parts.unshift(name(e));
    return '#' + rootID(root) + ' ' + parts.join(' > ');
  };
  const rootID = (root) => root.id || (root.getRootNode().host || {}).id || '';
  const out = [];
  const measure = document.createElement('canvas').getContext('2d');
  const add = (root, el, what, r, box) => out.push({calc: rootID(root), sel: path(el, root), what,
    right: Math.round(r.right - box.right), left: Math.round(box.left - r.left)});
  for (const root of ` + rootsJS + `) {
    const rb = root.getBoundingClientRect();
    if (rb.right > vw + slack || rb.left < -slack) out.push({calc: rootID(root), sel: '#' + rootID(root), what: 'page',
      right: Math.round(rb.right - vw), left: Math.round(-rb.left)});
    for (const el of root.querySelectorAll('*')) {
      if (!el.checkVisibility({visibilityProperty: true})) continue;
      const r = el.getBoundingClientRect();
      if (r.width === 0 && r.height === 0) continue;
      if (r.right > rb.right + slack || r.left < rb.left - slack) add(root, el, 'calculator', r, rb);
      const svg = el.ownerSVGElement;
      if (svg && svg.checkVisibility()) {
        const sb = svg.getBoundingClientRect();
        if (r.right > sb.right + slack || r.left < sb.left - slack || r.top < sb.top - slack || r.bottom > sb.bottom + slack) add(root, el, 'chart', r, sb);
      }
      if (el.localName === 'select' && el.selectedOptions.length) {
        // A select shows its chosen option cut short when the box is too narrow.
        const cs = getComputedStyle(el);
        measure.font = cs.font;
        const need = measure.measureText(el.selectedOptions[0].text).width;
        const room = el.clientWidth - parseFloat(cs.paddingLeft) - parseFloat(cs.paddingRight) - 16;
        if (need > room) out.push({calc: rootID(root), sel: path(el, root), what: 'cut', right: Math.round(need - room), left: 0});
      }
      if (!svg && el.localName !== 'svg') {
        const ox = getComputedStyle(el).overflowX;
        if ((ox === 'auto' || ox === 'scroll') && el.scrollWidth > el.clientWidth + 1) {
          out.push({calc: rootID(root), sel: path(el, root), what: 'scrolls', right: el.scrollWidth - el.clientWidth, left: 0});
        }
      }
    }
  }
  return JSON.stringify(out);
})()`

// An offender is an element found by overflowJS.
type offender struct {
	Calc, Sel, What string
	Right, Left     int
}

// overflowing returns the offenders on the page as it is.
func (tb *tab) overflowing() []offender {
	tb.t.Helper()
	var found []offender
	if err := json.Unmarshal([]byte(eval[string](tb, overflowJS)), &found); err != nil {
		tb.t.Fatal(err)
	}
	return found
}

// offenderReport groups offenders by selector, most frequent first, for a
// failure message.
func offenderReport(found []offender) string {
	type group struct {
		key   string
		n     int
		worst int
	}
	by := map[string]*group{}
	for _, o := range found {
		k := o.What + ": " + o.Sel
		g := by[k]
		if g == nil {
			g = &group{key: k}
			by[k] = g
		}
		g.n++
		g.worst = max(g.worst, o.Right, o.Left)
	}
	var gs []*group
	for _, g := range by {
		gs = append(gs, g)
	}
	sort.Slice(gs, func(i, j int) bool {
		if gs[i].n != gs[j].n {
			return gs[i].n > gs[j].n
		}
		return gs[i].key < gs[j].key
	})
	var b strings.Builder
	for k, g := range gs {
		if k == 40 {
			fmt.Fprintf(&b, "\n  … and %d more selectors", len(gs)-k)
			break
		}
		fmt.Fprintf(&b, "\n  %4d × %s (up to %d px past)", g.n, g.key, g.worst)
	}
	return b.String()
}

// openFolds opens every folded section of every calculator, so that what
// they hold is measured too, and waits for a seat order asked for on
// opening.
func (tb *tab) openFolds(live bool) {
	tb.t.Helper()
	tb.do(chromedp.Evaluate[chromedp.Void](`{
  const ds = ` + rootsJS + `.flatMap(r => [...r.querySelectorAll('details')]);
  window.__scFolds = window.__scFolds || ds.map(d => d.open);
  for (const d of ds) d.open = true;
}`))
	if live {
		tb.waitFor("every seat order", `!`+rootsJS+`.some(r => r.querySelector('[data-role="order-pending"]'))`)
	}
	tb.settle()
}

// closeFolds puts every folded section back as the page opened it.
func (tb *tab) closeFolds() {
	tb.t.Helper()
	tb.do(chromedp.Evaluate[chromedp.Void](`{
  const ds = ` + rootsJS + `.flatMap(r => [...r.querySelectorAll('details')]);
  (window.__scFolds || []).forEach((open, i) => { if (ds[i]) ds[i].open = open; });
}`))
	tb.settle()
}

// settle lays the page out again after a change and gives it a moment to
// paint. (Animation frames would be neater, but a page without scripts
// runs none.)
func (tb *tab) settle() {
	tb.t.Helper()
	tb.do(chromedp.Evaluate[chromedp.Void](`document.documentElement.getBoundingClientRect()`), chromedp.Sleep(100*time.Millisecond))
}

// setWidth emulates a viewport of width CSS pixels: a phone (touch, mobile
// viewport) below 800, a desktop window above.
func (tb *tab) setWidth(w int64) {
	tb.t.Helper()
	if w < 800 {
		tb.do(chromedp.EmulateViewport(w, 800, chromedp.EmulateScale(1), chromedp.EmulatePortrait, chromedp.EmulateMobile, chromedp.EmulateTouch))
	} else {
		tb.do(chromedp.EmulateViewport(w, 900))
	}
}

// servedSite builds the site, serves it and starts a browser for t; it
// returns the browser's context and the site's origin.
func servedSite(t *testing.T) (context.Context, string) {
	t.Helper()
	chromiumPath(t)
	h, err := siteHandler(builtSite(t))
	if err != nil {
		t.Fatal(err)
	}
	srv := httptest.NewServer(h)
	t.Cleanup(srv.Close)
	return browser(t), srv.URL + "/"
}

// sitePages lists the site's pages by name.
func sitePages(t testing.TB) []string {
	t.Helper()
	files, _ := filepath.Glob(filepath.Join(siteSrc, "pages", "*.html"))
	var names []string
	for _, f := range files {
		names = append(names, strings.TrimSuffix(filepath.Base(f), ".html"))
	}
	if len(names) == 0 {
		t.Fatal("no pages")
	}
	return names
}

// openPage opens a page of the built site at width w, with JavaScript off
// (the prerendered calculators) or on (live, once every engine has run).
func openPage(t *testing.T, bctx context.Context, origin, name string, w int64, live bool) *tab {
	t.Helper()
	tb := newTab(t, bctx)
	if !live {
		if _, err := chromedp.Call(tb.ctx, emulation.SetScriptExecutionDisabled, emulation.SetScriptExecutionDisabledParams{Value: true}); err != nil {
			t.Fatalf("turning JavaScript off: %v", err)
		}
	}
	tb.setWidth(w)
	tb.do(chromedp.Navigate(origin + name + ".html"))
	if live {
		tb.waitFor("every calculator live", allLive)
	} else {
		tb.waitFor("the page", `document.readyState === 'complete'`)
		if n := eval[int](tb, `document.querySelectorAll('[data-state="live"]').length`); n != 0 {
			t.Fatalf("%d calculators went live with JavaScript off", n)
		}
	}
	return tb
}

// TestBrowserLayout holds every page at 320, 390 and 1280 pixels to zero
// calculator elements past their calculator's box (and chart elements past
// their chart), with the calculators prerendered and live, as the page
// opens and with every folded section open.
func TestBrowserLayout(t *testing.T) {
	bctx, origin := servedSite(t)
	// A page of someone else's with calculators embedded is held to the
	// same, inside their shadow roots.
	writeHostPages(t, builtSite(t))
	art := artifactsDir(t)
	t.Logf("screenshots: %s", art)
	totals := map[string]int{}
	var mu sync.Mutex
	for _, state := range []string{"prerendered", "live"} {
		live := state == "live"
		for _, name := range append(sitePages(t), embedHost) {
			t.Run(state+"/"+name, func(t *testing.T) {
				ws := widthsToTest(t)
				// One page at each width in turn: the calculator's layout
				// goes by its width alone, so the page need not load again.
				tb := openPage(t, bctx, origin, name, ws[0], live)
				if n := eval[int](tb, `document.querySelectorAll('`+calcRoots+`').length`); n == 0 {
					t.Fatalf("no calculator on %s", name)
				}
				for i, w := range ws {
					if i > 0 {
						tb.setWidth(w)
						tb.closeFolds()
					}
					first := tb.overflowing()
					if live || w == 390 {
						// The prerendered page differs from the live one only
						// in its disabled controls: one width shows it.
						shot, err := chromedp.Run(tb.ctx, chromedp.FullScreenshot(85))
						if err != nil {
							t.Fatalf("screenshot: %v", err)
						}
						saveArtifact(t, fmt.Sprintf("%s-%s-%d.jpg", name, state, w), shot)
					}
					tb.openFolds(live)
					opened := tb.overflowing()
					mu.Lock()
					totals[fmt.Sprintf("%s, %4d px, as opened", state, w)] += len(first)
					totals[fmt.Sprintf("%s, %4d px, folds open", state, w)] += len(opened)
					mu.Unlock()
					t.Logf("%s %d px: %d elements past their box as opened, %d with every fold open", name, w, len(first), len(opened))
					if len(first) > 0 {
						t.Errorf("%d px: %d calculator elements reach past their box as the page opens:%s", w, len(first), offenderReport(first))
					}
					if len(opened) > 0 {
						t.Errorf("%d px: %d calculator elements reach past their box with every folded section open:%s", w, len(opened), offenderReport(opened))
					}
				}
			})
		}
	}
	var keys []string
	for k := range totals {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	for _, k := range keys {
		t.Logf("elements past their box, %s: %d", k, totals[k])
	}
}

// shownMethodsJS lists the methods whose column the comparison of calculator
// id shows.
const shownMethodsJS = `[...document.querySelectorAll('#%s .sc-comparison thead th[data-method]')].filter(th => getComputedStyle(th).display !== 'none').map(th => th.dataset.method)`

// TestBrowserMethodPicker chooses the method a phone's comparison shows,
// by keyboard with the calculator live and by a tap with JavaScript off;
// at desktop width the picker is out of sight and every method shows.
func TestBrowserMethodPicker(t *testing.T) {
	bctx, origin := servedSite(t)
	shown := func(tb *tab) []string { return eval[[]string](tb, fmt.Sprintf(shownMethodsJS, "assembly")) }
	same := func(got []string, want ...string) bool { return strings.Join(got, " ") == strings.Join(want, " ") }

	t.Run("keyboard", func(t *testing.T) {
		tb := openPage(t, bctx, origin, "assembly", 390, true)
		if got := shown(tb); !same(got, "huntington-hill") {
			t.Fatalf("the comparison shows %v, want the calculator's own method alone", got)
		}
		tb.do(chromedp.Focus(chromedp.CSS(`#assembly-shown-huntington-hill`)), chromedp.KeyEvent(kb.ArrowDown))
		if got := shown(tb); !same(got, "modified-sainte-lague") {
			t.Errorf("after the arrow key the comparison shows %v", got)
		}
		// An edit keeps the reader's choice.
		tb.typeInto(`#assembly [data-field="seats"]`, "41")
		tb.waitFor("41 seats", `document.querySelector('#assembly table.sc-results').dataset.house === '41'`)
		if got := shown(tb); !same(got, "modified-sainte-lague") {
			t.Errorf("after an edit the comparison shows %v", got)
		}
		tb.checkClean(origin)
	})
	t.Run("without JavaScript", func(t *testing.T) {
		tb := openPage(t, bctx, origin, "assembly", 320, false)
		tb.do(chromedp.Click(chromedp.CSS(`label[for="assembly-shown-jefferson"]`)))
		if got := shown(tb); !same(got, "jefferson") {
			t.Errorf("after a tap the comparison shows %v", got)
		}
	})
	t.Run("desktop", func(t *testing.T) {
		tb := openPage(t, bctx, origin, "assembly", 1280, true)
		if got := shown(tb); len(got) != 8 {
			t.Errorf("the desktop comparison shows %v", got)
		}
		if eval[bool](tb, `document.querySelector('#assembly [data-role="method-picker"]').checkVisibility()`) {
			t.Error("the picker shows at desktop width")
		}
	})
}
