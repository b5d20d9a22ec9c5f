package engine

import (
	"errors"
	"testing"
)

func ip(n int) *int { return &n }

func TestParseDecimalErrors(t *testing.T) {
	for _, c := range []struct {
		in   string
		want error
	}{
		{"", ErrEmpty}, {"   ", ErrEmpty}, {"-5", ErrNegative}, {"-0.5", ErrNegative},
		{"1e5", ErrNotANumber}, {"1,000", ErrNotANumber}, {"1 000", ErrNotANumber}, {".", ErrNotANumber},
		{"1.2.3", ErrNotANumber}, {"abc", ErrNotANumber}, {"+", ErrNotANumber}, {"0x10", ErrNotANumber},
		{"1.0000000001", ErrTooPrecise}, {"1000000000000000001", ErrTooLarge}, {"99999999999999999999", ErrTooLarge},
	} {
		if _, err := ParseDecimal(c.in); !errors.Is(err, c.want) {
			t.Errorf("ParseDecimal(%q) error %v, want %v", c.in, err, c.want)
		}
	}
	for in, want := range map[string]string{
		"0": "0", "-0": "0", "+12": "12", " 12.50 ": "12.5", "0.000000001": "0.000000001",
		"1000000000000000000": "1000000000000000000", "1.50000000000": "1.5", ".5": "0.5", "7.": "7",
	} {
		d, err := ParseDecimal(in)
		if err != nil || d.String() != want {
			t.Errorf("ParseDecimal(%q) = %v, %v; want %s", in, d, err, want)
		}
	}
}

func TestInvalidScenarios(t *testing.T) {
	units := func(pops ...uint64) []Unit {
		var us []Unit
		for i, p := range pops {
			us = append(us, Unit{Name: testNames[i], Population: Whole(p)})
		}
		return us
	}
	for _, c := range []struct {
		name  string
		s     Scenario
		field string
		unit  int
	}{
		{"no method", Scenario{Units: units(1), Seats: 1}, "method", -1},
		{"bad method", Scenario{Units: units(1), Seats: 1, Method: 99}, "method", -1},
		{"zero seats", Scenario{Units: units(1), Seats: 0, Method: Webster}, "seats", -1},
		{"negative seats", Scenario{Units: units(1), Seats: -3, Method: Webster}, "seats", -1},
		{"absurd seats", Scenario{Units: units(1), Seats: MaxSeats + 1, Method: Webster}, "seats", -1},
		{"no units", Scenario{Seats: 3, Method: Webster}, "units", -1},
		{"empty name", Scenario{Units: []Unit{{Name: " ", Population: Whole(1)}}, Seats: 1, Method: Webster}, "name", 0},
		{"duplicate name", Scenario{Units: []Unit{{Name: "Orlen", Population: Whole(1)}, {Name: "Orlen ", Population: Whole(2)}}, Seats: 1, Method: Webster}, "name", 1},
		{"too precise", Scenario{Units: []Unit{{Name: "Orlen", Population: Decimal{Coef: 1, Places: 10}}}, Seats: 1, Method: Webster}, "population", 0},
		{"too large", Scenario{Units: []Unit{{Name: "Orlen", Population: Whole(MaxCoefficient + 1)}}, Seats: 1, Method: Webster}, "population", 0},
		{"too many digits once scaled", Scenario{Units: []Unit{{Name: "Orlen", Population: Whole(MaxCoefficient)}, {Name: "Tamsk", Population: Decimal{Coef: 5, Places: 1}}}, Seats: 1, Method: Webster}, "population", 0},
		{"all zero", Scenario{Units: units(0, 0), Seats: 1, Method: Webster}, "population", -1},
		{"min above max", Scenario{Units: []Unit{{Name: "Orlen", Population: Whole(5), Min: ip(3), Max: ip(2)}}, Seats: 3, Method: Webster}, "min", 0},
		{"negative min", Scenario{Units: []Unit{{Name: "Orlen", Population: Whole(5), Min: ip(-1)}}, Seats: 3, Method: Webster}, "min", 0},
		{"negative max", Scenario{Units: []Unit{{Name: "Orlen", Population: Whole(5), Max: ip(-1)}}, Seats: 3, Method: Webster}, "max", 0},
		{"negative default min", Scenario{Units: units(5), Seats: 3, Method: Webster, Min: -1}, "min", -1},
		{"negative default max", Scenario{Units: units(5), Seats: 3, Method: Webster, Max: -1}, "max", -1},
		{"minimums over the house", Scenario{Units: units(5, 6, 7), Seats: 5, Method: Hamilton, Min: 2}, "min", -1},
		{"caps too tight", Scenario{Units: units(5, 6, 7), Seats: 10, Method: Jefferson, Max: 3}, "max", -1},
		{"caps too tight (remainder)", Scenario{Units: units(5, 6, 7), Seats: 10, Method: Hamilton, Max: 3}, "max", -1},
		{"adams with too few seats", Scenario{Units: units(5, 6, 7), Seats: 2, Method: Adams}, "seats", -1},
		{"dean with too few seats", Scenario{Units: units(5, 6, 7), Seats: 2, Method: Dean}, "seats", -1},
		{"huntington-hill with too few seats", Scenario{Units: units(5, 6, 7), Seats: 2, Method: HuntingtonHill}, "seats", -1},
		{"threshold above one", Scenario{Units: units(5), Seats: 2, Method: Webster, Threshold: Decimal{Coef: 11, Places: 1}}, "threshold", -1},
		{"threshold excludes all", Scenario{Units: units(5, 5, 5), Seats: 2, Method: Webster, Threshold: Decimal{Coef: 1}}, "threshold", -1},
		{"bad tie rule", Scenario{Units: units(5), Seats: 2, Method: Webster, Tie: TieRule{Kind: 9}}, "tie", -1},
	} {
		t.Run(c.name, func(t *testing.T) {
			res, err := Allot(&c.s, Full)
			var e *Error
			if !errors.As(err, &e) {
				t.Fatalf("Allot = %v, %v; want an *Error", res, err)
			}
			if e.Field != c.field || e.Unit != c.unit {
				t.Errorf("error %q: field %q unit %d, want field %q unit %d", e, e.Field, e.Unit, c.field, c.unit)
			}
			if e.Error() == "" {
				t.Error("empty message")
			}
		})
	}
}

