// Package input reads apportionment scenarios from CSV tables and from
// seatsmith's JSON scenario documents, and reports bad input by file, line
// and field.
//
// # CSV
//
// A CSV table has a header row naming its columns, in any order and any
// case: name and population are required, min and max are optional per-unit
// bounds (an empty cell means "the default"). A byte-order mark and CRLF line
// ends are accepted. Any other column is an error.
//
//	name,population,min
//	Orlen,1204553,2
//	Tamsk,880120,
//
// # JSON scenario documents (version 1)
//
// A scenario document is one JSON object:
//
//	{
//	  "version": 1,
//	  "title": "Assembly of Vessaria",
//	  "seats": 120,
//	  "method": "webster",
//	  "min": 1,
//	  "max": 40,
//	  "threshold": "5%",
//	  "tie": "lot:7",
//	  "units": [
//	    {"name": "Orlen", "population": 1204553, "min": 2},
//	    {"name": "Tamsk", "population": "880120.5"}
//	  ]
//	}
//
// Only units is required. version defaults to 1; a document of a later
// version is refused. population is a JSON number or a string holding an
// exact decimal (no exponent); populations keep every digit as written.
// seats, min and max are whole numbers; max 0 means no cap. threshold is a
// share of the total, written as a number or string ("0.05") or a percentage
// string ("5%"). method takes the ids and aliases of engine.ParseMethod; tie
// takes "none", "order" or "lot:SEED". Unknown members are errors, so that a
// misspelt option is never silently ignored.
package input
