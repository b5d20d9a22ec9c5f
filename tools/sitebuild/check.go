package main

import (
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"github.com/sergi/go-diff/diffmatchpatch"

	"seatsmith/site/calc"
)

// goldenText writes what a page's calculators show for the page's own
// numbers: one section a calculator, one line a unit (name, seats, quota),
// then the comparison and every claim's verdict.
func goldenText(p *page) string {
	var b strings.Builder
	b.WriteString("# " + filepath.Base(p.File) + ": what its calculators show for the page's own numbers.\n")
	b.WriteString("# Rewrite with: go run ./tools/sitebuild check -update\n")
	for i, br := range p.Blocks {
		o := p.Outcomes[i]
		writeGolden(&b, br.Block, o)
	}
	b.WriteString(projectionGolden(p))
	b.WriteString(electionGolden(p))
	return b.String()
}

func writeGolden(b *strings.Builder, blk *calc.Block, o *calc.Outcome) {
	switch {
	case o.Sweep != nil:
		writeSweepGolden(b, blk, o)
		return
	case o.Growth != nil:
		writeGrowthGolden(b, blk, o)
		return
	case o.Admit != nil:
		writeAdmitGolden(b, blk, o)
		return
	}
	r := o.Result
	b.WriteString("\ncalculator " + blk.ID + ": " + r.Method.String() + ", " + strconv.Itoa(r.Seats) + " seats, total " + r.Total + "\n")
	for _, u := range r.Units {
		line := "  " + u.Name + "\t" + strconv.Itoa(u.Seats) + "\tquota " + u.Quota.Text
		if u.Excluded {
			line += "\texcluded"
		}
		if u.Tied {
			line += "\ttied"
		}
		b.WriteString(line + "\n")
	}
	if d := r.Divisor; d != nil {
		hi := d.High.Text
		if d.High.Infinite {
			hi = "infinite"
		}
		b.WriteString("  divisor " + d.Low.Text + " .. " + hi + "\n")
	}
	for _, t := range r.Ties {
		b.WriteString("  tie " + strings.Join(t.Names, ", ") + " for " + strconv.Itoa(t.Seats) + "\n")
	}
	c := o.Comparison
	b.WriteString("  compare")
	for k, m := range c.Methods {
		b.WriteString(" " + m.String())
		if c.Results[k] == nil {
			b.WriteString("(fails)")
		}
	}
	b.WriteString("\n")
	if first := c.First(); first != nil {
		for i, u := range first.Units {
			b.WriteString("    " + u.Name + "\t")
			for k := range c.Methods {
				if k > 0 {
					b.WriteString(" ")
				}
				if c.Results[k] == nil {
					b.WriteString("-")
				} else {
					b.WriteString(strconv.Itoa(c.Results[k].Units[i].Seats))
				}
			}
			b.WriteString("\n")
		}
	}
	writeVerdicts(b, o)
}

func writeVerdicts(b *strings.Builder, o *calc.Outcome) {
	for _, v := range o.Verdicts {
		verdict := "holds"
		if !v.Holds {
			verdict = "DOES NOT HOLD"
		}
		b.WriteString("  claim " + v.Claim.ID + ": " + verdict + ": " + v.Found + "\n")
	}
}

// writeSweepGolden writes a sweep block: every method's seats at every
// house size (one line a size, the units in order), then the findings.
func writeSweepGolden(b *strings.Builder, blk *calc.Block, o *calc.Outcome) {
	set := o.Sweep.Set
	f := set.First()
	b.WriteString("\nsweep " + blk.ID + ": house sizes " + strconv.Itoa(set.From) + " to " + strconv.Itoa(set.To) + "\n")
	b.WriteString("  units " + strings.Join(f.Names, ", ") + "\n")
	for k, sw := range set.Sweeps {
		m := set.Methods[k].String()
		if sw == nil {
			b.WriteString("  method " + m + ": fails: " + set.Errors[k].Error() + "\n")
			continue
		}
		b.WriteString("  method " + m + "\n")
		for j := range sw.Sizes {
			z := &sw.Sizes[j]
			line := "    " + strconv.Itoa(z.House) + ":"
			if z.Err != nil {
				line += " fails"
			}
			for _, a := range z.Seats {
				line += " " + strconv.Itoa(a)
			}
			for _, t := range z.Ties {
				line += "; tie " + strings.Join(t.Names, ", ") + " for " + strconv.Itoa(t.Seats)
			}
			b.WriteString(line + "\n")
		}
	}
	for k := range set.Methods {
		for _, p := range set.Paradoxes[k] {
			b.WriteString("  alabama " + p.Text() + "\n")
		}
		for _, v := range o.Sweep.Violations[k] {
			b.WriteString("  quota " + v.Text() + "\n")
		}
	}
	writeVerdicts(b, o)
}

