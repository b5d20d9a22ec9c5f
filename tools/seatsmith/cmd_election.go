package main

import (
	"bufio"
	"errors"
	"flag"
	"io"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/election"
	"seatsmith/engine/format"
	"seatsmith/engine/input"
)

func init() {
	register(&command{name: "election", summary: "seats of an election with districts: per district, biproportional, two-tier, mixed-member", run: runElection})
}

const electionHelp = `Usage: seatsmith election [options] FILE [FILE]

Turns the votes of an election with districts into seats by one of four
systems, exactly, and reports every tie:

  districts       each district's seats among its parties on their own;
                  national totals are sums
  biproportional  the parties' seats over the whole election (upper
                  apportionment) and the districts' seats, then a divisor
                  for every district and every party such that rounding
                  votes / (district divisor x party divisor) meets every
                  total (lower apportionment; a divisor method). The
                  divisors are the certificate: every cell is checked
                  exactly against them
  two-tier        district seats first, then -compensatory seats so that
                  each party's national total follows its votes as
                  closely as the method allows, never taking a district
                  seat away
  mixed-member    each party's total follows its list votes; its district
                  wins count towards it, list seats fill the rest; an
                  overhang is kept (keep), levelled (level: the house grows
                  until no party has more wins than seats) or absorbed by
                  the others (fixed: the house keeps its size)

FILE is a JSON election scenario ({"kind": "election", ...}) or CSV: vote
rows (district,party,votes[,wins]) and, after a blank line or in a second
FILE, the districts (district,seats[,population][,other_votes]) and parties
(party[,wins][,exempt][,independent]). Both formats are described in the
package documentation of engine/election. Options override the file.

A party qualifies when it reaches -threshold (a share: 5% or 0.05) of the
votes for lists (-threshold-base lists) or of all valid votes, blank
ballots and other votes recorded included (valid), over the whole election
(-threshold-scope election) or in at least one district (any-district), or
when it has won -alternative-wins district seats. With -threshold-scope
district the share applies within each district instead.

JSON (-format json): {version, kind: "election-result", caution, title,
system, method, upper_method, seats, base_seats, compensatory,
overhang_rule, upper_basis, tie_rule, unassigned, pending, parties: [{name,
votes, qualified, reason, exempt, seats, district_seats, list_seats,
entitlement, overhang, basis, divisor}], districts: [{name, seats, votes,
other_votes, population, divisor}], cells: [{district, party, votes, seats,
excluded, tied}], ties: [{stage, district, districts, parties, cells,
seats, value, rule, winners}], certificate}. CSV (-format csv) writes one
table: -table cells (the default), parties or districts.

Examples:
  seatsmith election -system districts -method dhondt testdata/demo/vessaria-election.csv
  seatsmith election testdata/demo/vessaria-election.json
  seatsmith election -system two-tier -method dhondt -upper-method sainte-lague -compensatory 12 -threshold 4% testdata/demo/vessaria-election.csv
  seatsmith election -overhang level -format json testdata/demo/vessaria-mixed.json

Options:
`

// electionFlags are the election command's scenario options.
type electionFlags struct {
	system, method, upper, district, overhang, basis string
	threshold, scope, base, tiebreak                 string
	seats, compensatory, altWins                     int
}

func (f *electionFlags) bind(fs *flag.FlagSet) {
	fs.StringVar(&f.system, "system", "", "system: districts, biproportional, two-tier or mixed-member")
	fs.StringVar(&f.method, "method", "", "method within districts, of the lower apportionment, or of the list seats: "+strings.Join(engine.MethodIDs(), ", "))
	fs.StringVar(&f.upper, "upper-method", "", "method of the parties' seats (biproportional) or the national tier (two-tier); default -method")
	fs.StringVar(&f.district, "district-method", "", "method of the districts' seats from their populations; default the upper method")
	fs.IntVar(&f.seats, "seats", 0, "house size (mixed-member: before overhang; else needed only when the districts' seats come from populations)")
	fs.IntVar(&f.compensatory, "compensatory", 0, "compensatory seats (two-tier)")
	fs.StringVar(&f.overhang, "overhang", "", "overhang rule (mixed-member): keep, level or fixed")
	fs.StringVar(&f.basis, "upper-basis", "", "what the biproportional upper apportionment divides: votes, or voters (votes over the district's seats, rounded)")
	fs.StringVar(&f.threshold, "threshold", "", "share of the votes a party needs, e.g. 5% or 0.05 (none: no threshold)")
	fs.StringVar(&f.scope, "threshold-scope", "", "where -threshold is measured: election, any-district or district")
	fs.StringVar(&f.base, "threshold-base", "", "what -threshold is a share of: lists (votes for lists) or valid (all valid votes)")
	fs.IntVar(&f.altWins, "alternative-wins", 0, "a party below the threshold qualifies with this many district seats won (mixed-member, two-tier)")
	fs.StringVar(&f.tiebreak, "tiebreak", "", "how to settle a tie: none (report it), order (input order), lot:SEED")
}

