package election

import (
	"math/big"
	"strconv"
	"strings"

	model "seatsmith/engine/election"
	"seatsmith/engine/format"
	. "seatsmith/engine/render"
)

// A SeatMatrix is a result's seats by district (rows) and party (columns).
type SeatMatrix struct {
	Seats    [][]int
	Has      [][]bool // the party stood in the district
	Excluded [][]bool
	Tied     [][]bool
}

// Matrix lays out a result's cells by district and party.
func Matrix(r *model.Result, parties int) *SeatMatrix {
	m := &SeatMatrix{}
	for range r.Districts {
		m.Seats = append(m.Seats, make([]int, parties))
		m.Has = append(m.Has, make([]bool, parties))
		m.Excluded = append(m.Excluded, make([]bool, parties))
		m.Tied = append(m.Tied, make([]bool, parties))
	}
	for _, c := range r.Cells {
		if c.District < 0 || c.Party >= parties {
			continue
		}
		m.Seats[c.District][c.Party] += c.Seats
		m.Has[c.District][c.Party] = true
		m.Excluded[c.District][c.Party] = c.Excluded
		m.Tied[c.District][c.Party] = m.Tied[c.District][c.Party] || c.Tied
	}
	return m
}

// RowSum is district d's seats over every party.
func (m *SeatMatrix) RowSum(d int) int {
	n := 0
	for _, k := range m.Seats[d] {
		n += k
	}
	return n
}

// ColSum is party p's seats over every district.
func (m *SeatMatrix) ColSum(p int) int {
	n := 0
	for _, row := range m.Seats {
		n += row[p]
	}
	return n
}

// Output is the block's result: the setup in words, every party's seats
// under the three systems side by side, then for each system its seats by
// district and party with row and column totals (the biproportional one
// with its divisors, the certificate) and its ties, the claims with their
// verdicts and the caution.
func Output(c *Config, o *Outcome, id string) *Node {
	out := El("div", "class", "el-output", "data-role", "election-output")
	if c.Title != "" {
		out.Add(Wrap("h3", c.Title))
	}
	out.Add(Wrap("p", setupText(c, o), "class", "el-setup", "data-role", "election-setup"))
	out.Add(partyTable(c, o, id))
	for i, sys := range Systems {
		out.Add(systemSection(c, o.Results[i], sys, id))
	}
	if len(c.Claims) > 0 {
		ul := El("ul", "class", "el-claims", "data-role", "election-claims", "aria-label", "Claims checked against these results")
		for i := range c.Claims {
			cl := &c.Claims[i]
			v := cl.Check(c, o)
			text := cl.Text
			if text == "" {
				text = cl.Statement()
			}
			verdict := "holds"
			if !v.Holds {
				verdict = "does not hold"
			}
			li := El("li", "data-claim", cl.ID, "data-holds", strconv.FormatBool(v.Holds), "class", "el-claim")
			li.Add(Wrap("span", verdict, "class", "el-verdict"), Text(" "+text+" "), Wrap("small", "("+v.Found+")", "class", "el-hint"))
			ul.Add(li)
		}
		out.Add(ul)
	}
	out.Add(Wrap("p", format.Caution, "class", "el-caution", "data-role", "caution"))
	return out
}

// setupText says what the block computed: seats, districts, threshold,
// compensatory seats, and who falls below the threshold.
func setupText(c *Config, o *Outcome) string {
	r := o.Results[0]
	s := strconv.Itoa(r.Seats) + " district seats in " + strconv.Itoa(len(r.Districts)) + " districts, " +
		strconv.Itoa(len(c.Parties)) + " parties, " + Group(totalVotes(r)) + " votes. "
	if len(r.Thresholds) == 0 {
		s += "No threshold: every party takes part."
	} else {
		s += "Threshold: " + format.SharePercent(r.Thresholds[0].Share) + " of the votes over the whole election"
		var below []string
		for _, p := range r.Parties {
			if !p.Qualified {
				below = append(below, p.Name)
			}
		}
		if len(below) == 0 {
			s += "; every party reaches it."
		} else {
			s += "; below it: " + strings.Join(below, ", ") + " (no seat under per-district D'Hondt or biproportional Sainte-Laguë; under two-tier compensation only the district seats it wins)."
		}
	}
	s += " The two-tier house adds " + format.Plural(c.Compensatory, "compensatory seat") + " to the district seats."
	return s
}

