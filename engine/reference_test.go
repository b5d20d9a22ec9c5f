package engine

import (
	"math/big"
	"sort"
	"strconv"

	"pgregory.net/rapid"
)

// This file holds an independent reference implementation of every method,
// written for clarity rather than speed: populations are big.Rat values, a
// divisor method's result comes from sorting every seat slot by its exact
// priority value (not from a heap), and the largest-remainder passes use
// rational quotas. The property tests compare the engine against it on small
// scenarios, and the generators below build those scenarios.

// refSignpostSq returns s(a)^2 as an exact rational for a divisor method.
func refSignpostSq(m Method, a int) *big.Rat {
	x := big.NewRat(int64(a), 1)
	var s *big.Rat
	switch m {
	case Jefferson:
		s = new(big.Rat).Add(x, big.NewRat(1, 1))
	case Webster:
		s = new(big.Rat).Add(x, big.NewRat(1, 2))
	case ModifiedSainteLague:
		if a == 0 {
			s = big.NewRat(7, 10)
		} else {
			s = new(big.Rat).Add(x, big.NewRat(1, 2))
		}
	case Adams:
		s = x
	case Dean:
		// 2a(a+1)/(2a+1)
		s = new(big.Rat).Mul(big.NewRat(2*int64(a), 1), big.NewRat(int64(a)+1, 2*int64(a)+1))
	case HuntingtonHill:
		return new(big.Rat).Mul(x, big.NewRat(int64(a)+1, 1))
	default:
		panic("not a divisor method")
	}
	return new(big.Rat).Mul(s, s)
}

// refSlot is one seat a unit could take under a divisor method: its
// (a+1)-th seat, with priority p/s(a) kept as p^2 and s(a)^2.
type refSlot struct {
	unit int
	p2   *big.Rat // p^2
	s2   *big.Rat // s(a)^2; zero means an infinite priority (when p > 0)
}

// refCmpSlot compares two slots' priority values exactly.
func refCmpSlot(x, y refSlot) int {
	xInf, yInf := x.s2.Sign() == 0 && x.p2.Sign() > 0, y.s2.Sign() == 0 && y.p2.Sign() > 0
	switch {
	case xInf && yInf:
		return 0
	case xInf:
		return 1
	case yInf:
		return -1
	}
	// p_x^2 / s_x^2 against p_y^2 / s_y^2.
	l := new(big.Rat).Mul(x.p2, y.s2)
	r := new(big.Rat).Mul(y.p2, x.s2)
	return l.Cmp(r)
}

// refOutcome is the reference result: outright seats, whether a tie is
// left open at the cut, the tied units and the seats they contest. ok is
// false when no apportionment exists.
type refOutcome struct {
	ok       bool
	seats    []int
	ties     []refTie
	eligible []bool
}

// A refTie is a tie the reference found: the tied units and the seats they
// contest. Ties in a largest-remainder pass before the last are settled in
// input order; a final one leaves its seats unassigned.
type refTie struct {
	units []int
	seats int
}

func decRat(d Decimal) *big.Rat {
	return new(big.Rat).SetFrac(new(big.Int).SetUint64(d.Coef), new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(d.Places)), nil))
}

// refBounds returns every unit's bounds and eligibility straight from the
// scenario's definitions.
func refBounds(s *Scenario) (pops []*big.Rat, lo, hi []int, elig []bool) {
	n := len(s.Units)
	total := new(big.Rat)
	for _, u := range s.Units {
		p := decRat(u.Population)
		pops = append(pops, p)
		total.Add(total, p)
	}
	th := decRat(s.Threshold)
	for i, u := range s.Units {
		l, h := s.Min, 1<<40
		if s.Max > 0 {
			h = s.Max
		}
		if u.Min != nil {
			l = *u.Min
		}
		if u.Max != nil {
			h = *u.Max
		}
		lo, hi = append(lo, l), append(hi, h)
		// Excluded when p/P < threshold.
		share := new(big.Rat).Mul(th, total)
		elig = append(elig, th.Sign() == 0 || pops[i].Cmp(share) >= 0)
	}
	_ = n
	return
}

// refAllot apportions s by the definitions alone.
func refAllot(s *Scenario) refOutcome {
	pops, lo, hi, elig := refBounds(s)
	total := new(big.Rat)
	for i, p := range pops {
		if lo[i] > hi[i] {
			return refOutcome{}
		}
		total.Add(total, p)
	}
	if total.Sign() == 0 {
		return refOutcome{}
	}
	if s.Method.IsDivisor() {
		return refDivisor(s.Method, s.Seats, pops, lo, hi, elig)
	}
	return refRemainder(s.Method, s.Seats, pops, lo, hi, elig)
}

