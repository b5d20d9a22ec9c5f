package input

import (
	"bufio"
	"errors"
	"io"
	"slices"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
)

// Version is the scenario document version this package reads and writes.
const Version = 1

// ReadJSON reads a scenario document.
func ReadJSON(file string, r io.Reader) (*Source, error) { return Options{}.ReadJSON(file, r) }

// ReadJSON reads a scenario document as the package's ReadJSON does, with
// the options. A document larger than [MaxJSONBytes] is refused.
func (o Options) ReadJSON(file string, r io.Reader) (*Source, error) {
	data, err := ReadLimited(file, r)
	if err != nil {
		return nil, err
	}
	v, err := jsondoc.Parse(data)
	if err != nil {
		var se *jsondoc.SyntaxError
		if errors.As(err, &se) {
			return nil, &Error{File: file, Line: se.Line, Msg: "column " + strconv.Itoa(se.Col) + ": " + se.Msg}
		}
		return nil, &Error{File: file, Msg: err.Error()}
	}
	return o.FromDoc(file, v)
}

// Read reads a scenario from CSV or JSON: JSON when the first character that
// is not white space is '{', CSV otherwise. What is neither is refused
// (see [Sniff]).
func Read(file string, r io.Reader) (*Source, error) { return Options{}.Read(file, r) }

// Read reads a scenario as the package's Read does, with the options.
func (o Options) Read(file string, r io.Reader) (*Source, error) {
	// Look only as far as what decides, then hand the whole input on: a
	// CSV table is read as it streams in.
	br := bufio.NewReaderSize(r, 64<<10)
	kind, err := Sniff(file, br)
	if err != nil {
		return nil, err
	}
	if kind == JSON {
		return o.ReadJSON(file, br)
	}
	return o.ReadCSV(file, br)
}

var scenarioMembers = []string{"version", "title", "seats", "method", "min", "max", "threshold", "tie", "units"}
var unitMembers = []string{"name", "population", "min", "max"}

// FromDoc reads a scenario from a parsed JSON document (or from JavaScript
// values converted to one).
func FromDoc(file string, v *jsondoc.Value) (*Source, error) { return Options{}.FromDoc(file, v) }

