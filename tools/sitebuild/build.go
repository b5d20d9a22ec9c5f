package main

import (
	"bytes"
	"crypto/sha256"
	"encoding/base64"
	"fmt"
	"html/template"
	"os"
	"path/filepath"
	"sort"
	"strings"

	"seatsmith/engine/format"
	"seatsmith/engine/render"
	"seatsmith/site/calc"
)

// Options say what to build and where.
type Options struct {
	Src  string // the site sources (pages/, static/, scenarios/, layout.html)
	Out  string // the folder to write
	Wasm string // a folder of prebuilt modules to use instead of building them
	// Engines, when not nil, are the modules themselves (tests build them
	// once).
	Engines *Engines
}

// Stats count what a build wrote.
type Stats struct {
	Pages, Calculators, Claims int
	Files                      []string // every file written, relative to Out
}

// CSP is the Content-Security-Policy of every page served from the site:
// only the site's own scripts and styles, WebAssembly compilation, no
// inline scripts (JSON data blocks are not scripts), nothing from any other
// origin.
const CSP = "default-src 'self'; script-src 'self' 'wasm-unsafe-eval'; style-src 'self'; img-src 'self'; " +
	"connect-src 'self'; font-src 'self'; worker-src 'self'; object-src 'none'; base-uri 'none'; form-action 'none'"

// headersFile names the file of HTTP headers written beside the site.
const headersFile = "site-headers.txt"

// offlinePage is the page source rendered again as the offline file.
const offlinePage = "calculator"

