package input

import (
	"errors"
	"io"
	"strconv"
	"strings"

	"seatsmith/engine"
)

// ReadCSV reads a table of units. file names the input in error messages.
// The scenario-level fields (seats, method, ...) are left for the caller.
func ReadCSV(file string, r io.Reader) (*Source, error) { return Options{}.ReadCSV(file, r) }

// ReadCSV reads a table of units as the package's ReadCSV does, with the
// options.
func (o Options) ReadCSV(file string, r io.Reader) (*Source, error) {
	cr := NewCSVReader(r) // every row as long as the header
	src := &Source{File: file, Given: map[string]bool{}, fieldLines: map[string]int{}}
	header, err := cr.Read()
	if err == io.EOF {
		return nil, &Error{File: file, Line: 1, Msg: "empty file: expected a header row such as name,population"}
	}
	if err != nil {
		return nil, errorOf(file, err)
	}
	header = append([]string(nil), header...) // the reader reuses its slice
	if err := CheckRecord(file, 1, header, nil); err != nil {
		return nil, err
	}
	col := map[string]int{}
	for i, h := range header {
		k := strings.ToLower(strings.TrimSpace(h))
		switch k {
		case "name", "population", "min", "max":
		default:
			return nil, &Error{File: file, Line: 1, Field: "column " + strconv.Itoa(i+1),
				Msg: "unknown column " + strconv.Quote(h) + "; the columns are name, population and optional min and max"}
		}
		if _, dup := col[k]; dup {
			return nil, &Error{File: file, Line: 1, Field: k, Msg: "the column appears twice"}
		}
		col[k] = i
	}
	for _, need := range []string{"name", "population"} {
		if _, ok := col[need]; !ok {
			return nil, &Error{File: file, Line: 1, Field: need, Msg: "missing column; the header must name the columns name and population"}
		}
	}
	names := newNameSeen(o)
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, errorOf(file, err)
		}
		line := cr.Line()
		if len(src.unitLines) >= engine.MaxUnits {
			return nil, &Error{File: file, Line: line, Msg: "more than " + strconv.Itoa(engine.MaxUnits) + " units"}
		}
		if err := CheckRecord(file, line, rec, header); err != nil {
			return nil, err
		}
		u, uerr := unitFromRow(rec, col, o)
		if uerr != nil {
			uerr.File, uerr.Line = file, line
			return nil, uerr
		}
		if msg := names.check(len(src.unitLines), strings.TrimSpace(rec[col["name"]]), u.Name, src.UnitLine); msg != "" {
			return nil, &Error{File: file, Line: line, Field: "name", Msg: msg}
		}
		src.Scenario.Units = append(src.Scenario.Units, u)
		src.unitLines = append(src.unitLines, line)
	}
	if len(src.Scenario.Units) == 0 {
		return nil, &Error{File: file, Line: 2, Msg: "no units: the table has a header but no rows"}
	}
	return src, nil
}

// CheckRecord refuses a CSV record holding text that is not UTF-8 or
// holds a NUL byte, naming the file, line and field (the column's name
// from header, or its number).
func CheckRecord(file string, line int, rec, header []string) error {
	for i, f := range rec {
		msg := textProblem(f)
		if msg == "" {
			continue
		}
		field := "column " + strconv.Itoa(i+1)
		if i < len(header) && textProblem(header[i]) == "" && strings.TrimSpace(header[i]) != "" {
			field = strings.ToLower(strings.TrimSpace(header[i]))
		}
		return &Error{File: file, Line: line, Field: field, Msg: "the text " + msg}
	}
	return nil
}

func unitFromRow(rec []string, col map[string]int, o Options) (engine.Unit, *Error) {
	var u engine.Unit
	u.Name = o.name(rec[col["name"]])
	if u.Name == "" {
		return u, &Error{Field: "name", Msg: "empty"}
	}
	ptext := rec[col["population"]]
	p, err := engine.ParseDecimal(ptext)
	if err != nil {
		return u, &Error{Field: "population", Msg: PopulationProblem(u.Name, ptext, err)}
	}
	u.Population = p
	for _, b := range []struct {
		key string
		dst **int
	}{{"min", &u.Min}, {"max", &u.Max}} {
		i, ok := col[b.key]
		if !ok || strings.TrimSpace(rec[i]) == "" {
			continue
		}
		n, err := wholeSeats(rec[i])
		if err != nil {
			return u, &Error{Field: b.key, Msg: strconv.Quote(u.Name) + ": " + err.Error()}
		}
		*b.dst = &n
	}
	return u, nil
}

// PopulationProblem says why text, given as unit name's population, is
// not one: `"North": "-5" is not a population: populations cannot be
// negative`. err is the error of engine.ParseDecimal.
func PopulationProblem(name, text string, err error) string {
	return strconv.Quote(name) + ": " + NumberProblem("population", text, err)
}

// NumberProblem says why text is not a kind of number (a population, a
// count of votes), in the words every reader uses: `"-5" is not a count:
// counts cannot be negative`. err is the error of engine.ParseDecimal.
func NumberProblem(kind, text string, err error) string {
	return strconv.Quote(strings.TrimSpace(text)) + " is not a " + kind + ": " + decimalProblem(kind, err)
}

func decimalProblem(kind string, err error) string {
	switch {
	case errors.Is(err, engine.ErrEmpty):
		return "missing"
	case errors.Is(err, engine.ErrNegative):
		return kind + "s cannot be negative"
	case errors.Is(err, engine.ErrTooPrecise):
		return "at most 9 decimal places"
	case errors.Is(err, engine.ErrTooLarge):
		return "at most 10^18"
	}
	return "write a whole number or an exact decimal such as 1250.5, without separators or exponents"
}

// wholeSeats reads a bound: a whole number of seats from 0 to engine.MaxSeats.
func wholeSeats(s string) (int, error) {
	t := strings.TrimSpace(s)
	n, err := strconv.Atoi(t)
	if err != nil || n < 0 {
		return 0, errors.New(strconv.Quote(t) + " is not a whole number of seats")
	}
	if n > engine.MaxSeats {
		return 0, errors.New(t + " is more than the limit of " + strconv.Itoa(engine.MaxSeats) + " seats")
	}
	return n, nil
}
