package analysisapi

import (
	"strconv"
	"strings"
	"testing"

	"seatsmith/engine/jsondoc"
)

// smallElection is an invented election of two districts and three parties.
const smallElection = `{"threshold": "5%", "compensatory": 2,
 "districts": [{"name": "North", "seats": 5}, {"name": "South", "seats": 3}],
 "votes": [{"district": "North", "party": "Lark", "votes": 5200}, {"district": "North", "party": "Fern", "votes": 3100},
  {"district": "North", "party": "Moth", "votes": 900}, {"district": "South", "party": "Lark", "votes": 2100},
  {"district": "South", "party": "Fern", "votes": 2900}, {"district": "South", "party": "Moth", "votes": 700}],
 "claims": [{"id": "sums", "kind": "district-sums"}, {"id": "cert", "kind": "certificate"},
  {"id": "lark", "kind": "seats", "party": "Lark", "seats": {"districts": 99}}]}`

func TestElectionCall(t *testing.T) {
	tests := []struct {
		name string
		doc  *jsondoc.Value
		want string // in the error message; "" for an answer
	}{
		{"as text", jsondoc.Str(smallElection), ""},
		{"as object", must(t, smallElection), ""},
		{"malformed", jsondoc.Str(`{"districts": [`), "malformed"},
		{"bad votes", jsondoc.Str(strings.Replace(smallElection, `5200`, `"5,200"`, 1)), "votes"},
		{"bad threshold", jsondoc.Str(strings.Replace(smallElection, `"5%"`, `"half"`, 1)), "threshold"},
		{"system given", jsondoc.Str(strings.Replace(smallElection, `{"threshold"`, `{"system": "districts", "threshold"`, 1)), "system"},
		{"too many districts", jsondoc.Str(manyDistricts(61)), "limits().election_districts"},
		{"too many seats", jsondoc.Str(strings.Replace(smallElection, `"seats": 5}`, `"seats": 5000}`, 1)), "limits().election_seats"},
		{"not an object", jsondoc.Str(`[1, 2]`), "object"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			arg := jsondoc.NewObject().Set("block", jsondoc.Str("x")).Set("doc", tc.doc)
			got := call(electionCall, arg)
			e := got.Get("error")
			if tc.want != "" {
				if e == nil || !strings.Contains(string(jsondoc.Marshal(e)), tc.want) {
					t.Fatalf("want an error with %q, got %.300s", tc.want, jsondoc.Marshal(got))
				}
				return
			}
			if e != nil {
				t.Fatalf("failed: %s", jsondoc.Marshal(got))
			}
			holds := map[string]bool{}
			for _, c := range got.Get("claims").Items {
				holds[c.Get("id").Text] = c.Get("holds").Bool
			}
			if !holds["sums"] || !holds["cert"] || holds["lark"] {
				t.Errorf("claims %s", jsondoc.Marshal(got.Get("claims")))
			}
			if v := string(jsondoc.Marshal(got.Get("view"))); !strings.Contains(v, "election-matrix") || !strings.Contains(v, "x-biproportional") {
				t.Errorf("view %.300s", v)
			}
		})
	}
	if got := call(electionCall, jsondoc.NewObject()); got.Get("error") == nil {
		t.Errorf("no doc: %s", jsondoc.Marshal(got))
	}
}

func must(t *testing.T, s string) *jsondoc.Value {
	v, err := jsondoc.Parse([]byte(s))
	if err != nil {
		t.Fatal(err)
	}
	return v
}

func manyDistricts(n int) string {
	var ds, vs []string
	for i := range n {
		name := "D" + strconv.Itoa(i)
		ds = append(ds, `{"name": "`+name+`", "seats": 1}`)
		vs = append(vs, `{"district": "`+name+`", "party": "Lark", "votes": 10}`)
	}
	return `{"districts": [` + strings.Join(ds, ",") + `], "votes": [` + strings.Join(vs, ",") + `]}`
}
