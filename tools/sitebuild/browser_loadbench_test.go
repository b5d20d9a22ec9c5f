package main

// How long the calculator page takes to load on a slow network, against a
// minimal page running the minimal syscall/js program, both served the same
// way (the preview server, precompressed twins, the same headers) in the
// same run. Nothing here fails on slowness.

import (
	"net/http"
	"net/http/httptest"
	"os"
	"os/exec"
	"path/filepath"
	"slices"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/cdproto/network"
	"github.com/chromedp/chromedp"

	"seatsmith/wasm/wasmbuild"
)

// The network of the load benchmark: 1.6 Mbit/s down, 750 kbit/s up, 150
// ms from request to response headers, no cache (a reader's first visit on
// a slow mobile connection).
const (
	slowDown    = 1.6e6 / 8 // bytes a second
	slowUp      = 750e3 / 8
	slowLatency = 150 // milliseconds
)

// minimalLoadProgram is the baseline program: the minimal syscall/js
// program of tools/wasmsize, one global function, then block.
const minimalLoadProgram = `package main

import "syscall/js"

func main() {
	js.Global().Set("ping", js.FuncOf(func(this js.Value, args []js.Value) any { return "pong" }))
	select {}
}
`

// minimalLoadPage loads the minimal program as a page with a calculator
// loads its engine: preloaded early, Go's runtime support as a script,
// compiled while it downloads, and live once the program has answered its
// first call, which sets what the bridge sets then: the mark
// "seatsmith-live".
const minimalLoadPage = `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>Minimal program</title>
<link rel="preload" href="assets/minimal.wasm" as="fetch" type="application/wasm" crossorigin>
<script defer src="assets/wasm_exec.js"></script>
<script type="module" src="assets/minimal.js"></script>
</head>
<body>
<h1>Minimal program</h1>
<p>This page runs the smallest syscall/js program.</p>
</body>
</html>
`

const minimalLoadScript = `const go = new Go();
const { instance } = await WebAssembly.instantiateStreaming(fetch('assets/minimal.wasm'), go.importObject);
go.run(instance);
if (globalThis.ping() === 'pong') performance.mark('seatsmith-live');
`

// minimalSite builds the minimal page with the release flags into a
// folder served like the site: precompressed twins and a headers file.
func minimalSite(b *testing.B) string {
	b.Helper()
	src := b.TempDir()
	if err := os.WriteFile(filepath.Join(src, "main.go"), []byte(minimalLoadProgram), 0o644); err != nil {
		b.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(src, "go.mod"), []byte("module minimal\n\ngo 1.21\n"), 0o644); err != nil {
		b.Fatal(err)
	}
	wasm := filepath.Join(src, "minimal.wasm")
	if err := wasmbuild.Compile(src, ".", wasm); err != nil {
		b.Fatal(err)
	}
	mod, err := os.ReadFile(wasm)
	if err != nil {
		b.Fatal(err)
	}
	exec, err := wasmExecJS()
	if err != nil {
		b.Fatal(err)
	}
	execMin, err := minifyAs(newMinifier(), "text/javascript", exec, "wasm_exec.js")
	if err != nil {
		b.Fatal(err)
	}
	files := map[string][]byte{
		"index.html":          []byte(minimalLoadPage),
		"assets/minimal.wasm": mod,
		"assets/wasm_exec.js": execMin,
		"assets/minimal.js":   []byte(minimalLoadScript),
		headersFile:           []byte("/*\n  X-Content-Type-Options: nosniff\n/index.html\n  Cache-Control: no-cache\n/assets/*\n  Cache-Control: public, max-age=31536000, immutable\n"),
	}
	addCompressed(files)
	out := filepath.Join(b.TempDir(), "minimal")
	if err := writeFiles(out, files); err != nil {
		b.Fatal(err)
	}
	return out
}

// loadTimes are the moments of one page load, in milliseconds from the
// start of navigation.
type loadTimes struct {
	FCP, Live float64
	// Engine is the content coding the engine came in.
	Engine string
	// Resources lists what the page fetched, when each began and ended.
	Resources string
}

