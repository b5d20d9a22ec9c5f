package analysis

import (
	"fmt"
	"math/big"
	"strings"
	"testing"

	"seatsmith/engine"
)

// TestPopulationParadoxHamilton: an invented case checked by hand. Ten
// seats among Ashby 263, Brent 851 and Colne 853 people: quotas 1.337,
// 4.326, 4.337, and the seat left over goes to Ashby (remainder .33706
// against Colne's .33655), 2-4-4. Later Ashby has 283 (+7.60%), Brent 882
// and Colne 907 (+6.33%): quotas 1.366, 4.257, 4.377, and the seat goes to
// Colne, 1-4-5. Ashby grew faster than Colne yet lost a seat to it.
func TestPopulationParadoxHamilton(t *testing.T) {
	names := []string{"Ashby", "Brent", "Colne"}
	s := &engine.Scenario{Units: units(names, 263, 851, 853), Seats: 10, Method: engine.Hamilton}
	later := &engine.Scenario{Units: units(names, 283, 882, 907)}
	r, err := FindPopulation(s, later)
	if err != nil {
		t.Fatal(err)
	}
	if len(r.Findings) != 1 {
		t.Fatalf("findings %+v, want one", r.Findings)
	}
	f := r.Findings[0]
	if f.Loser.Name != "Ashby" || f.Gainer.Name != "Colne" || !f.Faster || f.Tied {
		t.Errorf("finding %+v", f)
	}
	if Fraction(f.Loser.Growth) != "20/263" || Fraction(f.Gainer.Growth) != "54/853" {
		t.Errorf("growth %s and %s, want 20/263 and 54/853", Fraction(f.Loser.Growth), Fraction(f.Gainer.Growth))
	}
	want := "Hamilton (Hare quota), house of 10: Ashby grew 7.60% (263 → 283), faster than Colne at 6.33% (853 → 907), yet Ashby loses a seat (2 → 1) while Colne gains one (4 → 5)."
	if f.Text() != want {
		t.Errorf("text\n%s\nwant\n%s", f.Text(), want)
	}
	// Names are matched, not positions.
	later.Units[0], later.Units[2] = later.Units[2], later.Units[0]
	if r2, err := FindPopulation(s, later); err != nil || len(r2.Findings) != 1 {
		t.Errorf("reordered later set: %v, %v", r2, err)
	}
	later.Units[0].Name = "Dorn"
	if _, err := FindPopulation(s, later); err == nil || !strings.Contains(err.Error(), "missing") {
		t.Errorf("a missing unit gave %v", err)
	}
	// Webster on the same figures: no paradox.
	s.Method = engine.Webster
	later.Units = units(names, 283, 882, 907)
	if r, err := FindPopulation(s, later); err != nil || len(r.Findings) != 0 {
		t.Errorf("Webster: %+v, %v", r, err)
	}
}

func TestCompare(t *testing.T) {
	names := []string{"Ashby", "Brent", "Colne"}
	base := &engine.Scenario{Units: units(names, 263, 851, 853), Seats: 10, Method: engine.Hamilton}
	same, err := Compare(base, base)
	if err != nil {
		t.Fatal(err)
	}
	if len(same.Settings) != 0 || same.Moved() != 0 || same.Text()[0] != "no unit's seats change" {
		t.Errorf("same scenario: %+v %v", same.Settings, same.Text())
	}
	prop := *base
	prop.Units = append(units(names[1:], 882, 907), engine.Unit{Name: "Dorn", Population: engine.Whole(300)})
	prop.Seats = 12
	prop.Method = engine.Webster
	d, err := Compare(base, &prop)
	if err != nil {
		t.Fatal(err)
	}
	got := strings.Join(d.Text(), "\n")
	for _, want := range []string{"seats: 10 → 12", "method: hamilton → webster", "Ashby is not in the proposal (it had 2 seats)",
		"Dorn is new in the proposal, with 2 seats", "Colne gains 1 seat (4 → 5); population 853 → 907"} {
		if !strings.Contains(got, want) {
			t.Errorf("diff lacks %q:\n%s", want, got)
		}
	}
	if len(d.Units) != 4 || d.Units[0].InProposal || !d.Units[3].InProposal || d.Units[3].InBase {
		t.Errorf("units %+v", d.Units)
	}
	// Ashby -2, Brent +1 (4 → 5), Colne +1, Dorn +2: six changes, three
	// seats moved.
	if d.Moved() != 3 {
		t.Errorf("moved %d, want 3", d.Moved())
	}
	bad := prop
	bad.Seats = 1
	bad.Method = engine.Adams
	if _, err := Compare(base, &bad); err == nil || !strings.HasPrefix(err.Error(), "proposal: ") {
		t.Errorf("infeasible proposal gave %v", err)
	}
}

func TestChooseSize(t *testing.T) {
	us := units([]string{"Ashby", "Brent", "Colne"}, 263, 851, 853)
	hs, err := ChooseSize(SmallestUnit, us)
	if err != nil {
		t.Fatal(err)
	}
	// 1967/263 = 7.479..., nearest 7.
	if hs.Size != 7 || hs.Smallest != "Ashby" || hs.Text != "7.479087" {
		t.Errorf("smallest-unit rule: %+v", hs)
	}
	// The cube root of 1967 is 12.53..., nearest 13; of 1_000_000 exactly 100.
	if hs, _ := ChooseSize(CubeRoot, us); hs.Size != 13 || hs.Text != "12.530" {
		t.Errorf("cube-root rule: %+v", hs)
	}
	if hs, _ := ChooseSize(CubeRoot, units([]string{"x"}, 1_000_000)); hs.Size != 100 {
		t.Errorf("cube root of a million: %d", hs.Size)
	}
	if _, err := ChooseSize(CubeRoot, units([]string{"x"}, 0)); err == nil {
		t.Error("no people: no error")
	}
}

