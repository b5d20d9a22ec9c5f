package engine

// A Prepared is a scenario checked and converted into the form the
// procedures work on. It keeps what apportioning needs (the names, the
// populations scaled to a common number of decimal places, the bounds and
// the rules) and no reference to the scenario's units, so a caller holding
// a large scenario can drop its units before apportioning: the result and
// the units' copy are then never in memory at the same time.
type Prepared struct {
	pr *problem
}

// Prepare checks the scenario and converts it for [Prepared.Allot]. It
// returns the *[Error] that [Allot] returns for an invalid scenario; the
// few that only the procedure itself finds come from [Prepared.Allot].
// Later changes to s, its units included, do not affect the Prepared.
func Prepare(s *Scenario) (*Prepared, error) {
	pr, err := prepare(s)
	if err != nil {
		return nil, err
	}
	return &Prepared{pr: pr}, nil
}

// Allot apportions the prepared scenario's seats and explains the result,
// as [Allot] does for the scenario it was prepared from. It may be called
// more than once, with the same or another detail.
func (p *Prepared) Allot(detail Detail) (*Result, error) {
	return p.pr.allot(detail)
}
