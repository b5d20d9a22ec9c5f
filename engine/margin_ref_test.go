package engine

import (
	"math/big"
	"slices"
	"strconv"
	"testing"

	"pgregory.net/rapid"
)

// This file keeps the margin search the engine used before its margins
// were computed from crossing points: an exact search over one unit's
// population in which every probe is a complete apportionment (withPop
// copies the populations; run apportions them). It is slow (every probe
// costs a copy and an apportionment, O(n) each, and a margin takes dozens
// to thousands of probes) but simple, and it is the reference the margins
// are held to (TestMarginsMatchSearch).

// refMargins fills every unit's Gain and Lose the way the engine once did:
// closed forms for divisor methods without a threshold (or an unsettled
// tie), the search otherwise.
func (pr *problem) refMargins(o *outcome, res *Result) {
	if pr.m.IsDivisor() && pr.threshold.IsZero() && (o.tie == nil || pr.tie.Kind != TieReport) {
		pr.margins(o, res)
		return
	}
	for i := range res.Units {
		u := &res.Units[i]
		u.Gain, u.Lose = nil, nil
		if gain, ok := pr.refGainSearch(i, o.seats[i]); ok {
			d := Decimal{Coef: gain, Places: uint8(pr.places)}.trim()
			u.Gain = &d
		}
		if lose, ok := pr.refLoseSearch(i, o.seats[i]); ok {
			d := Decimal{Coef: lose, Places: uint8(pr.places)}.trim()
			u.Lose = &d
		}
	}
}

func (pr *problem) refOutrightAt(i int, p uint64) int {
	q := pr.withPop(i, p)
	if q == nil {
		return -1
	}
	o, err := q.run(false)
	if err != nil {
		return -1
	}
	return o.seats[i]
}

// The searches below find the least change x in [1, limit] (people added
// for a gain, taken away for a loss) at which unit i holds more, or fewer,
// seats outright. The range of x is cut into pieces on which the outcome is
// monotone in x, and each piece is searched by bisection:
//
//   - A threshold changes who takes part at known points: unit j drops out
//     once p_j/P falls below the threshold and unit i joins once its own
//     share reaches it. These points cut x into segments with a fixed set
//     of eligible units. A population of zero (the end of a loss) is a
//     segment of its own, since under Adams, Dean and Huntington–Hill it
//     changes which house sizes are feasible.
//   - Within a segment a divisor method is population monotone, and so is
//     Hamilton: a growing unit's quota rises and every other quota falls.
//   - The Droop quota floor(P/(H+1))+1 steps up with the total, and a step
//     can cost the growing unit a seat, so each pass that contains unit i
//     also cuts the segment where its quota steps. With the quota of every
//     pass fixed, the unit's seats rise with its population.
//
// Within a piece the changes with an apportionment form an interval, so the
// search finds its end first.
//
// With bounds, a largest-remainder pass fixes units at their bounds and
// apportions the rest again, and which units it fixes changes with the
// population: the outcome is not monotone between those points, which the
// pieces above do not locate. For these the first refScanFirst changes are
// visited one by one, so a margin of up to refScanFirst people (or units of
// the last decimal place) is exact; a larger one is found by the piecewise
// search, which assumes the pass structure does not change inside a piece.

