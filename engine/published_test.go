package engine

import (
	"encoding/csv"
	"os"
	"strconv"
	"testing"
)

// loadCensus2020 reads testdata/us-2020-apportionment.csv.
//
// Source: U.S. Census Bureau, 2020 Census Apportionment Results, Table 1
// "Apportionment Population and Number of Representatives by State: 2020
// Census" (released April 26, 2021).
func loadCensus2020(t testing.TB) (units []Unit, seats map[string]int) {
	t.Helper()
	f, err := os.Open("../testdata/us-2020-apportionment.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	seats = map[string]int{}
	for _, r := range rows[1:] {
		p, err := ParseDecimal(r[1])
		if err != nil {
			t.Fatal(err)
		}
		n, _ := strconv.Atoi(r[2])
		units = append(units, Unit{Name: r[0], Population: p})
		seats[r[0]] = n
	}
	return units, seats
}

// TestCensus2020 checks the 2020 apportionment of the U.S. House: the method
// of equal proportions (Huntington–Hill), 435 seats, every state at least one
// (2 U.S.C. §2a). Source: U.S. Census Bureau, 2020 Census Apportionment
// Results, Table 1. The 435th seat went to Minnesota (its 8th) and New York
// fell 89 people short of keeping its 27th seat (same release, widely
// reported).
func TestCensus2020(t *testing.T) {
	units, want := loadCensus2020(t)
	res, err := Allot(&Scenario{Units: units, Seats: 435, Method: HuntingtonHill, Min: 1}, Full)
	if err != nil {
		t.Fatal(err)
	}
	if res.Total != "331108434" {
		t.Errorf("total = %s, want 331108434 (Table 1)", res.Total)
	}
	for _, u := range res.Units {
		if u.Seats != want[u.Name] {
			t.Errorf("%s: %d seats, want %d", u.Name, u.Seats, want[u.Name])
		}
	}
	if len(res.Ties) != 0 {
		t.Errorf("ties = %+v, want none", res.Ties)
	}
	last := res.Order[len(res.Order)-1]
	if last.Seat != 435 || last.Name != "Minnesota" || last.Nth != 8 {
		t.Errorf("seat 435 = %+v, want Minnesota's 8th", last)
	}
	if len(res.Beyond) == 0 || res.Beyond[0].Name != "New York" || res.Beyond[0].Nth != 27 {
		t.Errorf("seat 436 = %+v, want New York's 27th", res.Beyond)
	}
	for _, u := range res.Units {
		if u.Name == "New York" {
			if u.Gain == nil || u.Gain.String() != "89" {
				t.Errorf("New York gain margin = %v, want 89", u.Gain)
			}
		}
	}
	t.Logf("divisor range %s .. %s, certificate %s", res.Divisor.Low.Text, res.Divisor.High.Text, res.Divisor.Certificate)
}
