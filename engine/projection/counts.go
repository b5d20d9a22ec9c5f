package projection

import (
	"bufio"
	"errors"
	"io"
	"math"
	"slices"
	"sort"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
)

// A Count is one count of a unit's population, dated or not.
type Count struct {
	Date       Date
	Dated      bool
	Population engine.Decimal
	Line       int // the line it was read from (0 when unknown)
}

// A Series is one unit with its counts, in date order.
type Series struct {
	Name   string
	Counts []Count
	// RSE is the unit's own relative standard error (0.02 for two
	// percent), overriding the study's default; nil when not given.
	RSE *float64
	// Min and Max override the scenario's default bounds when set.
	Min, Max *int
	Line     int // the line the unit starts on
}

// Latest returns the unit's most recent count (its only one when undated).
func (s *Series) Latest() Count { return s.Counts[len(s.Counts)-1] }

// Counts is a file of counts: the units with their counts and the
// scenario-level settings the file gives.
type Counts struct {
	File  string
	Title string
	// Scenario holds the settings the file gives (seats, method, bounds,
	// threshold, tie rule); its Units are filled in by the study.
	Scenario engine.Scenario
	// Given records which settings the file set ("seats", "method", "min",
	// "max", "threshold", "tie"), so that command-line options can fill in
	// the rest.
	Given  map[string]bool
	Series []Series
	// Dated reports whether the counts carry dates.
	Dated bool

	fieldLines map[string]int
}

// Locate turns an *engine.Error about a scenario built from these counts
// into an *input.Error naming the file and the line of the unit or setting
// at fault. Other errors are returned unchanged.
func (c *Counts) Locate(err error) error {
	var ee *engine.Error
	if !errors.As(err, &ee) {
		return err
	}
	e := &input.Error{File: c.File, Field: ee.Field, Msg: ee.Msg}
	if ee.Unit >= 0 && ee.Unit < len(c.Series) {
		e.Line = c.Series[ee.Unit].Line
		if ee.Name != "" {
			e.Msg = strconv.Quote(ee.Name) + ": " + ee.Msg
		}
	} else if l, ok := c.fieldLines[ee.Field]; ok {
		e.Line = l
	}
	return e
}

// ReadCounts reads counts from CSV or JSON: JSON when the first character
// that is not white space is '{', CSV otherwise. file names the input in
// error messages. What is neither is refused as input.Sniff says.
func ReadCounts(file string, r io.Reader) (*Counts, error) {
	return ReadCountsWith(file, r, input.Options{})
}

// ReadCountsWith is ReadCounts with the scenario readers' options (such as
// the form names are compared in).
func ReadCountsWith(file string, r io.Reader, opt input.Options) (*Counts, error) {
	br := bufio.NewReaderSize(r, 64<<10)
	kind, err := input.Sniff(file, br)
	if err != nil {
		return nil, err
	}
	if kind == input.JSON {
		data, err := input.ReadLimited(file, br)
		if err != nil {
			return nil, err
		}
		v, err := jsondoc.Parse(data)
		if err != nil {
			var se *jsondoc.SyntaxError
			if errors.As(err, &se) {
				return nil, &input.Error{File: file, Line: se.Line, Msg: "column " + strconv.Itoa(se.Col) + ": " + se.Msg}
			}
			return nil, &input.Error{File: file, Msg: err.Error()}
		}
		return countsFromDoc(file, v, opt)
	}
	return readCSV(file, br, opt)
}

var csvColumns = []string{"name", "date", "population", "rse", "min", "max"}