func refDivisor(m Method, h int, pops []*big.Rat, lo, hi []int, elig []bool) refOutcome {
	n := len(pops)
	out := refOutcome{seats: make([]int, n), eligible: elig}
	free := h
	var slots []refSlot
	for i := range pops {
		if !elig[i] {
			continue
		}
		out.seats[i] = lo[i]
		free -= lo[i]
		if pops[i].Sign() == 0 {
			continue
		}
		p2 := new(big.Rat).Mul(pops[i], pops[i])
		for a := lo[i]; a < hi[i] && a < lo[i]+h+1; a++ {
			slots = append(slots, refSlot{unit: i, p2: p2, s2: refSignpostSq(m, a)})
		}
	}
	if free < 0 || len(slots) < free {
		return out
	}
	sort.SliceStable(slots, func(x, y int) bool { return refCmpSlot(slots[x], slots[y]) > 0 })
	// Under Adams, Dean and Huntington–Hill a unit with people rounds up
	// from zero at every divisor: a first seat (infinite priority) left
	// out means no divisor gives an apportionment.
	if len(slots) > free && slots[free].s2.Sign() == 0 {
		return out
	}
	out.ok = true
	if free == 0 {
		return out
	}
	cut := slots[free-1]
	var gt, eq int
	var eqUnits []int
	for _, sl := range slots {
		switch c := refCmpSlot(sl, cut); {
		case c > 0:
			gt++
			out.seats[sl.unit]++
		case c == 0:
			eq++
			eqUnits = append(eqUnits, sl.unit)
		}
	}
	need := free - gt
	if eq == need {
		for _, u := range eqUnits {
			out.seats[u]++
		}
		return out
	}
	out.ties = []refTie{{uniqueSorted(eqUnits), need}}
	return out
}

func uniqueSorted(s []int) []int {
	s = append([]int(nil), s...)
	sort.Ints(s)
	var u []int
	for i, v := range s {
		if i == 0 || v != s[i-1] {
			u = append(u, v)
		}
	}
	return u
}

func refRemainder(m Method, h int, pops []*big.Rat, lo, hi []int, elig []bool) refOutcome {
	n := len(pops)
	out := refOutcome{seats: make([]int, n), eligible: elig}
	var active []int
	for i := range pops {
		if elig[i] {
			active = append(active, i)
		}
	}
	left := h
	for {
		if len(active) == 0 {
			out.ok = left == 0
			return out
		}
		if left < 0 {
			return out
		}
		total := new(big.Rat)
		for _, u := range active {
			total.Add(total, pops[u])
		}
		if total.Sign() == 0 {
			return out
		}
		var q *big.Rat
		if left == 0 {
			q = new(big.Rat).Add(total, big.NewRat(1, 1)) // above every population: all whole parts 0
		} else if m == Hamilton {
			q = new(big.Rat).Quo(total, big.NewRat(int64(left), 1))
		} else {
			t := new(big.Rat).Quo(total, big.NewRat(int64(left)+1, 1))
			f := new(big.Int).Quo(t.Num(), t.Denom())
			q = new(big.Rat).SetInt(f.Add(f, big.NewInt(1)))
		}
		got := make([]int, len(active))
		rems := make([]*big.Rat, len(active))
		sum := 0
		for j, u := range active {
			x := new(big.Rat).Quo(pops[u], q)
			f := new(big.Int).Quo(x.Num(), x.Denom())
			got[j] = int(f.Int64())
			rems[j] = x.Sub(x, new(big.Rat).SetInt(f))
			sum += got[j]
		}
		// A unit with no people takes no seat by remainder: it ranks after
		// every unit with people, and a pass cannot hand out more seats by
		// remainder than it has units with people.
		populated := 0
		for _, u := range active {
			if pops[u].Sign() > 0 {
				populated++
			}
		}
		extra := left - sum
		if extra < 0 || extra > populated {
			return out
		}
		rank := make([]int, len(active))
		for j := range rank {
			rank[j] = j
		}
		sort.SliceStable(rank, func(x, y int) bool {
			if c := rems[rank[x]].Cmp(rems[rank[y]]); c != 0 {
				return c > 0
			}
			return pops[active[rank[x]]].Sign() > 0 && pops[active[rank[y]]].Sign() == 0
		})
		// A tie at the cut: units that need the seat for their minimum
		// take it first, units at their maximum come last, input order
		// otherwise; the tie left is the group the cut falls inside.
		var tie *refTie
		boundTie := false
		if extra > 0 && extra < populated && rems[rank[extra-1]].Cmp(rems[rank[extra]]) == 0 {
			v := rems[rank[extra-1]]
			var groups [3][]int
			first, k := -1, 0
			for x, j := range rank {
				if rems[j].Cmp(v) != 0 || pops[active[j]].Sign() == 0 {
					continue
				}
				if first < 0 {
					first = x
				}
				if x < extra {
					k++
				}
				u := active[j]
				switch {
				case got[j]+1 == lo[u]:
					groups[0] = append(groups[0], j)
				case got[j] == hi[u]:
					groups[2] = append(groups[2], j)
				default:
					groups[1] = append(groups[1], j)
				}
			}
			run := rank[first:first]
			start := 0
			for g, grp := range groups {
				sort.Ints(grp)
				run = append(run, grp...)
				if start < k && k < start+len(grp) {
					var units []int
					for _, j := range grp {
						units = append(units, active[j])
					}
					tie = &refTie{units: units, seats: k - start}
					boundTie = g != 1
				}
				start += len(grp)
			}
		}
		for k := 0; k < extra; k++ {
			got[rank[k]]++
		}
		var rest []int
		pinned := false
		for j, u := range active {
			switch {
			case got[j] < lo[u]:
				out.seats[u], pinned = lo[u], true
				left -= lo[u]
			case got[j] > hi[u]:
				out.seats[u], pinned = hi[u], true
				left -= hi[u]
			default:
				rest = append(rest, u)
			}
		}
		if !pinned {
			for j, u := range active {
				out.seats[u] = got[j]
			}
			if tie != nil {
				out.ties = append(out.ties, *tie)
				for k := extra - tie.seats; k < extra; k++ {
					out.seats[active[rank[k]]]--
				}
			}
			out.ok = true
			return out
		}
		if tie != nil && boundTie {
			out.ties = append(out.ties, *tie)
		}
		active = rest
	}
}

