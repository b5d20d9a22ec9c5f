// Command analysis is seatsmith's WebAssembly analysis module
// (seatsmith-analysis.wasm): the calculator module's API and the
// functions that search beyond one apportionment, sweeps, paradoxes and
// projections, which only the blocks that need them load. See
// wasm/README.md.
package main

import (
	"seatsmith/wasm/analysisapi"
	"seatsmith/wasm/api"
)

func main() { api.Serve(analysisapi.Module()) }
