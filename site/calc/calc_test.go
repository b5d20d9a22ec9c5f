package calc

import (
	"bytes"
	"os"
	"strconv"
	"strings"
	"testing"

	"seatsmith/engine/jsondoc"
	"seatsmith/engine/render"
)

func vessaria(t *testing.T) string {
	t.Helper()
	data, err := os.ReadFile("../../testdata/demo/vessaria.json")
	if err != nil {
		t.Fatal(err)
	}
	return string(data)
}

func request(block string, kv ...any) *jsondoc.Value {
	req := jsondoc.NewObject().Set("block_text", jsondoc.Str(block)).Set("id", jsondoc.Str("v"))
	for i := 0; i+1 < len(kv); i += 2 {
		req.Set(kv[i].(string), kv[i+1].(*jsondoc.Value))
	}
	return req
}

// live answers a request given in its JSON form, as the WebAssembly
// engine's calculator function does: a request that cannot be decoded gets
// a fatal answer.
func live(req *jsondoc.Value) *jsondoc.Value {
	r, err := DecodeRequest(req)
	if err != nil {
		return fatalResponse(err.Error()).Doc()
	}
	return Answer(r).Doc()
}

func outputHTML(t *testing.T, resp *jsondoc.Value) string {
	t.Helper()
	n, ok := render.FromDoc(resp.Get("output"))
	if !ok {
		t.Fatalf("no output tree in %s", jsondoc.Marshal(resp))
	}
	return render.HTML(n)
}

func TestAnswer(t *testing.T) {
	resp := live(request(vessaria(t), "editor", jsondoc.Boolean(true), "export", jsondoc.Boolean(true)))
	if resp.Get("state").Text != "live" {
		t.Fatalf("state %s: %s", resp.Get("state").Text, jsondoc.Marshal(resp.Get("error")))
	}
	h := outputHTML(t, resp)
	// Huntington–Hill, 40 seats: Orlen 12 (the CLI gives the same).
	for _, w := range []string{`data-unit="Orlen" data-seats="12"`, `data-unit="Marrowgate" data-seats="1"`, "Not an official apportionment"} {
		if !strings.Contains(h, w) {
			t.Errorf("output lacks %s", w)
		}
	}
	if _, ok := render.FromDoc(resp.Get("editor")); !ok {
		t.Error("no editor tree")
	}
	if !strings.Contains(resp.Get("csv").Text, "huntington-hill,40,1,,0,none,Orlen,2694457,1,,false,13.142784,13,14,12,false,") {
		t.Errorf("csv export: %s", resp.Get("csv").Text)
	}
	if p := resp.Get("scenario").Get("units").Items[0].Get("population"); p.Kind != jsondoc.String || p.Text != "2694457" {
		t.Errorf("scenario populations are not strings: %s", jsondoc.Marshal(p))
	}
}

func TestAnswerErrors(t *testing.T) {
	doc, _ := jsondoc.Parse([]byte(`{"seats": "40", "method": "webster", "units": [{"name": "A", "population": "1"}, {"name": "B", "population": "12x"}]}`))
	resp := live(request(vessaria(t), "scenario", doc))
	if resp.Get("state").Text != "error" {
		t.Fatalf("state %s", resp.Get("state").Text)
	}
	e := resp.Get("error")
	if e.Get("field").Text != "units.1.population" || !strings.Contains(e.Get("message").Text, "Unit 2") {
		t.Errorf("error %s", jsondoc.Marshal(e))
	}
	if h := outputHTML(t, resp); !strings.Contains(h, `role="alert"`) {
		t.Errorf("no alert in %s", h)
	}
	// An engine error about a unit names the unit's field too.
	doc, _ = jsondoc.Parse([]byte(`{"seats": "2", "method": "webster", "units": [{"name": "A", "population": "1", "min": "3"}]}`))
	e = live(request(vessaria(t), "scenario", doc)).Get("error")
	if e.Get("field").Text != "min" {
		t.Errorf("min error %s", jsondoc.Marshal(e))
	}
	// A block that cannot be read is fatal, and never panics.
	for _, bad := range []*jsondoc.Value{nil, jsondoc.Str("x"), request("{"), request(`{"units": []}`), jsondoc.NewObject()} {
		r := live(bad)
		if r.Get("state").Text != "error" || r.Get("fatal") == nil {
			t.Errorf("bad request answered %s", jsondoc.Marshal(r))
		}
	}
}

