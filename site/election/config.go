package election

import (
	"errors"
	"strconv"
	"strings"

	"seatsmith/engine"
	model "seatsmith/engine/election"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
)

// Limits of an election block: a page computes it after every keystroke,
// and every district is a row and every party a column of its tables.
const (
	MaxDistricts = 60
	MaxParties   = 20
	MaxCells     = 1_200
	// MaxSeats is the most seats of the house, compensatory seats included.
	MaxSeats = 5_000
	// MaxCompensatory is the most compensatory seats.
	MaxCompensatory = 1_000
)

// The three systems a block shows, in the order it shows them.
var Systems = []model.System{model.Districts, model.TwoTier, model.Biproportional}

// A Config is one election block: the scenario the engine reads, the
// compensatory seats of the two-tier system and the claims.
type Config struct {
	File, Title  string
	Line         int
	Compensatory int
	// Threshold is the threshold as written ("" for none).
	Threshold string
	// Source is the scenario as read (by the per-district system); Rows
	// are its vote rows as district and party indexes.
	Source  *model.Source
	Parties []string
	Rows    []CellRef
	Claims  []Claim
}

// A CellRef names one vote row's district and party by index.
type CellRef struct{ District, Party int }

var blockMembers = "title, threshold, compensatory, districts, parties, votes, tie, claims"

// Parse reads a block document:
//
//	title         a heading for the result (optional)
//	threshold     a share of the votes over the whole election that a party
//	              needs for any seat, "4%" or 0.04 (optional; none by default)
//	compensatory  the compensatory seats of the two-tier system (default 0)
//	districts     [{name, seats}], as in an election scenario
//	parties       [{name, exempt}] (optional), as in an election scenario
//	votes         [{district, party, votes}], as in an election scenario
//	tie           none (default), order or lot:SEED
//	claims        an array of claims (see [Claim])
//
// The systems and their methods are the block's own: a document naming
// system or method is refused. Counts may be numbers or strings, as form
// fields give them. A bad member is an *input.Error naming file, line and
// field.
func Parse(file string, line int, v *jsondoc.Value) (*Config, error) {
	bad := func(x *jsondoc.Value, field, msg string) error {
		l := line
		if x != nil && x.Line > 0 {
			l = x.Line
		}
		return &input.Error{File: file, Line: l, Field: field, Msg: msg}
	}
	if v == nil || v.Kind != jsondoc.Object {
		return nil, bad(v, "", "an election block is a JSON object with districts and votes")
	}
	c := &Config{File: file, Line: line}
	doc := jsondoc.NewObject().Set("version", jsondoc.Int(1)).Set("kind", jsondoc.Str(model.Kind)).
		Set("system", jsondoc.Str("districts")).Set("method", jsondoc.Str("jefferson"))
	var claims *jsondoc.Value
	for _, f := range v.Fields {
		x := f.Value
		switch f.Key {
		case "title":
			if x.Kind != jsondoc.String {
				return nil, bad(x, "title", "must be a string")
			}
			c.Title = x.Text
		case "threshold":
			t := ""
			if x.Kind == jsondoc.String || x.Kind == jsondoc.Number {
				t = strings.TrimSpace(x.Text)
			} else if x.Kind != jsondoc.Null {
				return nil, bad(x, "threshold", "give one share of the votes over the whole election, such as \"4%\"")
			}
			c.Threshold = t
			if t != "" {
				doc.Set("threshold", jsondoc.Str(t))
			}
		case "compensatory":
			n, err := strconv.Atoi(strings.TrimSpace(x.Text))
			if (x.Kind != jsondoc.Number && x.Kind != jsondoc.String) || err != nil || n < 0 || n > MaxCompensatory {
				return nil, bad(x, "compensatory", strconv.Quote(x.Text)+" is not a number of compensatory seats from 0 to "+strconv.Itoa(MaxCompensatory))
			}
			c.Compensatory = n
		case "districts", "parties", "votes", "tie":
			doc.Set(f.Key, x)
		case "claims":
			claims = x
		case "system", "method", "upper_method":
			return nil, bad(x, f.Key, "an election block shows its three systems with their own methods; leave "+f.Key+" out")
		default:
			return nil, bad(x, f.Key, "unknown member "+strconv.Quote(f.Key)+" of an election block; it has "+blockMembers)
		}
	}
	if doc.Get("districts") == nil {
		return nil, bad(v, "districts", "missing: give the districts and their seats")
	}
	if doc.Get("votes") == nil {
		return nil, bad(v, "votes", "missing: give the votes")
	}
	src, err := model.FromDoc(file, doc)
	if err != nil {
		return nil, err
	}
	c.Source = src
	if err := c.index(); err != nil {
		return nil, err
	}
	if claims != nil {
		if c.Claims, err = parseClaims(c, claims); err != nil {
			return nil, err
		}
	}
	return c, nil
}

