package projection

import (
	"context"
	"strconv"
	"strings"
	"unicode/utf8"

	"seatsmith/engine"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	model "seatsmith/engine/projection"
)

// Limits of a projection block: a page runs in one tab, and every unit is
// a row of the block's table and chart.
const (
	// MaxDraws is the most draws one block makes.
	MaxDraws = 200_000
	// MaxUnits is the most units its counts may have, and MaxNameLength
	// the most characters of a unit's name.
	MaxUnits      = 1_000
	MaxNameLength = 200
	// MaxSeats is the largest house a block apportions at every draw.
	MaxSeats = 100_000
)

// A Config is one projection block: the counts, the scenario settings the
// counts leave open, the projection and error model, the draws and the
// claims.
type Config struct {
	File   string // the page or file the block comes from, for messages
	Line   int    // the line the block starts on (0 when unknown)
	Title  string
	Counts string // the counts, as CSV or a JSON counts document
	// CountsFile names the counts in messages (the sample file's name).
	CountsFile string
	Seats      int
	Method     engine.Method
	Min        int
	Target     model.Date
	Growth     model.Growth
	Fit        model.Fit
	Error      model.Distribution
	RSE        float64
	RSEText    string // the relative standard error as written
	Draws      int
	Seed       uint64
	Claims     []Claim
}

// Parse reads a block document:
//
//	title        a heading for the result (optional)
//	counts       the counts as text: CSV (name,date,population,rse,...) or a
//	             JSON counts document (see package projection)
//	counts_file  the name the counts are known by, for messages (optional)
//	seats        the house size (whole number, required unless the counts give it)
//	method       a method id (required unless the counts give it)
//	min          the minimum seats of every unit (optional)
//	target       the date projected to, YYYY-MM-DD, YYYY-MM or YYYY (required)
//	growth       "linear" (default) or "geometric"
//	fit          "all" (default) or "last2"
//	error        "normal" (default) or "lognormal"
//	rse          the relative standard error of units without their own, "2%" or 0.02
//	draws        the number of draws (1 to MaxDraws, default 2000)
//	seed         the seed (whole number, default 1)
//	claims       an array of claims (see [Claim])
//
// Numbers may be written as JSON numbers or as strings, as form fields
// give them. A bad member is an *input.Error naming file, line and field.
func Parse(file string, line int, v *jsondoc.Value) (*Config, error) {
	bad := func(field, msg string) error { return &input.Error{File: file, Line: line, Field: field, Msg: msg} }
	if v == nil || v.Kind != jsondoc.Object {
		return nil, bad("", "a projection block is a JSON object")
	}
	c := &Config{File: file, Line: line, Growth: model.Linear, Error: model.Normal, Draws: 2000, Seed: 1}
	for _, f := range v.Fields {
		x := f.Value
		text := jsondoc.ScalarText(x)
		switch f.Key {
		case "title":
			c.Title = text
		case "counts":
			if x.Kind != jsondoc.String {
				return nil, bad("counts", "give the counts as text (CSV or a JSON counts document)")
			}
			c.Counts = x.Text
		case "counts_file":
			c.CountsFile = text
		case "seats", "min", "draws":
			n, err := strconv.Atoi(strings.TrimSpace(text))
			if err != nil || n < 0 {
				return nil, bad(f.Key, strconv.Quote(text)+" is not a whole number of zero or more")
			}
			switch f.Key {
			case "seats":
				c.Seats = n
			case "min":
				c.Min = n
			case "draws":
				if n < 1 || n > MaxDraws {
					return nil, bad("draws", "give from 1 to "+strconv.Itoa(MaxDraws)+" draws, not "+strconv.Itoa(n))
				}
				c.Draws = n
			}
		case "seed":
			s, err := strconv.ParseUint(strings.TrimSpace(text), 10, 64)
			if err != nil {
				return nil, bad("seed", strconv.Quote(text)+" is not a seed: give a whole number from 0 to 18446744073709551615")
			}
			c.Seed = s
		case "method":
			m, err := engine.ParseMethod(text)
			if err != nil {
				return nil, bad("method", err.Error())
			}
			c.Method = m
		case "target":
			d, err := model.ParseDate(strings.TrimSpace(text))
			if err != nil {
				return nil, bad("target", err.Error())
			}
			c.Target = d
		case "growth":
			g, err := model.ParseGrowth(strings.TrimSpace(text))
			if err != nil {
				return nil, bad("growth", err.Error())
			}
			c.Growth = g
		case "fit":
			ft, err := model.ParseFit(strings.TrimSpace(text))
			if err != nil {
				return nil, bad("fit", err.Error())
			}
			c.Fit = ft
		case "error":
			d, err := model.ParseDistribution(strings.TrimSpace(text))
			if err != nil {
				return nil, bad("error", err.Error())
			}
			c.Error = d
		case "rse":
			r, err := model.ParseRSE(strings.TrimSpace(text))
			if err != nil {
				return nil, bad("rse", err.Error())
			}
			c.RSE, c.RSEText = r, strings.TrimSpace(text)
		case "claims":
			cl, err := parseClaims(file, line, x)
			if err != nil {
				return nil, err
			}
			c.Claims = cl
		default:
			return nil, bad(f.Key, "unknown member "+strconv.Quote(f.Key)+" of a projection block")
		}
	}
	if c.Counts == "" {
		return nil, bad("counts", "missing: give the counts")
	}
	if c.Target == (model.Date{}) {
		return nil, bad("target", "missing: give the date to project to")
	}
	return c, nil
}

