package main

// Browser tests: the built site in real headless Chromium. They need
// /usr/bin/chromium (or SEATSMITH_CHROMIUM); without it they skip locally
// and fail when CI is set. SEATSMITH_WASM names a folder of prebuilt
// modules (as wasmbuild.Build writes them) to use instead of building them.

import (
	"bufio"
	"context"
	"encoding/base64"
	"encoding/json"
	"net/http/httptest"
	"net/url"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/chromedp/cdproto/network"
	"github.com/chromedp/chromedp"
	"github.com/chromedp/chromedp/kb"
)

var (
	builtOnce  sync.Once
	builtDir   string
	builtFiles []string // the files the build wrote (tests add pages beside them)
	builtErr   error
)

// builtSite builds the real site once for every browser test.
func builtSite(t testing.TB) string {
	t.Helper()
	builtOnce.Do(func() {
		dir, err := os.MkdirTemp("", "sitebuild-browser-")
		if err != nil {
			builtErr = err
			return
		}
		eng, err := buildEngines(os.Getenv("SEATSMITH_WASM"))
		if err != nil {
			builtErr = err
			return
		}
		builtDir = filepath.Join(dir, "site")
		var st *Stats
		if st, builtErr = Build(Options{Src: siteSrc, Out: builtDir, Engines: eng}); builtErr == nil {
			builtFiles = st.Files
		}
	})
	if builtErr != nil {
		t.Fatalf("building the site: %v", builtErr)
	}
	return builtDir
}

// chromiumExe is the Chromium the browser tests ask for first:
// SEATSMITH_CHROMIUM, or /usr/bin/chromium.
func chromiumExe() string {
	if p := os.Getenv("SEATSMITH_CHROMIUM"); p != "" {
		return p
	}
	return "/usr/bin/chromium"
}

func chromiumPath(t testing.TB) string {
	t.Helper()
	p := chromiumExe()
	if _, err := os.Stat(p); err != nil {
		if lp, lerr := exec.LookPath("chromium"); lerr == nil {
			return lp
		}
		if os.Getenv("CI") != "" {
			t.Fatalf("chromium is missing (%s): the browser tests must run in CI; install the chromium package", p)
		}
		t.Skipf("chromium is missing (%s): skipping the browser tests (they run in CI)", p)
	}
	return p
}

// browser starts one headless Chromium for a test and returns its context.
func browser(t testing.TB) context.Context {
	t.Helper()
	exe := chromiumPath(t)
	ud := t.TempDir()
	opts := []chromedp.ExecAllocatorOption{
		chromedp.ExecPath(exe),
		chromedp.Headless,
		chromedp.NoSandbox,
		chromedp.DisableGPU,
		chromedp.NoFirstRun,
		chromedp.NoDefaultBrowserCheck,
		chromedp.Flag("disable-background-networking", true),
		chromedp.Flag("disable-component-update", true),
		chromedp.Flag("disable-sync", true),
		chromedp.Flag("disable-dev-shm-usage", true),
		chromedp.Flag("disable-extensions", true),
		chromedp.Flag("disable-default-apps", true),
		// Tabs opened by the tests must keep their timers running.
		chromedp.Flag("disable-background-timer-throttling", true),
		chromedp.Flag("disable-backgrounding-occluded-windows", true),
		chromedp.Flag("disable-renderer-backgrounding", true),
		chromedp.Flag("no-default-browser-check", true),
		chromedp.UserDataDir(ud),
		chromedp.WindowSize(1280, 900),
	}
	actx, cancel := chromedp.NewExecAllocator(context.Background(), opts...)
	t.Cleanup(cancel)
	bctx, bcancel := chromedp.NewContext(actx)
	t.Cleanup(bcancel)
	if err := chromedp.Do(bctx); err != nil {
		t.Fatalf("starting chromium: %v", err)
	}
	return bctx
}

// A tab is one page under test, with everything it logged and requested.
type tab struct {
	t        testing.TB
	ctx      context.Context
	mu       sync.Mutex
	console  []chromedp.ConsoleMessage
	requests []string
	// engineEncoding is the Content-Encoding of the last WebAssembly
	// module the page received.
	engineEncoding string
	cancel         func()
}

// close ends the tab before the test does.
func (tb *tab) close() { tb.cancel() }

