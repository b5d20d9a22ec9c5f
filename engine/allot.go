package engine

import (
	"math"
	"math/big"
	"strconv"
	"strings"
)

// Allot apportions the scenario's seats and explains the result. detail
// chooses the costlier parts of the explanation: the seat order and the
// margins. Allot returns an *[Error] for a scenario that is invalid or
// cannot be apportioned (bounds that cannot be met, too few seats for
// Adams, Dean or Huntington–Hill). [Prepare] splits it in two steps, for
// callers that drop the scenario's units before apportioning.
func Allot(s *Scenario, detail Detail) (*Result, error) {
	pr, err := prepare(s)
	if err != nil {
		return nil, err
	}
	return pr.allot(detail)
}

// outcome is what both families of procedures produce.
type outcome struct {
	seats []int // after the tie rule
	full  []int // as the procedure handed them out
	tie   *Tie
	div   *divisorOutcome
	lr    *lrOutcome
}

func (pr *problem) run(keepOrder bool) (*outcome, error) {
	if pr.m.IsDivisor() {
		d, err := pr.divisorSeats(keepOrder)
		if err != nil {
			return nil, err
		}
		return &outcome{seats: d.seats, full: d.full, tie: d.tie, div: d}, nil
	}
	l, err := pr.remainderCut()
	if err != nil {
		return nil, err
	}
	return &outcome{seats: l.seats, full: l.full, tie: l.tie, lr: l}, nil
}

func (pr *problem) allot(detail Detail) (*Result, error) {
	o, err := pr.run(detail&WithOrder != 0)
	if err != nil {
		return nil, err
	}
	res := &Result{Method: pr.m, Seats: pr.h, Tie: pr.tie}
	sum := 0
	for _, a := range o.seats {
		sum += a
	}
	res.Unassigned = pr.h - sum
	if o.div != nil && detail != SeatsOnly {
		// The divisor range, the seat order and the next seats first: what
		// they use of their own (a copy of the seats and a heap over the
		// units, the awards in order) is garbage by the time the units'
		// results take their room, the largest part of the result.
		pr.explainDivisorRange(o, res, detail)
	}
	n := pr.n()
	res.Units = make([]UnitResult, n)
	total := pr.eligibleTotal()
	res.Total = scaledText(total, pr.places)
	var dens lastText
	sl := new(slabs)
	exact := detail != SeatsOnly
	quotas := pr.quotas.of(pr, total, exact, sl)
	for i := range res.Units {
		u := &res.Units[i]
		u.Name = pr.names[i]
		u.Population = Decimal{Coef: pr.pops[i], Places: uint8(pr.places)}.trim()
		u.Seats = o.seats[i]
		u.Min, u.Max = pr.min[i], pr.max[i]
		if u.Max == noCap {
			u.Max = -1
		}
		u.Excluded = !pr.eligible[i]
		var qp quotaPart
		if quotas != nil {
			qp = quotas[i]
		} else {
			qp = pr.quota(i, total, &dens, &sl.text, exact)
		}
		u.Quota, u.Lower, u.Upper = qp.q, qp.lower, qp.upper
		if pr.eligible[i] {
			u.MeetsQuota = u.Seats == u.Lower || u.Seats == u.Upper
		} else {
			u.MeetsQuota = u.Seats == 0
		}
	}
	if o.lr != nil {
		res.Ties = append(res.Ties, o.lr.early...)
	}
	if o.tie != nil {
		res.Ties = append(res.Ties, *o.tie)
	}
	for _, t := range res.Ties {
		for _, j := range t.Units {
			res.Units[j].Tied = true
		}
	}
	switch {
	case detail == SeatsOnly:
		if o.lr != nil {
			pr.boundsHeld(o.lr, res)
		}
	case o.div != nil:
		pr.explainDivisor(o, res, sl)
	default:
		pr.explainRemainder(o.lr, res, sl)
	}
	if detail&WithMargins != 0 {
		pr.margins(o, res)
	}
	return res, nil
}

// eligibleTotal is the population of the units not excluded.
func (pr *problem) eligibleTotal() u128 {
	var t u128
	for i, p := range pr.pops {
		if pr.eligible[i] {
			t, _ = t.add64(p)
		}
	}
	return t
}