func (pr *problem) refEligibilityBreaks(i int, dir int, limit uint64) []uint64 {
	p := pr.pops[i]
	var out []uint64
	add := func(x *big.Int) {
		if x.Sign() > 0 && x.IsUint64() && x.Uint64() <= limit {
			out = append(out, x.Uint64())
		}
	}
	if dir < 0 && p <= limit {
		add(bigU(p)) // the population reaches zero
	}
	if !pr.threshold.IsZero() {
		var rest big.Int // the population of the other units
		for j, v := range pr.pops {
			if j != i {
				rest.Add(&rest, bigU(v))
			}
		}
		c := bigU(pr.threshold.Coef)
		unit := bigU(pow10(int(pr.threshold.Places)))
		pb := bigU(p)
		for j, v := range pr.pops {
			if j == i {
				// i takes part once p'·10^k >= c·(rest + p'), that is
				// p' >= c·rest / (10^k - c).
				d := new(big.Int).Sub(unit, c)
				if d.Sign() <= 0 {
					continue
				}
				u := new(big.Int).Mul(c, &rest)
				u.Add(u, new(big.Int).Sub(d, big.NewInt(1)))
				u.Quo(u, d) // the least p' at which i takes part
				if dir > 0 {
					add(new(big.Int).Sub(u, pb))
				} else {
					add(new(big.Int).Add(new(big.Int).Sub(pb, u), big.NewInt(1)))
				}
				continue
			}
			// j takes part while p' <= floor(p_j·10^k / c) - rest.
			vj := new(big.Int).Mul(bigU(v), unit)
			vj.Quo(vj, c)
			vj.Sub(vj, &rest)
			if dir > 0 {
				add(new(big.Int).Add(new(big.Int).Sub(vj, pb), big.NewInt(1)))
			} else {
				add(new(big.Int).Sub(pb, vj))
			}
		}
	}
	slices.Sort(out)
	return out
}

func (pr *problem) refPieceEnd(i int, x uint64, dir int, limit uint64) uint64 {
	if pr.m != Droop {
		return limit
	}
	p := pr.pops[i] + x
	if dir < 0 {
		p = pr.pops[i] - x
	}
	q := pr.withPop(i, p)
	var passes []*lrRound
	if q != nil && !pr.hasBounds() {
		// One pass over the eligible units.
		passes = []*lrRound{{seats: pr.h, units: []int{i}, total: q.eligibleTotal()}}
	} else if q != nil {
		if o, err := q.remainderCut(); err == nil {
			passes = o.passes
		}
	}
	if passes == nil {
		// No apportionment at x: use the first pass's quota over the
		// eligible units.
		if q == nil {
			q = pr.refWithPopAnyway(i, p)
		}
		r := &lrRound{seats: pr.h, units: []int{i}}
		r.total = q.eligibleTotal()
		passes = []*lrRound{r}
	}
	end := limit
	w0 := bigU(pow10(pr.places))
	for _, r := range passes {
		if !slices.Contains(r.units, i) || r.seats == 0 {
			continue
		}
		w := new(big.Int).Mul(w0, big.NewInt(int64(r.seats)+1))
		t := r.total.big()
		k := new(big.Int).Quo(t, w)
		var room *big.Int // further change with the same quota
		if dir > 0 {
			room = k.Add(k, big.NewInt(1)).Mul(k, w)
			room.Sub(room, big.NewInt(1))
			room.Sub(room, t)
		} else {
			room = new(big.Int).Sub(t, k.Mul(k, w))
		}
		e := new(big.Int).Add(room, bigU(x))
		if e.IsUint64() && e.Uint64() < end {
			end = e.Uint64()
		}
	}
	return end
}

func (pr *problem) refWithPopAnyway(i int, p uint64) *problem {
	q := *pr
	q.pops = append([]uint64(nil), pr.pops...)
	q.pops[i] = p
	q.eligible = append([]bool(nil), pr.eligible...)
	if !pr.threshold.IsZero() {
		total := sum128(q.pops)
		for j, v := range q.pops {
			q.eligible[j] = !belowShare(v, total, pr.threshold)
		}
	}
	return &q
}

func (pr *problem) refSearchChange(i int, dir int, limit uint64, seats func(uint64) int, want func(int) bool) (uint64, bool) {
	if limit == 0 {
		return 0, false
	}
	from := uint64(1)
	if pr.m.IsLargestRemainder() && pr.hasBounds() {
		// With bounds, which units a largest-remainder pass fixes at a
		// bound changes with the population, and with it every later
		// pass: the outcome need not be monotone between those points.
		// Visit the first changes one by one.
		for ; from <= min(limit, refScanFirst); from++ {
			if s := seats(from); s >= 0 && want(s) {
				return from, true
			}
		}
		if from > limit {
			return 0, false
		}
	}
	breaks := pr.refEligibilityBreaks(i, dir, limit)
	starts := append([]uint64{1}, breaks...)
	for k, s := range starts {
		if k > 0 && s == starts[k-1] {
			continue
		}
		e := limit
		for _, b := range breaks {
			if b > s {
				e = b - 1
				break
			}
		}
		if e < from {
			continue
		}
		pieces := 0
		for x := max(s, from); x <= e; {
			end := min(pr.refPieceEnd(i, x, dir, e), e)
			if pieces++; pieces > refMaxPieces {
				// Very many quota steps: bisect over the ends of the
				// pieces instead of visiting each (see below).
				if got, ok := pr.refSearchPieceEnds(i, x, e, dir, seats, want); ok {
					return got, true
				}
				break // nothing in this segment: try the next

			}
			if got, ok := pr.refSearchSegments(i, x, end, dir, seats, want); ok {
				return got, true
			}
			if end == e {
				break
			}
			x = end + 1
		}
	}
	return 0, false
}