// FromDoc reads a scenario as the package's FromDoc does, with the
// options.
func (o Options) FromDoc(file string, v *jsondoc.Value) (*Source, error) {
	src := &Source{File: file, Given: map[string]bool{}, fieldLines: map[string]int{}}
	bad := func(line int, field, msg string) error {
		return &Error{File: file, Line: line, Field: field, Msg: msg}
	}
	if v == nil || v.Kind != jsondoc.Object {
		return nil, bad(jsondoc.LineOf(v), "", "a scenario is a JSON object with a units member")
	}
	for _, f := range v.Fields {
		if !slices.Contains(scenarioMembers, f.Key) {
			return nil, bad(jsondoc.LineOf(f.Value), f.Key, "unknown member; a scenario has "+strings.Join(scenarioMembers, ", "))
		}
		src.fieldLines[f.Key] = jsondoc.LineOf(f.Value)
	}
	if x := v.Get("version"); !x.IsNull() {
		n, err := Whole(x)
		if err != nil {
			return nil, bad(jsondoc.LineOf(x), "version", err.Error())
		}
		if n != Version {
			return nil, bad(jsondoc.LineOf(x), "version", "this is a version "+strconv.Itoa(n)+" document; this seatsmith reads version "+strconv.Itoa(Version))
		}
	}
	if x := v.Get("title"); !x.IsNull() {
		if x.Kind != jsondoc.String {
			return nil, bad(jsondoc.LineOf(x), "title", "must be a string")
		}
		if msg := textProblem(x.Text); msg != "" {
			return nil, bad(jsondoc.LineOf(x), "title", "the text "+msg)
		}
		src.Title = x.Text
	}
	sc := &src.Scenario
	ints := []struct {
		key string
		dst *int
	}{{"seats", &sc.Seats}, {"min", &sc.Min}, {"max", &sc.Max}}
	for _, it := range ints {
		x := v.Get(it.key)
		if x.IsNull() {
			continue
		}
		n, err := Whole(x)
		if err == nil && (n < 0 || n > engine.MaxSeats) {
			err = errors.New("must be between 0 and " + strconv.Itoa(engine.MaxSeats))
		}
		if err != nil {
			return nil, bad(jsondoc.LineOf(x), it.key, err.Error())
		}
		*it.dst = n
		src.Given[it.key] = true
	}
	if x := v.Get("method"); !x.IsNull() {
		if x.Kind != jsondoc.String {
			return nil, bad(jsondoc.LineOf(x), "method", "must be a string such as \"webster\"")
		}
		m, err := engine.ParseMethod(x.Text)
		if err != nil {
			return nil, bad(jsondoc.LineOf(x), "method", engine.ErrorMsg(err))
		}
		sc.Method = m
		src.Given["method"] = true
	}
	if x := v.Get("threshold"); !x.IsNull() {
		if x.Kind != jsondoc.String && x.Kind != jsondoc.Number {
			return nil, bad(jsondoc.LineOf(x), "threshold", "must be a share such as 0.05 or \"5%\"")
		}
		th, err := ParseShare(x.Text)
		if err != nil {
			return nil, bad(jsondoc.LineOf(x), "threshold", err.Error())
		}
		sc.Threshold = th
		src.Given["threshold"] = true
	}
	if x := v.Get("tie"); !x.IsNull() {
		if x.Kind != jsondoc.String {
			return nil, bad(jsondoc.LineOf(x), "tie", "must be a string: none, order or lot:SEED")
		}
		t, err := engine.ParseTieRule(x.Text)
		if err != nil {
			return nil, bad(jsondoc.LineOf(x), "tie", engine.ErrorMsg(err))
		}
		sc.Tie = t
		src.Given["tie"] = true
	}
	us := v.Get("units")
	if us.IsNull() {
		return nil, bad(jsondoc.LineOf(v), "units", "missing: a scenario needs a units array")
	}
	if us.Kind != jsondoc.Array {
		return nil, bad(jsondoc.LineOf(us), "units", "must be an array of units")
	}
	if len(us.Items) == 0 {
		return nil, bad(jsondoc.LineOf(us), "units", "empty: a scenario needs at least one unit")
	}
	if len(us.Items) > engine.MaxUnits {
		return nil, bad(jsondoc.LineOf(us), "units", "more than "+strconv.Itoa(engine.MaxUnits)+" units")
	}
	names := newNameSeen(o)
	for k, x := range us.Items {
		u, err := unitFromDoc(x, o)
		if err == nil {
			if msg := names.check(k, strings.TrimSpace(x.Get("name").Text), u.Name, src.UnitLine); msg != "" {
				err = &Error{Line: jsondoc.LineOf(x.Get("name")), Field: "name", Msg: msg}
			}
		}
		if err != nil {
			err.File = file
			if err.Line == 0 {
				err.Line = jsondoc.LineOf(x)
			}
			err.Field = "units[" + strconv.Itoa(k) + "]." + err.Field
			return nil, err
		}
		sc.Units = append(sc.Units, u)
		src.unitLines = append(src.unitLines, jsondoc.LineOf(x))
	}
	return src, nil
}

