package input

import (
	"strconv"
	"strings"
	"unicode/utf16"
	"unicode/utf8"

	"seatsmith/engine"
)

// A Sheet is a table as people paste or drop it: cells copied from a
// spreadsheet (separated by tabs), or a CSV file separated by commas or
// semicolons, quoted or not, with or without a header row. ReadSheet finds
// the separator and the header; GuessColumns says which column is which;
// Units reads the units with the columns the reader confirmed.
type Sheet struct {
	// Sep is the separator found: '\t', ';' or ','.
	Sep byte
	// Header holds the header row's cells, or nil when the first row is
	// already data.
	Header []string
	// Rows holds the data rows, each as wide as the widest row (short rows
	// are padded with empty cells). Rows with no text at all are dropped.
	Rows [][]string
	// Lines holds the line on which each data row starts (1-based).
	Lines []int
}

// Columns says which column of a sheet holds each field of a unit: the
// name, the count (population, votes, students, ...), and the optional
// per-unit minimum and maximum. A column is an index into the rows; -1
// means the sheet has no such column.
type Columns struct {
	Name, Count, Min, Max int
}

// MaxSheetText is the longest text ReadSheet accepts, in bytes.
const MaxSheetText = 64 << 20

// ReadSheet splits text into a sheet. A byte-order mark (UTF-8 or UTF-16)
// is honoured; the separator is the one of tab, semicolon and comma that
// splits the most rows into the same number of cells (two at least), in
// that order of preference when several do equally well. The first row is a
// header when some column is a number in most later rows but not in the
// first. Errors name the line.
func ReadSheet(text string) (*Sheet, error) {
	if len(text) > MaxSheetText {
		return nil, &Error{Msg: "the table is longer than " + strconv.Itoa(MaxSheetText>>20) + " MiB"}
	}
	text = decodeText(text)
	if !utf8.ValidString(text) {
		return nil, &Error{Msg: "the table is not text in UTF-8 or UTF-16"}
	}
	if strings.IndexByte(text, 0) >= 0 {
		return nil, &Error{Line: lineOf(text, strings.IndexByte(text, 0)), Msg: "the table holds a NUL character; it is not a text table"}
	}
	var best *splitRows
	for _, sep := range []byte{'\t', ';', ','} {
		rows, err := splitSheet(text, sep)
		if err != nil {
			if best == nil && sep == ',' {
				return nil, err
			}
			continue
		}
		if rows.width() < 2 {
			continue
		}
		if best == nil || rows.agreeing() > best.agreeing() {
			best = rows
		}
	}
	if best == nil {
		return nil, &Error{Line: 1, Msg: "found no columns: separate the name and the count by a tab, a comma or a semicolon, one unit a line"}
	}
	s := &Sheet{Sep: best.sep}
	w := best.width()
	for i, r := range best.cells {
		for len(r) < w {
			r = append(r, "")
		}
		s.Rows = append(s.Rows, r)
		s.Lines = append(s.Lines, best.lines[i])
	}
	if len(s.Rows) > 0 && looksLikeHeader(s.Rows) {
		s.Header = s.Rows[0]
		s.Rows, s.Lines = s.Rows[1:], s.Lines[1:]
	}
	if len(s.Rows) == 0 {
		return nil, &Error{Line: 1, Msg: "no rows: the table has no unit"}
	}
	return s, nil
}

// decodeText drops a UTF-8 byte-order mark and decodes UTF-16 text that
// starts with its byte-order mark.
func decodeText(text string) string {
	switch {
	case strings.HasPrefix(text, "\uFEFF"):
		return text[len("\uFEFF"):]
	case len(text) >= 2 && (text[0] == 0xFF && text[1] == 0xFE || text[0] == 0xFE && text[1] == 0xFF):
		little := text[0] == 0xFF
		b := text[2:]
		u := make([]uint16, len(b)/2)
		for i := range u {
			if little {
				u[i] = uint16(b[2*i]) | uint16(b[2*i+1])<<8
			} else {
				u[i] = uint16(b[2*i])<<8 | uint16(b[2*i+1])
			}
		}
		return string(utf16.Decode(u))
	}
	return text
}

// lineOf returns the line holding byte offset off of text.
func lineOf(text string, off int) int {
	return strings.Count(text[:off], "\n") + 1
}

// splitRows is a text split by one separator.
type splitRows struct {
	sep   byte
	cells [][]string
	lines []int
}

// width is the most common number of cells in a row.
func (r *splitRows) width() int {
	count := map[int]int{}
	w, most := 0, 0
	for _, c := range r.cells {
		count[len(c)]++
		if n := count[len(c)]; n > most || n == most && len(c) > w {
			w, most = len(c), n
		}
	}
	return w
}

