package election

import (
	"strconv"
	"strings"

	model "seatsmith/engine/election"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
)

// A Claim is a sentence about the election that the block can check:
//
//	kind           members                           holds when
//	seats          party, seats: {system: n, ...}    the party wins exactly n seats under each system named
//	differ         party, systems: [A, B]            the party's seats differ under the two systems
//	cell-seats     system, district, party, seats    the party wins exactly that many seats in the district
//	district-sums  system and district optional      every district's (or that district's) seats by party add up to its seats, and the parties' to the house
//	certificate    strict optional (true or false)   the biproportional divisors round every cell to its seats, checked exactly (strict: no quotient on a signpost)
//	excluded       party                             the party is below the threshold
//	no-ties        system optional                   no tie decided a seat (under that system)
//
// Systems are named by their ids: districts, two-tier, biproportional.
type Claim struct {
	ID, Kind, Party, District string
	Line                      int
	System                    model.System // zero: every system
	Systems                   []model.System
	Seats                     []int // one per Systems entry (seats), or one (cell-seats)
	Strict                    bool
	Text                      string // the author's sentence (optional)
}

// A Verdict is a claim checked against an outcome.
type Verdict struct {
	Holds bool
	Found string // what the results show, for messages
}

var claimKinds = "seats, differ, cell-seats, district-sums, certificate, excluded, no-ties"

func parseClaims(c *Config, v *jsondoc.Value) ([]Claim, error) {
	bad := func(l int, msg string) error { return &input.Error{File: c.File, Line: l, Field: "claims", Msg: msg} }
	if v.Kind != jsondoc.Array {
		return nil, bad(c.Line, "claims is an array of claims")
	}
	ids := map[string]bool{}
	var out []Claim
	for _, x := range v.Items {
		l := c.Line
		if x.Line > 0 {
			l = x.Line
		}
		if x.Kind != jsondoc.Object {
			return nil, bad(l, "a claim is an object with id and kind")
		}
		cl := Claim{Line: l}
		var seats *jsondoc.Value
		for _, f := range x.Fields {
			t := jsondoc.ScalarText(f.Value)
			switch f.Key {
			case "id":
				cl.ID = t
			case "kind":
				cl.Kind = t
			case "party":
				cl.Party = t
			case "district":
				cl.District = t
			case "text":
				cl.Text = t
			case "system":
				s, err := model.ParseSystem(t)
				if err != nil || !isShown(s) {
					return nil, bad(l, "claim "+strconv.Quote(cl.ID)+": system "+strconv.Quote(t)+" is not one of districts, two-tier, biproportional")
				}
				cl.System = s
			case "systems":
				if f.Value.Kind != jsondoc.Array || len(f.Value.Items) != 2 {
					return nil, bad(l, "claim "+strconv.Quote(cl.ID)+": systems is a list of two systems")
				}
				for _, it := range f.Value.Items {
					s, err := model.ParseSystem(it.Text)
					if it.Kind != jsondoc.String || err != nil || !isShown(s) {
						return nil, bad(l, "claim "+strconv.Quote(cl.ID)+": system "+strconv.Quote(it.Text)+" is not one of districts, two-tier, biproportional")
					}
					cl.Systems = append(cl.Systems, s)
				}
			case "seats":
				seats = f.Value
			case "strict":
				if f.Value.Kind != jsondoc.Bool {
					return nil, bad(l, "claim "+strconv.Quote(cl.ID)+": strict is true or false")
				}
				cl.Strict = f.Value.Bool
			default:
				return nil, bad(l, "claim "+strconv.Quote(cl.ID)+": unknown member "+strconv.Quote(f.Key))
			}
		}
		if cl.ID == "" {
			return nil, bad(l, "a claim needs an id")
		}
		if ids[cl.ID] {
			return nil, bad(l, "claim id "+strconv.Quote(cl.ID)+" is used twice")
		}
		ids[cl.ID] = true
		whole := func(x *jsondoc.Value) (int, bool) {
			n, err := strconv.Atoi(x.Text)
			return n, (x.Kind == jsondoc.Number || x.Kind == jsondoc.String) && err == nil && n >= 0
		}
		need := func(what string, ok bool) error {
			if ok {
				return nil
			}
			return bad(l, "claim "+strconv.Quote(cl.ID)+" ("+cl.Kind+") gives no "+what)
		}
		var err error
		switch cl.Kind {
		case "seats":
			if err = need("party", cl.Party != ""); err == nil && (seats == nil || seats.Kind != jsondoc.Object || len(seats.Fields) == 0) {
				err = bad(l, "claim "+strconv.Quote(cl.ID)+": seats is an object of system ids and seats, such as {\"districts\": 14, \"biproportional\": 12}")
			}
			if err == nil {
				for _, f := range seats.Fields {
					s, perr := model.ParseSystem(f.Key)
					n, ok := whole(f.Value)
					if perr != nil || !isShown(s) || !ok {
						return nil, bad(l, "claim "+strconv.Quote(cl.ID)+": "+strconv.Quote(f.Key)+" is not a system with a whole number of seats")
					}
					cl.Systems, cl.Seats = append(cl.Systems, s), append(cl.Seats, n)
				}
			}
		case "differ":
			if err = need("party", cl.Party != ""); err == nil {
				err = need("systems", len(cl.Systems) == 2)
			}
		case "cell-seats":
			n, ok := 0, false
			if seats != nil {
				n, ok = whole(seats)
			}
			cl.Seats = []int{n}
			for _, e := range []error{need("system", cl.System != 0), need("district", cl.District != ""), need("party", cl.Party != ""), need("seats", ok)} {
				if err == nil {
					err = e
				}
			}
		case "district-sums", "no-ties", "certificate":
		case "excluded":
			err = need("party", cl.Party != "")
		default:
			err = bad(l, "claim "+strconv.Quote(cl.ID)+": kind "+strconv.Quote(cl.Kind)+" is not one of "+claimKinds)
		}
		if err != nil {
			return nil, err
		}
		if cl.Party != "" && c.party(cl.Party) < 0 {
			return nil, bad(l, "claim "+strconv.Quote(cl.ID)+" is about "+strconv.Quote(cl.Party)+", which is not a party of the votes")
		}
		if cl.District != "" && c.district(cl.District) < 0 {
			return nil, bad(l, "claim "+strconv.Quote(cl.ID)+" is about "+strconv.Quote(cl.District)+", which is not one of the districts")
		}
		out = append(out, cl)
	}
	return out, nil
}