// totalVotes is the parties' votes added up, as exact decimal text.
func totalVotes(r *model.Result) string {
	places := 0
	for _, p := range r.Parties {
		places = max(places, int(p.Votes.Places))
	}
	sum, ten := new(big.Int), big.NewInt(10)
	for _, p := range r.Parties {
		x := new(big.Int).SetUint64(p.Votes.Coef)
		for k := int(p.Votes.Places); k < places; k++ {
			x.Mul(x, ten)
		}
		sum.Add(sum, x)
	}
	s := sum.String()
	if places == 0 {
		return s
	}
	for len(s) <= places {
		s = "0" + s
	}
	return s[:len(s)-places] + "." + s[len(s)-places:]
}

// partyTable is every party's votes and seats under the three systems.
func partyTable(c *Config, o *Outcome, id string) *Node {
	t := El("table", "class", "el-table el-parties", "data-role", "election-parties")
	t.Add(Wrap("caption", "Seats by party under each system (two-tier: district seats + compensatory seats)."))
	head := El("tr")
	for _, h := range []string{"Party", "Votes", "Share of votes"} {
		head.Add(Wrap("th", h, "scope", "col"))
	}
	for _, sys := range Systems {
		head.Add(Wrap("th", SystemTitle(sys), "scope", "col"))
	}
	t.Add(El("thead").Add(head))
	body := El("tbody")
	tv := o.Results[0]
	total := totalVotes(tv)
	for p, name := range c.Parties {
		pr := &tv.Parties[p]
		tr := El("tr", "data-party", name)
		for i, sys := range Systems {
			tr.Set("data-"+sys.String(), strconv.Itoa(o.Results[i].Parties[p].Seats))
		}
		tr.Add(Wrap("th", name, "scope", "row"))
		tr.Add(Wrap("td", Group(pr.Votes.String()), "class", "num"), Wrap("td", shareText(pr.Votes.String(), total), "class", "num"))
		for i, sys := range Systems {
			q := &o.Results[i].Parties[p]
			txt := strconv.Itoa(q.Seats)
			if sys == model.TwoTier && q.Qualified {
				txt += " (" + strconv.Itoa(q.DistrictSeats) + " + " + strconv.Itoa(q.ListSeats) + ")"
			}
			if !q.Qualified {
				txt += " (below threshold)"
			}
			tr.Add(Wrap("td", txt, "class", "num"))
		}
		body.Add(tr)
	}
	t.Add(body)
	foot := El("tr")
	foot.Add(Wrap("th", "Total", "scope", "row"), Wrap("td", Group(total), "class", "num"), Wrap("td", "100%", "class", "num"))
	for i := range Systems {
		r := o.Results[i]
		txt := strconv.Itoa(r.Seats)
		if r.Unassigned > 0 {
			txt += " (" + strconv.Itoa(r.Unassigned) + " open)"
		}
		foot.Add(Wrap("td", txt, "class", "num"))
	}
	t.Add(El("tfoot").Add(foot))
	return Stackable(t)
}

