package report

import (
	"bytes"
	"io"

	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
)

// Version is the version of the documents this package builds.
const Version = 1

// Allotment builds the allotment document for res.
func Allotment(title string, res *engine.Result) *jsondoc.Value {
	units := jsondoc.NewArray()
	for i := range res.Units {
		units.Append(unitDoc(&res.Units[i], res.Method))
	}
	return allotment(title, res, units)
}

// WriteAllotJSON writes the allotment document of res as indented JSON,
// byte for byte what jsondoc.MarshalIndent(Allotment(title, res), "  ")
// gives, but making the units' objects one at a time as they are written.
// skipped names the parts of the explanation that were not computed
// ("margins", "order"); when there are any, the document ends with a
// skipped member listing them.
func WriteAllotJSON(w io.Writer, title string, res *engine.Result, skipped []string) error {
	b, own := buffered(w)
	v := allotment(title, res, jsondoc.NewArray())
	if len(skipped) > 0 {
		arr := jsondoc.NewArray()
		for _, s := range skipped {
			arr.Append(jsondoc.Str(s))
		}
		v.Set("skipped", arr)
	}
	doc := jsondoc.MarshalIndent(v, "  ")
	const mark = "\n  \"units\": []"
	k := bytes.Index(doc, []byte(mark))
	if k < 0 || len(res.Units) == 0 {
		b.Write(doc)
		return finish(b, own)
	}
	b.Write(doc[:k+len(mark)-1])
	var one []byte
	for i := range res.Units {
		if i > 0 {
			b.WriteByte(',')
		}
		b.WriteString("\n    ")
		// Each unit is an object without nested values on their own lines
		// but its members; indent those by two levels.
		one = append(one[:0], jsondoc.MarshalIndent(unitDoc(&res.Units[i], res.Method), "  ")...)
		one = one[:len(one)-1] // the final line feed
		for len(one) > 0 {
			j := bytes.IndexByte(one, '\n')
			if j < 0 {
				b.Write(one)
				break
			}
			b.Write(one[:j+1])
			b.WriteString("    ")
			one = one[j+1:]
		}
	}
	b.WriteString("\n  ]")
	b.Write(doc[k+len(mark):])
	return finish(b, own)
}

func allotment(title string, res *engine.Result, units *jsondoc.Value) *jsondoc.Value {
	v := header("allotment", title)
	v.Set("method", jsondoc.Str(res.Method.String()))
	v.Set("method_name", jsondoc.Str(res.Method.Name()))
	v.Set("seats", jsondoc.Int(res.Seats))
	v.Set("total", jsondoc.Str(res.Total))
	v.Set("tie_rule", jsondoc.Str(res.Tie.String()))
	v.Set("unassigned", jsondoc.Int(res.Unassigned))
	v.Set("units", units)
	v.Set("ties", Ties(res))
	if d := res.Divisor; d != nil {
		dv := jsondoc.NewObject().Set("low", valueDoc(&d.Low)).Set("high", valueDoc(&d.High))
		dv.Set("single", jsondoc.Boolean(d.Single))
		if d.Certificate != "" {
			dv.Set("certificate", jsondoc.Str(d.Certificate))
		} else {
			dv.Set("certificate", nil)
		}
		v.Set("divisor", dv)
	} else {
		v.Set("divisor", nil)
	}
	v.Set("order", awardsDoc(res.Order))
	v.Set("beyond", awardsDoc(res.Beyond))
	if res.Quota != nil {
		v.Set("quota", jsondoc.Str(res.Quota.Text))
		v.Set("passes", jsondoc.Int(res.Passes))
	} else {
		v.Set("quota", nil)
		v.Set("passes", nil)
	}
	return v
}

func header(kind, title string) *jsondoc.Value {
	v := jsondoc.NewObject().Set("version", jsondoc.Int(Version)).Set("kind", jsondoc.Str(kind))
	v.Set("caution", jsondoc.Str(Caution))
	if title != "" {
		v.Set("title", jsondoc.Str(title))
	}
	return v
}

