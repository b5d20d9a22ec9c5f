package input

import (
	"bufio"
	"bytes"
	"errors"
	"io"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
)

// Version is the scenario document version this package reads and writes.
const Version = 1

// ReadJSON reads a scenario document.
func ReadJSON(file string, r io.Reader) (*Source, error) {
	data, err := io.ReadAll(io.LimitReader(r, 1<<31))
	if err != nil {
		return nil, &Error{File: file, Msg: err.Error()}
	}
	v, err := jsondoc.Parse(data)
	if err != nil {
		var se *jsondoc.SyntaxError
		if errors.As(err, &se) {
			return nil, &Error{File: file, Line: se.Line, Msg: "column " + strconv.Itoa(se.Col) + ": " + se.Msg}
		}
		return nil, &Error{File: file, Msg: err.Error()}
	}
	return FromDoc(file, v)
}

// Read reads a scenario from CSV or JSON: JSON when the first character that
// is not white space is '{', CSV otherwise.
func Read(file string, r io.Reader) (*Source, error) {
	// Read only as far as the first character that decides, then hand the
	// whole input on: a CSV table is read as it streams in.
	br := bufio.NewReaderSize(r, 64<<10)
	var head []byte
	for {
		c, err := br.ReadByte()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, &Error{File: file, Msg: err.Error()}
		}
		head = append(head, c)
		if len(head) <= 3 && bytes.HasPrefix([]byte("\xEF\xBB\xBF"), head) {
			continue
		}
		if c != ' ' && c != '\t' && c != '\r' && c != '\n' {
			break
		}
	}
	all := io.MultiReader(bytes.NewReader(head), br)
	if len(head) > 0 && head[len(head)-1] == '{' {
		return ReadJSON(file, all)
	}
	return ReadCSV(file, all)
}

var scenarioMembers = []string{"version", "title", "seats", "method", "min", "max", "threshold", "tie", "units"}
var unitMembers = []string{"name", "population", "min", "max"}