const refScanFirst = 4096

const refMaxPieces = 256

// refBisect returns the x in [a, b) with f(x) and not f(x+1), given f(a)
// and not f(b).
func refBisect(a, b uint64, f func(uint64) bool) uint64 {
	for b-a > 1 {
		m := a + (b-a)/2
		if f(m) {
			a = m
		} else {
			b = m
		}
	}
	return a
}

func (pr *problem) refSearchPieceEnds(i int, x, e uint64, dir int, seats func(uint64) int, want func(int) bool) (uint64, bool) {
	ok := func(y uint64) bool { s := seats(y); return s >= 0 && want(s) }
	end := func(y uint64) uint64 { return min(pr.refPieceEnd(i, y, dir, e), e) }
	if !ok(e) {
		return 0, false
	}
	if ok(end(x)) {
		return pr.refSearchSegments(i, x, end(x), dir, seats, want)
	}
	// x's piece fails at its end and e succeeds: the first change whose
	// piece succeeds at its end starts it.
	hi := refBisect(x, e, func(y uint64) bool { return !ok(end(y)) }) + 1
	return pr.refSearchSegments(i, hi, end(hi), dir, seats, want)
}

func (pr *problem) refSearchPiece(lo, hi uint64, dir int, seats0 func(uint64) int, want func(int) bool) (uint64, bool) {
	var lastX uint64
	lastS, have := 0, false
	seats := func(x uint64) int { // remembers the last probe
		if !have || x != lastX {
			lastX, lastS, have = x, seats0(x), true
		}
		return lastS
	}
	feasible := func(x uint64) bool { return seats(x) >= 0 }
	if !feasible(hi) {
		// The feasible changes form a prefix: find its end. (A loss can
		// run into infeasible house sizes; with bounds, a largest-
		// remainder pass can fix more seats at the bounds than the house
		// holds once one unit is very large.)
		if !feasible(lo) {
			return 0, false
		}
		hi = refBisect(lo, hi, feasible)
	}
	ok := func(x uint64) bool { s := seats(x); return s >= 0 && want(s) }
	if !ok(hi) {
		return 0, false
	}
	if ok(lo) {
		return lo, true
	}
	return refBisect(lo, hi, func(x uint64) bool { return !ok(x) }) + 1, true
}

func (pr *problem) refGainSearch(i, a int) (uint64, bool) {
	if a >= pr.max[i] {
		return 0, false
	}
	p := pr.pops[i]
	return pr.refSearchChange(i, +1, min(MaxCoefficient-p, pr.gainLimit(i)),
		func(x uint64) int { return pr.refOutrightAt(i, p+x) },
		func(s int) bool { return s > a })
}

func (pr *problem) refLoseSearch(i, a int) (uint64, bool) {
	if a == 0 || (a <= pr.min[i] && pr.threshold.IsZero()) {
		return 0, false
	}
	p := pr.pops[i]
	return pr.refSearchChange(i, -1, p,
		func(x uint64) int { return pr.refOutrightAt(i, p-x) },
		func(s int) bool { return s < a })
}