// readCSV reads a table with one row per count.
func readCSV(file string, r io.Reader, opt input.Options) (*Counts, error) {
	cr := input.NewCSVReader(r)
	bad := func(line int, field, msg string) error {
		return &input.Error{File: file, Line: line, Field: field, Msg: msg}
	}
	header, err := cr.Read()
	if err == io.EOF {
		return nil, bad(1, "", "empty file: expected a header row such as name,date,population")
	}
	if err != nil {
		return nil, csvError(file, err)
	}
	header = append([]string(nil), header...) // the reader reuses its slice
	if err := input.CheckRecord(file, 1, header, nil); err != nil {
		return nil, err
	}
	col := map[string]int{}
	for i, h := range header {
		k := strings.ToLower(strings.TrimSpace(h))
		if !slices.Contains(csvColumns, k) {
			return nil, bad(1, "column "+strconv.Itoa(i+1), "unknown column "+strconv.Quote(h)+
				"; the columns are name, population, optional date (one row per dated count), rse, min and max")
		}
		if _, dup := col[k]; dup {
			return nil, bad(1, k, "the column appears twice")
		}
		col[k] = i
	}
	for _, need := range []string{"name", "population"} {
		if _, ok := col[need]; !ok {
			return nil, bad(1, need, "missing column; the header must name the columns name and population (and date for dated counts)")
		}
	}
	_, dated := col["date"]
	c := &Counts{File: file, Given: map[string]bool{}, Dated: dated, fieldLines: map[string]int{}}
	index := map[string]int{}
	writtenAs := map[string]string{} // each name as first written
	// Where each per-unit setting was first given.
	setLine := map[string]int{}
	cell := func(rec []string, k string) (string, bool) {
		i, ok := col[k]
		if !ok {
			return "", false
		}
		t := strings.TrimSpace(rec[i])
		return t, t != ""
	}
	rows := 0
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, csvError(file, err)
		}
		line := cr.Line()
		rows++
		if rows > engine.MaxUnits*8 {
			return nil, bad(line, "", "too many rows")
		}
		if err := input.CheckRecord(file, line, rec, header); err != nil {
			return nil, err
		}
		name, _ := cell(rec, "name")
		if name == "" {
			return nil, bad(line, "name", "empty")
		}
		written := name
		if opt.NameForm != nil {
			name = opt.NameForm(name)
		}
		ptext, _ := cell(rec, "population")
		p, err := engine.ParseDecimal(ptext)
		if err != nil {
			return nil, bad(line, "population", input.PopulationProblem(name, ptext, err))
		}
		cnt := Count{Population: p, Line: line}
		if dated {
			dtext, _ := cell(rec, "date")
			d, err := ParseDate(dtext)
			if err != nil {
				return nil, bad(line, "date", strconv.Quote(name)+": "+err.Error())
			}
			cnt.Date, cnt.Dated = d, true
		}
		k, seen := index[name]
		if !seen {
			if len(c.Series) >= engine.MaxUnits {
				return nil, bad(line, "", "more than "+strconv.Itoa(engine.MaxUnits)+" units")
			}
			k = len(c.Series)
			index[name] = k
			writtenAs[name] = written
			c.Series = append(c.Series, Series{Name: name, Line: line})
		} else if !dated {
			return nil, bad(line, "name", strconv.Quote(name)+": the same name as line "+strconv.Itoa(c.Series[k].Line)+
				"; add a date column to give several counts of one unit")
		} else if writtenAs[name] != written {
			return nil, bad(line, "name", strconv.Quote(name)+": the unit of line "+strconv.Itoa(c.Series[k].Line)+
				", written with other Unicode characters; names are compared in Unicode normalization form C")
		}
		s := &c.Series[k]
		for _, prev := range s.Counts {
			if prev.Date == cnt.Date {
				return nil, bad(line, "date", strconv.Quote(name)+": a second count for "+cnt.Date.String()+" (the first is on line "+strconv.Itoa(prev.Line)+")")
			}
		}
		s.Counts = append(s.Counts, cnt)
		if t, ok := cell(rec, "rse"); ok {
			v, err := ParseRSE(t)
			if err != nil {
				return nil, bad(line, "rse", strconv.Quote(name)+": "+err.Error())
			}
			if s.RSE != nil && *s.RSE != v {
				return nil, bad(line, "rse", strconv.Quote(name)+": differs from the value on line "+strconv.Itoa(setLine[name+"\x00rse"]))
			}
			if s.RSE == nil {
				s.RSE = &v
				setLine[name+"\x00rse"] = line
			}
		}
		for _, b := range []struct {
			key string
			dst **int
		}{{"min", &s.Min}, {"max", &s.Max}} {
			t, ok := cell(rec, b.key)
			if !ok {
				continue
			}
			n, err := wholeSeats(t)
			if err != nil {
				return nil, bad(line, b.key, strconv.Quote(name)+": "+err.Error())
			}
			if *b.dst != nil && **b.dst != n {
				return nil, bad(line, b.key, strconv.Quote(name)+": differs from the value on line "+strconv.Itoa(setLine[name+"\x00"+b.key]))
			}
			if *b.dst == nil {
				*b.dst = &n
				setLine[name+"\x00"+b.key] = line
			}
		}
	}
	if len(c.Series) == 0 {
		return nil, bad(2, "", "no units: the table has a header but no rows")
	}
	for i := range c.Series {
		sortCounts(c.Series[i].Counts)
	}
	return c, nil
}