func TestAnswerLoad(t *testing.T) {
	load := jsondoc.NewObject().Set("name", jsondoc.Str("t.csv")).Set("text", jsondoc.Str("name,population\nNorth,600\nSouth,400\n"))
	resp := live(request(vessaria(t), "load", load))
	if resp.Get("state").Text != "live" || resp.Get("load_error") != nil {
		t.Fatalf("%s", jsondoc.Marshal(resp))
	}
	sc := resp.Get("scenario")
	if sc.Get("seats").Text != "40" || len(sc.Get("units").Items) != 2 {
		t.Errorf("scenario after the table: %s", jsondoc.Marshal(sc))
	}
	if h := outputHTML(t, resp); !strings.Contains(h, `data-unit="North" data-seats="24"`) {
		t.Errorf("North: %s", h)
	}
	bad := jsondoc.NewObject().Set("name", jsondoc.Str("t.csv")).Set("text", jsondoc.Str("name,population\nNorth,many\n"))
	resp = live(request(vessaria(t), "load", bad))
	le := resp.Get("load_error")
	if le == nil || le.Get("line").Text != "2" {
		t.Fatalf("load error %s", jsondoc.Marshal(le))
	}
	if len(resp.Get("scenario").Get("units").Items) != 9 {
		t.Error("a bad table replaced the units")
	}
}

func TestParseBlockErrors(t *testing.T) {
	cases := []struct{ js, want string }{
		{`{"method": "webster", "units": [{"name": "A", "population": 1}]}`, "seats: missing"},
		{`{"seats": 3, "method": "webster", "units": [{"name": "A", "population": 1}], "compare": ["best"]}`, "compare[0]"},
		{`{"seats": 3, "method": "webster", "units": [{"name": "A", "population": 1}], "claims": [{"id": "x", "kind": "seats", "unit": "Z", "seats": 1}]}`, "not a unit"},
	}
	for _, c := range cases {
		v, _ := jsondoc.Parse([]byte(c.js))
		_, err := ParseBlock("page.html", "c", Compact, v)
		if err == nil || !strings.Contains(err.Error(), c.want) || !strings.Contains(err.Error(), "page.html") {
			t.Errorf("%s: got %v, want %q", c.js, err, c.want)
		}
	}
}

// TestTieShown checks that a tie is reported, not hidden: two equal units
// and an odd house under Webster (common practice: equal priorities at the
// cut are a tie).
func TestTieShown(t *testing.T) {
	block := `{"seats": 3, "method": "webster", "units": [{"name": "East", "population": 500}, {"name": "West", "population": 500}]}`
	resp := live(request(block))
	h := outputHTML(t, resp)
	for _, w := range []string{"A tie decides seats", `data-tied="true"`, "left unassigned", "1 seat is left open by a tie"} {
		if !strings.Contains(h, w) {
			t.Errorf("output lacks %q", w)
		}
	}
	doc, _ := jsondoc.Parse([]byte(`{"seats": "3", "method": "webster", "tie": "lot:7", "units": [{"name": "East", "population": "500"}, {"name": "West", "population": "500"}]}`))
	h = outputHTML(t, live(request(block, "scenario", doc)))
	if !strings.Contains(h, "lots drawn with seed 7") || strings.Contains(h, "left open") {
		t.Errorf("settled tie: %s", h)
	}
}

// TestQuickMargins checks which results leave their margins for later and
// which may fill them in by themselves.
func TestQuickMargins(t *testing.T) {
	cases := []struct {
		block         string
		pending, auto bool
	}{
		{`{"seats": 40, "method": "huntington-hill", "units": [{"name": "A", "population": 2694457}, {"name": "B", "population": 2079562}]}`, false, false},
		// Hamilton's margins are counted in closed form: never left out.
		{`{"seats": 40, "method": "hamilton", "units": [{"name": "A", "population": 2694457}, {"name": "B", "population": 2079562}]}`, false, false},
		// With a minimum they are proven stretch by stretch: left out.
		{`{"seats": 40, "method": "hamilton", "min": 1, "units": [{"name": "A", "population": 2694457}, {"name": "B", "population": 2079562}]}`, true, false},
		{`{"seats": 31, "method": "hamilton", "min": 1, "units": [{"name": "A", "population": 461}, {"name": "B", "population": 1214}]}`, true, true},
		{`{"seats": 30, "method": "jefferson", "threshold": "5%", "units": [{"name": "A", "population": 380000}, {"name": "B", "population": 49000}]}`, true, true},
	}
	for _, c := range cases {
		resp := live(request(c.block, "margins", jsondoc.Boolean(false)))
		if p, a := resp.Get("margins_pending").Bool, resp.Get("margins_auto").Bool; p != c.pending || a != c.auto {
			t.Errorf("%s: pending %v auto %v, want %v %v", c.block, p, a, c.pending, c.auto)
		}
		if full := live(request(c.block)); full.Get("margins_pending").Bool {
			t.Errorf("%s: margins pending without being left out", c.block)
		}
	}
}

