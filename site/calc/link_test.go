package calc

import (
	"encoding/base64"
	"errors"
	"strconv"
	"strings"
	"testing"

	"seatsmith/engine/jsondoc"
)

func mustDoc(t *testing.T, s string) *jsondoc.Value {
	t.Helper()
	if s == "" {
		return nil
	}
	v, err := parseJSON(s)
	if err != nil {
		t.Fatalf("%s: %v", s, err)
	}
	return stringNumbers(withoutLines(v))
}

func docJSON(v *jsondoc.Value) string {
	if v == nil {
		return "null"
	}
	return string(jsondoc.Marshal(v))
}

const linkBlock = `{"version": 1, "title": "Riverland", "seats": "10", "method": "webster",
 "units": [{"name": "North Reach", "population": "5200"}, {"name": "South_Bank", "population": "3900", "min": "1"}, {"name": "Ost", "population": "900"}]}`

func TestLinkRoundTrip(t *testing.T) {
	block := mustDoc(t, linkBlock)
	for _, c := range []struct {
		name, base, scen string
		want             string // the payload, when it matters
	}{
		{"the block's own", "", linkBlock, "~"},
		{"seats", "", `{"version": 1, "title": "Riverland", "seats": "11", "method": "webster", "units": [{"name": "North Reach", "population": "5200"}, {"name": "South_Bank", "population": "3900", "min": "1"}, {"name": "Ost", "population": "900"}]}`, "~s11"},
		{"one count", "", `{"version": 1, "title": "Riverland", "seats": "10", "method": "webster", "units": [{"name": "North Reach", "population": "5200"}, {"name": "South_Bank", "population": "3950", "min": "1"}, {"name": "Ost", "population": "900"}]}`, "~u,~3950,"},
		{"a field removed, a member removed", "", `{"version": 1, "seats": "10", "method": "hamilton", "units": [{"name": "North Reach", "population": "5200"}, {"name": "South_Bank", "population": "3900"}, {"name": "Ost", "population": "900"}]}`, "~mh*u,~~',*title:'"},
		{"odd text", "", `{"seats": "", "method": "w", "threshold": "5%", "tie": "lot:3", "units": [{"name": "A & B, 'C'*!~ä", "population": "1,5"}]}`, ""},
		{"one unit like the block's first", "", `{"version": 1, "title": "Riverland", "seats": "10", "method": "webster", "units": [{"name": "North Reach", "population": "5200"}]}`, "~u~"},
		{"no units", "", `{"version": 1, "title": "Riverland", "seats": "10", "method": "webster", "units": []}`, "~u"},
		{"more units", "", `{"version": 1, "title": "Riverland", "seats": "10", "method": "webster", "units": [{"name": "North Reach", "population": "5200"}, {"name": "South_Bank", "population": "3900", "min": "1"}, {"name": "Ost", "population": "900"}, {"name": "New", "population": "7", "later": "9"}]}`, "~u,,,New~7~~~9"},
		{"study members", "", `{"from": "5", "to": "20", "methods": ["webster", "dean", "x"], "admit": {"name": "Isle", "population": "70"}, "units": []}`, ""},
		{"baseline and proposal", `{"version": 1, "title": "Riverland", "seats": "12", "method": "webster", "units": [{"name": "North Reach", "population": "5200"}, {"name": "South_Bank", "population": "3900", "min": "1"}, {"name": "Ost", "population": "900"}]}`,
			`{"version": 1, "title": "Riverland", "seats": "12", "method": "dean", "units": [{"name": "North Reach", "population": "5200"}, {"name": "South_Bank", "population": "3900", "min": "1"}, {"name": "Ost", "population": "1900"}]}`, "~s12!me*u,,~1900"},
	} {
		t.Run(c.name, func(t *testing.T) {
			base, scen := mustDoc(t, c.base), mustDoc(t, c.scen)
			p := EncodeLink(block, base, scen)
			if c.want != "" && p != c.want {
				t.Errorf("payload %q, want %q", p, c.want)
			}
			if strings.ContainsAny(p, "&=#?/ \"<>") {
				t.Errorf("payload %q holds characters a fragment entry must not", p)
			}
			gb, gs, err := DecodeLink(block, p)
			if err != nil {
				t.Fatalf("decoding %q: %v", p, err)
			}
			if !sameValue(gb, base) || !sameValue(gs, scen) {
				t.Errorf("round trip of %q:\nbaseline %s\n    want %s\nscenario %s\n    want %s", p, docJSON(gb), docJSON(base), docJSON(gs), docJSON(scen))
			}
		})
	}
}

