package election

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"seatsmith/engine"
	"seatsmith/engine/input"
)

func readFile(t *testing.T, name string) *Source {
	t.Helper()
	f, err := os.Open(filepath.Join("testdata", name))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	src, err := Read(name, f)
	if err != nil {
		t.Fatal(err)
	}
	return src
}

// The published scenarios read from their files give the published seats
// (sources in testdata/README.md).
func TestReadPublished(t *testing.T) {
	res, err := readFile(t, "zurich-2018.json").Compute()
	if err != nil {
		t.Fatal(err)
	}
	wantSeats(t, res, map[string]int{"SP": 43, "SVP": 17, "FDP": 21, "Grüne": 16, "glp": 14, "AL": 10, "EVP/BDP": 4})
	res, err = readFile(t, "new-zealand-2008.json").Compute()
	if err != nil {
		t.Fatal(err)
	}
	if res.Seats != 122 {
		t.Errorf("New Zealand 2008: house of %d, want 122", res.Seats)
	}
}

// The same election as JSON and as CSV sections gives the same result.
func TestCSVMatchesJSON(t *testing.T) {
	js := `{"kind": "election", "system": "districts", "method": "dhondt",
  "districts": [{"name": "North", "seats": 5}, {"name": "South", "seats": 3}],
  "votes": [
    {"district": "North", "party": "Lantern", "votes": 5200},
    {"district": "North", "party": "Harbour", "votes": 3100},
    {"district": "South", "party": "Lantern", "votes": 900},
    {"district": "South", "party": "Harbour", "votes": 2950.5}
  ]}`
	csv := "district,party,votes\r\nNorth,Lantern,5200\r\nNorth,Harbour,3100\r\nSouth,Lantern,900\r\nSouth,Harbour,2950.5\r\n,,\r\nSeats,District\r\n5,North\r\n3,South\r\n"
	a, err := Read("a.json", strings.NewReader(js))
	if err != nil {
		t.Fatal(err)
	}
	b, err := Read("b.csv", strings.NewReader(csv))
	if err != nil {
		t.Fatal(err)
	}
	b.Scenario.System, b.Scenario.Method = Districts, engine.Jefferson
	ra, err := a.Compute()
	if err != nil {
		t.Fatal(err)
	}
	rb, err := b.Compute()
	if err != nil {
		t.Fatal(err)
	}
	if da, db := resultSummary(ra), resultSummary(rb); da != db {
		t.Errorf("JSON and CSV differ:\n%s\n%s", da, db)
	}
}

// The district table may come from a second file.
func TestCSVSecondFile(t *testing.T) {
	src, err := Read("votes.csv", strings.NewReader("party,district,votes\nA,X,10\nB,X,7\n"))
	if err != nil {
		t.Fatal(err)
	}
	if err := src.AddCSV("seats.csv", strings.NewReader("district,seats\nX,3\n")); err != nil {
		t.Fatal(err)
	}
	src.Scenario.System, src.Scenario.Method = Districts, engine.Webster
	res, err := src.Compute()
	if err != nil {
		t.Fatal(err)
	}
	if res.Parties[0].Seats != 2 || res.Parties[1].Seats != 1 {
		t.Errorf("seats %d, %d; want 2, 1", res.Parties[0].Seats, res.Parties[1].Seats)
	}
	// An error about the district names the second file and its line.
	src.Scenario.Districts[0].Seats = 0
	_, err = src.Compute()
	if err == nil || !strings.Contains(err.Error(), "seats.csv:2: districts[0].seats") {
		t.Errorf("error %v, want it located at seats.csv:2", err)
	}
}

