package calc

import (
	"bytes"
	"errors"
	"strconv"
	"strings"
	"time"

	"seatsmith/engine/format"
	csvformat "seatsmith/engine/format/csv"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	"seatsmith/engine/render"
)

// Live answers one request from the browser and never panics. The request
// is an object:
//
//	block_text  the calculator block's JSON text, as on the page (required)
//	id          the calculator's id (required)
//	mode        "full", "compact", "sweep", "growth" or "admit" (see Mode)
//	scenario    the scenario being edited, a scenario document; the
//	            block's own when absent or null
//	scenario_text
//	            the same as JSON text, in place of scenario (one string
//	            crosses from JavaScript into the engine much faster than
//	            an object read member by member, so the bridge sends this)
//	load        {name, text}: a CSV table (replaces the units) or a JSON
//	            scenario document (replaces the scenario) to load first
//	editor      true to lay out the editor as well as the results
//	export      true to add the CSV and JSON exports
//	timings     true to add timings to the answer (for measuring speed)
//	margins     false to leave out the margins where they are costly (see
//	            Options.QuickMargins); the answer then has margins_pending true, and
//	            margins_auto true when they are quick enough to fill in
//	            without being asked
//	order       false to leave out the seat order (see Options.NoOrder)
//	            unless export is asked for; the answer then has
//	            order_pending true when a full calculator would show it
//
// The answer is an object:
//
//	state       "live", or "error" when the scenario cannot be apportioned
//	error       {message, field} or null
//	scenario    the scenario the answer is for, every number as a string
//	            (so that no digit is lost in JavaScript)
//	output      the results as a render tree (package render's JSON form)
//	editor      the editor as a render tree, when asked for
//	claims      [{id, holds, found}]
//	margins_pending, margins_auto, order_pending
//	            what was left out, as above
//	load_error  {message, line, field} when load could not be read
//	csv, json   the exports, when asked for and the scenario is valid
//	timings     {compute_ms, layout_ms} when asked for: the milliseconds
//	            spent apportioning, comparing and checking claims, and
//	            laying the results out as a tree
//
// A block that cannot be read answers {state: "error", error, fatal: true}.
func Live(req *jsondoc.Value) (resp *jsondoc.Value) {
	defer func() {
		if p := recover(); p != nil {
			resp = fatal("internal error: " + panicText(p))
		}
	}()
	if req == nil || req.Kind != jsondoc.Object {
		return fatal("the request must be an object")
	}
	bt := req.Get("block_text")
	if bt == nil || bt.Kind != jsondoc.String {
		return fatal("block_text: missing")
	}
	id := "calc"
	if x := req.Get("id"); x != nil && x.Kind == jsondoc.String && x.Text != "" {
		id = x.Text
	}
	mode, _ := ParseMode(str(req.Get("mode")))
	b, msg := blocks.get(id, mode, bt.Text)
	if b == nil {
		return fatal(msg)
	}
	doc := req.Get("scenario")
	if st := req.Get("scenario_text"); st != nil && st.Kind == jsondoc.String {
		v, err := jsondoc.Parse([]byte(st.Text))
		if err != nil {
			return fatal("scenario_text is not valid JSON: " + err.Error())
		}
		doc = withoutLines(v)
	}
	if doc.IsNull() {
		doc = b.Doc
	}
	resp = jsondoc.NewObject()
	if ld := req.Get("load"); !ld.IsNull() {
		nd, lerr := load(doc, ld)
		if lerr != nil {
			le := jsondoc.NewObject().Set("message", jsondoc.Str(lerr.Msg)).Set("line", jsondoc.Int(lerr.Line)).Set("field", jsondoc.Str(lerr.Field))
			resp.Set("load_error", le)
		} else {
			doc = nd
		}
	}
	doc = stringNumbers(doc)
	var opt Options
	if x := req.Get("margins"); x != nil && x.Kind == jsondoc.Bool && !x.Bool {
		opt.QuickMargins = true
	}
	export := false
	if x := req.Get("export"); x != nil && x.Kind == jsondoc.Bool && x.Bool {
		export = true
	}
	if x := req.Get("order"); x != nil && x.Kind == jsondoc.Bool && !x.Bool && !export {
		opt.NoOrder = true
	}
	started := time.Now()
	o := RunWith(b, doc, opt)
	computed := time.Now()
	resp.Set("margins_pending", jsondoc.Boolean(o.MarginsPending))
	resp.Set("order_pending", jsondoc.Boolean(o.OrderPending))
	resp.Set("margins_auto", jsondoc.Boolean(o.MarginsAuto()))
	resp.Set("state", jsondoc.Str(o.State()))
	if o.Problem != nil {
		resp.Set("error", jsondoc.NewObject().Set("message", jsondoc.Str(o.Problem.Msg)).Set("field", jsondoc.Str(o.Problem.Field)))
	} else {
		resp.Set("error", nil)
	}
	resp.Set("scenario", doc)
	resp.Set("output", render.JSON(Output(o)))
	if x := req.Get("timings"); x != nil && x.Kind == jsondoc.Bool && x.Bool {
		ms := func(d time.Duration) *jsondoc.Value {
			return jsondoc.Num(strconv.FormatFloat(d.Seconds()*1000, 'f', 3, 64))
		}
		resp.Set("timings", jsondoc.NewObject().Set("compute_ms", ms(computed.Sub(started))).Set("layout_ms", ms(time.Since(computed))))
	}
	if x := req.Get("editor"); x != nil && x.Kind == jsondoc.Bool && x.Bool {
		resp.Set("editor", render.JSON(Editor(b, doc, true)))
	}
	cl := jsondoc.NewArray()
	for _, v := range o.Verdicts {
		cl.Append(jsondoc.NewObject().Set("id", jsondoc.Str(v.Claim.ID)).Set("holds", jsondoc.Boolean(v.Holds)).Set("found", jsondoc.Str(v.Found)))
	}
	resp.Set("claims", cl)
	if export && o.Problem == nil && !o.MarginsPending {
		csv, js := Export(o)
		resp.Set("csv", jsondoc.Str(csv)).Set("json", jsondoc.Str(js))
	}
	return resp
}

