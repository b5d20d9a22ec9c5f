// Package svg writes the chart of seatsmith's result documents as a
// standalone SVG file: the same chart the pages draw (package
// engine/render/chart), written by render.SVG.
package svg
