package main

import (
	"os"
	"strings"
	"testing"
)

func writeFile(t *testing.T, name, content string) {
	t.Helper()
	if err := os.WriteFile(name, []byte(content), 0o644); err != nil {
		t.Fatal(err)
	}
}

func TestDiffText(t *testing.T) {
	out, errOut, code := cli(t, "", "diff", "-method", "huntington-hill", "-seats", "40", "-min", "1", "-new-method", "webster", "-new-seats", "41", demoCSV)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, want := range []string{"baseline: Huntington–Hill, 40 seats", "proposal: Webster (Sainte-Laguë), 41 seats",
		"~  Orlen", "12 → 13", "seats: 40 → 41", "method: huntington-hill → webster", "Orlen gains 1 seat (12 → 13)", "Seats that change hands: 1"} {
		if !strings.Contains(out, want) {
			t.Errorf("output lacks %q:\n%s", want, out)
		}
	}
}

func TestDiffProposalFile(t *testing.T) {
	dir := t.TempDir()
	prop := dir + "/prop.csv"
	writeFile(t, prop, "name,population\nAshby,283\nBrent,882\nColne,907\nDorn,0\n")
	out, errOut, code := cli(t, "name,population\nAshby,263\nBrent,851\nColne,853\n", "diff", "-method", "hamilton", "-seats", "10", "-format", "json", "-", prop)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	v := parseJSON(t, out)
	if v.Get("kind").Text != "diff" || v.Get("proposal").Get("seats").Text != "10" {
		t.Errorf("document %s", out)
	}
	status := map[string]string{}
	for _, u := range v.Get("units").Items {
		status[u.Get("name").Text] = u.Get("status").Text + " " + u.Get("change").Text
	}
	if status["Ashby"] != "changed -1" || status["Colne"] != "changed 1" || status["Dorn"] != "added 0" {
		t.Errorf("statuses %v", status)
	}
}

func TestMeasureCLI(t *testing.T) {
	out, errOut, code := cli(t, "", "measure", "-seats", "40", "-min", "1", "-format", "json", demoCSV)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	v := parseJSON(t, out)
	for _, m := range v.Get("methods").Items {
		if m.Get("method").Text == "huntington-hill" && m.Get("improving_transfers").Get("relative_difference").Text != "0" {
			t.Errorf("Huntington–Hill fails its own pairwise test: %s", out)
		}
		for _, k := range []string{"loosemore_hanby", "gallagher", "sainte_lague", "ratio", "absolute_difference", "relative_difference"} {
			if m.Get(k) == nil || m.Get(k).IsNull() {
				t.Errorf("%s lacks %s", m.Get("method").Text, k)
			}
		}
	}
	txt, _, _ := cli(t, "", "measure", "-seats", "40", "-min", "1", demoCSV)
	if !strings.Contains(txt, "Loosemore–Hanby = ½") || !strings.Contains(txt, "float64") {
		t.Errorf("text lacks the formulas:\n%s", txt)
	}
}

func TestHouseCLI(t *testing.T) {
	out, errOut, code := cli(t, "", "house", "-rule", "cube-root", "-min", "1", "-format", "json", demoCSV)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	// The cube root of 8,200,567 is 201.66: 202 seats.
	v := parseJSON(t, out)
	if v.Get("seats").Text != "202" || v.Get("comparison").Get("seats").Text != "202" {
		t.Errorf("document %s", out[:200])
	}
	out, _, _ = cli(t, "", "house", "-rule", "smallest-unit", "-method", "webster", demoCSV)
	// 8,200,567 / 55,971 (Marrowgate) = 146.51...: 147 seats.
	if !strings.Contains(out, "smallest-unit rule gives 147 seats") || !strings.Contains(out, "Marrowgate has 55971 people") {
		t.Errorf("text:\n%s", out)
	}
}

func TestDerivedCLI(t *testing.T) {
	out, errOut, code := cli(t, "name,population\nAshby,100\nBrent,300\nColne,600\n", "derived", "-method", "webster", "-seats", "10", "-plus", "2", "-format", "json", "-")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	v := parseJSON(t, out)
	if v.Get("body_seats").Text != "16" || v.Get("units").Items[0].Get("body_weight").Text != "1.875" {
		t.Errorf("document %s", out)
	}
}