// Build renders the site. The output folder is replaced only when every
// page has been rendered: a failed build leaves the previous one in place.
func Build(opt Options) (*Stats, error) {
	s, err := loadSite(opt.Src)
	if err != nil {
		return nil, err
	}
	m := newMinifier()
	files := map[string][]byte{}
	assets := map[string]asset{}
	add := func(a asset) {
		assets[a.Name] = a
		files[a.Path] = a.Data
	}
	read := func(p string) ([]byte, error) {
		b, err := os.ReadFile(p)
		if err != nil {
			return nil, fmt.Errorf("%s: cannot read: %v", p, err)
		}
		return b, nil
	}
	// The bridge lives in the module's wasm folder: the module holding the
	// sources, or else the one the build runs in.
	root, err := moduleRoot(opt.Src)
	if err != nil {
		if root, err = moduleRoot("."); err != nil {
			return nil, err
		}
	}
	// The site's stylesheet is its page frame followed by the calculators'
	// own rules; other pages get the calculators' rules alone.
	frameRaw, err := read(filepath.Join(opt.Src, "static", "style.css"))
	if err != nil {
		return nil, err
	}
	calcRaw, err := read(filepath.Join(opt.Src, "static", "calculator.css"))
	if err != nil {
		return nil, err
	}
	cssRaw := append(append(append([]byte(nil), frameRaw...), '\n'), calcRaw...)
	cssMin, err := minifyAs(m, "text/css", cssRaw, "style.css")
	if err != nil {
		return nil, err
	}
	embedCSS, err := minifyAs(m, "text/css", rootFree(calcRaw), "calculator.css")
	if err != nil {
		return nil, err
	}
	add(fingerprint("assets", "style.css", cssMin))
	icon, err := read(filepath.Join(opt.Src, "static", "favicon.svg"))
	if err != nil {
		return nil, err
	}
	iconMin, err := minifyAs(m, "image/svg+xml", icon, "favicon.svg")
	if err != nil {
		return nil, err
	}
	add(fingerprint("assets", "favicon.svg", iconMin))
	bridgeRaw, err := read(filepath.Join(root, "wasm", "js", "bridge.js"))
	if err != nil {
		return nil, err
	}
	bridgeMin, err := minifyAs(m, "text/javascript", bridgeRaw, "bridge.js")
	if err != nil {
		return nil, err
	}
	add(fingerprint("assets", "bridge.js", bridgeMin))
	execRaw, err := wasmExecJS()
	if err != nil {
		return nil, err
	}
	execMin, err := minifyAs(m, "text/javascript", execRaw, "wasm_exec.js")
	if err != nil {
		return nil, err
	}
	add(fingerprint("assets", "wasm_exec.js", execMin))
	// The engine's worker is one script: Go's runtime support, then the
	// worker's own code.
	workerRaw, err := read(filepath.Join(root, "wasm", "js", "engine-worker.js"))
	if err != nil {
		return nil, err
	}
	workerMin, err := minifyAs(m, "text/javascript", workerRaw, "engine-worker.js")
	if err != nil {
		return nil, err
	}
	workerJS := append(append(append([]byte(nil), execMin...), '\n'), workerMin...)
	add(fingerprint("assets", "engine-worker.js", workerJS))
	engines := opt.Engines
	if engines == nil {
		if engines, err = buildEngines(opt.Wasm); err != nil {
			return nil, err
		}
	}
	eng := engines.Calculator
	add(fingerprint("assets", "seatsmith.wasm", eng))
	add(fingerprint("assets", "seatsmith-analysis.wasm", engines.Analysis))
	if err := addProjectionAssets(root, opt.Src, m, add, assets["bridge.js"]); err != nil {
		return nil, err
	}
	data, _ := filepath.Glob(filepath.Join(opt.Src, "scenarios", "*"))
	sort.Strings(data)
	for _, f := range data {
		b, err := read(f)
		if err != nil {
			return nil, err
		}
		name := filepath.Base(f)
		if strings.HasSuffix(name, ".json") {
			if b, err = minifyAs(m, "application/json", b, f); err != nil {
				return nil, err
			}
		}
		add(fingerprint("data", name, b))
	}
	// Unfingerprinted copies for pages elsewhere that embed a calculator.
	files["embed/bridge.js"] = bridgeMin
	files["embed/wasm_exec.js"] = execMin
	files["embed/engine-worker.js"] = workerJS
	files["embed/seatsmith.wasm"] = eng
	files["embed/seatsmith-analysis.wasm"] = engines.Analysis
	files["embed/seatsmith.css"] = embedCSS

	layout, err := read(filepath.Join(opt.Src, "layout.html"))
	if err != nil {
		return nil, err
	}
	st := &Stats{}
	for _, p := range s.Pages {
		out, err := renderPage(s, p, string(layout), assets, nil)
		if err != nil {
			return nil, err
		}
		min, err := minifyAs(m, "text/html", out, p.File)
		if err != nil {
			return nil, err
		}
		files[p.Name+".html"] = min
		st.Pages++
		st.Calculators += len(p.Blocks)
		for _, b := range p.Blocks {
			st.Claims += len(b.Block.Claims)
		}
	}
	var off *page
	for _, p := range s.Pages {
		if p.Name == offlinePage {
			off = p
		}
	}
	if off == nil {
		return nil, fmt.Errorf("%s: no page %s.html to make the offline file from", filepath.Join(opt.Src, "pages"), offlinePage)
	}
	offline, offlineCSP, err := renderOffline(s, off, string(layout), assets, m, cssMin, execMin, bridgeMin, workerMin, eng)
	if err != nil {
		return nil, err
	}
	files["offline.html"] = offline
	var names []string
	for _, p := range s.Pages {
		names = append(names, p.Name)
	}
	files[headersFile] = []byte(headersText(names, offlineCSP))
	addCompressed(files)
	if err := writeFiles(opt.Out, files); err != nil {
		return nil, err
	}
	for f := range files {
		st.Files = append(st.Files, f)
	}
	sort.Strings(st.Files)
	return st, nil
}

// headersText is the headers file: one path pattern a line, then its
// headers indented below it. Each page gets its policy by its own path, so
// that the offline file (whose policy allows its inline parts by hash) is
// not also held to the site's policy.
func headersText(pages []string, offlineCSP string) string {
	var b strings.Builder
	b.WriteString("# HTTP headers for this site (sitebuild serve applies them; a host that reads\n" +
		"# a path-pattern headers file can use it as it is).\n" +
		"#\n" +
		"# Besides these, a host should send .wasm files as application/wasm (the\n" +
		"# engine then compiles while it downloads), and may send a file's NAME.br\n" +
		"# or NAME.gz twin, written beside each compressible file, to a client whose\n" +
		"# Accept-Encoding allows it, with Content-Encoding: br or gzip, the\n" +
		"# original file's Content-Type and Vary: Accept-Encoding.\n" +
		"/*\n" +
		"  X-Content-Type-Options: nosniff\n" +
		"  Referrer-Policy: no-referrer\n" +
		"  Cross-Origin-Opener-Policy: same-origin\n")
	// Pages are checked with the server on every visit (they name the
	// current fingerprinted assets); assets never change under their name.
	page := func(path, csp string) {
		b.WriteString(path + "\n  Content-Security-Policy: " + csp + "; frame-ancestors 'none'\n  Cache-Control: no-cache\n")
	}
	page("/", CSP)
	for _, p := range pages {
		page("/"+p+".html", CSP)
	}
	page("/offline.html", offlineCSP)
	b.WriteString("/assets/*\n  Cache-Control: public, max-age=31536000, immutable\n" +
		"/data/*\n  Cache-Control: public, max-age=31536000, immutable\n" +
		"/embed/*\n  Cache-Control: public, max-age=3600\n")
	return b.String()
}