func sortCounts(cs []Count) {
	sort.SliceStable(cs, func(i, j int) bool { return cs[i].Date.Before(cs[j].Date) })
}

var docMembers = []string{"version", "title", "seats", "method", "min", "max", "threshold", "tie", "units"}
var unitMembers = []string{"name", "population", "counts", "rse", "min", "max"}

// countsFromDoc reads counts from a parsed JSON document: a scenario
// document whose units carry either a population (one undated count) or a
// counts array of {date, population}, and optionally an rse.
func countsFromDoc(file string, v *jsondoc.Value, opt input.Options) (*Counts, error) {
	bad := func(line int, field, msg string) error {
		return &input.Error{File: file, Line: line, Field: field, Msg: msg}
	}
	if v == nil || v.Kind != jsondoc.Object {
		return nil, bad(jsondoc.LineOf(v), "", "a counts document is a JSON object with a units member")
	}
	for _, f := range v.Fields {
		if !slices.Contains(docMembers, f.Key) {
			return nil, bad(jsondoc.LineOf(f.Value), f.Key, "unknown member; a counts document has "+strings.Join(docMembers, ", "))
		}
	}
	c := &Counts{File: file, Given: map[string]bool{}, fieldLines: map[string]int{}}
	us := v.Get("units")
	if us.IsNull() {
		return nil, bad(jsondoc.LineOf(v), "units", "missing: a counts document needs a units array")
	}
	if us.Kind != jsondoc.Array {
		return nil, bad(jsondoc.LineOf(us), "units", "must be an array of units")
	}
	if len(us.Items) > engine.MaxUnits {
		return nil, bad(jsondoc.LineOf(us), "units", "more than "+strconv.Itoa(engine.MaxUnits)+" units")
	}
	// The scenario-level members and each unit's name, population and
	// bounds are read by the scenario reader, from a copy of the document
	// whose units carry their latest count as their population.
	plain := jsondoc.NewObject()
	plain.Line = v.Line
	for _, f := range v.Fields {
		if f.Key != "units" {
			plain.Set(f.Key, f.Value)
		}
	}
	plainUnits := jsondoc.NewArray()
	plainUnits.Line = us.Line
	for k, x := range us.Items {
		field := "units[" + strconv.Itoa(k) + "]"
		if x.Kind != jsondoc.Object {
			return nil, bad(jsondoc.LineOf(x), field, "a unit is an object with a name and a population or counts")
		}
		for _, f := range x.Fields {
			if !slices.Contains(unitMembers, f.Key) {
				return nil, bad(jsondoc.LineOf(f.Value), field+"."+f.Key, "unknown member; a unit has "+strings.Join(unitMembers, ", "))
			}
		}
		s := Series{Line: jsondoc.LineOf(x)}
		if n := x.Get("name"); n != nil && n.Kind == jsondoc.String {
			s.Name = strings.TrimSpace(n.Text)
		}
		pop, counts := x.Get("population"), x.Get("counts")
		switch {
		case !pop.IsNull() && !counts.IsNull():
			return nil, bad(jsondoc.LineOf(counts), field+".counts", strconv.Quote(s.Name)+": give a population or counts, not both")
		case !counts.IsNull():
			if counts.Kind != jsondoc.Array || len(counts.Items) == 0 {
				return nil, bad(jsondoc.LineOf(counts), field+".counts", strconv.Quote(s.Name)+": must be an array of {date, population}")
			}
			c.Dated = true
			for j, cx := range counts.Items {
				cf := field + ".counts[" + strconv.Itoa(j) + "]"
				cnt, err := countFromDoc(cx, s.Name)
				if err != nil {
					err.File = file
					err.Field = cf + "." + err.Field
					return nil, err
				}
				for _, prev := range s.Counts {
					if prev.Date == cnt.Date {
						return nil, bad(cnt.Line, cf+".date", strconv.Quote(s.Name)+": a second count for "+cnt.Date.String()+" (the first is on line "+strconv.Itoa(prev.Line)+")")
					}
				}
				s.Counts = append(s.Counts, cnt)
			}
			sortCounts(s.Counts)
		}
		if r := x.Get("rse"); !r.IsNull() {
			if r.Kind != jsondoc.Number && r.Kind != jsondoc.String {
				return nil, bad(jsondoc.LineOf(r), field+".rse", strconv.Quote(s.Name)+": must be a share such as 0.02 or \"2%\"")
			}
			f, err := ParseRSE(r.Text)
			if err != nil {
				return nil, bad(jsondoc.LineOf(r), field+".rse", strconv.Quote(s.Name)+": "+err.Error())
			}
			s.RSE = &f
		}
		u := jsondoc.NewObject()
		u.Line = x.Line
		for _, f := range x.Fields {
			switch f.Key {
			case "name", "population", "min", "max":
				u.Set(f.Key, f.Value)
			}
		}
		if len(s.Counts) > 0 {
			latest := s.Latest()
			u.Set("population", &jsondoc.Value{Kind: jsondoc.String, Text: latest.Population.String(), Line: latest.Line})
		}
		plainUnits.Append(u)
		c.Series = append(c.Series, s)
	}
	plain.Set("units", plainUnits)
	src, err := opt.FromDoc(file, plain)
	if err != nil {
		return nil, err
	}
	c.Title, c.Scenario, c.Given = src.Title, src.Scenario, src.Given
	for i := range c.Series {
		s := &c.Series[i]
		u := src.Scenario.Units[i]
		s.Name, s.Min, s.Max = u.Name, u.Min, u.Max
		if len(s.Counts) == 0 {
			s.Counts = []Count{{Population: u.Population, Line: src.UnitLine(i)}}
		}
	}
	c.Scenario.Units = nil
	for _, f := range v.Fields {
		c.fieldLines[f.Key] = jsondoc.LineOf(f.Value)
	}
	return c, nil
}

