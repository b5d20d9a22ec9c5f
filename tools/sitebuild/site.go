package main

import (
	"fmt"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"

	"seatsmith/engine/input"
	"seatsmith/site/calc"
)

// A page is one page source with its calculators read and checked.
type page struct {
	File   string // the source file, as given (for messages)
	Name   string // the output name without .html, e.g. "assembly"
	Source string // the source, calculator blocks still in place
	Blocks []blockRef
	// Outcomes are the calculators' results for the page's own numbers.
	Outcomes []*calc.Outcome
	// Projections are the page's projection blocks (see projection.go).
	Projections []*projectionRef
	// Elections are the page's election blocks (see election.go).
	Elections []*electionRef
}

// A site is every page of the site sources.
type site struct {
	Src   string
	Pages []*page
}

// loadSite reads every page under src/pages, reads its calculator blocks
// and checks every claim. Every false claim is reported, not just the
// first.
func loadSite(src string) (*site, error) {
	calc.UseVariations() // the site has every kind of block
	files, err := filepath.Glob(filepath.Join(src, "pages", "*.html"))
	if err != nil {
		return nil, err
	}
	if len(files) == 0 {
		return nil, fmt.Errorf("%s: no page sources (expected %s)", src, filepath.Join(src, "pages", "*.html"))
	}
	sort.Strings(files)
	s := &site{Src: src}
	var claimErrs []string
	for _, f := range files {
		p, errs, err := loadPage(f)
		if err != nil {
			return nil, err
		}
		claimErrs = append(claimErrs, errs...)
		s.Pages = append(s.Pages, p)
	}
	if len(claimErrs) > 0 {
		return nil, &claimError{claimErrs}
	}
	return s, nil
}

// A claimError lists every claim that does not hold.
type claimError struct{ msgs []string }

func (e *claimError) Error() string {
	return strconv.Itoa(len(e.msgs)) + " claim(s) do not hold:\n  " + strings.Join(e.msgs, "\n  ")
}

func loadPage(file string) (*page, []string, error) {
	data, err := os.ReadFile(file)
	if err != nil {
		return nil, nil, &input.Error{File: file, Msg: "cannot read: " + err.Error()}
	}
	p := &page{File: file, Name: strings.TrimSuffix(filepath.Base(file), ".html"), Source: string(data)}
	projectionBad, err := expandProjections(p)
	if err != nil {
		return nil, nil, err
	}
	electionBad, err := expandElections(p)
	if err != nil {
		return nil, nil, err
	}
	projectionBad = append(projectionBad, electionBad...)
	p.Blocks, err = scanBlocks(file, p.Source)
	if err != nil {
		return nil, nil, err
	}
	claimIDs := map[string]string{}
	bad := projectionBad
	for _, br := range p.Blocks {
		b := br.Block
		o := calc.Run(b, nil)
		if o.Problem != nil {
			return nil, nil, &input.Error{File: file, Line: br.Line, Field: o.Problem.Field, Msg: o.Problem.Msg}
		}
		p.Outcomes = append(p.Outcomes, o)
		for i, v := range o.Verdicts {
			c := &b.Claims[i]
			if other, dup := claimIDs[c.ID]; dup {
				return nil, nil, &input.Error{File: file, Line: c.Line, Field: "claims", Msg: "claim id " + strconv.Quote(c.ID) + " is also used in calculator " + strconv.Quote(other)}
			}
			claimIDs[c.ID] = b.ID
			if !v.Holds {
				says := c.Text
				if says == "" {
					says = b.Statement(c)
				}
				bad = append(bad, file+":"+strconv.Itoa(c.Line)+": calculator "+strconv.Quote(b.ID)+", claim "+strconv.Quote(c.ID)+
					" does not hold: it says "+strconv.Quote(says)+", but "+v.Found)
			}
		}
	}
	return p, bad, nil
}

// claimIDs returns the ids of every claim on the page.
func (p *page) claimIDs() map[string]bool {
	ids := map[string]bool{}
	for _, br := range p.Blocks {
		for _, c := range br.Block.Claims {
			ids[c.ID] = true
		}
	}
	for _, f := range p.Projections {
		for _, c := range f.Config.Claims {
			ids[c.ID] = true
		}
	}
	for _, e := range p.Elections {
		for _, c := range e.Config.Claims {
			ids[c.ID] = true
		}
	}
	return ids
}

// engine returns the asset name of the WebAssembly module the page's
// blocks need: the analysis module for variation blocks, paradox claims,
// projections and elections, the calculator module for calculators alone, and ""
// for a page without blocks.
func (p *page) engine() string {
	if len(p.Projections) > 0 || len(p.Elections) > 0 {
		return "seatsmith-analysis.wasm"
	}
	for _, br := range p.Blocks {
		if br.Block.NeedsAnalysis() {
			return "seatsmith-analysis.wasm"
		}
	}
	if len(p.Blocks) > 0 {
		return "seatsmith.wasm"
	}
	return ""
}
