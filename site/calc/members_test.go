package calc

import (
	"encoding/csv"
	"strconv"
	"strings"
	"testing"

	"seatsmith/engine/jsondoc"
	"seatsmith/engine/render"
)

// The block of these tests, invented: a council of ten seats that counts
// votes.
const votesBlock = `{"seats": 10, "method": "jefferson", "count": "votes", "units": [{"name": "Amber List", "population": 4000}, {"name": "Birch Party", "population": 3000}, {"name": "Cobalt", "population": 2000}]}`

func loadReq(text, choose string, cols *jsondoc.Value) *jsondoc.Value {
	l := jsondoc.NewObject().Set("name", jsondoc.Str("pasted table")).Set("text", jsondoc.Str(text))
	if choose != "" {
		l.Set("choose", jsondoc.Str(choose))
	}
	if cols != nil {
		l.Set("columns", cols)
	}
	return request(votesBlock, "load", l)
}

func unitsOf(resp *jsondoc.Value) string {
	var parts []string
	for _, u := range resp.Get("scenario").Get("units").Items {
		s := str(u.Get("name")) + "=" + str(u.Get("population"))
		for _, k := range []string{"min", "max"} {
			if x := u.Get(k); x != nil {
				s += " " + k + x.Text
			}
		}
		parts = append(parts, s)
	}
	return strings.Join(parts, "; ")
}

func TestRequestLoadSheets(t *testing.T) {
	cols := func(n, c, lo, hi int) *jsondoc.Value {
		return jsondoc.NewObject().Set("name", jsondoc.Int(n)).Set("count", jsondoc.Int(c)).Set("min", jsondoc.Int(lo)).Set("max", jsondoc.Int(hi))
	}
	for _, c := range []struct {
		name, text, choose string
		cols               *jsondoc.Value
		units              string // the units loaded, or "" when the chooser shows
		chooser            []string
		err                string
	}{
		{name: "spreadsheet paste", text: "Partei\tStimmen\nAmber List\t1.234.567\nBirch Party\t 987.654\n", units: "Amber List=1234567; Birch Party=987654"},
		{name: "semicolon file", text: "Partei;Stimmen\nNord;12,5\nSüd;7,25\n", units: "Nord=12.5; Süd=7.25"},
		{name: "commas, quoted, grouped", text: "state,pop\n\"North, upper\",\"1,234,567\"\nSouth,\"2,000,001\"\n", units: "North, upper=1234567; South=2000001"},
		{name: "spaces group", text: "name;votes;max\nA;1 234 567;3\nB;7 654;\n", units: "A=1234567 max3; B=7654"},
		{name: "no header", text: "East\t500\nWest\t700\n", units: "East=500; West=700"},
		{name: "always chooses", text: "state,pop\nA,5\nB,6\n", choose: ChooseAlways, chooser: []string{"Which column is which?", ">Votes<", `data-column="count"`, `value="1" selected`, "separated by commas"}},
		{name: "unsure without a header", text: "A;5;1\nB;6;2\n", choose: ChooseUnsure, chooser: []string{"separated by semicolons", `<option value="-1" selected="">None</option>`}},
		{name: "unsure but certain", text: "name,votes\nA,5\nB,6\n", choose: ChooseUnsure, units: "A=5; B=6"},
		{name: "columns chosen", text: "seats;who;n\n2;A;5\n1;B;6\n", choose: ChooseAlways, cols: cols(1, 2, 0, -1), units: "A=5 min2; B=6 min1"},
		{name: "ambiguous thousands", text: "name,votes\nA,\"1,234\"\nB,\"5,678\"\n", err: "could be 1234 or 1.234"},
		{name: "error names line and column", text: "Partei;Stimmen\nA;5\nB;viele\n", err: `line 3, count "Stimmen" (column 2)`},
		{name: "column out of range", text: "a,b\nx,1\n", cols: cols(0, 7, -1, -1), err: "no column 8"},
		{name: "no columns", text: "just one column\nanother\n", err: "found no columns"},
	} {
		t.Run(c.name, func(t *testing.T) {
			resp := live(loadReq(c.text, c.choose, c.cols))
			if resp.Get("fatal") != nil {
				t.Fatalf("fatal: %s", jsondoc.Marshal(resp))
			}
			le := resp.Get("load_error")
			if c.err != "" {
				if le == nil {
					t.Fatalf("no load error; units %s", unitsOf(resp))
				}
				where := "line " + le.Get("line").Text + ", " + str(le.Get("field")) + ": " + str(le.Get("message"))
				if !strings.Contains(where, c.err) {
					t.Errorf("load error %q, want %q", where, c.err)
				}
				if got := unitsOf(resp); !strings.HasPrefix(got, "Amber List=4000") {
					t.Errorf("a bad table changed the units: %s", got)
				}
				return
			}
			if le != nil {
				t.Fatalf("load error %s", jsondoc.Marshal(le))
			}
			if c.chooser != nil {
				n, ok := render.FromDoc(resp.Get("chooser"))
				if !ok {
					t.Fatalf("no chooser; units %s", unitsOf(resp))
				}
				h := render.HTML(n)
				for _, w := range c.chooser {
					if !strings.Contains(h, w) {
						t.Errorf("the chooser lacks %s:\n%s", w, h)
					}
				}
				if got := unitsOf(resp); !strings.HasPrefix(got, "Amber List=4000") {
					t.Errorf("the chooser loaded the units: %s", got)
				}
				return
			}
			if resp.Get("chooser") != nil {
				t.Errorf("a chooser where none was asked for")
			}
			if got := unitsOf(resp); got != c.units {
				t.Errorf("units %q, want %q", got, c.units)
			}
		})
	}
}

