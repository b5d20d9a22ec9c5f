package format

import (
	"strconv"
	"strings"
)

// Caution is shown with every result: the last paragraph of every text
// and Markdown document, a member of every JSON document, the caption of
// every chart.
const Caution = "Not an official apportionment. seatsmith computes what the chosen method gives for the numbers supplied; " +
	"the governing statute or constitution, the official counts and the responsible authority decide. " +
	"Rely on election officials and counsel, not on this tool."

// Wrap breaks text into lines of at most width characters at spaces.
func Wrap(text string, width int) string {
	var b strings.Builder
	n := 0
	for i, w := range strings.Fields(text) {
		l := len([]rune(w))
		if i > 0 {
			if n+1+l > width {
				b.WriteString("\n")
				n = 0
			} else {
				b.WriteString(" ")
				n++
			}
		}
		b.WriteString(w)
		n += l
	}
	return b.String()
}

// Plural writes a count with its noun: "1 seat", "3 seats".
func Plural(n int, w string) string {
	if n == 1 {
		return "1 " + w
	}
	return strconv.Itoa(n) + " " + w + "s"
}

// capital returns s with its first letter in upper case.
func capital(s string) string {
	if s == "" || s[0] < 'a' || s[0] > 'z' {
		return s
	}
	return string(s[0]-'a'+'A') + s[1:]
}

func countText(n int, one, many string) string {
	switch n {
	case 0:
		return "no " + many
	case 1:
		return "1 " + one
	}
	return strconv.Itoa(n) + " " + many
}

func errText(err error) string {
	if err == nil {
		return ""
	}
	return err.Error()
}

// fixed writes f with the given decimal places.
func fixed(f float64, places int) string { return strconv.FormatFloat(f, 'f', places, 64) }

// round6 keeps six significant digits for display.
func round6(f float64) float64 {
	s := strconv.FormatFloat(f, 'g', 6, 64)
	g, _ := strconv.ParseFloat(s, 64)
	return g
}