// parseBlock reads a calculator block from its JSON text, or says why it
// cannot.
func parseBlock(id string, mode Mode, text string) (*Block, string) {
	bv, err := jsondoc.Parse([]byte(text))
	if err != nil {
		return nil, "the calculator's scenario block is not valid JSON: " + err.Error()
	}
	b, err := ParseBlock("", id, mode, bv)
	if err != nil {
		return nil, "the calculator's scenario block is invalid: " + trimInput(err)
	}
	return b, ""
}

// withoutLines clears the line numbers of a parsed document, which for a
// document passed as text are those of the text, not of the page.
func withoutLines(v *jsondoc.Value) *jsondoc.Value {
	if v == nil {
		return nil
	}
	v.Line = 0
	for _, x := range v.Items {
		withoutLines(x)
	}
	for _, f := range v.Fields {
		withoutLines(f.Value)
	}
	return v
}

func fatal(msg string) *jsondoc.Value {
	return jsondoc.NewObject().Set("state", jsondoc.Str("error")).Set("fatal", jsondoc.Boolean(true)).
		Set("error", jsondoc.NewObject().Set("message", jsondoc.Str(msg)).Set("field", jsondoc.Str("")))
}

func panicText(p any) string {
	switch x := p.(type) {
	case error:
		return x.Error()
	case string:
		return x
	}
	return "unexpected failure"
}

func str(v *jsondoc.Value) string {
	if v != nil && v.Kind == jsondoc.String {
		return v.Text
	}
	return ""
}

// trimInput drops the empty file name from an input error's text.
func trimInput(err error) string {
	var ie *input.Error
	if errors.As(err, &ie) {
		s := ""
		if ie.Field != "" {
			s = ie.Field + ": "
		}
		return s + ie.Msg
	}
	return err.Error()
}

