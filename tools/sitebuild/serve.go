package main

import (
	"bufio"
	"flag"
	"fmt"
	"io"
	"net/http"
	"os"
	"path"
	"path/filepath"
	"strings"
)

// A headerRule is one path pattern of the headers file with its headers.
type headerRule struct {
	pattern string
	headers [][2]string
}

// readHeaders reads the headers file written by build.
func readHeaders(file string) ([]headerRule, error) {
	f, err := os.Open(file)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	var rules []headerRule
	sc := bufio.NewScanner(f)
	n := 0
	for sc.Scan() {
		n++
		l := sc.Text()
		t := strings.TrimSpace(l)
		if t == "" || strings.HasPrefix(t, "#") {
			continue
		}
		if !strings.HasPrefix(l, " ") {
			rules = append(rules, headerRule{pattern: t})
			continue
		}
		k, v, ok := strings.Cut(t, ":")
		if !ok || len(rules) == 0 {
			return nil, fmt.Errorf("%s:%d: expected \"Name: value\" under a path pattern", file, n)
		}
		rules[len(rules)-1].headers = append(rules[len(rules)-1].headers, [2]string{strings.TrimSpace(k), strings.TrimSpace(v)})
	}
	return rules, sc.Err()
}

func (r headerRule) matches(p string) bool {
	if strings.HasSuffix(r.pattern, "*") {
		return strings.HasPrefix(p, strings.TrimSuffix(r.pattern, "*"))
	}
	return p == r.pattern
}

// contentTypes are the media types the preview server sends, by
// extension; a host should send the same (application/wasm above all: a
// module sent as another type cannot be compiled while it downloads).
var contentTypes = map[string]string{
	".html": "text/html; charset=utf-8",
	".css":  "text/css; charset=utf-8",
	".js":   "text/javascript; charset=utf-8",
	".wasm": "application/wasm",
	".svg":  "image/svg+xml",
	".json": "application/json",
	".csv":  "text/csv; charset=utf-8",
}

// siteHandler serves a built site with its headers. A compressible file is
// sent as its brotli or gzip twin when the request's Accept-Encoding
// allows (brotli first), with Content-Encoding set, its own Content-Type
// and Vary: Accept-Encoding; as it is otherwise.
func siteHandler(dir string) (http.Handler, error) {
	rules, err := readHeaders(filepath.Join(dir, headersFile))
	if err != nil {
		return nil, err
	}
	fsrv := http.FileServer(http.Dir(dir))
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		p := path.Clean("/" + r.URL.Path)
		if p == "/"+headersFile {
			http.NotFound(w, r)
			return
		}
		h := w.Header()
		for _, rule := range rules {
			if rule.matches(p) {
				for _, kv := range rule.headers {
					h.Set(kv[0], kv[1])
				}
			}
		}
		name := p
		if strings.HasSuffix(r.URL.Path, "/") {
			name = path.Join(p, "index.html")
		}
		if ct, ok := contentTypes[path.Ext(name)]; ok {
			h.Set("Content-Type", ct)
		}
		if compressible(name) {
			h.Add("Vary", "Accept-Encoding")
			if f, st, enc := openTwin(dir, name, r.Header.Values("Accept-Encoding")); f != nil {
				defer f.Close()
				h.Set("Content-Encoding", enc)
				http.ServeContent(w, r, name, st.ModTime(), f)
				return
			}
		}
		fsrv.ServeHTTP(w, r)
	}), nil
}

// openTwin opens the precompressed twin of the site file name (a clean
// slash path) in the first encoding the Accept-Encoding values allow, and
// returns it with its encoding; nil when there is none.
func openTwin(dir, name string, accept []string) (*os.File, os.FileInfo, string) {
	for _, e := range encodings {
		if !accepts(accept, e.name) {
			continue
		}
		f, err := os.Open(filepath.Join(dir, filepath.FromSlash(name+e.suffix)))
		if err != nil {
			continue
		}
		st, err := f.Stat()
		if err != nil || !st.Mode().IsRegular() {
			f.Close()
			continue
		}
		return f, st, e.name
	}
	return nil, nil, ""
}

func cmdServe(args []string, stdout, stderr io.Writer) error {
	fs := flag.NewFlagSet("serve", flag.ContinueOnError)
	src := fs.String("src", filepath.Join("site", "content"), "the site sources")
	addr := fs.String("addr", "127.0.0.1:8080", "the address to listen on")
	wasm := fs.String("wasm", "", "use the prebuilt modules in `DIR` (seatsmith.wasm, seatsmith-analysis.wasm) instead of building them")
	if err := parseFlags(fs, args, stderr); err != nil {
		return err
	}
	dir, err := os.MkdirTemp("", "sitebuild-serve-")
	if err != nil {
		return err
	}
	defer os.RemoveAll(dir)
	out := filepath.Join(dir, "site")
	st, err := Build(Options{Src: *src, Out: out, Wasm: *wasm})
	if err != nil {
		return err
	}
	h, err := siteHandler(out)
	if err != nil {
		return err
	}
	fmt.Fprintf(stdout, "built %d pages; serving http://%s/ (Ctrl-C stops)\n", st.Pages, *addr)
	return http.ListenAndServe(*addr, h)
}
