// Package election is the election block of the seatsmith site: one
// election with districts (its votes, the districts' seats, a threshold
// and a number of compensatory seats) turned into seats under three
// systems side by side: per-district D'Hondt, two-tier compensation
// (D'Hondt in the districts, then compensatory seats so that each party's
// national total follows its votes by Sainte-Laguë) and biproportional
// Sainte-Laguë (the parties' seats over the election, then a divisor for
// every district and every party, the certificate).
//
// A block is a JSON document (see [Parse]) read with the engine's election
// package (election.FromDoc). The site build computes it with the native
// engine and writes [Output] as HTML, so that the page is right with
// JavaScript off; in the browser the analysis WebAssembly module computes
// the same [Output] tree after every edit of the votes, the districts'
// seats, the threshold or the compensatory seats, and the page builds it
// into DOM nodes without parsing HTML.
//
// Claims ([Claim]) state a party's seats under the systems, a district's
// seats, the certificate or the ties; the build fails on a claim that does
// not hold, and the page shows their verdicts again after every edit.
//
// The package uses no reflection (no fmt) so that it compiles into the
// WebAssembly module. Its results are not official: the governing law,
// the official counts and the responsible authority decide.
package election