func newTab(t testing.TB, parent context.Context) *tab {
	t.Helper()
	return newTabFor(t, parent, 60*time.Second)
}

// newTabFor opens a tab that lives at most d.
func newTabFor(t testing.TB, parent context.Context, d time.Duration) *tab {
	t.Helper()
	ctx, cancel := chromedp.NewContext(parent)
	ctx, tcancel := context.WithTimeout(ctx, d)
	t.Cleanup(func() { tcancel(); cancel() })
	tb := &tab{t: t, ctx: ctx, cancel: func() { tcancel(); cancel() }}
	msgs := chromedp.Console(ctx)
	reqs := chromedp.Events(ctx, network.RequestWillBeSent)
	resps := chromedp.Events(ctx, network.ResponseReceived)
	go func() {
		for ev, err := range resps {
			if err != nil {
				return
			}
			if strings.HasSuffix(ev.Response.URL, ".wasm") {
				enc := ""
				for k, v := range ev.Response.Headers {
					if strings.EqualFold(k, "Content-Encoding") {
						enc, _ = v.(string)
					}
				}
				tb.mu.Lock()
				tb.engineEncoding = enc
				tb.mu.Unlock()
			}
		}
	}()
	go func() {
		for m, err := range msgs {
			if err != nil {
				return
			}
			tb.mu.Lock()
			tb.console = append(tb.console, m)
			tb.mu.Unlock()
		}
	}()
	go func() {
		for ev, err := range reqs {
			if err != nil {
				return
			}
			tb.mu.Lock()
			tb.requests = append(tb.requests, ev.Request.URL)
			tb.mu.Unlock()
		}
	}()
	return tb
}

func (tb *tab) do(steps ...chromedp.Action[chromedp.Void]) {
	tb.t.Helper()
	if err := chromedp.Do(tb.ctx, steps...); err != nil {
		tb.t.Fatalf("browser: %v", err)
	}
}

func eval[T any](tb *tab, js string) T {
	tb.t.Helper()
	v, err := chromedp.Run(tb.ctx, chromedp.Evaluate[T](js, chromedp.EvalAwaitPromise))
	if err != nil {
		tb.t.Fatalf("evaluating %s: %v", js, err)
	}
	return v
}

// waitFor polls a JavaScript condition for at most 20 seconds.
func (tb *tab) waitFor(what, js string) {
	tb.t.Helper()
	tb.waitForWithin(what, js, 20*time.Second)
}

// waitForWithin polls a JavaScript condition for at most d.
func (tb *tab) waitForWithin(what, js string, d time.Duration) {
	tb.t.Helper()
	if _, err := chromedp.Run(tb.ctx, chromedp.Poll[bool](js, chromedp.WithPollingTimeout(d), chromedp.WithPollingInterval(50*time.Millisecond))); err != nil {
		state := eval[string](tb, `JSON.stringify([...document.querySelectorAll('[data-seatsmith]')].map(e => [e.id, e.dataset.state, (e.querySelector('[role=alert]')||{}).textContent]))`)
		tb.t.Fatalf("waiting for %s: %v (calculators: %s; console: %v)", what, err, state, tb.messages())
	}
}

const allLive = `document.querySelectorAll('[data-seatsmith], seatsmith-calculator, [data-projection], [data-election]').length > 0 && [...document.querySelectorAll('[data-seatsmith], seatsmith-calculator, [data-projection], [data-election]')].every(e => e.dataset.state === 'live')`

func (tb *tab) messages() []string {
	tb.mu.Lock()
	defer tb.mu.Unlock()
	var out []string
	for _, m := range tb.console {
		out = append(out, string(m.Type)+": "+m.Text)
	}
	return out
}

// checkClean fails on any console error or exception and on any request to
// another origin than allowed.
func (tb *tab) checkClean(origin string) {
	tb.t.Helper()
	time.Sleep(100 * time.Millisecond)
	tb.mu.Lock()
	defer tb.mu.Unlock()
	for _, m := range tb.console {
		if m.Type == chromedp.ConsoleError || m.Type == chromedp.ConsoleException {
			tb.t.Errorf("console %s: %s (%s:%d)", m.Type, m.Text, m.URL, m.Line)
		}
	}
	for _, r := range tb.requests {
		if strings.HasPrefix(r, "data:") || strings.HasPrefix(r, "blob:") {
			continue
		}
		if !strings.HasPrefix(r, origin) {
			tb.t.Errorf("request to another origin: %s", r)
		}
	}
}