func countFromDoc(x *jsondoc.Value, name string) (Count, *input.Error) {
	cnt := Count{Line: jsondoc.LineOf(x)}
	if x.Kind != jsondoc.Object {
		return cnt, &input.Error{Line: jsondoc.LineOf(x), Msg: strconv.Quote(name) + ": a count is an object {date, population}"}
	}
	for _, f := range x.Fields {
		if f.Key != "date" && f.Key != "population" {
			return cnt, &input.Error{Line: jsondoc.LineOf(f.Value), Field: f.Key, Msg: strconv.Quote(name) + ": unknown member; a count has date and population"}
		}
	}
	d := x.Get("date")
	if d.IsNull() || d.Kind != jsondoc.String {
		return cnt, &input.Error{Line: jsondoc.LineOf(x), Field: "date", Msg: strconv.Quote(name) + ": missing: every count needs a date string such as \"2030-04-01\""}
	}
	date, err := ParseDate(d.Text)
	if err != nil {
		return cnt, &input.Error{Line: jsondoc.LineOf(d), Field: "date", Msg: strconv.Quote(name) + ": " + err.Error()}
	}
	p := x.Get("population")
	if p.IsNull() || (p.Kind != jsondoc.Number && p.Kind != jsondoc.String) {
		return cnt, &input.Error{Line: jsondoc.LineOf(x), Field: "population", Msg: strconv.Quote(name) + ": missing: every count needs a population (a number or a string holding one)"}
	}
	pop, perr := engine.ParseDecimal(p.Text)
	if perr != nil {
		return cnt, &input.Error{Line: jsondoc.LineOf(p), Field: "population", Msg: input.PopulationProblem(name, p.Text, perr)}
	}
	cnt.Date, cnt.Dated, cnt.Population = date, true, pop
	return cnt, nil
}

// ParseRSE reads a relative standard error: a share such as 0.02 or .02,
// or a percentage such as 2%, from 0 to 1 (100%).
func ParseRSE(s string) (float64, error) {
	t := strings.TrimSpace(s)
	pct := strings.HasSuffix(t, "%")
	t = strings.TrimSpace(strings.TrimSuffix(t, "%"))
	bad := errors.New(strconv.Quote(s) + " is not a relative standard error: write a share such as 0.02 or a percentage such as 2%")
	if t == "" || strings.ContainsAny(t, "eEinfINFxX_") {
		return 0, bad
	}
	f, err := strconv.ParseFloat(t, 64)
	if err != nil || math.IsNaN(f) || f < 0 {
		return 0, bad
	}
	if pct {
		f /= 100
	}
	if f > 1 {
		return 0, errors.New(strconv.Quote(s) + " is more than 100%: a relative standard error is a share of the count")
	}
	return f, nil
}

func wholeSeats(s string) (int, error) {
	n, err := strconv.Atoi(s)
	if err != nil || n < 0 {
		return 0, errors.New(strconv.Quote(s) + " is not a whole number of seats")
	}
	if n > engine.MaxSeats {
		return 0, errors.New(s + " is more than the limit of " + strconv.Itoa(engine.MaxSeats) + " seats")
	}
	return n, nil
}

func csvError(file string, err error) error { return input.CSVErrorOf(file, err) }
