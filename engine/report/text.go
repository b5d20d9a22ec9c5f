package report

import (
	"io"
	"strconv"
	"strings"

	"seatsmith/engine"
)

// AllotTable returns one row per unit of res: name, population, quota,
// seats, whether quota holds, the method's explanation columns and the
// margins.
func AllotTable(res *engine.Result) *Table {
	r := AllotRows(res)
	t := &Table{Header: r.Header, Right: r.Right, Rows: make([][]string, r.N)}
	for i := range t.Rows {
		t.Rows[i] = r.Row(i, nil)
	}
	return t
}

// AllotRows returns the rows of [AllotTable], made one at a time as they
// are written.
func AllotRows(res *engine.Result) *Rows {
	t := &Rows{N: len(res.Units)}
	div := res.Method.IsDivisor()
	if div {
		t.Header = []string{"unit", "population", "quota", "seats", "quota ok", "last priority", "next priority", "gain margin", "lose margin", "notes"}
	} else {
		t.Header = []string{"unit", "population", "quota", "seats", "quota ok", "remainder", "rank", "gain margin", "lose margin", "notes"}
	}
	t.Right = []bool{false, true, true, true, false, true, true, true, true, false}
	t.Row = func(i int, row []string) []string {
		u := &res.Units[i]
		row = append(row[:0], u.Name, u.Population.String(), u.Quota.Text, strconv.Itoa(u.Seats), yesNo(u.MeetsQuota))
		if div {
			row = append(row, valueText(u.Last), valueText(u.Next))
		} else {
			rank := ""
			if u.Remainder != nil {
				rank = strconv.Itoa(u.RemainderRank)
				if u.RemainderSeat {
					rank += " +1"
				}
			}
			row = append(row, valueText(u.Remainder), rank)
		}
		return append(row, marginText(u.Gain), marginText(u.Lose), unitNotes(u))
	}
	return t
}

func unitNotes(u *engine.UnitResult) string {
	var n []string
	if u.Excluded {
		n = append(n, "below threshold")
	}
	if u.AtMin {
		n = append(n, "held at minimum "+strconv.Itoa(u.Min))
	}
	if u.AtMax {
		n = append(n, "held at maximum "+strconv.Itoa(u.Max))
	}
	if u.Tied {
		n = append(n, "TIED")
	}
	return strings.Join(n, "; ")
}

func yesNo(b bool) string {
	if b {
		return "yes"
	}
	return "NO"
}

func valueText(v *engine.Value) string {
	switch {
	case v == nil:
		return "-"
	case v.Infinite:
		return "infinite"
	}
	return v.Text
}

func marginText(d *engine.Decimal) string {
	if d == nil {
		return "-"
	}
	return d.String()
}

// WriteAllotText writes a full explanation of res for reading in a
// terminal. order chooses whether the whole seat order is listed; otherwise
// the last five seats and the next five are.
// skipped names the parts of the explanation left out ("margins",
// "order"), which the text says above the table.
func WriteAllotText(w io.Writer, title string, res *engine.Result, order bool, skipped []string) error {
	b, own := buffered(w)
	if title != "" {
		b.WriteString(title + "\n")
	}
	b.WriteString(allotHead(res) + "\n")
	if n := skippedNote(skipped); n != "" {
		b.WriteString(Wrap(n, 76) + "\n")
	}
	b.WriteString("\n")
	if err := AllotRows(res).WriteText(b); err != nil {
		return err
	}
	b.WriteString("\n")
	for _, l := range allotLegend(res) {
		b.WriteString(Wrap(l, 76) + "\n")
	}
	b.WriteString("\n")
	writeExplanation(b, res, order, "")
	b.WriteString("\n" + Wrap(Caution, 76) + "\n")
	return finish(b, own)
}

// WriteAllotMarkdown writes res as a Markdown section.
// skipped is as for WriteAllotText.
func WriteAllotMarkdown(w io.Writer, title string, res *engine.Result, skipped []string) error {
	b, own := buffered(w)
	if title == "" {
		title = "Apportionment"
	}
	b.WriteString("## " + title + "\n\n")
	b.WriteString(allotHead(res) + ".\n\n")
	if n := skippedNote(skipped); n != "" {
		b.WriteString("*" + n + "*\n\n")
	}
	if err := AllotRows(res).WriteMarkdown(b); err != nil {
		return err
	}
	b.WriteString("\n")
	for _, l := range allotLegend(res) {
		b.WriteString("- " + l + "\n")
	}
	b.WriteString("\n")
	writeExplanation(b, res, false, "- ")
	b.WriteString("\n> " + Caution + "\n")
	return finish(b, own)
}

