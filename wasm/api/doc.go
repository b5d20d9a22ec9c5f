// Package api is the API object the WebAssembly modules put on
// globalThis.seatsmith: the conversion of JavaScript values to jsondoc
// trees and of documents back, the error values, the limits every
// function checks its request against, and the functions of the
// calculator module ([Calculator]): methods, allot, compare, readCSV and
// calculator.
//
// A module's main is one line: [Serve] with its functions and limits.
//
// # Functions
//
// A [Function] receives its JavaScript arguments as jsondoc trees and
// returns a document or an error. No function throws: the handler
// converts the arguments, catches panics and builds the error object
// {error: {message, field, line}}: message always, field when the fault
// has a place (a path such as "units[2].population", or a CSV column), line
// for CSV input. The engine stays usable afterwards.
//
// A scenario is a plain object in the shape of a JSON scenario document
// (engine/input): {seats, method, min, max, threshold, tie, title, units:
// [{name, population, min, max}]}. A population may be a string (exact, as
// written), a number (written as the shortest decimal that reads back as
// the same number, which is exact for whole numbers up to 2^53) or a
// BigInt. Members that are undefined count as absent; unknown members,
// NaN, Infinity, functions and symbols are errors.
//
// # Limits
//
// Every function checks its request against the limits in limits.go
// before it computes anything and refuses a request beyond one with an
// error naming it; limits() lists them. Memory for a request is bounded by
// design: allot computes the costly parts of an explanation (the margins
// engine.Scenario.CostlyMargins names, the seat order) only on request or
// for small inputs, and
// writes its document unit by unit.
//
// Built for the host the package's functions and conversion are tested
// there; the modules are tested under Node by package nodetest.
package api
