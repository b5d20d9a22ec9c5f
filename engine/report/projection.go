package report

import (
	"io"
	"math"
	"sort"
	"strconv"
	"strings"
	"unicode/utf8"

	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
	"seatsmith/engine/projection"
)

// Projection builds the projection document (version 1) of a study's
// summary, one JSON object:
//
//	version      1
//	kind         "projection"
//	caution      the not-official caution, always present
//	title        the counts' title, when they have one
//	method       the method id; method_name its display name
//	seats        the house size (number)
//	target       the date projected to, "YYYY-MM-DD", or null when the
//	             latest counts were apportioned as they are
//	growth       "linear" or "geometric", null without a target
//	fit          "all" (least squares over every count) or "last2" (the
//	             two latest counts), null without a target
//	error        {model: "normal" | "lognormal", rse: the default relative
//	             standard error (number)}, null when no draw was made
//	seed         the seed (number, exact digits)
//	contest      seats tracked on each side of the cut (number)
//	draws        draws made (number)
//	apportioned  draws that could be apportioned; every share is of these
//	failed       draws for which no apportionment exists
//	tied         draws with a tie at the cut
//	unassigned   draws in which a tie left seats unassigned
//	max_standard_error  the largest standard error any share can have,
//	             0.5/sqrt(apportioned), or null without draws
//	baseline     the apportionment of the latest counts, which gains and
//	             losses are measured against: {total, unassigned, ties}
//	central      the apportionment of the central projection: {total,
//	             unassigned, ties, divisor: {low, high, certificate} or null}
//	units        array, one object per unit, in input order:
//	  name, counts (number of counts given), latest_date ("YYYY-MM-DD" or
//	  null for an undated count), latest (exact decimal string), projected
//	  (exact decimal string; the latest count without a target), clamped
//	  (boolean: a falling line reached zero), rate_per_year (people a year
//	  for linear growth, the growth factor minus one for geometric, null
//	  without a target), rse (number), baseline_seats, central_seats
//	  (numbers), mean_seats, sd_seats (numbers, null without draws),
//	  distribution: [{seats, draws, share}] for every seat count drawn,
//	  fewest first, and the shares gain, lose, last_seat, next_seat, in_last,
//	  in_next, tied, each {draws, share}
//
// Shares are numbers from 0 to 1 (draws divided by apportioned); draws are
// whole counts, the same for every number of workers with the same seed.
func Projection(s *projection.Summary) *jsondoc.Value {
	v := header("projection", s.Title)
	v.Set("method", jsondoc.Str(s.Method.String()))
	v.Set("method_name", jsondoc.Str(s.Method.Name()))
	v.Set("seats", jsondoc.Int(s.Seats))
	if s.Target != nil {
		v.Set("target", jsondoc.Str(s.Target.String()))
		v.Set("growth", jsondoc.Str(s.Growth.String()))
		v.Set("fit", jsondoc.Str(s.Fit.String()))
	} else {
		v.Set("target", nil).Set("growth", nil).Set("fit", nil)
	}
	if s.Draws > 0 {
		v.Set("error", jsondoc.NewObject().Set("model", jsondoc.Str(s.Error.String())).Set("rse", jsondoc.Float(s.RSE)))
	} else {
		v.Set("error", nil)
	}
	v.Set("seed", jsondoc.Num(strconv.FormatUint(s.Seed, 10)))
	v.Set("contest", jsondoc.Int(s.Contest))
	v.Set("draws", jsondoc.Int(s.Draws))
	v.Set("apportioned", count(s.Apportioned))
	v.Set("failed", count(s.Failed))
	v.Set("tied", count(s.Tied))
	v.Set("unassigned", count(s.Unassigned))
	if s.Apportioned > 0 {
		v.Set("max_standard_error", jsondoc.Float(0.5/math.Sqrt(float64(s.Apportioned))))
	} else {
		v.Set("max_standard_error", nil)
	}
	v.Set("baseline", resultSummary(s.Baseline, false))
	v.Set("central", resultSummary(s.Central, true))
	units := jsondoc.NewArray()
	for i := range s.Units {
		units.Append(projectedUnitDoc(&s.Units[i], s.Target != nil, s.Draws > 0))
	}
	return v.Set("units", units)
}

func count(n int64) *jsondoc.Value { return jsondoc.Num(strconv.FormatInt(n, 10)) }

