package format

import (
	"strconv"
	"strings"

	"seatsmith/engine"
)

// TieText says what a tie is and what became of it, in the words every
// document and the pages' sweep tables use: "East Ward, West Ward tie at
// 300 for 1 seat: left unassigned", or "...: settled by input order for
// East Ward". name gives a unit's name by its index (for the winners).
func TieText(t *engine.Tie, name func(int) string) string {
	s := strings.Join(t.Names, ", ") + " tie"
	if t.Value.Text != "" {
		s += " at " + t.Value.Text
	}
	s += " for " + Plural(t.Seats, "seat")
	if len(t.Winners) == 0 {
		return s + ": left unassigned"
	}
	ws := make([]string, len(t.Winners))
	for i, w := range t.Winners {
		ws[i] = name(w)
	}
	return s + ": settled by " + TieRuleText(t.Rule) + " for " + strings.Join(ws, ", ")
}

// TiesText is TieText of each tie, joined by "; ".
func TiesText(ts []engine.Tie, name func(int) string) string {
	s := make([]string, len(ts))
	for i := range ts {
		s[i] = TieText(&ts[i], name)
	}
	return strings.Join(s, "; ")
}

// TieRuleText names a tie rule for people: "input order", "lots drawn
// with seed 7".
func TieRuleText(rule string) string {
	switch {
	case rule == "order":
		return "input order"
	case strings.HasPrefix(rule, "lot:"):
		return "lots drawn with seed " + rule[4:]
	}
	return rule
}

// SeatChanges names the units that lose and gain seats from one house
// size to the next, losers first: "Sarrow −1, Brevia +1"; "" for the
// first size.
func SeatChanges(names []string, prev, cur []int) string {
	if prev == nil {
		return ""
	}
	var down, up []string
	for i := range cur {
		switch d := cur[i] - prev[i]; {
		case d < 0:
			down = append(down, names[i]+" −"+strconv.Itoa(-d))
		case d > 0:
			up = append(up, names[i]+" +"+strconv.Itoa(d))
		}
	}
	return strings.Join(append(down, up...), ", ")
}