func isShown(s model.System) bool {
	for _, x := range Systems {
		if x == s {
			return true
		}
	}
	return false
}

func (c *Config) party(name string) int {
	for i, p := range c.Parties {
		if p == name {
			return i
		}
	}
	return -1
}

func (c *Config) district(name string) int {
	for i, d := range c.Source.Scenario.Districts {
		if d.Name == name {
			return i
		}
	}
	return -1
}

// Statement is the claim in words, for a claim with no text of its own.
func (cl *Claim) Statement() string {
	switch cl.Kind {
	case "seats":
		var parts []string
		for i, s := range cl.Systems {
			parts = append(parts, seatsText(cl.Seats[i])+" under "+systemPhrase(s))
		}
		return cl.Party + " wins " + listText(parts) + "."
	case "differ":
		return cl.Party + "'s seats differ under " + systemPhrase(cl.Systems[0]) + " and " + systemPhrase(cl.Systems[1]) + "."
	case "cell-seats":
		return cl.Party + " wins " + seatsText(cl.Seats[0]) + " in " + cl.District + " under " + systemPhrase(cl.System) + "."
	case "district-sums":
		who := "Every district's seats"
		if cl.District != "" {
			who = cl.District + "'s seats"
		}
		return who + " by party add up to its size" + underText(cl.System) + "."
	case "certificate":
		if cl.Strict {
			return "The biproportional divisors are a strict certificate: no other lower apportionment exists."
		}
		return "The biproportional divisors are a valid certificate."
	case "excluded":
		return cl.Party + " is below the threshold."
	}
	return "No tie decides a seat" + underText(cl.System) + "."
}

