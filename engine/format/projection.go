package format

import (
	"math"
	"sort"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
	"seatsmith/engine/projection"
)

// Projection returns the document of a projection study's summary s: the
// setup, a table of units, the units contending for the last seats and
// the first seats beyond, the ties, and the caution that a projection is
// an estimate. scen holds the settings the counts were apportioned with
// (its units are not read).
func Projection(s *projection.Summary, scen *engine.Scenario) *Document {
	title := "Projection"
	if s.Title != "" {
		title += ": " + s.Title
	}
	d := &Document{Kind: "projection", Title: title}
	d.Body = append(d.Body, List{Items: projectionSetup(s)}, projectionTable(s))
	if l, ok := contenders(s); ok {
		d.Body = append(d.Body, l)
	}
	var ties []string
	for _, r := range []struct {
		name string
		res  *engine.Result
	}{{"latest counts", s.Baseline}, {"central projection", s.Central}} {
		if s.Target == nil && r.res == s.Central {
			continue // the latest counts again
		}
		for i, tie := range r.res.Ties {
			t := "TIE (" + r.name + "): " + TieText(&r.res.Ties[i], unitName(r.res))
			if len(tie.Winners) == 0 {
				t += " (the seats shown are those held outright)"
			}
			ties = append(ties, t)
		}
	}
	if len(ties) > 0 {
		d.Body = append(d.Body, List{Items: ties})
	}
	d.Body = append(d.Body, Paragraph{"A projection is an estimate from a growth model and an assumed error, not a forecast of record."})
	st := SettingsOf(scen)
	st.Method, st.Seats = s.Method, s.Seats
	d.Data = projectionData(st, s)
	d.Tree = func() *Tree { return &Tree{Root: ProjectionJSON(s)} }
	return d
}

// projectionSetup says what was projected and drawn.
func projectionSetup(s *projection.Summary) []string {
	l := []string{s.Method.Name() + ", " + Plural(s.Seats, "seat") + "."}
	if s.Target != nil {
		fit := "least squares over every count"
		if s.Fit == projection.LastTwo {
			fit = "through the two latest counts"
		}
		l = append(l, "Counts projected to "+s.Target.String()+" by "+s.Growth.String()+" growth ("+fit+").")
	} else {
		l = append(l, "The latest counts, not projected.")
	}
	n := s.Apportioned
	if s.Draws == 0 {
		return append(l, "No error model (relative standard error 0): no draws.", "\"now\" is the apportionment of the latest counts.")
	}
	e := "Error model: " + s.Error.String() + ", relative standard error " + fixed(100*s.RSE, 2) + "%"
	var own []string
	for _, u := range s.Units {
		if u.RSE != s.RSE {
			own = append(own, u.Name+" "+fixed(100*u.RSE, 2)+"%")
		}
	}
	if len(own) > 0 {
		e += " (own: " + strings.Join(own, ", ") + ")"
	}
	l = append(l, e+".")
	dr := strconv.Itoa(s.Draws) + " draws, seed " + strconv.FormatUint(s.Seed, 10) + "; " + strconv.FormatInt(n, 10) + " apportioned"
	if s.Failed > 0 {
		dr += ", " + strconv.FormatInt(s.Failed, 10) + " could not be apportioned"
	}
	l = append(l, dr+".")
	if n > 0 {
		l = append(l, "Every share below is within "+fixed(50/math.Sqrt(float64(n)), 2)+" percentage points (one standard error at most).")
	}
	if s.Tied > 0 {
		tie := strconv.FormatInt(s.Tied, 10) + " draws had a tie at the cut"
		if s.Unassigned > 0 {
			tie += "; in " + strconv.FormatInt(s.Unassigned, 10) + " of them seats stayed unassigned, and each unit counts the seats it held outright"
		}
		l = append(l, tie+".")
	}
	return append(l, "\"now\" is the apportionment of the latest counts; lose and gain are measured against it.")
}