// writeGrowthGolden writes a growth block: each unit's populations and
// seats under the block's method, every method's findings.
func writeGrowthGolden(b *strings.Builder, blk *calc.Block, o *calc.Outcome) {
	g := o.Growth
	r := g.Results[g.Main]
	b.WriteString("\ngrowth " + blk.ID + ": " + g.Methods[g.Main].String() + ", " + strconv.Itoa(r.Before.Seats) + " seats, total " +
		r.Before.Total + " then " + r.After.Total + "\n")
	for i := range r.Before.Units {
		u, a := &r.Before.Units[i], &r.After.Units[i]
		b.WriteString("  " + u.Name + ": " + u.Population.String() + " then " + a.Population.String() + ", seats " +
			strconv.Itoa(u.Seats) + " then " + strconv.Itoa(a.Seats) + "\n")
	}
	for k, m := range g.Methods {
		if g.Results[k] == nil {
			b.WriteString("  method " + m.String() + ": fails: " + g.Errors[k].Error() + "\n")
			continue
		}
		b.WriteString("  method " + m.String() + ": " + "population paradoxes " + strconv.Itoa(len(g.Results[k].Findings)) + "\n")
		for _, f := range g.Results[k].Findings {
			b.WriteString("    " + f.Text() + "\n")
		}
	}
	writeVerdicts(b, o)
}

// writeAdmitGolden writes an admit block: each unit's seats before and
// after under the block's method, and what every method does.
func writeAdmitGolden(b *strings.Builder, blk *calc.Block, o *calc.Outcome) {
	a := o.Admit
	r := a.Results[a.Main]
	b.WriteString("\nadmit " + blk.ID + ": " + a.Methods[a.Main].String() + ", " + r.Name + " with " + strconv.Itoa(r.Added) +
		" added seats, house " + strconv.Itoa(r.House) + " then " + strconv.Itoa(r.NewHouse) + "\n")
	for i := range r.After.Units {
		u := &r.After.Units[i]
		before := "new"
		if i < len(r.Before.Units) {
			before = strconv.Itoa(r.Before.Units[i].Seats)
		}
		b.WriteString("  " + u.Name + ": seats " + before + " then " + strconv.Itoa(u.Seats) + "\n")
	}
	for k, m := range a.Methods {
		if a.Results[k] == nil {
			b.WriteString("  method " + m.String() + ": fails: " + a.Errors[k].Error() + "\n")
			continue
		}
		b.WriteString("  method " + m.String() + ": " + a.Results[k].Text() + "\n")
	}
	writeVerdicts(b, o)
}

// lineDiff returns a readable line-by-line difference of want and got.
func lineDiff(want, got string) string {
	dmp := diffmatchpatch.New()
	a, b, lines := dmp.DiffLinesToChars(want, got)
	diffs := dmp.DiffCharsToLines(dmp.DiffMain(a, b, false), lines)
	var out strings.Builder
	for _, d := range diffs {
		prefix := "  "
		switch d.Type {
		case diffmatchpatch.DiffDelete:
			prefix = "- "
		case diffmatchpatch.DiffInsert:
			prefix = "+ "
		}
		for _, l := range strings.SplitAfter(d.Text, "\n") {
			if l == "" {
				continue
			}
			if prefix == "  " {
				continue
			}
			out.WriteString(prefix + strings.TrimSuffix(l, "\n") + "\n")
		}
	}
	return out.String()
}

// check compares every page's golden text with the file under golden.
// It returns the names of the pages that differ (after printing their
// differences to w), or rewrites the files when update is set.
func check(src, golden string, update bool, w io.Writer) ([]string, error) {
	s, err := loadSite(src)
	if err != nil {
		return nil, err
	}
	var bad []string
	for _, p := range s.Pages {
		if len(p.Blocks) == 0 && len(p.Projections) == 0 && len(p.Elections) == 0 {
			continue
		}
		got := goldenText(p)
		file := filepath.Join(golden, p.Name+".txt")
		if update {
			if err := os.MkdirAll(golden, 0o755); err != nil {
				return nil, err
			}
			if err := os.WriteFile(file, []byte(got), 0o644); err != nil {
				return nil, err
			}
			fmt.Fprintf(w, "wrote %s\n", file)
			continue
		}
		want, err := os.ReadFile(file)
		if err != nil {
			fmt.Fprintf(w, "%s: no golden file %s (run with -update to write it)\n", p.File, file)
			bad = append(bad, p.Name)
			continue
		}
		if string(want) != got {
			fmt.Fprintf(w, "%s: results differ from %s (- golden, + now):\n%s\n", p.File, file, lineDiff(string(want), got))
			bad = append(bad, p.Name)
		}
	}
	return bad, nil
}

func cmdCheck(args []string, stdout, stderr io.Writer) error {
	fs := flag.NewFlagSet("check", flag.ContinueOnError)
	src := fs.String("src", filepath.Join("site", "content"), "the site sources")
	golden := fs.String("golden", filepath.Join("testdata", "site"), "the folder of golden files")
	update := fs.Bool("update", false, "rewrite the golden files from the current results")
	if err := parseFlags(fs, args, stderr); err != nil {
		return err
	}
	bad, err := check(*src, *golden, *update, stdout)
	if err != nil {
		return err
	}
	if len(bad) > 0 {
		return fmt.Errorf("%d page(s) differ from their golden files: %s", len(bad), strings.Join(bad, ", "))
	}
	if !*update {
		fmt.Fprintln(stdout, "every calculator matches its golden file")
	}
	return nil
}
