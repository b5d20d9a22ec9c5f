package format

import (
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/election"
)

// An ElectionTable names the table an election's CSV file holds.
type ElectionTable string

// The tables of an election result.
const (
	ElectionCells     ElectionTable = "cells"     // one row a party in a district
	ElectionParties   ElectionTable = "parties"   // one row a party
	ElectionDistricts ElectionTable = "districts" // one row a district
)

// ParseElectionTable reads a table's name.
func ParseElectionTable(s string) (ElectionTable, bool) {
	switch t := ElectionTable(s); t {
	case ElectionCells, ElectionParties, ElectionDistricts:
		return t, true
	}
	return "", false
}

// Election returns the document of an election's result: what was
// computed, the parties, the districts, the seats by district and party,
// the certificate and every tie; its CSV data is the table data names.
func Election(title string, res *election.Result, data ElectionTable) *Document {
	d := &Document{Kind: election.ResultKind, Title: title}
	if d.Title == "" {
		d.Title = "Election"
	}
	d.Body = append(d.Body, Paragraph{electionSummary(res)}, Heading{"Parties"}, partyTable(res))
	if len(res.Districts) > 0 {
		d.Body = append(d.Body, Heading{"Districts"}, districtTable(res))
	}
	if len(res.Cells) > 0 && res.System != election.MixedMember {
		d.Body = append(d.Body, Heading{"Seats by district and party"}, seatMatrix(res),
			Paragraph{`"-": the party may take no seat in the district (threshold or qualification); "*": the cell is tied.`})
	}
	if c := res.Certificate; c != nil {
		s := "Certificate: every cell's votes divided by its district divisor and its party divisor rounds to its seats at the method's signposts, checked exactly."
		if c.Strict {
			s += " No quotient sits on a signpost, so no other lower apportionment exists."
		} else {
			s += " Tied cells sit on a signpost: another lower apportionment exists."
		}
		d.Body = append(d.Body, Paragraph{s})
	}
	if res.Pending != "" {
		d.Body = append(d.Body, Paragraph{"Pending: " + res.Pending + "."})
	}
	if len(res.Ties) == 0 {
		d.Body = append(d.Body, Paragraph{"Ties: none."})
	} else {
		var ts []string
		for _, t := range res.Ties {
			ts = append(ts, ElectionTieText(res, t))
		}
		d.Body = append(d.Body, List{Items: ts})
	}
	if res.Unassigned > 0 {
		d.Body = append(d.Body, Paragraph{Plural(res.Unassigned, "seat") + " left unassigned by a tie; settle with -tiebreak or by the governing rule."})
	}
	switch data {
	case ElectionParties:
		d.Data = partyData(res)
	case ElectionDistricts:
		d.Data = districtData(res)
	default:
		d.Data = cellData(res)
	}
	d.Tree = func() *Tree { return &Tree{Root: ElectionJSON(title, res)} }
	return d
}

// electionSummary says what was computed, in a sentence or two.
func electionSummary(res *election.Result) string {
	var s strings.Builder
	s.WriteString(capital(res.System.Name()) + " election, " + res.Method.Name() + ", " + Plural(res.Seats, "seat") + ".")
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
		pct := SharePercent(t.Share)
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
			qual = append(qual, Plural(res.WinsThreshold, "district seat")+" won")
		}
		s.WriteString(" A party qualifies with " + strings.Join(qual, ", or ") + ".")
	}
	if len(within) > 0 {
		s.WriteString(" Within each district a party needs " + strings.Join(within, " and ") + ".")
	}
	return s.String()
}

// ElectionTieText says who tied, at which stage, for how many seats, and
// what became of them.
func ElectionTieText(res *election.Result, t election.Tie) string {
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
		names = append(names, cellName(res, c))
	}
	s.WriteString(strings.Join(names, ", "))
	if t.District >= 0 {
		s.WriteString(" in district " + res.Districts[t.District].Name)
	}
	s.WriteString(" contest " + Plural(t.Seats, "seat"))
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
		w = append(w, cellName(res, c))
	}
	s.WriteString("; settled by " + t.Rule + ": " + strings.Join(w, ", ") + ".")
	return s.String()
}

func cellName(res *election.Result, c election.CellRef) string {
	return res.Parties[c.Party].Name + " in " + res.Districts[c.District].Name
}

