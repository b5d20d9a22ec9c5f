package render

import (
	"encoding/xml"
	"io"
	"os"
	"strings"
	"testing"
)

func TestSVGIsWellFormed(t *testing.T) {
	n := El("svg", "xmlns", "http://www.w3.org/2000/svg", "viewBox", "0 0 10 10")
	n.Add(Wrap("title", `A <b> & "c" 'd'`), El("rect", "x", "1", "class", `a"b`),
		Wrap("text", "bad \x00\x01 byte \xff and \ufffe", "x", "2"), Wrap("style", ".a > .b { fill: red; }"))
	out := SVG(n)
	if !strings.HasPrefix(out, `<?xml version="1.0" encoding="UTF-8"?>`+"\n<svg ") {
		t.Errorf("no XML declaration: %.60s", out)
	}
	for _, want := range []string{`<rect x="1" class="a&#34;b"/>`, `A &lt;b&gt; &amp; "c" 'd'`, "bad \ufffd\ufffd byte \ufffd and \ufffd"} {
		if !strings.Contains(out, want) {
			t.Errorf("SVG lacks %q:\n%s", want, out)
		}
	}
	d := xml.NewDecoder(strings.NewReader(out))
	for {
		_, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("not well-formed: %v\n%s", err, out)
		}
	}
}

func ExampleSVG() {
	n := El("svg", "xmlns", "http://www.w3.org/2000/svg", "width", "20", "height", "10")
	n.Add(El("line", "x1", "0", "y1", "5", "x2", "20", "y2", "5", "class", "sc-step sc-u0"), Wrap("title", "North & South"))
	os.Stdout.WriteString(SVG(n))
	// Output:
	// <?xml version="1.0" encoding="UTF-8"?>
	// <svg xmlns="http://www.w3.org/2000/svg" width="20" height="10"><line x1="0" y1="5" x2="20" y2="5" class="sc-step sc-u0"/><title>North &amp; South</title></svg>
}
