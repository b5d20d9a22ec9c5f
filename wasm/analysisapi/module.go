package analysisapi

import (
	"seatsmith/site/calc"
	"seatsmith/site/election"
	"seatsmith/site/projection"
	"seatsmith/wasm/api"
)

// Module returns the functions and limits of the analysis module: every
// function of the calculator module, its calculator serving variation
// blocks too (sweep, growth and admit; see calc.UseVariations), and sweep,
// projectStart, projectRun, projectResult, projectDrop and election.
func Module() ([]api.Function, []api.Limit) {
	calc.UseVariations()
	fns := append(api.Calculator(),
		api.Function{Name: "sweep", Call: sweep},
		api.Function{Name: "projectStart", Call: projectStart},
		api.Function{Name: "projectRun", Call: projectRun},
		api.Function{Name: "projectResult", Call: projectResult},
		api.Function{Name: "projectDrop", Call: projectDrop},
		api.Function{Name: "election", Call: electionCall},
	)
	limits := append(api.Limits(),
		api.Limit{Key: "sweep_cells", Value: MaxSweepCells},
		api.Limit{Key: "sweep_sizes", Value: calc.MaxSweepSizes},
		api.Limit{Key: "draws", Value: projection.MaxDraws},
		api.Limit{Key: "draws_per_call", Value: maxChunk},
		api.Limit{Key: "projection_units", Value: projection.MaxUnits},
		api.Limit{Key: "election_districts", Value: election.MaxDistricts},
		api.Limit{Key: "election_parties", Value: election.MaxParties},
		api.Limit{Key: "election_cells", Value: election.MaxCells},
		api.Limit{Key: "election_seats", Value: election.MaxSeats},
	)
	return fns, limits
}
