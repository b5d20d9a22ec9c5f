package calc

import (
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
	. "seatsmith/engine/render"
)

// docText returns the text of a scalar member of doc, or "".
func docText(doc *jsondoc.Value, key string) string {
	x := doc.Get(key)
	if x == nil {
		return ""
	}
	switch x.Kind {
	case jsondoc.String, jsondoc.Number:
		return x.Text
	}
	return ""
}

// Editor lays out the controls for the scenario doc. live is false for a
// page rendered ahead of time: its controls are disabled until the engine
// has loaded in the browser.
func Editor(b *Block, doc *jsondoc.Value, live bool) *Node {
	return editorFor(b, doc, live, false)
}

// editorFor is Editor with a baseline pinned or not, which the pin
// buttons follow.
func editorFor(b *Block, doc *jsondoc.Value, live, pinned bool) *Node {
	if doc == nil {
		doc = b.Doc
	}
	id := func(s string) string { return b.ID + "-" + s }
	form := El("form", "class", "sc-editor", "data-part", "editor", "novalidate", "", "aria-label", "Scenario for "+title(b, doc))
	fs := El("fieldset", "class", "sc-controls", "data-role", "controls").SetIf(!live, "disabled", "")
	fs.Add(Wrap("legend", "Your numbers", "class", "sc-legend"))
	if !live {
		fs.Add(Wrap("p", "Not live: these results were computed when the page was built. The calculator becomes editable once its engine loads, which needs JavaScript and the page opened through a web server (from a file on disk, use the offline calculator file).", "class", "sc-static-note", "data-role", "static-note"))
	}
	if b.vary != nil {
		b.vary.controls(fs, b, doc, id)
	} else {
		calculatorControls(fs, b, doc, id, pinned)
	}
	fs.Add(El("p", "class", "sc-note", "data-role", "notice", "role", "status"))
	form.Add(fs)
	return form
}

func calculatorControls(fs *Node, b *Block, doc *jsondoc.Value, id func(string) string, pinned bool) {
	grid := El("div", "class", "sc-grid")
	grid.Add(numberField(id("seats"), "House size (seats)", "seats", docText(doc, "seats"), "1"))
	grid.Add(methodField(id("method"), docText(doc, "method")))
	grid.Add(numberField(id("min"), "Minimum seats per unit", "min", docText(doc, "min"), "0"))
	fs.Add(grid)
	fs.Add(advancedFields(b, doc, id))
	fs.Add(unitsTable(b, doc))
	fs.Add(unitActions())

	fs.Add(tableLoader(b, id))

	ex := El("div", "class", "sc-actions sc-export")
	ex.Add(Wrap("button", "Download results (CSV)", "type", "button", "data-action", "export-csv"))
	ex.Add(Wrap("button", "Download scenario and results (JSON)", "type", "button", "data-action", "export-json"))
	ex.Add(linkButton())
	fs.Add(ex)
	fs.Add(pinActions(pinned))
}

// tableLoader is where a reader pastes, drops or picks a table: cells
// copied from a spreadsheet, or a CSV file with commas or semicolons, in
// any columns; the column chooser shows in its slot before the table
// loads.
func tableLoader(b *Block, id func(string) string) *Node {
	c := b.Count
	csv := El("details", "class", "sc-csv", "data-role", "drop-zone")
	csv.Add(Wrap("summary", "Paste, drop or load a table"))
	hint := "Cells copied from a spreadsheet, or a CSV table (commas or semicolons): a column of names and a column of " + c.Nouns() +
		", optionally minimum and maximum seats. You choose which column is which before it replaces the units above. You can also drop a file here."
	csv.Add(Wrap("p", hint, "class", "sc-hint", "id", id("csv-hint")))
	cf := El("div", "class", "sc-field")
	cf.Add(Wrap("label", "Table", "for", id("csv")))
	cf.Add(El("textarea", "id", id("csv"), "data-field", "csv", "rows", "5", "spellcheck", "false", "aria-describedby", id("csv-hint"),
		"placeholder", "name\t"+c.Noun()+"\nNorth\t1,200\nSouth\t800"))
	csv.Add(cf)
	ca := El("div", "class", "sc-actions")
	ca.Add(Wrap("button", "Use this table", "type", "button", "data-action", "use-csv"))
	ca.Add(El("label", "class", "sc-file").AddText("Load a file (table or JSON scenario) ").
		Add(El("input", "type", "file", "accept", ".csv,.tsv,.txt,.json,text/csv,text/tab-separated-values,text/plain,application/json", "data-action", "load-file")))
	csv.Add(ca)
	csv.Add(El("div", "data-role", "chooser-slot"))
	return csv
}