// systemSection is one system's seats by district and party, with totals,
// its divisors where it has them, and its ties.
func systemSection(c *Config, r *model.Result, sys model.System, id string) *Node {
	sec := El("section", "class", "el-system", "data-system", sys.String(), "aria-labelledby", id+"-"+sys.String())
	sec.Add(Wrap("h4", SystemTitle(sys), "id", id+"-"+sys.String()))
	sec.Add(Wrap("p", systemText(r, sys), "class", "el-hint"))
	m := Matrix(r, len(c.Parties))
	bip := sys == model.Biproportional && r.Certificate != nil
	t := El("table", "class", "el-table el-matrix", "data-role", "election-matrix", "data-system", sys.String())
	t.Add(Wrap("caption", SystemTitle(sys)+": seats by district (rows) and party (columns), with totals."))
	head := El("tr")
	head.Add(Wrap("th", "District", "scope", "col"))
	for _, p := range c.Parties {
		head.Add(Wrap("th", p, "scope", "col"))
	}
	head.Add(Wrap("th", "Total", "scope", "col"))
	if bip {
		head.Add(Wrap("th", "District divisor", "scope", "col"))
	}
	t.Add(El("thead").Add(head))
	body := El("tbody")
	for d, dr := range r.Districts {
		tr := El("tr", "data-district", dr.Name, "data-seats", strconv.Itoa(m.RowSum(d)), "data-size", strconv.Itoa(dr.Seats))
		tr.Add(Wrap("th", dr.Name, "scope", "row"))
		for p := range c.Parties {
			td := El("td", "class", "num", "data-party", c.Parties[p])
			switch {
			case !m.Has[d][p]:
				td.AddText("–").Set("title", "no list here")
			case m.Excluded[d][p]:
				td.AddText("0 (excluded)")
			case m.Tied[d][p]:
				td.AddText(strconv.Itoa(m.Seats[d][p])+" (tied)").Set("data-tied", "")
			default:
				td.AddText(strconv.Itoa(m.Seats[d][p]))
			}
			tr.Add(td)
		}
		tr.Add(Wrap("td", strconv.Itoa(m.RowSum(d))+" of "+strconv.Itoa(dr.Seats), "class", "num el-total"))
		if bip {
			tr.Add(Wrap("td", dr.Divisor, "class", "num el-divisor"))
		}
		body.Add(tr)
	}
	t.Add(body)
	foot := El("tfoot")
	row := func(label string, cell func(p int) string, total string, extra string) {
		tr := El("tr")
		tr.Add(Wrap("th", label, "scope", "row"))
		for p := range c.Parties {
			tr.Add(Wrap("td", cell(p), "class", "num"))
		}
		tr.Add(Wrap("td", total, "class", "num el-total"))
		if bip {
			tr.Add(Wrap("td", extra, "class", "num"))
		}
		foot.Add(tr)
	}
	dist := 0
	for d := range r.Districts {
		dist += m.RowSum(d)
	}
	if sys == model.TwoTier {
		row("District seats", func(p int) string { return strconv.Itoa(m.ColSum(p)) }, strconv.Itoa(dist), "")
		comp := 0
		for _, p := range r.Parties {
			comp += p.ListSeats
		}
		row("Compensatory seats", func(p int) string { return strconv.Itoa(r.Parties[p].ListSeats) }, strconv.Itoa(comp), "")
	}
	all := 0
	for _, p := range r.Parties {
		all += p.Seats
	}
	row("Total", func(p int) string { return strconv.Itoa(r.Parties[p].Seats) }, strconv.Itoa(all)+" of "+strconv.Itoa(r.Seats), "")
	if bip {
		row("Party divisor", func(p int) string {
			if d := r.Parties[p].Divisor; d != "" {
				return d
			}
			return "–"
		}, "", "")
	}
	t.Add(foot)
	sec.Add(Stackable(t))
	if bip {
		s := "Certificate: each party's votes in a district, divided by the district divisor and by the party divisor and rounded by Sainte-Laguë (down below a half, up above), give exactly the seats in the table; the engine checked every cell again in exact arithmetic."
		if r.Certificate.Strict {
			s += " No quotient sits exactly on a half, so no other result meets every district's and party's total."
		} else {
			s += " Tied cells sit exactly on a half: another result meets the totals too."
		}
		sec.Add(Wrap("p", s, "class", "el-certificate", "data-role", "election-certificate"))
	}
	if r.Pending != "" {
		sec.Add(Wrap("p", "Waiting: "+r.Pending+".", "class", "el-hint"))
	}
	if len(r.Ties) == 0 {
		sec.Add(Wrap("p", "Ties: none.", "class", "el-ties", "data-ties", "0"))
	} else {
		ul := El("ul", "class", "el-ties", "data-ties", strconv.Itoa(len(r.Ties)), "aria-label", "Ties under "+SystemTitle(sys))
		for _, tie := range r.Ties {
			ul.Add(Wrap("li", format.ElectionTieText(r, tie)))
		}
		sec.Add(ul)
	}
	if r.Unassigned > 0 {
		sec.Add(Wrap("p", format.Plural(r.Unassigned, "seat")+" left open by a tie: the governing rule decides them.", "class", "el-hint", "role", "note"))
	}
	return sec
}

// systemText says in a sentence how the system turned votes into seats.
func systemText(r *model.Result, sys model.System) string {
	switch sys {
	case model.Districts:
		return "Each district divides its own seats among its parties by D'Hondt; a party's national seats are the sum of its district seats."
	case model.TwoTier:
		return "Each district divides its seats by D'Hondt; then " + format.Plural(r.Compensatory, "compensatory seat") +
			" go to the parties whose national totals fall short of the Sainte-Laguë share of the " + strconv.Itoa(r.Seats) +
			" seats, never taking a district seat away."
	}
	return "Each party's national seats by Sainte-Laguë, then a divisor for every district and every party so that rounding votes ÷ (district divisor × party divisor) meets every district's and every party's total."
}

// shareText is part/total as a percentage with one decimal (for display
// only: no seat depends on it).
func shareText(part, total string) string {
	p, _ := strconv.ParseFloat(part, 64)
	t, _ := strconv.ParseFloat(total, 64)
	if t == 0 {
		return "–"
	}
	return strconv.FormatFloat(100*p/t, 'f', 1, 64) + "%"
}
