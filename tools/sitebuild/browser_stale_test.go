package main

// An answer that arrives after the reader has edited again must not put
// its older scenario back: the next request carries the edit.

import (
	"net/http/httptest"
	"testing"

	"github.com/chromedp/chromedp"
)

// staleAnswerJS makes a second calculator from a copy of the page's
// #workbench block, with an engine that passes calls to the page's engine
// but hands back their answers only when told. It edits the house size to
// 41, lets that request go out, edits it to 42 and, before the next
// request leaves, hands back the answer for 41. It returns the house size
// of the scenario the calculator holds and of its results once every
// answer is in.
const staleAnswerJS = `(async () => {
  const bridge = await import(document.querySelector('script[type=module][src]').src);
  const real = bridge.engineFor(false);
  const held = [];
  let hold = false;
  const engine = {
    call(fn, args, opts) {
      const answer = real.call(fn, args, opts);
      if (!hold) return answer;
      return new Promise((resolve) => held.push({ answer, resolve }));
    },
  };
  const root = document.querySelector('#workbench').cloneNode(true);
  root.id = 'workbench-copy';
  document.querySelector('main').appendChild(root);
  const c = new bridge.Calculator(root, engine);
  await c.start();
  if (root.dataset.state !== 'live') return 'the copy did not go live: ' + root.dataset.state;
  const seats = root.querySelector('[data-field="seats"]');
  const type = (v) => {
    seats.value = v;
    seats.dispatchEvent(new Event('input', { bubbles: true }));
  };
  const until = async (cond) => {
    for (let i = 0; i < 400 && !cond(); i++) await new Promise((r) => setTimeout(r, 10));
    return cond();
  };
  hold = true;
  type('41');
  if (!(await until(() => held.length === 1))) return 'the edit to 41 sent no request';
  const first = held.shift();
  const a = await first.answer;
  // The reader types on; the answer for 41 arrives before the request
  // for 42 leaves.
  type('42');
  first.resolve(a);
  await new Promise((r) => setTimeout(r, 0));
  hold = false;
  if (!(await until(() => root.dataset.busy !== 'true' && String((c.scenario || {}).seats) === '42'))) {
    return 'the calculator holds ' + JSON.stringify((c.scenario || {}).seats) + ' seats after the edit to 42 (busy: ' + root.dataset.busy + ')';
  }
  const total = [...root.querySelectorAll('[data-part="output"] tr[data-unit]')].reduce((s, tr) => s + Number(tr.dataset.seats), 0);
  root.remove();
  return 'ok ' + total;
})()`

func TestBrowserStaleAnswer(t *testing.T) {
	chromiumPath(t)
	dir := builtSite(t)
	h, err := siteHandler(dir)
	if err != nil {
		t.Fatal(err)
	}
	srv := httptest.NewServer(h)
	defer srv.Close()
	tb := newTab(t, browser(t))
	tb.do(chromedp.Navigate(srv.URL + "/calculator.html"))
	tb.waitFor("live", allLive)
	if got := eval[string](tb, staleAnswerJS); got != "ok 42" {
		t.Errorf("after an answer that arrived between two edits: %s", got)
	}
	tb.checkClean(srv.URL + "/")
}