// pinActions pin the results as a baseline that later edits are compared
// with, and unpin it.
func pinActions(pinned bool) *Node {
	p := El("div", "class", "sc-actions sc-pin", "data-role", "pin")
	if pinned {
		p.Add(Wrap("button", "Pin these numbers as the baseline instead", "type", "button", "data-action", "pin"))
		p.Add(Wrap("button", "Unpin the baseline", "type", "button", "data-action", "unpin"))
	} else {
		p.Add(Wrap("button", "Pin as baseline", "type", "button", "data-action", "pin", "title", "Keep these results and compare later edits with them"))
	}
	return p
}

// advancedFields are the options most scenarios leave alone: a cap, a
// threshold and the tie rule, folded away unless the scenario uses them.
func advancedFields(b *Block, doc *jsondoc.Value, id func(string) string) *Node {
	more := El("details", "class", "sc-more").SetIf(b.Mode == Full || hasAdvanced(doc), "open", "")
	more.Add(Wrap("summary", "Caps, threshold and ties"))
	mg := El("div", "class", "sc-grid")
	mg.Add(numberField(id("max"), "Maximum seats per unit (0: no cap)", "max", docText(doc, "max"), "0"))
	th := El("div", "class", "sc-field")
	th.Add(Wrap("label", "Threshold (share of the total, e.g. 5%)", "for", id("threshold")))
	th.Add(El("input", "id", id("threshold"), "type", "text", "data-field", "threshold", "value", docText(doc, "threshold"),
		"inputmode", "decimal", "autocomplete", "off", "spellcheck", "false", "placeholder", "none"))
	mg.Add(th)
	kind, seed := tieParts(docText(doc, "tie"))
	tf := El("div", "class", "sc-field")
	tf.Add(Wrap("label", "When units tie for the last seat", "for", id("tie-kind")))
	sel := El("select", "id", id("tie-kind"), "data-field", "tie-kind")
	for _, o := range [][2]string{{"none", "Report it, leave it open"}, {"order", "The unit listed first"}, {"lot", "Draw lots (seeded)"}} {
		sel.Add(Wrap("option", o[1], "value", o[0]).SetIf(o[0] == kind, "selected", ""))
	}
	tf.Add(sel)
	mg.Add(tf)
	sf := El("div", "class", "sc-field")
	sf.Add(Wrap("label", "Seed for drawing lots", "for", id("tie-seed")))
	sf.Add(El("input", "id", id("tie-seed"), "type", "text", "inputmode", "numeric", "data-field", "tie-seed", "value", seed, "autocomplete", "off"))
	mg.Add(sf)
	more.Add(mg)
	return more
}

func unitActions() *Node {
	acts := El("div", "class", "sc-actions")
	acts.Add(Wrap("button", "Add a unit", "type", "button", "data-action", "add-unit"))
	acts.Add(Wrap("button", "Back to the page's numbers", "type", "button", "data-action", "reset"))
	return acts
}

func linkButton() *Node {
	return Wrap("button", "Copy a link to these numbers", "type", "button", "data-action", "copy-link")
}

