// Package analysisapi holds the functions of seatsmith's WebAssembly
// analysis module beyond the calculator module's: sweep (every unit's
// seats at every house size of a range) and the projection functions
// (projectStart, projectRun, projectResult, projectDrop), which make a
// projection block's draws in chunks so that a worker can report progress
// and stop between them, and election, an election block under its three
// systems (site/election). [Module] returns them with every calculator
// function, whose calculator then serves variation blocks (sweep, growth,
// admit) too.
package analysisapi
