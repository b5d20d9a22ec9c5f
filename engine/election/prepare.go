package election

import (
	"math/big"
	"strconv"
	"strings"

	"seatsmith/engine"
)

// Limits on the size of an election scenario. Larger inputs are refused.
const (
	MaxDistricts = 100_000
	MaxParties   = 10_000
	MaxVotes     = 1_000_000 // vote rows (district and party pairs)
)

// prepared is a scenario checked and indexed: districts and parties by
// number, votes in a matrix scaled to whole numbers.
type prepared struct {
	s       *Scenario
	names   []string // district names
	parties []partyInfo
	places  uint8      // the votes' common decimal places
	v       [][]uint64 // v[i][j]: votes of party j in district i, scaled by 10^places; 0 when absent
	row     [][]int    // row[i][j]: the vote row for the cell, or -1
	// nat holds votes without a district (mixed-member), per party.
	nat      []uint64
	natRow   []int
	other    []uint64 // other valid votes per district, scaled
	otherNat uint64
	seats    []int          // each district's seats
	seatsRes *engine.Result // the apportionment of the districts' seats, when made
}

type partyInfo struct {
	name        string
	wins        int
	winsGiven   bool // given on the party
	exempt      bool
	independent bool
	index       int // the party entry, or -1
	firstVote   int // the first vote row naming it, or -1
}

