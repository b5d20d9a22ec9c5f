package render

import (
	"fmt"
	"testing"

	"seatsmith/engine/jsondoc"
)

func TestHTMLEscapes(t *testing.T) {
	n := El("p", "title", `a"b'<c>&`).AddText(`<script>alert(1)</script> & more`)
	got := HTML(n)
	want := `<p title="a&#34;b&#39;&lt;c&gt;&amp;">&lt;script&gt;alert(1)&lt;/script&gt; &amp; more</p>`
	if got != want {
		t.Errorf("got  %s\nwant %s", got, want)
	}
}

func TestHTMLForms(t *testing.T) {
	cases := []struct {
		n    *Node
		want string
	}{
		{El("input", "type", "text", "value", "x"), `<input type="text" value="x">`},
		{El("br"), `<br>`},
		{El("svg", "viewBox", "0 0 1 1").Add(El("rect", "x", "0")), `<svg viewBox="0 0 1 1"><rect x="0"/></svg>`},
		{El("svg").Add(Wrap("text", "a<b")), `<svg><text>a&lt;b</text></svg>`},
		{El("td").Add(nil, Text("1")), `<td>1</td>`},
	}
	for _, c := range cases {
		if got := HTML(c.n); got != c.want {
			t.Errorf("got %s, want %s", got, c.want)
		}
	}
}

func TestDocRoundTrip(t *testing.T) {
	n := El("div", "class", "x", "data-unit", "<b>").Add(Wrap("span", "hi"), Text(" & "), El("svg").Add(El("line", "x1", "1")))
	back, ok := FromDoc(Doc(n))
	if !ok {
		t.Fatal("FromDoc refused its own tree")
	}
	if HTML(back) != HTML(n) {
		t.Errorf("round trip changed the tree:\n%s\n%s", HTML(back), HTML(n))
	}
	v, _ := jsondoc.Parse([]byte(`["script", {}, "alert(1)"]`))
	if _, ok := FromDoc(v); ok {
		t.Error("FromDoc accepted a script element")
	}
	v, _ = jsondoc.Parse([]byte(`["p", {"onclick": 1}]`))
	if _, ok := FromDoc(v); ok {
		t.Error("FromDoc accepted a non-string attribute")
	}
}

func TestGroup(t *testing.T) {
	for in, want := range map[string]string{
		"0": "0", "999": "999", "1000": "1,000", "2694457": "2,694,457", "1234567.891": "1,234,567.891",
		"infinite": "infinite", "12a4567": "12a4567",
	} {
		if got := Group(in); got != want {
			t.Errorf("Group(%q) = %q, want %q", in, got, want)
		}
	}
}

func TestTextContent(t *testing.T) {
	n := El("p").AddText("a").Add(Wrap("b", "c"))
	if got := n.TextContent(); got != "ac" {
		t.Errorf("got %q", got)
	}
}

func ExampleHTML() {
	row := El("tr", "data-unit", "Orlen", "data-seats", "12").Add(Wrap("th", "Orlen"), Wrap("td", Group("2694457")))
	fmt.Println(HTML(row))
	// Output: <tr data-unit="Orlen" data-seats="12"><th>Orlen</th><td>2,694,457</td></tr>
}

func ExampleDoc() {
	n := El("p", "class", "note").AddText("Seats: ").Add(Wrap("strong", "12"))
	fmt.Println(string(jsondoc.Marshal(Doc(n))))
	// Output: ["p",{"class":"note"},"Seats: ",["strong",{},"12"]]
}

// TestJSON checks that JSON writes the same text as marshalling Doc, and
// that FromDoc reads it back.
func TestJSON(t *testing.T) {
	n := El("div", "class", "a", "data-x", `<"q">`).Add(
		Wrap("p", "one & two", "id", "x"),
		El("ul").Add(Wrap("li", "Sainte-Laguë"), El("li"), Text("\u2028")),
		El("svg", "viewBox", "0 0 1 1").Add(El("rect", "x", "0")),
	)
	raw := JSON(n)
	if got, want := string(jsondoc.Marshal(raw)), string(jsondoc.Marshal(Doc(n))); got != want {
		t.Fatalf("JSON wrote\n%s\nwant\n%s", got, want)
	}
	back, ok := FromDoc(raw)
	if !ok || HTML(back) != HTML(n) {
		t.Errorf("FromDoc(JSON(n)) = %v, %v", back, ok)
	}
	if _, ok := FromDoc(jsondoc.RawJSON(`["script",{}]`)); ok {
		t.Error("FromDoc read a refused tag from raw JSON")
	}
	wrapped := string(jsondoc.Marshal(jsondoc.NewObject().Set("output", raw)))
	if want := `{"output":` + string(jsondoc.Marshal(Doc(n))) + `}`; wrapped != want {
		t.Errorf("raw JSON inside an object: %s", wrapped)
	}
}