// refSeatsAtDivisor rounds every population at the divisor d with the
// method's signposts, counting exactly how many signposts lie strictly below
// p/d, then clamps to the bounds. It shares no code with the engine.
func refSeatsAtDivisor(m Method, d *big.Rat, pops []*big.Rat, lo, hi []int, elig []bool) []int {
	seats := make([]int, len(pops))
	for i, p := range pops {
		if !elig[i] {
			continue
		}
		x := new(big.Rat).Quo(p, d)
		x2 := new(big.Rat).Mul(x, x)
		below := func(a int) bool { // s(a) < p/d, compared through squares
			return refSignpostSq(m, a).Cmp(x2) < 0
		}
		// Signposts increase with a, so count them by doubling then
		// bisection.
		n := 0
		switch {
		case p.Sign() == 0:
		case below(hi[i] - 1):
			n = hi[i] // at least the cap: clamped below
		default:
			hiA := 1
			for below(hiA - 1) {
				hiA *= 2
			}
			loA := 0 // below(a) holds for every a < loA
			for loA < hiA {
				mid := (loA + hiA) / 2
				if below(mid) {
					loA = mid + 1
				} else {
					hiA = mid
				}
			}
			n = loA
		}
		seats[i] = min(max(n, lo[i]), hi[i])
	}
	return seats
}

// Generators for small scenarios.

var testNames = []string{"Orlen", "Tamsk", "Brevia", "Quill", "Marrow", "Ostend", "Pellin", "Varda", "Yssel", "Corrin", "Dunmoor", "Estara"}

// genScenario draws a small scenario for method m. maxPop bounds the
// populations; bounds and thresholds appear when withBounds is set.
func genScenario(t *rapid.T, m Method, maxUnits int, maxPop uint64, maxSeats int, withBounds bool) *Scenario {
	n := rapid.IntRange(1, maxUnits).Draw(t, "units")
	s := &Scenario{Method: m, Seats: rapid.IntRange(1, maxSeats).Draw(t, "seats")}
	decimals := rapid.IntRange(0, 6).Draw(t, "decimals") == 0
	for i := 0; i < n; i++ {
		p := Decimal{Coef: rapid.Uint64Range(0, maxPop).Draw(t, "pop")}
		if decimals {
			p.Places = uint8(rapid.IntRange(0, 2).Draw(t, "places"))
		}
		u := Unit{Name: testNames[i%len(testNames)] + suffix(i), Population: p.trim()}
		if withBounds && rapid.IntRange(0, 3).Draw(t, "hasMin") == 0 {
			v := rapid.IntRange(0, 3).Draw(t, "min")
			u.Min = &v
		}
		if withBounds && rapid.IntRange(0, 3).Draw(t, "hasMax") == 0 {
			v := rapid.IntRange(0, maxSeats).Draw(t, "max")
			u.Max = &v
		}
		s.Units = append(s.Units, u)
	}
	if withBounds {
		s.Min = rapid.IntRange(0, 4).Draw(t, "defmin") / 3 // mostly 0, sometimes 1
		if rapid.IntRange(0, 3).Draw(t, "hasDefMax") == 0 {
			s.Max = rapid.IntRange(0, maxSeats).Draw(t, "defmax")
		}
		if rapid.IntRange(0, 2).Draw(t, "hasThreshold") == 0 {
			s.Threshold = rapid.SampledFrom([]Decimal{{Coef: 5, Places: 2}, {Coef: 1, Places: 1}, {Coef: 25, Places: 2}, {Coef: 2, Places: 1}}).Draw(t, "threshold")
		}
	}
	return s
}

// drawTieRule draws no tie rule, input order, or lot with a drawn seed.
func drawTieRule(t *rapid.T) TieRule {
	switch rapid.IntRange(0, 2).Draw(t, "tie") {
	case 1:
		return TieRule{Kind: TieByOrder}
	case 2:
		return TieRule{Kind: TieByLot, Seed: rapid.Uint64().Draw(t, "seed")}
	}
	return TieRule{}
}

func suffix(i int) string {
	if i < len(testNames) {
		return ""
	}
	return strconv.Itoa(i / len(testNames))
}

func cloneScenario(s *Scenario) *Scenario {
	c := *s
	c.Units = append([]Unit(nil), s.Units...)
	return &c
}
