//go:build !js

package nodetest

import (
	"math/rand/v2"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
)

// Random scenarios for the comparison with the native packages. The data
// is invented: generated names and populations.

// methodSpellings gives, for some methods, other names a scenario may use
// (engine.ParseMethod's aliases and case and spacing variants).
var methodSpellings = map[engine.Method][]string{
	engine.Hamilton:            {"hare", "Hare-Niemeyer", "largest_remainder"},
	engine.Jefferson:           {"dhondt", "D'Hondt", "greatest divisors"},
	engine.Webster:             {"sainte-lague", "Sainte-Laguë", "major fractions"},
	engine.HuntingtonHill:      {"equal-proportions", "Huntington Hill", "hill"},
	engine.ModifiedSainteLague: {"Modified Sainte Lague"},
}

// maxRemainderUnits caps the units of largest-remainder scenarios.
const maxRemainderUnits = 12

var syllables = []string{"or", "len", "tam", "sk", "bre", "via", "cal", "moor", "pel", "rin", "sar", "row", "vell", "ked", "dle", "mar", "gate", "quil", "fen", "ash"}

// unitName makes the i-th invented unit name; some carry characters that
// JSON and HTML escape.
func unitName(r *rand.Rand, i int) string {
	var b strings.Builder
	for k := 0; k < 2+r.IntN(2); k++ {
		b.WriteString(syllables[r.IntN(len(syllables))])
	}
	name := strings.ToUpper(b.String()[:1]) + b.String()[1:] + " " + strconv.Itoa(i+1)
	switch r.IntN(12) {
	case 0:
		name += ` "North" & <South>`
	case 1:
		name += " Ærøvik–Öst"
	case 2:
		name = "  " + name + "\t" // trimmed by the reader
	}
	return name
}

// population returns a population as a JSON value: a number or a string,
// whole or an exact decimal, from 0 to 10^12.
func population(r *rand.Rand, style int) *jsondoc.Value {
	mag := uint64(1)
	for k := r.IntN(13); k > 0; k-- {
		mag *= 10
	}
	whole := r.Uint64N(mag) + 1
	if r.IntN(40) == 0 {
		whole = 0
	}
	switch style {
	case 0: // whole numbers as JSON numbers
		return jsondoc.Num(strconv.FormatUint(whole, 10))
	case 1: // whole numbers as strings
		return jsondoc.Str(strconv.FormatUint(whole, 10))
	case 2: // exact decimals as strings, up to six places
		places := 1 + r.IntN(6)
		w := r.Uint64N(1_000_000_000)
		f := r.Uint64N(uint64(pow10(places)))
		s := strconv.FormatUint(w, 10) + "." + pad(strconv.FormatUint(f, 10), places)
		return jsondoc.Str(s)
	default: // decimals with two places as JSON numbers, written as JavaScript writes them
		c := r.Uint64N(10_000_000_000)
		return jsondoc.Num(strconv.FormatFloat(float64(c)/100, 'f', -1, 64))
	}
}

func pow10(n int) int {
	p := 1
	for ; n > 0; n-- {
		p *= 10
	}
	return p
}

func pad(s string, n int) string {
	for len(s) < n {
		s = "0" + s
	}
	return s
}