// agreeing counts the rows that have the most common number of cells.
func (r *splitRows) agreeing() int {
	w, n := r.width(), 0
	for _, c := range r.cells {
		if len(c) == w {
			n++
		}
	}
	return n
}

// splitSheet splits text into rows of cells at sep. Cells may be quoted
// with double quotes (holding separators, line breaks and doubled quotes);
// a quote inside an unquoted cell is kept as text. Rows without any text
// are dropped.
func splitSheet(text string, sep byte) (*splitRows, error) {
	r := &splitRows{sep: sep}
	line := 1
	var row []string
	var cell strings.Builder
	start := 1
	empty := true
	endRow := func() {
		row = append(row, cell.String())
		cell.Reset()
		if !empty {
			r.cells = append(r.cells, row)
			r.lines = append(r.lines, start)
		}
		row, empty = nil, true
	}
	for i := 0; i < len(text); {
		c := text[i]
		switch {
		case c == '"' && strings.TrimSpace(cell.String()) == "":
			// A quoted cell: up to the closing quote.
			cell.Reset()
			qline := line
			i++
			for {
				if i >= len(text) {
					return nil, &Error{Line: qline, Msg: "a quoted cell is never closed"}
				}
				if text[i] == '"' {
					if i+1 < len(text) && text[i+1] == '"' {
						cell.WriteByte('"')
						i += 2
						continue
					}
					i++
					break
				}
				if text[i] == '\n' {
					line++
				}
				cell.WriteByte(text[i])
				i++
			}
			empty = false
			// Spaces after the closing quote are ignored; anything else
			// is kept as text.
			for i < len(text) && text[i] == ' ' {
				i++
			}
		case c == sep:
			row = append(row, cell.String())
			cell.Reset()
			i++
		case c == '\r' && i+1 < len(text) && text[i+1] == '\n':
			i++
		case c == '\n' || c == '\r':
			endRow()
			line++
			start = line
			i++
		default:
			if c != ' ' && c != '\t' {
				empty = false
			}
			cell.WriteByte(c)
			i++
		}
	}
	endRow()
	for _, row := range r.cells {
		for j := range row {
			row[j] = strings.TrimSpace(row[j])
		}
	}
	return r, nil
}

// looksLikeHeader reports whether the first row names the columns: some
// column holds a number in most later rows but not in the first.
func looksLikeHeader(rows [][]string) bool {
	if len(rows) < 2 {
		// A single row is data if it has a number, a header otherwise.
		for _, c := range rows[0] {
			if isNumberLike(c) {
				return false
			}
		}
		return true
	}
	for j := range rows[0] {
		if isNumberLike(rows[0][j]) {
			continue
		}
		n := 0
		for _, r := range rows[1:] {
			if isNumberLike(r[j]) {
				n++
			}
		}
		if n > 0 && 2*n >= len(rows)-1 {
			return true
		}
	}
	return false
}

// isNumberLike reports whether a cell reads as a number in some style:
// digits with at most a sign and grouping and decimal marks.
func isNumberLike(c string) bool {
	c = strings.TrimSpace(c)
	if c != "" && (c[0] == '+' || c[0] == '-') {
		c = c[1:]
	}
	digits := 0
	for _, r := range c {
		switch {
		case r >= '0' && r <= '9':
			digits++
		case r == '.' || r == ',' || r == '\'' || r == ' ' || r == '\u00a0' || r == '\u202f':
		default:
			return false
		}
	}
	return digits > 0
}

// Words the header of a column may use for each field, compared without
// case, spaces or punctuation. The count's words cover what is apportioned
// in practice: people, votes, pupils, requests.
var (
	nameWords  = []string{"name", "unit", "state", "district", "party", "list", "school", "region", "province", "county", "constituency", "member", "place", "area", "division", "department", "group", "team"}
	countWords = []string{"population", "pop", "count", "votes", "vote", "students", "pupils", "enrolment", "enrollment", "applications", "requests", "people", "persons", "inhabitants", "residents", "members", "total", "size", "weight", "number"}
	minWords   = []string{"min", "minimum", "floor", "least", "minseats"}
	maxWords   = []string{"max", "maximum", "cap", "most", "maxseats"}
)