// sweepControls are a sweep block's: the range of house sizes, the methods
// and the units.
func sweepControls(fs *Node, b *Block, doc *jsondoc.Value, id func(string) string) {
	grid := El("div", "class", "sc-grid")
	grid.Add(numberField(id("from"), "From (house size)", "from", docText(doc, "from"), "1"))
	grid.Add(numberField(id("to"), "To (house size)", "to", docText(doc, "to"), "1"))
	grid.Add(numberField(id("min"), "Minimum seats per unit", "min", docText(doc, "min"), "0"))
	fs.Add(grid)
	fs.Add(Wrap("p", "A range covers at most "+strconv.Itoa(MaxSweepSizes)+" house sizes.", "class", "sc-hint"))
	chosen := map[string]bool{}
	if ms := doc.Get("methods"); ms != nil && ms.Kind == jsondoc.Array {
		for _, x := range ms.Items {
			if m, err := engine.ParseMethod(x.Text); err == nil && x.Kind == jsondoc.String {
				chosen[m.String()] = true
			}
		}
	} else {
		for _, m := range engine.Methods() {
			chosen[m.String()] = true
		}
	}
	mf := El("fieldset", "class", "sc-methods", "data-role", "methods")
	mf.Add(Wrap("legend", "Methods to sweep"))
	for _, group := range []struct {
		name    string
		divisor bool
	}{{"Largest remainder", false}, {"Divisor methods", true}} {
		gid := id("mg-" + strconv.FormatBool(group.divisor))
		checks := El("div", "class", "sc-checks", "role", "group", "aria-labelledby", gid)
		checks.Add(Wrap("span", group.name, "class", "sc-check-kind", "id", gid))
		for _, m := range engine.Methods() {
			if m.IsDivisor() != group.divisor {
				continue
			}
			box := El("input", "type", "checkbox", "id", id("m-"+m.String()), "data-field", "methods", "value", m.String()).SetIf(chosen[m.String()], "checked", "")
			checks.Add(El("label", "class", "sc-check", "for", id("m-"+m.String())).Add(box, Text(m.Name())))
		}
		mf.Add(checks)
	}
	fs.Add(mf)
	fs.Add(advancedFields(b, doc, id))
	units := El("details", "class", "sc-units-more")
	n := 0
	if us := doc.Get("units"); us != nil && us.Kind == jsondoc.Array {
		n = len(us.Items)
	}
	units.Add(Wrap("summary", "The units and their "+b.Count.Nouns()+" ("+strconv.Itoa(n)+")"))
	units.Add(unitsTable(b, doc), unitActions())
	fs.Add(units)
	ex := El("div", "class", "sc-actions sc-export")
	ex.Add(Wrap("button", "Download the sweep (CSV)", "type", "button", "data-action", "export-csv"))
	ex.Add(Wrap("button", "Download the sweep and findings (JSON)", "type", "button", "data-action", "export-json"))
	ex.Add(linkButton())
	fs.Add(ex)
}

// growthControls are a growth block's: house size, method and each unit's
// first and later population.
func growthControls(fs *Node, b *Block, doc *jsondoc.Value, id func(string) string) {
	grid := El("div", "class", "sc-grid")
	grid.Add(numberField(id("seats"), "House size (seats)", "seats", docText(doc, "seats"), "1"))
	grid.Add(methodField(id("method"), docText(doc, "method")))
	grid.Add(numberField(id("min"), "Minimum seats per unit", "min", docText(doc, "min"), "0"))
	fs.Add(grid)
	fs.Add(advancedFields(b, doc, id))
	fs.Add(editableUnits("sc-units sc-units-growth", "Units and their two counts. A blank later count keeps the first.", doc, []unitColumn{
		{"Name", "Name", "name", "text", "sc-in-name"},
		{"First count", "First count", "population", "decimal", "sc-in-pop num"},
		{"Later count", "Later count", "later", "decimal", "sc-in-pop num"},
	}))
	fs.Add(unitActions())
	fs.Add(El("div", "class", "sc-actions sc-export").Add(linkButton()))
}

// admitControls are an admit block's: house size, method, the unit
// admitted and the units already there.
func admitControls(fs *Node, b *Block, doc *jsondoc.Value, id func(string) string) {
	grid := El("div", "class", "sc-grid")
	grid.Add(numberField(id("seats"), "House size before (seats)", "seats", docText(doc, "seats"), "1"))
	grid.Add(methodField(id("method"), docText(doc, "method")))
	grid.Add(numberField(id("min"), "Minimum seats per unit", "min", docText(doc, "min"), "0"))
	fs.Add(grid)
	a := doc.Get("admit")
	af := El("fieldset", "class", "sc-admit-unit", "data-role", "admit-unit")
	af.Add(Wrap("legend", "The unit admitted"))
	ag := El("div", "class", "sc-grid")
	nf := El("div", "class", "sc-field")
	nf.Add(Wrap("label", "Its name", "for", id("admit-name")))
	nf.Add(El("input", "id", id("admit-name"), "type", "text", "data-field", "admit.name", "value", docText(a, "name"), "autocomplete", "off", "spellcheck", "false"))
	ag.Add(nf)
	pf := El("div", "class", "sc-field")
	pf.Add(Wrap("label", "Its "+b.Count.Noun(), "for", id("admit-population")))
	pf.Add(El("input", "id", id("admit-population"), "type", "text", "data-field", "admit.population", "value", docText(a, "population"),
		"inputmode", "decimal", "autocomplete", "off", "spellcheck", "false"))
	ag.Add(pf)
	added := numberField(id("admit-added"), "Seats added for it (blank: its fair share)", "admit.added", docText(a, "added"), "0")
	ag.Add(added)
	af.Add(ag)
	fs.Add(af)
	fs.Add(advancedFields(b, doc, id))
	fs.Add(unitsTable(b, doc))
	fs.Add(unitActions())
	fs.Add(El("div", "class", "sc-actions sc-export").Add(linkButton()))
}

