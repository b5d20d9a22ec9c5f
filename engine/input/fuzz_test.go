package input

import (
	"bytes"
	"testing"

	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
)

func marshal(v *jsondoc.Value) []byte { return jsondoc.Marshal(v) }

// FuzzReadCSV: any input gives an error or units, never a panic; the
// units found always allot or fail with an error.
func FuzzReadCSV(f *testing.F) {
	for _, s := range []string{
		"name,population\nA,10\nB,20.5\n",
		"\ufeffname,population,min,max\r\nA,1,0,3\r\nB,2,,\r\n",
		"name,population\n\"A,\"\"x\",7\n",
		"name,population\nA,-1\n",
		"name\nA\n",
	} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		src, err := ReadCSV("f.csv", bytes.NewReader(data))
		if err != nil {
			if _, ok := err.(*Error); !ok {
				t.Fatalf("error %T is not an *input.Error", err)
			}
			return
		}
		if len(src.Scenario.Units) > 50 {
			return
		}
		src.Scenario.Seats, src.Scenario.Method = 7, engine.Webster
		if res, err := engine.Allot(&src.Scenario, engine.Full); err == nil {
			sum := 0
			for _, u := range res.Units {
				sum += u.Seats
			}
			if sum+res.Unassigned != 7 {
				t.Fatalf("seats sum to %d + %d unassigned", sum, res.Unassigned)
			}
		}
	})
}

// FuzzReadJSON: any input gives an error or a scenario, never a panic.
func FuzzReadJSON(f *testing.F) {
	for _, s := range []string{
		`{"seats": 5, "method": "adams", "units": [{"name": "A", "population": 10}, {"name": "B", "population": "3.25"}]}`,
		`{"version": 1, "threshold": "5%", "tie": "lot:3", "units": [{"name": "A", "population": 1, "min": 1, "max": 2}]}`,
		`{"units": [{"name": "A", "population": 1e3}]}`,
		`[]`,
	} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		src, err := ReadJSON("f.json", bytes.NewReader(data))
		if err != nil {
			if _, ok := err.(*Error); !ok {
				t.Fatalf("error %T is not an *input.Error", err)
			}
			return
		}
		if len(src.Scenario.Units) > 50 || src.Scenario.Seats > 10000 {
			return
		}
		if src.Scenario.Seats == 0 {
			src.Scenario.Seats = 5
		}
		if !src.Scenario.Method.Valid() {
			src.Scenario.Method = engine.HuntingtonHill
		}
		_, _ = engine.Allot(&src.Scenario, engine.Full)
	})
}
