package calc

import (
	"strconv"
	"time"

	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	"seatsmith/engine/render"
	"seatsmith/site/claim"
)

// A Request is what a page asks of a calculator block after a reader's
// edit: the block as the page holds it, the scenario being edited, and how
// much of the answer to lay out. [DecodeRequest] reads one from its JSON
// form, whose members are named in the field comments.
type Request struct {
	// BlockText is the block's JSON text, as on the page (block_text,
	// required).
	BlockText string
	// ID is the calculator's id (id; "calc" when not given).
	ID string
	// Mode is the kind of block (mode: "compact", "full", "sweep",
	// "growth" or "admit"; compact when not given).
	Mode Mode
	// Scenario is the scenario being edited, a scenario document; nil
	// means the block's own. Its JSON form is scenario (a document) or
	// scenario_text (the same as JSON text, which crosses from JavaScript
	// into the engine much faster than an object read member by member;
	// the bridge sends this).
	Scenario *jsondoc.Value
	// Load is a table (which replaces the units) or a JSON scenario
	// document (which replaces the scenario) to read first (load: {name,
	// text, columns, choose}).
	Load *Load
	// Baseline is the pinned baseline the scenario is compared with, a
	// scenario document (baseline_text: as JSON text); nil when none is
	// pinned. Only compact and full calculators compare.
	Baseline *jsondoc.Value
	// Link is a link's payload (link), as [EncodeLink] writes it: when
	// given, the scenario and the baseline it holds replace Scenario and
	// Baseline.
	Link string
	// Editor asks for the editor's layout as well as the results (editor).
	Editor bool
	// Export asks for the CSV and JSON exports (export).
	Export bool
	// Timings asks for the time spent computing and laying out (timings),
	// for measuring speed.
	Timings bool
	// Options say what the answer may leave out while the reader edits:
	// margins: false sets QuickMargins, order: false sets NoOrder (which
	// an export overrides).
	Options
}

// A Load is a table or a scenario file the reader loads into a calculator.
//
// A table is read as people paste or drop it: tab-, semicolon- or
// comma-separated, with any header, thousands separators and a decimal
// comma where unambiguous (see input.ReadSheet). Its columns are those
// given (columns: {name, count, min, max}, -1 for none), or guessed; when
// choose asks for it and no columns are given, the response holds the
// column chooser instead of loading.
type Load struct {
	Name string // the file's name, for messages ("table" when empty)
	Text string
	// Columns are the columns the reader chose, or nil.
	Columns *input.Columns
	// Choose is ChooseAlways, ChooseUnsure or "" (load the guess).
	Choose string
}

// A Response is the calculator's answer to a [Request]. [Response.Doc]
// gives its JSON form, whose members are named in the field comments.
type Response struct {
	// Fatal is set when the block itself cannot be read (or the request
	// is malformed): the answer then holds only State "error" and Problem
	// (fatal: true).
	Fatal bool
	// Outcome is the scenario apportioned, compared and checked; its
	// Problem (error: {message, field}, or null) says why it could not
	// be, and its State is the answer's state ("live" or "error").
	Outcome *Outcome
	// Problem is the fatal error's message, when Fatal.
	Problem *Problem
	// Scenario is the scenario the answer is for, every number written as
	// a string so that JavaScript keeps every digit (scenario).
	Scenario *jsondoc.Value
	// Output and Editor are the results' and the editor's layouts (output,
	// editor; the editor only when asked for).
	Output, Editor *render.Node
	// LoadError says why Load could not be read (load_error: {message,
	// line, field}).
	LoadError *input.Error
	// Chooser is the column chooser of a loaded table whose columns the
	// reader is to choose (chooser); the table is then not loaded yet.
	Chooser *render.Node
	// Baseline is the pinned baseline in effect (baseline), every number a
	// string; nil when none is.
	Baseline *jsondoc.Value
	// Link is the payload of a link to the scenario and the baseline
	// (link), for compact and full calculators and study blocks.
	Link string
	// LinkError says why Request.Link could not be read (link_error); the
	// answer is then for the scenario without it.
	LinkError string
	// Exports are the CSV table and the JSON document of the results
	// (csv, json), when asked for and the scenario is valid.
	Exports *Exports
	// Timings are filled when asked for (timings: {compute_ms,
	// layout_ms}).
	Timings *Timings
}

// Exports are a calculator's downloads.
type Exports struct{ CSV, JSON string }

// Timings say how long an answer took: apportioning, comparing and
// checking claims (Compute), and laying the results out (Layout).
type Timings struct{ Compute, Layout time.Duration }

