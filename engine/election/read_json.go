package election

import (
	"errors"
	"io"
	"slices"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
)

// Kind is the kind member of an election scenario document.
const Kind = "election"

// DocVersion is the election scenario document version this package reads.
const DocVersion = 1

var electionMembers = []string{"version", "kind", "title", "system", "method", "upper_method", "district_method",
	"seats", "compensatory", "overhang", "upper_basis", "threshold", "alternative_wins", "other_votes", "tie",
	"districts", "parties", "votes"}

var districtMembers = []string{"name", "seats", "population", "other_votes"}
var partyMembers = []string{"name", "wins", "exempt", "independent"}
var voteMembers = []string{"district", "party", "votes", "wins"}
var thresholdMembers = []string{"share", "scope", "base"}

// ReadJSON reads an election scenario document.
func ReadJSON(file string, r io.Reader) (*Source, error) {
	data, err := io.ReadAll(io.LimitReader(r, 1<<31))
	if err != nil {
		return nil, &input.Error{File: file, Msg: err.Error()}
	}
	v, err := jsondoc.Parse(data)
	if err != nil {
		var se *jsondoc.SyntaxError
		if errors.As(err, &se) {
			return nil, &input.Error{File: file, Line: se.Line, Msg: "column " + strconv.Itoa(se.Col) + ": " + se.Msg}
		}
		return nil, &input.Error{File: file, Msg: err.Error()}
	}
	return FromDoc(file, v)
}

// IsElectionDoc reports whether a parsed JSON document is an election
// scenario (its kind member is "election").
func IsElectionDoc(v *jsondoc.Value) bool {
	k := v.Get("kind")
	return k != nil && k.Kind == jsondoc.String && k.Text == Kind
}