// index checks the block's limits and names every vote row's district and
// party by index, the parties in the engine's order (the parties list,
// then first appearance in the votes).
func (c *Config) index() error {
	s := &c.Source.Scenario
	bad := func(field, msg string) error { return &input.Error{File: c.File, Line: c.Line, Field: field, Msg: msg} }
	limit := func(key, field, msg string) error {
		return &limitError{input.Error{File: c.File, Line: c.Line, Field: field, Msg: msg}, key}
	}
	districts := map[string]int{}
	for i, d := range s.Districts {
		districts[d.Name] = i
	}
	parties := map[string]int{}
	add := func(name string) {
		if _, ok := parties[name]; !ok {
			parties[name] = len(c.Parties)
			c.Parties = append(c.Parties, name)
		}
	}
	for _, p := range s.Parties {
		add(p.Name)
	}
	for _, v := range s.Votes {
		add(v.Party)
	}
	seats := c.Compensatory
	for _, d := range s.Districts {
		seats += d.Seats
	}
	switch {
	case len(s.Districts) > MaxDistricts:
		return limit("districts", "districts", strconv.Itoa(len(s.Districts))+" districts is more than the "+strconv.Itoa(MaxDistricts)+" an election block shows; the command-line tool takes more")
	case len(c.Parties) > MaxParties:
		return limit("parties", "parties", strconv.Itoa(len(c.Parties))+" parties is more than the "+strconv.Itoa(MaxParties)+" an election block shows; the command-line tool takes more")
	case len(s.Votes) > MaxCells:
		return limit("cells", "votes", strconv.Itoa(len(s.Votes))+" vote rows is more than the "+strconv.Itoa(MaxCells)+" an election block shows; the command-line tool takes more")
	case seats > MaxSeats:
		return limit("seats", "districts", "a house of "+strconv.Itoa(seats)+" seats is more than the "+strconv.Itoa(MaxSeats)+" an election block apportions; the command-line tool takes more")
	}
	for _, v := range s.Votes {
		d, ok := districts[v.District]
		if !ok {
			return bad("votes", "votes in "+strconv.Quote(v.District)+", which is not one of the districts")
		}
		c.Rows = append(c.Rows, CellRef{d, parties[v.Party]})
	}
	return nil
}

// scenario is the block's election under system sys: per-district D'Hondt,
// two-tier (D'Hondt in the districts, the national tier by Sainte-Laguë)
// or biproportional Sainte-Laguë.
func (c *Config) scenario(sys model.System) *model.Scenario {
	s := c.Source.Scenario
	s.System = sys
	switch sys {
	case model.Districts:
		s.Method = engine.Jefferson
	case model.TwoTier:
		s.Method, s.UpperMethod, s.Compensatory = engine.Jefferson, engine.Webster, c.Compensatory
	case model.Biproportional:
		s.Method, s.UpperMethod = engine.Webster, engine.Webster
	}
	return &s
}

// An Outcome is the block's election under each of its systems.
type Outcome struct {
	Results [3]*model.Result // in the order of Systems
	// Certificate is what checking the biproportional divisors again
	// found: nil when they hold.
	Certificate error
}

// Result is the outcome under one system.
func (o *Outcome) Result(sys model.System) *model.Result {
	for i, s := range Systems {
		if s == sys {
			return o.Results[i]
		}
	}
	return nil
}

// Run computes the election under the three systems. An error names the
// block's file, line and field.
func (c *Config) Run() (*Outcome, error) {
	o := &Outcome{}
	for i, sys := range Systems {
		r, err := model.Compute(c.scenario(sys))
		if err != nil {
			err = c.Source.Locate(err)
			if ie, ok := err.(*input.Error); ok && ie.Line == 0 {
				ie.Line = c.Line
			}
			return nil, err
		}
		o.Results[i] = r
	}
	if r := o.Result(model.Biproportional); r.Pending == "" {
		o.Certificate = model.Verify(r)
	}
	return o, nil
}

// SystemTitle is a system as the block shows it, with its methods.
func SystemTitle(sys model.System) string {
	switch sys {
	case model.Districts:
		return "Per-district D'Hondt"
	case model.TwoTier:
		return "Two-tier compensation"
	}
	return "Biproportional Sainte-Laguë"
}

// A limitError is an *input.Error from one of the block's limits, which
// key names: "districts", "parties", "cells" or "seats".
type limitError struct {
	err input.Error
	key string
}

func (e *limitError) Error() string { return e.err.Error() }
func (e *limitError) Unwrap() error { return &e.err }

// LimitKey returns the key of the limit err is beyond ("districts",
// "parties", "cells" or "seats", as MaxDistricts, MaxParties, MaxCells and
// MaxSeats), or "" when err is not about a limit.
func LimitKey(err error) string {
	var le *limitError
	if errors.As(err, &le) {
		return le.key
	}
	return ""
}
