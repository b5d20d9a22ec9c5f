package main

import (
	"bufio"
	"flag"
	"fmt"
	"io"
	"mime"
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

// siteHandler serves a built site with its headers.
func siteHandler(dir string) (http.Handler, error) {
	rules, err := readHeaders(filepath.Join(dir, headersFile))
	if err != nil {
		return nil, err
	}
	mime.AddExtensionType(".wasm", "application/wasm")
	mime.AddExtensionType(".js", "text/javascript; charset=utf-8")
	fsrv := http.FileServer(http.Dir(dir))
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		p := path.Clean("/" + r.URL.Path)
		if p == "/"+headersFile {
			http.NotFound(w, r)
			return
		}
		for _, rule := range rules {
			if rule.matches(p) {
				for _, h := range rule.headers {
					w.Header().Set(h[0], h[1])
				}
			}
		}
		fsrv.ServeHTTP(w, r)
	}), nil
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