func unitDoc(u *engine.UnitResult, m engine.Method) *jsondoc.Value {
	x := jsondoc.NewObject()
	x.Set("name", jsondoc.Str(u.Name))
	x.Set("population", jsondoc.Str(u.Population.String()))
	x.Set("seats", jsondoc.Int(u.Seats))
	x.Set("quota", jsondoc.Str(u.Quota.Text))
	x.Set("quota_exact", jsondoc.Str(u.Quota.Num+"/"+u.Quota.Den))
	x.Set("lower_quota", jsondoc.Int(u.Lower))
	x.Set("upper_quota", jsondoc.Int(u.Upper))
	x.Set("meets_quota", jsondoc.Boolean(u.MeetsQuota))
	x.Set("min", jsondoc.Int(u.Min))
	if u.Max >= 0 {
		x.Set("max", jsondoc.Int(u.Max))
	} else {
		x.Set("max", nil)
	}
	x.Set("excluded", jsondoc.Boolean(u.Excluded))
	x.Set("at_min", jsondoc.Boolean(u.AtMin))
	x.Set("at_max", jsondoc.Boolean(u.AtMax))
	x.Set("tied", jsondoc.Boolean(u.Tied))
	if m.IsDivisor() {
		x.Set("last_priority", valueDoc(u.Last))
		x.Set("next_priority", valueDoc(u.Next))
		x.Set("remainder", nil)
		x.Set("remainder_rank", nil)
		x.Set("remainder_seat", nil)
	} else {
		x.Set("last_priority", nil)
		x.Set("next_priority", nil)
		x.Set("remainder", valueDoc(u.Remainder))
		if u.Remainder != nil {
			x.Set("remainder_rank", jsondoc.Int(u.RemainderRank))
			x.Set("remainder_seat", jsondoc.Boolean(u.RemainderSeat))
		} else {
			x.Set("remainder_rank", nil)
			x.Set("remainder_seat", nil)
		}
	}
	x.Set("gain_margin", marginDoc(u.Gain))
	x.Set("lose_margin", marginDoc(u.Lose))
	return x
}

func marginDoc(d *engine.Decimal) *jsondoc.Value {
	if d == nil {
		return nil
	}
	return jsondoc.Num(d.String())
}

// valueDoc writes a priority value or divisor: its decimal text, "infinite",
// or null when v is nil.
func valueDoc(v *engine.Value) *jsondoc.Value {
	switch {
	case v == nil:
		return nil
	case v.Infinite:
		return jsondoc.Str("infinite")
	}
	return jsondoc.Str(v.Text)
}

func awardsDoc(as []engine.SeatAward) *jsondoc.Value {
	arr := jsondoc.NewArray()
	for i := range as {
		a := &as[i]
		arr.Append(jsondoc.NewObject().Set("seat", jsondoc.Int(a.Seat)).Set("unit", jsondoc.Str(a.Name)).
			Set("nth", jsondoc.Int(a.Nth)).Set("priority", valueDoc(&a.Priority)))
	}
	return arr
}

// Ties builds the ties array of a result.
func Ties(res *engine.Result) *jsondoc.Value {
	arr := jsondoc.NewArray()
	for _, t := range res.Ties {
		names := jsondoc.NewArray()
		for _, n := range t.Names {
			names.Append(jsondoc.Str(n))
		}
		winners := jsondoc.NewArray()
		for _, w := range t.Winners {
			winners.Append(jsondoc.Str(res.Units[w].Name))
		}
		arr.Append(jsondoc.NewObject().Set("units", names).Set("seats", jsondoc.Int(t.Seats)).
			Set("value", valueDoc(&t.Value)).Set("rule", jsondoc.Str(t.Rule)).Set("winners", winners))
	}
	return arr
}
