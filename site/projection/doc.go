// Package projection is the projection block of the seatsmith site: a set of
// dated counts projected to a target date, a seeded Monte Carlo study of a
// count error around the projection, and every unit's chance of each seat
// count and of gaining or losing a seat against the apportionment of the
// latest counts.
//
// A block is a JSON document (see [Parse]). The site build runs it with the
// native engine and writes [Output] as HTML, so that the page is right with
// JavaScript off; in the browser a Web Worker runs the same study inside
// the WebAssembly engine, in chunks of draws, and hands the page the same
// [Output] tree as JSON, which the page builds into DOM nodes without
// parsing HTML. Draw number i depends on the seed and i alone, so the same
// seed gives the same numbers natively and in the browser.
//
// Claims ([Claim]) state a unit's chance of losing or gaining a seat, or
// of a seat count, against a probability; the build checks them with the
// block's fixed seed and fails on a false one, and the page shows their
// verdicts again after every live run.
//
// The package uses no reflection (no fmt) so that it compiles into the
// WebAssembly engine. Results are estimates under an assumed growth and
// error model, not official figures: the governing law, the official counts
// and the responsible authority decide any apportionment.
package projection
