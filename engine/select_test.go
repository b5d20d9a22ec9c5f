package engine

import (
	"slices"
	"testing"

	"pgregory.net/rapid"
)

// The selection (select.go) must find exactly what sorting finds: the e-th
// largest remainder, the groups above, at and below it in input order, and
// once completed the same ranking as a stable sort.

// genKeys draws remainders: few distinct values (many equal), full 64-bit
// values, or values with high words (the math/big path's remainders).
func genKeys(t *rapid.T) []u128 {
	n := rapid.IntRange(1, 300).Draw(t, "n")
	if rapid.Bool().Draw(t, "many") {
		n = rapid.IntRange(selectSmall, 3*selectSmall).Draw(t, "many n") // the histogram path
	}
	kind := rapid.IntRange(0, 3).Draw(t, "kind")
	keys := make([]u128, n)
	for i := range keys {
		switch kind {
		case 0:
			keys[i] = u128{0, rapid.Uint64Range(0, 5).Draw(t, "small")}
		case 1:
			keys[i] = u128{0, rapid.Uint64().Draw(t, "lo")}
		case 2:
			keys[i] = u128{rapid.Uint64Range(0, 3).Draw(t, "hi"), rapid.Uint64().Draw(t, "lo")}
		default:
			// Sorted runs, which defeat naive pivots.
			keys[i] = u128{0, uint64(i / rapid.IntRange(1, 4).Draw(t, "run"))}
		}
	}
	if kind == 3 && rapid.Bool().Draw(t, "reverse") {
		slices.Reverse(keys)
	}
	return keys
}

// narrowKeys returns the keys as 64-bit values when they all fit.
func narrowKeys(keys []u128) ([]uint64, bool) {
	out := make([]uint64, len(keys))
	for i, k := range keys {
		if k.hi != 0 {
			return nil, false
		}
		out[i] = k.lo
	}
	return out, true
}

func maxKey(keys []u128) u128 {
	var m u128
	for _, k := range keys {
		if k.cmp(m) > 0 {
			m = k
		}
	}
	return m
}

func TestKthLargest(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		keys := genKeys(t)
		e := rapid.IntRange(1, len(keys)).Draw(t, "e")
		sorted := slices.Clone(keys)
		slices.SortFunc(sorted, func(x, y u128) int { return y.cmp(x) })
		want := sorted[e-1]
		gt, eq := 0, 0
		for _, k := range keys {
			switch k.cmp(want) {
			case 1:
				gt++
			case 0:
				eq++
			}
		}
		bound := maxKey(keys)
		if rapid.Bool().Draw(t, "looseBound") {
			bound, _ = bound.add64(rapid.Uint64().Draw(t, "slack"))
		}
		var count *[selectBuckets]int32
		if rapid.Bool().Draw(t, "count") {
			count = new([selectBuckets]int32)
			for _, k := range keys {
				count[k.shr(uint(selectShift(bound))).lo&(selectBuckets-1)]++
			}
		}
		v, g, q := kthLargest(slices.Clone(keys), nil, e, bound, count)
		if v != want || g != gt || q != eq {
			t.Fatalf("kthLargest(%d) = %v (%d above, %d equal), want %v (%d, %d)", e, v, g, q, want, gt, eq)
		}
		if narrow, ok := narrowKeys(keys); ok {
			v, g, q := kthLargest(nil, narrow, e, bound, count)
			if v != want || g != gt || q != eq {
				t.Fatalf("kthLargest(%d) on 64-bit keys = %v (%d above, %d equal), want %v (%d, %d)", e, v, g, q, want, gt, eq)
			}
		}
		if got := quickSelect(slices.Clone(keys), e); got != want {
			t.Fatalf("quickSelect(%d) = %v, want %v", e, got, want)
		}
	})
}

// stableRanking is the ranking by a stable sort: largest remainder first,
// equal remainders in input order.
func stableRanking(rems []u128) []int {
	r := make([]int, len(rems))
	for j := range r {
		r[j] = j
	}
	slices.SortStableFunc(r, func(x, y int) int { return rems[y].cmp(rems[x]) })
	return r
}

// cmpBool orders false before true.
func cmpBool(x, y bool) int {
	switch {
	case x == y:
		return 0
	case y:
		return -1
	}
	return 1
}

