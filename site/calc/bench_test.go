package calc

import (
	"strconv"
	"strings"
	"testing"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
)

// fiftyUnits is an invented scenario of fifty units with made-up names and
// populations from tens of thousands to millions, 250 seats, as a block.
func fiftyUnits() string {
	first := []string{"Quell", "Vask", "Orn", "Tirr", "Zeph", "Mour", "Kest", "Brin", "Yalt", "Drov"}
	last := []string{"ara", "ion", "esk", "ith", "umbre"}
	var b strings.Builder
	b.WriteString(`{"version": 1, "title": "Fifty invented units", "seats": 250, "method": "huntington-hill", "units": [`)
	x := uint32(2463534242)
	for i := 0; i < 50; i++ {
		x ^= x << 13
		x ^= x >> 17
		x ^= x << 5
		if i > 0 {
			b.WriteString(", ")
		}
		b.WriteString(`{"name": "` + first[i%10] + last[i/10] + `", "population": ` + strconv.Itoa(20000+int(x%3000000)) + `}`)
	}
	b.WriteString("]}")
	return b.String()
}

// BenchmarkLiveFifty times one browser request for a fifty-unit calculator
// with every method compared, against its parts: the apportionment alone
// with every explanation, and the comparison alone.
func BenchmarkLiveFifty(b *testing.B) {
	block := fiftyUnits()
	doc, err := jsondoc.Parse([]byte(block))
	if err != nil {
		b.Fatal(err)
	}
	src, err := input.FromDoc("", doc)
	if err != nil {
		b.Fatal(err)
	}
	b.Run("live", func(b *testing.B) {
		// As the calculator page asks while the reader edits: the full
		// calculator, its seat order folded away.
		req := request(block, "mode", jsondoc.Str("full"), "margins", jsondoc.Boolean(false), "order", jsondoc.Boolean(false))
		for b.Loop() {
			if live(req).Get("state").Text != "live" {
				b.Fatal("not live")
			}
		}
	})
	b.Run("compute", func(b *testing.B) {
		// What the live request spends apportioning, comparing and
		// checking claims, before any of the results is laid out.
		blk, msg := parseBlock("fifty", Full, block)
		if blk == nil {
			b.Fatal(msg)
		}
		for b.Loop() {
			if o := RunWith(blk, nil, Options{QuickMargins: true, NoOrder: true}); o.Problem != nil {
				b.Fatal(o.Problem.Msg)
			}
		}
	})
	b.Run("allot", func(b *testing.B) {
		for b.Loop() {
			if _, err := engine.Allot(&src.Scenario, engine.Full); err != nil {
				b.Fatal(err)
			}
		}
	})
	b.Run("compare", func(b *testing.B) {
		for b.Loop() {
			analysis.CompareMethods(src.Scenario, engine.Methods(), 0)
		}
	})
}
