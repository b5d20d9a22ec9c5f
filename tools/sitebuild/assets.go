package main

import (
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"strings"

	"github.com/tdewolff/minify/v2"
	"github.com/tdewolff/minify/v2/css"
	"github.com/tdewolff/minify/v2/html"
	"github.com/tdewolff/minify/v2/js"
	"github.com/tdewolff/minify/v2/json"
	"github.com/tdewolff/minify/v2/svg"
)

// newMinifier returns a minifier for HTML, CSS, JavaScript, SVG and JSON.
// JSON numbers are kept as written: populations are exact decimals and
// must not be rewritten (1000000 would become 1e6).
func newMinifier() *minify.M {
	m := minify.New()
	m.AddFunc("text/css", css.Minify)
	m.Add("text/html", &html.Minifier{KeepDocumentTags: true, KeepEndTags: true, KeepQuotes: true})
	m.AddFuncRegexp(regexp.MustCompile(`^(application|text)/(x-)?(java|ecma)script$`), js.Minify)
	m.AddFunc("module", js.Minify)
	m.Add("image/svg+xml", &svg.Minifier{})
	m.Add("application/json", &json.Minifier{KeepNumbers: true})
	return m
}

// An asset is one file of the site with a fingerprinted name.
type asset struct {
	Name string // the logical name, e.g. "style.css"
	Path string // the path in the site, e.g. "assets/style.1a2b3c4d5e.css"
	Data []byte
}

func fingerprint(dir, name string, data []byte) asset {
	sum := sha256.Sum256(data)
	ext := filepath.Ext(name)
	base := strings.TrimSuffix(name, ext)
	return asset{Name: name, Path: dir + "/" + base + "." + hex.EncodeToString(sum[:5]) + ext, Data: data}
}

func minifyAs(m *minify.M, mediatype string, data []byte, name string) ([]byte, error) {
	out, err := m.Bytes(mediatype, data)
	if err != nil {
		return nil, fmt.Errorf("%s: cannot minify: %v", name, err)
	}
	return out, nil
}

// moduleRoot finds the folder holding go.mod at or above dir.
func moduleRoot(dir string) (string, error) {
	d, err := filepath.Abs(dir)
	if err != nil {
		return "", err
	}
	for {
		if _, err := os.Stat(filepath.Join(d, "go.mod")); err == nil {
			return d, nil
		}
		up := filepath.Dir(d)
		if up == d {
			return "", fmt.Errorf("%s: not inside a Go module", dir)
		}
		d = up
	}
}
