package render

import "strings"

// Group writes a decimal string with its whole part in groups of three
// digits separated by commas: "2694457.5" becomes "2,694,457.5". Text that
// is not a plain non-negative decimal is returned unchanged.
func Group(s string) string {
	whole, frac := s, ""
	if i := strings.IndexByte(s, '.'); i >= 0 {
		whole, frac = s[:i], s[i:]
	}
	if len(whole) <= 3 {
		return s
	}
	for i := 0; i < len(whole); i++ {
		if whole[i] < '0' || whole[i] > '9' {
			return s
		}
	}
	var b strings.Builder
	first := len(whole) % 3
	if first > 0 {
		b.WriteString(whole[:first])
	}
	for i := first; i < len(whole); i += 3 {
		if b.Len() > 0 {
			b.WriteByte(',')
		}
		b.WriteString(whole[i : i+3])
	}
	b.WriteString(frac)
	return b.String()
}