// GuessColumns returns the sheet's most likely columns: by header words
// where the header has them, otherwise the first column that is mostly
// text for the name and the first column that is mostly numbers for the
// count. Min and max are guessed only from the header.
func (s *Sheet) GuessColumns() Columns {
	c := Columns{Name: -1, Count: -1, Min: -1, Max: -1}
	taken := map[int]bool{}
	if s.Header != nil {
		for _, f := range []struct {
			dst   *int
			words []string
		}{{&c.Min, minWords}, {&c.Max, maxWords}, {&c.Name, nameWords}, {&c.Count, countWords}} {
			for j, h := range s.Header {
				if !taken[j] && headerMatches(h, f.words) {
					*f.dst = j
					taken[j] = true
					break
				}
			}
		}
	}
	numeric := make([]bool, len(s.Rows[0]))
	for j := range numeric {
		n := 0
		for _, r := range s.Rows {
			if isNumberLike(r[j]) {
				n++
			}
		}
		numeric[j] = 2*n >= len(s.Rows)
	}
	if c.Count < 0 {
		for j := range numeric {
			if numeric[j] && !taken[j] {
				c.Count = j
				taken[j] = true
				break
			}
		}
	}
	if c.Name < 0 {
		for j := range numeric {
			if !numeric[j] && !taken[j] {
				c.Name = j
				taken[j] = true
				break
			}
		}
	}
	return c
}

// headerMatches reports whether header h is one of words, ignoring case,
// spaces, punctuation and a trailing plural s.
func headerMatches(h string, words []string) bool {
	var b strings.Builder
	for _, r := range strings.ToLower(h) {
		if r >= 'a' && r <= 'z' || r >= '0' && r <= '9' {
			b.WriteRune(r)
		}
	}
	k := b.String()
	for _, w := range words {
		if k == w || k == w+"s" {
			return true
		}
	}
	return false
}

// Units reads the sheet's units with the columns c; c.Name and c.Count are
// required. Counts may use thousands separators (comma, point, space,
// apostrophe) and a decimal comma where the sheet as a whole leaves no
// doubt which is which: 1,234,567 and 1.234.567 and 12,5 and 1 234,5 read
// at once; a sheet whose every count is like 1,234 is refused, since that
// could be 1234 or 1.234. Errors name the line and the column.
func (s *Sheet) Units(c Columns) ([]engine.Unit, error) {
	width := len(s.Rows[0])
	for _, f := range []struct {
		name string
		col  int
		need bool
	}{{"name", c.Name, true}, {"count", c.Count, true}, {"min", c.Min, false}, {"max", c.Max, false}} {
		if f.col < 0 && f.need {
			return nil, &Error{Field: f.name, Msg: "choose the column that holds the " + f.name}
		}
		if f.col >= width {
			return nil, &Error{Field: f.name, Msg: "the table has no column " + strconv.Itoa(f.col+1)}
		}
	}
	var cells []string
	for _, col := range []int{c.Count, c.Min, c.Max} {
		if col < 0 {
			continue
		}
		for _, r := range s.Rows {
			cells = append(cells, r[col])
		}
	}
	style := numberStyleOf(cells)
	if len(s.Rows) > engine.MaxUnits {
		return nil, &Error{Line: s.Lines[engine.MaxUnits], Msg: "more than " + strconv.Itoa(engine.MaxUnits) + " units"}
	}
	units := make([]engine.Unit, 0, len(s.Rows))
	for i, r := range s.Rows {
		line := s.Lines[i]
		u := engine.Unit{Name: r[c.Name]}
		if u.Name == "" {
			return nil, &Error{Line: line, Field: s.columnName(c.Name, "name"), Msg: "empty"}
		}
		text, err := style.normalize(r[c.Count])
		if err != nil {
			return nil, &Error{Line: line, Field: s.columnName(c.Count, "count"), Msg: strconv.Quote(u.Name) + ": " + err.Error()}
		}
		p, perr := engine.ParseDecimal(text)
		if perr != nil {
			return nil, &Error{Line: line, Field: s.columnName(c.Count, "count"), Msg: PopulationProblem(u.Name, r[c.Count], perr)}
		}
		u.Population = p
		for _, b := range []struct {
			col int
			dst **int
		}{{c.Min, &u.Min}, {c.Max, &u.Max}} {
			if b.col < 0 || strings.TrimSpace(r[b.col]) == "" {
				continue
			}
			t, err := style.normalize(r[b.col])
			if err == nil {
				var n int
				if n, err = wholeSeats(t); err == nil {
					*b.dst = &n
				}
			}
			if err != nil {
				return nil, &Error{Line: line, Field: s.columnName(b.col, ""), Msg: strconv.Quote(u.Name) + ": " + err.Error()}
			}
		}
		units = append(units, u)
	}
	return units, nil
}

// columnName names column j for messages: its header, or its number.
func (s *Sheet) columnName(j int, field string) string {
	n := "column " + strconv.Itoa(j+1)
	if s.Header != nil && s.Header[j] != "" {
		n = strconv.Quote(s.Header[j]) + " (" + n + ")"
	}
	if field != "" {
		n = field + " " + n
	}
	return n
}