func title(b *Block, doc *jsondoc.Value) string {
	if t := docText(doc, "title"); t != "" {
		return t
	}
	if t := docText(b.Doc, "title"); t != "" {
		return t
	}
	return "this calculator"
}

func hasAdvanced(doc *jsondoc.Value) bool {
	for _, k := range []string{"max", "threshold", "tie"} {
		if t := docText(doc, k); t != "" && t != "0" && t != "none" {
			return true
		}
	}
	return false
}

func tieParts(s string) (kind, seed string) {
	t := strings.ToLower(strings.TrimSpace(s))
	switch {
	case t == "order" || t == "input-order":
		return "order", ""
	case t == "lot":
		return "lot", "1"
	case strings.HasPrefix(t, "lot:"):
		return "lot", t[4:]
	}
	return "none", ""
}

func numberField(id, label, field, val, min string) *Node {
	f := El("div", "class", "sc-field")
	f.Add(Wrap("label", label, "for", id))
	f.Add(El("input", "id", id, "type", "number", "inputmode", "numeric", "min", min, "step", "1", "data-field", field, "value", val, "autocomplete", "off"))
	return f
}

func methodField(id, val string) *Node {
	cur, _ := engine.ParseMethod(val)
	f := El("div", "class", "sc-field")
	f.Add(Wrap("label", "Method", "for", id))
	sel := El("select", "id", id, "data-field", "method")
	lr := El("optgroup", "label", "Largest remainder")
	dv := El("optgroup", "label", "Divisor methods")
	for _, m := range engine.Methods() {
		o := Wrap("option", m.Name(), "value", m.String()).SetIf(m == cur, "selected", "")
		if m.IsDivisor() {
			dv.Add(o)
		} else {
			lr.Add(o)
		}
	}
	sel.Add(lr, dv)
	f.Add(sel)
	return f
}

func unitsTable(b *Block, doc *jsondoc.Value) *Node {
	return editableUnits("sc-units", "Units: names and "+b.Count.Nouns()+". A blank minimum or maximum uses the default above.", doc, []unitColumn{
		{"Name", "Name", "name", "text", "sc-in-name"},
		{b.Count.Head(), b.Count.Head(), "population", "decimal", "sc-in-pop num"},
		{"Min", "Minimum seats", "min", "numeric", "sc-in-bound num"},
		{"Max", "Maximum seats", "max", "numeric", "sc-in-bound num"},
	})
}

// A unitColumn is one column of inputs in a units table: its heading, the
// label of each of its inputs (with "of unit N" added), the unit's member
// it edits, the input mode and the input's class.
type unitColumn struct{ head, label, field, mode, class string }

// editableUnits lays out a units table of the given class and caption: a
// row a unit of doc, numbered, with an input for each column and a button
// that removes the unit.
func editableUnits(class, caption string, doc *jsondoc.Value, cols []unitColumn) *Node {
	wrap := El("div", "class", "sc-scroll", "role", "region", "tabindex", "0", "aria-label", "Units")
	t := El("table", "class", class)
	t.Add(Wrap("caption", caption))
	head := El("tr").Add(Wrap("th", "#", "scope", "col"))
	for _, c := range cols {
		head.Add(Wrap("th", c.head, "scope", "col"))
	}
	head.Add(El("th", "scope", "col").Add(Wrap("span", "Remove", "class", "sc-vh")))
	t.Add(El("thead").Add(head))
	body := El("tbody")
	if us := doc.Get("units"); us != nil && us.Kind == jsondoc.Array {
		for k, u := range us.Items {
			n := strconv.Itoa(k + 1)
			key := "units." + strconv.Itoa(k) + "."
			row := El("tr", "data-row", strconv.Itoa(k))
			row.Add(Wrap("td", n, "class", "num sc-idx"))
			for _, c := range cols {
				row.Add(El("td").Add(El("input", "type", "text", "class", c.class, "data-field", key+c.field, "value", docText(u, c.field),
					"aria-label", c.label+" of unit "+n, "inputmode", c.mode, "autocomplete", "off", "spellcheck", "false")))
			}
			row.Add(El("td").Add(Wrap("button", "×", "type", "button", "class", "sc-remove", "data-action", "remove-unit",
				"data-index", strconv.Itoa(k), "aria-label", "Remove unit "+n)))
			body.Add(row)
		}
	}
	t.Add(body)
	wrap.Add(Stackable(t))
	return wrap
}