func prepare(s *Scenario) (*prepared, error) {
	if !s.System.Valid() {
		return nil, scenarioErr("system", "missing or unknown: use districts, biproportional, two-tier or mixed-member")
	}
	if !s.Method.Valid() {
		return nil, scenarioErr("method", "missing or unknown method; known: "+strings.Join(engine.MethodIDs(), ", "))
	}
	if s.System == Biproportional && !s.Method.IsDivisor() {
		return nil, scenarioErr("method", "the lower apportionment of a biproportional election needs a divisor method, not "+s.Method.Name())
	}
	for _, m := range []struct {
		field string
		m     engine.Method
	}{{"upper_method", s.UpperMethod}, {"district_method", s.DistrictMethod}} {
		if m.m != 0 && !m.m.Valid() {
			return nil, scenarioErr(m.field, "unknown method")
		}
	}
	if s.Tie.Kind > engine.TieByOrder {
		return nil, scenarioErr("tie", "unknown tie rule")
	}
	if s.Seats < 0 || s.Seats > engine.MaxSeats {
		return nil, scenarioErr("seats", "must be between 0 and "+strconv.Itoa(engine.MaxSeats))
	}
	if s.Compensatory != 0 && s.System != TwoTier {
		return nil, scenarioErr("compensatory", "compensatory seats belong to a two-tier election")
	}
	if s.Compensatory < 0 || s.Compensatory > engine.MaxSeats {
		return nil, scenarioErr("compensatory", "must be between 0 and "+strconv.Itoa(engine.MaxSeats))
	}
	if s.Overhang > Fixed {
		return nil, scenarioErr("overhang", "unknown overhang rule")
	}
	if s.Overhang != Keep && s.System != MixedMember {
		return nil, scenarioErr("overhang", "an overhang rule belongs to a mixed-member election")
	}
	if s.UpperBasis > Voters {
		return nil, scenarioErr("upper_basis", "unknown basis")
	}
	if s.UpperBasis == Voters && s.System != Biproportional {
		return nil, scenarioErr("upper_basis", "voter numbers are the basis of a biproportional upper apportionment only")
	}
	if s.WinsThreshold < 0 {
		return nil, scenarioErr("threshold", "the number of district seats that qualifies cannot be negative")
	}
	if s.WinsThreshold > 0 && s.System != MixedMember && s.System != TwoTier {
		return nil, scenarioErr("threshold", "qualifying by district seats won belongs to a mixed-member or two-tier election")
	}
	for k, t := range s.Thresholds {
		f := "thresholds[" + strconv.Itoa(k) + "]"
		if t.Share.Cmp(engine.Whole(1)) > 0 {
			return nil, scenarioErr(f, "a share cannot be more than the whole")
		}
		if t.Scope > InDistrict || t.Base > Valid {
			return nil, scenarioErr(f, "unknown scope or base")
		}
		if t.Scope != Election && s.System == MixedMember {
			return nil, scenarioErr(f, "a mixed-member election's thresholds are over the whole election")
		}
	}
	if len(s.Districts) > MaxDistricts {
		return nil, scenarioErr("districts", "more than "+strconv.Itoa(MaxDistricts)+" districts")
	}
	if len(s.Parties) > MaxParties {
		return nil, scenarioErr("parties", "more than "+strconv.Itoa(MaxParties)+" parties")
	}
	if len(s.Votes) > MaxVotes {
		return nil, scenarioErr("votes", "more than "+strconv.Itoa(MaxVotes)+" vote rows")
	}
	if len(s.Districts) == 0 && s.System != MixedMember {
		return nil, scenarioErr("districts", "missing: a "+s.System.Name()+" election needs its districts")
	}
	if len(s.Votes) == 0 {
		return nil, scenarioErr("votes", "missing: an election needs votes")
	}

	p := &prepared{s: s}
	dIndex := make(map[string]int, len(s.Districts))
	for i, d := range s.Districts {
		name := strings.TrimSpace(d.Name)
		if name == "" {
			return nil, districtErr(i, "name", "missing or empty: every district needs a name")
		}
		if k, dup := dIndex[name]; dup {
			return nil, districtErr(i, "name", strconv.Quote(name)+": the same name as district "+strconv.Itoa(k+1))
		}
		if d.Seats < 0 || d.Seats > engine.MaxSeats {
			return nil, districtErr(i, "seats", strconv.Quote(name)+": must be between 0 and "+strconv.Itoa(engine.MaxSeats))
		}
		dIndex[name] = i
		p.names = append(p.names, name)
	}
	pIndex := make(map[string]int, len(s.Parties))
	for k, q := range s.Parties {
		name := strings.TrimSpace(q.Name)
		if name == "" {
			return nil, partyErr(k, "name", "missing or empty: every party needs a name")
		}
		if j, dup := pIndex[name]; dup {
			return nil, partyErr(k, "name", strconv.Quote(name)+": the same name as party "+strconv.Itoa(j+1))
		}
		if q.Wins < 0 || q.Wins > engine.MaxSeats {
			return nil, partyErr(k, "wins", strconv.Quote(name)+": must be between 0 and "+strconv.Itoa(engine.MaxSeats))
		}
		if q.Wins > 0 && s.System != MixedMember {
			return nil, partyErr(k, "wins", strconv.Quote(name)+": district wins belong to a mixed-member election")
		}
		if q.Independent && s.System != MixedMember && s.System != TwoTier {
			return nil, partyErr(k, "independent", strconv.Quote(name)+": independents belong to a mixed-member or two-tier election")
		}
		pIndex[name] = len(p.parties)
		p.parties = append(p.parties, partyInfo{name: name, wins: q.Wins, winsGiven: q.Wins > 0, exempt: q.Exempt, independent: q.Independent, index: k, firstVote: -1})
	}

	// The common number of decimal places.
	for _, v := range s.Votes {
		p.places = max(p.places, v.Votes.Places)
	}
	for _, d := range s.Districts {
		p.places = max(p.places, d.OtherVotes.Places)
	}
	p.places = max(p.places, s.OtherVotes.Places)
	if p.places > engine.MaxPlaces {
		return nil, scenarioErr("votes", "more than "+strconv.Itoa(engine.MaxPlaces)+" decimal places")
	}
	type cellKey struct{ d, q int }
	seen := make(map[cellKey]int, len(s.Votes))
	type cell struct {
		d, q int
		v    uint64
		wins int
	}
	cells := make([]cell, 0, len(s.Votes))
	for k, v := range s.Votes {
		dname := strings.TrimSpace(v.District)
		d := -1
		if dname != "" {
			var ok bool
			if d, ok = dIndex[dname]; !ok {
				return nil, voteErr(k, "district", "unknown district "+strconv.Quote(dname))
			}
		} else if s.System != MixedMember {
			return nil, voteErr(k, "district", "missing: every vote row names its district")
		}
		pname := strings.TrimSpace(v.Party)
		if pname == "" {
			return nil, voteErr(k, "party", "missing or empty: every vote row names its party")
		}
		q, ok := pIndex[pname]
		if !ok {
			if len(p.parties) >= MaxParties {
				return nil, voteErr(k, "party", "more than "+strconv.Itoa(MaxParties)+" parties")
			}
			q = len(p.parties)
			pIndex[pname] = q
			p.parties = append(p.parties, partyInfo{name: pname, index: -1, firstVote: k})
		} else if p.parties[q].firstVote < 0 {
			p.parties[q].firstVote = k
		}
		if j, dup := seen[cellKey{d, q}]; dup {
			where := "district " + strconv.Quote(dname)
			if d < 0 {
				where = "no district"
			}
			return nil, voteErr(k, "party", strconv.Quote(pname)+" in "+where+": the same district and party as vote row "+strconv.Itoa(j+1))
		}
		seen[cellKey{d, q}] = k
		sv, err := scaled(v.Votes, p.places)
		if err != nil {
			return nil, voteErr(k, "votes", strconv.Quote(pname)+": "+err.Error())
		}
		if v.Wins < 0 || v.Wins > engine.MaxSeats {
			return nil, voteErr(k, "wins", "must be between 0 and "+strconv.Itoa(engine.MaxSeats))
		}
		if v.Wins > 0 && s.System != MixedMember {
			return nil, voteErr(k, "wins", "district wins belong to a mixed-member election")
		}
		cells = append(cells, cell{d, q, sv, v.Wins})
	}
	m, n := len(p.names), len(p.parties)
	p.v = make([][]uint64, m)
	p.row = make([][]int, m)
	for i := range m {
		p.v[i] = make([]uint64, n)
		p.row[i] = make([]int, n)
		for j := range p.row[i] {
			p.row[i][j] = -1
		}
	}
	p.nat = make([]uint64, n)
	p.natRow = make([]int, n)
	for j := range p.natRow {
		p.natRow[j] = -1
	}
	rowWins := make([]int, n)
	for k, c := range cells {
		if c.d >= 0 {
			p.v[c.d][c.q] = c.v
			p.row[c.d][c.q] = k
		} else {
			p.nat[c.q] = c.v
			p.natRow[c.q] = k
		}
		rowWins[c.q] += c.wins
		if rowWins[c.q] > engine.MaxSeats {
			return nil, voteErr(k, "wins", "more than "+strconv.Itoa(engine.MaxSeats)+" wins")
		}
	}
	for j := range p.parties {
		pi := &p.parties[j]
		if rowWins[j] > 0 {
			if pi.winsGiven && pi.wins != rowWins[j] {
				return nil, partyErr(pi.index, "wins", strconv.Quote(pi.name)+": "+strconv.Itoa(pi.wins)+" wins, but its vote rows add up to "+strconv.Itoa(rowWins[j]))
			}
			pi.wins = rowWins[j]
		}
	}
	p.other = make([]uint64, m)
	for i, d := range s.Districts {
		o, err := scaled(d.OtherVotes, p.places)
		if err != nil {
			return nil, districtErr(i, "other_votes", strconv.Quote(p.names[i])+": "+err.Error())
		}
		p.other[i] = o
	}
	o, err := scaled(s.OtherVotes, p.places)
	if err != nil {
		return nil, scenarioErr("other_votes", err.Error())
	}
	p.otherNat = o
	if err := p.districtSeats(); err != nil {
		return nil, err
	}
	return p, nil
}