// load reads a CSV table or a JSON scenario and merges it into doc: a table
// replaces the units; a scenario replaces every member it gives.
func load(doc, ld *jsondoc.Value) (*jsondoc.Value, *input.Error) {
	text := str(ld.Get("text"))
	name := str(ld.Get("name"))
	if name == "" {
		name = "table"
	}
	src, err := input.Read(name, strings.NewReader(text))
	if err != nil {
		var ie *input.Error
		if errors.As(err, &ie) {
			return nil, ie
		}
		return nil, &input.Error{File: name, Msg: err.Error()}
	}
	enc := input.Encode(src.Title, &src.Scenario)
	out := jsondoc.NewObject()
	isJSON := strings.HasPrefix(strings.TrimLeft(strings.TrimPrefix(text, "\uFEFF"), " \t\r\n"), "{")
	if doc != nil && doc.Kind == jsondoc.Object {
		for _, f := range doc.Fields {
			if f.Key == "units" {
				continue
			}
			if isJSON && src.Given[f.Key] {
				continue
			}
			if isJSON && f.Key == "title" && src.Title != "" {
				continue
			}
			out.Set(f.Key, f.Value)
		}
	}
	for _, f := range enc.Fields {
		switch {
		case f.Key == "units":
			out.Set("units", f.Value)
		case isJSON && (src.Given[f.Key] || (f.Key == "title" && src.Title != "")):
			out.Set(f.Key, f.Value)
		}
	}
	return out, nil
}

// stringNumbers returns a copy of v with every number written as a string,
// so that JavaScript keeps every digit.
func stringNumbers(v *jsondoc.Value) *jsondoc.Value {
	if v == nil {
		return nil
	}
	switch v.Kind {
	case jsondoc.Number:
		return jsondoc.Str(v.Text)
	case jsondoc.Array:
		a := jsondoc.NewArray()
		for _, x := range v.Items {
			a.Append(stringNumbers(x))
		}
		return a
	case jsondoc.Object:
		o := jsondoc.NewObject()
		for _, f := range v.Fields {
			o.Set(f.Key, stringNumbers(f.Value))
		}
		return o
	}
	c := *v
	return &c
}

// Export returns the CSV table of o's result (the seatsmith command's
// allot -format csv table, cells guarded against spreadsheet formulas) and
// a JSON document holding the scenario, the allotment and the comparison.
//
// For a sweep block the CSV table holds every method's seats at every
// house size (the seatsmith command's sweep -format csv table) and the JSON
// document the scenario, the sweep and the paradoxes found. Growth and
// admit blocks have no exports.
func Export(o *Outcome) (csv, js string) {
	if o.Sweep != nil {
		return exportSweep(o)
	}
	if o.Result == nil {
		return "", ""
	}
	var b bytes.Buffer
	if err := csvformat.WriteTable(&b, format.AllotmentData(o.Result, &o.Scenario, true)); err != nil {
		b.Reset()
	}
	v := jsondoc.NewObject().Set("version", jsondoc.Int(1)).Set("kind", jsondoc.Str("calculator-export"))
	v.Set("caution", jsondoc.Str(format.Caution))
	v.Set("scenario", input.Encode(o.Title, &o.Scenario))
	v.Set("allotment", format.AllotmentJSON(o.Title, o.Result))
	v.Set("comparison", format.ComparisonJSON(o.Title, o.Comparison))
	cl := jsondoc.NewArray()
	for _, vd := range o.Verdicts {
		cl.Append(jsondoc.NewObject().Set("id", jsondoc.Str(vd.Claim.ID)).Set("holds", jsondoc.Boolean(vd.Holds)).Set("found", jsondoc.Str(vd.Found)))
	}
	v.Set("claims", cl)
	return b.String(), string(jsondoc.MarshalIndent(v, "  "))
}

func exportSweep(o *Outcome) (csv, js string) {
	set := o.Sweep.Set
	var b bytes.Buffer
	if err := csvformat.WriteTable(&b, format.SweepData(set)); err != nil {
		b.Reset()
	}
	v := jsondoc.NewObject().Set("version", jsondoc.Int(1)).Set("kind", jsondoc.Str("sweep-export"))
	v.Set("caution", jsondoc.Str(format.Caution))
	v.Set("scenario", input.Encode(o.Title, &o.Scenario))
	v.Set("sweep", format.SweepJSON(o.Title, set))
	v.Set("paradoxes", format.ParadoxJSON(o.Title, set))
	v.Set("claims", verdictsDoc(o))
	return b.String(), string(jsondoc.MarshalIndent(v, "  "))
}

func verdictsDoc(o *Outcome) *jsondoc.Value {
	cl := jsondoc.NewArray()
	for _, vd := range o.Verdicts {
		cl.Append(jsondoc.NewObject().Set("id", jsondoc.Str(vd.Claim.ID)).Set("holds", jsondoc.Boolean(vd.Holds)).Set("found", jsondoc.Str(vd.Found)))
	}
	return cl
}