// FromDoc reads an election scenario from a parsed JSON document (or from
// JavaScript values converted to one). Unknown members are errors, so that
// a misspelt option is never silently ignored.
func FromDoc(file string, v *jsondoc.Value) (*Source, error) {
	src := newSource(file)
	bad := func(x *jsondoc.Value, field, msg string) error {
		return &input.Error{File: file, Line: jsondoc.LineOf(x), Field: field, Msg: msg}
	}
	if v == nil || v.Kind != jsondoc.Object {
		return nil, bad(v, "", "an election scenario is a JSON object with kind \"election\", districts and votes")
	}
	for _, f := range v.Fields {
		if !slices.Contains(electionMembers, f.Key) {
			return nil, bad(f.Value, f.Key, "unknown member; an election scenario has "+strings.Join(electionMembers, ", "))
		}
		src.fields[f.Key] = place{file, jsondoc.LineOf(f.Value)}
		src.Given[f.Key] = true
	}
	s := &src.Scenario
	if x := v.Get("version"); !x.IsNull() {
		n, err := input.Whole(x)
		if err != nil {
			return nil, bad(x, "version", err.Error())
		}
		if n != DocVersion {
			return nil, bad(x, "version", "this is a version "+strconv.Itoa(n)+" document; this seatsmith reads version "+strconv.Itoa(DocVersion))
		}
	}
	if x := v.Get("kind"); x.IsNull() || x.Kind != jsondoc.String || x.Text != Kind {
		return nil, bad(x, "kind", "must be \"election\"")
	}
	if x := v.Get("title"); !x.IsNull() {
		if x.Kind != jsondoc.String {
			return nil, bad(x, "title", "must be a string")
		}
		src.Title = x.Text
	}
	str := func(key string) (*jsondoc.Value, string, error) {
		x := v.Get(key)
		if x.IsNull() {
			return nil, "", nil
		}
		if x.Kind != jsondoc.String {
			return x, "", bad(x, key, "must be a string")
		}
		return x, x.Text, nil
	}
	if x, t, err := str("system"); err != nil {
		return nil, err
	} else if x != nil {
		sys, err := ParseSystem(t)
		if err != nil {
			return nil, bad(x, "system", msgOf(err))
		}
		s.System = sys
	}
	for _, m := range []struct {
		key string
		dst *engine.Method
	}{{"method", &s.Method}, {"upper_method", &s.UpperMethod}, {"district_method", &s.DistrictMethod}} {
		x, t, err := str(m.key)
		if err != nil {
			return nil, err
		}
		if x == nil {
			continue
		}
		mm, err := engine.ParseMethod(t)
		if err != nil {
			return nil, bad(x, m.key, msgOf(err))
		}
		*m.dst = mm
	}
	for _, n := range []struct {
		key string
		dst *int
	}{{"seats", &s.Seats}, {"compensatory", &s.Compensatory}, {"alternative_wins", &s.WinsThreshold}} {
		x := v.Get(n.key)
		if x.IsNull() {
			continue
		}
		k, err := input.Whole(x)
		if err == nil && (k < 0 || k > engine.MaxSeats) {
			err = errors.New("must be between 0 and " + strconv.Itoa(engine.MaxSeats))
		}
		if err != nil {
			return nil, bad(x, n.key, err.Error())
		}
		*n.dst = k
	}
	if x, t, err := str("overhang"); err != nil {
		return nil, err
	} else if x != nil {
		r, err := ParseOverhangRule(t)
		if err != nil {
			return nil, bad(x, "overhang", msgOf(err))
		}
		s.Overhang = r
	}
	if x, t, err := str("upper_basis"); err != nil {
		return nil, err
	} else if x != nil {
		b, err := ParseBasis(t)
		if err != nil {
			return nil, bad(x, "upper_basis", msgOf(err))
		}
		s.UpperBasis = b
	}
	if x, t, err := str("tie"); err != nil {
		return nil, err
	} else if x != nil {
		tr, err := engine.ParseTieRule(t)
		if err != nil {
			return nil, bad(x, "tie", msgOf(err))
		}
		s.Tie = tr
	}
	if x := v.Get("other_votes"); !x.IsNull() {
		d, err := decimalOf(x)
		if err != nil {
			return nil, bad(x, "other_votes", err.Error())
		}
		s.OtherVotes = d
	}
	if x := v.Get("threshold"); !x.IsNull() {
		ths, err := thresholdsOf(file, x)
		if err != nil {
			return nil, err
		}
		s.Thresholds = ths
	}
	type list struct {
		key   string
		limit int
	}
	items := func(l list) ([]*jsondoc.Value, error) {
		x := v.Get(l.key)
		if x.IsNull() {
			return nil, nil
		}
		if x.Kind != jsondoc.Array {
			return nil, bad(x, l.key, "must be an array")
		}
		if len(x.Items) > l.limit {
			return nil, bad(x, l.key, "more than "+strconv.Itoa(l.limit)+" entries")
		}
		return x.Items, nil
	}
	ds, err := items(list{"districts", MaxDistricts})
	if err != nil {
		return nil, err
	}
	for k, x := range ds {
		d, err := districtOf(x)
		if err != nil {
			return nil, located(file, "districts", k, x, err)
		}
		s.Districts = append(s.Districts, d)
		src.parts["districts"] = append(src.parts["districts"], place{file, jsondoc.LineOf(x)})
	}
	ps, err := items(list{"parties", MaxParties})
	if err != nil {
		return nil, err
	}
	for k, x := range ps {
		p, err := partyOf(x)
		if err != nil {
			return nil, located(file, "parties", k, x, err)
		}
		s.Parties = append(s.Parties, p)
		src.parts["parties"] = append(src.parts["parties"], place{file, jsondoc.LineOf(x)})
	}
	if v.Get("votes").IsNull() {
		return nil, bad(v, "votes", "missing: an election scenario needs a votes array")
	}
	vs, err := items(list{"votes", MaxVotes})
	if err != nil {
		return nil, err
	}
	for k, x := range vs {
		vt, err := voteOf(x)
		if err != nil {
			return nil, located(file, "votes", k, x, err)
		}
		s.Votes = append(s.Votes, vt)
		src.parts["votes"] = append(src.parts["votes"], place{file, jsondoc.LineOf(x)})
	}
	return src, nil
}

// fieldErr is an error about one member of a list entry.
type fieldErr struct {
	x     *jsondoc.Value
	field string
	msg   string
}

func (e *fieldErr) Error() string { return e.field + ": " + e.msg }