// allotHead is the line under an allotment's title: method, house size
// (and the seats a tie left unassigned), population.
func allotHead(res *engine.Result) string {
	s := res.Method.Name() + ", " + plural(res.Seats, "seat")
	if res.Unassigned > 0 {
		s += " (" + strconv.Itoa(res.Unassigned) + " left unassigned by a tie)"
	}
	return s + ", population " + res.Total
}

// MarginLegend says what the quota and the margins are, in the words both
// the command line and the pages use.
const MarginLegend = "Quota: the unit's exact share of the seats, population × seats ÷ total. " +
	"Gain margin: the fewest extra people who would win the unit one more seat outright, all others fixed; " +
	"lose margin: the fewest people whose loss, all others fixed, would cost it a seat or leave its last seat tied. " +
	"A dash means no change of its population alone does it."

// allotLegend says what the allotment table's columns mean.
func allotLegend(res *engine.Result) []string {
	l := []string{MarginLegend, "quota ok: whether the seats are the unit's lower or upper quota (NO: outside them)."}
	if res.Method.IsDivisor() {
		l = append(l, "last priority: the priority (population ÷ signpost) at which the unit won its last seat; "+
			"next priority: the one its next seat needs; the seats go to the highest priorities.")
	} else {
		l = append(l, "remainder: what is left of the unit's quota once its whole seats are given; "+
			"rank: its place among the remainders, +1 when it won a seat.")
	}
	return l
}

func writeExplanation(b io.StringWriter, res *engine.Result, order bool, bullet string) {
	line := func(s string) { b.WriteString(bullet + s + "\n") }
	for _, t := range res.Ties {
		s := "TIE: " + strings.Join(t.Names, ", ") + " tie at " + t.Value.Text + " for " + plural(t.Seats, "seat")
		if len(t.Winners) > 0 {
			var ws []string
			for _, u := range t.Winners {
				ws = append(ws, res.Units[u].Name)
			}
			s += "; settled by " + t.Rule + " for " + strings.Join(ws, ", ")
		} else {
			s += "; not settled: " + plural(t.Seats, "seat") + " left unassigned (choose a tie rule, or follow the law's own rule)"
		}
		line(s)
	}
	if d := res.Divisor; d != nil {
		if d.Single {
			line("Divisor: only " + d.Low.Text + " gives this result (a tie)")
		} else {
			hi := d.High.Text
			if d.High.Infinite {
				hi = "unbounded"
			}
			line("Divisor range: every divisor D with " + d.Low.Text + " < D < " + hi + " gives this result; " +
				d.Certificate + " is one (checked exactly)")
		}
	}
	if res.Quota != nil {
		name := "Hare quota (people per seat)"
		if res.Method == engine.Droop {
			name = "Droop quota"
		}
		s := name + ": " + res.Quota.Text
		if res.Passes > 1 {
			s += " in the last of " + strconv.Itoa(res.Passes) + " passes (units held at a bound were set aside)"
		}
		line(s)
	}
	if len(res.Order) > 0 {
		from := 0
		if !order && len(res.Order) > 5 {
			from = len(res.Order) - 5
			line("Last seats in the house:")
		} else {
			line("Seat order (beyond the minimums):")
		}
		for _, a := range res.Order[from:] {
			line("  " + awardText(a))
		}
	}
	if len(res.Beyond) > 0 {
		line("Next seats beyond the house size:")
		for _, a := range res.Beyond {
			line("  " + awardText(a))
		}
	}
}

func awardText(a engine.SeatAward) string {
	p := a.Priority.Text
	if a.Priority.Infinite {
		p = "infinite"
	}
	return "seat " + strconv.Itoa(a.Seat) + ": " + a.Name + " (its seat " + strconv.Itoa(a.Nth) + "), priority " + p
}

func plural(n int, w string) string {
	if n == 1 {
		return "1 " + w
	}
	return strconv.Itoa(n) + " " + w + "s"
}

func writeString(w io.Writer, s string) error {
	_, err := io.WriteString(w, s)
	return err
}

// ComparisonTable returns one row per unit with its seats under each method.
// A seat count that breaks quota is marked with "!", and the last column
// says whether the methods differ for the unit.
func ComparisonTable(c *Comparison) *Table {
	t := &Table{Header: []string{"unit", "population", "quota"}, Right: []bool{false, true, true}}
	for _, m := range c.Methods {
		t.Header = append(t.Header, m.String())
		t.Right = append(t.Right, true)
	}
	t.Header = append(t.Header, "differs")
	first := c.First()
	if first == nil {
		return t
	}
	for i := range first.Units {
		u := &first.Units[i]
		row := []string{u.Name, u.Population.String(), u.Quota.Text}
		for _, r := range c.Results {
			if r == nil {
				row = append(row, "error")
				continue
			}
			s := strconv.Itoa(r.Units[i].Seats)
			if !r.Units[i].MeetsQuota {
				s = "!" + s
			}
			row = append(row, s)
		}
		if c.Differs(i) {
			row = append(row, "*")
		} else {
			row = append(row, "")
		}
		t.AddRow(row...)
	}
	if row := unassignedRow(c.Results, 3); row != nil {
		t.AddRow(append(row, "")...)
	}
	return t
}

