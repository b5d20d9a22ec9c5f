package main

// Speed of the live calculator in headless Chromium: an edit to a scenario
// of fifty units re-renders the full comparison of every method, and the
// engine call behind it. The figures are measured inside the page with
// performance.now() and reported as metrics beside baselines from the same
// run; nothing here fails on slowness.

import (
	"encoding/json"
	"math"
	"net/http/httptest"
	"slices"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/chromedp"
)

// benchUnits is the invented scenario the benchmark edits: fifty units with
// made-up names and populations spread from tens of thousands to millions.
func benchUnits() string {
	first := []string{"Quell", "Vask", "Orn", "Tirr", "Zeph", "Mour", "Kest", "Brin", "Yalt", "Drov"}
	last := []string{"ara", "ion", "esk", "ith", "umbre"}
	var b strings.Builder
	b.WriteString("name,population\n")
	x := uint32(2463534242)
	for i := 0; i < 50; i++ {
		x ^= x << 13
		x ^= x >> 17
		x ^= x << 5
		pop := 20000 + int(x%3000000)
		b.WriteString(first[i%10] + last[i/10] + "," + strconv.Itoa(pop) + "\n")
	}
	return b.String()
}

// editTimingJS runs the edits inside the page and returns their timings in
// milliseconds. Each edit sets a unit's population field and dispatches
// the events a reader's typing and committing produce (input, then change)
// on that field, so the bridge's own handlers do the work. For each edit:
//
//	handle  from the input event to the change handler's return, when the
//	        results are in the DOM
//	raf     from the input event to the next requestAnimationFrame callback
//	render  style, layout and paint of that frame: from the callback to a
//	        message posted in it
//	gap     the time between that frame and the one before it
//
// With same set, every edit writes the value the field already holds: a
// render of an unchanged scenario, the baseline of an edit.
const editTimingJS = `(async (n, same) => {
  const root = document.querySelector('#workbench');
  const fields = [...root.querySelectorAll('[data-field$=".population"]')];
  const frame = () => new Promise((resolve) => requestAnimationFrame((ts) => {
    const at = performance.now();
    const ch = new MessageChannel();
    ch.port1.onmessage = () => resolve([ts, at, performance.now()]);
    ch.port2.postMessage(0);
  }));
  let [prev] = await frame();
  const out = {handle: [], raf: [], render: [], gap: []};
  for (let i = 0; i < n; i++) {
    const el = fields[(i * 7) % fields.length];
    const v = same ? el.value : String(Number(el.value) + ((i % 2) ? -1 : 1) * (1000 + 37 * i));
    const t0 = performance.now();
    el.value = v;
    el.dispatchEvent(new Event('input', {bubbles: true}));
    el.dispatchEvent(new Event('change', {bubbles: true}));
    const t1 = performance.now();
    const [ts, t2, t3] = await frame();
    out.handle.push(t1 - t0);
    out.raf.push(t2 - t0);
    out.render.push(t3 - t2);
    out.gap.push(ts - prev);
    prev = ts;
  }
  return JSON.stringify(out);
})`