func scaledText(x u128, places int) string {
	if x.hi == 0 {
		return formatScaled(x.lo, places)
	}
	r := new(big.Rat).SetFrac(x.big(), bigU(pow10(places)))
	return decimalText(r)
}

// lastText writes whole numbers, reusing the last text for the same
// number: most quotas share one denominator, the total over a small common
// factor, and a million units need not keep a million copies of it.
type lastText struct {
	n    uint64
	text string
}

func (c *lastText) of(n uint64, t *textSlab) string {
	if c.text == "" || c.n != n {
		c.n, c.text = n, t.uint(n)
	}
	return c.text
}

// slabs hold the many small parts of a result in shared blocks: a million
// units' quotas and priority values are a few hundred blocks, not millions
// of small objects each rounded up to its size class.
type slabs struct {
	text textSlab
	val  valueSlab
}

// A textSlab writes short texts end to end into shared blocks, each text
// a substring of its block. The nil *textSlab gives every text a string of
// its own.
type textSlab struct {
	b    strings.Builder
	size int // of the current block
}

// Blocks grow from textSlabMin to textSlabMax bytes; a text longer than
// textSlabLong gets its own string.
const (
	textSlabMin  = 256
	textSlabMax  = 64 << 10
	textSlabLong = 64
)

// add returns p as a string.
func (t *textSlab) add(p []byte) string {
	if t == nil || len(p) > textSlabLong {
		return string(p)
	}
	if t.b.Cap()-t.b.Len() < len(p) {
		t.size = min(max(2*t.size, textSlabMin), textSlabMax)
		// A new block: the strings already returned keep the old one.
		t.b = strings.Builder{}
		t.b.Grow(t.size)
	}
	k := t.b.Len()
	t.b.Write(p)
	// The block never moves once grown, and bytes written are never
	// changed, so the substring stays valid as the block fills.
	return t.b.String()[k:]
}

// uint writes n in decimal.
func (t *textSlab) uint(n uint64) string {
	var buf [20]byte
	return t.add(strconv.AppendUint(buf[:0], n, 10))
}

// A valueSlab hands out Values from shared blocks of valueSlabMin up to
// valueSlabMax Values.
type valueSlab struct {
	block []Value
	used  int
}

const (
	valueSlabMin = 8
	valueSlabMax = 2048
)

// put stores v and returns a pointer to its copy.
func (s *valueSlab) put(v Value) *Value {
	if s.used == len(s.block) {
		s.block = make([]Value, min(max(2*len(s.block), valueSlabMin), valueSlabMax))
		s.used = 0
	}
	p := &s.block[s.used]
	s.used++
	*p = v
	return p
}

// A quotaPart is what a unit's result shows of its standard quota p·H/P,
// the same under every method.
type quotaPart struct {
	q            Fraction
	lower, upper int
}

// A quotaMemo keeps the units' quota parts for a problem apportioned by
// several methods in turn (AllotMethods), so that they are worked out once.
// The nil *quotaMemo keeps nothing.
type quotaMemo struct {
	parts []quotaPart
	exact bool // the parts have the fraction in lowest terms
	// What they are for: a copy of the problem with other populations or
	// another house size (a margin's probe, say) works its own out.
	pops     *uint64
	eligible *bool
	h        int
}

// of returns the units' quota parts, worked out on first use (and again
// when exact is asked for the first time); nil when m is nil or was made
// for other populations, eligibility or house size.
func (m *quotaMemo) of(pr *problem, total u128, exact bool, sl *slabs) []quotaPart {
	if m == nil || pr.n() == 0 {
		return nil
	}
	if m.parts == nil {
		m.pops, m.eligible, m.h = &pr.pops[0], &pr.eligible[0], pr.h
	} else if m.pops != &pr.pops[0] || m.eligible != &pr.eligible[0] || m.h != pr.h {
		return nil
	}
	if m.parts == nil || (exact && !m.exact) {
		var dens lastText
		m.parts = make([]quotaPart, pr.n())
		for i := range m.parts {
			m.parts[i] = pr.quota(i, total, &dens, &sl.text, exact)
		}
		m.exact = exact
	}
	return m.parts
}

