package main

import (
	"encoding/csv"
	"strconv"
	"strings"
	"testing"
)

// TestCSVIsData runs every command's CSV output and holds it to being
// data a spreadsheet reads as it is meant: every column holds numbers or
// text, never both; no number carries a mark, an arrow, a sign on a
// positive or a percent sign; true and false are the only marks; the
// settings lead every row; text a spreadsheet would run as a formula is
// guarded.
func TestCSVIsData(t *testing.T) {
	for _, c := range goldenCases() {
		if !strings.HasSuffix(c.name, ".csv") {
			continue
		}
		t.Run(c.name, func(t *testing.T) {
			out, errOut, code := cli(t, "", c.args...)
			if code != 0 && code != 3 {
				t.Fatalf("exit %d: %s", code, errOut)
			}
			checkCSVData(t, out)
		})
	}
}

func checkCSVData(t *testing.T, out string) [][]string {
	t.Helper()
	recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatalf("not CSV: %v\n%s", err, out)
	}
	if len(recs) < 2 {
		t.Fatalf("no rows:\n%s", out)
	}
	head := strings.Join(recs[0], ",")
	if !strings.Contains(head, "tie_rule") && !strings.Contains(head, "seed") {
		t.Errorf("the settings do not lead the rows: %s", head)
	}
	for col, name := range recs[0] {
		numeric, text := 0, 0
		for _, r := range recs[1:] {
			c := r[col]
			switch {
			case c == "":
			case isNumber(c):
				numeric++
			default:
				text++
			}
			if strings.ContainsAny(c, "→!%") && !strings.Contains(name, "error") && name != "detail" {
				t.Errorf("column %s: %q holds a mark", name, c)
			}
			if c != "" && strings.ContainsRune("=+-@\t\r", rune(c[0])) && !isNumber(c) {
				// A text cell a spreadsheet would run as a formula.
				t.Errorf("column %s: %q is not guarded", name, c)
			}
		}
		if numeric > 0 && text > 0 {
			t.Errorf("column %s holds numbers and text", name)
		}
	}
	return recs
}

func isNumber(s string) bool {
	_, err := strconv.ParseFloat(s, 64)
	return err == nil && !strings.HasPrefix(s, "+") && !strings.ContainsAny(s, "eEInfa")
}

// TestCSVGuardsFormulas: names a spreadsheet would run as formulas,
// "-2+3" among them, are guarded, while negative numbers stay numbers.
func TestCSVGuardsFormulas(t *testing.T) {
	in := "name,population\n-2+3,5000\n=SUM(A1),3000\n@cmd,1000\n+1,900\n-5,800\nPlain,700\n"
	out, errOut, code := cli(t, in, "allot", "-method", "webster", "-seats", "10", "-format", "csv", "-")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	recs := checkCSVData(t, out)
	unit := 0
	for i, h := range recs[0] {
		if h == "unit" {
			unit = i
		}
	}
	want := []string{"'-2+3", "'=SUM(A1)", "'@cmd", "'+1", "'-5", "Plain"}
	for k, w := range want {
		if got := recs[k+1][unit]; got != w {
			t.Errorf("unit %d written %q, want %q", k+1, got, w)
		}
	}
	// A falling population's growth is a negative number, unguarded.
	out, _, _ = cli(t, "", "growth", "-method", "hamilton", "-format", "csv", demoJSON, demoLater)
	if !strings.Contains(out, ",Brevia,1178082,1162306,-0.013391,") {
		t.Errorf("negative growth not written as a number:\n%s", out)
	}
}
