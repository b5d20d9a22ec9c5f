package calc

import (
	"bytes"
	"errors"
	"strconv"
	"strings"

	"seatsmith/engine/format"
	csvformat "seatsmith/engine/format/csv"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	. "seatsmith/engine/render"
)

// parseBlock reads a calculator block from its JSON text, or says why it
// cannot.
func parseBlock(id string, mode Mode, text string) (*Block, string) {
	bv, err := parseJSON(text)
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

// load reads a table or a JSON scenario and merges it into doc: a table
// replaces the units; a scenario replaces every member it gives. A table
// is read as people paste or drop it (see [sheetUnits]); when its columns
// are to be chosen first, load returns the chooser and doc unchanged.
func load(b *Block, doc *jsondoc.Value, ld *Load) (*jsondoc.Value, *Node, *input.Error) {
	text, name := ld.Text, ld.Name
	if name == "" {
		name = "table"
	}
	if len(text) > MaxLoadBytes {
		return nil, nil, &input.Error{File: name, Msg: "the file of " + strconv.Itoa(len(text)) + " bytes is larger than the limit of " +
			strconv.Itoa(MaxLoadBytes>>20) + " MiB a calculator loads"}
	}
	asError := func(err error) *input.Error {
		var ie *input.Error
		if errors.As(err, &ie) {
			return ie
		}
		return &input.Error{File: name, Msg: err.Error()}
	}
	isJSON := strings.HasPrefix(strings.TrimLeft(strings.TrimPrefix(text, "\uFEFF"), " \t\r\n"), "{")
	var units *jsondoc.Value
	var src *input.Source
	if isJSON {
		var err error
		if src, err = readLoad(name, text); err != nil {
			return nil, nil, asError(err)
		}
		units = input.Encode(src.Title, &src.Scenario).Get("units")
	} else {
		var chooser *Node
		var err error
		if units, chooser, err = sheetUnits(b, name, ld); err != nil {
			return nil, nil, asError(b.Count.speakErr(err))
		}
		if chooser != nil {
			return doc, chooser, nil
		}
	}
	out := jsondoc.NewObject()
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
	if isJSON {
		for _, f := range input.Encode(src.Title, &src.Scenario).Fields {
			if f.Key != "units" && (src.Given[f.Key] || (f.Key == "title" && src.Title != "")) {
				out.Set(f.Key, f.Value)
			}
		}
	}
	out.Set("units", units)
	return out, nil, nil
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
	if vm := o.Block.vary; vm != nil {
		if vm.export == nil || o.Problem != nil {
			return "", ""
		}
		return vm.export(o)
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
	v.Set("claims", verdictsDoc(o.Verdicts))
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
	v.Set("claims", verdictsDoc(o.Verdicts))
	return b.String(), string(jsondoc.MarshalIndent(v, "  "))
}

// readLoad reads a loaded scenario file, refusing one beyond the block's
// limits before it builds the units: more than MaxValues values or
// MaxUnits units.
func readLoad(name, text string) (*input.Source, error) {
	v, err := parseJSON(strings.TrimPrefix(text, "\uFEFF"))
	if err != nil {
		var se *jsondoc.SyntaxError
		if errors.As(err, &se) {
			return nil, &input.Error{File: name, Line: se.Line, Msg: "column " + strconv.Itoa(se.Col) + ": " + se.Msg}
		}
		return nil, err
	}
	if err := precheckUnits(name, v); err != nil {
		return nil, err
	}
	return input.FromDoc(name, v)
}