// pageData is what the layout and page templates see.
type pageData struct {
	Name    string
	Offline bool
	CSP     string
	Caution string
	// Engine is the WebAssembly module the page's blocks need (its asset
	// name), which the page asks for early; empty for a page without.
	Engine string
}

// renderPage executes the layout and page templates. Calculator blocks are
// replaced by their prerendered markup; inline adds the offline file's
// inline parts (nil for a served page).
func renderPage(s *site, p *page, layout string, assets map[string]asset, inline *inlineParts) ([]byte, error) {
	pre := make([]template.HTML, len(p.Blocks))
	var src strings.Builder
	last := 0
	for i, br := range p.Blocks {
		pre[i] = template.HTML(prerender(br, p.Outcomes[i]))
		src.WriteString(p.Source[last:br.Start])
		src.WriteString(fmt.Sprintf("{{calculator %d}}", i))
		// Keep the line count so that template errors name the right line.
		src.WriteString(strings.Repeat("\n", strings.Count(p.Source[br.Start:br.End], "\n")))
		last = br.End
	}
	src.WriteString(p.Source[last:])
	ids := p.claimIDs()
	funcs := template.FuncMap{
		"asset": func(name string) (template.URL, error) {
			a, ok := assets[name]
			if !ok {
				return "", fmt.Errorf("no asset %q", name)
			}
			if inline != nil {
				// The offline file carries its sample tables inside it.
				if !strings.HasPrefix(a.Path, "data/") {
					return "", fmt.Errorf("the offline page cannot link to %q", name)
				}
				return template.URL("data:" + dataType(name) + ";base64," + base64.StdEncoding.EncodeToString(a.Data)), nil
			}
			return template.URL(a.Path), nil
		},
		"calculator": func(i int) template.HTML { return pre[i] },
		"claim": func(id, text string) (template.HTML, error) {
			if !ids[id] {
				return "", fmt.Errorf("claim %q is not a claim of any calculator on this page", id)
			}
			n := render.El("mark", "class", "sc-ref", "data-claim-ref", id, "data-holds", "true").AddText(text)
			return template.HTML(render.HTML(n)), nil
		},
		"caution": func() string { return format.Caution },
		"link": func(name string) string {
			if inline != nil {
				return ""
			}
			return name
		},
	}
	t := template.New("layout").Funcs(funcs)
	if _, err := t.Parse(layout); err != nil {
		return nil, fmt.Errorf("%s: %v", filepath.Join(s.Src, "layout.html"), err)
	}
	if _, err := t.New(p.File).Parse(src.String()); err != nil {
		return nil, fmt.Errorf("%s: %v", p.File, err)
	}
	for _, need := range []string{"title", "description", "body"} {
		if t.Lookup(need) == nil {
			return nil, fmt.Errorf("%s: the page defines no %q template ({{define %q}}…{{end}})", p.File, need, need)
		}
	}
	d := pageData{Name: p.Name, CSP: CSP, Caution: format.Caution, Engine: p.engine()}
	if inline != nil {
		d.Offline = true
		d.CSP = inline.csp
	}
	var b bytes.Buffer
	if err := t.ExecuteTemplate(&b, "layout", d); err != nil {
		return nil, fmt.Errorf("%s: %v", p.File, err)
	}
	return b.Bytes(), nil
}

// prerender writes a calculator as the page carries it before the engine
// runs: the root with data-state="static", the scenario block, the
// editor (disabled) and the results computed by the native engine.
func prerender(br blockRef, o *calc.Outcome) string {
	b := br.Block
	class := "seatsmith"
	if br.Class != "" && !strings.Contains(" "+br.Class+" ", " seatsmith ") {
		class = br.Class + " seatsmith"
	} else if br.Class != "" {
		class = br.Class
	}
	root := render.El("div", "class", class, "id", b.ID, "data-seatsmith", b.Mode.String(), "data-state", "static")
	h := render.HTML(root)
	h = strings.TrimSuffix(h, "</div>")
	return h + `<script type="application/json">` + br.JSON + `</script>` +
		render.HTML(calc.Editor(b, nil, false)) + render.HTML(calc.Output(o)) + "</div>"
}