func (pr *problem) refSearchSegments(i int, lo, hi uint64, dir int, seats func(uint64) int, want func(int) bool) (uint64, bool) {
	if !pr.m.IsLargestRemainder() || !pr.hasBounds() {
		return pr.refSearchPiece(lo, hi, dir, seats, want)
	}
	pop := func(x uint64) uint64 {
		if dir > 0 {
			return pr.pops[i] + x
		}
		return pr.pops[i] - x
	}
	for lo <= hi {
		sig := pr.refPinnedAt(i, pop(lo))
		same := func(x uint64) bool { return refEqualInts(pr.refPinnedAt(i, pop(x)), sig) }
		end := hi
		if !same(hi) {
			end = refBisect(lo, hi, same)
		}
		if got, ok := pr.refSearchPiece(lo, end, dir, seats, want); ok {
			return got, true
		}
		if end == hi {
			break
		}
		lo = end + 1
	}
	return 0, false
}

func (pr *problem) refPinnedAt(i int, p uint64) []int {
	q := pr.withPop(i, p)
	if q == nil {
		return nil
	}
	o, err := q.remainderCut()
	if err != nil {
		return nil
	}
	if o.pinned == nil {
		return make([]int, q.n()) // none fixed
	}
	return o.pinned
}

func refEqualInts(a, b []int) bool {
	if (a == nil) != (b == nil) || len(a) != len(b) {
		return false
	}
	for k := range a {
		if a[k] != b[k] {
			return false
		}
	}
	return true
}

// hasBounds reports whether any eligible unit has a minimum or a maximum.
func (pr *problem) hasBounds() bool {
	for j := range pr.pops {
		if pr.eligible[j] && (pr.min[j] > 0 || pr.max[j] != noCap) {
			return true
		}
	}
	return false
}

// genSearchScenario draws a scenario for TestMarginsMatchSearch: a few
// units with populations small (ties, units without people) or large
// (millions, decimals), bounds, thresholds and tie rules; or tens to
// hundreds of units without bounds, whose claims the margins count from a
// table.
func genSearchScenario(t *rapid.T, m Method) *Scenario {
	if rapid.IntRange(0, 2).Draw(t, "many") == 0 {
		n := rapid.IntRange(claimTableBig, 160).Draw(t, "units")
		s := &Scenario{Method: m, Seats: rapid.IntRange(1, 5*n).Draw(t, "seats")}
		places := uint8(rapid.IntRange(0, 2).Draw(t, "places"))
		for i := 0; i < n; i++ {
			p := uint64(1)
			for k := rapid.IntRange(0, 6).Draw(t, "decades"); k > 0; k-- {
				p *= 10
			}
			p = rapid.Uint64Range(0, 9*p).Draw(t, "pop")
			s.Units = append(s.Units, Unit{Name: "u" + strconv.Itoa(i), Population: Decimal{Coef: p, Places: places}.trim()})
		}
		if rapid.IntRange(0, 3).Draw(t, "hasThreshold") == 0 {
			s.Threshold = Decimal{Coef: uint64(rapid.IntRange(1, 30).Draw(t, "share")), Places: 3}
		}
		s.Tie = rapid.SampledFrom([]TieRule{{}, {Kind: TieByOrder}}).Draw(t, "tie")
		return s
	}
	maxPop := rapid.SampledFrom([]uint64{40, 5_000, 300_000}).Draw(t, "maxPop")
	s := genScenario(t, m, 7, maxPop, rapid.SampledFrom([]int{8, 30, 120}).Draw(t, "maxSeats"), rapid.Bool().Draw(t, "bounds"))
	s.Tie = rapid.SampledFrom([]TieRule{{}, {}, {Kind: TieByOrder}, {Kind: TieByLot, Seed: 5}}).Draw(t, "tie")
	return s
}

// TestMarginsMatchSearch holds the margins to the search they replaced,
// unit by unit, on every method: the same margins, or none alike. The
// search assumed in places that the outcome rises with the change between
// points it probed (beyond refMaxPieces stretches of the Droop quota, or
// beyond refScanFirst changes with bounds), which need not hold; where the
// two differ, counting one change at a time decides, and the margins must
// agree with it.
func TestMarginsMatchSearch(t *testing.T) {
	for _, m := range Methods() {
		t.Run(m.String(), func(t *testing.T) {
			rapid.Check(t, func(t *rapid.T) { checkMarginsMatchSearch(t, genSearchScenario(t, m)) })
		})
	}
}

