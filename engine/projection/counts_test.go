package projection

import (
	"context"
	"errors"
	"strings"
	"testing"

	"seatsmith/engine"
	"seatsmith/engine/input"
)

func TestReadCountsCSV(t *testing.T) {
	c, err := ReadCounts("c.csv", strings.NewReader("\uFEFFName,Date,Population,RSE,min\r\nA,2020,120,2%,1\r\nB,2010-04-01,40,,\r\nA,2010,100,0.02,\r\nB,2020-04-01,55.5,,2\r\n"))
	if err != nil {
		t.Fatal(err)
	}
	if !c.Dated || len(c.Series) != 2 {
		t.Fatalf("dated %v, %d series", c.Dated, len(c.Series))
	}
	a, b := c.Series[0], c.Series[1]
	if a.Name != "A" || len(a.Counts) != 2 || a.Counts[0].Date.Year != 2010 || a.Latest().Population.String() != "120" {
		t.Errorf("A: %+v", a)
	}
	if a.RSE == nil || *a.RSE != 0.02 || *a.Min != 1 || a.Line != 2 {
		t.Errorf("A settings: rse %v min %v line %d", a.RSE, a.Min, a.Line)
	}
	if b.RSE != nil || *b.Min != 2 || b.Latest().Line != 5 {
		t.Errorf("B settings: %+v", b)
	}
	u, err := ReadCounts("u.csv", strings.NewReader("name,population\nA,10\nB,20\n"))
	if err != nil || u.Dated || len(u.Series) != 2 || u.Series[1].Latest().Dated {
		t.Fatalf("undated: %+v, %v", u, err)
	}
}

func TestReadCountsJSON(t *testing.T) {
	doc := `{
  "title": "Vessaria",
  "seats": 40,
  "method": "huntington-hill",
  "min": 1,
  "units": [
    {"name": "Orlen", "rse": "1.5%", "counts": [
      {"date": "2020-04-01", "population": 2694457},
      {"date": "2015-04-01", "population": "2550112"}
    ]},
    {"name": "Tamsk", "min": 2, "population": 2079562}
  ]
}`
	c, err := ReadCounts("v.json", strings.NewReader(doc))
	if err != nil {
		t.Fatal(err)
	}
	if c.Title != "Vessaria" || c.Scenario.Seats != 40 || c.Scenario.Method != engine.HuntingtonHill || c.Scenario.Min != 1 || !c.Given["seats"] {
		t.Errorf("settings %+v", c.Scenario)
	}
	o, tm := c.Series[0], c.Series[1]
	if len(o.Counts) != 2 || o.Counts[0].Date.Year != 2015 || *o.RSE != 0.015 || o.Line != 7 || o.Counts[1].Line != 8 {
		t.Errorf("Orlen %+v", o)
	}
	if len(tm.Counts) != 1 || tm.Counts[0].Dated || *tm.Min != 2 || tm.Line != 11 {
		t.Errorf("Tamsk %+v", tm)
	}
}