func unitFromDoc(x *jsondoc.Value, o Options) (engine.Unit, *Error) {
	var u engine.Unit
	if x.Kind != jsondoc.Object {
		return u, &Error{Msg: "a unit is an object with name and population"}
	}
	for _, f := range x.Fields {
		if !slices.Contains(unitMembers, f.Key) {
			return u, &Error{Line: jsondoc.LineOf(f.Value), Field: f.Key, Msg: "unknown member; a unit has " + strings.Join(unitMembers, ", ")}
		}
	}
	n := x.Get("name")
	if n.IsNull() || n.Kind != jsondoc.String || strings.TrimSpace(n.Text) == "" {
		return u, &Error{Line: jsondoc.LineOf(n), Field: "name", Msg: "missing or empty: every unit needs a name (a string)"}
	}
	if msg := textProblem(n.Text); msg != "" {
		return u, &Error{Line: jsondoc.LineOf(n), Field: "name", Msg: "the text " + msg}
	}
	u.Name = o.name(n.Text)
	p := x.Get("population")
	if p.IsNull() {
		return u, &Error{Field: "population", Msg: strconv.Quote(u.Name) + ": missing"}
	}
	if p.Kind != jsondoc.Number && p.Kind != jsondoc.String {
		return u, &Error{Line: jsondoc.LineOf(p), Field: "population", Msg: strconv.Quote(u.Name) + ": must be a number or a string holding one"}
	}
	d, err := engine.ParseDecimal(p.Text)
	if err != nil {
		return u, &Error{Line: jsondoc.LineOf(p), Field: "population", Msg: PopulationProblem(u.Name, p.Text, err)}
	}
	u.Population = d
	for _, b := range []struct {
		key string
		dst **int
	}{{"min", &u.Min}, {"max", &u.Max}} {
		v := x.Get(b.key)
		if v.IsNull() {
			continue
		}
		k, err := Whole(v)
		if err == nil && (k < 0 || k > engine.MaxSeats) {
			err = errors.New("must be between 0 and " + strconv.Itoa(engine.MaxSeats))
		}
		if err != nil {
			return u, &Error{Line: jsondoc.LineOf(v), Field: b.key, Msg: strconv.Quote(u.Name) + ": " + err.Error()}
		}
		*b.dst = &k
	}
	return u, nil
}

// Whole reads a whole number from a number or a string.
func Whole(x *jsondoc.Value) (int, error) {
	if x.Kind != jsondoc.Number && x.Kind != jsondoc.String {
		return 0, errors.New("must be a whole number")
	}
	n, err := strconv.Atoi(strings.TrimSpace(x.Text))
	if err != nil {
		return 0, errors.New(strconv.Quote(x.Text) + " is not a whole number")
	}
	return n, nil
}

// ParseShare reads a share of the total: "0.05", ".05" or "5%". Its
// errors say what is wrong with the text.
func ParseShare(s string) (engine.Decimal, error) {
	t := strings.TrimSpace(s)
	pct := strings.HasSuffix(t, "%")
	t = strings.TrimSpace(strings.TrimSuffix(t, "%"))
	if strings.HasPrefix(t, ".") {
		t = "0" + t
	}
	q := strconv.Quote(s)
	d, err := engine.ParseDecimal(t)
	switch {
	case errors.Is(err, engine.ErrEmpty):
		return engine.Decimal{}, errors.New("missing: write a share such as 0.05 or 5%")
	case errors.Is(err, engine.ErrNegative):
		return engine.Decimal{}, errors.New(q + " is negative; a threshold is a share from 0 to 1, such as 0.05 or 5%")
	case errors.Is(err, engine.ErrTooPrecise):
		return engine.Decimal{}, errors.New(q + " has more than " + strconv.Itoa(engine.MaxPlaces) + " decimal places; a threshold takes at most " +
			strconv.Itoa(engine.MaxPlaces) + " (" + strconv.Itoa(engine.MaxPlaces-2) + " in a percentage)")
	case err != nil:
		return engine.Decimal{}, errors.New(q + " is not a share: write 0.05 or 5%")
	}
	if pct {
		if d.Places+2 > engine.MaxPlaces {
			return engine.Decimal{}, errors.New(q + " has more than " + strconv.Itoa(engine.MaxPlaces-2) + " decimal places; a percentage takes at most " +
				strconv.Itoa(engine.MaxPlaces-2) + " (a share " + strconv.Itoa(engine.MaxPlaces) + ")")
		}
		d.Places += 2
	}
	if d.Cmp(engine.Whole(1)) > 0 {
		return engine.Decimal{}, errors.New(q + " is more than the whole")
	}
	return d, nil
}