// requestTable is the field table of a request's JSON form.
func requestTable(r *Request) []jsondoc.Member {
	var mode, scenarioText string
	return []jsondoc.Member{
		{Key: "block_text", Read: jsondoc.ReadString(&r.BlockText)},
		{Key: "id", Read: jsondoc.ReadString(&r.ID)},
		{Key: "mode", Read: func(v *jsondoc.Value) error {
			if err := jsondoc.ReadString(&mode)(v); err != nil {
				return err
			}
			m, ok := ParseMode(mode)
			if !ok {
				return &jsondoc.MemberError{Line: v.Line, Msg: strconv.Quote(mode) + " is not a mode; use compact, full, sweep, growth or admit"}
			}
			r.Mode = m
			return nil
		}},
		{Key: "scenario", Read: func(v *jsondoc.Value) error {
			if r.Scenario == nil {
				r.Scenario = v
			}
			return nil
		}},
		{Key: "scenario_text", Read: func(v *jsondoc.Value) error {
			if err := jsondoc.ReadString(&scenarioText)(v); err != nil {
				return err
			}
			doc, err := parseJSON(scenarioText)
			if err != nil {
				return &jsondoc.MemberError{Line: v.Line, Msg: "not valid JSON: " + err.Error()}
			}
			// The lines are those of the text, not of the page.
			r.Scenario = withoutLines(doc)
			return nil
		}},
		{Key: "load", Read: func(v *jsondoc.Value) error {
			l := &Load{}
			r.Load = l
			return jsondoc.Decode(v, "a load", []jsondoc.Member{
				{Key: "name", Read: jsondoc.ReadString(&l.Name)},
				{Key: "text", Read: jsondoc.ReadString(&l.Text)},
				{Key: "choose", Read: func(v *jsondoc.Value) error {
					if err := jsondoc.ReadString(&l.Choose)(v); err != nil {
						return err
					}
					if l.Choose != "" && l.Choose != ChooseAlways && l.Choose != ChooseUnsure {
						return &jsondoc.MemberError{Line: v.Line, Msg: strconv.Quote(l.Choose) + " is not a choice; use always or unsure"}
					}
					return nil
				}},
				{Key: "columns", Read: func(v *jsondoc.Value) error {
					c := &input.Columns{Name: -1, Count: -1, Min: -1, Max: -1}
					l.Columns = c
					return jsondoc.Decode(v, "the columns", []jsondoc.Member{
						{Key: "name", Read: jsondoc.ReadInt(&c.Name, -1, 999)},
						{Key: "count", Read: jsondoc.ReadInt(&c.Count, -1, 999)},
						{Key: "min", Read: jsondoc.ReadInt(&c.Min, -1, 999)},
						{Key: "max", Read: jsondoc.ReadInt(&c.Max, -1, 999)},
					})
				}},
			})
		}},
		{Key: "baseline_text", Read: func(v *jsondoc.Value) error {
			var text string
			if err := jsondoc.ReadString(&text)(v); err != nil {
				return err
			}
			if text == "" || text == "null" {
				return nil
			}
			doc, err := parseJSON(text)
			if err != nil {
				return &jsondoc.MemberError{Line: v.Line, Msg: "not valid JSON: " + err.Error()}
			}
			if doc.Kind != jsondoc.Object {
				return &jsondoc.MemberError{Line: v.Line, Msg: "not a scenario document"}
			}
			r.Baseline = withoutLines(doc)
			return nil
		}},
		{Key: "link", Read: jsondoc.ReadString(&r.Link)},
		{Key: "editor", Read: jsondoc.ReadBool(&r.Editor)},
		{Key: "export", Read: jsondoc.ReadBool(&r.Export)},
		{Key: "timings", Read: jsondoc.ReadBool(&r.Timings)},
		{Key: "margins", Read: notFlag(&r.QuickMargins)},
		{Key: "order", Read: notFlag(&r.NoOrder)},
	}
}

// notFlag reads a boolean member into dst negated: margins: false sets
// QuickMargins.
func notFlag(dst *bool) func(*jsondoc.Value) error {
	return func(v *jsondoc.Value) error {
		var b bool
		if err := jsondoc.ReadBool(&b)(v); err != nil {
			return err
		}
		*dst = !b
		return nil
	}
}

// DecodeRequest reads a request from its JSON form (see [Request]). An
// unknown member or a member of the wrong type is a *jsondoc.MemberError
// naming it.
func DecodeRequest(v *jsondoc.Value) (*Request, error) {
	r := &Request{}
	if err := jsondoc.Decode(v, "a calculator request", requestTable(r)); err != nil {
		return nil, err
	}
	if r.BlockText == "" {
		return nil, &jsondoc.MemberError{Path: "block_text", Msg: "missing: give the calculator block's JSON text"}
	}
	return r, nil
}

