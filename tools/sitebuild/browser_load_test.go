package main

// How a page starts in headless Chromium: the prerendered results show
// before the engine arrives, the engine is compiled while it downloads
// (WebAssembly.compileStreaming) when the server sends it as
// application/wasm, and the bridge falls back to a buffer when the server
// sends another type. Also: results patched in place after an edit are the
// same markup as results built afresh.

import (
	"net/http"
	"net/http/httptest"
	"strconv"
	"strings"
	"sync"
	"testing"

	cdppage "github.com/chromedp/cdproto/page"
	"github.com/chromedp/chromedp"
)

// wasmGate serves a built site and holds every .wasm response until
// release is called; with mime set it sends the engine as that type.
type wasmGate struct {
	h        http.Handler
	mime     string
	asked    chan struct{} // closed when the page first asks for the engine
	askOnce  sync.Once
	released chan struct{}
	once     sync.Once
}

func (g *wasmGate) ServeHTTP(w http.ResponseWriter, r *http.Request) {
	if !strings.HasSuffix(r.URL.Path, ".wasm") {
		g.h.ServeHTTP(w, r)
		return
	}
	g.askOnce.Do(func() { close(g.asked) })
	select {
	case <-g.released:
	case <-r.Context().Done():
		return
	}
	if g.mime != "" {
		w = &typedWriter{ResponseWriter: w, mime: g.mime}
	}
	g.h.ServeHTTP(w, r)
}

func (g *wasmGate) release() { g.once.Do(func() { close(g.released) }) }

// typedWriter overrides the Content-Type the file server chooses.
type typedWriter struct {
	http.ResponseWriter
	mime string
}

func (w *typedWriter) WriteHeader(code int) {
	w.Header().Set("Content-Type", w.mime)
	w.ResponseWriter.WriteHeader(code)
}

func (w *typedWriter) Write(b []byte) (int, error) {
	if w.Header().Get("Content-Type") != w.mime {
		w.WriteHeader(http.StatusOK)
	}
	return w.ResponseWriter.Write(b)
}

// recordLoads is run in each page before its own scripts: it notes how the
// engine is compiled, from a stream or from a buffer, and how that ended.
const recordLoads = `(() => {
  const log = window.__wasmLoads = [];
  const stream = WebAssembly.compileStreaming, buffer = WebAssembly.compile;
  WebAssembly.compileStreaming = function (...a) {
    log.push('streaming');
    return stream.apply(this, a).then((r) => { log.push('streaming ok'); return r; }, (e) => { log.push('streaming failed'); throw e; });
  };
  WebAssembly.compile = function (...a) {
    log.push('buffer');
    return buffer.apply(this, a);
  };
})()`