// engineTimingJS calls the engine as the bridge does for an edit (the
// calculator function with the edited scenario as JSON text, no editor, no
// costly margins) without building anything from the answer, and a trivial
// exported function (methods) as the baseline of a call across the bridge.
// It also times the pieces of a render: the call, building the DOM nodes
// from the answer (the bridge's own build), and putting them in place with
// the style and layout that follow. Milliseconds; the trivial call is timed
// in runs of batch calls and reported per call, finer than the clock.
const engineTimingJS = `(async (n, batch) => {
  const root = document.querySelector('#workbench');
  const api = globalThis.seatsmith;
  const bridge = await import(document.querySelector('script[type=module][src]').src);
  const frag = new Map(location.hash.slice(1).split('&').map((p) => [p.slice(0, p.indexOf('=')), p.slice(p.indexOf('=') + 1)]));
  const scenario = (await bridge.engineFor(false).call('calculator', [{block_text: root.querySelector('script[type="application/json"]').textContent,
    id: root.id, mode: root.getAttribute('data-seatsmith'), link: frag.get('workbench'), margins: false}])).scenario;
  const req = {block_text: root.querySelector('script[type="application/json"]').textContent, id: root.id,
    mode: root.getAttribute('data-seatsmith'), scenario_text: '', editor: false, margins: false, timings: true};
  const out = {engine: [], compute: [], layout: [], noop: [], build: [], place: [], compare: [], units: scenario.units.length, state: ''};
  for (let i = 0; i < n; i++) {
    const u = scenario.units[(i * 7) % scenario.units.length];
    u.population = String(Number(u.population) + ((i % 2) ? -1 : 1) * (1000 + 37 * i));
    const t0 = performance.now();
    req.scenario_text = JSON.stringify(scenario);
    const r = api.calculator(req);
    const t1 = performance.now();
    out.engine.push(t1 - t0);
    out.compute.push(Number(r.timings.compute_ms));
    out.layout.push(Number(r.timings.layout_ms));
    out.state = r.state;
    const el = bridge.build(r.output);
    const t2 = performance.now();
    out.build.push(t2 - t1);
    const old = root.querySelector('[data-part="output"]');
    old.replaceWith(el);
    void root.offsetHeight;
    out.place.push(performance.now() - t2);
    const c0 = performance.now();
    api.compare(scenario);
    out.compare.push(performance.now() - c0);
    const m0 = performance.now();
    for (let k = 0; k < batch; k++) api.methods();
    out.noop.push((performance.now() - m0) / batch);
  }
  return JSON.stringify(out);
})`

// quantile returns the q-quantile of xs (nearest rank).
func quantile(xs []float64, q float64) float64 {
	if len(xs) == 0 {
		return math.NaN()
	}
	s := slices.Clone(xs)
	slices.Sort(s)
	k := int(math.Ceil(q*float64(len(s)))) - 1
	return s[max(0, min(k, len(s)-1))]
}

// frameBudget is one frame at 60 frames a second, rounded as the budget
// is usually stated (common practice).
const frameBudget = 16.0

// fiftyUnitPage opens the calculator page in a new tab of a new headless
// Chromium and loads the benchmark's scenario the way a reader would: a
// house large enough for fifty units with a seat each, then the table
// pasted into the page's table box. It checks that the page then compares
// every method for fifty units and saves pictures of it.
func fiftyUnitPage(b testing.TB) *tab {
	b.Helper()
	chromiumPath(b)
	dir := builtSite(b)
	h, err := siteHandler(dir)
	if err != nil {
		b.Fatal(err)
	}
	srv := httptest.NewServer(h)
	b.Cleanup(srv.Close)
	bctx := browser(b)
	tb := newTabFor(b, bctx, 30*time.Minute)
	tb.do(chromedp.EmulateViewport(1280, 900))
	tb.do(chromedp.Navigate(srv.URL + "/calculator.html"))
	tb.waitFor("live", allLive)

	tb.do(chromedp.SetValue(chromedp.CSS(`#workbench [data-field="seats"]`), "250"),
		chromedp.Evaluate[chromedp.Void](`document.querySelector('#workbench [data-field="seats"]').dispatchEvent(new Event('change', {bubbles: true}))`))
	tb.do(chromedp.Click(chromedp.CSS(`#workbench .sc-csv summary`)),
		chromedp.SetValue(chromedp.CSS(`#workbench [data-field="csv"]`), benchUnits()),
		chromedp.Click(chromedp.CSS(`#workbench [data-action="use-csv"]`)))
	tb.waitFor("the column chooser", `!!document.querySelector('#workbench [data-action="use-columns"]')`)
	tb.do(chromedp.Click(chromedp.CSS(`#workbench [data-action="use-columns"]`)))
	tb.waitFor("fifty units", `document.querySelectorAll('#workbench tr[data-unit]').length === 50`)
	shape := eval[[]int](tb, `[document.querySelectorAll('#workbench [data-field$=".population"]').length,
		document.querySelectorAll('#workbench table.sc-comparison tr[data-compare-unit]').length,
		document.querySelectorAll('#workbench table.sc-comparison thead th[data-method]').length,
		+document.querySelector('#workbench table.sc-results').dataset.house]`)
	if len(shape) != 4 || shape[0] != 50 || shape[1] != 50 || shape[2] != 8 || shape[3] != 250 {
		b.Fatalf("the page under test is not a 250-seat house of 50 units compared by 8 methods: fields, comparison rows, methods, house = %v", shape)
	}
	for _, shot := range []struct{ name, sel string }{
		{"bench-edit-summary.png", `#workbench [data-role="summary"]`},
		{"bench-edit-compare.png", `#workbench [data-role="compare"]`},
	} {
		png, err := chromedp.Run(tb.ctx, chromedp.Screenshot(chromedp.CSS(shot.sel)))
		if err != nil {
			b.Fatalf("screenshot of %s: %v", shot.sel, err)
		}
		artifact(b, shot.name, png)
	}
	return tb
}

