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
// must give seats and method, with two more optional members:
//
//	claims    an array of claims (see package seatsmith/site/claim)
//	compare   the method ids the comparison shows (default: every method)
package calc
