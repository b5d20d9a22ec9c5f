package main

import (
	"bytes"
	"regexp"
)

// remLength matches a length in rem: its number is the first group.
var remLength = regexp.MustCompile(`([0-9]*\.?[0-9]+)rem\b`)

// rootFree rewrites the calculators' stylesheet for a shadow root, where
// rem still follows the host page's root font size (a page that sets
// html { font-size: 62.5% } would shrink every calculator to ten pixels a
// rem): each rem length in a declaration becomes that many times
// --sc-root-size, which the bridge sets on :host to the reader's default
// font size, and stays 1rem where it is not set. At-rule preludes keep
// their lengths: a custom property cannot stand in a media query, and the
// container queries are written in em, which follow the calculator's own
// font size. The stylesheet keeps one at-rule prelude a line, as it is
// written.
func rootFree(css []byte) []byte {
	lines := bytes.SplitAfter(css, []byte("\n"))
	for i, l := range lines {
		if bytes.HasPrefix(bytes.TrimSpace(l), []byte("@")) {
			continue
		}
		lines[i] = remLength.ReplaceAll(l, []byte("calc(var(--sc-root-size,1rem)*$1)"))
	}
	return bytes.Join(lines, nil)
}