// quota works out the standard quota p·H/P of unit i, in integer
// arithmetic when the total fits in 64 bits; without exact it may leave out
// the fraction in lowest terms (Num and Den). Short texts are written into
// t.
func (pr *problem) quota(i int, total u128, dens *lastText, t *textSlab, exact bool) quotaPart {
	if !pr.eligible[i] {
		return quotaPart{q: Fraction{Num: "0", Den: "1", Text: "0"}}
	}
	num := mul128(pr.pops[i], uint64(pr.h))
	var q, rem uint64
	if total.hi == 0 {
		q, rem, _ = divmod128(num, total.lo)
	} else {
		qq, rr := new(big.Int).QuoRem(num.big(), total.big(), new(big.Int))
		q, rem = qq.Uint64(), uint64(rr.Sign())
	}
	qp := quotaPart{lower: int(q), upper: int(q)}
	if rem != 0 {
		qp.upper++
	}
	if total.hi == 0 && !forceBig {
		qp.q.Text = quotaTextIn(t, q, rem, total.lo)
		qp.q.Approx = ratFloat(num, total.lo)
		if !exact {
			return qp // SeatsOnly: the fraction in lowest terms is not shown
		}
		// gcd(num, total) = gcd(num mod total, total).
		g := gcd64(rem, total.lo)
		n, _ := num.div64(g)
		if n.hi == 0 {
			qp.q.Num = t.uint(n.lo)
		} else {
			qp.q.Num = n.text()
		}
		qp.q.Den = dens.of(total.lo/g, t)
		return qp
	}
	r := new(big.Rat).SetFrac(num.big(), total.big())
	qp.q.Approx, _ = r.Float64()
	qp.q.Num, qp.q.Den = r.Num().String(), r.Denom().String()
	if s, ok := exactDecimal(r, 6); ok {
		qp.q.Text = s
	} else {
		qp.q.Text = r.FloatString(6)
	}
	return qp
}

// quotaTextIn writes q + rem/den with six decimal places, rounded half up,
// or fewer when that is exact, into t (nil: a string of its own).
func quotaTextIn(t *textSlab, q, rem, den uint64) string {
	var digits [6]byte
	n := 0
	if rem <= math.MaxUint64/1_000_000 {
		// The six digits at once, in one 64-bit division: far quicker
		// than six 128-bit ones where those are done in software, as in
		// WebAssembly.
		x := rem * 1_000_000
		d := x / den
		rem = x % den
		for k := 5; k >= 0; k-- {
			digits[k] = byte(d % 10)
			d /= 10
		}
		n = 6
		if rem == 0 {
			for n > 0 && digits[n-1] == 0 {
				n--
			}
		}
	} else {
		for ; n < 6 && rem != 0; n++ {
			d, r, _ := divmod128(mul128(rem, 10), den)
			digits[n] = byte(d)
			rem = r
		}
	}
	if rem != 0 && mul128(rem, 2).cmp(u128{0, den}) >= 0 {
		// Round up, carrying through the digits into the whole part.
		k := n - 1
		for ; k >= 0; k-- {
			if digits[k] < 9 {
				digits[k]++
				break
			}
			digits[k] = 0
		}
		if k < 0 {
			q++
		}
	}
	var buf [32]byte
	b := strconv.AppendUint(buf[:0], q, 10)
	if n > 0 {
		b = append(b, '.')
		for i := 0; i < n; i++ {
			b = append(b, '0'+digits[i])
		}
	}
	return t.add(b)
}

// explainDivisorRange adds the divisor range, the seat order and the
// seats beyond the house size; res.Unassigned must be set.
func (pr *problem) explainDivisorRange(o *outcome, res *Result, detail Detail) {
	d := o.div
	res.Divisor = pr.divisorRange(d.full)
	if o.tie != nil && pr.tie.Kind != TieReport {
		// The settled result has its own (single-point) range.
		res.Divisor = pr.divisorRange(o.seats)
	}
	first := pr.h - d.free // seats given as minimums
	if detail&WithOrder != 0 {
		order := d.order
		if d.tail != nil {
			// Replace the tied seats at the end by the rule's winners, or
			// drop them when the tie stays open.
			order = order[:len(order)-len(d.tail)]
			if o.tie.Winners != nil {
				for _, w := range o.tie.Winners {
					order = append(order, award{w, prio{pr.pops[w], o.seats[w] - 1}})
				}
			}
		}
		res.Order = make([]SeatAward, len(order))
		for k, w := range order {
			res.Order[k] = pr.seatAward(first+k+1, w)
		}
		d.order = nil // shown now in res.Order
	}
	res.Beyond = pr.beyond(o.seats, pr.h-res.Unassigned, 5)
}

