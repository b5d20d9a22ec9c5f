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
var MarginLegend = MarginLegendIn("population", "people", "who")

// MarginLegendIn is [MarginLegend] in the words of what the units count:
// noun names the count ("population", "votes"), many its units ("people",
// "votes", "students") and who the relative pronoun for them ("who",
// "that").
func MarginLegendIn(noun, many, who string) string {
	return "Quota: the unit's exact share of the seats, " + noun + " × seats ÷ total. " +
		"Gain margin: the fewest extra " + many + " " + who + " would win the unit one more seat outright, all others fixed; " +
		"lose margin: the fewest " + many + " whose loss, all others fixed, would cost it a seat or leave its last seat tied. " +
		"A dash means no change of its " + noun + " alone does it."
}
