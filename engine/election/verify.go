package election

import (
	"math/big"
	"strconv"
	"strings"
)

// parseDivisor reads a divisor as written in a result: a decimal, a
// fraction n/d, or sqrt(n/d). It returns its value, squared when sq (the
// form Huntington–Hill's comparisons take).
func parseDivisor(text string, sq bool) (*big.Rat, bool) {
	t := strings.TrimSpace(text)
	root := false
	if strings.HasPrefix(t, "sqrt(") && strings.HasSuffix(t, ")") {
		t, root = t[5:len(t)-1], true
	}
	r, ok := new(big.Rat).SetString(t)
	if !ok || r.Sign() <= 0 {
		return nil, false
	}
	switch {
	case root && sq:
		return r, true
	case root:
		return nil, false
	case sq:
		r.Mul(r, r)
	}
	return r, true
}

// shiftDivisor divides a divisor's text by 10^places (sq: the value is a
// square root, whose square is divided by 10^(2·places)).
func shiftDivisor(text string, places uint8) string {
	if text == "" || places == 0 {
		return text
	}
	if !strings.ContainsAny(text, "/(") {
		r, _ := new(big.Rat).SetString(text)
		r.Quo(r, new(big.Rat).SetInt(new(big.Int).Exp(big.NewInt(10), big.NewInt(int64(places)), nil)))
		return ratText(r, false)
	}
	root := strings.HasPrefix(text, "sqrt(")
	t := strings.TrimSuffix(strings.TrimPrefix(text, "sqrt("), ")")
	r, _ := new(big.Rat).SetString(t)
	k := int64(places)
	if root {
		k *= 2
	}
	r.Quo(r, new(big.Rat).SetInt(new(big.Int).Exp(big.NewInt(10), big.NewInt(k), nil)))
	return ratText(r, root)
}

// Verify checks a biproportional result's certificate exactly, from the
// divisors as written: every cell's votes divided by its district's and its
// party's divisor must round to the cell's seats at the method's signposts,
// strictly so unless the cell is tied; every district and party must add up
// to its seats (when no tie left seats unassigned). It returns nil when the
// certificate holds, and an *Error naming the first cell that breaks it.
func Verify(res *Result) error {
	if res.System != Biproportional || res.Pending != "" {
		return nil
	}
	rd := roundingOf(res.Method)
	d := make([]*big.Rat, len(res.Districts))
	e := make([]*big.Rat, len(res.Parties))
	for i, dr := range res.Districts {
		if dr.Divisor == "" {
			continue
		}
		v, ok := parseDivisor(dr.Divisor, rd.sq)
		if !ok {
			return districtErr(i, "divisor", strconv.Quote(dr.Name)+": "+strconv.Quote(dr.Divisor)+" is not a divisor")
		}
		d[i] = v
	}
	for j, pr := range res.Parties {
		if pr.Divisor == "" {
			continue
		}
		v, ok := parseDivisor(pr.Divisor, rd.sq)
		if !ok {
			return partyErr(j, "divisor", strconv.Quote(pr.Name)+": "+strconv.Quote(pr.Divisor)+" is not a divisor")
		}
		e[j] = v
	}
	rows := make([]int, len(res.Districts))
	cols := make([]int, len(res.Parties))
	strictAll := res.Certificate != nil && res.Certificate.Strict
	var w, scale, lhs, rhs, l, r, t big.Int
	ten := big.NewInt(10)
	for _, c := range res.Cells {
		rows[c.District] += c.Seats
		cols[c.Party] += c.Seats
		bad := func(msg string) error {
			return &Error{Part: "votes", Index: c.Row, Field: "seats", Msg: strconv.Quote(res.Parties[c.Party].Name) + " in " + strconv.Quote(res.Districts[c.District].Name) + ": " + msg}
		}
		if c.Excluded || c.Votes.IsZero() {
			if c.Seats != 0 {
				return bad(strconv.Itoa(c.Seats) + " seats without eligible votes")
			}
			continue
		}
		if d[c.District] == nil || e[c.Party] == nil {
			if c.Seats != 0 {
				return bad("seats without a divisor")
			}
			continue
		}
		// q = w / (d·e) with w = coef/10^places (squared for
		// Huntington–Hill); q against s(a) = sn/sd compares
		// coef·sd·den(d)·den(e) with sn·num(d)·num(e)·10^places.
		w.SetUint64(c.Votes.Coef)
		scale.Exp(ten, scale.SetInt64(int64(c.Votes.Places)), nil)
		if rd.sq {
			w.Mul(&w, &w)
			scale.Mul(&scale, &scale)
		}
		lhs.Mul(&w, d[c.District].Denom())
		lhs.Mul(&lhs, e[c.Party].Denom())
		rhs.Mul(d[c.District].Num(), e[c.Party].Num())
		rhs.Mul(&rhs, &scale)
		cmpSign := func(a int) (int, bool) {
			sn, sd := rd.sign(a)
			l.Mul(&lhs, t.SetUint64(sd))
			r.Mul(&rhs, t.SetUint64(sn))
			return l.Cmp(&r), sn == 0
		}
		x := c.Seats
		strict := strictAll || !c.Tied
		if x > 0 {
			cmp, zero := cmpSign(x - 1)
			if cmp < 0 || (cmp == 0 && strict && !zero) {
				return bad("the quotient does not round to " + strconv.Itoa(x) + " seats")
			}
		}
		if cmp, _ := cmpSign(x); cmp > 0 || (cmp == 0 && strict) {
			return bad("the quotient does not round to " + strconv.Itoa(x) + " seats")
		}
	}
	if res.Unassigned == 0 {
		for i, dr := range res.Districts {
			if rows[i] != dr.Seats {
				return districtErr(i, "seats", strconv.Quote(dr.Name)+": the cells hold "+strconv.Itoa(rows[i])+" seats, not "+strconv.Itoa(dr.Seats))
			}
		}
		for j, pr := range res.Parties {
			if pr.Qualified && cols[j] != pr.Seats {
				return partyErr(j, "seats", strconv.Quote(pr.Name)+": the cells hold "+strconv.Itoa(cols[j])+" seats, not "+strconv.Itoa(pr.Seats))
			}
		}
	}
	return nil
}
