package format

import (
	"strconv"
	"strings"

	"seatsmith/engine"
)

// UnitNotes says what holds a unit where it is, in the words both the
// command line and the pages use: "below the threshold", "held up by its
// minimum of 1", "held down by its maximum of 5", "tied".
func UnitNotes(u *engine.UnitResult) string {
	var n []string
	if u.Excluded {
		n = append(n, "below the threshold")
	}
	if u.AtMin {
		n = append(n, "held up by its minimum of "+strconv.Itoa(u.Min))
	}
	if u.AtMax {
		n = append(n, "held down by its maximum of "+strconv.Itoa(u.Max))
	}
	if u.Tied {
		n = append(n, "tied")
	}
	return strings.Join(n, "; ")
}

// MarginLegend says what a unit's quota and margins are, in the words both
// the command line and the pages use.
const MarginLegend = "Quota: the unit's exact share of the seats, population × seats ÷ total. " +
	"Gain margin: the fewest extra people who would win the unit one more seat outright, all others fixed; " +
	"lose margin: the fewest people whose loss, all others fixed, would cost it a seat or leave its last seat tied. " +
	"A dash means no change of its population alone does it."