func TestDerive(t *testing.T) {
	res, err := engine.Allot(&engine.Scenario{Units: units([]string{"Ashby", "Brent", "Colne"}, 100, 300, 600), Seats: 10, Method: engine.Webster}, 0)
	if err != nil {
		t.Fatal(err)
	}
	d, err := Derive(res, 2)
	if err != nil {
		t.Fatal(err)
	}
	// Seats 1, 3, 6; body 3, 5, 8 of 16; Ashby's weight (3/16)/(1/10) = 15/8.
	if d.Size != 16 || d.Units[0].Body != 3 || Fraction(d.Units[0].Weight) != "15/8" || Fraction(d.Units[2].Weight) != "5/6" {
		t.Errorf("derived body %+v", d)
	}
	sum := new(big.Rat)
	for _, u := range d.Units {
		sum.Add(sum, u.BodyShare)
	}
	if sum.Cmp(big.NewRat(1, 1)) != 0 {
		t.Errorf("body shares add up to %s", sum.RatString())
	}
	if d.BodyIndices[0] <= d.HouseIndices[0] {
		t.Errorf("adding seats per unit should make the body less proportional: %v vs %v", d.BodyIndices, d.HouseIndices)
	}
	if _, err := Derive(res, -1); err == nil {
		t.Error("negative plus accepted")
	}
}

func TestMeasure(t *testing.T) {
	res, err := engine.Allot(&engine.Scenario{Units: units([]string{"Ashby", "Brent", "Colne"}, 100, 300, 600), Seats: 10, Method: engine.Webster}, 0)
	if err != nil {
		t.Fatal(err)
	}
	m := Measure(res)
	if m.LoosemoreHanby != 0 || m.Gallagher != 0 || m.SainteLague != 0 || m.Ratio != 1 || m.RelativeDifference != 0 {
		t.Errorf("exactly proportional result: %+v", m)
	}
	res, _ = engine.Allot(&engine.Scenario{Units: units([]string{"Ashby", "Brent", "Colne"}, 150, 300, 550), Seats: 10, Method: engine.Jefferson}, 0)
	m = Measure(res)
	// Jefferson: 1, 3, 6 against shares 15%, 30%, 55%: LH = ½(5+0+5) = 5;
	// Gallagher = √(½(25+0+25)) = 5; Sainte-Laguë = 25/15 + 25/55.
	if !near(m.LoosemoreHanby, 5) || !near(m.Gallagher, 5) || !near(m.SainteLague, 25.0/15+25.0/55) {
		t.Errorf("indices %+v", m)
	}
	if m.LargestUnit != "Ashby" || !near(m.Largest, 150) || !near(m.Smallest, 550.0/6) || !near(m.Ratio, 150/(550.0/6)) {
		t.Errorf("district sizes %+v", m)
	}
}

func near(a, b float64) bool { return a-b < 1e-9 && b-a < 1e-9 }

func ExampleFindAlabama() {
	s := &engine.Scenario{Method: engine.Hamilton, Units: []engine.Unit{
		{Name: "Tarrow", Population: engine.Whole(940)},
		{Name: "Ulm", Population: engine.Whole(9030)},
		{Name: "Vesk", Population: engine.Whole(10030)},
	}}
	sw, _ := engine.Sweep(s, 195, 205)
	for _, f := range FindAlabama(sw) {
		fmt.Println(f.Name, f.From, f.To, f.Before, f.After)
	}
	// Output:
	// Tarrow 200 201 10 9
	// Tarrow 202 203 10 9
}

// TestQuotaViolationBlame: a violation is put down to the bounds only when
// the unit would be within quota without them. Invented figures.
func TestQuotaViolationBlame(t *testing.T) {
	one, two := 1, 2
	names := []string{"Orlen", "Tamsk", "Brevia", "Caldmoor", "Pellin Reach", "Sarrow", "Upper Vell", "Keddle Isles", "Marrowgate"}
	pops := []uint64{2694457, 2079562, 1178082, 977496, 588225, 344546, 188940, 93288, 55971}
	// Adams gives every unit a seat of itself, so a minimum of one holds
	// no unit where Adams would not: Orlen's shortfall (12 seats, quota
	// 13.14) is Adams's own.
	s := &engine.Scenario{Units: units(names, pops...), Method: engine.Adams, Min: 1}
	sw, err := engine.Sweep(s, 40, 40)
	if err != nil {
		t.Fatal(err)
	}
	vs := FindQuotaViolations(sw, s)
	if len(vs) == 0 {
		t.Fatal("no violation under Adams at 20 seats")
	}
	for _, v := range vs {
		if v.Bounds || strings.Contains(v.Text(), "minimums") {
			t.Errorf("blamed on bounds that do not bind: %s", v.Text())
		}
	}
	// Hamilton never breaks quota by itself; a cap of 2 on Orlen (quota
	// about 7.8) does.
	s = &engine.Scenario{Units: units(names, pops...), Method: engine.Hamilton}
	s.Units[0].Max = &two
	s.Units[5].Min = &one
	sw, err = engine.Sweep(s, 20, 20)
	if err != nil {
		t.Fatal(err)
	}
	vs = FindQuotaViolations(sw, s)
	found := false
	for _, v := range vs {
		if v.Name == "Orlen" {
			found = true
			if !v.Bounds || !strings.Contains(v.Text(), "the minimums or maximums cause it") {
				t.Errorf("the cap's violation is not put down to it: %s", v.Text())
			}
		}
	}
	if !found {
		t.Errorf("no violation for the capped unit: %v", vs)
	}
}