// A numberStyle says which of comma and point groups thousands and which
// marks decimals in a sheet's numbers.
type numberStyle int

const (
	styleUnknown   numberStyle = iota // no number needed a choice
	stylePointMark                    // 1,234,567.5
	styleCommaMark                    // 1.234.567,5
	styleAmbiguous                    // every number could be read both ways, and differently
	styleMixed                        // some numbers are in one style, some in the other
)

// numberStyleOf finds the style the cells share: a cell that can be read
// only one way decides; cells that read the same either way (such as 1250)
// do not count; when every deciding cell could be read both ways the style
// is ambiguous.
func numberStyleOf(cells []string) numberStyle {
	point, comma, both := false, false, false
	for _, c := range cells {
		t := stripSpaceGroups(c)
		p, pok := readStyle(t, ',', '.')
		q, qok := readStyle(t, '.', ',')
		switch {
		case pok && qok && p != q:
			both = true
		case pok && !qok:
			point = true
		case qok && !pok:
			comma = true
		}
	}
	switch {
	case point && comma:
		return styleMixed
	case point:
		return stylePointMark
	case comma:
		return styleCommaMark
	case both:
		return styleAmbiguous
	}
	return styleUnknown
}

// normalize writes c as a plain decimal (digits and at most one point).
// A cell that is not a number in either style is returned trimmed, for
// engine.ParseDecimal to say what is wrong with it.
func (st numberStyle) normalize(c string) (string, error) {
	t := stripSpaceGroups(c)
	p, pok := readStyle(t, ',', '.')
	q, qok := readStyle(t, '.', ',')
	switch {
	case pok && qok && p == q:
		return p, nil
	case st == styleMixed && (pok || qok):
		return "", &errText{strconv.Quote(c) + ": the table writes numbers in two styles (1,234.5 and 1.234,5); write them one way"}
	case pok && qok && st == stylePointMark, pok && !qok && st != styleCommaMark:
		return p, nil
	case pok && qok && st == styleCommaMark, qok && !pok && st != stylePointMark:
		return q, nil
	case pok && qok:
		return "", &errText{strconv.Quote(c) + " could be " + p + " or " + q + ": write it without a thousands separator"}
	case pok || qok:
		return "", &errText{strconv.Quote(c) + " is written in another number style than the rest of the table"}
	}
	return strings.TrimSpace(c), nil
}

// stripSpaceGroups trims c and removes the grouping marks that cannot be
// decimal marks (spaces, no-break spaces and apostrophes between digits)
// and a leading plus sign.
func stripSpaceGroups(c string) string {
	c = strings.TrimPrefix(strings.TrimSpace(c), "+")
	if !strings.ContainsAny(c, " '\u00a0\u202f") {
		return c
	}
	var b strings.Builder
	rs := []rune(c)
	for i, r := range rs {
		if (r == ' ' || r == '\'' || r == '\u00a0' || r == '\u202f') && i > 0 && i+4 <= len(rs) &&
			isDigit(rs[i-1]) && isDigit(rs[i+1]) && isDigit(rs[i+2]) && isDigit(rs[i+3]) &&
			(i+4 == len(rs) || !isDigit(rs[i+4])) {
			continue
		}
		b.WriteRune(r)
	}
	return b.String()
}

func isDigit(r rune) bool { return r >= '0' && r <= '9' }

// readStyle reads t as digits grouped by group in threes with an optional
// decimal part after mark, and returns it as a plain decimal. Digits alone
// (no group mark) are allowed too.
func readStyle(t string, group, mark byte) (string, bool) {
	if t == "" {
		return "", false
	}
	whole, frac, hasFrac := t, "", false
	if k := strings.IndexByte(t, mark); k >= 0 {
		whole, frac, hasFrac = t[:k], t[k+1:], true
		if frac == "" || !allDigits(frac) {
			return "", false
		}
	}
	if whole == "" {
		return "", false
	}
	if strings.IndexByte(whole, group) >= 0 {
		parts := strings.Split(whole, string(group))
		if len(parts[0]) < 1 || len(parts[0]) > 3 || !allDigits(parts[0]) {
			return "", false
		}
		for _, p := range parts[1:] {
			if len(p) != 3 || !allDigits(p) {
				return "", false
			}
		}
		whole = strings.Join(parts, "")
	} else if !allDigits(whole) {
		return "", false
	}
	if hasFrac {
		return whole + "." + frac, true
	}
	return whole, true
}

func allDigits(s string) bool {
	for i := 0; i < len(s); i++ {
		if s[i] < '0' || s[i] > '9' {
			return false
		}
	}
	return s != ""
}

// errText is an error with a fixed message, without package errors' cost.
type errText struct{ s string }

func (e *errText) Error() string { return e.s }