// FromDoc reads a scenario from a parsed JSON document (or from JavaScript
// values converted to one).
func FromDoc(file string, v *jsondoc.Value) (*Source, error) {
	src := &Source{File: file, Given: map[string]bool{}, fieldLines: map[string]int{}}
	bad := func(line int, field, msg string) error {
		return &Error{File: file, Line: line, Field: field, Msg: msg}
	}
	if v == nil || v.Kind != jsondoc.Object {
		return nil, bad(line(v), "", "a scenario is a JSON object with a units member")
	}
	for _, f := range v.Fields {
		if !contains(scenarioMembers, f.Key) {
			return nil, bad(line(f.Value), f.Key, "unknown member; a scenario has "+strings.Join(scenarioMembers, ", "))
		}
		src.fieldLines[f.Key] = line(f.Value)
	}
	if x := v.Get("version"); !x.IsNull() {
		n, err := whole(x)
		if err != nil {
			return nil, bad(line(x), "version", err.Error())
		}
		if n != Version {
			return nil, bad(line(x), "version", "this is a version "+strconv.Itoa(n)+" document; this seatsmith reads version "+strconv.Itoa(Version))
		}
	}
	if x := v.Get("title"); !x.IsNull() {
		if x.Kind != jsondoc.String {
			return nil, bad(line(x), "title", "must be a string")
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
		n, err := whole(x)
		if err == nil && (n < 0 || n > engine.MaxSeats) {
			err = errors.New("must be between 0 and " + strconv.Itoa(engine.MaxSeats))
		}
		if err != nil {
			return nil, bad(line(x), it.key, err.Error())
		}
		*it.dst = n
		src.Given[it.key] = true
	}
	if x := v.Get("method"); !x.IsNull() {
		if x.Kind != jsondoc.String {
			return nil, bad(line(x), "method", "must be a string such as \"webster\"")
		}
		m, err := engine.ParseMethod(x.Text)
		if err != nil {
			return nil, bad(line(x), "method", errMsg(err))
		}
		sc.Method = m
		src.Given["method"] = true
	}
	if x := v.Get("threshold"); !x.IsNull() {
		if x.Kind != jsondoc.String && x.Kind != jsondoc.Number {
			return nil, bad(line(x), "threshold", "must be a share such as 0.05 or \"5%\"")
		}
		th, err := ParseShare(x.Text)
		if err != nil {
			return nil, bad(line(x), "threshold", err.Error())
		}
		sc.Threshold = th
		src.Given["threshold"] = true
	}
	if x := v.Get("tie"); !x.IsNull() {
		if x.Kind != jsondoc.String {
			return nil, bad(line(x), "tie", "must be a string: none, order or lot:SEED")
		}
		t, err := engine.ParseTieRule(x.Text)
		if err != nil {
			return nil, bad(line(x), "tie", errMsg(err))
		}
		sc.Tie = t
		src.Given["tie"] = true
	}
	us := v.Get("units")
	if us.IsNull() {
		return nil, bad(line(v), "units", "missing: a scenario needs a units array")
	}
	if us.Kind != jsondoc.Array {
		return nil, bad(line(us), "units", "must be an array of units")
	}
	if len(us.Items) == 0 {
		return nil, bad(line(us), "units", "empty: a scenario needs at least one unit")
	}
	if len(us.Items) > engine.MaxUnits {
		return nil, bad(line(us), "units", "more than "+strconv.Itoa(engine.MaxUnits)+" units")
	}
	for k, x := range us.Items {
		u, err := unitFromDoc(x)
		if err != nil {
			err.File = file
			if err.Line == 0 {
				err.Line = line(x)
			}
			err.Field = "units[" + strconv.Itoa(k) + "]." + err.Field
			return nil, err
		}
		sc.Units = append(sc.Units, u)
		src.unitLines = append(src.unitLines, line(x))
	}
	return src, nil
}

func unitFromDoc(x *jsondoc.Value) (engine.Unit, *Error) {
	var u engine.Unit
	if x.Kind != jsondoc.Object {
		return u, &Error{Msg: "a unit is an object with name and population"}
	}
	for _, f := range x.Fields {
		if !contains(unitMembers, f.Key) {
			return u, &Error{Line: line(f.Value), Field: f.Key, Msg: "unknown member; a unit has " + strings.Join(unitMembers, ", ")}
		}
	}
	n := x.Get("name")
	if n.IsNull() || n.Kind != jsondoc.String || strings.TrimSpace(n.Text) == "" {
		return u, &Error{Line: line(n), Field: "name", Msg: "missing or empty: every unit needs a name (a string)"}
	}
	u.Name = strings.TrimSpace(n.Text)
	p := x.Get("population")
	if p.IsNull() {
		return u, &Error{Field: "population", Msg: strconv.Quote(u.Name) + ": missing"}
	}
	if p.Kind != jsondoc.Number && p.Kind != jsondoc.String {
		return u, &Error{Line: line(p), Field: "population", Msg: strconv.Quote(u.Name) + ": must be a number or a string holding one"}
	}
	d, err := engine.ParseDecimal(p.Text)
	if err != nil {
		return u, &Error{Line: line(p), Field: "population", Msg: populationMsg(u.Name, p.Text, err)}
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
		k, err := whole(v)
		if err == nil && (k < 0 || k > engine.MaxSeats) {
			err = errors.New("must be between 0 and " + strconv.Itoa(engine.MaxSeats))
		}
		if err != nil {
			return u, &Error{Line: line(v), Field: b.key, Msg: strconv.Quote(u.Name) + ": " + err.Error()}
		}
		*b.dst = &k
	}
	return u, nil
}

// whole reads a whole number from a number or a string.
func whole(x *jsondoc.Value) (int, error) {
	if x.Kind != jsondoc.Number && x.Kind != jsondoc.String {
		return 0, errors.New("must be a whole number")
	}
	n, err := strconv.Atoi(strings.TrimSpace(x.Text))
	if err != nil {
		return 0, errors.New(strconv.Quote(x.Text) + " is not a whole number")
	}
	return n, nil
}

// ParseShare reads a share of the total: "0.05", ".05" or "5%".
func ParseShare(s string) (engine.Decimal, error) {
	t := strings.TrimSpace(s)
	pct := strings.HasSuffix(t, "%")
	t = strings.TrimSpace(strings.TrimSuffix(t, "%"))
	if strings.HasPrefix(t, ".") {
		t = "0" + t
	}
	d, err := engine.ParseDecimal(t)
	if err != nil {
		return engine.Decimal{}, errors.New(strconv.Quote(s) + " is not a share: write 0.05 or 5%")
	}
	if pct {
		if d.Places+2 > engine.MaxPlaces {
			return engine.Decimal{}, errors.New(strconv.Quote(s) + " has too many decimal places")
		}
		d.Places += 2
	}
	if d.Cmp(engine.Whole(1)) > 0 {
		return engine.Decimal{}, errors.New(strconv.Quote(s) + " is more than the whole")
	}
	return d, nil
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}

func line(v *jsondoc.Value) int {
	if v == nil {
		return 0
	}
	return v.Line
}

func errMsg(err error) string {
	var ee *engine.Error
	if errors.As(err, &ee) {
		return ee.Msg
	}
	return err.Error()
}
