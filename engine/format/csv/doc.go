// Package csv writes the data table of seatsmith's result documents as
// CSV (RFC 4180): a header row, then one record a row, fields quoted when
// they hold a comma, a quote or a line break or begin with white space.
// Cells of numeric columns are plain numbers and are written as they are;
// a cell of a text column that a spreadsheet would run as a formula
// (starting with =, +, -, @, a tab or a carriage return) gets a leading
// apostrophe. The package uses no reflection, so that the WebAssembly
// engine can write the same files as the command-line tool.
package csv