func resultSummary(r *engine.Result, divisor bool) *jsondoc.Value {
	v := jsondoc.NewObject().Set("total", jsondoc.Str(r.Total)).Set("unassigned", jsondoc.Int(r.Unassigned)).Set("ties", Ties(r))
	if divisor {
		if d := r.Divisor; d != nil {
			dv := jsondoc.NewObject().Set("low", valueDoc(&d.Low)).Set("high", valueDoc(&d.High))
			if d.Certificate != "" {
				dv.Set("certificate", jsondoc.Str(d.Certificate))
			} else {
				dv.Set("certificate", nil)
			}
			v.Set("divisor", dv)
		} else {
			v.Set("divisor", nil)
		}
	}
	return v
}

func shareDoc(s projection.Share) *jsondoc.Value {
	return jsondoc.NewObject().Set("draws", count(s.Draws)).Set("share", jsondoc.Float(s.P))
}

func projectedUnitDoc(u *projection.UnitSummary, projected, drawn bool) *jsondoc.Value {
	v := jsondoc.NewObject().Set("name", jsondoc.Str(u.Name)).Set("counts", jsondoc.Int(u.Counts))
	if u.Latest.Dated {
		v.Set("latest_date", jsondoc.Str(u.Latest.Date.String()))
	} else {
		v.Set("latest_date", nil)
	}
	v.Set("latest", jsondoc.Str(u.Latest.Population.String()))
	v.Set("projected", jsondoc.Str(u.Central.String()))
	v.Set("clamped", jsondoc.Boolean(u.Clamped))
	if projected {
		v.Set("rate_per_year", jsondoc.Float(u.Rate))
	} else {
		v.Set("rate_per_year", nil)
	}
	v.Set("rse", jsondoc.Float(u.RSE))
	v.Set("baseline_seats", jsondoc.Int(u.BaselineSeats))
	v.Set("central_seats", jsondoc.Int(u.CentralSeats))
	if drawn {
		v.Set("mean_seats", jsondoc.Float(u.Mean)).Set("sd_seats", jsondoc.Float(u.SD))
	} else {
		v.Set("mean_seats", nil).Set("sd_seats", nil)
	}
	dist := jsondoc.NewArray()
	for _, d := range u.Dist {
		dist.Append(jsondoc.NewObject().Set("seats", jsondoc.Int(d.Seats)).Set("draws", count(d.Draws)).Set("share", jsondoc.Float(d.P)))
	}
	v.Set("distribution", dist)
	for _, f := range []struct {
		key string
		s   projection.Share
	}{{"gain", u.Gain}, {"lose", u.Lose}, {"last_seat", u.Last}, {"next_seat", u.Next},
		{"in_last", u.InLast}, {"in_next", u.InNext}, {"tied", u.Tied}} {
		v.Set(f.key, shareDoc(f.s))
	}
	return v
}

// ProjectionTable is the per-unit table of a projection summary: counts,
// projection, seats at baseline and at the central projection, and (with
// draws) the mean seats, the chances of losing and gaining a seat, of
// holding the last seat and taking the next, and the seat distribution.
func ProjectionTable(s *projection.Summary) *Table {
	t := &Table{
		Header: []string{"unit", "latest_date", "latest", "projected", "rse", "baseline_seats", "central_seats",
			"mean_seats", "p_lose", "p_gain", "p_last_seat", "p_next_seat", "p_in_last", "p_in_next", "p_tied", "distribution"},
		Right: []bool{false, false, true, true, true, true, true, true, true, true, true, true, true, true, true, false},
	}
	drawn := s.Draws > 0
	for _, u := range s.Units {
		date := ""
		if u.Latest.Dated {
			date = u.Latest.Date.String()
		}
		row := []string{u.Name, date, u.Latest.Population.String(), u.Central.String(), fixed(u.RSE, 4),
			strconv.Itoa(u.BaselineSeats), strconv.Itoa(u.CentralSeats)}
		if drawn {
			var dist []string
			for _, d := range u.Dist {
				dist = append(dist, strconv.Itoa(d.Seats)+":"+fixed(d.P, 4))
			}
			row = append(row, fixed(u.Mean, 3), fixed(u.Lose.P, 4), fixed(u.Gain.P, 4), fixed(u.Last.P, 4), fixed(u.Next.P, 4),
				fixed(u.InLast.P, 4), fixed(u.InNext.P, 4), fixed(u.Tied.P, 4), strings.Join(dist, " "))
		} else {
			row = append(row, "", "", "", "", "", "", "", "", "")
		}
		t.AddRow(row...)
	}
	return t
}

