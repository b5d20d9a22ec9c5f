package projection

import (
	"errors"
	"math/big"
	"strconv"
	"strings"
)

// A Date is a calendar day in the proleptic Gregorian calendar.
type Date struct {
	Year, Month, Day int // Month and Day count from 1
}

// ParseDate reads a date written as YYYY-MM-DD, YYYY-MM (the first of the
// month) or YYYY (the first of January), with a year from 1 to 9999.
func ParseDate(s string) (Date, error) {
	t := strings.TrimSpace(s)
	parts := strings.Split(t, "-")
	bad := errors.New(strconv.Quote(t) + " is not a date: write YYYY-MM-DD, YYYY-MM or YYYY")
	if t == "" {
		return Date{}, errors.New("missing date")
	}
	if len(parts) > 3 {
		return Date{}, bad
	}
	nums := make([]int, 3)
	nums[1], nums[2] = 1, 1
	widths := []int{4, 2, 2}
	for i, p := range parts {
		if len(p) != widths[i] {
			return Date{}, bad
		}
		for _, c := range p {
			if c < '0' || c > '9' {
				return Date{}, bad
			}
		}
		nums[i], _ = strconv.Atoi(p)
	}
	d := Date{nums[0], nums[1], nums[2]}
	if d.Year < 1 || d.Month < 1 || d.Month > 12 || d.Day < 1 || d.Day > daysIn(d.Year, d.Month) {
		return Date{}, errors.New(strconv.Quote(t) + " is not a day of the calendar")
	}
	return d, nil
}

// String writes the date as YYYY-MM-DD.
func (d Date) String() string {
	pad := func(n, w int) string {
		s := strconv.Itoa(n)
		for len(s) < w {
			s = "0" + s
		}
		return s
	}
	return pad(d.Year, 4) + "-" + pad(d.Month, 2) + "-" + pad(d.Day, 2)
}

// Before reports whether d comes before e.
func (d Date) Before(e Date) bool { return d.cmp(e) < 0 }

func (d Date) cmp(e Date) int {
	for _, c := range [][2]int{{d.Year, e.Year}, {d.Month, e.Month}, {d.Day, e.Day}} {
		if c[0] != c[1] {
			if c[0] < c[1] {
				return -1
			}
			return 1
		}
	}
	return 0
}

func leap(y int) bool { return y%4 == 0 && (y%100 != 0 || y%400 == 0) }

func daysIn(y, m int) int {
	switch m {
	case 2:
		if leap(y) {
			return 29
		}
		return 28
	case 4, 6, 9, 11:
		return 30
	}
	return 31
}

// dayOfYear counts from 1 for the first of January.
func (d Date) dayOfYear() int {
	n := d.Day
	for m := 1; m < d.Month; m++ {
		n += daysIn(d.Year, m)
	}
	return n
}

// Years returns the date as a decimal year: Year + (day of year - 1) /
// (days in the year). The first of January 2030 is 2030 exactly; the first
// of July 2030 is 2030 + 181/365.
func (d Date) Years() *big.Rat {
	days := 365
	if leap(d.Year) {
		days = 366
	}
	r := big.NewRat(int64(d.dayOfYear()-1), int64(days))
	return r.Add(r, new(big.Rat).SetInt64(int64(d.Year)))
}

// yearsFloat is Years as a float64.
func (d Date) yearsFloat() float64 {
	f, _ := d.Years().Float64()
	return f
}