// Answer answers one request and never panics: a block that cannot be
// read, or a fault of the engine, gives a fatal response.
func Answer(req *Request) (resp *Response) {
	defer func() {
		if p := recover(); p != nil {
			resp = fatalResponse("internal error: " + panicText(p))
		}
	}()
	id := req.ID
	if id == "" {
		id = "calc"
	}
	b, msg := blocks.get(id, req.Mode, req.BlockText)
	if b == nil {
		return fatalResponse(msg)
	}
	resp = &Response{}
	doc, base := req.Scenario, req.Baseline
	if req.Link != "" {
		lb, ls, err := DecodeLink(b.Doc, req.Link)
		if err != nil {
			resp.LinkError = err.Error()
		} else {
			doc, base = ls, lb
		}
	}
	if doc.IsNull() {
		doc = b.Doc
	}
	if req.Load != nil {
		nd, chooser, lerr := load(b, doc, req.Load)
		if lerr != nil {
			resp.LoadError = lerr
		} else {
			doc, resp.Chooser = nd, chooser
		}
	}
	doc = stringNumbers(doc)
	if b.vary != nil {
		base = nil
	}
	if !base.IsNull() {
		base = stringNumbers(base)
		resp.Baseline = base
	}
	resp.Link = EncodeLink(b.Doc, base, doc)
	opt := req.Options
	if req.Export {
		opt.NoOrder = false
	}
	started := time.Now()
	o := RunWith(b, doc, opt)
	computed := time.Now()
	resp.Outcome, resp.Scenario = o, doc
	resp.Output = Output(o)
	if base != nil && o.Problem == nil && o.Result != nil {
		// The comparison follows the summary and any tie.
		resp.Output.Kids = append(resp.Output.Kids[:1], append([]*render.Node{baselineView(o, base)}, resp.Output.Kids[1:]...)...)
	}
	if req.Timings {
		resp.Timings = &Timings{Compute: computed.Sub(started), Layout: time.Since(computed)}
	}
	if req.Editor {
		resp.Editor = editorFor(b, doc, true, base != nil)
	}
	if req.Export && o.Problem == nil && !o.MarginsPending {
		csv, js := Export(o)
		resp.Exports = &Exports{CSV: csv, JSON: js}
	}
	return resp
}

func fatalResponse(msg string) *Response {
	return &Response{Fatal: true, Problem: &Problem{Msg: msg}}
}

// Doc is the response's JSON form: an object with the members named in
// [Response]'s field comments, plus state ("live" or "error"), claims
// ([{id, holds, found}]) and what was left out: margins_pending (the
// margins were left out), margins_auto (they are quick enough to fill in
// without being asked) and order_pending (a full calculator's seat order
// was left out).
func (r *Response) Doc() *jsondoc.Value {
	if r.Fatal {
		return jsondoc.NewObject().Set("state", jsondoc.Str("error")).Set("fatal", jsondoc.Boolean(true)).
			Set("error", problemDoc(r.Problem))
	}
	o := r.Outcome
	v := jsondoc.NewObject()
	if le := r.LoadError; le != nil {
		v.Set("load_error", jsondoc.NewObject().Set("message", jsondoc.Str(le.Msg)).Set("line", jsondoc.Int(le.Line)).Set("field", jsondoc.Str(le.Field)))
	}
	if r.Chooser != nil {
		v.Set("chooser", render.JSON(r.Chooser))
	}
	if r.Baseline != nil {
		v.Set("baseline", r.Baseline)
	}
	if r.Link != "" {
		v.Set("link", jsondoc.Str(r.Link))
	}
	if r.LinkError != "" {
		v.Set("link_error", jsondoc.Str(r.LinkError))
	}
	v.Set("margins_pending", jsondoc.Boolean(o.MarginsPending))
	v.Set("order_pending", jsondoc.Boolean(o.OrderPending))
	v.Set("margins_auto", jsondoc.Boolean(o.MarginsAuto()))
	v.Set("state", jsondoc.Str(o.State()))
	v.Set("error", problemDoc(o.Problem))
	v.Set("scenario", r.Scenario)
	v.Set("output", render.JSON(r.Output))
	if t := r.Timings; t != nil {
		ms := func(d time.Duration) *jsondoc.Value {
			return jsondoc.Num(strconv.FormatFloat(d.Seconds()*1000, 'f', 3, 64))
		}
		v.Set("timings", jsondoc.NewObject().Set("compute_ms", ms(t.Compute)).Set("layout_ms", ms(t.Layout)))
	}
	if r.Editor != nil {
		v.Set("editor", render.JSON(r.Editor))
	}
	v.Set("claims", verdictsDoc(o.Verdicts))
	if x := r.Exports; x != nil {
		v.Set("csv", jsondoc.Str(x.CSV)).Set("json", jsondoc.Str(x.JSON))
	}
	return v
}

// problemDoc is {message, field}, or null for no problem.
func problemDoc(p *Problem) *jsondoc.Value {
	if p == nil {
		return jsondoc.NullValue()
	}
	return jsondoc.NewObject().Set("message", jsondoc.Str(p.Msg)).Set("field", jsondoc.Str(p.Field))
}

// verdictsDoc is [{id, holds, found}].
func verdictsDoc(vs []claim.Verdict) *jsondoc.Value {
	cl := jsondoc.NewArray()
	for _, vd := range vs {
		cl.Append(jsondoc.NewObject().Set("id", jsondoc.Str(vd.Claim.ID)).Set("holds", jsondoc.Boolean(vd.Holds)).Set("found", jsondoc.Str(vd.Found)))
	}
	return cl
}
