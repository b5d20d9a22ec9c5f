package claim

import (
	"slices"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
)

// A Kind is what a claim asserts.
type Kind uint8

// The kinds of claims.
const (
	Seats Kind = iota + 1
	Differ
	Agree
	BreaksQuota
	MeetsQuota
	GainBelow
	LoseBelow
	Alabama
	Excluded
	Included
	NoAlabama
	NoQuotaViolation
	PopulationParadox
	NoPopulationParadox
	NewStates
	NoNewStates
)

// lastKind is the last of the kinds.
const lastKind = NoNewStates

var kindIDs = [...]string{
	Seats: "seats", Differ: "differ", Agree: "agree", BreaksQuota: "breaks-quota",
	MeetsQuota: "meets-quota", GainBelow: "gain-below", LoseBelow: "lose-below",
	Alabama: "alabama", Excluded: "excluded", Included: "included",
	NoAlabama: "no-alabama", NoQuotaViolation: "no-quota-violation",
	PopulationParadox: "population-paradox", NoPopulationParadox: "no-population-paradox",
	NewStates: "new-states", NoNewStates: "no-new-states",
}

// String returns the kind's id, as written in a claim.
func (k Kind) String() string {
	if k >= Seats && k <= lastKind {
		return kindIDs[k]
	}
	return "unknown"
}

// Kinds returns the ids of every kind.
func Kinds() []string {
	var ids []string
	for k := Seats; k <= lastKind; k++ {
		ids = append(ids, kindIDs[k])
	}
	return ids
}

// A Claim is one checkable statement.
type Claim struct {
	ID   string
	Text string // the author's sentence, or empty
	Kind Kind
	// Unit is the unit the claim is about; empty for a claim about every
	// unit (see [Kind.UnitOptional]).
	Unit string
	// Gainer is, for a population-paradox claim, the unit that gains the
	// seat the claim's unit loses (empty: any unit).
	Gainer string
	// Method is the method the claim is about (zero: the scenario's own);
	// Methods the two methods of a differ or agree claim.
	Method  engine.Method
	Methods [2]engine.Method
	// House is the house size the claim is about (zero: the scenario's).
	House int
	// From and To are the house sizes a no-alabama or no-quota-violation
	// claim covers (zero: the range of the sweep block it belongs to).
	From, To int
	// Seats is the seat count of a seats claim.
	Seats int
	// Below is the bound of a margin claim.
	Below engine.Decimal
	// Line is where the claim starts in its file.
	Line int
}

var members = []string{"id", "text", "kind", "unit", "gainer", "method", "methods", "house", "from", "to", "seats", "below"}

// needs lists the members each kind requires beyond id, kind and unit.
var needs = map[Kind][]string{
	Seats: {"seats"}, Differ: {"methods"}, Agree: {"methods"},
	GainBelow: {"below"}, LoseBelow: {"below"},
}

// UnitOptional reports whether a claim of kind k may leave out its unit,
// and is then about every unit: no-alabama, no-quota-violation,
// no-population-paradox, new-states and no-new-states.
func (k Kind) UnitOptional() bool {
	switch k {
	case NoAlabama, NoQuotaViolation, NoPopulationParadox, NewStates, NoNewStates:
		return true
	}
	return false
}

// ranged reports whether a claim of kind k covers a range of house sizes.
func (k Kind) ranged() bool { return k == NoAlabama || k == NoQuotaViolation }

// Parse reads a claims array. Errors are *input.Error values with the line
// and field at fault (the file is left for the caller to fill in).
func Parse(v *jsondoc.Value) ([]Claim, error) {
	if v.IsNull() {
		return nil, nil
	}
	if v.Kind != jsondoc.Array {
		return nil, &input.Error{Line: v.Line, Field: "claims", Msg: "must be an array of claims"}
	}
	var out []Claim
	seen := map[string]bool{}
	for i, x := range v.Items {
		c, err := parseOne(x)
		if err != nil {
			err.Field = "claims[" + strconv.Itoa(i) + "]" + dotted(err.Field)
			if err.Line == 0 {
				err.Line = x.Line
			}
			return nil, err
		}
		if seen[c.ID] {
			return nil, &input.Error{Line: x.Line, Field: "claims[" + strconv.Itoa(i) + "].id", Msg: strconv.Quote(c.ID) + " is used by another claim"}
		}
		seen[c.ID] = true
		out = append(out, c)
	}
	return out, nil
}

func dotted(f string) string {
	if f == "" {
		return ""
	}
	return "." + f
}

