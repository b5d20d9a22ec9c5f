package main

import (
	"flag"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/sergi/go-diff/diffmatchpatch"
)

// The golden files hold what the built binary writes, standard output and
// standard error, for every command in every text format, on the demo and
// on small inputs made to hold a tie, so that any change of wording or of
// a number shows as a diff. Run
//
//	go test ./tools/seatsmith -run Golden -update
//
// to rewrite them, and read the diff before committing it.

var update = flag.Bool("update", false, "rewrite the golden files of TestGolden")

const (
	wardsTie    = "tools/seatsmith/testdata/input/wards-tie.csv"
	wardsBefore = "tools/seatsmith/testdata/input/wards-before.csv"
	wardsLater  = "tools/seatsmith/testdata/input/wards-later.csv"
	demoLater   = "testdata/demo/vessaria-later.csv"
	demoProp    = "testdata/demo/vessaria-proposal.csv"
	electionCSV = "testdata/demo/vessaria-election.csv"
	electionTie = "tools/seatsmith/testdata/input/election-tie.csv"
)

// goldenCase is one run of the binary.
type goldenCase struct {
	name string
	args []string
}

// goldenCases returns every case: each command in each of its formats.
func goldenCases() []goldenCase {
	var cs []goldenCase
	add := func(name string, formats []string, args ...string) {
		for _, f := range formats {
			a := append([]string{args[0], "-format", f}, args[1:]...)
			cs = append(cs, goldenCase{name + "." + f, a})
		}
	}
	all := []string{"text", "markdown", "csv", "json"}
	add("allot", all, "allot", "-method", "huntington-hill", "-seats", "40", "-min", "1", demoCSV)
	add("allot-hamilton", []string{"text", "csv"}, "allot", "-method", "hamilton", demoJSON)
	add("allot-tie", all, "allot", "-method", "jefferson", "-seats", "4", wardsTie)
	add("compare", all, "compare", demoJSON)
	add("compare-tie", all, "compare", "-seats", "4", wardsTie)
	add("sweep", append(all, "svg"), "sweep", "-method", "hamilton,webster", "-from", "30", "-to", "45", demoJSON)
	add("sweep-tie", append(all, "svg"), "sweep", "-method", "jefferson,hamilton", "-from", "1", "-to", "6", wardsTie)
	add("paradox", all, "paradox", "-method", "hamilton,adams", "-from", "38", "-to", "42", demoJSON)
	add("paradox-tie", all, "paradox", "-method", "jefferson,webster", "-from", "1", "-to", "6", wardsTie)
	add("growth", all, "growth", demoJSON, demoLater)
	add("growth-tie", all, "growth", "-method", "jefferson,hamilton", "-seats", "4", wardsBefore, wardsLater)
	add("admit", all, "admit", "-name", "Ostry Fen", "-population", "410000", demoJSON)
	add("admit-tie", all, "admit", "-method", "jefferson", "-seats", "3", "-name", "Low Ward", "-population", "300", wardsTie)
	add("diff", all, "diff", demoJSON, demoProp)
	add("diff-tie", all, "diff", "-method", "jefferson", "-seats", "4", wardsBefore, wardsTie)
	add("measure", all, "measure", demoJSON)
	add("measure-tie", all, "measure", "-method", "jefferson,webster", "-seats", "4", wardsTie)
	add("house", all, "house", "-rule", "cube-root", "-min", "1", demoCSV)
	add("house-tie", all, "house", "-rule", "smallest-unit", "tools/seatsmith/testdata/input/vales-tie.csv")
	add("house-ratio", all, "house", "-ratio", "200000", "-method", "jefferson", demoCSV)
	add("house-ratio-tie", all, "house", "-ratio", "200", "-method", "webster", wardsTie)
	add("house-ratio-lot", []string{"text"}, "house", "-ratio", "200", "-method", "webster", "-tiebreak", "lot:2", wardsTie)
	add("house-base", all, "house", "-base", "2", "-seats", "40", "-method", "hamilton", demoCSV)
	add("house-base-tie", all, "house", "-base", "1", "-seats", "7", "-method", "jefferson", wardsTie)
	add("derived", all, "derived", "-plus", "2", demoJSON)
	add("derived-tie", all, "derived", "-method", "jefferson", "-seats", "4", "-plus", "1", wardsTie)
	add("bias", all, "bias", "-draws", "200", "-units", "6", "-method", "jefferson,webster,adams")
	// Tiny populations make ties common: each set's tie is settled by lot
	// and counted.
	add("bias-tie", all, "bias", "-draws", "200", "-units", "3", "-seats", "6", "-total", "30", "-method", "jefferson,webster,hamilton")
	add("project", all, "project", "-target", "2030-04-01", "-rse", "2%", "-draws", "2000", "testdata/demo/vessaria-counts.json")
	add("project-tie", all, "project", "-method", "jefferson", "-seats", "4", wardsTie)
	add("election", all, "election", "-system", "districts", "-method", "dhondt", electionCSV)
	add("election-biproportional", all, "election", "testdata/demo/vessaria-election.json")
	add("election-parties", []string{"csv"}, "election", "-table", "parties", "testdata/demo/vessaria-election.json")
	add("election-districts", []string{"csv"}, "election", "-table", "districts", "testdata/demo/vessaria-election.json")
	add("election-two-tier", []string{"text", "csv"}, "election", "-system", "two-tier", "-method", "dhondt", "-upper-method", "sainte-lague",
		"-compensatory", "12", "-threshold", "4%", "-table", "parties", electionCSV)
	add("election-mixed", []string{"text", "csv"}, "election", "-overhang", "level", "-table", "parties", "testdata/demo/vessaria-mixed.json")
	add("election-tie", all, "election", "-system", "biproportional", "-method", "webster", electionTie)
	return cs
}