// apply copies the options given on the command line over the scenario.
func (f *electionFlags) apply(fs *flag.FlagSet, s *election.Scenario) error {
	set := map[string]bool{}
	fs.Visit(func(fl *flag.Flag) { set[fl.Name] = true })
	flagErr := func(name, msg string) error { return usageError("-" + name + ": " + msg) }
	msg := func(err error) string {
		if e, ok := err.(*election.Error); ok {
			return e.Msg
		}
		return errMsg(err)
	}
	if set["system"] {
		sys, err := election.ParseSystem(f.system)
		if err != nil {
			return flagErr("system", msg(err))
		}
		s.System = sys
	}
	for _, m := range []struct {
		name string
		text string
		dst  *engine.Method
	}{{"method", f.method, &s.Method}, {"upper-method", f.upper, &s.UpperMethod}, {"district-method", f.district, &s.DistrictMethod}} {
		if !set[m.name] {
			continue
		}
		mm, err := engine.ParseMethod(m.text)
		if err != nil {
			return flagErr(m.name, msg(err))
		}
		*m.dst = mm
	}
	for _, n := range []struct {
		name string
		v    int
		dst  *int
	}{{"seats", f.seats, &s.Seats}, {"compensatory", f.compensatory, &s.Compensatory}, {"alternative-wins", f.altWins, &s.WinsThreshold}} {
		if !set[n.name] {
			continue
		}
		if n.v < 0 || n.v > engine.MaxSeats {
			return flagErr(n.name, "must be between 0 and "+strconv.Itoa(engine.MaxSeats))
		}
		*n.dst = n.v
	}
	if set["overhang"] {
		r, err := election.ParseOverhangRule(f.overhang)
		if err != nil {
			return flagErr("overhang", msg(err))
		}
		s.Overhang = r
	}
	if set["upper-basis"] {
		b, err := election.ParseBasis(f.basis)
		if err != nil {
			return flagErr("upper-basis", msg(err))
		}
		s.UpperBasis = b
	}
	if (set["threshold-scope"] || set["threshold-base"]) && !set["threshold"] {
		return usageError("-threshold-scope and -threshold-base qualify -threshold; give it too")
	}
	if set["threshold"] {
		s.Thresholds = nil
		if t := strings.TrimSpace(f.threshold); t != "none" && t != "" {
			share, err := input.ParseShare(t)
			if err != nil {
				return flagErr("threshold", err.Error())
			}
			th := election.Threshold{Share: share}
			if th.Scope, err = election.ParseScope(f.scope); err != nil {
				return flagErr("threshold-scope", msg(err))
			}
			if th.Base, err = election.ParseBase(f.base); err != nil {
				return flagErr("threshold-base", msg(err))
			}
			s.Thresholds = []election.Threshold{th}
		}
	}
	if set["tiebreak"] {
		t, err := engine.ParseTieRule(f.tiebreak)
		if err != nil {
			return flagErr("tiebreak", msg(err))
		}
		s.Tie = t
	}
	if !s.System.Valid() {
		return usageError("no system: give -system (or \"system\" in a JSON scenario)")
	}
	if !s.Method.Valid() {
		return usageError("no method: give -method (or \"method\" in a JSON scenario)")
	}
	return nil
}

func runElection(e *env, args []string) int {
	fs := flag.NewFlagSet("election", flag.ContinueOnError)
	fs.SetOutput(e.stderr)
	var of outputFlags
	var ef electionFlags
	of.bind(fs, "text", "csv", "json", "markdown")
	ef.bind(fs)
	tableName := fs.String("table", "cells", "the table -format csv writes: cells, parties or districts")
	fs.Usage = helpFunc(fs, e.stdout, electionHelp)
	if code, done := parseArgs(fs, args); done {
		return code
	}
	if err := of.check("text", "csv", "json", "markdown"); err != nil {
		return fail(e, "election", err)
	}
	table, ok := format.ParseElectionTable(*tableName)
	if !ok {
		return fail(e, "election", usageError("-table: unknown table "+quote(*tableName)+"; use cells, parties or districts"))
	}
	if fs.NArg() < 1 || fs.NArg() > 2 {
		return fail(e, "election", usageError("expected FILE (or - for standard input), and optionally a second FILE with CSV sections, got "+strconv.Itoa(fs.NArg())+" arguments"))
	}
	src, err := readElection(e, fs.Arg(0), fs.Arg(1))
	if err != nil {
		return fail(e, "election", err)
	}
	if err := ef.apply(fs, &src.Scenario); err != nil {
		return fail(e, "election", err)
	}
	res, err := src.Compute()
	if err != nil {
		return fail(e, "election", err)
	}
	if err := of.encode(e, format.Election(src.Title, res, table)); err != nil {
		return fail(e, "election", err)
	}
	return tieNote(e, "election", res.Unassigned > 0 || res.Pending != "")
}