// Study reads the counts and prepares the study (no draws made yet).
// Errors name the counts file, line and field.
func (c *Config) Study() (*model.Study, error) {
	name := c.CountsFile
	if name == "" {
		name = "counts"
	}
	counts, err := model.ReadCounts(name, strings.NewReader(c.Counts))
	if err != nil {
		return nil, err
	}
	if n := len(counts.Series); n > MaxUnits {
		return nil, &input.Error{File: c.File, Line: c.Line, Field: "counts", Msg: strconv.Itoa(n) + " units is more than the limit of " +
			strconv.Itoa(MaxUnits) + " units a projection block shows; the command-line tool takes more"}
	}
	for i, s := range counts.Series {
		if n := utf8.RuneCountInString(s.Name); n > MaxNameLength {
			return nil, &input.Error{File: c.File, Line: c.Line, Field: "counts", Msg: "unit " + strconv.Itoa(i+1) + ": a name of " + strconv.Itoa(n) +
				" characters is longer than the limit of " + strconv.Itoa(MaxNameLength) + " characters"}
		}
	}
	if !counts.Given["seats"] && c.Seats > 0 {
		counts.Scenario.Seats = c.Seats
	}
	if !counts.Given["method"] && c.Method.Valid() {
		counts.Scenario.Method = c.Method
	}
	if !counts.Given["min"] && c.Min > 0 {
		counts.Scenario.Min = c.Min
	}
	if counts.Scenario.Seats <= 0 {
		return nil, &input.Error{File: c.File, Line: c.Line, Field: "seats", Msg: "missing: give the house size"}
	}
	if n := counts.Scenario.Seats; n > MaxSeats {
		return nil, &input.Error{File: c.File, Line: c.Line, Field: "seats", Msg: "the house size " + strconv.Itoa(n) + " is larger than the limit of " +
			strconv.Itoa(MaxSeats) + " seats a projection block apportions; the command-line tool takes larger houses"}
	}
	if !counts.Scenario.Method.Valid() {
		return nil, &input.Error{File: c.File, Line: c.Line, Field: "method", Msg: "missing: give a method"}
	}
	for _, cl := range c.Claims {
		found := false
		for _, s := range counts.Series {
			found = found || s.Name == cl.Unit
		}
		if !found {
			return nil, &input.Error{File: c.File, Line: c.Line, Field: "claims", Msg: "claim " + strconv.Quote(cl.ID) + " is about " + strconv.Quote(cl.Unit) + ", which is not a unit of the counts"}
		}
	}
	target := c.Target
	return model.New(counts, model.Options{
		Target: &target, Growth: c.Growth, Fit: c.Fit, Error: c.Error, RSE: c.RSE,
		Draws: c.Draws, Seed: c.Seed, Workers: 1, Contest: model.DefaultContest,
	})
}

// Run prepares the study and makes every draw: what the site build does.
func (c *Config) Run(ctx context.Context) (*model.Summary, error) {
	st, err := c.Study()
	if err != nil {
		return nil, err
	}
	if err := st.RunAll(ctx); err != nil {
		return nil, err
	}
	return st.Summary(), nil
}