// loadOnce opens url in a fresh tab on the slow network and returns when
// the page went live.
func loadOnce(b *testing.B, tb *tab, url string) loadTimes {
	b.Helper()
	if _, err := chromedp.Call(tb.ctx, network.SetCacheDisabled, network.SetCacheDisabledParams{CacheDisabled: true}); err != nil {
		b.Fatal(err)
	}
	if _, err := chromedp.Call(tb.ctx, network.EmulateNetworkConditionsByRule, network.EmulateNetworkConditionsByRuleParams{
		MatchedNetworkConditions: []*network.Conditions{{Latency: slowLatency, DownloadThroughput: slowDown, UploadThroughput: slowUp}},
	}); err != nil {
		b.Fatal(err)
	}
	tb.do(chromedp.Navigate(url))
	tb.waitForWithin("the page to go live", `performance.getEntriesByName('seatsmith-live').length > 0`, 120*time.Second)
	var lt loadTimes
	got := eval[[]float64](tb, `[
  (performance.getEntriesByType('paint').find((e) => e.name === 'first-contentful-paint') || {startTime: -1}).startTime,
  performance.getEntriesByName('seatsmith-live')[0].startTime]`)
	lt.FCP, lt.Live = got[0], got[1]
	lt.Resources = eval[string](tb, `performance.getEntriesByType('resource').map((e) =>
  e.name.replace(/^.*\//, '') + ' ' + Math.round(e.startTime) + '-' + Math.round(e.responseEnd) + 'ms').join(', ')`)
	tb.mu.Lock()
	lt.Engine = tb.engineEncoding
	tb.mu.Unlock()
	return lt
}

// BenchmarkBrowserLoad loads the calculator page and the minimal page in
// turn, each in a fresh tab on the slow network with the cache disabled,
// and reports the medians of the first contentful paint and of the time
// until the page is live: for the calculator page, when the engine's
// first answer is in place (the mark "seatsmith-live" the bridge puts in
// the page's performance timeline); for the
// minimal page, when the minimal program has answered its first call. The
// ratio of the times until live is the figure to watch (the target is at
// most 1.6).
//
//	go test -run '^$' -bench BrowserLoad -benchtime 3x ./tools/sitebuild
func BenchmarkBrowserLoad(b *testing.B) {
	if _, err := os.Stat(chromiumExe()); err != nil {
		if _, lerr := exec.LookPath("chromium"); lerr != nil {
			b.Skip("chromium is missing: the load benchmark needs it")
		}
	}
	site := builtSite(b)
	h, err := siteHandler(site)
	if err != nil {
		b.Fatal(err)
	}
	mh, err := siteHandler(minimalSite(b))
	if err != nil {
		b.Fatal(err)
	}
	mux := http.NewServeMux()
	mux.Handle("/", h)
	mux.Handle("/minimal/", http.StripPrefix("/minimal", mh))
	srv := httptest.NewServer(mux)
	defer srv.Close()
	bctx := browser(b)
	pages := []struct{ name, path string }{{"calculator", "/calculator.html"}, {"minimal", "/minimal/"}}
	load := func(path string) loadTimes {
		tb := newTabFor(b, bctx, 3*time.Minute)
		defer tb.close()
		tb.do()
		return loadOnce(b, tb, srv.URL+path)
	}
	// One load of each first, not counted: the browser starts its
	// processes and connections.
	for _, p := range pages {
		load(p.path)
	}
	times := map[string][]loadTimes{}
	for i := range b.N {
		for k := range pages {
			// The pages take turns at going first.
			p := pages[(i+k)%len(pages)]
			lt := load(p.path)
			if lt.Engine != "br" {
				b.Errorf("%s: the engine came with Content-Encoding %q, not br", p.name, lt.Engine)
			}
			times[p.name] = append(times[p.name], lt)
		}
	}
	median := func(name string, f func(loadTimes) float64) float64 {
		var xs []float64
		for _, lt := range times[name] {
			xs = append(xs, f(lt))
		}
		slices.Sort(xs)
		return xs[len(xs)/2]
	}
	fcp := func(lt loadTimes) float64 { return lt.FCP }
	live := func(lt loadTimes) float64 { return lt.Live }
	for _, p := range pages {
		b.ReportMetric(median(p.name, fcp), p.name+"-fcp-ms")
		b.ReportMetric(median(p.name, live), p.name+"-live-ms")
	}
	b.ReportMetric(median("calculator", fcp)/median("minimal", fcp), "fcp-ratio")
	b.ReportMetric(median("calculator", live)/median("minimal", live), "live-ratio")
	b.ReportMetric(0, "ns/op")
	var lines []string
	for _, p := range pages {
		for _, lt := range times[p.name] {
			lines = append(lines, p.name+": fcp "+ms(lt.FCP)+", live "+ms(lt.Live)+" ("+lt.Resources+")")
		}
	}
	b.Log(strings.Join(lines, "\n"))
}

func ms(x float64) string {
	return time.Duration(x * float64(time.Millisecond)).Round(time.Millisecond).String()
}