// A row is one result row: calculator, unit and seats.
type row struct{ Calc, Unit, Seats string }

// rowsJS lists the result rows of every calculator, in the page or in its
// block's shadow root.
const rowsJS = `JSON.stringify([...document.querySelectorAll('[data-seatsmith], seatsmith-calculator')].flatMap(h => [...(h.shadowRoot || h).querySelectorAll('tr[data-unit]')].map(r => ({Calc: h.id, Unit: r.dataset.unit, Seats: r.dataset.seats}))))`

func (tb *tab) rows() []row {
	tb.t.Helper()
	var rs []row
	if err := json.Unmarshal([]byte(eval[string](tb, rowsJS)), &rs); err != nil {
		tb.t.Fatal(err)
	}
	return rs
}

// goldenRows reads the rows of testdata/site/PAGE.txt.
func goldenRows(t *testing.T, name string) []row {
	t.Helper()
	f, err := os.Open(filepath.Join(goldenDir, name+".txt"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var rs []row
	calc := ""
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		l := sc.Text()
		if strings.HasPrefix(l, "calculator ") {
			calc = strings.TrimSuffix(strings.Fields(l)[1], ":")
			continue
		}
		if strings.HasPrefix(l, "  ") && !strings.HasPrefix(l, "    ") {
			parts := strings.Split(strings.TrimPrefix(l, "  "), "\t")
			if len(parts) >= 3 && strings.HasPrefix(parts[2], "quota ") {
				rs = append(rs, row{calc, parts[0], parts[1]})
			}
		}
	}
	return rs
}

var staticRow = regexp.MustCompile(`<tr data-unit="([^"]*)" data-seats="(\d+)"`)

func sameRows(t *testing.T, what string, got, want []row) {
	t.Helper()
	if len(got) != len(want) {
		t.Fatalf("%s: %d rows, golden has %d\n got %v\nwant %v", what, len(got), len(want), got, want)
	}
	for i := range got {
		if got[i] != want[i] {
			t.Errorf("%s: row %d is %v, golden %v", what, i, got[i], want[i])
		}
	}
}

func artifact(t testing.TB, name string, png []byte) {
	t.Helper()
	dir := filepath.Join("..", "..", "testdata", "artifacts")
	if err := os.MkdirAll(dir, 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, name), png, 0o644); err != nil {
		t.Fatal(err)
	}
}

func (tb *tab) screenshot(name string, width, height int64, mobile bool) {
	tb.t.Helper()
	var opts []chromedp.EmulateViewportOption
	if mobile {
		opts = append(opts, chromedp.EmulateScale(2), chromedp.EmulatePortrait, chromedp.EmulateMobile)
	}
	tb.do(chromedp.EmulateViewport(width, height, opts...))
	time.Sleep(150 * time.Millisecond)
	png, err := chromedp.Run(tb.ctx, chromedp.FullScreenshot(100))
	if err != nil {
		tb.t.Fatalf("screenshot: %v", err)
	}
	artifact(tb.t, name, png)
}