// TestLiveScenarioText checks that a scenario sent as JSON text, as the
// bridge sends it, gets the answer the same scenario sent as a document
// gets, errors included, and that text that is not JSON is refused.
func TestLiveScenarioText(t *testing.T) {
	for _, text := range []string{
		`{"seats": "40", "method": "webster", "units": [{"name": "A", "population": "1200"}, {"name": "B", "population": "800"}]}`,
		`{"seats": "40", "method": "webster", "units": [{"name": "A", "population": "1"}, {"name": "B", "population": "12x"}]}`,
		`{"seats": 7, "method": "hamilton", "min": 1, "units": [{"name": "A", "population": 10}, {"name": "B", "population": 3}]}`,
	} {
		doc, err := jsondoc.Parse([]byte(text))
		if err != nil {
			t.Fatal(err)
		}
		want := jsondoc.Marshal(live(request(vessaria(t), "scenario", withoutLines(doc), "editor", jsondoc.Boolean(true))))
		got := jsondoc.Marshal(live(request(vessaria(t), "scenario_text", jsondoc.Str(text), "editor", jsondoc.Boolean(true))))
		if !bytes.Equal(got, want) {
			t.Errorf("scenario_text %s answered differently:\n got %.300s\nwant %.300s", text, got, want)
		}
	}
	r := live(request(vessaria(t), "scenario_text", jsondoc.Str(`{"seats": `)))
	if r.Get("fatal") == nil || !strings.Contains(r.Get("error").Get("message").Text, "scenario_text") {
		t.Errorf("bad scenario_text answered %s", jsondoc.Marshal(r))
	}
}

// TestBlockCache checks that a block's text is parsed once, that the same
// text under another id or mode is a different block, that a bad block is
// refused every time, and that the cache stays within its size.
func TestBlockCache(t *testing.T) {
	var c blockCache
	text := vessaria(t)
	a, msg := c.get("a", Full, text)
	if a == nil {
		t.Fatal(msg)
	}
	if b, _ := c.get("a", Full, text); b != a {
		t.Error("the same block was parsed again")
	}
	if b, _ := c.get("b", Full, text); b == a || b.ID != "b" {
		t.Error("another calculator's id got the first one's block")
	}
	for k := 0; k < 2; k++ {
		if b, msg := c.get("a", Full, "{"); b != nil || !strings.Contains(msg, "not valid JSON") {
			t.Errorf("bad block: %v, %q", b, msg)
		}
	}
	for k := 0; k < 3*maxCachedBlocks; k++ {
		c.get("x"+strconv.Itoa(k), Full, text)
	}
	if len(c.entries) != maxCachedBlocks {
		t.Errorf("%d blocks cached, want %d", len(c.entries), maxCachedBlocks)
	}
}

// TestDecodeRequest checks that the field table names what it cannot read.
func TestDecodeRequest(t *testing.T) {
	cases := []struct{ js, want string }{
		{`{"block_text": "{}", "marigns": false}`, "marigns: unknown member; a calculator request has block_text, id, mode,"},
		{`{"block_text": "{}", "margins": "no"}`, "margins: must be true or false, not a string"},
		{`{"block_text": "{}", "mode": "wide"}`, `mode: "wide" is not a mode`},
		{`{"block_text": "{}", "load": {"text": 5}}`, "load.text: must be a string, not a number"},
		{`{"block_text": "{}",` + "\n" + `"load": {"name": "a", "size": 1}}`, "line 2: load.size: unknown member; a load has name, text"},
		{`{"block_text": "{}", "scenario_text": "{"}`, "scenario_text: not valid JSON"},
		{`{"id": "x"}`, "block_text: missing"},
		{`[1]`, "a calculator request must be an object, not an array"},
	}
	for _, c := range cases {
		v, err := jsondoc.Parse([]byte(c.js))
		if err != nil {
			t.Fatal(err)
		}
		_, err = DecodeRequest(v)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: got %v, want %q", c.js, err, c.want)
		}
	}
	v, _ := jsondoc.Parse([]byte(`{"block_text": "{}", "id": "c", "mode": "full", "scenario_text": "{\"seats\": 3}", "editor": true, "margins": false, "order": false, "load": {"name": "t.csv", "text": "x"}}`))
	r, err := DecodeRequest(v)
	if err != nil {
		t.Fatal(err)
	}
	if r.ID != "c" || r.Mode != Full || !r.Editor || !r.QuickMargins || !r.NoOrder || r.Load == nil || r.Load.Name != "t.csv" ||
		r.Scenario.Get("seats").Text != "3" {
		t.Errorf("decoded %+v", r)
	}
}

// The variation modes (sweep, growth, admit) are tested here as the site
// build uses them.
func TestMain(m *testing.M) {
	UseVariations()
	os.Exit(m.Run())
}
