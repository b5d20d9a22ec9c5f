package claim

import (
	"strings"
	"testing"
)

// A block that counts students speaks of students in its margins.
func TestWords(t *testing.T) {
	cs := parse(t, `[{"id": "g", "kind": "gain-below", "unit": "Cedar Row", "below": 500},
		{"id": "l", "kind": "lose-below", "unit": "Cedar Row", "below": 3}]`)
	s := schools()
	cases := []struct {
		ctx  Context
		want []string
	}{
		{Context{}, []string{"Cedar Row is fewer than 500 people from gaining a seat", "Cedar Row can lose fewer than 3 people before it drops a seat"}},
		{Context{Noun: "students", People: "students"}, []string{"Cedar Row is fewer than 500 students from gaining a seat", "Cedar Row can lose fewer than 3 students before it drops a seat"}},
	}
	for _, c := range cases {
		for i := range cs {
			if got := cs[i].StatementIn(s.Method, s.Seats, c.ctx); !strings.HasPrefix(got, c.want[i]) {
				t.Errorf("%+v: %q, want %q…", c.ctx, got, c.want[i])
			}
		}
	}
	// No change of a single unit's count wins Fernvale a seat at a house
	// of one seat: the verdict says so in the block's words.
	one := s
	one.Seats = 1
	v := CheckIn(one, parse(t, `[{"id": "f", "kind": "lose-below", "unit": "Fernvale", "below": 10}]`), Context{Noun: "students", People: "students"})
	if !strings.Contains(v[0].Found, "no change of its students alone does it") {
		t.Errorf("verdict %q", v[0].Found)
	}
}