func underText(s model.System) string {
	if s == 0 {
		return " under any of the three systems"
	}
	return " under " + systemPhrase(s)
}

// systemPhrase is a system's name inside a sentence.
func systemPhrase(s model.System) string {
	t := SystemTitle(s)
	return strings.ToLower(t[:1]) + t[1:]
}

// listText joins "a", "b" and "c" as "a, b and c".
func listText(xs []string) string {
	if len(xs) < 2 {
		return strings.Join(xs, "")
	}
	return strings.Join(xs[:len(xs)-1], ", ") + " and " + xs[len(xs)-1]
}

func seatsText(n int) string {
	if n == 1 {
		return "1 seat"
	}
	return strconv.Itoa(n) + " seats"
}

// Check checks the claim against the block's outcome.
func (cl *Claim) Check(c *Config, o *Outcome) Verdict {
	switch cl.Kind {
	case "seats", "differ":
		p := c.party(cl.Party)
		var got []string
		var n []int
		holds := true
		for i, s := range cl.Systems {
			k := o.Result(s).Parties[p].Seats
			n = append(n, k)
			got = append(got, seatsText(k)+" under "+systemPhrase(s))
			if cl.Kind == "seats" && k != cl.Seats[i] {
				holds = false
			}
		}
		if cl.Kind == "differ" {
			holds = n[0] != n[1]
		}
		return Verdict{holds, cl.Party + " wins " + listText(got)}
	case "cell-seats":
		r := o.Result(cl.System)
		d, p := c.district(cl.District), c.party(cl.Party)
		k := 0
		for _, cell := range r.Cells {
			if cell.District == d && cell.Party == p {
				k = cell.Seats
			}
		}
		return Verdict{k == cl.Seats[0], cl.Party + " wins " + seatsText(k) + " in " + cl.District + " under " + systemPhrase(cl.System)}
	case "district-sums":
		for _, sys := range Systems {
			if cl.System != 0 && sys != cl.System {
				continue
			}
			r := o.Result(sys)
			m := Matrix(r, len(c.Parties))
			for d := range r.Districts {
				if cl.District != "" && r.Districts[d].Name != cl.District {
					continue
				}
				if sum := m.RowSum(d); sum != r.Districts[d].Seats {
					return Verdict{false, r.Districts[d].Name + "'s seats by party add up to " + strconv.Itoa(sum) + " of its " +
						strconv.Itoa(r.Districts[d].Seats) + " under " + systemPhrase(sys)}
				}
			}
			total := 0
			for _, p := range r.Parties {
				total += p.Seats
			}
			if total+r.Unassigned != r.Seats {
				return Verdict{false, "the parties' seats add up to " + strconv.Itoa(total) + " of " + strconv.Itoa(r.Seats) + " under " + systemPhrase(sys)}
			}
		}
		return Verdict{true, "the seats add up in every district and over the parties"}
	case "certificate":
		r := o.Result(model.Biproportional)
		switch {
		case r.Certificate == nil:
			return Verdict{false, "the biproportional result has no certificate (" + r.Pending + ")"}
		case o.Certificate != nil:
			return Verdict{false, "the divisors do not hold: " + o.Certificate.Error()}
		case cl.Strict && !r.Certificate.Strict:
			return Verdict{false, "the divisors hold, but tied cells sit on a signpost"}
		}
		if r.Certificate.Strict {
			return Verdict{true, "every cell rounds strictly to its seats"}
		}
		return Verdict{true, "every cell rounds to its seats; tied cells sit on a signpost"}
	case "excluded":
		pr := o.Results[0].Parties[c.party(cl.Party)]
		return Verdict{!pr.Qualified, cl.Party + ": " + pr.Reason}
	}
	n := 0
	for i, sys := range Systems {
		if cl.System == 0 || sys == cl.System {
			n += len(o.Results[i].Ties)
		}
	}
	switch n {
	case 0:
		return Verdict{true, "no tie"}
	case 1:
		return Verdict{false, "1 tie"}
	}
	return Verdict{false, strconv.Itoa(n) + " ties"}
}
