package main

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"os"
	"path"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"

	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	model "seatsmith/engine/projection"
	"seatsmith/site/projection"

	"github.com/tdewolff/minify/v2"
)

// A projectionRef is a projection block of a page: a <div data-projection>
// holding one <script type="application/json"> element with its document
// (see site/projection.Parse), whose "counts_file" names a file under the
// site's scenarios/ folder. The build reads that file into the document,
// runs the study natively with the block's fixed seed, checks its claims
// and puts the prerendered block in place of the source.
type projectionRef struct {
	ID      string
	Line    int
	Config  *projection.Config
	Summary *model.Summary
}

var projectionOpen = regexp.MustCompile(`<div\b[^>]*\bdata-projection\b[^>]*>`)

// expandProjections replaces every projection block in p.Source by its
// prerendered markup (keeping the page's line count) and records the
// blocks in p.Projections. It returns a message for every claim that does
// not hold; bad input is an *input.Error naming page, line and field.
func expandProjections(p *page) ([]string, error) {
	blocks, err := scanJSONBlocks(p.File, p.Source, projectionOpen, "projection")
	if err != nil || len(blocks) == 0 {
		return nil, err
	}
	scenarios := filepath.Join(filepath.Dir(filepath.Dir(p.File)), "scenarios")
	var bad, html []string
	for _, b := range blocks {
		line, v := b.Line, b.Doc
		fail := func(field, msg string) error { return &input.Error{File: p.File, Line: line, Field: field, Msg: msg} }
		if v.Kind == jsondoc.Object {
			if f := v.Get("counts_file"); f != nil && f.Kind == jsondoc.String {
				if strings.ContainsAny(f.Text, `/\`) || strings.HasPrefix(f.Text, ".") {
					return nil, fail("counts_file", strconv.Quote(f.Text)+" is not a file name in scenarios/")
				}
				data, err := os.ReadFile(filepath.Join(scenarios, f.Text))
				if err != nil {
					return nil, fail("counts_file", "cannot read "+f.Text+" from scenarios/: "+err.Error())
				}
				if v.Get("counts") != nil {
					return nil, fail("counts", "give the counts either inline or as counts_file, not both")
				}
				v.Set("counts", jsondoc.Str(string(data)))
			}
		}
		cfg, err := projection.Parse(p.File, line, v)
		if err != nil {
			return nil, err
		}
		s, err := cfg.Run(context.Background())
		if err != nil {
			var ie *input.Error
			if errors.As(err, &ie) && ie.File != p.File {
				// An error in the counts file: name the page too.
				return nil, &input.Error{File: p.File, Line: line, Field: "counts_file", Msg: err.Error()}
			}
			return nil, err
		}
		for i := range cfg.Claims {
			c := &cfg.Claims[i]
			if vd := c.Check(s); !vd.Holds {
				says := c.Text
				if says == "" {
					says = c.Statement()
				}
				bad = append(bad, p.File+":"+strconv.Itoa(line)+": projection "+strconv.Quote(b.ID)+", claim "+strconv.Quote(c.ID)+
					" does not hold with seed "+strconv.FormatUint(cfg.Seed, 10)+": it says "+strconv.Quote(says)+", but "+vd.Found)
			}
		}
		html = append(html, projection.Prerender(cfg, b.ID, blockJSON(v), s))
		p.Projections = append(p.Projections, &projectionRef{ID: b.ID, Line: line, Config: cfg, Summary: s})
	}
	p.Source = spliceBlocks(p.Source, blocks, html)
	return bad, nil
}

// projectionGolden writes what a page's projection blocks show: every unit's
// seats now and at the projection, the draws that lose and gain a seat and
// the seat counts drawn, then every claim's verdict.
func projectionGolden(p *page) string {
	var b strings.Builder
	for _, f := range p.Projections {
		s := f.Summary
		b.WriteString("\nprojection " + f.ID + ": " + s.Method.String() + ", " + strconv.Itoa(s.Seats) + " seats, to " + s.Target.String() +
			", " + s.Growth.String() + ", " + s.Error.String() + " rse " + strconv.FormatFloat(s.RSE, 'g', -1, 64) +
			", " + strconv.Itoa(s.Draws) + " draws, seed " + strconv.FormatUint(s.Seed, 10) + ", apportioned " + strconv.FormatInt(s.Apportioned, 10) + "\n")
		for _, u := range s.Units {
			b.WriteString("  " + u.Name + "\tprojected " + u.Central.String() + "\tnow " + strconv.Itoa(u.BaselineSeats) + "\tcentral " +
				strconv.Itoa(u.CentralSeats) + "\tlose " + strconv.FormatInt(u.Lose.Draws, 10) + "\tgain " + strconv.FormatInt(u.Gain.Draws, 10) + "\tseats")
			for _, d := range u.Dist {
				b.WriteString(" " + strconv.Itoa(d.Seats) + ":" + strconv.FormatInt(d.Draws, 10))
			}
			b.WriteString("\n")
		}
		for i := range f.Config.Claims {
			c := &f.Config.Claims[i]
			v := c.Check(s)
			verdict := "holds"
			if !v.Holds {
				verdict = "does not hold"
			}
			b.WriteString("  claim " + c.ID + ": " + verdict + ": " + v.Found + "\n")
		}
	}
	return b.String()
}

// projectionAssets are the projection and election blocks' own files:
// their stylesheets and page scripts, which run on the bridge's engine,
// and the script the page scripts share (before them, so that their
// imports of it can be pointed at its built name).
var projectionAssets = []struct{ name, dir, mediatype string }{
	{"blocks.js", "wasm/js", "text/javascript"},
	{"projection.css", "site/static", "text/css"},
	{"projection.js", "wasm/js", "text/javascript"},
	{"election.css", "site/static", "text/css"},
	{"election.js", "wasm/js", "text/javascript"},
}

// addProjectionAssets minifies and fingerprints the projection block's
// files and hands each to add. A script's imports of the bridge and of the
// scripts built before it are pointed at their fingerprinted names, beside
// it in assets/.
func addProjectionAssets(root, src string, m *minify.M, add func(asset), bridge asset) error {
	built := map[string]string{"bridge.js": path.Base(bridge.Path)}
	for _, a := range projectionAssets {
		dir := filepath.Join(root, a.dir)
		if a.dir == "site/static" {
			dir = filepath.Join(src, "static")
		}
		raw, err := os.ReadFile(filepath.Join(dir, a.name))
		if err != nil {
			return err
		}
		if strings.HasSuffix(a.name, ".js") {
			if raw, err = pointImports(a.name, raw, built); err != nil {
				return err
			}
		}
		min, err := minifyAs(m, a.mediatype, raw, a.name)
		if err != nil {
			return err
		}
		f := fingerprint("assets", a.name, min)
		if strings.HasSuffix(a.name, ".js") {
			built[a.name] = path.Base(f.Path)
		}
		add(f)
	}
	return nil
}

// pointImports points a page script's imports of the scripts in built (by
// source name) at their built names. The script must import the bridge,
// and nothing that is not built.
func pointImports(name string, raw []byte, built map[string]string) ([]byte, error) {
	const from = "from './"
	if !bytes.Contains(raw, []byte(from+"bridge.js'")) {
		return nil, fmt.Errorf("%s: no import %sbridge.js' to point at the built bridge", name, from)
	}
	var out []byte
	for {
		i := bytes.Index(raw, []byte(from))
		if i < 0 {
			return append(out, raw...), nil
		}
		out = append(out, raw[:i+len(from)]...)
		raw = raw[i+len(from):]
		j := bytes.IndexByte(raw, '\'')
		to, ok := built[string(raw[:max(j, 0)])]
		if !ok {
			return nil, fmt.Errorf("%s: an import of %s%s, which is not built before it", name, from, raw[:max(j, 0)])
		}
		out = append(out, to...)
		raw = raw[j:]
	}
}