// Bad input is reported by file, line and field.
func TestReadErrors(t *testing.T) {
	for _, tc := range []struct {
		name, text string
		compute    bool
		want       string
	}{
		{"a.json", `{"kind": "election", "votes": []}` + "\n", true, ""},
		{"b.json", "{\n \"kind\": \"election\",\n \"votes\": [\n  {\"district\": \"X\", \"party\": \"A\", \"votes\": -3}\n ]\n}", false, "b.json:4: votes[0].votes: \"A\": \"-3\" is not a count: counts cannot be negative"},
		{"c.json", "{\n \"kind\": \"election\",\n \"sistem\": \"districts\"\n}", false, "c.json:3: sistem: unknown member"},
		{"d.json", "{\"kind\": \"allotment\", \"votes\": []}", false, "d.json:1: kind: must be \"election\""},
		{"e.json", "{\n \"kind\": \"election\", \"system\": \"districts\", \"method\": \"dhondt\",\n \"districts\": [{\"name\": \"X\", \"seats\": 2}],\n \"votes\": [\n  {\"district\": \"X\", \"party\": \"A\", \"votes\": 3},\n  {\"district\": \"Y\", \"party\": \"B\", \"votes\": 3}\n ]\n}", true, "e.json:6: votes[1].district: unknown district \"Y\""},
		{"f.json", "{\n \"kind\": \"election\", \"system\": \"districts\", \"method\": \"dhondt\",\n \"threshold\": {\"share\": \"5%\", \"scope\": \"county\"},\n \"votes\": []\n}", false, "f.json:3: threshold.scope: unknown threshold scope"},
		{"g.csv", "district,party,votes\nX,A,12\nX,B,twelve\n", false, "g.csv:3: votes: \"B\": \"twelve\" is not a count"},
		{"h.csv", "district,party,votes\nX,A,12\n\ndistrict,seats,colour\nX,3,red\n", false, "h.csv:4: column 3: unknown column \"colour\" in a districts section"},
		{"i.csv", "district,party,votes\nX,A,12\nX,A,5\n\ndistrict,seats\nX,3\n", true, "i.csv:3: votes[1].party: \"A\" in district \"X\": the same district and party as vote row 1"},
		{"j.csv", "district,party,votes\nX,A,12\n\ndistrict,seats\nX,3\nX,4\n", true, "i.csv"},
		{"k.csv", "colour\nred\n", false, "k.csv:1: unknown section"},
		{"l.csv", "", false, "l.csv:1: empty file"},
		{"m.csv", "district,party,votes\nX,\"A\nB\",1\nY,C\n", false, "m.csv:4: row:"},
	} {
		src, err := Read(tc.name, strings.NewReader(tc.text))
		if err == nil && tc.compute {
			src.Scenario.System, src.Scenario.Method = Districts, engine.Jefferson
			_, err = src.Compute()
		}
		if tc.want == "" {
			if err == nil {
				t.Errorf("%s: no error", tc.name)
			}
			continue
		}
		if tc.name == "j.csv" {
			if err == nil || !strings.Contains(err.Error(), "j.csv:6: districts[1].name") {
				t.Errorf("%s: %v", tc.name, err)
			}
			continue
		}
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: error %v, want %q", tc.name, err, tc.want)
		}
		if err != nil {
			if _, ok := err.(*input.Error); !ok {
				t.Errorf("%s: %T, want *input.Error", tc.name, err)
			}
		}
	}
}

// A threshold is a share, an object or an array of them.
func TestReadThresholds(t *testing.T) {
	src, err := Read("t.json", strings.NewReader(`{"kind": "election", "threshold": ["5%", {"share": 0.03, "scope": "any-district", "base": "valid"}], "alternative_wins": 2, "votes": []}`))
	if err != nil {
		t.Fatal(err)
	}
	th := src.Scenario.Thresholds
	if len(th) != 2 || th[0].Share.String() != "0.05" || th[1].Scope != AnyDistrict || th[1].Base != Valid || src.Scenario.WinsThreshold != 2 {
		t.Errorf("thresholds %+v, wins %d", th, src.Scenario.WinsThreshold)
	}
}

// resultSummary writes what a result says of every party, district and
// cell, to compare two results.
func resultSummary(r *Result) string {
	var b strings.Builder
	for _, p := range r.Parties {
		fmt.Fprintf(&b, "party %s %s %v %s %d\n", p.Name, p.Votes, p.Qualified, p.Reason, p.Seats)
	}
	for _, d := range r.Districts {
		fmt.Fprintf(&b, "district %s %d %s %s %s\n", d.Name, d.Seats, d.Votes, d.OtherVotes, d.Divisor)
	}
	for _, c := range r.Cells {
		fmt.Fprintf(&b, "cell %d %d %s %d %v %v\n", c.District, c.Party, c.Votes, c.Seats, c.Excluded, c.Tied)
	}
	fmt.Fprintf(&b, "ties %d unassigned %d\n", len(r.Ties), r.Unassigned)
	return b.String()
}
