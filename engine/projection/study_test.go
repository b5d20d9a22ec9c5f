package projection

import (
	"context"
	"errors"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"seatsmith/engine"
	"seatsmith/engine/input"
)

// demoCounts are dated counts for the nine provinces of Vessaria, an
// invented federation (demo data only): testdata/demo/vessaria-counts.csv.
var demoCounts = func() string {
	b, err := os.ReadFile(filepath.Join("..", "..", "testdata", "demo", "vessaria-counts.csv"))
	if err != nil {
		panic(err)
	}
	return string(b)
}()

func demoStudy(t testing.TB, opt Options) *Study {
	t.Helper()
	c, err := ReadCounts("vessaria-counts.csv", strings.NewReader(demoCounts))
	if err != nil {
		t.Fatal(err)
	}
	c.Scenario.Seats, c.Scenario.Method, c.Scenario.Min = 40, engine.HuntingtonHill, 1
	st, err := New(c, opt)
	if err != nil {
		t.Fatal(err)
	}
	return st
}

func target(t testing.TB, s string) *Date {
	d, err := ParseDate(s)
	if err != nil {
		t.Fatal(err)
	}
	return &d
}

// TestSameSeedSameNumbers runs the same study with 1, 2 and 7 workers, and
// in uneven chunks, and expects identical summaries.
func TestSameSeedSameNumbers(t *testing.T) {
	opt := Options{Target: target(t, "2030-04-01"), RSE: 0.03, Draws: 3000, Seed: 42, Contest: 3}
	var first *Summary
	for _, workers := range []int{1, 2, 7} {
		opt.Workers = workers
		st := demoStudy(t, opt)
		if err := st.RunAll(context.Background()); err != nil {
			t.Fatal(err)
		}
		s := st.Summary()
		if first == nil {
			first = s
			continue
		}
		if !reflect.DeepEqual(s, first) {
			t.Fatalf("%d workers give a different summary from 1 worker", workers)
		}
	}
	opt.Workers = 3
	st := demoStudy(t, opt)
	for _, cut := range [][2]int{{0, 1}, {1, 700}, {700, 701}, {701, 3000}} {
		if err := st.Run(context.Background(), cut[0], cut[1]); err != nil {
			t.Fatal(err)
		}
	}
	if !reflect.DeepEqual(st.Summary(), first) {
		t.Fatal("draws run in chunks give a different summary")
	}
	// A different seed gives different draws.
	opt.Seed = 43
	other := demoStudy(t, opt)
	if err := other.RunAll(context.Background()); err != nil {
		t.Fatal(err)
	}
	if reflect.DeepEqual(other.Summary().Units, first.Units) {
		t.Error("seeds 42 and 43 give the same summary")
	}
}

func TestRunChunksAndCancel(t *testing.T) {
	var calls []int
	st := demoStudy(t, Options{RSE: 0.02, Draws: 2000, Seed: 1, Workers: 2, Progress: func(done, total int) {
		if total != 2000 {
			t.Errorf("progress total %d", total)
		}
		calls = append(calls, done)
	}})
	if err := st.Run(context.Background(), 5, 10); err == nil {
		t.Error("a run that skips draws was accepted")
	}
	if err := st.RunAll(context.Background()); err != nil {
		t.Fatal(err)
	}
	if len(calls) == 0 || calls[len(calls)-1] != 2000 {
		t.Fatalf("progress calls %v", calls)
	}
	for k := 1; k < len(calls); k++ {
		if calls[k] <= calls[k-1] {
			t.Fatalf("progress went backwards: %v", calls)
		}
	}
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if err := st.Run(ctx, 2000, 100_000); !errors.Is(err, context.Canceled) {
		t.Fatalf("cancelled run: %v", err)
	}
	if st.Done() != 2000 || st.Summary().Apportioned != 2000 {
		t.Fatalf("a cancelled run changed the study: done %d", st.Done())
	}
}

// TestSummaryConsistent checks the summary's own arithmetic on the demo.
func TestSummaryConsistent(t *testing.T) {
	st := demoStudy(t, Options{Target: target(t, "2032"), RSE: 0.04, Draws: 4000, Seed: 9, Contest: 3})
	if err := st.RunAll(context.Background()); err != nil {
		t.Fatal(err)
	}
	s := st.Summary()
	var last, next int64
	for _, u := range s.Units {
		var n int64
		var p float64
		for _, d := range u.Dist {
			n += d.Draws
			p += d.P
		}
		if n != s.Apportioned || p < 0.999999 || p > 1.000001 {
			t.Errorf("%s: distribution covers %d of %d draws (shares add to %v)", u.Name, n, s.Apportioned, p)
		}
		if u.Last.Draws > u.InLast.Draws || u.Next.Draws > u.InNext.Draws {
			t.Errorf("%s: last %d > in last %d or next %d > in next %d", u.Name, u.Last.Draws, u.InLast.Draws, u.Next.Draws, u.InNext.Draws)
		}
		last += u.Last.Draws
		next += u.Next.Draws
	}
	if last != s.Apportioned || next != s.Apportioned {
		t.Errorf("the last seat is held in %d draws and the next taken in %d, of %d", last, next, s.Apportioned)
	}
	// Orlen has its own relative standard error in the file.
	if s.Units[0].RSE != 0.015 || s.Units[1].RSE != 0.04 {
		t.Errorf("rse %v and %v, want 0.015 and 0.04", s.Units[0].RSE, s.Units[1].RSE)
	}
}

