package main

import (
	"strconv"
	"strings"
)

// accepts reports whether Accept-Encoding header values (RFC 9110,
// section 12.5.3) allow the content coding: named with a quality above
// zero, or matched by "*" with a quality above zero when not named. A
// quality that cannot be read counts as zero: the file as it is, never
// refused, is the safe answer. "x-gzip" is gzip.
func accepts(values []string, coding string) bool {
	named, star := -1.0, -1.0
	for _, v := range values {
		for _, item := range strings.Split(v, ",") {
			name, params, _ := strings.Cut(item, ";")
			name = strings.ToLower(strings.TrimSpace(name))
			if name == "x-gzip" {
				name = "gzip"
			}
			switch name {
			case coding:
				named = max(named, quality(params))
			case "*":
				star = max(star, quality(params))
			}
		}
	}
	if named >= 0 {
		return named > 0
	}
	return star > 0
}

// quality reads the q parameter of an Accept-Encoding item's parameters
// (1 when absent, 0 when unreadable).
func quality(params string) float64 {
	for _, p := range strings.Split(params, ";") {
		k, v, ok := strings.Cut(strings.TrimSpace(p), "=")
		if !ok || !strings.EqualFold(strings.TrimSpace(k), "q") {
			continue
		}
		q, err := strconv.ParseFloat(strings.TrimSpace(v), 64)
		if err != nil || q < 0 || q > 1 {
			return 0
		}
		return q
	}
	return 1
}