func TestRequestMemberErrors(t *testing.T) {
	for _, c := range []struct {
		name string
		req  *jsondoc.Value
		want string
	}{
		{"bad choose", request(votesBlock, "load", jsondoc.NewObject().Set("text", jsondoc.Str("a,1")).Set("choose", jsondoc.Str("maybe"))), "not a choice"},
		{"bad columns", request(votesBlock, "load", jsondoc.NewObject().Set("text", jsondoc.Str("a,1")).Set("columns", jsondoc.NewObject().Set("name", jsondoc.Str("x")))), "name"},
		{"baseline not JSON", request(votesBlock, "baseline_text", jsondoc.Str("{oops")), "not valid JSON"},
		{"baseline not a scenario", request(votesBlock, "baseline_text", jsondoc.Str("[1]")), "not a scenario"},
		{"link not text", request(votesBlock, "link", jsondoc.Int(3)), "link"},
	} {
		t.Run(c.name, func(t *testing.T) {
			resp := live(c.req)
			if resp.Get("fatal") == nil || !strings.Contains(string(jsondoc.Marshal(resp.Get("error"))), c.want) {
				t.Errorf("got %s, want a fatal error saying %q", jsondoc.Marshal(resp), c.want)
			}
		})
	}
}

// A pinned baseline and a proposal: the comparison shows the seats that
// move, with arrows and words, and the link carries both.
func TestRequestBaseline(t *testing.T) {
	base := `{"seats": "10", "method": "jefferson", "units": [{"name": "Amber List", "population": "4000"}, {"name": "Birch Party", "population": "3000"}, {"name": "Cobalt", "population": "2000"}]}`
	prop := `{"seats": "10", "method": "jefferson", "units": [{"name": "Amber List", "population": "4000"}, {"name": "Birch Party", "population": "3000"}, {"name": "Cobalt", "population": "2900"}]}`
	resp := live(request(votesBlock, "baseline_text", jsondoc.Str(base), "scenario_text", jsondoc.Str(prop), "editor", jsondoc.Boolean(true)))
	if resp.Get("state").Text != "live" {
		t.Fatalf("%s", jsondoc.Marshal(resp))
	}
	h := outputHTML(t, resp)
	for _, w := range []string{`data-role="baseline"`, `data-moved="1"`, "1 seat moves", "gaining: Cobalt +1", "losing: Amber List −1",
		`data-diff-unit="Cobalt" data-change="1"`, "seat gained", "seat lost", "2,000 to 2,900"} {
		if !strings.Contains(h, w) {
			t.Errorf("the comparison lacks %s", w)
		}
	}
	ed, _ := render.FromDoc(resp.Get("editor"))
	if !strings.Contains(render.HTML(ed), `data-action="unpin"`) {
		t.Error("no unpin button while a baseline is pinned")
	}
	link := str(resp.Get("link"))
	if !strings.Contains(link, "!") {
		t.Fatalf("the link %q lacks the baseline", link)
	}
	// The link reopens the same view.
	again := live(request(votesBlock, "link", jsondoc.Str(link)))
	if h2 := outputHTML(t, again); h2 != h {
		t.Errorf("the link reopens another view:\n%s\n%s", h2, h)
	}
	if str(again.Get("link")) != link {
		t.Errorf("the reopened link %q differs from %q", str(again.Get("link")), link)
	}
	// A damaged link says so and shows the block's own numbers.
	bad := live(request(votesBlock, "link", jsondoc.Str("~u1%")))
	if !strings.Contains(str(bad.Get("link_error")), "damaged") || bad.Get("baseline") != nil || bad.Get("state").Text != "live" {
		t.Errorf("a damaged link: %s", jsondoc.Marshal(bad))
	}
	// A baseline that cannot be apportioned says so in place.
	worse := live(request(votesBlock, "baseline_text", jsondoc.Str(`{"seats": "10", "method": "jefferson", "units": [{"name": "A", "population": "-1"}]}`)))
	if h := outputHTML(t, worse); !strings.Contains(h, `data-role="baseline-error"`) || !strings.Contains(h, "votes cannot be negative") {
		t.Errorf("a bad baseline: %s", h)
	}
}

