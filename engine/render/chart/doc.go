// Package chart draws seatsmith's charts into the markup tree of package
// render, once for both faces: the pages put the tree in the document (as
// HTML prerendered, as DOM nodes live), and the command-line tool writes
// it as a standalone SVG file (render.SVG) with [Style], the rules the
// site's stylesheet gives the same classes.
//
// The sweep chart has one panel a method, each a step line a unit: its
// seats at every house size in a range. A ring marks each Alabama
// paradox (where a unit's line steps down as the house grows) over a pale
// column, a triangle each quota violation (pointing up above the upper
// quota, down below the lower), a short mark at the top each size with a
// tie, and a grey band each size the method cannot apportion. Colours
// come from classes (sc-u0 … sc-u11, then the same colours dashed), so the
// pages need no inline style. Floating-point numbers only place the marks.
//
// Like package render, chart avoids reflection, for the WebAssembly
// engine.
package chart