// BenchmarkBrowserEdit measures, in headless Chromium, edits to a scenario
// of fifty units on the calculator page, which shows every method's seats
// side by side. It loads the scenario through the page's own table box,
// then runs editsPerOp population edits per iteration and reports:
//
//	ms/edit-median, ms/edit-p95   input event to the DOM updated
//	ms/paint-p95                  that plus the next frame's style, layout and paint
//	ms/raf-p95                    input event to the next animation frame
//	ms/unchanged-median           the same for a render of an unchanged scenario
//	ms/engine-median, ms/engine-p95   the calculator call alone
//	ms/compute-median, -p95       of which the apportionment, the comparison and the claims
//	ms/layout-median, -p95        and the laying out of the results as a tree
//	ms/noop-median                a trivial call across the bridge
//	edit-p95/frame, paint-p95/frame   against a 16 ms frame
//	edit-median/unchanged, engine-median/noop, ...   ratios to baselines of this run
//	edit-median/engine-median     how much of an edit the bridge and the DOM add to the engine
//
// Run it with
//
//	go test -run '^$' -bench BrowserEdit -benchtime 1x ./tools/sitebuild
func BenchmarkBrowserEdit(b *testing.B) {
	const editsPerOp = 200
	tb := fiftyUnitPage(b)

	type editTimes struct{ Handle, Raf, Render, Gap []float64 }
	type engineTimes struct {
		Engine, Compute, Layout, Noop, Build, Place, Compare []float64
		Units                                                int
		State                                                string
	}
	var edits, same editTimes
	var eng engineTimes
	run := func(js string, dst any) {
		b.Helper()
		if err := json.Unmarshal([]byte(eval[string](tb, js)), dst); err != nil {
			b.Fatal(err)
		}
	}
	// One warm-up round, untimed, so that the engine's first calls and the
	// page's first layout of the big tables are not counted.
	var warm editTimes
	run(editTimingJS+`(20, false)`, &warm)

	b.ResetTimer()
	for b.Loop() {
		var e, s editTimes
		var g engineTimes
		run(editTimingJS+`(`+strconv.Itoa(editsPerOp)+`, false)`, &e)
		run(editTimingJS+`(`+strconv.Itoa(editsPerOp/4)+`, true)`, &s)
		tb.waitFor("the link to hold the scenario", `location.hash.includes("workbench=")`)
		run(engineTimingJS+`(`+strconv.Itoa(editsPerOp)+`, 20)`, &g)
		edits.Handle = append(edits.Handle, e.Handle...)
		edits.Raf = append(edits.Raf, e.Raf...)
		edits.Render = append(edits.Render, e.Render...)
		edits.Gap = append(edits.Gap, e.Gap...)
		same.Handle = append(same.Handle, s.Handle...)
		same.Render = append(same.Render, s.Render...)
		eng.Engine = append(eng.Engine, g.Engine...)
		eng.Compute = append(eng.Compute, g.Compute...)
		eng.Layout = append(eng.Layout, g.Layout...)
		eng.Noop = append(eng.Noop, g.Noop...)
		eng.Build = append(eng.Build, g.Build...)
		eng.Place = append(eng.Place, g.Place...)
		eng.Compare = append(eng.Compare, g.Compare...)
		eng.Units, eng.State = g.Units, g.State
	}
	b.StopTimer()
	if eng.Units != 50 || eng.State != "live" {
		b.Fatalf("the engine calls ran on %d units with state %q", eng.Units, eng.State)
	}
	if got := eval[string](tb, `document.querySelector('#workbench').dataset.state`); got != "live" {
		b.Fatalf("the calculator ended in state %q", got)
	}
	paint := make([]float64, len(edits.Handle))
	for i := range paint {
		paint[i] = edits.Handle[i] + edits.Render[i]
	}
	samePaint := make([]float64, len(same.Handle))
	for i := range samePaint {
		samePaint[i] = same.Handle[i] + same.Render[i]
	}
	dropped := 0
	for _, g := range edits.Gap {
		if g > 1.5*1000/60 {
			dropped++
		}
	}

	med, p95 := quantile(edits.Handle, .5), quantile(edits.Handle, .95)
	sameMed, sameP95 := quantile(same.Handle, .5), quantile(same.Handle, .95)
	engMed, noopMed := quantile(eng.Engine, .5), quantile(eng.Noop, .5)
	paintP95 := quantile(paint, .95)
	b.ReportMetric(0, "ns/op")
	b.ReportMetric(med, "ms/edit-median")
	b.ReportMetric(p95, "ms/edit-p95")
	b.ReportMetric(paintP95, "ms/paint-p95")
	b.ReportMetric(quantile(edits.Raf, .95), "ms/raf-p95")
	b.ReportMetric(sameMed, "ms/unchanged-median")
	b.ReportMetric(engMed, "ms/engine-median")
	b.ReportMetric(quantile(eng.Engine, .95), "ms/engine-p95")
	b.ReportMetric(quantile(eng.Compute, .95), "ms/compute-p95")
	b.ReportMetric(quantile(eng.Layout, .95), "ms/layout-p95")
	b.ReportMetric(noopMed, "ms/noop-median")
	computeMed := quantile(eng.Compute, .5)
	b.ReportMetric(computeMed, "ms/compute-median")
	b.ReportMetric(quantile(eng.Layout, .5), "ms/layout-median")
	b.ReportMetric(computeMed/engMed, "compute-median/engine-median")
	b.ReportMetric(quantile(eng.Compare, .5), "ms/compare-median")
	b.ReportMetric(quantile(eng.Build, .5), "ms/build-median")
	b.ReportMetric(quantile(eng.Place, .5), "ms/place-median")
	b.ReportMetric(p95/frameBudget, "edit-p95/frame")
	b.ReportMetric(paintP95/frameBudget, "paint-p95/frame")
	b.ReportMetric(med/sameMed, "edit-median/unchanged")
	b.ReportMetric(p95/sameP95, "edit-p95/unchanged")
	b.ReportMetric(quantile(paint, .5)/quantile(samePaint, .5), "paint-median/unchanged")
	b.ReportMetric(engMed/noopMed, "engine-median/noop")
	b.ReportMetric(med/engMed, "edit-median/engine-median")
	b.ReportMetric(engMed/frameBudget, "engine-median/frame")
	b.ReportMetric(float64(dropped)/float64(len(edits.Gap)), "late-frames/edit")
	b.Logf("%d edits of 50 units (every method compared): input to DOM median %.2f ms, p95 %.2f ms; with the next frame's rendering p95 %.2f ms; "+
		"unchanged scenario median %.2f ms; engine call median %.3f ms, of which apportioning, comparing and claims %.3f ms and layout %.3f ms (no-op call %.4f ms, compare alone %.3f ms); DOM build median %.2f ms, placing %.2f ms",
		len(edits.Handle), med, p95, paintP95, sameMed, engMed, computeMed, quantile(eng.Layout, .5), noopMed, quantile(eng.Compare, .5), quantile(eng.Build, .5), quantile(eng.Place, .5))
}
