package projection

import (
	"math"
	"math/big"
	"strings"
	"testing"

	"seatsmith/engine"
)

func series(t *testing.T, pts ...any) *Series {
	t.Helper()
	s := &Series{Name: "X"}
	for k := 0; k < len(pts); k += 2 {
		d, err := ParseDate(pts[k].(string))
		if err != nil {
			t.Fatal(err)
		}
		p, err := engine.ParseDecimal(pts[k+1].(string))
		if err != nil {
			t.Fatal(err)
		}
		s.Counts = append(s.Counts, Count{Date: d, Dated: true, Population: p})
	}
	sortCounts(s.Counts)
	return s
}

// TestProjectLinear checks the least-squares line against hand
// computation (the ordinary least-squares slope and intercept: common
// practice, in any statistics text). Counts 100, 120, 150 at 2000, 2010,
// 2020: mean time 2010, mean count 370/3, slope Sxy/Sxx = 500/200 = 2.5
// people a year, so 2030 gives 370/3 + 50 = 173.33..., rounded to 173.
// Through the last two counts the line gives 150 + 3·10 = 180.
func TestProjectLinear(t *testing.T) {
	s := series(t, "2000", "100", "2010", "120", "2020", "150")
	for _, tc := range []struct {
		fit    Fit
		target string
		want   string
		rate   float64
	}{
		{AllCounts, "2030", "173", 2.5},
		{LastTwo, "2030", "180", 3},
		{AllCounts, "2010", "123", 2.5},
		// 2025-07-02 is day 183 of 365: t = 2025 + 182/365; the line
		// through the last two gives 150 + 3·(5 + 182/365) = 166.4958...
		{LastTwo, "2025-07-02", "166", 3},
	} {
		p, err := Project(s, *mustDate(t, tc.target), Linear, tc.fit, 0)
		if err != nil {
			t.Fatal(err)
		}
		if p.Population.String() != tc.want || p.Rate != tc.rate || p.Clamped {
			t.Errorf("%v to %s: %v (rate %v, clamped %v), want %s (rate %v)", tc.fit, tc.target, p.Population, p.Rate, p.Clamped, tc.want, tc.rate)
		}
	}
	// Halves round up: 100 and 101 two years apart give 101.5 a year on.
	h := series(t, "2000", "100", "2002", "101")
	p, err := Project(h, Date{2003, 1, 1}, Linear, AllCounts, 0)
	if err != nil {
		t.Fatal(err)
	}
	if p.Population.String() != "102" {
		t.Errorf("101.5 rounded to %v, want 102", p.Population)
	}
	// Decimal counts keep their places: 10.5 and 11.25 two years apart.
	dcm := series(t, "2018", "10.5", "2020", "11.25")
	p, _ = Project(dcm, Date{2024, 1, 1}, Linear, AllCounts, 2)
	if p.Population.String() != "12.75" {
		t.Errorf("decimal projection %v, want 12.75", p.Population)
	}
	// A falling line that crosses zero is clamped.
	f := series(t, "2000", "50", "2010", "20")
	p, _ = Project(f, Date{2030, 1, 1}, Linear, AllCounts, 0)
	if !p.Clamped || !p.Population.IsZero() {
		t.Errorf("falling line: %+v", p)
	}
}

func mustDate(t *testing.T, s string) *Date {
	d, err := ParseDate(s)
	if err != nil {
		t.Fatal(err)
	}
	return &d
}

// TestProjectGeometric checks compound growth. Through two counts,
// p(T) = p_2·(p_2/p_1)^((T - t_2)/(t_2 - t_1)): 120 then 150 ten years
// later grows by 1.25 a decade, so 2030 gives 187.5, rounded to 188. Over
// all three counts the least-squares line on the logarithms is checked
// against the same formula written out.
func TestProjectGeometric(t *testing.T) {
	s := series(t, "2000", "100", "2010", "120", "2020", "150")
	p, err := Project(s, Date{2030, 1, 1}, Geometric, LastTwo, 0)
	if err != nil {
		t.Fatal(err)
	}
	if p.Population.String() != "188" || math.Abs(p.Rate-(math.Pow(1.25, 0.1)-1)) > 1e-12 {
		t.Errorf("last two: %v rate %v", p.Population, p.Rate)
	}
	y := []float64{math.Log(100), math.Log(120), math.Log(150)}
	ybar := (y[0] + y[1] + y[2]) / 3
	b := (-10*(y[0]-ybar) + 10*(y[2]-ybar)) / 200
	want := math.Round(math.Exp(ybar + b*20))
	p, _ = Project(s, Date{2030, 1, 1}, Geometric, AllCounts, 0)
	if float64(p.Population.Coef) != want {
		t.Errorf("all counts: %v, want %v", p.Population, want)
	}
	z := series(t, "2000", "0", "2010", "5")
	if _, err := Project(z, Date{2030, 1, 1}, Geometric, AllCounts, 0); err == nil || !strings.Contains(err.Error(), "above zero") {
		t.Errorf("zero count: %v", err)
	}
}

func TestProjectErrors(t *testing.T) {
	one := series(t, "2020", "10")
	if _, err := Project(one, Date{2030, 1, 1}, Linear, AllCounts, 0); err == nil {
		t.Error("one count projected")
	}
	big := series(t, "2000", "1", "2001", "900000000000000000")
	if _, err := Project(big, Date{2100, 1, 1}, Linear, AllCounts, 0); err == nil {
		t.Error("projection above 10^18 accepted")
	}
	if _, err := Project(big, Date{2100, 1, 1}, Geometric, AllCounts, 0); err == nil {
		t.Error("geometric projection above 10^18 accepted")
	}
}

func TestDates(t *testing.T) {
	for _, tc := range []struct {
		in, out string
		years   *big.Rat
	}{
		{"2030", "2030-01-01", big.NewRat(2030, 1)},
		{"2030-07", "2030-07-01", big.NewRat(2030*365+181, 365)},
		{"2020-04-01", "2020-04-01", big.NewRat(2020*366+91, 366)},   // 2020 is a leap year
		{" 1900-03-01 ", "1900-03-01", big.NewRat(1900*365+59, 365)}, // 1900 is not
	} {
		d, err := ParseDate(tc.in)
		if err != nil {
			t.Fatalf("%q: %v", tc.in, err)
		}
		if d.String() != tc.out || d.Years().Cmp(tc.years) != 0 {
			t.Errorf("%q: %s, %s years; want %s, %s", tc.in, d, d.Years().RatString(), tc.out, tc.years.RatString())
		}
	}
	for _, bad := range []string{"", "20", "2030-13-01", "2021-02-29", "2030/01/01", "2030-1-1", "0000", "2030-01-01-01", "２０３０"} {
		if _, err := ParseDate(bad); err == nil {
			t.Errorf("%q accepted", bad)
		}
	}
}