func TestBiasCLI(t *testing.T) {
	out, errOut, code := cli(t, "", "bias", "-draws", "300", "-method", "jefferson,adams", "-format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	v := parseJSON(t, out)
	ms := v.Get("methods").Items
	if len(ms) != 2 || ms[0].Get("leaning").Text != "large" || ms[1].Get("leaning").Text != "small" {
		t.Errorf("document %s", out)
	}
	again, _, _ := cli(t, "", "bias", "-draws", "300", "-method", "jefferson,adams", "-format", "json")
	if again != out {
		t.Error("the same seed gave a different study")
	}
}

// The statutory house rules through the binary: the first apportionment
// of the U.S. House of Representatives, one member for every 33,000
// persons with fractions dropped, made a House of 105. Sources: the
// representable numbers Thomas Jefferson stated in his opinion to
// President Washington of 4 April 1792 (Papers of George Washington,
// Presidential Series, vol. 10; Founders Online, National Archives); the
// seats per state of the Act of 14 April 1792 (1 Stat. 253), as tabulated
// in St. George Tucker's edition of Blackstone's Commentaries (1803),
// vol. 1, appendix note D.
func TestHouseFixedRatio1792(t *testing.T) {
	in := "name,population\nVermont,85532\nNew Hampshire,141823\nMassachusetts,475327\nRhode Island,68444\nConnecticut,235941\n" +
		"New York,352915\nNew Jersey,179556\nPennsylvania,432880\nDelaware,55538\nMaryland,278513\nVirginia,630558\n" +
		"Kentucky,68705\nNorth Carolina,353521\nSouth Carolina,206236\nGeorgia,70843\n"
	out, errOut, code := cli(t, in, "house", "-ratio", "33000", "-method", "jefferson", "-min", "1", "-format", "json", "-")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	v := parseJSON(t, out)
	if v.Get("kind").Text != "fixed-ratio" || v.Get("seats").Text != "105" || v.Get("unassigned").Text != "0" {
		t.Errorf("document %s", out)
	}
	want := []string{"2", "4", "14", "2", "7", "10", "5", "13", "1", "8", "19", "2", "10", "6", "2"}
	for i, u := range v.Get("units").Items {
		if u.Get("seats").Text != want[i] {
			t.Errorf("%s: %s seats, want %s", u.Get("name").Text, u.Get("seats").Text, want[i])
		}
	}
	txt, _, _ := cli(t, in, "house", "-ratio", "33000", "-method", "jefferson", "-min", "1", "-")
	if !strings.Contains(txt, "one seat per 33000 people gives 105 seats") || !strings.Contains(txt, "19.107818") {
		t.Errorf("text:\n%s", txt)
	}
}

// Base seats through the binary: 3 units, 2 base seats each, 20 seats; the
// 14 others by Hamilton on 50,000 : 30,000 : 20,000 give quotas 7, 4.2 and
// 2.8, so 7, 4 and 3; totals 9, 6 and 5 (common practice, worked by hand).
func TestHouseBaseSeats(t *testing.T) {
	in := "name,population\nArdent,50000\nBellow,30000\nCorran,20000\n"
	out, errOut, code := cli(t, in, "house", "-base", "2", "-seats", "20", "-method", "hamilton", "-format", "csv", "-")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, want := range []string{
		"hamilton,20,0,,0,none,2,Ardent,50000,2,7,7,9,",
		"hamilton,20,0,,0,none,2,Bellow,30000,2,4.2,4,6,",
		"hamilton,20,0,,0,none,2,Corran,20000,2,2.8,3,5,",
	} {
		if !strings.Contains(out, want) {
			t.Errorf("csv lacks %q:\n%s", want, out)
		}
	}
}

// The statutory rules refuse what they cannot do, saying why.
func TestHouseRulesRefused(t *testing.T) {
	for _, c := range []struct {
		args []string
		code int
		want string
	}{
		{[]string{"house", demoCSV}, 2, "give one of -rule, -ratio or -base"},
		{[]string{"house", "-rule", "cube-root", "-ratio", "1000", demoCSV}, 2, "give one of -rule, -ratio or -base"},
		{[]string{"house", "-ratio", "1000", demoCSV}, 2, "-ratio apportions by one method: give -method"},
		{[]string{"house", "-ratio", "1000", "-method", "webster,jefferson", demoCSV}, 2, "-ratio apportions by one method; name one"},
		{[]string{"house", "-ratio", "1000", "-method", "hamilton", demoCSV}, 2, "Hamilton (Hare quota) is a largest-remainder method"},
		{[]string{"house", "-ratio", "zero", "-method", "webster", demoCSV}, 2, `-ratio: "zero" is not a number of people above zero`},
		{[]string{"house", "-ratio", "0", "-method", "webster", demoCSV}, 2, `-ratio: "0" is not a number of people above zero`},
		{[]string{"house", "-ratio", "1000", "-seats", "40", "-method", "webster", demoCSV}, 2, "-seats: a fixed ratio makes the house size"},
		{[]string{"house", "-ratio", "1000", "-threshold", "5%", "-method", "webster", demoCSV}, 2, "-threshold: a fixed ratio makes the house size"},
		{[]string{"house", "-ratio", "1000", "-tiebreak", "order", "-method", "webster", demoCSV}, 2, "input order cannot settle it"},
		// A ratio that would make a runaway house is refused before any
		// counting, naming the unit, its line and the limit.
		{[]string{"house", "-ratio", "0.000001", "-method", "webster", demoCSV}, 1,
			`vessaria.csv:2: population: "Orlen": alone would have about 2694457000000 seats at one seat per 0.000001 people, more than the limit of 1000000000 seats a house`},
		{[]string{"house", "-base", "5", "-seats", "40", "-method", "webster", demoCSV}, 1, "vessaria.csv: seats: 9 units with 5 base seats each need 45 seats, more than the house size 40"},
		{[]string{"house", "-base", "4", "-seats", "36", "-method", "webster", demoCSV}, 1, "leaving none for the minimums, which need 9 seats beyond them"},
		{[]string{"house", "-base", "3", "-seats", "30", "-method", "webster", demoCSV}, 1, "in the apportionment of the 3 seats beyond the base seats:"},
		{[]string{"house", "-base", "-1", "-seats", "30", "-method", "webster", demoCSV}, 2, "-base: must be between 0 and"},
	} {
		_, errOut, code := cli(t, "", c.args...)
		if code != c.code || !strings.Contains(errOut, c.want) {
			t.Errorf("%v: exit %d, %q; want exit %d and %q", c.args, code, errOut, c.code, c.want)
		}
	}
}
