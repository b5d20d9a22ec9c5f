package chart_test

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/render"
	"seatsmith/engine/render/chart"
)

// TestStyleMatchesTheSite: a chart standing alone looks as it does on the
// pages: every colour and dash its style gives a unit's class is the one
// the calculators' stylesheet gives it.
func TestStyleMatchesTheSite(t *testing.T) {
	css, err := os.ReadFile(filepath.Join("..", "..", "..", "site", "content", "static", "calculator.css"))
	if err != nil {
		t.Fatal(err)
	}
	site := string(css)
	n := 0
	for _, line := range strings.Split(chart.Style, "\n") {
		if !strings.HasPrefix(line, ".sc-u") && !strings.HasPrefix(line, ".sc-dash") {
			continue
		}
		for _, rule := range strings.SplitAfter(line, "}") {
			if rule = strings.TrimSpace(rule); rule != "" {
				n++
				if !strings.Contains(site, rule) {
					t.Errorf("the site's stylesheet lacks %q", rule)
				}
			}
		}
	}
	if n != 15 {
		t.Errorf("%d unit rules, want 12 colours and 3 dashes", n)
	}
}

// TestPanelMarks: a panel draws a line a unit, a ring an Alabama paradox
// and a triangle a quota violation, each titled in words. Invented
// wards: Hamilton takes a seat from Tarrow at 201 (the classic pattern of
// the Alabama paradox); Adams gives the largest ward less than its lower
// quota.
func TestPanelMarks(t *testing.T) {
	s := engine.Scenario{Units: []engine.Unit{
		{Name: "Tarrow", Population: engine.Whole(940)},
		{Name: "Ulm", Population: engine.Whole(9030)},
		{Name: "Vesk", Population: engine.Whole(10030)},
		{Name: "Wend", Population: engine.Whole(52000)},
	}}
	set := analysis.SweepAll(s, []engine.Method{engine.Hamilton, engine.Adams}, 195, 205)
	for k, m := range set.Methods {
		p := chart.Panel(m, set.Sweeps[k], set.Paradoxes[k], set.Violations(k), chart.Top(set))
		steps, rings, triangles := 0, 0, 0
		p.Walk(func(n *render.Node) {
			c, _ := n.Attr("class")
			switch {
			case strings.HasPrefix(c, "sc-step "):
				steps++
			case strings.HasPrefix(c, "sc-ring "):
				rings++
			case strings.HasPrefix(c, "sc-off "):
				triangles++
			}
		})
		if steps != 4 || rings != len(set.Paradoxes[k]) || triangles != len(set.Violations(k)) {
			t.Errorf("%s: %d lines, %d rings, %d triangles; want 4, %d, %d", m, steps, rings, triangles, len(set.Paradoxes[k]), len(set.Violations(k)))
		}
	}
	if len(set.Paradoxes[0]) == 0 || len(set.Violations(1)) == 0 {
		t.Errorf("the example holds no paradox or no violation")
	}
}

func ExampleUnitClass() {
	for _, i := range []int{0, 11, 12, 25} {
		println := func(s string) { os.Stdout.WriteString(s + "\n") }
		println(chart.UnitClass(i))
	}
	// Output:
	// sc-u0
	// sc-u11
	// sc-u0 sc-dash1
	// sc-u1 sc-dash2
}