// districtSeats fills in the districts' seats: given, or apportioned from
// the populations.
func (p *prepared) districtSeats() error {
	s := p.s
	m := len(p.names)
	p.seats = make([]int, m)
	if s.System == MixedMember {
		for i, d := range s.Districts {
			p.seats[i] = d.Seats
		}
		if s.Seats < 1 {
			return scenarioErr("seats", "missing: a mixed-member election needs its house size")
		}
		return nil
	}
	given, fromPop := 0, 0
	for _, d := range s.Districts {
		if d.Seats > 0 {
			given++
		} else if d.Population != nil {
			fromPop++
		}
	}
	switch {
	case given == m:
		total := 0
		for i, d := range s.Districts {
			p.seats[i] = d.Seats
			total += d.Seats
			if total > engine.MaxSeats {
				return districtErr(i, "seats", "the districts' seats add up to more than "+strconv.Itoa(engine.MaxSeats))
			}
		}
		if s.Seats != 0 && s.Seats != total {
			return scenarioErr("seats", strconv.Itoa(s.Seats)+" seats, but the districts' seats add up to "+strconv.Itoa(total))
		}
		return nil
	case fromPop == m:
		if s.Seats < 1 {
			return scenarioErr("seats", "missing: the districts' seats are apportioned from their populations, so the scenario needs the number of seats")
		}
		units := make([]engine.Unit, m)
		for i, d := range s.Districts {
			units[i] = engine.Unit{Name: p.names[i], Population: *d.Population}
		}
		res, err := engine.Allot(&engine.Scenario{Units: units, Seats: s.Seats, Method: s.districtMethod(), Tie: s.Tie}, 0)
		if err != nil {
			return fromEngine(err, "districts", "population")
		}
		for i, u := range res.Units {
			p.seats[i] = u.Seats
		}
		p.seatsRes = res
		return nil
	}
	for i, d := range s.Districts {
		if d.Seats == 0 && d.Population == nil {
			return districtErr(i, "seats", strconv.Quote(p.names[i])+": missing: give every district its seats, or every district its population")
		}
	}
	return scenarioErr("districts", "give every district its seats, or every district its population, not some of each")
}