// explainDivisor adds each unit's priority values and whether a bound
// holds it.
func (pr *problem) explainDivisor(o *outcome, res *Result, sl *slabs) {
	low, lowOK, high, highOK := pr.divisorBounds(o.seats)
	for i := range res.Units {
		u := &res.Units[i]
		a := o.seats[i]
		if !pr.eligible[i] || pr.pops[i] == 0 {
			continue
		}
		if a > pr.min[i] {
			u.Last = sl.val.put(pr.m.valueIn(&sl.text, prio{pr.pops[i], a - 1}, pr.places))
		}
		if a < pr.max[i] {
			u.Next = sl.val.put(pr.m.valueIn(&sl.text, prio{pr.pops[i], a}, pr.places))
		}
		// Held up by the minimum: its min-th seat ranks at or below every
		// divisor in range. Held down by the cap: its next seat ranks at or
		// above every divisor in range.
		u.AtMin = a == pr.min[i] && a > 0 && lowOK && pr.m.cmpPrio(prio{pr.pops[i], a - 1}, low) <= 0
		u.AtMax = a == pr.max[i] && highOK && pr.m.cmpPrio(prio{pr.pops[i], a}, high) >= 0
	}
}

func (pr *problem) seatAward(seat int, w award) SeatAward {
	return SeatAward{Seat: seat, Unit: w.u, Name: pr.names[w.u], Nth: w.pr.a + 1, Priority: pr.m.value(w.pr, pr.places)}
}

// beyond lists the next k seats the procedure would hand out after the
// given seats.
func (pr *problem) beyond(seats []int, filled, k int) []SeatAward {
	next, _ := pr.bestSeats(seats, false, k, nil, nil)
	var out []SeatAward
	for j, s := range next {
		out = append(out, pr.seatAward(filled+j+1, award{s.u, prio{pr.pops[s.u], s.k}}))
	}
	return out
}

// boundsHeld records the largest-remainder passes and the units they fixed
// at a bound.
func (pr *problem) boundsHeld(l *lrOutcome, res *Result) {
	res.Passes = l.rounds
	for i, p := range l.pinned {
		res.Units[i].AtMin = p < 0
		res.Units[i].AtMax = p > 0
	}
}

// explainRemainder adds the quota, remainders and ranks.
func (pr *problem) explainRemainder(l *lrOutcome, res *Result, sl *slabs) {
	r := l.final
	if r != nil {
		r.rankAll() // the explanation shows every remainder's rank
	}
	pr.boundsHeld(l, res)
	l.pinned = nil // shown now in res.Units
	if r == nil {
		return
	}
	if r.quota != nil {
		q := ratValue(r.quota)
		res.Quota = &q
	}
	// In rank order: the k-th of r.ranked has rank k+1.
	for k, j := range r.ranked {
		ur := &res.Units[r.units[j]]
		ur.Remainder = sl.val.put(pr.remainderValue(r, j, &sl.text))
		ur.RemainderRank = k + 1
		ur.RemainderSeat = k+1 <= r.extra
	}
}

// remainderValue is r.remValue(pr, j) in integer arithmetic where the
// denominator fits in 64 bits: a fraction of a seat for Hamilton, people
// for Droop. Its text is written into t.
func (pr *problem) remainderValue(r *lrRound, j int, t *textSlab) Value {
	den := pow10(pr.places)
	if pr.m == Hamilton {
		den = r.total.lo
		if r.total.hi != 0 || den == 0 {
			return r.remValue(pr, j)
		}
	}
	if forceBig {
		return r.remValue(pr, j)
	}
	if v, ok := fracValueIn(t, r.rem(j), den); ok {
		return v
	}
	return r.remValue(pr, j)
}