func TestParseMethod(t *testing.T) {
	for in, want := range map[string]Method{
		"hamilton": Hamilton, "Hare-Niemeyer": Hamilton, "droop": Droop, "D'Hondt": Jefferson, "dhondt": Jefferson,
		"Sainte-Laguë": Webster, "webster": Webster, "adams": Adams, "dean": Dean, "Huntington Hill": HuntingtonHill,
		"huntington_hill": HuntingtonHill, "huntington–hill": HuntingtonHill, "equal-proportions": HuntingtonHill,
		"modified-sainte-lague": ModifiedSainteLague,
	} {
		if m, err := ParseMethod(in); err != nil || m != want {
			t.Errorf("ParseMethod(%q) = %v, %v; want %v", in, m, err, want)
		}
	}
	for _, m := range Methods() {
		if back, err := ParseMethod(m.String()); err != nil || back != m {
			t.Errorf("round trip %v: %v, %v", m, back, err)
		}
	}
	_, err := ParseMethod("plurality")
	if e, ok := err.(*Error); !ok || e.Field != "method" {
		t.Errorf("ParseMethod(plurality) error %v", err)
	}
}

func TestErrorMsg(t *testing.T) {
	for _, c := range []struct {
		err  error
		want string
	}{
		{&Error{Unit: 1, Name: "North", Field: "population", Msg: "must be positive"}, "must be positive"},
		{errors.Join(errors.New("reading"), &Error{Unit: -1, Field: "seats", Msg: "too many"}), "too many"},
		{errors.New("plain"), "plain"},
	} {
		if got := ErrorMsg(c.err); got != c.want {
			t.Errorf("ErrorMsg(%v) = %q, want %q", c.err, got, c.want)
		}
	}
}
