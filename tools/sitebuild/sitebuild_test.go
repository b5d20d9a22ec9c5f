package main

import (
	"bytes"
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"seatsmith/engine/jsondoc"
	"seatsmith/engine/render"
	"seatsmith/site/calc"
)

const (
	siteSrc   = "../../site/content"
	goldenDir = "../../testdata/site"
)

// TestGoldens checks every page's calculators against testdata/site, as
// "sitebuild check" does.
func TestGoldens(t *testing.T) {
	var out bytes.Buffer
	bad, err := check(siteSrc, goldenDir, false, &out)
	if err != nil {
		t.Fatal(err)
	}
	if len(bad) > 0 {
		t.Fatalf("pages differ from their goldens: %v\n%s", bad, out.String())
	}
}

// TestLiveMatchesPrerender renders every calculator's results both ways:
// as the build prerenders them and as the browser asks the engine for them
// (calc.Answer, behind the WebAssembly engine's calculator function). They must be
// the same markup.
func TestLiveMatchesPrerender(t *testing.T) {
	s, err := loadSite(siteSrc)
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, p := range s.Pages {
		for i, br := range p.Blocks {
			pre := render.HTML(calc.Output(p.Outcomes[i]))
			req := jsondoc.NewObject().Set("block_text", jsondoc.Str(br.JSON)).Set("id", jsondoc.Str(br.Block.ID)).
				Set("mode", jsondoc.Str(br.Block.Mode.String()))
			r, err := calc.DecodeRequest(req)
			if err != nil {
				t.Fatal(err)
			}
			resp := calc.Answer(r).Doc()
			if st := resp.Get("state"); st == nil || st.Text != "live" {
				t.Fatalf("%s/%s: live state %s", p.Name, br.Block.ID, jsondoc.Marshal(resp))
			}
			tree, ok := render.FromDoc(resp.Get("output"))
			if !ok {
				t.Fatalf("%s/%s: the live output is not a render tree", p.Name, br.Block.ID)
			}
			if live := render.HTML(tree); live != pre {
				t.Errorf("%s/%s: live and prerendered results differ:\n%s", p.Name, br.Block.ID, lineDiff(pre, live))
			}
			n++
		}
	}
	if n < 5 {
		t.Fatalf("only %d calculators on the site", n)
	}
}

// writeSite makes a site source tree with one page.
func writeSite(t *testing.T, page string) string {
	t.Helper()
	dir := t.TempDir()
	for _, d := range []string{"pages", "static", "scenarios"} {
		os.MkdirAll(filepath.Join(dir, d), 0o755)
	}
	copyFile(t, filepath.Join(siteSrc, "layout.html"), filepath.Join(dir, "layout.html"))
	// Every static file, so that the build finds each stylesheet it needs.
	static, err := filepath.Glob(filepath.Join(siteSrc, "static", "*"))
	if err != nil || len(static) == 0 {
		t.Fatalf("no static files: %v", err)
	}
	for _, f := range static {
		copyFile(t, f, filepath.Join(dir, "static", filepath.Base(f)))
	}
	if err := os.WriteFile(filepath.Join(dir, "pages", "calculator.html"), []byte(page), 0o644); err != nil {
		t.Fatal(err)
	}
	return dir
}

func copyFile(t *testing.T, from, to string) {
	t.Helper()
	b, err := os.ReadFile(from)
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(to, b, 0o644); err != nil {
		t.Fatal(err)
	}
}

const pageHead = `{{define "title"}}T{{end}}{{define "description"}}D{{end}}
{{define "body"}}
<p>Intro.</p>
`

func block(json string) string {
	return "<div class=\"seatsmith\" id=\"c\" data-seatsmith=\"compact\">\n<script type=\"application/json\">\n" + json + "\n</script>\n</div>\n{{end}}\n"
}

const goodScenario = `{
  "seats": 10,
  "method": "webster",
  "units": [
    {"name": "North", "population": 5200},
    {"name": "South", "population": 3900}
  ],
  "claims": [
    {"id": "north-six", "kind": "seats", "unit": "North", "seats": 6}
  ]
}`

