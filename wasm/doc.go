// Command wasm is seatsmith's WebAssembly calculator module
// (seatsmith.wasm), the engine every page with a calculator loads. Built
// with GOOS=js GOARCH=wasm (package wasmbuild does it with the release
// flags), it installs one object on globalThis and then serves calls for
// as long as the page or worker lives:
//
//	globalThis.seatsmith = {
//	  version: 1,                 // api.Version
//	  caution: "...",             // the not-official caution (report.Caution)
//	  methods(),                  // [{id, name, divisor}]
//	  allot(scenario, options),   // the allotment document
//	  compare(scenario),          // the comparison document
//	  readCSV(text),              // {units: [{name, population, min?, max?}]}
//	  calculator(request),        // a calculator block's answer (the bridge's)
//	  limits(),                   // {units: 100000, seats: 100000, ...}
//	}
//
// The functions live in package seatsmith/wasm/api; the analysis module
// (package seatsmith/wasm/analysis, seatsmith-analysis.wasm) has them all
// and the analysis functions besides. The JavaScript that loads a module in
// a page is in wasm/js. See wasm/README.md for the whole API.
//
// Built for the host the program only says that it is meant for js/wasm.
package main