func dataType(name string) string {
	if strings.HasSuffix(name, ".json") {
		return "application/json"
	}
	return "text/csv"
}

// inlineParts are the offline file's inline elements.
type inlineParts struct {
	csp string
}

func cspHash(content []byte) string {
	sum := sha256.Sum256(content)
	return "'sha256-" + base64.StdEncoding.EncodeToString(sum[:]) + "'"
}

// renderOffline writes the offline file: the full calculator page with the
// stylesheet, the runtime, the bridge, the worker's source and the engine
// (gzip, base64) inlined, and a policy that allows exactly those inline
// scripts and styles, and the worker the bridge makes from them.
func renderOffline(s *site, p *page, layout string, assets map[string]asset, m interface {
	Bytes(string, []byte) ([]byte, error)
}, css, execJS, bridge, worker, eng []byte) ([]byte, string, error) {
	for _, part := range [][]byte{execJS, bridge, worker} {
		if bytes.Contains(bytes.ToLower(part), []byte("</script")) {
			return nil, "", fmt.Errorf("a script to inline contains </script")
		}
	}
	if bytes.Contains(bytes.ToLower(css), []byte("</style")) {
		return nil, "", fmt.Errorf("the stylesheet contains </style")
	}
	// The engine's worker is made from the inlined runtime and worker
	// source, as a blob.
	csp := "default-src 'none'; script-src " + cspHash(execJS) + " " + cspHash(bridge) + " 'wasm-unsafe-eval'; style-src " + cspHash(css) +
		"; worker-src blob:; img-src data:; base-uri 'none'; form-action 'none'"
	out, err := renderPage(s, p, layout, assets, &inlineParts{csp: csp})
	if err != nil {
		return nil, "", err
	}
	min, err := m.Bytes("text/html", out)
	if err != nil {
		return nil, "", fmt.Errorf("offline.html: cannot minify: %v", err)
	}
	head := "<style>" + string(css) + "</style><script data-seatsmith-runtime>" + string(execJS) + "</script><script type=\"module\">" + string(bridge) + "</script>" +
		"<script type=\"text/plain\" data-seatsmith-worker>" + string(worker) + "</script></head>"
	body := "<script type=\"application/octet-stream\" data-seatsmith-engine data-encoding=\"gzip\">" +
		base64.StdEncoding.EncodeToString(gzipBytes(eng)) + "</script></body>"
	h := string(min)
	if !strings.Contains(h, "</head>") || !strings.Contains(h, "</body>") {
		return nil, "", fmt.Errorf("offline.html: the layout has no </head> or </body>")
	}
	h = strings.Replace(h, "</head>", head, 1)
	i := strings.LastIndex(h, "</body>")
	h = h[:i] + body + h[i+len("</body>"):]
	return []byte(h), csp, nil
}

// writeFiles writes files into a fresh folder beside out and then puts it
// in place of out, so that a failure leaves the old site whole.
func writeFiles(out string, files map[string][]byte) error {
	abs, err := filepath.Abs(out)
	if err != nil {
		return err
	}
	parent := filepath.Dir(abs)
	if err := os.MkdirAll(parent, 0o755); err != nil {
		return err
	}
	tmp, err := os.MkdirTemp(parent, "."+filepath.Base(abs)+".new-")
	if err != nil {
		return err
	}
	for name, data := range files {
		p := filepath.Join(tmp, filepath.FromSlash(name))
		if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
			os.RemoveAll(tmp)
			return err
		}
		if err := os.WriteFile(p, data, 0o644); err != nil {
			os.RemoveAll(tmp)
			return err
		}
	}
	if err := os.Chmod(tmp, 0o755); err != nil {
		os.RemoveAll(tmp)
		return err
	}
	old := ""
	if _, err := os.Stat(abs); err == nil {
		old = tmp + ".old"
		if err := os.Rename(abs, old); err != nil {
			os.RemoveAll(tmp)
			return fmt.Errorf("cannot replace %s: %v", out, err)
		}
	}
	if err := os.Rename(tmp, abs); err != nil {
		if old != "" {
			os.Rename(old, abs)
		}
		os.RemoveAll(tmp)
		return err
	}
	if old != "" {
		os.RemoveAll(old)
	}
	return nil
}
