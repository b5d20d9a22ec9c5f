package analysis

import (
	"math/big"
	"strconv"
	"strings"

	"seatsmith/engine"
)

// A Diff compares a baseline scenario with a proposal: other populations,
// another house size, method, bounds or threshold. Units are matched by
// name.
type Diff struct {
	Base, Proposal *engine.Result
	// Settings lists the scenario settings that differ.
	Settings []SettingChange
	// Units has one entry per unit name: the baseline's units in their
	// order, then the proposal's new units.
	Units []UnitDiff
	// Measures of both results, for the summary.
	BaseMeasures, ProposalMeasures Measures
}

// A SettingChange is one scenario setting that differs.
type SettingChange struct {
	Name          string // "seats", "method", "min", "max", "threshold", "tie"
	Before, After string
}

// A UnitDiff is one unit in both results (or in one of them).
type UnitDiff struct {
	Name                     string
	InBase, InProposal       bool
	Base, Proposal           *engine.UnitResult // nil where absent
	SeatChange               int                // proposal seats − baseline seats
	GainChanged, LoseChanged bool               // the margins differ
}

// Changed reports whether the unit's seats, presence or margins differ.
func (u *UnitDiff) Changed() bool {
	return u.SeatChange != 0 || u.InBase != u.InProposal || u.GainChanged || u.LoseChanged
}

// A SideError is an error in one of the two scenarios.
type SideError struct {
	Side string // "baseline" or "proposal"
	Err  error
}

func (e *SideError) Error() string { return e.Side + ": " + e.Err.Error() }

// Unwrap returns the underlying error.
func (e *SideError) Unwrap() error { return e.Err }

// Compare apportions both scenarios with margins and lines them up.
func Compare(base, proposal *engine.Scenario) (*Diff, error) {
	b, err := engine.Allot(base, engine.WithMargins)
	if err != nil {
		return nil, &SideError{"baseline", err}
	}
	p, err := engine.Allot(proposal, engine.WithMargins)
	if err != nil {
		return nil, &SideError{"proposal", err}
	}
	d := &Diff{Base: b, Proposal: p, BaseMeasures: Measure(b), ProposalMeasures: Measure(p)}
	d.Settings = settingChanges(base, proposal)
	inProp := map[string]int{}
	for j := range p.Units {
		inProp[p.Units[j].Name] = j
	}
	seen := map[string]bool{}
	for i := range b.Units {
		bu := &b.Units[i]
		ud := UnitDiff{Name: bu.Name, InBase: true, Base: bu}
		if j, ok := inProp[bu.Name]; ok {
			pu := &p.Units[j]
			ud.InProposal, ud.Proposal = true, pu
			ud.SeatChange = pu.Seats - bu.Seats
			ud.GainChanged = !sameMargin(bu.Gain, pu.Gain)
			ud.LoseChanged = !sameMargin(bu.Lose, pu.Lose)
		} else {
			ud.SeatChange = -bu.Seats
		}
		seen[bu.Name] = true
		d.Units = append(d.Units, ud)
	}
	for j := range p.Units {
		pu := &p.Units[j]
		if seen[pu.Name] {
			continue
		}
		d.Units = append(d.Units, UnitDiff{Name: pu.Name, InProposal: true, Proposal: pu, SeatChange: pu.Seats})
	}
	return d, nil
}

func sameMargin(a, b *engine.Decimal) bool {
	if a == nil || b == nil {
		return a == b
	}
	return a.Cmp(*b) == 0
}

func settingChanges(a, b *engine.Scenario) []SettingChange {
	var out []SettingChange
	add := func(name, x, y string) {
		if x != y {
			out = append(out, SettingChange{name, x, y})
		}
	}
	add("seats", strconv.Itoa(a.Seats), strconv.Itoa(b.Seats))
	add("method", a.Method.String(), b.Method.String())
	add("min", strconv.Itoa(a.Min), strconv.Itoa(b.Min))
	capText := func(m int) string {
		if m == 0 {
			return "none"
		}
		return strconv.Itoa(m)
	}
	add("max", capText(a.Max), capText(b.Max))
	thText := func(d engine.Decimal) string {
		if d.IsZero() {
			return "none"
		}
		return Percent(ratOf(d))
	}
	add("threshold", thText(a.Threshold), thText(b.Threshold))
	add("tie", a.Tie.String(), b.Tie.String())
	return out
}

// Moved returns the number of seats that change hands: half the sum of
// the absolute seat changes over all units (a seat taken from one unit and
// given to another counts once), rounded up when the house sizes differ.
func (d *Diff) Moved() int {
	s := 0
	for _, u := range d.Units {
		if u.SeatChange < 0 {
			s -= u.SeatChange
		} else {
			s += u.SeatChange
		}
	}
	return (s + 1) / 2
}

// Text summarises the differences in one sentence a line.
func (d *Diff) Text() []string {
	var lines []string
	for _, s := range d.Settings {
		lines = append(lines, s.Name+": "+s.Before+" → "+s.After)
	}
	for _, u := range d.Units {
		switch {
		case !u.InProposal:
			lines = append(lines, u.Name+" is not in the proposal (it had "+plural(u.Base.Seats, "seat")+")")
		case !u.InBase:
			lines = append(lines, u.Name+" is new in the proposal, with "+plural(u.Proposal.Seats, "seat"))
		case u.SeatChange != 0:
			sign := "gains "
			n := u.SeatChange
			if n < 0 {
				sign, n = "loses ", -n
			}
			s := u.Name + " " + sign + plural(n, "seat") + " (" + itoa(u.Base.Seats) + " → " + itoa(u.Proposal.Seats) + ")"
			if c := u.Base.Population.Cmp(u.Proposal.Population); c != 0 {
				s += "; population " + u.Base.Population.String() + " → " + u.Proposal.Population.String()
			}
			lines = append(lines, s)
		}
	}
	if len(lines) == 0 {
		lines = append(lines, "no unit's seats change")
	}
	return lines
}

// growth returns the exact growth rate of a unit between the two sides, or
// nil when it had no people in the baseline.
func (u *UnitDiff) growth() *big.Rat {
	if u.Base == nil || u.Proposal == nil || u.Base.Population.IsZero() {
		return nil
	}
	g := new(big.Rat).Quo(ratOf(u.Proposal.Population), ratOf(u.Base.Population))
	return g.Sub(g, big.NewRat(1, 1))
}

// Growth returns the unit's population growth as a percentage text, or ""
// when it is not in both scenarios or had no people.
func (u *UnitDiff) Growth() string {
	g := u.growth()
	if g == nil {
		return ""
	}
	s := Percent(g)
	if g.Sign() > 0 {
		s = "+" + s
	}
	return strings.TrimSpace(s)
}