// ShareText writes a share of n draws as a percentage for people, in the
// words of the command line and the pages: one decimal, "<0.1%" and
// ">99.9%" near the ends, and "0" or "100%" only when exact.
func ShareText(s projection.Share, n int64) string {
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

// projectionTable has one row a unit: its latest count, projection, seats
// now and at the central projection, and with draws the mean seats, the
// chances of losing and gaining a seat and the seats in the draws; and a
// row of the seats a tie left unassigned when one did. Without a target
// the projection is the latest count, and its columns are left out.
func projectionTable(s *projection.Summary) *Table {
	t := NewTable(Text("unit"), Numbers("latest", "projected", "now", "central"))
	if s.Target == nil {
		t = NewTable(Text("unit"), Numbers("latest", "now"))
	}
	if s.Draws > 0 {
		t.Columns = append(t.Columns, Numbers("mean", "lose", "gain")...)
		t.Columns = append(t.Columns, Text("seats in the draws")...)
	}
	n := s.Apportioned
	for _, u := range s.Units {
		latest := u.Latest.Population.String()
		if u.Latest.Dated {
			latest += " (" + u.Latest.Date.String() + ")"
		}
		cells := []string{u.Name, latest, strconv.Itoa(u.BaselineSeats)}
		if s.Target != nil {
			proj := u.Central.String()
			if u.Clamped {
				proj += " (line below 0)"
			}
			cells = []string{u.Name, latest, proj, strconv.Itoa(u.BaselineSeats), strconv.Itoa(u.CentralSeats)}
		}
		if s.Draws > 0 {
			var dist []string
			for _, d := range u.Dist {
				dist = append(dist, strconv.Itoa(d.Seats)+": "+ShareText(d.Share, n))
			}
			cells = append(cells, fixed(u.Mean, 2), ShareText(u.Lose, n), ShareText(u.Gain, n), strings.Join(dist, "  "))
		}
		t.Add(cells...)
	}
	if s.Baseline.Unassigned > 0 || s.Central.Unassigned > 0 {
		cells := make([]string, len(t.Columns))
		cells[0] = "(unassigned: tie)"
		if s.Target != nil {
			cells[3], cells[4] = strconv.Itoa(s.Baseline.Unassigned), strconv.Itoa(s.Central.Unassigned)
		} else {
			cells[2] = strconv.Itoa(s.Baseline.Unassigned)
		}
		t.Add(cells...)
	}
	return t
}

// contenders lists the units contending for the last seats held and the
// first beyond, by their share of the draws.
func contenders(s *projection.Summary) (List, bool) {
	n := s.Apportioned
	if s.Draws == 0 || n == 0 || s.Contest == 0 {
		return List{}, false
	}
	l := List{Head: "Contending for the cut (share of draws):"}
	add := func(label string, pick func(u *projection.UnitSummary) projection.Share) {
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
			parts = append(parts, x.name+" "+ShareText(x.sh, n))
		}
		if len(parts) > 0 {
			l.Items = append(l.Items, label+": "+strings.Join(parts, ", "))
		}
	}
	last, next := "holds the last seat (seat "+strconv.Itoa(s.Seats)+")", "would take the next seat ("+strconv.Itoa(s.Seats+1)+")"
	k := strconv.Itoa(s.Contest)
	lastK, nextK := "holds one of the last "+k+" seats", "would take one of the next "+k
	if s.Method.IsLargestRemainder() {
		last, next = "won the last seat by remainder", "has the largest remainder without a seat"
		lastK, nextK = "has one of the "+k+" smallest winning remainders", "has one of the "+k+" largest losing remainders"
	}
	add(last, func(u *projection.UnitSummary) projection.Share { return u.Last })
	add(next, func(u *projection.UnitSummary) projection.Share { return u.Next })
	if s.Contest > 1 {
		add(lastK, func(u *projection.UnitSummary) projection.Share { return u.InLast })
		add(nextK, func(u *projection.UnitSummary) projection.Share { return u.InNext })
	}
	return l, len(l.Items) > 0
}

// projectionData has one row a unit of a projection: the settings and the
// projection's (target date, growth model and fit, error model, default
// relative standard error, draws made and apportioned, seed), then the
// unit's latest count, projection, its own relative standard error, its
// seats and ties at baseline and at the central projection with each
// apportionment's unassigned seats, and, with draws, the mean seats and
// the shares of draws (fractions of one) in which it loses or gains a
// seat, holds the last seat, takes the next, and so on, and the seat
// distribution in words.
func projectionData(st Settings, s *projection.Summary) *Table {
	t := NewTable(st.columns(true, true), Text("target", "growth", "fit", "error_model"), Numbers("default_rse", "draws", "apportioned", "seed"),
		Text("unit", "latest_date"), Numbers("latest", "projected", "rse", "baseline_seats", "central_seats"), Text("baseline_tied", "central_tied"),
		Numbers("baseline_unassigned", "central_unassigned", "mean_seats", "p_lose", "p_gain", "p_last_seat", "p_next_seat", "p_in_last", "p_in_next", "p_tied"),
		Text("seat_distribution"))
	target, growth, fit, model := "", "", "", ""
	if s.Target != nil {
		target, growth, fit = s.Target.String(), s.Growth.String(), s.Fit.String()
	}
	if s.Draws > 0 {
		model = s.Error.String()
	}
	lead := append(st.cells(true, true), target, growth, fit, model, numFloat(s.RSE), strconv.Itoa(s.Draws),
		strconv.FormatInt(s.Apportioned, 10), strconv.FormatUint(s.Seed, 10))
	for i, u := range s.Units {
		date := ""
		if u.Latest.Dated {
			date = u.Latest.Date.String()
		}
		cells := row(lead, u.Name, date, u.Latest.Population.String(), u.Central.String(), numFloat(u.RSE),
			strconv.Itoa(u.BaselineSeats), strconv.Itoa(u.CentralSeats), boolCell(s.Baseline.Units[i].Tied), boolCell(s.Central.Units[i].Tied),
			strconv.Itoa(s.Baseline.Unassigned), strconv.Itoa(s.Central.Unassigned))
		if s.Draws > 0 {
			var dist []string
			for _, d := range u.Dist {
				dist = append(dist, Plural(d.Seats, "seat")+": "+fixed(d.P, 4))
			}
			cells = append(cells, numFloat(u.Mean), fixed(u.Lose.P, 4), fixed(u.Gain.P, 4), fixed(u.Last.P, 4), fixed(u.Next.P, 4),
				fixed(u.InLast.P, 4), fixed(u.InNext.P, 4), fixed(u.Tied.P, 4), strings.Join(dist, "; "))
		} else {
			cells = append(cells, "", "", "", "", "", "", "", "", "")
		}
		t.Add(cells...)
	}
	return t
}

// ProjectionJSON returns the projection document (JSON, version 1) of a
// study's summary, one object:
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
func ProjectionJSON(s *projection.Summary) *jsondoc.Value {
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
			v.Set("divisor", divisorDoc(d, false))
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
