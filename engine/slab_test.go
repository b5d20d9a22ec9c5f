package engine

import (
	"math/rand/v2"
	"strconv"
	"strings"
	"testing"
)

// Texts written into a slab stay as written while later texts fill the
// block and new blocks start, and match the texts written alone.
func TestTextSlab(t *testing.T) {
	r := rand.New(rand.NewPCG(5, 9))
	var ts textSlab
	var got, want []string
	for i := 0; i < 50_000; i++ {
		var s string
		switch i % 4 {
		case 0:
			s = strconv.FormatUint(r.Uint64()>>r.IntN(64), 10)
		case 1:
			s = strings.Repeat("7", r.IntN(2*textSlabLong)) // some too long for the slab
		case 2:
			s = ""
		default:
			s = "q" + strconv.Itoa(i)
		}
		want = append(want, s)
		got = append(got, ts.add([]byte(s)))
	}
	for i := range want {
		if got[i] != want[i] {
			t.Fatalf("text %d = %q, want %q", i, got[i], want[i])
		}
	}
	if (*textSlab)(nil).add([]byte("12.5")) != "12.5" {
		t.Error("nil slab")
	}
}

// The texts of quotas and priority values are the same in a slab and
// alone.
func TestSlabTexts(t *testing.T) {
	r := rand.New(rand.NewPCG(11, 3))
	ts := new(textSlab)
	for i := 0; i < 20_000; i++ {
		q, den := r.Uint64N(1<<40), r.Uint64N(1<<50)+1
		rem := r.Uint64N(den)
		if a, b := quotaTextIn(ts, q, rem, den), quotaTextIn(nil, q, rem, den); a != b {
			t.Fatalf("quota %d+%d/%d: %q in a slab, %q alone", q, rem, den, a, b)
		}
		x := prio{p: r.Uint64() >> r.IntN(64), a: r.IntN(1000)}
		places := r.IntN(4)
		for _, m := range Methods() {
			if !m.IsDivisor() {
				continue
			}
			if a, b := m.valueIn(ts, x, places), m.value(x, places); a != b {
				t.Fatalf("%s value %+v at %d places: %+v in a slab, %+v alone", m, x, places, a, b)
			}
		}
		if n := ts.uint(q); n != strconv.FormatUint(q, 10) {
			t.Fatalf("uint %d = %q", q, n)
		}
	}
}

func TestValueSlab(t *testing.T) {
	var s valueSlab
	var ps []*Value
	for i := 0; i < 10_000; i++ {
		ps = append(ps, s.put(Value{Text: strconv.Itoa(i), Approx: float64(i)}))
	}
	for i, p := range ps {
		if p.Text != strconv.Itoa(i) || p.Approx != float64(i) {
			t.Fatalf("value %d = %+v", i, *p)
		}
	}
}

func TestAppendPoint(t *testing.T) {
	for _, c := range []struct {
		q      uint64
		places int
		want   string
	}{
		{0, 0, "0"}, {0, 3, "0.000"}, {5, 3, "0.005"}, {45, 3, "0.045"}, {999, 3, "0.999"},
		{1000, 3, "1.000"}, {762314333, 3, "762314.333"}, {7, 1, "0.7"}, {18446744073709551615, 3, "18446744073709551.615"},
	} {
		if got := string(appendPoint([]byte("x"), c.q, c.places)); got != "x"+c.want {
			t.Errorf("appendPoint(%d, %d) = %q, want %q", c.q, c.places, got, "x"+c.want)
		}
	}
}
