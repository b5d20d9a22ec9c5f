package election

import (
	"testing"

	"seatsmith/engine"
)

// Cases of the lower apportionment worked by hand (common practice: the
// definitions in the package documentation).
func TestLowerCases(t *testing.T) {
	for _, tc := range []struct {
		name   string
		m      engine.Method
		v      [][]uint64
		r, c   []int
		want   [][]int // nil: no lower apportionment exists
		ties   int
		strict bool
	}{
		// Every cell has the same votes: the seats can sit on either
		// diagonal, a tie of two seats.
		{"diagonal tie", engine.Webster, [][]uint64{{1, 1}, {1, 1}}, []int{1, 1}, []int{1, 1}, [][]int{{0, 0}, {0, 0}}, 1, false},
		// One district: the plain method.
		{"one row", engine.Jefferson, [][]uint64{{600, 300, 100}}, []int{10}, []int{6, 3, 1}, [][]int{{6, 3, 1}}, 0, true},
		// Adams gives every cell with votes a seat first.
		{"adams floor", engine.Adams, [][]uint64{{10, 1}, {1, 10}}, []int{3, 3}, []int{3, 3}, [][]int{{2, 1}, {1, 2}}, 0, true},
		// A district without seats and without votes.
		{"empty district", engine.Webster, [][]uint64{{5, 5}, {0, 0}}, []int{2, 0}, []int{1, 1}, [][]int{{1, 1}, {0, 0}}, 0, true},
		// The second party needs 3 seats in the second district and one
		// in the first (Huntington–Hill gives every cell with votes a
		// seat), but has only 3: no lower apportionment exists, although
		// every district and party has enough cells; the estimate runs
		// away and the exact procedure finds no path.
		{"runaway", engine.HuntingtonHill, [][]uint64{{1, 1}, {0, 1}}, []int{2, 3}, []int{2, 3}, nil, 0, false},
		// Seats where a party has no votes.
		{"no votes", engine.Webster, [][]uint64{{5, 0}, {5, 0}}, []int{1, 1}, []int{1, 1}, nil, 0, false},
	} {
		lp := &lowerProblem{v: tc.v, r: tc.r, c: tc.c, rd: roundingOf(tc.m)}
		res, err := solveLower(lp, nil)
		if tc.want == nil {
			if err != errInfeasible {
				t.Errorf("%s: error %v, want no lower apportionment", tc.name, err)
			}
			continue
		}
		if err != nil {
			t.Errorf("%s: %v", tc.name, err)
			continue
		}
		for i := range tc.want {
			for j := range tc.want[i] {
				if res.x[i][j] != tc.want[i][j] {
					t.Errorf("%s: cell %d,%d: %d seats, want %d", tc.name, i, j, res.x[i][j], tc.want[i][j])
				}
			}
		}
		if len(res.ties) != tc.ties || res.strict != tc.strict {
			t.Errorf("%s: %d ties, strict %v; want %d, %v", tc.name, len(res.ties), res.strict, tc.ties, tc.strict)
		}
	}
}

// Votes with decimal places: the district divisors are written for the
// votes as given, not as scaled to whole numbers.
func TestDecimalVotesDivisors(t *testing.T) {
	s := &Scenario{System: Biproportional, Method: engine.Webster,
		Districts: []District{{Name: "A", Seats: 3}, {Name: "B", Seats: 2}},
		Votes: []Vote{
			{District: "A", Party: "P", Votes: engine.Decimal{Coef: 2505, Places: 1}},
			{District: "A", Party: "Q", Votes: engine.Decimal{Coef: 1205, Places: 1}},
			{District: "B", Party: "P", Votes: engine.Decimal{Coef: 801, Places: 1}},
			{District: "B", Party: "Q", Votes: engine.Decimal{Coef: 1590, Places: 1}},
		}}
	res, err := Compute(s)
	if err != nil {
		t.Fatal(err)
	}
	if err := Verify(res); err != nil {
		t.Fatal(err)
	}
	d, _ := parseDivisor(res.Districts[0].Divisor, false)
	if f, _ := d.Float64(); f < 10 || f > 200 {
		t.Errorf("district divisor %s for about 370 votes and 3 seats", res.Districts[0].Divisor)
	}
}