// scaled writes d with the given number of decimal places as a whole
// number.
func scaled(d engine.Decimal, places uint8) (uint64, error) {
	c := d.Coef
	for k := d.Places; k < places; k++ {
		if c > engine.MaxCoefficient/10 {
			return 0, &Error{Index: -1, Msg: d.String() + " is larger than 10^18 once written with " + strconv.Itoa(int(places)) + " decimal places"}
		}
		c *= 10
	}
	if c > engine.MaxCoefficient {
		return 0, &Error{Index: -1, Msg: d.String() + " is larger than 10^18"}
	}
	return c, nil
}

// decimalOf turns a scaled whole number back into a Decimal.
func (p *prepared) decimalOf(x uint64) engine.Decimal {
	return engine.Decimal{Coef: x, Places: p.places}
}

// bigDecimal turns a scaled total into a Decimal, refusing one above 10^18.
func (p *prepared) bigDecimal(x *big.Int) (engine.Decimal, bool) {
	if !x.IsUint64() || x.Uint64() > engine.MaxCoefficient {
		return engine.Decimal{}, false
	}
	return engine.Decimal{Coef: x.Uint64(), Places: p.places}, true
}

// partyTotal is party j's votes over the whole election.
func (p *prepared) partyTotal(j int) *big.Int {
	t := new(big.Int).SetUint64(p.nat[j])
	var x big.Int
	for i := range p.v {
		t.Add(t, x.SetUint64(p.v[i][j]))
	}
	return t
}

// fromEngine turns an engine error about a scenario of parties (or
// districts) into an Error naming the entry at fault.
func fromEngine(err error, part, field string) error {
	ee, ok := err.(*engine.Error)
	if !ok {
		return err
	}
	msg := ee.Msg
	if ee.Name != "" {
		msg = strconv.Quote(ee.Name) + ": " + msg
	}
	if ee.Field != "" && ee.Field != "population" && ee.Field != "units" {
		field = ee.Field
	}
	return &Error{Part: part, Index: ee.Unit, Field: field, Msg: msg}
}
