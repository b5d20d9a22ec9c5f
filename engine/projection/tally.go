package projection

import "seatsmith/engine"

// tally counts what the draws gave. Every member is a whole count, so
// tallies made by different workers add up to the same totals in any order.
type tally struct {
	apportioned, failed, tied, unassigned int64

	lo   []int     // the least seat count in hist, per unit
	hist [][]int64 // hist[u][k]: draws in which unit u held lo[u]+k seats

	gain, lose     []int64 // draws above and below the baseline seats
	last, next     []int64 // draws holding the last seat, taking the next one
	inLast, inNext []int64 // draws holding one of the last seats, taking one of the next
	inTie          []int64 // draws in which the unit is in a tie
}

func newTally(n int) *tally {
	return &tally{
		lo: make([]int, n), hist: make([][]int64, n),
		gain: make([]int64, n), lose: make([]int64, n),
		last: make([]int64, n), next: make([]int64, n),
		inLast: make([]int64, n), inNext: make([]int64, n),
		inTie: make([]int64, n),
	}
}

// count adds c draws in which unit u held s seats.
func (t *tally) count(u, s int, c int64) {
	h := t.hist[u]
	switch {
	case len(h) == 0:
		t.lo[u] = s
		h = append(h, 0)
	case s < t.lo[u]:
		grown := make([]int64, len(h)+t.lo[u]-s)
		copy(grown[t.lo[u]-s:], h)
		h, t.lo[u] = grown, s
	case s >= t.lo[u]+len(h):
		h = append(h, make([]int64, s-t.lo[u]-len(h)+1)...)
	}
	h[s-t.lo[u]] += c
	t.hist[u] = h
}

// add records one apportioned draw.
func (t *tally) add(r *engine.WarmResult, base []int) {
	t.apportioned++
	for u, s := range r.Seats {
		t.count(u, s, 1)
		if s > base[u] {
			t.gain[u]++
		} else if s < base[u] {
			t.lose[u]++
		}
	}
	if len(r.Tied) > 0 {
		t.tied++
		for _, u := range r.Tied {
			t.inTie[u]++
		}
	}
	if r.Unassigned > 0 {
		t.unassigned++
	}
	mark := func(list []int, first, in []int64) {
		if len(list) == 0 {
			return
		}
		first[list[0]]++
		for k, u := range list {
			seen := false
			for _, v := range list[:k] {
				if v == u {
					seen = true
					break
				}
			}
			if !seen {
				in[u]++
			}
		}
	}
	mark(r.Last, t.last, t.inLast)
	mark(r.Next, t.next, t.inNext)
}

// merge adds the counts of o.
func (t *tally) merge(o *tally) {
	t.apportioned += o.apportioned
	t.failed += o.failed
	t.tied += o.tied
	t.unassigned += o.unassigned
	for u := range t.hist {
		for k, c := range o.hist[u] {
			if c != 0 {
				t.count(u, o.lo[u]+k, c)
			}
		}
		t.gain[u] += o.gain[u]
		t.lose[u] += o.lose[u]
		t.last[u] += o.last[u]
		t.next[u] += o.next[u]
		t.inLast[u] += o.inLast[u]
		t.inNext[u] += o.inNext[u]
		t.inTie[u] += o.inTie[u]
	}
}
