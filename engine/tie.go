package engine

import (
	"math/rand/v2"
	"sort"
	"strconv"
	"strings"
)

// A TieKind says how a tie at the cut is settled.
type TieKind uint8

const (
	// TieReport reports the tie and leaves the contested seats unassigned.
	TieReport TieKind = iota
	// TieByLot draws the winners by lot from a seeded, reproducible
	// generator: the same seed always draws the same winners.
	TieByLot
	// TieByOrder gives the contested seats to the tied units that come
	// first in the input.
	TieByOrder
)

// A TieRule is the rule chosen for settling ties.
type TieRule struct {
	Kind TieKind
	Seed uint64 // for TieByLot
}

// ParseTieRule reads "none" (report only), "order", or "lot:SEED" where SEED
// is a whole number. "lot" alone uses seed 1.
func ParseTieRule(s string) (TieRule, error) {
	k := strings.ToLower(strings.TrimSpace(s))
	switch {
	case k == "" || k == "none" || k == "report":
		return TieRule{}, nil
	case k == "order" || k == "input-order":
		return TieRule{Kind: TieByOrder}, nil
	case k == "lot":
		return TieRule{Kind: TieByLot, Seed: 1}, nil
	case strings.HasPrefix(k, "lot:"):
		seed, err := strconv.ParseUint(k[4:], 10, 64)
		if err != nil {
			return TieRule{}, scenarioError("tie", "the seed in "+strconv.Quote(s)+" is not a whole number")
		}
		return TieRule{Kind: TieByLot, Seed: seed}, nil
	}
	return TieRule{}, scenarioError("tie", "unknown tie rule "+strconv.Quote(s)+"; use none, order or lot:SEED")
}

// String returns the rule in the form ParseTieRule reads.
func (t TieRule) String() string {
	switch t.Kind {
	case TieByLot:
		return "lot:" + strconv.FormatUint(t.Seed, 10)
	case TieByOrder:
		return "order"
	}
	return "none"
}

func (t TieRule) validate() error {
	if t.Kind > TieByOrder {
		return scenarioError("tie", "unknown tie rule")
	}
	return nil
}

// A Tie is a set of units with exactly equal claims on the last seats.
type Tie struct {
	Units []int    // indexes of the tied units, in input order
	Names []string // their names
	Seats int      // how many seats they contest
	// Value is the equal priority value (divisor methods) or remainder
	// (largest-remainder methods) at which they tie.
	Value Value
	// Winners are the units given the contested seats by the tie rule;
	// empty when the seats were left unassigned.
	Winners []int
	Rule    string // the rule that settled it, or "none"
}

// settle picks k winners from the candidates (indexes in input order).
func (t TieRule) settle(cands []int, k int) []int {
	c := append([]int(nil), cands...)
	sort.Ints(c)
	switch t.Kind {
	case TieByOrder:
		return c[:k]
	case TieByLot:
		r := rand.New(rand.NewPCG(t.Seed, 0x5ea75a1d))
		r.Shuffle(len(c), func(i, j int) { c[i], c[j] = c[j], c[i] })
		w := c[:k]
		sort.Ints(w)
		return w
	}
	return nil
}