// The CSV export is data: numeric columns parse as numbers, the settings
// are columns, and a tie has its own column.
func TestExportCSVData(t *testing.T) {
	// Jefferson, 3 seats, 2000 : 1000 : 1000: Amber's first seat at
	// 2000, then four equal priorities of 1000 (Amber's second, Birch's and
	// Cobalt's first) for two seats, which stay open with no tie rule
	// (worked by hand, common practice: D'Hondt divides by 1, 2, 3).
	block := `{"seats": 3, "method": "jefferson", "min": 0, "max": 5, "threshold": "1%", "units": [{"name": "Amber", "population": 2000}, {"name": "Birch", "population": 1000}, {"name": "Cobalt", "population": 1000}]}`
	resp := live(request(block, "export", jsondoc.Boolean(true)))
	text := str(resp.Get("csv"))
	rows, err := csv.NewReader(strings.NewReader(text)).ReadAll()
	if err != nil || len(rows) != 4 {
		t.Fatalf("CSV %v:\n%s", err, text)
	}
	col := map[string]int{}
	for j, h := range rows[0] {
		col[h] = j
	}
	for _, need := range []string{"method", "house_size", "default_min", "default_max", "threshold", "tie_rule", "unit", "population", "quota", "tied", "unassigned"} {
		if _, ok := col[need]; !ok {
			t.Errorf("no %s column in %v", need, rows[0])
		}
	}
	tied := 0
	for _, r := range rows[1:] {
		for _, k := range []string{"population", "quota", "lower_quota", "upper_quota", "unassigned", "last_priority", "next_priority", "gain_margin", "lose_margin"} {
			j, ok := col[k]
			if !ok || r[j] == "" || r[j] == "infinite" {
				continue
			}
			if _, err := strconv.ParseFloat(r[j], 64); err != nil {
				t.Errorf("%s of %s is %q, not a number", k, r[col["unit"]], r[j])
			}
		}
		if _, err := strconv.Atoi(r[col["seats"]]); err != nil {
			t.Errorf("seats %q", r[col["seats"]])
		}
		if r[col["tied"]] == "true" {
			tied++
		}
	}
	if tied != 3 || rows[1][col["unassigned"]] != "2" {
		t.Errorf("%d rows marked tied, want 3, and 2 seats open:\n%s", tied, text)
	}
}
