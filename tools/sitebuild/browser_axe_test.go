package main

// Accessibility tests: axe-core's WCAG 2.0, 2.1 and 2.2 A and AA rules on
// every page, at desktop and phone width, with the calculators live and
// prerendered. axe-core is injected through the DevTools protocol
// (Runtime.evaluate), never through a <script> element, so each page keeps
// its strict Content-Security-Policy while it is checked. The script comes
// from the npm package axe-core, installed from package-lock.json by
// `npm ci --prefix tools/sitebuild/testdata`, which the test runs itself
// the first time when npm is there.

import (
	"encoding/json"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"sync"
	"testing"

	"github.com/chromedp/cdproto/emulation"
	"github.com/chromedp/chromedp"
)

// axeTags are the rule sets run: WCAG 2.0, 2.1 and 2.2, levels A and AA.
var axeTags = []string{"wcag2a", "wcag2aa", "wcag21a", "wcag21aa", "wcag22a", "wcag22aa"}

// axeInstall installs axe-core from package-lock.json, once.
var axeInstall = sync.OnceValue(func() error {
	npm, err := exec.LookPath("npm")
	if err != nil {
		return err
	}
	out, err := exec.Command(npm, "ci", "--prefix", "testdata", "--prefer-offline", "--no-audit", "--no-fund").CombinedOutput()
	if err != nil {
		return fmt.Errorf("npm ci: %v: %s", err, out)
	}
	return nil
})

// axeSource returns axe-core's script, installing it first when it is
// missing. Without it the test skips locally and fails in CI.
func axeSource(t testing.TB) string {
	t.Helper()
	p := filepath.Join("testdata", "node_modules", "axe-core", "axe.min.js")
	b, err := os.ReadFile(p)
	if err != nil {
		if ierr := axeInstall(); ierr != nil {
			t.Logf("installing axe-core: %v", ierr)
		}
		b, err = os.ReadFile(p)
	}
	if err != nil {
		if os.Getenv("CI") != "" {
			t.Fatalf("axe-core is missing (%v): run npm ci --prefix tools/sitebuild/testdata", err)
		}
		t.Skipf("axe-core is missing (%v): run npm ci --prefix tools/sitebuild/testdata", err)
	}
	return string(b)
}

// An axeViolation is one rule broken, with the elements that break it.
type axeViolation struct {
	ID, Impact, Help string
	Nodes            []string
}

// axe injects axe-core into the page as it is and returns the violations
// of axeTags' rules.
func (tb *tab) axe(src string) []axeViolation {
	tb.t.Helper()
	tb.do(chromedp.Evaluate[chromedp.Void](src))
	tags, _ := json.Marshal(axeTags)
	run := `axe.run(document, {runOnly: {type: 'tag', values: ` + string(tags) + `}, resultTypes: ['violations']})
  .then(r => JSON.stringify(r.violations.map(v => ({ID: v.id, Impact: v.impact || '', Help: v.help,
    Nodes: v.nodes.map(n => n.target.join(' ') + ': ' + (n.failureSummary || '').replace(/\s+/g, ' '))}))))`
	var vs []axeViolation
	if err := json.Unmarshal([]byte(eval[string](tb, run)), &vs); err != nil {
		tb.t.Fatal(err)
	}
	return vs
}

func axeReport(vs []axeViolation) string {
	var b strings.Builder
	for _, v := range vs {
		fmt.Fprintf(&b, "\n  %s (%s): %s", v.ID, v.Impact, v.Help)
		for k, n := range v.Nodes {
			if k == 5 {
				fmt.Fprintf(&b, "\n    … and %d more", len(v.Nodes)-k)
				break
			}
			fmt.Fprintf(&b, "\n    %s", n)
		}
	}
	return b.String()
}

// TestBrowserAxe holds every page to zero violations of axe-core's WCAG
// 2.0-2.2 A and AA rules: live at 1280 and 320 pixels (a phone; at 390
// the layout is the same) with every folded section open, so that what
// they hold is checked too, and prerendered (JavaScript off) at 1280 and
// 320 as the page opens.
func TestBrowserAxe(t *testing.T) {
	chromiumPath(t)
	src := axeSource(t)
	bctx, origin := servedSite(t)
	writeHostPages(t, builtSite(t))
	runs := []struct {
		state  string
		widths []int64
	}{{"live", []int64{1280, 320}}, {"prerendered", []int64{1280, 320}}}
	// The host page with calculators embedded is checked too, their shadow
	// roots with it.
	for _, name := range append(sitePages(t), embedHost) {
		t.Run(name, func(t *testing.T) {
			for _, r := range runs {
				live := r.state == "live"
				tb := openPage(t, bctx, origin, name, r.widths[0], live)
				if live {
					tb.openFolds(live)
				} else {
					// axe-core needs timers, which a page without scripts
					// lacks; the page's own scripts, skipped as it loaded,
					// stay skipped.
					if _, err := chromedp.Call(tb.ctx, emulation.SetScriptExecutionDisabled, emulation.SetScriptExecutionDisabledParams{Value: false}); err != nil {
						t.Fatal(err)
					}
				}
				for i, w := range r.widths {
					if i > 0 {
						tb.setWidth(w)
						tb.settle()
					}
					vs := tb.axe(src)
					if len(vs) > 0 {
						t.Errorf("%s at %d px: %d axe-core rules broken:%s", r.state, w, len(vs), axeReport(vs))
					} else {
						t.Logf("%s at %d px: no violation", r.state, w)
					}
				}
				if live {
					tb.checkClean(origin)
				} else if n := eval[int](tb, `document.querySelectorAll('[data-state="live"]').length`); n != 0 {
					t.Errorf("%d calculators went live in the prerendered page", n)
				}
			}
		})
	}
}
