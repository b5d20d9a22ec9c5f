package main

import (
	"bytes"
	"compress/gzip"
	"io"
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"

	"github.com/andybalholm/brotli"
)

func TestAccepts(t *testing.T) {
	for _, c := range []struct {
		header string
		br     bool
		gzip   bool
	}{
		{"", false, false},
		{"gzip", false, true},
		{"gzip, deflate, br, zstd", true, true},
		{"br;q=1.0, gzip;q=0.8", true, true},
		{"BR", true, false},
		{"br;q=0, gzip", false, true},
		{"br; q=0.000", false, false},
		{"*", true, true},
		{"*;q=0, gzip", false, true},
		{"br;q=0, *", false, true},
		{"identity", false, false},
		{"x-gzip", false, true},
		{"br;q=nope, gzip;q=2", false, false},
		{"br;level=5", true, false},
	} {
		var vals []string
		if c.header != "" {
			vals = []string{c.header}
		}
		if got := accepts(vals, "br"); got != c.br {
			t.Errorf("Accept-Encoding %q: br %v, want %v", c.header, got, c.br)
		}
		if got := accepts(vals, "gzip"); got != c.gzip {
			t.Errorf("Accept-Encoding %q: gzip %v, want %v", c.header, got, c.gzip)
		}
	}
	if !accepts([]string{"deflate", "br"}, "br") {
		t.Error("a second Accept-Encoding line is not read")
	}
}

// decompress undoes a content coding.
func decompress(t testing.TB, enc string, data []byte) []byte {
	t.Helper()
	var r io.Reader
	switch enc {
	case "", "identity":
		return data
	case "br":
		r = brotli.NewReader(bytes.NewReader(data))
	case "gzip":
		z, err := gzip.NewReader(bytes.NewReader(data))
		if err != nil {
			t.Fatalf("gzip: %v", err)
		}
		r = z
	default:
		t.Fatalf("unknown encoding %q", enc)
	}
	out, err := io.ReadAll(r)
	if err != nil {
		t.Fatalf("%s: %v", enc, err)
	}
	return out
}

// checkTwins checks that every compressible file of a build (files,
// relative to dir, as Stats lists them) has a brotli and a gzip twin that
// decompress to its bytes, and that no other file has one. It returns the
// number of files with twins.
func checkTwins(t testing.TB, dir string, files []string) int {
	t.Helper()
	listed := map[string]bool{}
	for _, f := range files {
		listed[f] = true
	}
	n := 0
	for _, f := range files {
		if strings.HasSuffix(f, ".br") || strings.HasSuffix(f, ".gz") {
			if !listed[strings.TrimSuffix(strings.TrimSuffix(f, ".br"), ".gz")] {
				t.Errorf("%s is the twin of no file", f)
			}
			continue
		}
		p := filepath.Join(dir, filepath.FromSlash(f))
		data, err := os.ReadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		for _, e := range encodings {
			twin, err := os.ReadFile(p + e.suffix)
			if !compressible(f) {
				if err == nil || listed[f+e.suffix] {
					t.Errorf("%s has a %s twin", f, e.name)
				}
				continue
			}
			if err != nil || !listed[f+e.suffix] {
				t.Errorf("%s has no %s twin (%v)", f, e.name, err)
				continue
			}
			if !bytes.Equal(decompress(t, e.name, twin), data) {
				t.Errorf("%s%s does not decompress to %s", f, e.suffix, f)
			}
		}
		if compressible(f) {
			n++
		}
	}
	return n
}