func located(file, part string, k int, entry *jsondoc.Value, err error) error {
	var fe *fieldErr
	if !errors.As(err, &fe) {
		return &input.Error{File: file, Line: jsondoc.LineOf(entry), Field: part + "[" + strconv.Itoa(k) + "]", Msg: err.Error()}
	}
	l := jsondoc.LineOf(fe.x)
	if l == 0 {
		l = jsondoc.LineOf(entry)
	}
	f := part + "[" + strconv.Itoa(k) + "]"
	if fe.field != "" {
		f += "." + fe.field
	}
	return &input.Error{File: file, Line: l, Field: f, Msg: fe.msg}
}

func checkMembers(x *jsondoc.Value, what string, members []string) error {
	if x.Kind != jsondoc.Object {
		return &fieldErr{x, "", "a" + what + " is an object with " + strings.Join(members, ", ")}
	}
	for _, f := range x.Fields {
		if !slices.Contains(members, f.Key) {
			return &fieldErr{f.Value, f.Key, "unknown member; a" + what + " has " + strings.Join(members, ", ")}
		}
	}
	return nil
}

func nameOf(x *jsondoc.Value, key, what string) (string, error) {
	n := x.Get(key)
	if n.IsNull() || n.Kind != jsondoc.String || strings.TrimSpace(n.Text) == "" {
		return "", &fieldErr{n, key, "missing or empty: every " + what + " needs a " + key + " (a string)"}
	}
	return strings.TrimSpace(n.Text), nil
}

func districtOf(x *jsondoc.Value) (District, error) {
	var d District
	if err := checkMembers(x, " district", districtMembers); err != nil {
		return d, err
	}
	name, err := nameOf(x, "name", "district")
	if err != nil {
		return d, err
	}
	d.Name = name
	if y := x.Get("seats"); !y.IsNull() {
		k, err := input.Whole(y)
		if err == nil && (k < 0 || k > engine.MaxSeats) {
			err = errors.New("must be between 0 and " + strconv.Itoa(engine.MaxSeats))
		}
		if err != nil {
			return d, &fieldErr{y, "seats", strconv.Quote(name) + ": " + err.Error()}
		}
		d.Seats = k
	}
	if y := x.Get("population"); !y.IsNull() {
		p, err := decimalOf(y)
		if err != nil {
			return d, &fieldErr{y, "population", strconv.Quote(name) + ": " + err.Error()}
		}
		d.Population = &p
	}
	if y := x.Get("other_votes"); !y.IsNull() {
		o, err := decimalOf(y)
		if err != nil {
			return d, &fieldErr{y, "other_votes", strconv.Quote(name) + ": " + err.Error()}
		}
		d.OtherVotes = o
	}
	return d, nil
}

func partyOf(x *jsondoc.Value) (Party, error) {
	var p Party
	if err := checkMembers(x, " party", partyMembers); err != nil {
		return p, err
	}
	name, err := nameOf(x, "name", "party")
	if err != nil {
		return p, err
	}
	p.Name = name
	if y := x.Get("wins"); !y.IsNull() {
		k, err := input.Whole(y)
		if err == nil && (k < 0 || k > engine.MaxSeats) {
			err = errors.New("must be between 0 and " + strconv.Itoa(engine.MaxSeats))
		}
		if err != nil {
			return p, &fieldErr{y, "wins", strconv.Quote(name) + ": " + err.Error()}
		}
		p.Wins = k
	}
	for _, b := range []struct {
		key string
		dst *bool
	}{{"exempt", &p.Exempt}, {"independent", &p.Independent}} {
		if y := x.Get(b.key); !y.IsNull() {
			if y.Kind != jsondoc.Bool {
				return p, &fieldErr{y, b.key, strconv.Quote(name) + ": must be true or false"}
			}
			*b.dst = y.Bool
		}
	}
	return p, nil
}