// TestBrowser drives the built site in headless Chromium.
func TestBrowser(t *testing.T) {
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

	pages, _ := filepath.Glob(filepath.Join(siteSrc, "pages", "*.html"))
	t.Run("pages", func(t *testing.T) {
		for _, p := range pages {
			name := strings.TrimSuffix(filepath.Base(p), ".html")
			t.Run(name, func(t *testing.T) {
				want := goldenRows(t, name)
				html, err := os.ReadFile(filepath.Join(dir, name+".html"))
				if err != nil {
					t.Fatal(err)
				}
				var static []row
				for _, m := range staticRow.FindAllStringSubmatch(string(html), -1) {
					static = append(static, row{"", m[1], m[2]})
				}
				for i := range static {
					if i < len(want) {
						static[i].Calc = want[i].Calc
					}
				}
				sameRows(t, "prerendered "+name, static, want)
				if !strings.Contains(string(html), `data-state="static"`) || !strings.Contains(string(html), "Not an official") {
					t.Error("the prerendered page lacks data-state=static or the caution")
				}
				tb := newTab(t, bctx)
				tb.do(chromedp.Navigate(origin + name + ".html"))
				tb.waitFor("every calculator live", allLive)
				sameRows(t, "live "+name, tb.rows(), want)
				if n := eval[int](tb, `document.querySelectorAll('[data-role=caution]').length + document.querySelectorAll('[data-role=site-caution]').length`); n < 2 {
					t.Errorf("the caution shows %d times", n)
				}
				bad := eval[int](tb, `document.querySelectorAll('[data-claim][data-holds="false"], [data-claim-ref][data-holds="false"]').length`)
				if bad != 0 {
					t.Errorf("%d claims do not hold on the live page", bad)
				}
				tb.screenshot(name+"-desktop.png", 1280, 900, false)
				tb.screenshot(name+"-phone.png", 390, 844, true)
				tb.checkClean(origin)
			})
		}
	})

	t.Run("edit population", func(t *testing.T) {
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate(origin + "assembly.html"))
		tb.waitFor("live", allLive)
		before := eval[string](tb, `document.querySelector('#assembly tr[data-unit="Marrowgate"]').dataset.seats`)
		sel := chromedp.CSS(`#assembly [data-field="units.8.population"]`)
		tb.do(chromedp.Focus(sel), chromedp.Evaluate[chromedp.Void](`document.activeElement.select()`), chromedp.SendKeys(sel, "3055971"))
		tb.waitFor("Marrowgate to gain seats", `+document.querySelector('#assembly tr[data-unit="Marrowgate"]').dataset.seats > 10`)
		after := eval[string](tb, `document.querySelector('#assembly tr[data-unit="Marrowgate"]').dataset.seats`)
		if before == after {
			t.Errorf("seats stayed %s", before)
		}
		if got := eval[string](tb, `document.activeElement.getAttribute('data-field')`); got != "units.8.population" {
			t.Errorf("focus moved to %q while typing", got)
		}
		// Claims now show whether they still hold.
		if n := eval[int](tb, `document.querySelectorAll('#assembly [data-claim][data-holds]').length`); n != 6 {
			t.Errorf("%d claims shown", n)
		}
		// The link follows once the typing pauses.
		tb.waitFor("the edit in the fragment", `location.hash.includes("assembly=")`)
		// The claims in the prose follow the edit: Orlen no longer gets 12.
		if got := eval[string](tb, `document.querySelector('[data-claim-ref="orlen-hh"]').dataset.holds`); got != "false" {
			t.Errorf("the inline claim shows holds=%s after the edit", got)
		}
		// The keyboard alone changes the method.
		tb.do(chromedp.Focus(chromedp.CSS(`#assembly [data-field="method"]`)), chromedp.KeyEvent(kb.ArrowUp))
		tb.waitFor("another method", `document.querySelector('#assembly table.sc-results').dataset.method !== 'huntington-hill'`)
		tb.checkClean(origin)
	})

	t.Run("embedded without prerendering", func(t *testing.T) {
		page := `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Embedded</title>
<script type="module" src="embed/bridge.js"></script></head><body>
<p>A page elsewhere.</p>
<div class="seatsmith" id="mine" data-seatsmith="compact">
<script type="application/json">{"seats": 15, "method": "webster", "units": [{"name": "North", "population": 5200}, {"name": "South", "population": 3900}],
 "claims": [{"id": "north", "kind": "seats", "unit": "North", "seats": 9}]}</script>
</div></body></html>`
		if err := os.WriteFile(filepath.Join(dir, "embedded-test.html"), []byte(page), 0o644); err != nil {
			t.Fatal(err)
		}
		// The page has no icon of its own; the browser asks for this one.
		os.WriteFile(filepath.Join(dir, "favicon.ico"), nil, 0o644)
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate(origin + "embedded-test.html"))
		tb.waitFor("live", allLive)
		sameRows(t, "embedded", tb.rows(), []row{{"mine", "North", "9"}, {"mine", "South", "6"}})
		if eval[string](tb, `document.querySelector('#mine').shadowRoot.querySelector('[data-claim="north"]').dataset.holds`) != "true" {
			t.Error("the embedded claim does not hold")
		}
		if eval[string](tb, `getComputedStyle(document.querySelector('#mine').shadowRoot.querySelector('.seatsmith')).borderTopStyle`) != "solid" {
			t.Error("the bridge did not give the calculator its styles")
		}
		tb.checkClean(origin)
	})

	t.Run("margins after a pause", func(t *testing.T) {
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate(origin + "devices.html"))
		tb.waitFor("live", allLive)
		sel := chromedp.CSS(`#carts [data-field="units.0.population"]`)
		tb.do(chromedp.Focus(sel), chromedp.Evaluate[chromedp.Void](`document.activeElement.select()`), chromedp.SendKeys(sel, "470"))
		tb.waitFor("the new total", `document.querySelector("#carts [data-role=summary]").textContent.includes("3,925")`)
		tb.waitFor("the margins", `!document.querySelector('#carts [data-role=margins-pending]') && ![...document.querySelectorAll('#carts table.sc-results td')].some(td => td.textContent === '…')`)
		tb.checkClean(origin)
	})

	t.Run("bad input", func(t *testing.T) {
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate(origin + "devices.html"))
		tb.waitFor("live", allLive)
		sel := chromedp.CSS(`#carts [data-field="units.2.population"]`)
		tb.do(chromedp.Focus(sel), chromedp.SendKeys(sel, "x"))
		tb.waitFor("the error state", `document.querySelector('#carts').dataset.state === 'error'`)
		msg := eval[string](tb, `document.querySelector('#carts [data-role=error]').textContent`)
		// The devices page counts students, and its messages say so.
		if !strings.Contains(msg, "Unit 3, students: ") || !strings.Contains(msg, "is not a number of students") || strings.Contains(msg, "population") {
			t.Errorf("error message %q does not name the unit and field in the block's words", msg)
		}
		if eval[string](tb, `document.querySelector('#carts [data-field="units.2.population"]').getAttribute('aria-invalid')`) != "true" {
			t.Error("the bad field is not marked invalid")
		}
		// The rest keeps working: other controls still answer, and fixing
		// the number brings the results back.
		tb.do(chromedp.SetValue(chromedp.CSS(`#carts [data-field="method"]`), "webster"),
			chromedp.Evaluate[chromedp.Void](`document.querySelector('#carts [data-field="method"]').dispatchEvent(new Event('change', {bubbles: true}))`))
		if eval[string](tb, `document.querySelector('#carts').dataset.state`) != "error" {
			t.Error("changing the method hid the error")
		}
		tb.do(chromedp.Focus(sel), chromedp.KeyEvent("\b"))
		tb.waitFor("live again", `document.querySelector('#carts').dataset.state === 'live'`)
		if got := eval[string](tb, `document.querySelector('#carts table.sc-results').dataset.method`); got != "webster" {
			t.Errorf("method after the fix is %q", got)
		}
		if eval[bool](tb, `!!document.querySelector('#carts [aria-invalid]')`) {
			t.Error("a field stays marked invalid after the fix")
		}
		tb.checkClean(origin)
	})

	t.Run("markup in names", func(t *testing.T) {
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate(origin + "index.html"))
		tb.waitFor("live", allLive)
		evil := `<img src=x onerror="window.__hit=1"><script>window.__hit=2</script><b>bold</b>`
		sel := chromedp.CSS(`#islands [data-field="units.0.name"]`)
		tb.do(chromedp.Focus(sel), chromedp.Evaluate[chromedp.Void](`document.activeElement.select()`), chromedp.SendKeys(sel, evil))
		tb.waitFor("the new name", `!!document.querySelector('#islands tr[data-unit]') && document.querySelector('#islands tr[data-unit]').dataset.unit.includes('bold')`)
		time.Sleep(200 * time.Millisecond)
		if got := eval[string](tb, `document.querySelector('#islands tr[data-unit]').dataset.unit`); got != evil {
			t.Errorf("data-unit is %q", got)
		}
		if got := eval[string](tb, `document.querySelector('#islands tr[data-unit] th').textContent`); got != evil {
			t.Errorf("the name shows as %q", got)
		}
		if n := eval[int](tb, `document.querySelectorAll('#islands img, #islands b, #islands .sc-output script').length`); n != 0 {
			t.Errorf("the name became %d elements", n)
		}
		if eval[bool](tb, `window.__hit !== undefined`) {
			t.Error("script in a unit name ran")
		}
		tb.checkClean(origin)
	})

	t.Run("fragment round trip", func(t *testing.T) {
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate(origin + "party-list.html"))
		tb.waitFor("live", allLive)
		tb.do(chromedp.SetValue(chromedp.CSS(`#council [data-field="method"]`), "webster"),
			chromedp.Evaluate[chromedp.Void](`document.querySelector('#council [data-field="method"]').dispatchEvent(new Event('change', {bubbles: true}))`))
		sel := chromedp.CSS(`#council [data-field="seats"]`)
		tb.do(chromedp.Focus(sel), chromedp.Evaluate[chromedp.Void](`document.activeElement.select()`), chromedp.SendKeys(sel, "41"))
		tb.waitFor("41 seats", `document.querySelector('#council table.sc-results').dataset.house === '41'`)
		rows := tb.rows()
		// The link follows once the typing pauses, and at once when the
		// page is being left.
		if got := eval[string](tb, `dispatchEvent(new PageTransitionEvent('pagehide')), `+linkMember("council", "s")); got != "41" {
			t.Errorf("leaving the page left the link with seats %s, want 41", got)
		}
		tb.waitFor("the link to hold 41 seats", linkMember("council", "s")+` === "41"`)
		link := eval[string](tb, `location.href`)
		if !strings.Contains(link, "#council=") {
			t.Fatalf("no scenario in the link %s", link)
		}
		tb2 := newTab(t, bctx)
		tb2.do(chromedp.Navigate(link))
		tb2.waitFor("live", allLive)
		sameRows(t, "reopened link", tb2.rows(), rows)
		if got := eval[string](tb2, `document.querySelector('#council [data-field="seats"]').value + ' ' + document.querySelector('#council [data-field="method"]').value`); got != "41 webster" {
			t.Errorf("the reopened editor shows %q", got)
		}
		tb2.checkClean(origin)

		// A damaged link shows an inline error and the page's own numbers.
		tb3 := newTab(t, bctx)
		u, _ := url.Parse(link)
		u.Fragment = ""
		// A key that is not valid percent-encoding is left alone; the
		// calculator's own entry is damaged.
		tb3.do(chromedp.Navigate(u.String() + "#%E0%A4%A=x&council=" + strings.Repeat("Zm9v", 3) + "%%%"))
		tb3.waitFor("live", allLive)
		note := eval[string](tb3, `(document.querySelector('#council [data-role=notice][data-error]')||{}).textContent || ''`)
		if !strings.Contains(note, "could not be read") {
			t.Errorf("no inline error for a damaged link (notice %q)", note)
		}
		sameRows(t, "damaged link", tb3.rows(), goldenRows(t, "party-list"))
		// A link whose scenario is readable but wrong shows the engine's error.
		bad := `{"seats":"30","method":"jefferson","units":[{"name":"A","population":"-4"}]}`
		u.Fragment = ""
		tb4 := newTab(t, bctx)
		tb4.do(chromedp.Navigate(u.String() + "#council=" + b64url(bad)))
		tb4.waitFor("the error state", `document.querySelector('#council').dataset.state === 'error'`)
		if msg := eval[string](tb4, `document.querySelector('#council [data-role=error]').textContent`); !strings.Contains(msg, "negative") {
			t.Errorf("error for a negative population: %q", msg)
		}
		tb3.checkClean(origin)
		tb4.checkClean(origin)
	})

	t.Run("csv and export", func(t *testing.T) {
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate(origin + "calculator.html"))
		tb.waitFor("live", allLive)
		csv := "name,population,max\nHarlow,5000,\n=SUM(A1:A2),3000,\nTeal <i>x</i>,2000,1\n"
		tb.do(chromedp.Click(chromedp.CSS(`#workbench .sc-csv summary`)),
			chromedp.SetValue(chromedp.CSS(`#workbench [data-field="csv"]`), csv),
			chromedp.Click(chromedp.CSS(`#workbench [data-action="use-csv"]`)))
		tb.chooseColumns("#workbench")
		tb.waitFor("three units", `document.querySelectorAll('#workbench tr[data-unit]').length === 3`)
		got := tb.rows()
		want := []row{{"workbench", "Harlow", "20"}, {"workbench", "=SUM(A1:A2)", "12"}, {"workbench", "Teal <i>x</i>", "1"}}
		if got[2].Seats != "1" || got[0].Unit != "Harlow" || got[1].Unit != want[1].Unit || got[2].Unit != want[2].Unit {
			t.Errorf("rows after the CSV: %v", got)
		}
		// Capture the export instead of saving it.
		tb.do(chromedp.Evaluate[chromedp.Void](`window.__blobs = []; const o = URL.createObjectURL; URL.createObjectURL = (b) => { window.__blobs.push(b); return o.call(URL, b); }; HTMLAnchorElement.prototype.click = function () {};`))
		tb.do(chromedp.Click(chromedp.CSS(`#workbench [data-action="export-csv"]`)))
		tb.waitFor("the CSV export", `window.__blobs.length === 1`)
		tb.do(chromedp.Click(chromedp.CSS(`#workbench [data-action="export-json"]`)))
		tb.waitFor("the JSON export", `window.__blobs.length === 2`)
		out := eval[string](tb, `Promise.all(window.__blobs.map(b => b.text())).then(t => JSON.stringify(t))`)
		var texts []string
		json.Unmarshal([]byte(out), &texts)
		if len(texts) != 2 {
			t.Fatalf("exports: %v", texts)
		}
		if !strings.Contains(texts[0], "'=SUM(A1:A2)") || strings.Contains(texts[0], "\n=SUM") {
			t.Errorf("the CSV export does not guard a formula:\n%s", texts[0])
		}
		var doc map[string]any
		if err := json.Unmarshal([]byte(texts[1]), &doc); err != nil || doc["allotment"] == nil || doc["scenario"] == nil {
			t.Errorf("the JSON export: %v %.200s", err, texts[1])
		}
		// A bad table is reported by line and leaves the units alone.
		tb.do(chromedp.SetValue(chromedp.CSS(`#workbench [data-field="csv"]`), "name,population\nA,12\nB,lots\n"),
			chromedp.Click(chromedp.CSS(`#workbench [data-action="use-csv"]`)))
		tb.chooseColumns("#workbench")
		tb.waitFor("the notice", `document.querySelector('#workbench [data-role=notice]').textContent.includes('could not be read')`)
		note := eval[string](tb, `document.querySelector('#workbench [data-role=notice]').textContent`)
		if !strings.Contains(note, "line 3") {
			t.Errorf("bad CSV notice: %q", note)
		}
		if n := eval[int](tb, `document.querySelectorAll('#workbench tr[data-unit]').length`); n != 3 {
			t.Errorf("a bad table changed the units (%d rows)", n)
		}
		tb.screenshot("calculator-csv-desktop.png", 1280, 900, false)
		tb.checkClean(origin)
	})

	t.Run("many units ask for margins", func(t *testing.T) {
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate(origin + "calculator.html"))
		tb.waitFor("live", allLive)
		// Hamilton's method with a minimum of one seat: margins proven
		// stretch by stretch, which an edit leaves for the reader to ask.
		tb.do(chromedp.SetValue(chromedp.CSS(`#workbench [data-field="method"]`), "hamilton"),
			chromedp.Evaluate[chromedp.Void](`document.querySelector('#workbench [data-field="method"]').dispatchEvent(new Event('change', {bubbles: true}))`),
			chromedp.SetValue(chromedp.CSS(`#workbench [data-field="min"]`), "1"),
			chromedp.Evaluate[chromedp.Void](`{ const f = document.querySelector('#workbench [data-field="min"]'); f.dispatchEvent(new Event('input', {bubbles: true})); f.dispatchEvent(new Event('change', {bubbles: true})); }`))
		var csv strings.Builder
		csv.WriteString("name,population\n")
		for i := 1; i <= 20; i++ {
			csv.WriteString("District " + strconv.Itoa(i) + "," + strconv.Itoa(10000+i*1733) + "\n")
		}
		tb.do(chromedp.Click(chromedp.CSS(`#workbench .sc-csv summary`)),
			chromedp.SetValue(chromedp.CSS(`#workbench [data-field="csv"]`), csv.String()),
			chromedp.Click(chromedp.CSS(`#workbench [data-action="use-csv"]`)))
		tb.chooseColumns("#workbench")
		tb.waitFor("twenty units", `document.querySelectorAll('#workbench tr[data-unit]').length === 20`)
		tb.waitFor("the margins button", `!!document.querySelector('#workbench [data-action="margins"]')`)
		tb.do(chromedp.Click(chromedp.CSS(`#workbench [data-action="margins"]`)))
		tb.waitFor("the margins", `!document.querySelector('#workbench [data-role=margins-pending]') && ![...document.querySelectorAll('#workbench table.sc-results td')].some(td => td.textContent === '…')`)
		tb.checkClean(origin)
	})

	t.Run("engine missing", func(t *testing.T) {
		page := `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>No engine</title>
<meta name="seatsmith-engine" content="missing.wasm">
<script type="module" src="embed/bridge.js"></script></head><body>
<div class="seatsmith" id="lost" data-seatsmith="compact">
<script type="application/json">{"seats": 3, "method": "webster", "units": [{"name": "A", "population": 1}]}</script>
</div><p id="after">The rest of the page.</p></body></html>`
		if err := os.WriteFile(filepath.Join(dir, "no-engine-test.html"), []byte(page), 0o644); err != nil {
			t.Fatal(err)
		}
		os.WriteFile(filepath.Join(dir, "favicon.ico"), nil, 0o644)
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate(origin + "no-engine-test.html"))
		tb.waitFor("the error state", `document.querySelector('#lost').dataset.state === 'error'`)
		if msg := eval[string](tb, `document.querySelector('#lost').shadowRoot.querySelector('[role=alert]').textContent`); !strings.Contains(msg, "could not start") || !strings.Contains(msg, "404") {
			t.Errorf("message %q", msg)
		}
		// The scenario's units stay, as a plain table, under that one line.
		if n := eval[int](tb, `document.querySelector('#lost').shadowRoot.querySelectorAll('[data-role="fallback-units"] tbody tr').length`); n != 1 {
			t.Errorf("the plain table shows %d units, want 1", n)
		}
	})

	t.Run("offline file", func(t *testing.T) {
		tb := newTab(t, bctx)
		file := "file://" + filepath.ToSlash(filepath.Join(dir, "offline.html"))
		tb.do(chromedp.Navigate(file))
		tb.waitFor("live", allLive)
		sameRows(t, "offline", tb.rows(), goldenRows(t, "calculator"))
		sel := chromedp.CSS(`#workbench [data-field="seats"]`)
		tb.do(chromedp.Focus(sel), chromedp.Evaluate[chromedp.Void](`document.activeElement.select()`), chromedp.SendKeys(sel, "60"))
		tb.waitFor("60 seats", `document.querySelector('#workbench table.sc-results').dataset.house === '60'`)
		tb.screenshot("offline-phone.png", 390, 844, true)
		tb.checkClean(file)
		// The same file served from the site works as well.
		tb2 := newTab(t, bctx)
		tb2.do(chromedp.Navigate(origin + "offline.html"))
		tb2.waitFor("live", allLive)
		tb2.checkClean(origin)
	})
}

func b64url(s string) string { return base64.RawURLEncoding.EncodeToString([]byte(s)) }

// linkMember returns a JavaScript expression for a setting of the
// scenario that the page's link holds for calculator id, written against
// the block's own (undefined while the link holds none): member is one of
// the link's one-letter codes, "s" for seats.
func linkMember(id, code string) string {
	return `(() => {
  const m = new RegExp('[#&]' + ` + strconv.Quote(id) + ` + '=~([^&!]*)').exec(location.hash);
  if (!m) return undefined;
  const t = m[1].split('*').find((t) => t.startsWith(` + strconv.Quote(code) + `) && !t.includes(':'));
  return t === undefined ? undefined : t.slice(1);
})()`
}

// chooseColumns confirms the column chooser of calculator sel with the
// columns it guessed.
func (tb *tab) chooseColumns(sel string) {
	tb.t.Helper()
	tb.waitFor("the column chooser", `!!document.querySelector('`+sel+` [data-action="use-columns"]')`)
	tb.do(chromedp.Click(chromedp.CSS(sel + ` [data-action="use-columns"]`)))
}