// TestServeEncodings builds a small site and asks the preview server for
// each kind of file with each Accept-Encoding a client may send.
func TestServeEncodings(t *testing.T) {
	dir := writeSite(t, pageHead+block(goodScenario))
	index := `{{define "title"}}Home{{end}}{{define "description"}}D{{end}}{{define "body"}}<p>Home.</p>{{end}}`
	if err := os.WriteFile(filepath.Join(dir, "pages", "index.html"), []byte(index), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(t.TempDir(), "out")
	st, err := Build(Options{Src: dir, Out: out, Engines: fakeEngines})
	if err != nil {
		t.Fatal(err)
	}
	if n := checkTwins(t, out, st.Files); n < 10 {
		t.Errorf("only %d files with twins", n)
	}
	page, err := os.ReadFile(filepath.Join(out, "calculator.html"))
	if err != nil {
		t.Fatal(err)
	}
	asset := func(re string) string {
		p := regexp.MustCompile(re).FindString(string(page))
		if p == "" {
			t.Fatalf("the page names no %s", re)
		}
		return "/" + p
	}
	h, err := siteHandler(out)
	if err != nil {
		t.Fatal(err)
	}
	srv := httptest.NewServer(h)
	defer srv.Close()
	// A client that leaves the body as sent.
	client := &http.Client{Transport: &http.Transport{DisableCompression: true}}
	files := []struct{ path, file, ctype string }{
		{asset(`assets/seatsmith\.[0-9a-f]+\.wasm`), "", "application/wasm"},
		{asset(`assets/bridge\.[0-9a-f]+\.js`), "", "text/javascript; charset=utf-8"},
		{asset(`assets/style\.[0-9a-f]+\.css`), "", "text/css; charset=utf-8"},
		{asset(`assets/favicon\.[0-9a-f]+\.svg`), "", "image/svg+xml"},
		{"/calculator.html", "", "text/html; charset=utf-8"},
		{"/", "/index.html", "text/html; charset=utf-8"},
		{"/embed/seatsmith.wasm", "", "application/wasm"},
	}
	for _, c := range []struct {
		accept []string
		enc    string
	}{
		{nil, ""},
		{[]string{"identity"}, ""},
		{[]string{"gzip, deflate"}, "gzip"},
		{[]string{"gzip, deflate, br, zstd"}, "br"},
		{[]string{"gzip;q=1, br;q=0.5"}, "br"},
		{[]string{"br;q=0, gzip"}, "gzip"},
		{[]string{"*"}, "br"},
		{[]string{"deflate", "gzip"}, "gzip"},
	} {
		for _, f := range files {
			file := f.file
			if file == "" {
				file = f.path
			}
			want, err := os.ReadFile(filepath.Join(out, filepath.FromSlash(file)))
			if err != nil {
				t.Fatal(err)
			}
			req, _ := http.NewRequest("GET", srv.URL+f.path, nil)
			for _, a := range c.accept {
				req.Header.Add("Accept-Encoding", a)
			}
			resp, err := client.Do(req)
			if err != nil {
				t.Fatal(err)
			}
			body, err := io.ReadAll(resp.Body)
			resp.Body.Close()
			if err != nil {
				t.Fatal(err)
			}
			where := f.path + " with Accept-Encoding " + strings.Join(c.accept, " | ")
			if resp.StatusCode != 200 {
				t.Errorf("%s: status %d", where, resp.StatusCode)
				continue
			}
			if got := resp.Header.Get("Content-Encoding"); got != c.enc {
				t.Errorf("%s: Content-Encoding %q, want %q", where, got, c.enc)
			}
			if got := resp.Header.Get("Content-Type"); got != f.ctype {
				t.Errorf("%s: Content-Type %q, want %q", where, got, f.ctype)
			}
			if got := resp.Header.Values("Vary"); len(got) != 1 || got[0] != "Accept-Encoding" {
				t.Errorf("%s: Vary %q", where, got)
			}
			if !bytes.Equal(decompress(t, c.enc, body), want) {
				t.Errorf("%s: the body is not the file", where)
			}
			if strings.HasPrefix(f.path, "/assets/") && !strings.Contains(resp.Header.Get("Cache-Control"), "immutable") {
				t.Errorf("%s: Cache-Control %q", where, resp.Header.Get("Cache-Control"))
			}
			if strings.HasSuffix(file, ".html") && resp.Header.Get("Cache-Control") != "no-cache" {
				t.Errorf("%s: Cache-Control %q", where, resp.Header.Get("Cache-Control"))
			}
		}
	}
	// A range of a compressed answer is a range of the compressed bytes;
	// a conditional request is answered as for the file.
	req, _ := http.NewRequest("GET", srv.URL+"/calculator.html", nil)
	req.Header.Set("Accept-Encoding", "br")
	req.Header.Set("Range", "bytes=0-3")
	resp, err := client.Do(req)
	if err != nil {
		t.Fatal(err)
	}
	resp.Body.Close()
	if resp.StatusCode != http.StatusPartialContent || resp.Header.Get("Content-Encoding") != "br" || resp.ContentLength != 4 {
		t.Errorf("range of the brotli twin: %d %v", resp.StatusCode, resp.Header)
	}
	req, _ = http.NewRequest("GET", srv.URL+"/calculator.html", nil)
	req.Header.Set("Accept-Encoding", "gzip")
	req.Header.Set("If-Modified-Since", time.Now().Add(time.Hour).UTC().Format(http.TimeFormat))
	if resp, err = client.Do(req); err != nil {
		t.Fatal(err)
	}
	resp.Body.Close()
	if resp.StatusCode != http.StatusNotModified {
		t.Errorf("a page not modified since: %d", resp.StatusCode)
	}
	// Files that are not compressible come as they are, without Vary.
	req, _ = http.NewRequest("GET", srv.URL+"/does-not-exist.html", nil)
	req.Header.Set("Accept-Encoding", "br")
	if resp, err = client.Do(req); err != nil {
		t.Fatal(err)
	}
	resp.Body.Close()
	if resp.StatusCode != 404 || resp.Header.Get("Content-Encoding") != "" {
		t.Errorf("a missing page: %d %v", resp.StatusCode, resp.Header)
	}
}

// TestBuiltSiteTwins checks the twins of the real site, with its real
// modules (built once for the browser tests).
func TestBuiltSiteTwins(t *testing.T) {
	if testing.Short() {
		t.Skip("builds the whole site")
	}
	dir := builtSite(t)
	if n := checkTwins(t, dir, builtFiles); n < 20 {
		t.Errorf("only %d files with twins", n)
	}
}