// randomScenario makes the k-th scenario document. Every method comes up
// in turn; some scenarios carry bounds, a threshold or a tie rule, some
// have ties, and some cannot be apportioned.
func randomScenario(r *rand.Rand, k int) *jsondoc.Value {
	ms := engine.Methods()
	m := ms[k%len(ms)]
	n := 1 + r.IntN(60)
	h := 1 + r.IntN(1000)
	if m.IsLargestRemainder() {
		// Largest-remainder margins with minimums or maximums are proven
		// stretch by stretch, tenths of a second a scenario at 60 units in
		// WebAssembly; smaller tables keep the suite fast.
		n = 1 + r.IntN(maxRemainderUnits)
	}
	v := jsondoc.NewObject()
	if r.IntN(3) == 0 {
		v.Set("version", jsondoc.Int(1))
	}
	if r.IntN(2) == 0 {
		v.Set("title", jsondoc.Str("Invented assembly "+strconv.Itoa(k)+" <&> “test”"))
	}
	v.Set("seats", jsondoc.Int(h))
	method := m.String()
	if alt := methodSpellings[m]; len(alt) > 0 && r.IntN(4) == 0 {
		method = alt[r.IntN(len(alt))]
	}
	v.Set("method", jsondoc.Str(method))
	if r.IntN(4) == 0 {
		v.Set("min", jsondoc.Int(r.IntN(3)))
	}
	if r.IntN(5) == 0 {
		v.Set("max", jsondoc.Int(r.IntN(h/2+2)))
	}
	switch r.IntN(8) {
	case 0:
		v.Set("threshold", jsondoc.Str(strconv.Itoa(1+r.IntN(10))+"%"))
	case 1:
		v.Set("threshold", jsondoc.Num("0.0"+strconv.Itoa(1+r.IntN(9))))
	}
	switch r.IntN(6) {
	case 0:
		v.Set("tie", jsondoc.Str("order"))
	case 1:
		v.Set("tie", jsondoc.Str("lot:"+strconv.Itoa(r.IntN(1000))))
	case 2:
		v.Set("tie", jsondoc.Str("none"))
	}
	style := r.IntN(4)
	units := jsondoc.NewArray()
	var pops []*jsondoc.Value
	for i := 0; i < n; i++ {
		p := population(r, style)
		if len(pops) > 0 && r.IntN(6) == 0 {
			p = pops[r.IntN(len(pops))] // equal populations make ties
		}
		pops = append(pops, p)
		u := jsondoc.NewObject().Set("name", jsondoc.Str(unitName(r, i))).Set("population", p)
		if r.IntN(10) == 0 {
			u.Set("min", jsondoc.Int(r.IntN(4)))
		}
		if r.IntN(12) == 0 {
			u.Set("max", jsondoc.Int(r.IntN(h+1)))
		}
		units.Append(u)
	}
	v.Set("units", units)
	// Some scenarios that cannot be apportioned.
	switch r.IntN(12) {
	case 0: // fewer seats than units
		v.Set("seats", jsondoc.Int(1+r.IntN(n)))
	case 1: // minimums above the house size
		v.Set("min", jsondoc.Int(h/n+2))
	case 2: // a population with too many digits once aligned
		units.Items[r.IntN(n)].Set("population", jsondoc.Str("999999999999.1234567"))
	}
	return v
}

// csvText writes a scenario's units as a CSV table, with the quirks real
// tables have: a byte-order mark, CRLF line ends, quoted cells, the columns
// in another order, empty bound cells.
func csvText(r *rand.Rand, scenario *jsondoc.Value) string {
	cols := []string{"name", "population", "min", "max"}
	if r.IntN(2) == 0 {
		cols = []string{"Population", "NAME", "max", "min"}
	}
	nl := "\n"
	if r.IntN(2) == 0 {
		nl = "\r\n"
	}
	var b strings.Builder
	if r.IntN(3) == 0 {
		b.WriteString("\uFEFF")
	}
	b.WriteString(strings.Join(cols, ",") + nl)
	for _, u := range scenario.Get("units").Items {
		cells := make([]string, len(cols))
		for i, c := range cols {
			x := u.Get(strings.ToLower(c))
			if x == nil {
				continue
			}
			cells[i] = csvCell(x.Text)
		}
		b.WriteString(strings.Join(cells, ",") + nl)
	}
	return b.String()
}

func csvCell(s string) string {
	if strings.ContainsAny(s, "\",\r\n") || strings.TrimSpace(s) != s {
		return `"` + strings.ReplaceAll(s, `"`, `""`) + `"`
	}
	return s
}
