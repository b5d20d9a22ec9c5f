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