// unassignedRow is a table row, after lead empty cells, with the seats a
// tie left unassigned in each result, so that a column of seats never
// sums short in silence; nil when every seat is assigned.
func unassignedRow(rs []*engine.Result, lead int) []string {
	any := false
	for _, r := range rs {
		any = any || (r != nil && r.Unassigned > 0)
	}
	if !any {
		return nil
	}
	row := make([]string, lead, lead+len(rs))
	row[0] = "(unassigned: tie)"
	for _, r := range rs {
		if r == nil {
			row = append(row, "")
			continue
		}
		row = append(row, strconv.Itoa(r.Unassigned))
	}
	return row
}

// WriteComparisonText writes the comparison for a terminal.
func WriteComparisonText(w io.Writer, title string, c *Comparison) error {
	var b strings.Builder
	if title != "" {
		b.WriteString(title + "\n")
	}
	if f := c.First(); f != nil {
		b.WriteString("All methods, " + strconv.Itoa(f.Seats) + " seats, population " + f.Total + "\n\n")
	}
	if err := writeString(w, b.String()); err != nil {
		return err
	}
	if err := ComparisonTable(c).WriteText(w); err != nil {
		return err
	}
	b.Reset()
	b.WriteString("\n")
	comparisonNotes(&b, c, "")
	b.WriteString("\n" + Wrap(Caution, 76) + "\n")
	return writeString(w, b.String())
}

// WriteComparisonMarkdown writes the comparison as a Markdown section.
func WriteComparisonMarkdown(w io.Writer, title string, c *Comparison) error {
	if title == "" {
		title = "Methods compared"
	}
	if err := writeString(w, "## "+title+"\n\n"); err != nil {
		return err
	}
	if err := ComparisonTable(c).WriteMarkdown(w); err != nil {
		return err
	}
	var b strings.Builder
	b.WriteString("\n")
	comparisonNotes(&b, c, "- ")
	b.WriteString("\n> " + Caution + "\n")
	return writeString(w, b.String())
}

func comparisonNotes(b *strings.Builder, c *Comparison, bullet string) {
	b.WriteString(bullet + "\"!\" marks seats outside the unit's lower and upper quota; \"*\" marks units the methods treat differently.\n")
	for k, m := range c.Methods {
		r := c.Results[k]
		if r == nil {
			b.WriteString(bullet + m.String() + ": cannot apportion this scenario: " + errText(c.Errors[k]) + "\n")
			continue
		}
		if v := c.QuotaViolations(k); v > 0 {
			b.WriteString(bullet + m.String() + ": breaks quota for " + plural(v, "unit") + "\n")
		}
		for _, t := range r.Ties {
			s := bullet + m.String() + ": TIE among " + strings.Join(t.Names, ", ") + " for " + plural(t.Seats, "seat")
			if len(t.Winners) == 0 {
				s += " (left unassigned)"
			}
			b.WriteString(s + "\n")
		}
	}
}

func errText(err error) string {
	if err == nil {
		return ""
	}
	return err.Error()
}

// Wrap breaks text into lines of at most width characters at spaces.
func Wrap(text string, width int) string {
	var b strings.Builder
	n := 0
	for i, w := range strings.Fields(text) {
		l := len([]rune(w))
		if i > 0 {
			if n+1+l > width {
				b.WriteString("\n")
				n = 0
			} else {
				b.WriteString(" ")
				n++
			}
		}
		b.WriteString(w)
		n += l
	}
	return b.String()
}

// skippedNote says which parts of the explanation were left out, so that
// a dash in the margin columns is not read as "cannot happen".
func skippedNote(skipped []string) string {
	var parts []string
	for _, k := range skipped {
		switch k {
		case "margins":
			parts = append(parts, "the gain and lose margins were not computed (a dash in their columns means not computed here)")
		case "order":
			parts = append(parts, "the full seat order was not computed")
		}
	}
	if len(parts) == 0 {
		return ""
	}
	out := strings.Join(parts, ", and ") + "."
	return strings.ToUpper(out[:1]) + out[1:]
}