// SharePercent writes a share as an exact percentage: 0.05 as "5%".
func SharePercent(d engine.Decimal) string {
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

// qualifiedText is a party's qualification for people: "yes", "no (below
// threshold)", "yes (exempt)".
func qualifiedText(p *election.PartyResult) string {
	switch {
	case !p.Qualified:
		return "no (" + p.Reason + ")"
	case p.Reason == election.QualifiedWins || p.Reason == election.QualifiedExempt:
		return "yes (" + p.Reason + ")"
	}
	return "yes"
}

// partyTable has one row a party, with the columns its system fills, and
// a row of the seats a tie left unassigned when one did.
func partyTable(res *election.Result) *Table {
	cols := []Column{{Name: "party"}, {Name: "votes", Number: true}, {Name: "qualified"}}
	switch res.System {
	case election.Biproportional:
		cols = append(cols, Numbers("basis", "seats", "divisor")...)
	case election.TwoTier:
		cols = append(cols, Numbers("district seats", "compensatory", "seats")...)
	case election.MixedMember:
		cols = append(cols, Numbers("wins", "entitlement", "overhang", "list seats", "seats")...)
	default:
		cols = append(cols, Numbers("seats")...)
	}
	t := NewTable(cols)
	for i := range res.Parties {
		p := &res.Parties[i]
		row := []string{p.Name, p.Votes.String(), qualifiedText(p)}
		switch res.System {
		case election.Biproportional:
			basis := ""
			if p.Qualified {
				basis = p.Basis.String()
			}
			row = append(row, basis, strconv.Itoa(p.Seats), p.Divisor)
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
		t.Add(row...)
	}
	if n := res.Unassigned; n > 0 {
		row := make([]string, len(cols))
		row[0] = "(unassigned: tie)"
		for i, c := range cols {
			if c.Name == "seats" {
				row[i] = strconv.Itoa(n)
			}
		}
		t.Add(row...)
	}
	return t
}

// districtTable has one row a district; columns that say nothing for this
// election are left out.
func districtTable(res *election.Result) *Table {
	other, pop, div := districtColumns(res)
	t := NewTable(Text("district"), Numbers("seats", "votes"))
	for _, c := range []struct {
		on   bool
		name string
	}{{other, "other votes"}, {pop, "population"}, {div, "divisor"}} {
		if c.on {
			t.Columns = append(t.Columns, Column{Name: c.name, Number: true})
		}
	}
	for _, d := range res.Districts {
		row := []string{d.Name, strconv.Itoa(d.Seats), d.Votes.String()}
		if other {
			row = append(row, d.OtherVotes.String())
		}
		if pop {
			row = append(row, optDecimal(d.Population))
		}
		if div {
			row = append(row, d.Divisor)
		}
		t.Add(row...)
	}
	return t
}

func districtColumns(res *election.Result) (other, pop, div bool) {
	for _, d := range res.Districts {
		other = other || !d.OtherVotes.IsZero()
		pop = pop || d.Population != nil
		div = div || d.Divisor != ""
	}
	return
}

func optDecimal(d *engine.Decimal) string {
	if d == nil {
		return ""
	}
	return d.String()
}

// seatMatrix is the seats by district (rows) and party (columns): "-" for
// a party that may take no seat there, "*" after a tied cell's seats,
// blank where the party has no votes.
func seatMatrix(res *election.Result) *Table {
	var cols []int
	for j, p := range res.Parties {
		if p.Qualified || p.Seats > 0 {
			cols = append(cols, j)
		}
	}
	t := NewTable(Text("district"))
	for _, j := range cols {
		t.Columns = append(t.Columns, Column{Name: res.Parties[j].Name, Number: true})
	}
	t.Columns = append(t.Columns, Column{Name: "seats", Number: true})
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
		t.Add(append(row, strconv.Itoa(d.Seats))...)
	}
	row := []string{"total"}
	sum := 0
	for _, n := range totals {
		row = append(row, strconv.Itoa(n))
		sum += n
	}
	t.Add(append(row, strconv.Itoa(sum))...)
	return t
}

// The CSV data of an election: the settings lead every row, then the
// record's own columns, then whether it is tied and the seats the
// election left unassigned.

// electionSettings returns the columns and cells of an election's
// settings: system, methods, house size, base and compensatory seats,
// overhang rule, upper basis, each threshold (a share, where it is
// measured and of what), the district seats that qualify a party, and the
// tie rule. A cell that does not apply to the system is empty.
func electionSettings(res *election.Result) ([]Column, []string) {
	mm, tt, bp := res.System == election.MixedMember, res.System == election.TwoTier, res.System == election.Biproportional
	cols := append(Text("system", "method", "upper_method"), Numbers("house_size", "base_seats", "compensatory")...)
	cols = append(cols, Text("overhang_rule", "upper_basis")...)
	upper := ""
	if res.UpperMethod.Valid() {
		upper = res.UpperMethod.String()
	}
	cells := []string{res.System.String(), res.Method.String(), upper, strconv.Itoa(res.Seats),
		intCell(mm || tt, res.BaseSeats), intCell(tt, res.Compensatory), strCell(mm, res.Overhang.String()), strCell(bp, res.UpperBasis.String())}
	ths := res.Thresholds
	if len(ths) == 0 {
		ths = []election.Threshold{{}} // no threshold: a share of 0, nothing else
	}
	for i, t := range ths {
		suffix := ""
		if i > 0 {
			suffix = "_" + strconv.Itoa(i+1)
		}
		cols = append(cols, Column{Name: "threshold" + suffix, Number: true}, Column{Name: "threshold_scope" + suffix}, Column{Name: "threshold_base" + suffix})
		if len(res.Thresholds) == 0 {
			cells = append(cells, "0", "", "")
		} else {
			cells = append(cells, t.Share.String(), t.Scope.String(), t.Base.String())
		}
	}
	cols = append(cols, Column{Name: "alternative_wins", Number: true}, Column{Name: "tie_rule"})
	cells = append(cells, intCell(res.WinsThreshold > 0, res.WinsThreshold), res.TieRule.String())
	return cols, cells
}

func intCell(ok bool, n int) string {
	if !ok {
		return ""
	}
	return strconv.Itoa(n)
}

func strCell(ok bool, s string) string {
	if !ok {
		return ""
	}
	return s
}

// tiedSets returns which parties and districts a tie names.
func tiedSets(res *election.Result) (parties, districts []bool) {
	parties, districts = make([]bool, len(res.Parties)), make([]bool, len(res.Districts))
	for _, t := range res.Ties {
		for _, k := range t.Parties {
			parties[k] = true
		}
		for _, k := range t.Districts {
			districts[k] = true
		}
		if t.District >= 0 {
			districts[t.District] = true
		}
		for _, c := range t.Cells {
			parties[c.Party], districts[c.District] = true, true
		}
	}
	return parties, districts
}

// cellData has one row a party's votes in a district.
func cellData(res *election.Result) *Table {
	sc, lead := electionSettings(res)
	t := NewTable(sc, Text("district", "party"), Numbers("votes", "seats"), Text("excluded", "tied"), Numbers("unassigned"))
	un := strconv.Itoa(res.Unassigned)
	for _, c := range res.Cells {
		t.Add(row(lead, res.Districts[c.District].Name, res.Parties[c.Party].Name, c.Votes.String(), strconv.Itoa(c.Seats),
			boolCell(c.Excluded), boolCell(c.Tied), un)...)
	}
	return t
}

// partyData has one row a party; a column its system does not fill is
// empty.
func partyData(res *election.Result) *Table {
	sc, lead := electionSettings(res)
	t := NewTable(sc, Text("party"), Numbers("votes"), Text("qualified", "reason", "exempt"),
		Numbers("seats", "district_seats", "list_seats", "entitlement", "overhang", "basis", "divisor"), Text("tied"), Numbers("unassigned"))
	mm, tt, bp := res.System == election.MixedMember, res.System == election.TwoTier, res.System == election.Biproportional
	tied, _ := tiedSets(res)
	un := strconv.Itoa(res.Unassigned)
	for i, p := range res.Parties {
		basis := ""
		if bp && p.Qualified {
			basis = p.Basis.String()
		}
		t.Add(row(lead, p.Name, p.Votes.String(), boolCell(p.Qualified), p.Reason, boolCell(p.Exempt), strconv.Itoa(p.Seats),
			intCell(mm || tt, p.DistrictSeats), intCell(mm || tt, p.ListSeats), intCell(mm && p.Qualified, p.Entitlement),
			intCell(mm && p.Qualified, p.Overhang), basis, strCell(bp, p.Divisor), boolCell(tied[i]), un)...)
	}
	return t
}

// districtData has one row a district.
func districtData(res *election.Result) *Table {
	sc, lead := electionSettings(res)
	t := NewTable(sc, Text("district"), Numbers("seats", "votes", "other_votes", "population", "divisor"), Text("tied"), Numbers("unassigned"))
	_, tied := tiedSets(res)
	un := strconv.Itoa(res.Unassigned)
	for i, d := range res.Districts {
		t.Add(row(lead, d.Name, strconv.Itoa(d.Seats), d.Votes.String(), d.OtherVotes.String(), optDecimal(d.Population), d.Divisor,
			boolCell(tied[i]), un)...)
	}
	return t
}
