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

// TestDHondtSpanishElectoralLaw reproduces the worked example printed in the
// Spanish electoral law, Ley Orgánica 5/1985 del Régimen Electoral General,
// article 163.1 (from memory of the statute's text): 480,000 valid votes in
// a district electing eight deputies, shared among six lists A 168,000,
// B 104,000, C 72,000, D 64,000, E 40,000, F 32,000. The statute's table of
// quotients gives A 4 seats, B 2, C 1, D 1.
func TestDHondtSpanishElectoralLaw(t *testing.T) {
	votes := []uint64{168000, 104000, 72000, 64000, 40000, 32000}
	want := []int{4, 2, 1, 1, 0, 0}
	var units []Unit
	for k, v := range votes {
		units = append(units, Unit{Name: string(rune('A' + k)), Population: Whole(v)})
	}
	for _, alias := range []string{"dhondt", "jefferson"} {
		m, err := ParseMethod(alias)
		if err != nil {
			t.Fatal(err)
		}
		res, err := Allot(&Scenario{Units: units, Seats: 8, Method: m}, Full)
		if err != nil {
			t.Fatal(err)
		}
		for k, u := range res.Units {
			if u.Seats != want[k] {
				t.Errorf("%s: list %s has %d seats, want %d", alias, u.Name, u.Seats, want[k])
			}
		}
		// The eighth seat goes at quotient 42,000 (A's fourth); the next
		// quotient in the statute's table is E's 40,000.
		last := res.Order[len(res.Order)-1]
		if last.Name != "A" || last.Nth != 4 || last.Priority.Text != "42000" {
			t.Errorf("%s: eighth seat %+v, want A's fourth at 42000", alias, last)
		}
		if res.Beyond[0].Name != "E" || res.Beyond[0].Priority.Text != "40000" {
			t.Errorf("%s: ninth quotient %+v, want E at 40000", alias, res.Beyond[0])
		}
	}
}

// TestTextbookFourParties checks the four-party example that reference
// works use to contrast the two divisor rules (votes A 100,000, B 80,000,
// C 30,000, D 20,000; eight seats): D'Hondt gives 4, 3, 1, 0 and
// Sainte-Laguë 3, 3, 1, 1. Source: the worked examples in the encyclopedia
// articles "D'Hondt method" and "Sainte-Laguë method" (from memory); both
// results follow by hand from the quotient tables, which the test checks
// through the seat order.
func TestTextbookFourParties(t *testing.T) {
	units := []Unit{
		{Name: "A", Population: Whole(100000)}, {Name: "B", Population: Whole(80000)},
		{Name: "C", Population: Whole(30000)}, {Name: "D", Population: Whole(20000)},
	}
	for _, tc := range []struct {
		m    Method
		want []int
	}{
		{Jefferson, []int{4, 3, 1, 0}},
		{Webster, []int{3, 3, 1, 1}},
	} {
		res, err := Allot(&Scenario{Units: units, Seats: 8, Method: tc.m}, Full)
		if err != nil {
			t.Fatal(err)
		}
		for k, u := range res.Units {
			if u.Seats != tc.want[k] {
				t.Errorf("%s: %s has %d seats, want %d", tc.m, u.Name, u.Seats, tc.want[k])
			}
		}
		if len(res.Ties) != 0 {
			t.Errorf("%s: unexpected tie %+v", tc.m, res.Ties)
		}
	}
}

// TestModifiedSainteLagueDivisors checks the divisor series 1.4, 3, 5, 7 of
// modified Sainte-Laguë, as laid down for example in the Norwegian Election
// Act (valgloven, section 11-4; from memory): a party's first quotient is
// its votes divided by 1.4. Priority values here are p/s(a) with s(0) = 0.7,
// that is twice the statute's quotients; the order of seats is the same.
func TestModifiedSainteLagueDivisors(t *testing.T) {
	res, err := Allot(&Scenario{Seats: 3, Method: ModifiedSainteLague, Units: []Unit{
		{Name: "Large", Population: Whole(14000)}, {Name: "Small", Population: Whole(4300)},
	}}, Full)
	if err != nil {
		t.Fatal(err)
	}
	// Quotients: Large 14000/1.4 = 10000, 14000/3 = 4666.7, 14000/5 = 2800;
	// Small 4300/1.4 = 3071.4. Seats: Large, Large, Small.
	got := []string{}
	for _, a := range res.Order {
		got = append(got, a.Name+":"+a.Priority.Text)
	}
	want := []string{"Large:20000", "Large:9333.333", "Small:6142.857"}
	if len(got) != 3 || got[0] != want[0] || got[1] != want[1] || got[2] != want[2] {
		t.Errorf("seat order %v, want %v", got, want)
	}
	if res.Units[0].Seats != 2 || res.Units[1].Seats != 1 {
		t.Errorf("seats %d-%d, want 2-1", res.Units[0].Seats, res.Units[1].Seats)
	}
}
