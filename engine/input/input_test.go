package input

import (
	"errors"
	"strings"
	"testing"

	"seatsmith/engine"
)

func TestReadCSV(t *testing.T) {
	in := "\ufeffName, Population ,min,MAX\r\nOrlen,1204553,2,\r\nTamsk,880120.50,,9\r\n"
	src, err := ReadCSV("units.csv", strings.NewReader(in))
	if err != nil {
		t.Fatal(err)
	}
	us := src.Scenario.Units
	if len(us) != 2 || us[0].Name != "Orlen" || us[1].Population.String() != "880120.5" {
		t.Fatalf("units = %+v", us)
	}
	if us[0].Min == nil || *us[0].Min != 2 || us[0].Max != nil || us[1].Max == nil || *us[1].Max != 9 {
		t.Errorf("bounds not read: %+v", us)
	}
	if src.UnitLine(1) != 3 {
		t.Errorf("line of unit 2 = %d, want 3", src.UnitLine(1))
	}
}

func TestBadInput(t *testing.T) {
	for _, tc := range []struct {
		name, in, want string
	}{
		{"negative", "name,population\nA,-5\n", "units.csv:2: population: \"A\": \"-5\" is not a population: populations cannot be negative"},
		{"not a number", "name,population\nA,12x\n", "units.csv:2: population: \"A\": \"12x\" is not a population"},
		{"missing population", "name,population\nA,\n", "units.csv:2: population: \"A\": \"\" is not a population: missing"},
		{"empty name", "name,population\n,12\n", "units.csv:2: name: empty"},
		{"ragged", "name,population\nA,1\nB,2,3\n", "units.csv:3: row: "},
		{"unknown column", "name,population,colour\nA,1,red\n", "units.csv:1: column 3: unknown column \"colour\""},
		{"no population column", "name,pop\nA,1\n", "units.csv:1: column 2: unknown column"},
		{"missing column", "name\nA\n", "units.csv:1: population: missing column"},
		{"no rows", "name,population\n", "units.csv:2: no units"},
		{"empty", "", "units.csv:1: empty file"},
		{"bad min", "name,population,min\nA,1,two\n", "units.csv:2: min: \"A\": \"two\" is not a whole number"},
		{"huge", "name,population\nA,10000000000000000000\n", "at most 10^18"},
		{"json syntax", "{\n\"units\": [\n{\"name\": \"A\",}\n]}", "units.csv:3: column 14: expected a quoted member name"},
		{"json unknown member", "{\"units\": [], \"colour\": 1}", "units.csv:1: colour: unknown member"},
		{"json unit member", "{\"units\": [\n{\"name\": \"A\", \"population\": 3, \"pop\": 2}]}", "units.csv:2: units[0].pop: unknown member"},
		{"json bad population", "{\"units\": [\n{\"name\": \"A\",\n\"population\": -3}]}", "units.csv:3: units[0].population: \"A\": \"-3\" is not a population: populations cannot be negative"},
		{"json exponent", "{\"units\": [{\"name\": \"A\", \"population\": 1e6}]}", "is not a population"},
		{"json method", "{\"method\": \"lottery\", \"units\": [{\"name\": \"A\", \"population\": 1}]}", "units.csv:1: method: unknown method \"lottery\""},
		{"json version", "{\"version\": 2, \"units\": []}", "version: this is a version 2 document"},
		{"json seats", "{\"seats\": 2.5, \"units\": []}", "seats: \"2.5\" is not a whole number"},
		{"json no units", "{\"seats\": 5}", "units: missing"},
		{"json threshold", "{\"threshold\": \"150%\", \"units\": [{\"name\": \"A\", \"population\": 1}]}", "threshold: \"150%\" is more than the whole"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Read("units.csv", strings.NewReader(tc.in))
			if err == nil {
				t.Fatalf("no error, want %q", tc.want)
			}
			var ie *Error
			if !errors.As(err, &ie) {
				t.Fatalf("error %T %v is not an *input.Error", err, err)
			}
			if !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error = %q, want it to contain %q", err, tc.want)
			}
		})
	}
}

func TestLocate(t *testing.T) {
	in := "name,population\nA,10\nB,20\nA,30\n"
	src, err := ReadCSV("u.csv", strings.NewReader(in))
	if err != nil {
		t.Fatal(err)
	}
	src.Scenario.Seats, src.Scenario.Method = 3, engine.Webster
	_, err = engine.Allot(&src.Scenario, 0)
	got := src.Locate(err).Error()
	if want := "u.csv:4: name: \"A\": the same name as unit 1"; got != want {
		t.Errorf("Locate = %q, want %q", got, want)
	}
}

func TestJSONRoundTrip(t *testing.T) {
	two, nine := 2, 9
	s := engine.Scenario{
		Units: []engine.Unit{
			{Name: "Orlen <b>", Population: engine.Decimal{Coef: 12045535, Places: 1}, Min: &two},
			{Name: "Tamsk", Population: engine.Whole(880120), Max: &nine},
		},
		Seats: 12, Method: engine.Dean, Min: 1, Max: 10,
		Threshold: engine.Decimal{Coef: 5, Places: 2}, Tie: engine.TieRule{Kind: engine.TieByLot, Seed: 7},
	}
	doc := Encode("Test", &s)
	src, err := FromDoc("x", doc)
	if err != nil {
		t.Fatal(err)
	}
	got := Encode(src.Title, &src.Scenario)
	if a, b := string(marshal(doc)), string(marshal(got)); a != b {
		t.Errorf("round trip changed the scenario:\n%s\n%s", a, b)
	}
}

func TestParseShare(t *testing.T) {
	for in, want := range map[string]string{"5%": "0.05", "0.05": "0.05", ".5": "0.5", "12.5%": "0.125", "100%": "1"} {
		d, err := ParseShare(in)
		if err != nil || d.String() != want {
			t.Errorf("ParseShare(%q) = %v, %v; want %s", in, d, err, want)
		}
	}
}