// readElection reads the scenario in the first file and the CSV sections
// of the second, when there is one, as every command reads its files:
// UTF-16 text, NUL bytes and JSON arrays refused at the start, no file
// larger than maxElectionBytes, names that are not text refused by file
// and line, names compared in Unicode normalization form C.
func readElection(e *env, first, second string) (*election.Source, error) {
	r, name, closeFile, err := openElection(e, first)
	if err != nil {
		return nil, err
	}
	src, err := election.Read(name, r)
	closeFile()
	if err != nil {
		return nil, err
	}
	if second != "" {
		if second == "-" && first == "-" {
			return nil, usageError("standard input can be read once only")
		}
		r, name, closeFile, err = openElection(e, second)
		if err != nil {
			return nil, err
		}
		err = src.AddCSV(name, r)
		closeFile()
		if err != nil {
			return nil, err
		}
	}
	return src, electionNames(src)
}

// openElection opens a file argument for an election reader, looking at
// its start first and bounding what is read.
func openElection(e *env, arg string) (io.Reader, string, func(), error) {
	r, name, closeFile, err := openArg(e, arg)
	if err != nil {
		return nil, name, nil, err
	}
	br := bufio.NewReaderSize(&boundedReader{r: r, left: maxElectionBytes}, 64<<10)
	if _, err := input.Sniff(name, br); err != nil {
		closeFile()
		var ie *input.Error
		if errors.As(err, &ie) && strings.HasPrefix(ie.Msg, "a JSON array") {
			ie.Msg = "a JSON array; an election scenario is a JSON object, such as {\"kind\": \"election\", \"system\": \"districts\", ...}"
		}
		return nil, name, nil, err
	}
	return br, name, closeFile, nil
}

// maxElectionBytes bounds an election file: the readers hold it whole, so
// an endless input would otherwise grow without bound. A million vote
// rows (the readers' own limit) of 128 bytes each fit.
const maxElectionBytes = 128 << 20

// A boundedReader reads at most left bytes and then fails, naming the
// limit, so that an endless input is refused rather than held in memory.
type boundedReader struct {
	r    io.Reader
	left int64
}

func (b *boundedReader) Read(p []byte) (int, error) {
	if b.left <= 0 {
		// One byte more tells an input of exactly the limit from a longer one.
		var one [1]byte
		if n, _ := b.r.Read(one[:]); n == 0 {
			return 0, io.EOF
		}
		return 0, errors.New("the file is larger than the limit of " + strconv.Itoa(maxElectionBytes>>20) + " MiB for an election")
	}
	if int64(len(p)) > b.left {
		p = p[:b.left]
	}
	n, err := b.r.Read(p)
	b.left -= int64(n)
	return n, err
}

// electionNames refuses names that are not text and puts every name in
// Unicode normalization form C, so that a name written with a composed
// letter and with a letter and a combining mark is one district or party.
func electionNames(src *election.Source) error {
	sc := &src.Scenario
	check := func(part string, k int, field string, name *string) error {
		if p := nameProblem(*name); p != "" {
			file, line := src.Line(part, k)
			return &input.Error{File: file, Line: line, Field: part + "[" + strconv.Itoa(k) + "]." + field, Msg: "the text " + p}
		}
		*name = readOptions.NameForm(*name)
		return nil
	}
	for k := range sc.Districts {
		if err := check("districts", k, "name", &sc.Districts[k].Name); err != nil {
			return err
		}
	}
	for k := range sc.Parties {
		if err := check("parties", k, "name", &sc.Parties[k].Name); err != nil {
			return err
		}
	}
	for k := range sc.Votes {
		if err := check("votes", k, "district", &sc.Votes[k].District); err != nil {
			return err
		}
		if err := check("votes", k, "party", &sc.Votes[k].Party); err != nil {
			return err
		}
	}
	if p := nameProblem(src.Title); p != "" {
		file, _ := src.Line("title", 0)
		return &input.Error{File: file, Field: "title", Msg: "the text " + p}
	}
	return nil
}
