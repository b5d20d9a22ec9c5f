package engine

import (
	"math/big"
	"strconv"
	"strings"
)

// A Method is an apportionment method. The zero Method is not valid.
type Method uint8

// The methods the engine implements.
const (
	// Hamilton is the largest-remainder method with the Hare quota P/H
	// (also called Hare–Niemeyer).
	Hamilton Method = iota + 1
	// Droop is the largest-remainder method with the Droop quota
	// floor(P/(H+1)) + 1.
	Droop
	// Jefferson is the divisor method of greatest divisors (D'Hondt);
	// signpost a+1.
	Jefferson
	// Webster is the divisor method of major fractions (Sainte-Laguë);
	// signpost a+1/2.
	Webster
	// Adams is the divisor method of smallest divisors; signpost a.
	Adams
	// Dean is the harmonic-mean divisor method; signpost 2a(a+1)/(2a+1).
	Dean
	// HuntingtonHill is the method of equal proportions; signpost
	// sqrt(a(a+1)). It has apportioned the U.S. House since 1941.
	HuntingtonHill
	// ModifiedSainteLague is Webster with the first signpost 0.7 (first
	// divisor 1.4 in the divisor series 1.4, 3, 5, ...).
	ModifiedSainteLague
)

var methodIDs = [...]string{
	Hamilton:            "hamilton",
	Droop:               "droop",
	Jefferson:           "jefferson",
	Webster:             "webster",
	Adams:               "adams",
	Dean:                "dean",
	HuntingtonHill:      "huntington-hill",
	ModifiedSainteLague: "modified-sainte-lague",
}

var methodNames = [...]string{
	Hamilton:            "Hamilton (Hare quota)",
	Droop:               "Droop quota",
	Jefferson:           "Jefferson (D'Hondt)",
	Webster:             "Webster (Sainte-Laguë)",
	Adams:               "Adams",
	Dean:                "Dean",
	HuntingtonHill:      "Huntington–Hill",
	ModifiedSainteLague: "modified Sainte-Laguë",
}

var methodAliases = map[string]Method{
	"hare":                  Hamilton,
	"hare-niemeyer":         Hamilton,
	"largest-remainder":     Hamilton,
	"droop-quota":           Droop,
	"dhondt":                Jefferson,
	"d'hondt":               Jefferson,
	"d-hondt":               Jefferson,
	"greatest-divisors":     Jefferson,
	"sainte-lague":          Webster,
	"sainte-laguë":          Webster,
	"major-fractions":       Webster,
	"smallest-divisors":     Adams,
	"harmonic-mean":         Dean,
	"equal-proportions":     HuntingtonHill,
	"hill":                  HuntingtonHill,
	"modified-sainte-laguë": ModifiedSainteLague,
}

// Methods returns every method in a fixed order: the largest-remainder
// methods first, then the divisor methods.
func Methods() []Method {
	return []Method{Hamilton, Droop, Jefferson, Webster, Adams, Dean, HuntingtonHill, ModifiedSainteLague}
}

// ParseMethod returns the method with the given id or alias. Case, spaces and
// underscores are not significant ("Huntington Hill" and "huntington_hill"
// both name [HuntingtonHill]).
func ParseMethod(s string) (Method, error) {
	k := strings.ToLower(strings.TrimSpace(s))
	k = strings.NewReplacer(" ", "-", "_", "-", "–", "-").Replace(k)
	for m := Hamilton; m <= ModifiedSainteLague; m++ {
		if methodIDs[m] == k {
			return m, nil
		}
	}
	if m, ok := methodAliases[k]; ok {
		return m, nil
	}
	return 0, &Error{Unit: -1, Field: "method", Msg: "unknown method " + strconvQuote(s) + "; known: " + strings.Join(MethodIDs(), ", ")}
}

// MethodIDs returns the ids of all methods, in the order of [Methods].
func MethodIDs() []string {
	ids := make([]string, 0, len(methodIDs)-1)
	for _, m := range Methods() {
		ids = append(ids, m.String())
	}
	return ids
}

// String returns the method's id, such as "huntington-hill".
func (m Method) String() string {
	if m.Valid() {
		return methodIDs[m]
	}
	return "invalid-method"
}

// Name returns the method's display name, such as "Huntington–Hill".
func (m Method) Name() string {
	if m.Valid() {
		return methodNames[m]
	}
	return "invalid method"
}

// Valid reports whether m is one of the defined methods.
func (m Method) Valid() bool { return m >= Hamilton && m <= ModifiedSainteLague }

// IsDivisor reports whether m is a divisor method.
func (m Method) IsDivisor() bool { return m >= Jefferson && m <= ModifiedSainteLague }

// IsLargestRemainder reports whether m is a largest-remainder method.
func (m Method) IsLargestRemainder() bool { return m == Hamilton || m == Droop }

// ZeroFirstSignpost reports whether the method's first signpost s(0) is zero,
// so that every unit with people gets a seat before any unit gets two.
func (m Method) ZeroFirstSignpost() bool {
	return m == Adams || m == Dean || m == HuntingtonHill
}

// Signpost returns the divisor method's signpost s(a), for a ≥ 0, as the
// fraction num/den: a quotient rounds to a seats when s(a-1) ≤ q ≤ s(a).
// For Huntington–Hill, whose signposts are square roots, it returns s(a)²
// and squared is true. num is zero for a zero signpost. ok is false for a
// method that has no signposts (the largest-remainder methods).
func (m Method) Signpost(a int) (num, den uint64, squared, ok bool) {
	if !m.IsDivisor() || a < 0 {
		return 0, 0, false, false
	}
	s := m.signpost(a)
	return s.n, s.d, s.sq, true
}

// SignpostText returns a readable form of the signpost s(a), such as
// "2.5", "4/3" or "sqrt(2·3)" (a decimal where one of at most six places
// is exact, else the reduced fraction), or "" for a method without
// signposts.
func (m Method) SignpostText(a int) string {
	n, d, sq, ok := m.Signpost(a)
	switch {
	case !ok:
		return ""
	case sq:
		return "sqrt(" + strconv.Itoa(a) + "·" + strconv.Itoa(a+1) + ")"
	}
	r := new(big.Rat).SetFrac(bigU(n), bigU(d))
	if t, ok := exactDecimal(r, 6); ok {
		return t
	}
	return r.String()
}

// signpost describes s(a) for a divisor method: s(a) = n/d, or for
// Huntington–Hill s(a)^2 = n/d (sq is true).
type signpost struct {
	n, d uint64
	sq   bool
}

// signpost returns s(a) for a >= 0.
func (m Method) signpost(a int) signpost {
	u := uint64(a)
	switch m {
	case Jefferson:
		return signpost{u + 1, 1, false}
	case Webster:
		return signpost{2*u + 1, 2, false}
	case Adams:
		return signpost{u, 1, false}
	case Dean:
		return signpost{2 * u * (u + 1), 2*u + 1, false}
	case HuntingtonHill:
		return signpost{u * (u + 1), 1, true}
	case ModifiedSainteLague:
		if a == 0 {
			return signpost{7, 10, false}
		}
		return signpost{2*u + 1, 2, false}
	}
	panic("engine: signpost of a method that has none")
}