// failer is what the margin checks need of *testing.T and *rapid.T.
type failer interface {
	Helper()
	Fatalf(format string, args ...any)
}

// checkMarginsMatchSearch holds the margins of s to the search, unit by
// unit (see TestMarginsMatchSearch).
func checkMarginsMatchSearch(t failer, s *Scenario) {
	t.Helper()
	got, err := Allot(s, WithMargins)
	if err != nil {
		return
	}
	pr, err := prepare(s)
	if err != nil {
		t.Fatalf("%v", err)
	}
	o, err := pr.run(false)
	if err != nil {
		t.Fatalf("%v", err)
	}
	want := &Result{Units: make([]UnitResult, len(s.Units))}
	pr.refMargins(o, want)
	pops, places, _ := scaledPops(s)
	for i := range got.Units {
		g, w := got.Units[i], want.Units[i]
		if decPtr(g.Gain) != decPtr(w.Gain) {
			checkByCount(t, s, i, "gain", g.Gain, w.Gain, func(x uint64) bool {
				return (g.Max < 0 || g.Seats < g.Max) && outrightSeats(s, i, pops[i]+x, places) > g.Seats
			})
		}
		if decPtr(g.Lose) != decPtr(w.Lose) {
			checkByCount(t, s, i, "lose", g.Lose, w.Lose, func(x uint64) bool {
				if x > pops[i] {
					return false
				}
				k := outrightSeats(s, i, pops[i]-x, places)
				return k >= 0 && k < g.Seats
			})
		}
	}
}

// checkByCount decides between a margin and the search's, which differ,
// by counting changes one at a time up to the larger of the two (meets
// says whether a change does what the margin is for). Past countLimit
// changes it checks the margin's own change and the one before, the
// search's, and a thousand changes spread below the margin.
func checkByCount(t failer, s *Scenario, i int, what string, got, search *Decimal, meets func(x uint64) bool) {
	t.Helper()
	_, places, _ := scaledPops(s)
	scaled := func(d *Decimal) uint64 {
		if d == nil {
			return 0
		}
		return d.Coef * pow10(int(places-d.Places))
	}
	g, w := scaled(got), scaled(search)
	fail := func(why string) {
		t.Fatalf("unit %d %s margin %s, search %s: %s", i, what, decPtr(got), decPtr(search), why)
	}
	if limit := max(g, w); limit <= countLimit {
		for x := uint64(1); x <= limit; x++ {
			if meets(x) {
				if got == nil || x != g {
					fail("counting finds " + strconv.FormatUint(x, 10))
				}
				return
			}
		}
		if got != nil {
			fail("counting finds none")
		}
		return
	}
	if got != nil && (!meets(g) || (g > 1 && meets(g-1))) {
		fail("its own change does not hold")
	}
	if search != nil && (got == nil || w < g) && meets(w) {
		fail("the search's change holds")
	}
	if got != nil {
		for k := uint64(1); k < 1000 && g > 1; k++ {
			if x := g * k / 1000; x >= 1 && meets(x) {
				fail("change " + strconv.FormatUint(x, 10) + " holds")
			}
		}
	}
}

// countLimit is the most changes checkByCount counts one at a time.
const countLimit = 200_000

// withPop returns a copy of the problem with unit i's population set to p,
// ties left open and eligibility recomputed, or nil if that is infeasible.
func (pr *problem) withPop(i int, p uint64) *problem {
	q := *pr
	q.pops = append([]uint64(nil), pr.pops...)
	q.pops[i] = p
	q.tie = TieRule{}
	q.quotas = nil
	if !pr.threshold.IsZero() {
		q.eligible = make([]bool, len(q.pops))
		total := sum128(q.pops)
		for j, v := range q.pops {
			q.eligible[j] = !belowShare(v, total, pr.threshold)
		}
	}
	if q.checkFeasible() != nil {
		return nil
	}
	return &q
}

// gainLimit bounds the useful gain of unit i (see gainLimitWith).
func (pr *problem) gainLimit(i int) uint64 { return pr.gainLimitWith(i, sum128(pr.pops)) }