// TestBadPageSources checks that mistakes in a page source are reported by
// file, line and field, and that nothing is written.
func TestBadPageSources(t *testing.T) {
	cases := []struct {
		name, json string
		want       []string // substrings of the message
	}{
		{"malformed JSON", "{\n  \"seats\": 10,\n  \"units\": [\n}", []string{"calculator.html:9:", "malformed"}},
		{"unknown member", "{\n  \"seats\": 10, \"method\": \"webster\",\n  \"colour\": \"red\",\n  \"units\": [{\"name\": \"A\", \"population\": 1}]\n}", []string{"calculator.html:8:", "colour", "unknown member"}},
		{"bad population", "{\n  \"seats\": 10, \"method\": \"webster\",\n  \"units\": [\n    {\"name\": \"A\", \"population\": \"12x\"}\n  ]\n}", []string{"calculator.html:9:", "units[0].population"}},
		{"no method", "{\n  \"seats\": 10,\n  \"units\": [{\"name\": \"A\", \"population\": 1}]\n}", []string{"calculator.html:6:", "method", "missing"}},
		{"bad claim kind", "{\n  \"seats\": 10, \"method\": \"webster\",\n  \"units\": [{\"name\": \"A\", \"population\": 1}],\n  \"claims\": [\n    {\"id\": \"x\", \"kind\": \"wins\", \"unit\": \"A\"}\n  ]\n}", []string{"calculator.html:10:", "claims[0].kind", "unknown kind"}},
		{"claim about no unit", "{\n  \"seats\": 10, \"method\": \"webster\",\n  \"units\": [{\"name\": \"A\", \"population\": 1}],\n  \"claims\": [\n    {\"id\": \"x\", \"kind\": \"seats\", \"unit\": \"B\", \"seats\": 1}\n  ]\n}", []string{"calculator.html:10:", "claims[0].unit", "\"B\""}},
		{"infeasible", "{\n  \"seats\": 1, \"method\": \"adams\",\n  \"units\": [{\"name\": \"A\", \"population\": 1}, {\"name\": \"B\", \"population\": 1}]\n}", []string{"calculator.html:7:", "seats"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			dir := writeSite(t, pageHead+block(c.json))
			out := filepath.Join(t.TempDir(), "out")
			_, err := Build(Options{Src: dir, Out: out, Engines: fakeEngines})
			if err == nil {
				t.Fatal("no error")
			}
			for _, w := range c.want {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("error %q does not contain %q", err, w)
				}
			}
			if _, serr := os.Stat(out); serr == nil {
				t.Error("the build wrote output despite the error")
			}
		})
	}
	t.Run("block without script", func(t *testing.T) {
		dir := writeSite(t, pageHead+"<div data-seatsmith id=\"c\">\n<p>no data</p>\n</div>\n{{end}}\n")
		_, err := Build(Options{Src: dir, Out: filepath.Join(t.TempDir(), "out"), Engines: fakeEngines})
		if err == nil || !strings.Contains(err.Error(), "calculator.html:4: script:") {
			t.Fatalf("got %v", err)
		}
	})
	t.Run("unknown claim reference", func(t *testing.T) {
		dir := writeSite(t, strings.Replace(pageHead, "<p>Intro.</p>", "<p>{{claim \"nope\" \"text\"}}</p>", 1)+block(goodScenario))
		_, err := Build(Options{Src: dir, Out: filepath.Join(t.TempDir(), "out"), Engines: fakeEngines})
		if err == nil || !strings.Contains(err.Error(), "calculator.html") || !strings.Contains(err.Error(), `"nope"`) {
			t.Fatalf("got %v", err)
		}
	})
}

// TestFalseClaimFailsBuild checks that a claim that does not hold stops the
// build with a message naming the page and the claim.
func TestFalseClaimFailsBuild(t *testing.T) {
	bad := strings.Replace(goodScenario, `"seats": 6}`, `"seats": 7, "text": "North wins seven."}`, 1)
	dir := writeSite(t, pageHead+block(bad))
	old := filepath.Join(t.TempDir(), "out")
	os.MkdirAll(old, 0o755)
	os.WriteFile(filepath.Join(old, "keep.txt"), []byte("previous build"), 0o644)
	_, err := Build(Options{Src: dir, Out: old, Engines: fakeEngines})
	if err == nil {
		t.Fatal("a false claim did not fail the build")
	}
	msg := err.Error()
	for _, w := range []string{"calculator.html:14:", `claim "north-six"`, `"North wins seven."`, "North gets 6 seats"} {
		if !strings.Contains(msg, w) {
			t.Errorf("message %q does not contain %q", msg, w)
		}
	}
	if b, err := os.ReadFile(filepath.Join(old, "keep.txt")); err != nil || string(b) != "previous build" {
		t.Error("the failed build touched the previous output")
	}
}