func parseOne(x *jsondoc.Value) (Claim, *input.Error) {
	c := Claim{Line: x.Line}
	if x.Kind != jsondoc.Object {
		return c, &input.Error{Msg: "a claim is an object with id, kind and unit"}
	}
	for _, f := range x.Fields {
		if !slices.Contains(members, f.Key) {
			return c, &input.Error{Line: f.Value.Line, Field: f.Key, Msg: "unknown member; a claim has " + strings.Join(members, ", ")}
		}
	}
	str := func(key string, required bool) (string, *input.Error) {
		v := x.Get(key)
		if v.IsNull() {
			if required {
				return "", &input.Error{Field: key, Msg: "missing"}
			}
			return "", nil
		}
		if v.Kind != jsondoc.String || strings.TrimSpace(v.Text) == "" {
			return "", &input.Error{Line: v.Line, Field: key, Msg: "must be a non-empty string"}
		}
		return strings.TrimSpace(v.Text), nil
	}
	var err *input.Error
	if c.ID, err = str("id", true); err != nil {
		return c, err
	}
	if c.Text, err = str("text", false); err != nil {
		return c, err
	}
	k, err := str("kind", true)
	if err != nil {
		return c, err
	}
	for kk := Seats; kk <= lastKind; kk++ {
		if kindIDs[kk] == k {
			c.Kind = kk
		}
	}
	if c.Kind == 0 {
		return c, &input.Error{Line: x.Get("kind").Line, Field: "kind", Msg: "unknown kind " + strconv.Quote(k) + "; known: " + strings.Join(Kinds(), ", ")}
	}
	if c.Unit, err = str("unit", !c.Kind.UnitOptional()); err != nil {
		return c, err
	}
	for _, need := range needs[c.Kind] {
		if x.Get(need).IsNull() {
			return c, &input.Error{Field: need, Msg: "missing: a " + k + " claim needs " + need}
		}
	}
	for _, f := range x.Fields {
		switch f.Key {
		case "method":
			m, e := method(f.Value)
			if e != nil {
				return c, e
			}
			c.Method = m
		case "methods":
			if c.Kind != Differ && c.Kind != Agree {
				return c, &input.Error{Line: f.Value.Line, Field: "methods", Msg: "only differ and agree claims name two methods"}
			}
			if f.Value.Kind != jsondoc.Array || len(f.Value.Items) != 2 {
				return c, &input.Error{Line: f.Value.Line, Field: "methods", Msg: "must be an array of two method ids"}
			}
			for j, mv := range f.Value.Items {
				m, e := method(mv)
				if e != nil {
					e.Field = "methods[" + strconv.Itoa(j) + "]"
					return c, e
				}
				c.Methods[j] = m
			}
		case "gainer":
			if c.Kind != PopulationParadox {
				return c, &input.Error{Line: f.Value.Line, Field: "gainer", Msg: "only a population-paradox claim names a gainer"}
			}
			if c.Gainer, err = str("gainer", false); err != nil {
				return c, err
			}
		case "house", "seats", "from", "to":
			n, e := whole(f.Value, f.Key)
			if e != nil {
				return c, e
			}
			switch f.Key {
			case "house", "from", "to":
				if n < 1 || n > engine.MaxSeats {
					return c, &input.Error{Line: f.Value.Line, Field: f.Key, Msg: "must be a house size of at least 1"}
				}
				if f.Key == "house" {
					if c.Kind.ranged() {
						return c, &input.Error{Line: f.Value.Line, Field: "house", Msg: "a " + k + " claim covers house sizes from and to, not one house"}
					}
					c.House = n
					break
				}
				if !c.Kind.ranged() {
					return c, &input.Error{Line: f.Value.Line, Field: f.Key, Msg: "only no-alabama and no-quota-violation claims cover a range from and to"}
				}
				if f.Key == "from" {
					c.From = n
				} else {
					c.To = n
				}
			default:
				if c.Kind != Seats {
					return c, &input.Error{Line: f.Value.Line, Field: "seats", Msg: "only a seats claim has seats"}
				}
				c.Seats = n
			}
		case "below":
			if c.Kind != GainBelow && c.Kind != LoseBelow {
				return c, &input.Error{Line: f.Value.Line, Field: "below", Msg: "only gain-below and lose-below claims have below"}
			}
			if f.Value.Kind != jsondoc.Number && f.Value.Kind != jsondoc.String {
				return c, &input.Error{Line: f.Value.Line, Field: "below", Msg: "must be a number (the margin stays below it)"}
			}
			d, e := engine.ParseDecimal(f.Value.Text)
			if e != nil {
				return c, &input.Error{Line: f.Value.Line, Field: "below", Msg: strconv.Quote(f.Value.Text) + " is not a bound for a margin: " + e.Error()}
			}
			c.Below = d
		}
	}
	if (c.From == 0) != (c.To == 0) {
		return c, &input.Error{Field: "from", Msg: "give both from and to, or neither (the sweep block's range)"}
	}
	if c.From > c.To {
		return c, &input.Error{Line: x.Get("from").Line, Field: "from", Msg: "must not be above to"}
	}
	return c, nil
}

func method(v *jsondoc.Value) (engine.Method, *input.Error) {
	if v.Kind != jsondoc.String {
		return 0, &input.Error{Line: v.Line, Field: "method", Msg: "must be a method id such as \"webster\""}
	}
	m, err := engine.ParseMethod(v.Text)
	if err != nil {
		return 0, &input.Error{Line: v.Line, Field: "method", Msg: "unknown method " + strconv.Quote(v.Text) + "; known: " + strings.Join(engine.MethodIDs(), ", ")}
	}
	return m, nil
}

func whole(v *jsondoc.Value, key string) (int, *input.Error) {
	if v.Kind == jsondoc.Number {
		if n, err := strconv.Atoi(v.Text); err == nil && n >= 0 {
			return n, nil
		}
	}
	return 0, &input.Error{Line: v.Line, Field: key, Msg: "must be a whole number"}
}
