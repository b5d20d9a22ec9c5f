// Package jsondoc is a small JSON document model: a tree of values that keeps
// object keys in order, keeps numbers as their exact decimal text, and
// remembers the line of every value it parses.
//
// seatsmith uses it instead of encoding/json for three reasons: exact
// populations survive parsing (no float64 in between), errors can name the
// line and field at fault, and the WebAssembly build stays free of
// reflection. The same tree is written as JSON by the command-line tool and
// converted to plain JavaScript objects by the WebAssembly bridge, so both
// faces return the same content.
package jsondoc
