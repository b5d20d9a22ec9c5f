// Package text writes seatsmith's result documents as plain text for a
// terminal: the title underlined, paragraphs wrapped to 76 characters,
// each item of a list on a line of its own (whole, so that a finding is
// one line to search for), tables with aligned columns (numbers to the
// right), and the not-official caution last. Tables whose rows are made one at a time are
// written without being held: their rows are made twice, once to measure
// the columns and once to write them.
package text