// TestCensus2020Central checks that a study of the published 2020
// apportionment populations with no error reproduces the published seats.
// Source: U.S. Census Bureau, 2020 Census Apportionment Results, Table 1
// (method of equal proportions, 435 seats, at least one each, 2 U.S.C. §2a).
func TestCensus2020Central(t *testing.T) {
	c, want := census(t)
	st, err := New(c, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if st.Noisy() {
		t.Fatal("no error model, but the study is noisy")
	}
	if err := st.RunAll(context.Background()); err != nil {
		t.Fatal(err)
	}
	s := st.Summary()
	for i, u := range s.Units {
		if u.CentralSeats != want[i] || u.BaselineSeats != want[i] {
			t.Errorf("%s: %d seats, want %d", u.Name, u.CentralSeats, want[i])
		}
	}
	if s.Draws != 0 {
		t.Errorf("%d draws with no error model", s.Draws)
	}
}

// census reads the 2020 apportionment populations (source above) as
// undated counts, with the seats published for them.
func census(t testing.TB) (*Counts, []int) {
	t.Helper()
	f, err := os.ReadFile("../../testdata/us-2020-apportionment.csv")
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(strings.TrimSpace(string(f)), "\n")
	var table strings.Builder
	table.WriteString("name,population\n")
	var seats []int
	for _, l := range lines[1:] {
		parts := strings.Split(l, ",")
		table.WriteString(parts[0] + "," + parts[1] + "\n")
		n := 0
		for _, ch := range parts[2] {
			n = n*10 + int(ch-'0')
		}
		seats = append(seats, n)
	}
	c, err := ReadCounts("us-2020.csv", strings.NewReader(table.String()))
	if err != nil {
		t.Fatal(err)
	}
	c.Scenario.Seats, c.Scenario.Method, c.Scenario.Min = 435, engine.HuntingtonHill, 1
	return c, seats
}

func TestStudyErrors(t *testing.T) {
	c, err := ReadCounts("one.csv", strings.NewReader("name,population\nA,100\nB,50\n"))
	if err != nil {
		t.Fatal(err)
	}
	c.Scenario.Seats, c.Scenario.Method = 3, engine.Webster
	_, err = New(c, Options{Target: target(t, "2030")})
	var ie *input.Error
	if !errors.As(err, &ie) || ie.Line != 2 || ie.Field != "counts" || !strings.Contains(ie.Msg, "two dated counts") {
		t.Errorf("projection of undated counts: %v", err)
	}
	for _, opt := range []Options{{Draws: -1}, {RSE: 2}, {Contest: 99}, {Workers: -1}} {
		if _, err := New(c, opt); err == nil {
			t.Errorf("options %+v accepted", opt)
		}
	}
	st, err := New(c, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := st.Run(context.Background(), 0, 10); err == nil {
		t.Error("draws with no error model accepted")
	}
	// A scenario error is located in the file.
	c.Scenario.Seats = 0
	_, err = New(c, Options{})
	if !errors.As(err, &ie) || ie.File != "one.csv" || ie.Field != "seats" {
		t.Errorf("scenario error: %v", err)
	}
}

// TestFailedDraws checks that draws for which no apportionment exists are
// counted apart from the others: with a five percent threshold, a draw that
// puts B below it leaves only A, capped at two of the four seats.
func TestFailedDraws(t *testing.T) {
	c, err := ReadCounts("cap.csv", strings.NewReader("name,population,max\nA,1000,2\nB,1000,\n"))
	if err != nil {
		t.Fatal(err)
	}
	c.Scenario.Seats, c.Scenario.Method, c.Scenario.Threshold = 4, engine.Webster, engine.Decimal{Coef: 5, Places: 2}
	st, err := New(c, Options{RSE: 0.9, Error: LogNormal, Draws: 2000, Seed: 3})
	if err != nil {
		t.Fatal(err)
	}
	if err := st.RunAll(context.Background()); err != nil {
		t.Fatal(err)
	}
	s := st.Summary()
	if s.Failed == 0 || s.Apportioned+s.Failed != 2000 {
		t.Fatalf("failed %d, apportioned %d", s.Failed, s.Apportioned)
	}
}

// TestDrawStreams checks that draws get distinct streams and that the
// normal variates of many draws have mean 0 and variance 1 (within five
// standard errors).
func TestDrawStreams(t *testing.T) {
	var src rand.PCG
	rng := rand.New(&src)
	seen := map[uint64]int{}
	const n = 20_000
	var sum, sq float64
	for i := 0; i < n; i++ {
		seedDraw(&src, 1, i)
		z := rng.NormFloat64()
		sum += z
		sq += z * z
		seedDraw(&src, 1, i)
		u := src.Uint64()
		if j, dup := seen[u]; dup {
			t.Fatalf("draws %d and %d start alike", j, i)
		}
		seen[u] = i
	}
	mean, variance := sum/n, sq/n-(sum/n)*(sum/n)
	if math.Abs(mean) > 5/math.Sqrt(n) || math.Abs(variance-1) > 5*math.Sqrt(2.0/n) {
		t.Errorf("first variates: mean %v, variance %v", mean, variance)
	}
}
