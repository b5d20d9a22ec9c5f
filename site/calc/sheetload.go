package calc

import (
	"strconv"

	"seatsmith/engine"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	. "seatsmith/engine/render"
)

// When a loaded table's columns are chosen by the reader rather than
// guessed (a Load's Choose).
const (
	// ChooseAlways shows the column chooser for every table (after a
	// paste).
	ChooseAlways = "always"
	// ChooseUnsure shows it when the guess is not certain: the table has
	// no header row, or a column the guess left unused (after a file is
	// loaded or dropped).
	ChooseUnsure = "unsure"
)

// sheetUnits reads a table people paste or drop (tab-, semicolon- or
// comma-separated, any header, thousands separators) with the columns the
// load names, or the guessed ones. When the load asks for the reader to
// choose and no columns are given, it returns the column chooser instead
// of units.
func sheetUnits(b *Block, name string, ld *Load) (units *jsondoc.Value, chooser *Node, err error) {
	if n := countLines(ld.Text); n > MaxUnits+1 {
		return nil, nil, tooManyUnits(name, 0, n-1)
	}
	sh, err := input.ReadSheet(ld.Text)
	if err != nil {
		return nil, nil, named(name, err)
	}
	promoteHeader(sh)
	cols := sh.GuessColumns()
	if ld.Columns != nil {
		cols = *ld.Columns
	} else if ld.Choose == ChooseAlways || ld.Choose == ChooseUnsure && !certain(sh, cols) {
		return nil, columnChooser(b, name, sh, cols), nil
	}
	us, err := sh.Units(cols)
	if err != nil {
		return nil, nil, named(name, err)
	}
	if len(us) > MaxUnits {
		return nil, nil, tooManyUnits(name, 0, len(us))
	}
	return input.Encode("", &engine.Scenario{Units: us}).Get("units"), nil, nil
}

// promoteHeader takes a first row without a single digit for the header
// when the sheet found none: a header over rows whose counts are all
// unreadable ("name,population" above "North,many") is still a header,
// and the errors then name the right line.
func promoteHeader(sh *input.Sheet) {
	if sh.Header != nil || len(sh.Rows) < 2 {
		return
	}
	for _, c := range sh.Rows[0] {
		for i := 0; i < len(c); i++ {
			if c[i] >= '0' && c[i] <= '9' {
				return
			}
		}
	}
	sh.Header, sh.Rows, sh.Lines = sh.Rows[0], sh.Rows[1:], sh.Lines[1:]
}

func countLines(s string) int {
	n := 0
	for i := 0; i < len(s); i++ {
		if s[i] == '\n' {
			n++
		}
	}
	return n
}

// named puts the file's name on a sheet's error.
func named(name string, err error) error {
	if ie, ok := err.(*input.Error); ok {
		e := *ie
		e.File = name
		return &e
	}
	return err
}

// certain reports whether a guess needs no confirming: the table names its
// columns and the guess uses every one.
func certain(sh *input.Sheet, c input.Columns) bool {
	if sh.Header == nil || c.Name < 0 || c.Count < 0 {
		return false
	}
	used := 0
	for _, j := range []int{c.Name, c.Count, c.Min, c.Max} {
		if j >= 0 {
			used++
		}
	}
	return used == len(sh.Header)
}

// sepNames name a sheet's separators.
var sepNames = map[byte]string{'\t': "tabs", ';': "semicolons", ',': "commas"}

// columnChooser asks which column is the name, the count, the minimum and
// the maximum, with the guess chosen, above the table's first rows.
func columnChooser(b *Block, name string, sh *input.Sheet, guess input.Columns) *Node {
	id := func(s string) string { return b.ID + "-col-" + s }
	c := b.Count
	box := El("div", "class", "sc-chooser", "data-role", "chooser", "role", "group", "aria-labelledby", id("head"))
	width := len(sh.Rows[0])
	intro := "Found " + plural(len(sh.Rows), "row") + " in " + strconv.Itoa(width) + " columns separated by " + sepNames[sh.Sep]
	if sh.Header != nil {
		intro += ", the first row naming them"
	}
	box.Add(El("p", "id", id("head")).Add(Wrap("strong", "Which column is which? "), Text(intro+". Check the choice, then load.")))
	label := func(j int) string {
		l := "Column " + strconv.Itoa(j+1)
		if sh.Header != nil && sh.Header[j] != "" {
			l += ": " + sh.Header[j]
		} else if v := sh.Rows[0][j]; v != "" {
			l += " (" + v + ", …)"
		}
		return l
	}
	grid := El("div", "class", "sc-grid")
	for _, f := range []struct {
		key, text string
		chosen    int
		optional  bool
	}{
		{"name", "Name", guess.Name, false},
		{"count", c.Head(), guess.Count, false},
		{"min", "Minimum seats", guess.Min, true},
		{"max", "Maximum seats", guess.Max, true},
	} {
		fd := El("div", "class", "sc-field")
		fd.Add(Wrap("label", f.text, "for", id(f.key)))
		sel := El("select", "id", id(f.key), "data-column", f.key)
		if f.optional {
			sel.Add(Wrap("option", "None", "value", "-1").SetIf(f.chosen < 0, "selected", ""))
		}
		for j := 0; j < width; j++ {
			sel.Add(Wrap("option", label(j), "value", strconv.Itoa(j)).SetIf(j == f.chosen, "selected", ""))
		}
		fd.Add(sel)
		grid.Add(fd)
	}
	box.Add(grid)
	// The columns share the width, so that the first rows fit a phone.
	t := El("table", "class", "sc-sheet")
	t.Add(Wrap("caption", "The first rows of "+name))
	head := El("tr", "data-role", "sheet-head")
	for j := 0; j < width; j++ {
		head.Add(Wrap("th", label(j), "scope", "col"))
	}
	t.Add(El("thead").Add(head))
	body := El("tbody")
	for i, r := range sh.Rows {
		if i == 3 {
			break
		}
		tr := El("tr")
		for _, v := range r {
			tr.Add(Wrap("td", v))
		}
		body.Add(tr)
	}
	t.Add(body)
	box.Add(t)
	acts := El("div", "class", "sc-actions")
	acts.Add(Wrap("button", "Load these columns", "type", "button", "data-action", "use-columns"))
	acts.Add(Wrap("button", "Cancel", "type", "button", "data-action", "cancel-columns"))
	box.Add(acts)
	return box
}