// TestReadCountsErrors checks that bad input is refused with the file,
// line and field at fault.
func TestReadCountsErrors(t *testing.T) {
	for _, tc := range []struct {
		name, text  string
		line        int
		field, part string
	}{
		{"empty", "", 1, "", "empty file"},
		{"unknown column", "name,date,people\n", 1, "column 3", "unknown column"},
		{"no population", "name,date\nA,2020\n", 1, "population", "missing column"},
		{"duplicate column", "name,name,population\n", 1, "name", "twice"},
		{"no rows", "name,population\n", 2, "", "no units"},
		{"bad date", "name,date,population\nA,2020,5\nA,2020-02-30,6\n", 3, "date", "not a day"},
		{"missing date", "name,date,population\nA,,5\n", 2, "date", "missing date"},
		{"same date", "name,date,population\nA,2020,5\nB,2020,6\nA,2020-01-01,6\n", 4, "date", "first is on line 2"},
		{"negative", "name,date,population\nA,2020,-5\n", 2, "population", "negative"},
		{"empty name", "name,date,population\n ,2020,5\n", 2, "name", "empty"},
		{"repeated undated", "name,population\nA,5\nA,6\n", 3, "name", "add a date column"},
		{"rse", "name,population,rse\nA,5,high\n", 2, "rse", "not a relative standard error"},
		{"rse too big", "name,population,rse\nA,5,150%\n", 2, "rse", "more than 100%"},
		{"rse differs", "name,date,population,rse\nA,2010,5,1%\nA,2020,6,2%\n", 3, "rse", "differs from the value on line 2"},
		{"min differs", "name,date,population,min\nA,2010,5,1\nA,2020,6,2\n", 3, "min", "differs"},
		{"bad max", "name,population,max\nA,5,many\n", 2, "max", "whole number"},
		{"short row", "name,date,population\nA,2020\n", 2, "row", "different number of fields"},
		{"json syntax", "{\n\"units\": [}\n", 2, "", "column"},
		{"json unknown", "{\"units\": [], \"speed\": 3}", 1, "speed", "unknown member"},
		{"json unit member", "{\"units\": [\n{\"name\": \"A\", \"people\": 3}]}", 2, "units[0].people", "unknown member"},
		{"json both", "{\"units\": [\n{\"name\": \"A\", \"population\": 3,\n \"counts\": [{\"date\": \"2020\", \"population\": 3}]}]}", 3, "units[0].counts", "not both"},
		{"json count date", "{\"units\": [{\"name\": \"A\", \"counts\": [\n{\"date\": \"soon\", \"population\": 3}]}]}", 2, "units[0].counts[0].date", "not a date"},
		{"json count population", "{\"units\": [{\"name\": \"A\", \"counts\": [\n{\"date\": \"2020\",\n \"population\": \"3e4\"}]}]}", 3, "units[0].counts[0].population", "not a population"},
		{"json no population", "{\"units\": [\n{\"name\": \"A\"}]}", 2, "units[0].population", "missing"},
		{"json seats", "{\"seats\": \"many\", \"units\": [{\"name\": \"A\", \"population\": 1}]}", 1, "seats", "not a whole number"},
		{"json rse", "{\"units\": [{\"name\": \"A\", \"population\": 1,\n \"rse\": true}]}", 2, "units[0].rse", "share"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := ReadCounts("in.txt", strings.NewReader(tc.text))
			var e *input.Error
			if !errors.As(err, &e) {
				t.Fatalf("error %v (%T), want an *input.Error", err, err)
			}
			if e.File != "in.txt" || e.Line != tc.line || e.Field != tc.field || !strings.Contains(e.Msg, tc.part) {
				t.Errorf("got %q (line %d, field %q), want line %d, field %q, containing %q", e.Error(), e.Line, e.Field, tc.line, tc.field, tc.part)
			}
		})
	}
}

func TestParseRSE(t *testing.T) {
	for in, want := range map[string]float64{"0.02": 0.02, ".05": 0.05, "2%": 0.02, " 0.5 % ": 0.005, "0": 0, "100%": 1} {
		got, err := ParseRSE(in)
		if err != nil || got != want {
			t.Errorf("%q: %v, %v; want %v", in, got, err, want)
		}
	}
	for _, bad := range []string{"", "-0.1", "1.5", "2e-2", "NaN", "inf", "%", "0x1p-3"} {
		if _, err := ParseRSE(bad); err == nil {
			t.Errorf("%q accepted", bad)
		}
	}
}

// FuzzReadCounts feeds arbitrary input to the reader and, when it is read,
// to a short study: bad input must give an error, never a panic.
func FuzzReadCounts(f *testing.F) {
	f.Add("name,date,population,rse\nA,2010,100,2%\nA,2020,120,\nB,2010,50,\nB,2020,40,\n")
	f.Add("name,population\nA,5\nB,0\n")
	f.Add(`{"seats": 3, "units": [{"name": "A", "counts": [{"date": "2010", "population": 1}, {"date": "2020", "population": 9}]}, {"name": "B", "population": 4}]}`)
	f.Add("name,date,population,min,max\nA,2020-02-29,1,3,1\n")
	f.Fuzz(func(t *testing.T, text string) {
		c, err := ReadCounts("fuzz", strings.NewReader(text))
		if err != nil {
			var e *input.Error
			if !errors.As(err, &e) {
				t.Fatalf("error %v is not an *input.Error", err)
			}
			return
		}
		if c.Scenario.Seats == 0 {
			c.Scenario.Seats = 5
		}
		if !c.Scenario.Method.Valid() {
			c.Scenario.Method = engine.HuntingtonHill
		}
		for _, target := range []*Date{nil, {2030, 1, 1}} {
			for _, g := range []Growth{Linear, Geometric} {
				st, err := New(c, Options{Target: target, Growth: g, RSE: 0.3, Draws: 20, Workers: 1, Contest: 2})
				if err != nil {
					continue
				}
				if err := st.RunAll(context.Background()); err != nil {
					t.Fatal(err)
				}
				st.Summary()
			}
		}
	})
}