func TestGolden(t *testing.T) {
	dir := filepath.Join("testdata", "golden")
	seen := map[string]bool{}
	for _, c := range goldenCases() {
		t.Run(c.name, func(t *testing.T) {
			out, errOut, code := cli(t, "", c.args...)
			var b strings.Builder
			b.WriteString("$ seatsmith " + strings.Join(c.args, " ") + "\n")
			b.WriteString("exit status " + strconv.Itoa(code) + "\n")
			b.WriteString("--- standard error\n" + errOut)
			b.WriteString("--- standard output\n" + out)
			got := b.String()
			file := filepath.Join(dir, c.name+".golden")
			seen[c.name+".golden"] = true
			if *update {
				if err := os.WriteFile(file, []byte(got), 0o644); err != nil {
					t.Fatal(err)
				}
				return
			}
			want, err := os.ReadFile(file)
			if err != nil {
				t.Fatalf("%v (run with -update to write it)", err)
			}
			if got != string(want) {
				dmp := diffmatchpatch.New()
				a, bb, lines := dmp.DiffLinesToChars(string(want), got)
				d := dmp.DiffCharsToLines(dmp.DiffMain(a, bb, false), lines)
				var s strings.Builder
				for _, x := range d {
					prefix := "  "
					switch x.Type {
					case diffmatchpatch.DiffInsert:
						prefix = "+ "
					case diffmatchpatch.DiffDelete:
						prefix = "- "
					case diffmatchpatch.DiffEqual:
						continue
					}
					for _, l := range strings.SplitAfter(strings.TrimSuffix(x.Text, "\n"), "\n") {
						s.WriteString(prefix + strings.TrimSuffix(l, "\n") + "\n")
					}
				}
				t.Errorf("%s differs from the golden file (- golden, + now):\n%s", file, s.String())
			}
		})
	}
	if *update {
		entries, _ := os.ReadDir(dir)
		for _, e := range entries {
			if !seen[e.Name()] {
				os.Remove(filepath.Join(dir, e.Name()))
			}
		}
	}
}