func voteOf(x *jsondoc.Value) (Vote, error) {
	var v Vote
	if err := checkMembers(x, " vote row", voteMembers); err != nil {
		return v, err
	}
	if y := x.Get("district"); !y.IsNull() {
		if y.Kind != jsondoc.String {
			return v, &fieldErr{y, "district", "must be a string"}
		}
		v.District = strings.TrimSpace(y.Text)
	}
	name, err := nameOf(x, "party", "vote row")
	if err != nil {
		return v, err
	}
	v.Party = name
	y := x.Get("votes")
	if y.IsNull() {
		return v, &fieldErr{x, "votes", strconv.Quote(name) + ": missing"}
	}
	d, err := decimalOf(y)
	if err != nil {
		return v, &fieldErr{y, "votes", strconv.Quote(name) + ": " + err.Error()}
	}
	v.Votes = d
	if y := x.Get("wins"); !y.IsNull() {
		k, err := input.Whole(y)
		if err == nil && (k < 0 || k > engine.MaxSeats) {
			err = errors.New("must be between 0 and " + strconv.Itoa(engine.MaxSeats))
		}
		if err != nil {
			return v, &fieldErr{y, "wins", strconv.Quote(name) + ": " + err.Error()}
		}
		v.Wins = k
	}
	return v, nil
}

// thresholdsOf reads a threshold: a share ("5%"), an object {share, scope,
// base}, or an array of either.
func thresholdsOf(file string, x *jsondoc.Value) ([]Threshold, error) {
	one := func(y *jsondoc.Value, field string) (Threshold, error) {
		var t Threshold
		bad := func(z *jsondoc.Value, f, msg string) error {
			return &input.Error{File: file, Line: jsondoc.LineOf(z), Field: f, Msg: msg}
		}
		if y.Kind == jsondoc.String || y.Kind == jsondoc.Number {
			sh, err := input.ParseShare(y.Text)
			if err != nil {
				return t, bad(y, field, err.Error())
			}
			t.Share = sh
			return t, nil
		}
		if y.Kind != jsondoc.Object {
			return t, bad(y, field, "must be a share such as \"5%\", or an object {share, scope, base}")
		}
		for _, f := range y.Fields {
			if !slices.Contains(thresholdMembers, f.Key) {
				return t, bad(f.Value, field+"."+f.Key, "unknown member; a threshold has "+strings.Join(thresholdMembers, ", "))
			}
		}
		sh := y.Get("share")
		if sh.IsNull() || (sh.Kind != jsondoc.String && sh.Kind != jsondoc.Number) {
			return t, bad(y, field+".share", "missing: a share such as \"5%\" or 0.05")
		}
		share, err := input.ParseShare(sh.Text)
		if err != nil {
			return t, bad(sh, field+".share", err.Error())
		}
		t.Share = share
		if sc := y.Get("scope"); !sc.IsNull() {
			if sc.Kind != jsondoc.String {
				return t, bad(sc, field+".scope", "must be a string: election, any-district or district")
			}
			s, err := ParseScope(sc.Text)
			if err != nil {
				return t, bad(sc, field+".scope", msgOf(err))
			}
			t.Scope = s
		}
		if b := y.Get("base"); !b.IsNull() {
			if b.Kind != jsondoc.String {
				return t, bad(b, field+".base", "must be a string: lists or valid")
			}
			base, err := ParseBase(b.Text)
			if err != nil {
				return t, bad(b, field+".base", msgOf(err))
			}
			t.Base = base
		}
		return t, nil
	}
	if x.Kind == jsondoc.Array {
		var out []Threshold
		for k, y := range x.Items {
			t, err := one(y, "threshold["+strconv.Itoa(k)+"]")
			if err != nil {
				return nil, err
			}
			out = append(out, t)
		}
		return out, nil
	}
	t, err := one(x, "threshold")
	if err != nil {
		return nil, err
	}
	return []Threshold{t}, nil
}

// decimalOf reads an exact non-negative decimal from a number or a string.
func decimalOf(x *jsondoc.Value) (engine.Decimal, error) {
	if x.Kind != jsondoc.Number && x.Kind != jsondoc.String {
		return engine.Decimal{}, errors.New("must be a number or a string holding one")
	}
	return parseCount(x.Text)
}

// parseCount reads votes or a population: an exact non-negative decimal.
func parseCount(text string) (engine.Decimal, error) {
	d, err := engine.ParseDecimal(text)
	if err != nil {
		return engine.Decimal{}, errors.New(input.NumberProblem("count", text, err))
	}
	return d, nil
}

// msgOf is err's message without its place.
func msgOf(err error) string {
	var e *Error
	if errors.As(err, &e) {
		return e.Msg
	}
	return engine.ErrorMsg(err)
}
