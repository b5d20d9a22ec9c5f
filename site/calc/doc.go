// Package calc is the calculator that seatsmith's pages carry: it reads a
// calculator block (a scenario document with claims), apportions it with
// the engine, checks the claims and lays the result out as a render tree.
//
// The site build tool uses it to render every calculator ahead of time, and
// the WebAssembly engine uses it (through [Live]) to render the same
// calculator in the browser after every edit. One code path for both is
// what guarantees that prerendered numbers equal live ones.
//
// # Calculator blocks
//
// A block is a scenario document (see package seatsmith/engine/input) that
// must give seats and method, with three more optional members:
//
//	claims    an array of claims (see package seatsmith/site/claim)
//	compare   the method ids the comparison shows (default: every method)
//	count     what the units' numbers count: "population" (the default),
//	          "votes", "students" or "applications"; the calculator speaks
//	          of it wherever it speaks of a unit's number (see [Count])
//
// # Study blocks
//
// Three more modes look at a scenario beyond one apportionment. Each adds
// members to the scenario document, which the reader can edit like the
// rest:
//
//	sweep   from, to (required) and methods (default: every method): every
//	        method's seats at every house size from..to (at most
//	        MaxSweepSizes of them), drawn as a step chart, with the Alabama
//	        paradoxes and quota violations found listed in words; seats
//	        and method are optional (claims name their own)
//	growth  a later population for each unit ("later" beside
//	        "population"; a unit without one keeps its population): the
//	        house apportioned with both counts and every population
//	        paradox between them
//	admit   admit: {name, population, added}: the house apportioned, then
//	        again with that unit and added seats (default: its fair
//	        share), and whose seats change (the new-states paradox)
//
// # Tables, baselines and links
//
// A [Request] may load a table as people paste or drop it, with a column
// chooser first ([Load]); compare the scenario with a pinned baseline
// (the comparison the seatsmith command's diff makes, laid out above the
// results); and open a link. Every answer carries the short payload of its
// link ([EncodeLink], [DecodeLink]).
//
// For growth and admit blocks, compare lists the methods whose findings
// are summarised. Their claims may use the kinds that need what the block
// adds (see claim.Context).
package calc