func TestCutOrder(t *testing.T) {
	rapid.Check(t, func(t *rapid.T) {
		keys := genKeys(t)
		n := len(keys)
		r := &lrRound{units: make([]int, n), rems: keys, extra: rapid.IntRange(0, n).Draw(t, "extra"), bound: maxKey(keys)}
		if narrow, ok := narrowKeys(keys); ok && rapid.Bool().Draw(t, "narrow") {
			r.rems, r.rem64 = nil, narrow
		}
		r.cutOrder()
		want := stableRanking(keys)
		// The groups hold what the stable ranking holds at their places,
		// in input order.
		for _, g := range [][2]int{{0, r.gt}, {r.gt, r.ge}, {r.ge, n}} {
			got := slices.Clone(r.ranked[g[0]:g[1]])
			if !slices.IsSorted(got) {
				t.Fatalf("group %v not in input order: %v", g, got)
			}
			w := slices.Clone(want[g[0]:g[1]])
			slices.Sort(w)
			if !slices.Equal(got, w) {
				t.Fatalf("group %v holds %v, the stable ranking %v", g, got, w)
			}
		}
		if 0 < r.extra && r.extra < n {
			v := keys[want[r.extra-1]]
			if r.gt >= r.extra || r.ge < r.extra || (r.ge > r.gt && keys[r.ranked[r.gt]] != v) {
				t.Fatalf("cut group [%d,%d) for extra %d", r.gt, r.ge, r.extra)
			}
		}
		k := rapid.IntRange(1, 40).Draw(t, "near")
		near := &lrRound{units: r.units, rems: r.rems, rem64: r.rem64, extra: r.extra, ranked: slices.Clone(r.ranked), gt: r.gt, ge: r.ge}
		near.rankNear(k)
		r.rankAll()
		if !slices.Equal(r.ranked, want) {
			t.Fatalf("rankAll %v, stable ranking %v", r.ranked, want)
		}
		for p := max(r.extra-k, 0); p < min(r.extra+k, n); p++ {
			if near.ranked[p] != want[p] {
				t.Fatalf("rankNear(%d) at %d: %d, stable ranking %d", k, p, near.ranked[p], want[p])
			}
		}
	})
}

// TestRemainderRanks: the ranks Allot reports are the stable ranking of the
// final pass's remainders, with the units tied at the cut in the order the
// bounds and the tie rule give them.
func TestRemainderRanks(t *testing.T) {
	for _, m := range []Method{Hamilton, Droop} {
		t.Run(m.String(), func(t *testing.T) {
			rapid.Check(t, func(t *rapid.T) {
				s := genScenario(t, m, 40, rapid.SampledFrom([]uint64{30, 100_000, MaxCoefficient}).Draw(t, "maxPop"), 300, rapid.Bool().Draw(t, "bounds"))
				pr, err := prepare(s)
				if err != nil {
					return
				}
				o, err := pr.remainderSeats()
				if err != nil || o.final == nil {
					return
				}
				f := o.final
				rems := make([]u128, len(f.units))
				for j := range rems {
					rems[j] = f.rem(j)
				}
				want := stableRanking(rems)
				// A unit without people ranks after every unit with
				// people, its remainder (zero) equal or not.
				slices.SortStableFunc(want, func(x, y int) int {
					return cmpBool(pr.pops[f.units[x]] == 0, pr.pops[f.units[y]] == 0)
				})
				for p := range want {
					if (p < f.gt || p >= f.ge) && f.ranked[p] != want[p] {
						t.Fatalf("rank %d: position %d, stable ranking %d", p+1, f.ranked[p], want[p])
					}
				}
				got := slices.Clone(f.ranked[f.gt:f.ge])
				slices.Sort(got)
				w := slices.Clone(want[f.gt:f.ge])
				slices.Sort(w)
				if !slices.Equal(got, w) {
					t.Fatalf("cut group %v, stable ranking %v", got, w)
				}
				// The cut-only procedure gives the same seats and ties.
				c, err := pr.remainderCut()
				if err != nil || !slices.Equal(c.seats, o.seats) || !slices.Equal(c.full, o.full) || (c.tie == nil) != (o.tie == nil) || len(c.early) != len(o.early) {
					t.Fatalf("cut only: %v %v, ranked: %v", c.seats, err, o.seats)
				}
			})
		})
	}
}

// remainderSeats runs the largest-remainder procedure with bounds and ranks
// every remainder of the final pass, as the explanation shows them.
func (pr *problem) remainderSeats() (*lrOutcome, error) {
	o, err := pr.remainderCut()
	if err == nil && o.final != nil {
		o.final.rankAll()
	}
	return o, err
}
