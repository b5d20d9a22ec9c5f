package json_test

import (
	"os"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/format"
	"seatsmith/engine/format/json"
)

// Two invented wards by two methods, as JSON: the comparison document.
func Example() {
	s := engine.Scenario{Seats: 3, Units: []engine.Unit{
		{Name: "North", Population: engine.Whole(52)},
		{Name: "South", Population: engine.Whole(48)},
	}}
	c := analysis.CompareMethods(s, []engine.Method{engine.Webster}, 0)
	json.Encoder{}.Encode(os.Stdout, format.Comparison("", c))
	// Output:
	// {
	//   "version": 1,
	//   "kind": "comparison",
	//   "caution": "Not an official apportionment. seatsmith computes what the chosen method gives for the numbers supplied; the governing statute or constitution, the official counts and the responsible authority decide. Rely on election officials and counsel, not on this tool.",
	//   "seats": 3,
	//   "total": "100",
	//   "methods": [
	//     "webster"
	//   ],
	//   "units": [
	//     {
	//       "name": "North",
	//       "population": "52",
	//       "quota": "1.56",
	//       "lower_quota": 1,
	//       "upper_quota": 2,
	//       "seats": {
	//         "webster": 2
	//       },
	//       "differs": false,
	//       "breaks_quota": []
	//     },
	//     {
	//       "name": "South",
	//       "population": "48",
	//       "quota": "1.44",
	//       "lower_quota": 1,
	//       "upper_quota": 2,
	//       "seats": {
	//         "webster": 1
	//       },
	//       "differs": false,
	//       "breaks_quota": []
	//     }
	//   ],
	//   "results": [
	//     {
	//       "method": "webster",
	//       "method_name": "Webster (Sainte-Laguë)",
	//       "error": null,
	//       "ties": [],
	//       "unassigned": 0,
	//       "quota_violations": 0
	//     }
	//   ]
	// }
}
