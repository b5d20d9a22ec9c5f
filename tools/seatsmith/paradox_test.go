package main

import (
	"strings"
	"testing"
)

func TestParadoxText(t *testing.T) {
	out, errOut, code := cli(t, textbookCSV, "paradox", "-method", "hamilton,jefferson", "-from", "195", "-to", "205", "-")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, want := range []string{
		"Hamilton (Hare quota): 2 Alabama paradoxes, no quota violations",
		"A has 10 seats in a house of 200 but 9 in a house of 201, although its quota rises from 9.4 to 9.447",
		"Jefferson (D'Hondt): no Alabama paradoxes",
	} {
		if !strings.Contains(out, want) {
			t.Errorf("output lacks %q:\n%s", want, out)
		}
	}
}

func TestParadoxJSON(t *testing.T) {
	out, errOut, code := cli(t, textbookCSV, "paradox", "-method", "jefferson", "-from", "200", "-to", "200", "-format", "json", "-")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	v := parseJSON(t, out)
	if v.Get("kind").Text != "paradoxes" {
		t.Errorf("kind %s", v.Get("kind").Text)
	}
	for _, p := range v.Get("paradoxes").Items {
		if p.Get("kind").Text != "quota" || p.Get("side").Text != "above" || p.Get("house").Text != "200" {
			t.Errorf("finding %s", out)
		}
	}
}

// TestGrowthCLI: the invented case of engine/analysis, checked by hand
// there: Ashby grows 7.60%, faster than Colne's 6.33%, yet loses a seat to
// it under Hamilton.
func TestGrowthCLI(t *testing.T) {
	dir := t.TempDir()
	before := dir + "/before.csv"
	writeFile(t, before, "name,population\nAshby,263\nBrent,851\nColne,853\n")
	out, errOut, code := cli(t, "name,population\nColne,907\nAshby,283\nBrent,882\n", "growth", "-seats", "10", "-format", "json", before, "-")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	v := parseJSON(t, out)
	ps := v.Get("paradoxes").Items
	if len(ps) != 1 {
		t.Fatalf("paradoxes: %s", out)
	}
	p := ps[0]
	if p.Get("method").Text != "hamilton" || p.Get("loser").Get("unit").Text != "Ashby" || p.Get("gainer").Get("unit").Text != "Colne" ||
		p.Get("loser").Get("growth_exact").Text != "20/263" || p.Get("faster").Bool != true {
		t.Errorf("paradox %s", out)
	}
	txt, _, _ := cli(t, "name,population\nColne,907\nAshby,283\nBrent,882\n", "growth", "-seats", "10", before, "-")
	if !strings.Contains(txt, "Ashby grew 7.60% (263 → 283), faster than Colne at 6.33% (853 → 907)") || !strings.Contains(txt, "Webster (Sainte-Laguë): no population paradox.") {
		t.Errorf("text:\n%s", txt)
	}
}

// TestAdmitCLI: the worked example of the new-states paradox in
// Tannenbaum, Excursions in Modern Mathematics (figures from memory,
// checked by hand in engine/analysis).
func TestAdmitCLI(t *testing.T) {
	out, errOut, code := cli(t, "name,population\nNorth,1045\nSouth,8955\n", "admit", "-seats", "100", "-method", "hamilton,webster",
		"-name", "New", "-population", "2525", "-format", "json", "-")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	v := parseJSON(t, out)
	if v.Get("added").Text != "25" || v.Get("house_after").Text != "125" || v.Get("fair_share").Text != "25.25" {
		t.Errorf("document %s", out)
	}
	rs := v.Get("results").Items
	if !rs[0].Get("paradox").Bool || rs[1].Get("paradox").Bool {
		t.Errorf("paradox flags %s", out)
	}
	if !strings.Contains(rs[0].Get("text").Text, "North (10 → 11), South (90 → 89)") {
		t.Errorf("text %s", rs[0].Get("text").Text)
	}
}
