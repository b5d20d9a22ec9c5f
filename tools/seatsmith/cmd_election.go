package main

import (
	"bytes"
	"flag"
	"io"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/election"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	"seatsmith/engine/report"
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
	table := fs.String("table", "cells", "the table -format csv writes: cells, parties or districts")
	fs.Usage = helpFunc(fs, e.stdout, electionHelp)
	if code, done := parseArgs(fs, args); done {
		return code
	}
	if err := of.check("text", "csv", "json", "markdown"); err != nil {
		return fail(e, "election", err)
	}
	switch *table {
	case "cells", "parties", "districts":
	default:
		return fail(e, "election", usageError("-table: unknown table "+quote(*table)+"; use cells, parties or districts"))
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
	var b bytes.Buffer
	switch of.format {
	case "json":
		b.Write(jsondoc.MarshalIndent(election.Document(src.Title, report.Caution, res), "  "))
	case "csv":
		err = electionTable(res, *table).WriteCSV(&b)
	default:
		err = writeElectionText(&b, src.Title, res, of.format == "markdown")
	}
	if err == nil {
		err = of.write(e, &b)
	}
	if err != nil {
		return fail(e, "election", err)
	}
	return tieNote(e, "election", res.Unassigned > 0 || res.Pending != "")
}

// readElection reads the scenario in the first file and the CSV sections
// of the second, when there is one.
func readElection(e *env, first, second string) (*election.Source, error) {
	r, name, closeFile, err := openArg(e, first)
	if err != nil {
		return nil, err
	}
	src, err := election.Read(name, r)
	closeFile()
	if err != nil {
		return nil, err
	}
	if second == "" {
		return src, nil
	}
	if second == "-" && first == "-" {
		return nil, usageError("standard input can be read once only")
	}
	r, name, closeFile, err = openArg(e, second)
	if err != nil {
		return nil, err
	}
	defer closeFile()
	return src, src.AddCSV(name, r)
}

// electionTable is one of the result's tables.
func electionTable(res *election.Result, which string) *report.Table {
	switch which {
	case "parties":
		return partyTable(res)
	case "districts":
		return districtTable(res)
	}
	t := &report.Table{Header: []string{"district", "party", "votes", "seats", "excluded", "tied"}, Right: []bool{false, false, true, true}}
	for _, c := range res.Cells {
		t.AddRow(report.CSVSafe(res.Districts[c.District].Name), report.CSVSafe(res.Parties[c.Party].Name), c.Votes.String(), strconv.Itoa(c.Seats), yesNo(c.Excluded), yesNo(c.Tied))
	}
	return t
}

func partyTable(res *election.Result) *report.Table {
	h := []string{"party", "votes", "qualified"}
	switch res.System {
	case election.Biproportional:
		h = append(h, "basis", "seats", "divisor")
	case election.TwoTier:
		h = append(h, "district seats", "compensatory", "seats")
	case election.MixedMember:
		h = append(h, "wins", "entitlement", "overhang", "list seats", "seats")
	default:
		h = append(h, "seats")
	}
	t := &report.Table{Header: h, Right: []bool{false, true, false, true, true, true, true, true}}
	for _, p := range res.Parties {
		q := "yes"
		switch {
		case !p.Qualified:
			q = "no (" + p.Reason + ")"
		case p.Reason == election.QualifiedWins || p.Reason == election.QualifiedExempt:
			q = "yes (" + p.Reason + ")"
		}
		row := []string{report.CSVSafe(p.Name), p.Votes.String(), q}
		switch res.System {
		case election.Biproportional:
			basis, div := "", p.Divisor
			if p.Qualified {
				basis = p.Basis.String()
			}
			row = append(row, basis, strconv.Itoa(p.Seats), div)
		case election.TwoTier:
			row = append(row, strconv.Itoa(p.DistrictSeats), strconv.Itoa(p.ListSeats), strconv.Itoa(p.Seats))
		case election.MixedMember:
			ent, over := "", ""
			if p.Qualified {
				ent, over = strconv.Itoa(p.Entitlement), strconv.Itoa(p.Overhang)
			}
			row = append(row, strconv.Itoa(p.DistrictSeats), ent, over, strconv.Itoa(p.ListSeats), strconv.Itoa(p.Seats))
		default:
			row = append(row, strconv.Itoa(p.Seats))
		}
		t.AddRow(row...)
	}
	return t
}

func districtTable(res *election.Result) *report.Table {
	// Columns that say nothing for this election are left out.
	other, pop, div := false, false, false
	for _, d := range res.Districts {
		other = other || !d.OtherVotes.IsZero()
		pop = pop || d.Population != nil
		div = div || d.Divisor != ""
	}
	t := &report.Table{Header: []string{"district", "seats", "votes"}, Right: []bool{false, true, true}}
	for _, c := range []struct {
		on   bool
		name string
	}{{other, "other votes"}, {pop, "population"}, {div, "divisor"}} {
		if c.on {
			t.Header = append(t.Header, c.name)
			t.Right = append(t.Right, true)
		}
	}
	for _, d := range res.Districts {
		row := []string{report.CSVSafe(d.Name), strconv.Itoa(d.Seats), d.Votes.String()}
		if other {
			row = append(row, d.OtherVotes.String())
		}
		if pop {
			p := ""
			if d.Population != nil {
				p = d.Population.String()
			}
			row = append(row, p)
		}
		if div {
			row = append(row, d.Divisor)
		}
		t.AddRow(row...)
	}
	return t
}

// seatMatrix is the seats by district (rows) and party (columns): "-" for a
// party that may take no seat there, "*" after a tied cell's seats, blank
// where the party has no votes.
func seatMatrix(res *election.Result) *report.Table {
	var cols []int
	for j, p := range res.Parties {
		if p.Qualified || p.Seats > 0 {
			cols = append(cols, j)
		}
	}
	h := []string{"district"}
	right := []bool{false}
	for _, j := range cols {
		h = append(h, res.Parties[j].Name)
		right = append(right, true)
	}
	h = append(h, "seats")
	right = append(right, true)
	t := &report.Table{Header: h, Right: right}
	cell := map[[2]int]election.Cell{}
	for _, c := range res.Cells {
		cell[[2]int{c.District, c.Party}] = c
	}
	totals := make([]int, len(cols))
	for i, d := range res.Districts {
		row := []string{d.Name}
		for k, j := range cols {
			c, ok := cell[[2]int{i, j}]
			switch {
			case !ok:
				row = append(row, "")
			case c.Excluded:
				row = append(row, "-")
			case c.Tied:
				row = append(row, strconv.Itoa(c.Seats)+"*")
			default:
				row = append(row, strconv.Itoa(c.Seats))
			}
			totals[k] += c.Seats
		}
		t.AddRow(append(row, strconv.Itoa(d.Seats))...)
	}
	row := []string{"total"}
	sum := 0
	for _, n := range totals {
		row = append(row, strconv.Itoa(n))
		sum += n
	}
	t.AddRow(append(row, strconv.Itoa(sum))...)
	return t
}

// writeElectionText writes the result as text, or Markdown when md is set.
func writeElectionText(w io.Writer, title string, res *election.Result, md bool) error {
	var b strings.Builder
	heading := func(s string) {
		if md {
			b.WriteString("## " + s + "\n\n")
		} else {
			b.WriteString(s + ":\n")
		}
	}
	para := func(s string) {
		if md {
			b.WriteString(s + "\n\n")
		} else {
			b.WriteString(report.Wrap(s, 76) + "\n")
		}
	}
	if title != "" {
		if md {
			b.WriteString("# " + title + "\n\n")
		} else {
			b.WriteString(title + "\n")
		}
	}
	para(electionSummary(res))
	if !md {
		b.WriteString("\n")
	}
	flush := func(t *report.Table) error {
		io.WriteString(w, b.String())
		b.Reset()
		if err := t.Write(w, md); err != nil {
			return err
		}
		io.WriteString(w, "\n")
		return nil
	}
	heading("Parties")
	if err := flush(partyTable(res)); err != nil {
		return err
	}
	if len(res.Districts) > 0 {
		heading("Districts")
		if err := flush(districtTable(res)); err != nil {
			return err
		}
	}
	if len(res.Cells) > 0 && res.System != election.MixedMember {
		heading("Seats by district and party")
		if err := flush(seatMatrix(res)); err != nil {
			return err
		}
		para(`"-": the party may take no seat in the district (threshold or qualification); "*": the cell is tied.`)
		if !md {
			b.WriteString("\n")
		}
	}
	if c := res.Certificate; c != nil {
		s := "Certificate: every cell's votes divided by its district divisor and its party divisor rounds to its seats at the method's signposts, checked exactly."
		if c.Strict {
			s += " No quotient sits on a signpost, so no other lower apportionment exists."
		} else {
			s += " Tied cells sit on a signpost: another lower apportionment exists."
		}
		para(s)
	}
	if res.Pending != "" {
		para("Pending: " + res.Pending + ".")
	}
	if len(res.Ties) == 0 {
		para("Ties: none.")
	}
	for _, t := range res.Ties {
		para(tieText(res, t))
	}
	if res.Unassigned > 0 {
		para(strconv.Itoa(res.Unassigned) + " seat" + plural(res.Unassigned) + " left unassigned by a tie; settle with -tiebreak or by the governing rule.")
	}
	if !md {
		b.WriteString("\n")
		b.WriteString(report.Wrap(report.Caution, 76) + "\n")
	} else {
		b.WriteString("> " + report.Caution + "\n")
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// electionSummary says what was computed, in a sentence or two.
func electionSummary(res *election.Result) string {
	var s strings.Builder
	s.WriteString(strings.ToUpper(res.System.Name()[:1]) + res.System.Name()[1:] + " election, " + res.Method.Name() + ", " + strconv.Itoa(res.Seats) + " seats.")
	switch res.System {
	case election.Biproportional:
		basis := "votes"
		if res.UpperBasis == election.Voters {
			basis = "voter numbers (votes over the district's seats, rounded)"
		}
		s.WriteString(" Parties' seats over the election by " + res.UpperMethod.Name() + " on their " + basis + "; seats within districts by the lower apportionment.")
	case election.TwoTier:
		s.WriteString(" " + strconv.Itoa(res.BaseSeats) + " district seats, " + strconv.Itoa(res.Compensatory) + " compensatory seats; national totals by " + res.UpperMethod.Name() + " with each party's district seats as its minimum.")
	case election.MixedMember:
		s.WriteString(" House of " + strconv.Itoa(res.BaseSeats) + " before overhang; overhang rule " + res.Overhang.String() + ".")
	}
	if res.DistrictSeats != nil {
		s.WriteString(" Districts' seats apportioned from their populations by " + res.DistrictSeats.Method.Name() + ".")
	}
	var qual, within []string
	for _, t := range res.Thresholds {
		of := "the votes for lists"
		if t.Base == election.Valid {
			of = "all valid votes"
		}
		pct := sharePercent(t.Share)
		switch t.Scope {
		case election.Election:
			qual = append(qual, pct+" of "+of+" over the election")
		case election.AnyDistrict:
			qual = append(qual, pct+" of "+of+" in at least one district")
		case election.InDistrict:
			within = append(within, pct+" of "+of+" in the district")
		}
	}
	if len(qual) > 0 {
		if res.WinsThreshold > 0 {
			qual = append(qual, strconv.Itoa(res.WinsThreshold)+" district seat"+plural(res.WinsThreshold)+" won")
		}
		s.WriteString(" A party qualifies with " + strings.Join(qual, ", or ") + ".")
	}
	if len(within) > 0 {
		s.WriteString(" Within each district a party needs " + strings.Join(within, " and ") + ".")
	}
	return s.String()
}

func tieText(res *election.Result, t election.Tie) string {
	var s strings.Builder
	s.WriteString("TIE (" + t.Stage + "): ")
	var names []string
	for _, k := range t.Districts {
		names = append(names, res.Districts[k].Name)
	}
	for _, k := range t.Parties {
		names = append(names, res.Parties[k].Name)
	}
	for _, c := range t.Cells {
		names = append(names, res.Parties[c.Party].Name+" in "+res.Districts[c.District].Name)
	}
	s.WriteString(strings.Join(names, ", "))
	if t.District >= 0 {
		s.WriteString(" in district " + res.Districts[t.District].Name)
	}
	s.WriteString(" contest " + strconv.Itoa(t.Seats) + " seat" + plural(t.Seats))
	if t.Value != "" {
		s.WriteString(" at " + t.Value)
	}
	if t.Rule == "none" || t.Rule == "" {
		s.WriteString("; left unassigned.")
		return s.String()
	}
	var w []string
	for _, k := range t.Winners {
		if t.Stage == election.StageDistrictSeats {
			w = append(w, res.Districts[k].Name)
		} else {
			w = append(w, res.Parties[k].Name)
		}
	}
	for _, c := range t.WinnerCells {
		w = append(w, res.Parties[c.Party].Name+" in "+res.Districts[c.District].Name)
	}
	s.WriteString("; settled by " + t.Rule + ": " + strings.Join(w, ", ") + ".")
	return s.String()
}

// sharePercent writes a share as an exact percentage: 0.05 as "5%".
func sharePercent(d engine.Decimal) string {
	if d.Places >= 2 {
		d.Places -= 2
	} else {
		for ; d.Places < 2; d.Places++ {
			d.Coef *= 10
		}
		d.Places = 0
	}
	return d.String() + "%"
}

func yesNo(b bool) string {
	if b {
		return "yes"
	}
	return "no"
}

func plural(n int) string {
	if n == 1 {
		return ""
	}
	return "s"
}
