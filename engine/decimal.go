package engine

import (
	"cmp"
	"errors"
	"strconv"
)

// MaxCoefficient is the largest coefficient a [Decimal] may hold, and the
// largest population any unit may have once all populations are written with
// the same number of decimal places: 10^18.
const MaxCoefficient = 1_000_000_000_000_000_000

// MaxPlaces is the largest number of decimal places a population may have.
const MaxPlaces = 9

// A Decimal is an exact non-negative decimal number Coef × 10^-Places.
// Whole-number populations have Places == 0.
type Decimal struct {
	Coef   uint64
	Places uint8
}

// Whole returns the Decimal for the whole number n.
func Whole(n uint64) Decimal { return Decimal{Coef: n} }

// Errors returned by [ParseDecimal].
var (
	ErrEmpty      = errors.New("empty")
	ErrNegative   = errors.New("negative")
	ErrNotANumber = errors.New("not a number")
	ErrTooPrecise = errors.New("more than 9 decimal places")
	ErrTooLarge   = errors.New("larger than 10^18")
)

// ParseDecimal reads a non-negative decimal such as "1250", "1250.75" or
// "0.5". Signs other than a leading '+', exponents, thousands separators and
// spaces inside the number are refused. Surrounding spaces are ignored.
func ParseDecimal(s string) (Decimal, error) {
	for len(s) > 0 && (s[0] == ' ' || s[0] == '\t') {
		s = s[1:]
	}
	for len(s) > 0 && (s[len(s)-1] == ' ' || s[len(s)-1] == '\t') {
		s = s[:len(s)-1]
	}
	if s == "" {
		return Decimal{}, ErrEmpty
	}
	if s[0] == '-' {
		if len(s) > 1 && isAllZeroDigits(s[1:]) {
			return Decimal{}, nil
		}
		return Decimal{}, ErrNegative
	}
	if s[0] == '+' {
		s = s[1:]
	}
	var coef uint64
	places := -1
	digits := 0
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c == '.':
			if places >= 0 {
				return Decimal{}, ErrNotANumber
			}
			places = 0
		case c >= '0' && c <= '9':
			digits++
			if places >= 0 {
				places++
				if places > MaxPlaces {
					// Trailing zeros beyond the limit are harmless.
					if c == '0' && isAllZeroDigits(s[i:]) {
						places = MaxPlaces
						i = len(s)
						continue
					}
					return Decimal{}, ErrTooPrecise
				}
			}
			if coef > (MaxCoefficient-uint64(c-'0'))/10 {
				return Decimal{}, ErrTooLarge
			}
			coef = coef*10 + uint64(c-'0')
		default:
			return Decimal{}, ErrNotANumber
		}
	}
	if digits == 0 {
		return Decimal{}, ErrNotANumber
	}
	if places < 0 {
		places = 0
	}
	d := Decimal{Coef: coef, Places: uint8(places)}
	return d.trim(), nil
}

func isAllZeroDigits(s string) bool {
	for i := 0; i < len(s); i++ {
		if s[i] != '0' && s[i] != '.' {
			return false
		}
	}
	return len(s) > 0
}

// trim drops trailing zero decimal places: 12.50 becomes 12.5.
func (d Decimal) trim() Decimal {
	for d.Places > 0 && d.Coef%10 == 0 {
		d.Coef /= 10
		d.Places--
	}
	return d
}

// IsZero reports whether d is zero.
func (d Decimal) IsZero() bool { return d.Coef == 0 }

// String formats d exactly, with no exponent and no trailing zeros.
func (d Decimal) String() string { return formatScaled(d.Coef, int(d.Places)) }

// formatScaled writes coef × 10^-places exactly.
func formatScaled(coef uint64, places int) string {
	s := strconv.FormatUint(coef, 10)
	if places == 0 {
		return s
	}
	for len(s) <= places {
		s = "0" + s
	}
	whole, frac := s[:len(s)-places], s[len(s)-places:]
	for len(frac) > 0 && frac[len(frac)-1] == '0' {
		frac = frac[:len(frac)-1]
	}
	if frac == "" {
		return whole
	}
	return whole + "." + frac
}

// Cmp compares d and e exactly and returns -1, 0 or +1.
func (d Decimal) Cmp(e Decimal) int {
	a, b := d.Coef, e.Coef
	pa, pb := d.Places, e.Places
	for pa < pb {
		hi, lo := mulWide(a, 10)
		if hi != 0 {
			return 1
		}
		a, pa = lo, pa+1
	}
	for pb < pa {
		hi, lo := mulWide(b, 10)
		if hi != 0 {
			return -1
		}
		b, pb = lo, pb+1
	}
	return cmp.Compare(a, b)
}

// pow10 returns 10^n for 0 <= n <= 19.
func pow10(n int) uint64 {
	p := uint64(1)
	for ; n > 0; n-- {
		p *= 10
	}
	return p
}