// TestBuildOutput builds a small site (with a stand-in engine) and checks
// the pieces a deployment relies on.
func TestBuildOutput(t *testing.T) {
	dir := writeSite(t, pageHead+`<p>{{claim "north-six" "North gets six"}}</p>`+"\n"+block(goodScenario))
	out := filepath.Join(t.TempDir(), "out")
	st, err := Build(Options{Src: dir, Out: out, Engines: fakeEngines})
	if err != nil {
		t.Fatal(err)
	}
	if st.Pages != 1 || st.Calculators != 1 || st.Claims != 1 {
		t.Errorf("stats %+v", st)
	}
	page, err := os.ReadFile(filepath.Join(out, "calculator.html"))
	if err != nil {
		t.Fatal(err)
	}
	h := string(page)
	for _, w := range []string{
		`data-state="static"`, `data-unit="North" data-seats="6"`, `data-unit="South" data-seats="4"`,
		`script-src 'self' 'wasm-unsafe-eval'`, `data-claim-ref="north-six"`, "Not an official",
	} {
		if !strings.Contains(h, w) {
			t.Errorf("page lacks %s", w)
		}
	}
	// Only the bridge module and JSON data blocks are scripts.
	for _, m := range regexp.MustCompile(`<script[^>]*>`).FindAllString(h, -1) {
		if !strings.Contains(m, `type="application/json"`) && !(strings.Contains(m, `type="module"`) && strings.Contains(m, `src="assets/bridge.`)) {
			t.Errorf("unexpected script element %s", m)
		}
	}
	for _, m := range regexp.MustCompile(`(?:src|href|content)="(assets/[^"]+)"`).FindAllStringSubmatch(h, -1) {
		if !regexp.MustCompile(`\.[0-9a-f]{10}\.(css|js|wasm|svg)$`).MatchString(m[1]) {
			t.Errorf("asset %s has no content hash in its name", m[1])
		}
		if _, err := os.Stat(filepath.Join(out, m[1])); err != nil {
			t.Errorf("asset %s was not written", m[1])
		}
	}
	hdr, err := os.ReadFile(filepath.Join(out, headersFile))
	if err != nil || !strings.Contains(string(hdr), "/calculator.html\n  Content-Security-Policy: "+CSP) {
		t.Errorf("headers file: %v\n%s", err, hdr)
	}
	off, err := os.ReadFile(filepath.Join(out, "offline.html"))
	if err != nil {
		t.Fatal(err)
	}
	o := string(off)
	if strings.Contains(o, `src="assets/`) || strings.Contains(o, `href="assets/`) || !strings.Contains(o, "data-seatsmith-engine") {
		t.Error("the offline file links to assets or lacks its engine")
	}
	if !strings.Contains(o, "'sha256-") {
		t.Error("the offline file's policy has no script hashes")
	}

	// The preview server applies the headers file and serves WebAssembly
	// with its own type, and keeps the headers file to itself.
	handler, err := siteHandler(out)
	if err != nil {
		t.Fatal(err)
	}
	srv := httptest.NewServer(handler)
	defer srv.Close()
	get := func(p string) *http.Response {
		t.Helper()
		resp, err := http.Get(srv.URL + p)
		if err != nil {
			t.Fatal(err)
		}
		resp.Body.Close()
		return resp
	}
	if r := get("/calculator.html"); r.StatusCode != 200 || !strings.Contains(r.Header.Get("Content-Security-Policy"), "frame-ancestors 'none'") || r.Header.Get("X-Content-Type-Options") != "nosniff" {
		t.Errorf("page headers: %d %v", r.StatusCode, r.Header)
	}
	wasm := regexp.MustCompile(`assets/seatsmith\.[0-9a-f]+\.wasm`).FindString(h)
	if r := get("/" + wasm); r.Header.Get("Content-Type") != "application/wasm" || !strings.Contains(r.Header.Get("Cache-Control"), "immutable") {
		t.Errorf("engine headers for %s: %v", wasm, r.Header)
	}
	if r := get("/offline.html"); strings.Contains(r.Header.Get("Content-Security-Policy"), "'self'") || !strings.Contains(r.Header.Get("Content-Security-Policy"), "'sha256-") {
		t.Errorf("the offline file is served with policy %q", r.Header.Get("Content-Security-Policy"))
	}
	if r := get("/" + headersFile); r.StatusCode != 404 {
		t.Errorf("the headers file is served (%d)", r.StatusCode)
	}
}

// TestMinifierKeepsNumbers guards populations in JSON against number
// shortening (1000000 must not become 1e6).
func TestMinifierKeepsNumbers(t *testing.T) {
	m := newMinifier()
	out, err := m.Bytes("application/json", []byte(`{"population": 1000000, "x": 0.50}`))
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(out), "1000000") || !strings.Contains(string(out), "0.50") {
		t.Errorf("numbers changed: %s", out)
	}
	h, err := m.Bytes("text/html", []byte(`<p>x</p><script type="application/json">{"population": 1000000}</script>`))
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(h), "1000000") {
		t.Errorf("numbers changed in a data block: %s", h)
	}
}

// fakeEngines stand in for the modules where a test does not run them.
var fakeEngines = &Engines{Calculator: []byte("\x00asm\x01\x00\x00\x00"), Analysis: []byte("\x00asm\x01\x00\x00\x00a")}