func TestLinkMalformed(t *testing.T) {
	block := mustDoc(t, linkBlock)
	for _, c := range []struct{ name, link, want string }{
		{"unknown code", "~q5", "not a member's code"},
		{"cut escape", "~s1%4", "cut %-escape"},
		{"bad escape", "~s%ZZ", "not a %-escape"},
		{"raw delimiter", "~s1'2", "where a value belongs"},
		{"empty member", "~s1**m", "empty member"},
		{"three sides", "~s1!s2!s3", "more than two"},
		{"bad method code", "~mz", "not a method's code"},
		{"too many fields", "~u1~2~3~4~5~6", "at most 5"},
		{"bad proposal", "~s1!s%", "the proposal"},
		{"too many units", "~u" + strings.Repeat(",", MaxUnits), "more than the 5000"},
		{"not base64", "@@@", "neither"},
		{"base64 not JSON", base64.RawURLEncoding.EncodeToString([]byte("{oops")), "not valid JSON"},
		{"base64 not an object", base64.RawURLEncoding.EncodeToString([]byte("[1]")), "does not hold a scenario"},
		{"too long", "~" + strings.Repeat("a", MaxLinkBytes), "longer than"},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, _, err := DecodeLink(block, c.link)
			var le *LinkError
			if err == nil || !errors.As(err, &le) || !strings.Contains(err.Error(), c.want) {
				t.Errorf("DecodeLink(%.40q) = %v, want a LinkError saying %q", c.link, err, c.want)
			}
		})
	}
}

// The earlier links, base64url of the scenario's JSON, still open.
func TestLinkOldForm(t *testing.T) {
	old := base64.RawURLEncoding.EncodeToString([]byte(`{"seats":"41","method":"webster","units":[{"name":"A","population":"9"}]}`))
	b, s, err := DecodeLink(mustDoc(t, linkBlock), old)
	if err != nil || b != nil || docText(s, "seats") != "41" {
		t.Fatalf("old link: %v %v %s", err, b, docJSON(s))
	}
}

// scenario50 is an invented scenario of 50 districts.
func scenario50(seats int, bump map[int]int) string {
	var b strings.Builder
	b.WriteString(`{"version": 1, "title": "Fifty districts", "seats": "` + strconv.Itoa(seats) + `", "method": "huntington-hill", "units": [`)
	for i := 0; i < 50; i++ {
		if i > 0 {
			b.WriteString(", ")
		}
		b.WriteString(`{"name": "District ` + strconv.Itoa(i+1) + `", "population": "` + strconv.Itoa(200000+(i*7919)%900000+bump[i]) + `"}`)
	}
	b.WriteString("]}")
	return b.String()
}

// TestLinkLength measures the link of a 50-unit scenario against the
// earlier form (base64url of the scenario's JSON as the page held it):
// the scenario alone, edited from a loaded table (every unit differs from
// the block's), and with a pinned baseline and a proposal that moves two
// counts and the house size.
func TestLinkLength(t *testing.T) {
	block := mustDoc(t, linkBlock)
	base := mustDoc(t, scenario50(435, nil))
	prop := mustDoc(t, scenario50(436, map[int]int{3: 12000, 17: -800}))
	old := len(base64.RawURLEncoding.EncodeToString(jsondoc.Marshal(base)))
	alone := len(EncodeLink(block, nil, base))
	both := len(EncodeLink(block, base, prop))
	oldBoth := old + len(base64.RawURLEncoding.EncodeToString(jsondoc.Marshal(prop)))
	t.Logf("50 units: earlier form %d characters, compact %d; with a baseline and a proposal: %d (the earlier form held one scenario; two would take %d)", old, alone, both, oldBoth)
	if alone*2 > old {
		t.Errorf("the compact link (%d) is not under half the earlier form (%d)", alone, old)
	}
	if both > alone+80 {
		t.Errorf("a proposal of three changes adds %d characters (49 of them separate the units)", both-alone)
	}
}
