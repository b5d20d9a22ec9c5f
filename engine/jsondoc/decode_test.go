package jsondoc_test

import (
	"fmt"
	"strings"
	"testing"

	"seatsmith/engine/jsondoc"
)

type point struct {
	Name string
	X, Y int
	Tags []string
}

func pointTable(p *point) []jsondoc.Member {
	return []jsondoc.Member{
		{Key: "name", Read: jsondoc.ReadString(&p.Name)},
		{Key: "x", Read: jsondoc.ReadInt(&p.X, 0, 100)},
		{Key: "y", Read: jsondoc.ReadInt(&p.Y, 0, 100)},
		{Key: "tags", Read: jsondoc.ReadArray(3, func(i int, v *jsondoc.Value) error {
			var s string
			if err := jsondoc.ReadString(&s)(v); err != nil {
				return err
			}
			p.Tags = append(p.Tags, s)
			return nil
		})},
	}
}

func TestDecode(t *testing.T) {
	cases := []struct{ js, want string }{
		{`{"name": "a", "x": 1, "y": "2", "tags": ["t"]}`, ""},
		{`{"name": null, "x": 1}`, ""},
		{`{"name": "a",` + "\n" + `"z": 1}`, "line 2: z: unknown member; a point has name, x, y, tags"},
		{`{"x": 101}`, "line 1: x: must be a whole number from 0 to 100"},
		{`{"x": true}`, "x: must be a whole number, not a boolean"},
		{`{"tags": ["a", 5]}`, "tags[1]: must be a string, not a number"},
		{`{"tags": ["a", "b", "c", "d"]}`, "tags: has 4 items, more than the limit of 3"},
		{`{"tags": {}}`, "tags: must be an array, not an object"},
		{`[]`, "a point must be an object, not an array"},
	}
	for _, c := range cases {
		v, err := jsondoc.Parse([]byte(c.js))
		if err != nil {
			t.Fatal(err)
		}
		var p point
		err = jsondoc.Decode(v, "a point", pointTable(&p))
		switch {
		case c.want == "" && err != nil:
			t.Errorf("%s: %v", c.js, err)
		case c.want != "" && (err == nil || !strings.Contains(err.Error(), c.want)):
			t.Errorf("%s: got %v, want %q", c.js, err, c.want)
		}
	}
	if err := jsondoc.Decode(nil, "a point", nil); err == nil {
		t.Error("nil decoded")
	}
}

// A nested member's error names its whole path.
func TestDecodeNested(t *testing.T) {
	v, _ := jsondoc.Parse([]byte("{\"at\":\n {\"x\": -1}}"))
	var p point
	err := jsondoc.Decode(v, "a shape", []jsondoc.Member{{Key: "at", Read: func(x *jsondoc.Value) error {
		return jsondoc.Decode(x, "a point", pointTable(&p))
	}}})
	if err == nil || err.Error() != "line 2: at.x: must be a whole number from 0 to 100" {
		t.Errorf("got %v", err)
	}
}

func ExampleDecode() {
	v, _ := jsondoc.Parse([]byte(`{"name": "North", "seats": 9, "colour": "blue"}`))
	var name string
	var seats int
	err := jsondoc.Decode(v, "a unit", []jsondoc.Member{
		{Key: "name", Read: jsondoc.ReadString(&name)},
		{Key: "seats", Read: jsondoc.ReadInt(&seats, 0, 1000)},
	})
	fmt.Println(name, seats)
	fmt.Println(err)
	// Output:
	// North 9
	// line 1: colour: unknown member; a unit has name, seats
}
