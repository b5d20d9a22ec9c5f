// Command wasm is the WebAssembly face of the seatsmith engine. Built with
// GOOS=js GOARCH=wasm (package wasmbuild does it with the release flags),
// it installs one object on globalThis and then serves calls from the page
// for as long as the page lives:
//
//	globalThis.seatsmith = {
//	  version: 1,             // APIVersion
//	  caution: "...",         // the not-official caution (format.Caution)
//	  methods(),              // [{id, name, divisor}]
//	  allot(scenario),        // the allotment document
//	  compare(scenario),      // the comparison document
//	  readCSV(text),          // {units: [{name, population, min?, max?}]}
//	  ...                     // functions other files register
//	}
//
// The object is defined once go.run(instance) has started the module (the
// program installs it before it first blocks) and is frozen.
//
// A scenario is a plain object in the shape of a JSON scenario document
// (engine/input): {seats, method, min, max, threshold, tie, title, units:
// [{name, population, min, max}]}. A population may be a string (exact, as
// written), a number (written as the shortest decimal that reads back as
// the same number, which is exact for whole numbers up to 2^53) or a
// BigInt. Members that are undefined count as absent; unknown members,
// NaN, Infinity, functions and symbols are errors.
//
// The documents returned are plain objects and arrays with exactly the
// content of the command-line tool's JSON output (schemas in
// engine/format): numbers as numbers, exact decimals as strings, null as
// null.
//
// No function throws. Every failure, bad input or an internal fault alike,
// returns {error: {message, field, line}}: message always, field when the
// fault has a place (a path such as "units[2].population", or a CSV
// column), line for CSV input. The engine stays usable afterwards.
//
// # Adding a function
//
// Each function lives in a file of its own, api_NAME.go, with an init
// function that calls register(name, f) for an [apiFunc]. The function
// receives its one argument as a jsondoc tree and returns a document or an
// error; the bridge converts, catches panics and builds the error object.
// Functions that take a scenario read it with scenarioArg. The browser
// build apportions at most maxSeats seats and maxUnits units.
//
// Built for the host the program only says that it is meant for js/wasm;
// the conversion and API functions are tested there, and the whole module
// is tested under Node by package nodetest.
package main