func fixed(f float64, places int) string { return strconv.FormatFloat(f, 'f', places, 64) }

// pct writes a share as a percentage for people: one decimal, "<0.1%" and
// ">99.9%" near the ends, and "0" or "100%" only when exact.
func pct(s projection.Share, n int64) string {
	switch {
	case s.Draws == 0:
		return "0"
	case s.Draws == n:
		return "100%"
	case s.P < 0.0005:
		return "<0.1%"
	case s.P > 0.9995:
		return ">99.9%"
	}
	return fixed(100*s.P, 1) + "%"
}

// WriteProjectionText writes a projection summary for people: the setup,
// a table of units, the units contending for the last seats and the first
// seats beyond, and the caution.
func WriteProjectionText(w io.Writer, s *projection.Summary) error {
	var b strings.Builder
	title := "Projection"
	if s.Title != "" {
		title += ": " + s.Title
	}
	b.WriteString(title + "\n\n")
	b.WriteString(s.Method.Name() + ", " + plural(s.Seats, "seat") + ".\n")
	if s.Target != nil {
		fit := "least squares over every count"
		if s.Fit == projection.LastTwo {
			fit = "through the two latest counts"
		}
		b.WriteString("Counts projected to " + s.Target.String() + " by " + s.Growth.String() + " growth (" + fit + ").\n")
	} else {
		b.WriteString("The latest counts, not projected.\n")
	}
	n := s.Apportioned
	if s.Draws > 0 {
		b.WriteString("Error model: " + s.Error.String() + ", relative standard error " + fixed(100*s.RSE, 2) + "%")
		var own []string
		for _, u := range s.Units {
			if u.RSE != s.RSE {
				own = append(own, u.Name+" "+fixed(100*u.RSE, 2)+"%")
			}
		}
		if len(own) > 0 {
			b.WriteString(" (own: " + strings.Join(own, ", ") + ")")
		}
		b.WriteString(".\n")
		b.WriteString(strconv.Itoa(s.Draws) + " draws, seed " + strconv.FormatUint(s.Seed, 10) + "; " +
			strconv.FormatInt(n, 10) + " apportioned")
		if s.Failed > 0 {
			b.WriteString(", " + strconv.FormatInt(s.Failed, 10) + " could not be apportioned")
		}
		b.WriteString(".\n")
		if n > 0 {
			b.WriteString("Every share below is within " + fixed(50/math.Sqrt(float64(n)), 2) + " percentage points (one standard error at most).\n")
		}
		if s.Tied > 0 {
			tie := strconv.FormatInt(s.Tied, 10) + " draws had a tie at the cut"
			if s.Unassigned > 0 {
				tie += "; in " + strconv.FormatInt(s.Unassigned, 10) + " of them seats stayed unassigned, and each unit counts the seats it held outright"
			}
			b.WriteString(Wrap(tie+".", 76) + "\n")
		}
	} else {
		b.WriteString("No error model (relative standard error 0): no draws.\n")
	}
	if s.Draws > 0 {
		b.WriteString("\"now\" is the apportionment of the latest counts; lose and gain are measured against it.\n")
	} else {
		b.WriteString("\"now\" is the apportionment of the latest counts.\n")
	}
	b.WriteString("\n")
	// Without a target the projection is the latest count and the central
	// seats are the seats now, so those columns are left out.
	t := &Table{Header: []string{"unit", "latest", "projected", "now", "central"}}
	if s.Target == nil {
		t.Header = []string{"unit", "latest", "now"}
	}
	if s.Draws > 0 {
		t.Header = append(t.Header, "mean", "lose", "gain", "seats in the draws")
	}
	t.Right = make([]bool, len(t.Header))
	for i := 1; i < len(t.Header); i++ {
		t.Right[i] = t.Header[i] != "seats in the draws"
	}
	for _, u := range s.Units {
		latest := u.Latest.Population.String()
		if u.Latest.Dated {
			latest += " (" + u.Latest.Date.String() + ")"
		}
		row := []string{u.Name, latest, strconv.Itoa(u.BaselineSeats)}
		if s.Target != nil {
			proj := u.Central.String()
			if u.Clamped {
				proj += " (line below 0)"
			}
			row = []string{u.Name, latest, proj, strconv.Itoa(u.BaselineSeats), strconv.Itoa(u.CentralSeats)}
		}
		if s.Draws > 0 {
			var dist []string
			for _, d := range u.Dist {
				dist = append(dist, strconv.Itoa(d.Seats)+": "+pct(d.Share, n))
			}
			row = append(row, fixed(u.Mean, 2), pct(u.Lose, n), pct(u.Gain, n), strings.Join(dist, "  "))
		}
		t.AddRow(row...)
	}
	if s.Baseline.Unassigned > 0 || s.Central.Unassigned > 0 {
		row := make([]string, len(t.Header))
		row[0] = "(unassigned: tie)"
		row[2] = strconv.Itoa(s.Baseline.Unassigned)
		if s.Target != nil {
			row[3], row[4] = strconv.Itoa(s.Baseline.Unassigned), strconv.Itoa(s.Central.Unassigned)
			row[2] = ""
		}
		t.AddRow(row...)
	}
	if err := t.WriteText(&b); err != nil {
		return err
	}
	if s.Draws > 0 && n > 0 && s.Contest > 0 {
		seat := s.Seats
		contenders := func(label string, pick func(u *projection.UnitSummary) projection.Share) {
			type c struct {
				name string
				sh   projection.Share
			}
			var cs []c
			for i := range s.Units {
				if sh := pick(&s.Units[i]); sh.Draws > 0 {
					cs = append(cs, c{s.Units[i].Name, sh})
				}
			}
			sort.SliceStable(cs, func(i, j int) bool { return cs[i].sh.Draws > cs[j].sh.Draws })
			var parts []string
			for k, x := range cs {
				if k == 6 {
					parts = append(parts, "and "+strconv.Itoa(len(cs)-k)+" more")
					break
				}
				parts = append(parts, x.name+" "+pct(x.sh, n))
			}
			if len(parts) > 0 {
				b.WriteString(wrapItems("  "+strings.TrimSpace(label)+": ", parts, 76))
			}
		}
		b.WriteString("\nContending for the cut (share of draws):\n")
		last, next := "  holds the last seat (seat "+strconv.Itoa(seat)+")", "  would take the next seat ("+strconv.Itoa(seat+1)+")"
		k := strconv.Itoa(s.Contest)
		lastK, nextK := "  holds one of the last "+k+" seats", "  would take one of the next "+k
		if s.Method.IsLargestRemainder() {
			last, next = "  won the last seat by remainder", "  has the largest remainder without a seat"
			lastK, nextK = "  has one of the "+k+" smallest winning remainders", "  has one of the "+k+" largest losing remainders"
		}
		contenders(last, func(u *projection.UnitSummary) projection.Share { return u.Last })
		contenders(next, func(u *projection.UnitSummary) projection.Share { return u.Next })
		if s.Contest > 1 {
			contenders(lastK, func(u *projection.UnitSummary) projection.Share { return u.InLast })
			contenders(nextK, func(u *projection.UnitSummary) projection.Share { return u.InNext })
		}
	}
	for _, r := range []struct {
		name string
		res  *engine.Result
	}{{"latest counts", s.Baseline}, {"central projection", s.Central}} {
		for _, tie := range r.res.Ties {
			b.WriteString("\nTie in the " + r.name + ": " + strings.Join(tie.Names, ", ") + " tie for " + plural(tie.Seats, "seat"))
			if len(tie.Winners) == 0 {
				b.WriteString(", left unassigned: the seats shown are those held outright.")
			} else {
				b.WriteString(", settled by " + tie.Rule + ".")
			}
		}
	}
	b.WriteString("\n" + Wrap("A projection is an estimate from a growth model and an assumed error, not a forecast of record.", 76) + "\n")
	b.WriteString("\n" + Wrap(Caution, 76) + "\n")
	return writeString(w, b.String())
}

// wrapItems writes head and the items separated by commas, breaking lines
// between items (never inside one) before width, with continuation lines
// indented by four spaces.
func wrapItems(head string, items []string, width int) string {
	var b strings.Builder
	line := head
	for k, it := range items {
		if k < len(items)-1 {
			it += ","
		}
		switch {
		case k == 0:
			line += it
		case utf8.RuneCountInString(line)+1+utf8.RuneCountInString(it) > width:
			b.WriteString(line + "\n")
			line = "    " + it
		default:
			line += " " + it
		}
	}
	b.WriteString(line + "\n")
	return b.String()
}
