package election

import (
	"math/big"

	"seatsmith/engine"
)

// Why a party qualifies (or not) for seats over the whole election.
const (
	QualifiedNoThreshold = "no threshold"
	QualifiedThreshold   = "threshold"
	QualifiedWins        = "district seats"
	QualifiedExempt      = "exempt"
	NotQualified         = "below threshold"
	NotQualifiedList     = "no list"
)

// reaches reports whether part/whole reaches the share t: part·10^k ≥ c·whole
// for t = c·10^-k, exactly. A whole of zero is reached by nothing.
func reaches(part, whole *big.Int, t engine.Decimal) bool {
	if whole.Sign() == 0 {
		return false
	}
	l := new(big.Int).Mul(part, new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(t.Places)), nil))
	r := new(big.Int).Mul(new(big.Int).SetUint64(t.Coef), whole)
	return l.Cmp(r) >= 0
}

// qualify decides which parties qualify for seats over the whole election
// and why. wins is each party's district seats, for the alternative by
// district seats won (nil when it does not apply).
func (p *prepared) qualify(wins []int) (ok []bool, why []string) {
	s := p.s
	n := len(p.parties)
	ok = make([]bool, n)
	why = make([]string, n)
	var lists, valid *big.Int
	national := false
	for _, t := range s.Thresholds {
		if t.Scope != InDistrict {
			national = true
		}
	}
	if national {
		lists = new(big.Int)
		var x big.Int
		for j := range p.parties {
			lists.Add(lists, p.partyTotal(j))
		}
		valid = new(big.Int).Set(lists)
		for _, o := range p.other {
			valid.Add(valid, x.SetUint64(o))
		}
		valid.Add(valid, x.SetUint64(p.otherNat))
	}
	for j, q := range p.parties {
		switch {
		case q.independent:
			why[j] = NotQualifiedList
			continue
		case q.exempt:
			ok[j], why[j] = true, QualifiedExempt
			continue
		case !national:
			// With no vote threshold over the election, an alternative to
			// it has nothing to be an alternative to.
			ok[j], why[j] = true, QualifiedNoThreshold
			continue
		}
		total := p.partyTotal(j)
		for _, t := range s.Thresholds {
			switch t.Scope {
			case Election:
				base := lists
				if t.Base == Valid {
					base = valid
				}
				ok[j] = reaches(total, base, t.Share)
			case AnyDistrict:
				for i := range p.v {
					if p.districtReaches(i, j, t) {
						ok[j] = true
						break
					}
				}
			}
			if ok[j] {
				why[j] = QualifiedThreshold
				break
			}
		}
		if !ok[j] && s.WinsThreshold > 0 && wins != nil && wins[j] >= s.WinsThreshold {
			ok[j], why[j] = true, QualifiedWins
		}
		if !ok[j] {
			why[j] = NotQualified
		}
	}
	return ok, why
}

// districtReaches reports whether party j reaches threshold t in district
// i.
func (p *prepared) districtReaches(i, j int, t Threshold) bool {
	var part, whole, x big.Int
	part.SetUint64(p.v[i][j])
	for _, v := range p.v[i] {
		whole.Add(&whole, x.SetUint64(v))
	}
	if t.Base == Valid {
		whole.Add(&whole, x.SetUint64(p.other[i]))
	}
	return reaches(&part, &whole, t.Share)
}

// inDistrict reports whether party j may take seats in district i under
// the thresholds of scope InDistrict (exempt parties always may).
func (p *prepared) inDistrict(i, j int) bool {
	if p.parties[j].exempt {
		return true
	}
	for _, t := range p.s.Thresholds {
		if t.Scope == InDistrict && !p.districtReaches(i, j, t) {
			return false
		}
	}
	return true
}
