// Package render builds the markup of seatsmith's calculators as a small
// tree of elements and text, and writes that tree either as escaped HTML
// (for pages rendered ahead of time) or as a JSON document (for the
// browser, which builds DOM nodes from it without ever parsing HTML); SVG
// writes a tree whose root is an <svg> element as a standalone file (the
// command-line tool's charts, drawn by package engine/render/chart).
//
// Both forms come from the same tree, so a calculator rendered at build
// time and the same calculator rendered live in the browser carry the same
// elements, attributes and text. Text and attribute values are always
// escaped; no caller can insert raw markup.
//
// The package avoids reflection (no fmt, no html/template) so that it can
// be compiled into the WebAssembly engine. For the same reason the small
// constructors (El, Wrap, Text, Add, AddText, Set, SetIf) are not inlined
// (their directive is go:noinline): the calculators call them thousands
// of times, and inlined copies of their loops and appends made up half of
// the calculators' code in the .wasm (go run ./tools/wasmsize -packages
// 10 shows the effect).
//
// # The JSON form
//
// A text node is a JSON string. An element is an array whose first item is
// the tag name, whose second item is an object of attributes (in order),
// and whose remaining items are the children:
//
//	["p", {"class": "note"}, "Seats: ", ["strong", {}, "12"]]
package render