func TestBrowserLoading(t *testing.T) {
	chromiumPath(t)
	dir := builtSite(t)
	h, err := siteHandler(dir)
	if err != nil {
		t.Fatal(err)
	}
	bctx := browser(t)
	want := goldenRows(t, "calculator")

	for _, tc := range []struct {
		name, mime string
		loads      string
	}{
		{"application/wasm streams", "", "streaming,streaming ok"},
		{"another type falls back to a buffer", "application/octet-stream", "streaming,streaming failed,buffer"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			gate := &wasmGate{h: h, mime: tc.mime, asked: make(chan struct{}), released: make(chan struct{})}
			srv := httptest.NewServer(gate)
			defer srv.Close()
			defer gate.release()
			tb := newTab(t, bctx)
			tb.do()
			if _, err := chromedp.Call(tb.ctx, cdppage.AddScriptToEvaluateOnNewDocument, cdppage.AddScriptToEvaluateOnNewDocumentParams{Source: recordLoads}); err != nil {
				t.Fatal(err)
			}
			tb.do(chromedp.Navigate(srv.URL + "/calculator.html"))
			select {
			case <-gate.asked:
			case <-tb.ctx.Done():
				t.Fatal("the page never asked for the engine")
			}
			// The engine is still on its way: the page shows the numbers
			// computed when it was built.
			if st := eval[string](tb, `document.querySelector('#workbench').dataset.state`); st != "static" {
				t.Fatalf("before the engine arrived the calculator is %q", st)
			}
			sameRows(t, "before the engine", tb.rows(), want)
			if !eval[bool](tb, `(() => { const r = document.querySelector('#workbench tr[data-unit] td.sc-seats').getBoundingClientRect(); return r.width > 0 && r.height > 0; })()`) {
				t.Error("the prerendered seats are not visible")
			}
			if eval[string](tb, `window.__wasmLoads.join(',')`) == tc.loads {
				t.Fatal("the engine was compiled before it arrived")
			}
			// Nothing waits for the engine to paint: the first contentful
			// paint has happened while the engine is held back.
			tb.waitFor("the first contentful paint", `performance.getEntriesByType('paint').some((e) => e.name === 'first-contentful-paint')`)
			gate.release()
			tb.waitFor("live", allLive)
			sameRows(t, "live", tb.rows(), want)
			if got := eval[string](tb, `window.__wasmLoads.join(',')`); got != tc.loads {
				t.Errorf("the engine was loaded by %q, want %q", got, tc.loads)
			}
			if tc.mime == "" {
				tb.checkClean(srv.URL + "/")
				// The page asked for the engine once: the bridge's fetch
				// took the preloaded answer.
				tb.mu.Lock()
				n := 0
				for _, r := range tb.requests {
					if strings.HasSuffix(r, ".wasm") {
						n++
					}
				}
				tb.mu.Unlock()
				if n != 1 {
					t.Errorf("the engine was requested %d times", n)
				}
			}
		})
	}

	t.Run("the seat order is laid out when opened", func(t *testing.T) {
		srv := httptest.NewServer(h)
		defer srv.Close()
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate(srv.URL + "/calculator.html"))
		tb.waitFor("live", allLive)
		const order = `#workbench details.sc-order`
		if !eval[bool](tb, `!!document.querySelector('`+order+` [data-role="order-pending"]') && !document.querySelector('`+order+` tbody')`) {
			t.Fatal("the folded seat order is laid out while closed")
		}
		tb.do(chromedp.Click(chromedp.CSS(order + ` summary`)))
		tb.waitFor("the order's rows", `document.querySelectorAll('`+order+` tbody tr').length > 0`)
		got := eval[[]int](tb, `[document.querySelectorAll('`+order+` tbody tr').length,
			+document.querySelector('`+order+` summary').textContent.match(/\((\d+) seat/)[1],
			document.querySelectorAll('`+order+` [data-role="order-pending"]').length]`)
		if len(got) != 3 || got[0] != got[1] || got[2] != 0 {
			t.Errorf("opened seat order: rows, count in its summary, pending notes = %v", got)
		}
		tb.checkClean(srv.URL + "/")
	})

	t.Run("patched results are built results", func(t *testing.T) {
		srv := httptest.NewServer(h)
		defer srv.Close()
		tb := newTab(t, bctx)
		tb.do(chromedp.Navigate(srv.URL + "/calculator.html"))
		tb.waitFor("live", allLive)
		tb.do(chromedp.Click(chromedp.CSS(`#workbench details.sc-order summary`)))
		// A change that moves seats, then one that makes an error, then
		// one that mends it: each time the page's results must be what a
		// fresh build of the engine's answer gives.
		for _, v := range []string{"3055971", "x", "55971"} {
			sel := chromedp.CSS(`#workbench [data-field="units.8.population"]`)
			before := eval[string](tb, `location.hash`)
			tb.do(chromedp.SetValue(sel, v), chromedp.Evaluate[chromedp.Void](`document.querySelector('#workbench [data-field="units.8.population"]').dispatchEvent(new Event('change', {bubbles: true}))`))
			// The link, which the check reads the scenario from, follows
			// after a pause.
			tb.waitFor("the link to follow the edit", `location.hash !== `+strconv.Quote(before))
			same := eval[string](tb, `(async () => {
  const bridge = await import(document.querySelector('script[type=module][src]').src);
  const root = document.querySelector('#workbench');
  const payload = location.hash.split('workbench=')[1].split('&')[0];
  const scenario = (await bridge.engineFor(false).call('calculator', [{block_text: root.querySelector('script[type="application/json"]').textContent,
    id: root.id, mode: root.getAttribute('data-seatsmith'), link: payload, margins: false}])).scenario;
  const r = await bridge.engineFor(false).call('calculator', [{block_text: root.querySelector('script[type="application/json"]').textContent,
    id: root.id, mode: root.getAttribute('data-seatsmith'), scenario, editor: false, margins: false}]);
  const fresh = bridge.build(r.output);
  const live = root.querySelector('[data-part="output"]');
  // Folded sections are as the reader left them.
  for (const d of fresh.querySelectorAll('details[class]')) {
    const l = live.querySelector('details.' + CSS.escape(d.classList[0]));
    if (l) d.open = l.open;
  }
  const canon = (n) => n.nodeType === Node.TEXT_NODE ? JSON.stringify(n.data) :
    '<' + n.namespaceURI + ' ' + n.localName + ' ' + [...n.attributes].map((a) => a.name + '=' + JSON.stringify(a.value)).sort().join(' ') + '>' +
    [...n.childNodes].map(canon).join('') + '</>';
  return canon(live) === canon(fresh) ? 'same' : 'differs: ' + live.outerHTML.length + ' vs ' + fresh.outerHTML.length;
})()`)
			if same != "same" {
				t.Errorf("after setting the population to %s the patched results %s from a fresh build", v, same)
			}
			if v == "3055971" && !eval[bool](tb, `document.querySelector('#workbench details.sc-order').open`) {
				t.Error("the seat order the reader opened closed after the edit")
			}
		}
		tb.checkClean(srv.URL + "/")
	})
}
