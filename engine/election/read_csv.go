package election

import (
	"bufio"
	"bytes"
	"errors"
	"io"
	"slices"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/input"
)

// Read reads an election scenario: a JSON document when the first
// character that is not white space is '{', CSV sections otherwise.
func Read(file string, r io.Reader) (*Source, error) {
	br := bufio.NewReader(r)
	for {
		b, err := br.Peek(1)
		if err != nil {
			break
		}
		if b[0] == ' ' || b[0] == '\t' || b[0] == '\r' || b[0] == '\n' {
			br.ReadByte()
			continue
		}
		if bom, _ := br.Peek(3); bytes.Equal(bom, []byte("\xEF\xBB\xBF")) {
			br.Discard(3)
			continue
		}
		if b[0] == '{' {
			return ReadJSON(file, br)
		}
		break
	}
	src := newSource(file)
	if err := src.AddCSV(file, br); err != nil {
		return nil, err
	}
	return src, nil
}

// The CSV columns, by section.
var (
	voteColumns     = []string{"district", "party", "votes", "wins"}
	districtColumns = []string{"district", "seats", "population", "other_votes"}
	partyColumns    = []string{"party", "wins", "exempt", "independent"}
)

// AddCSV reads CSV sections from another file into the source: vote rows,
// district rows and party rows, appended to those already read. See the
// package documentation for the format.
func (s *Source) AddCSV(file string, r io.Reader) error {
	data, err := io.ReadAll(io.LimitReader(r, 1<<31))
	if err != nil {
		return &input.Error{File: file, Msg: err.Error()}
	}
	data = bytes.TrimPrefix(data, []byte("\xEF\xBB\xBF"))
	secs := splitSections(data)
	if len(secs) == 0 {
		return &input.Error{File: file, Line: 1, Msg: "empty file: expected a header row such as district,party,votes"}
	}
	for _, sec := range secs {
		if err := s.readSection(file, sec); err != nil {
			return err
		}
	}
	return nil
}

type section struct {
	text []byte
	line int // the line the section starts on
}

// splitSections cuts CSV text at blank lines (empty, or holding only
// commas and spaces, as spreadsheets write them) outside quoted fields.
func splitSections(data []byte) []section {
	var out []section
	cur, curLine := -1, 0
	lineStart, line := 0, 1
	quoted := false
	for i := 0; i < len(data); i++ {
		c := data[i]
		if c == '"' {
			quoted = !quoted
		}
		if c != '\n' && i != len(data)-1 {
			continue
		}
		end := i + 1
		if c == '\n' {
			end = i
		}
		if !quoted && blankLine(data[lineStart:end]) {
			if cur >= 0 {
				out = append(out, section{data[cur:lineStart], curLine})
				cur = -1
			}
		} else if cur < 0 {
			cur, curLine = lineStart, line
		}
		lineStart, line = i+1, line+1
	}
	if cur >= 0 {
		out = append(out, section{data[cur:], curLine})
	}
	return out
}

func blankLine(b []byte) bool {
	for _, c := range b {
		if c != ' ' && c != '\t' && c != ',' && c != '\r' && c != ';' {
			return false
		}
	}
	return true
}

// readSection reads one section, recognised by its header.
func (s *Source) readSection(file string, sec section) error {
	cr := input.NewCSVReader(bytes.NewReader(sec.text))
	at := func() int { return sec.line + cr.Line() - 1 }
	header, err := cr.Read()
	if err != nil {
		return csvErr(file, sec.line, err)
	}
	for len(header) > 0 && strings.TrimSpace(header[len(header)-1]) == "" {
		header = header[:len(header)-1]
	}
	col := map[string]int{}
	for i, h := range header {
		k := normal(h)
		k = strings.ReplaceAll(k, "-", "_")
		if k == "name" {
			k = "district"
		}
		if _, dup := col[k]; dup {
			return &input.Error{File: file, Line: sec.line, Field: k, Msg: "the column appears twice"}
		}
		col[k] = i
	}
	_, hasVotes := col["votes"]
	_, hasSeats := col["seats"]
	_, hasPop := col["population"]
	_, hasOther := col["other_votes"]
	_, hasDistrict := col["district"]
	_, hasParty := col["party"]
	var kind string
	var known []string
	switch {
	case hasVotes:
		kind, known = "votes", voteColumns
	case hasSeats || hasPop || hasOther:
		kind, known = "districts", districtColumns
	case hasParty && !hasDistrict:
		kind, known = "parties", partyColumns
	default:
		return &input.Error{File: file, Line: sec.line, Msg: "unknown section: a header names district,party,votes (vote rows), district,seats (districts) or party,wins (parties)"}
	}
	for i, h := range header {
		k := strings.ReplaceAll(normal(h), "-", "_")
		if k == "name" {
			k = "district"
		}
		if !slices.Contains(known, k) {
			return &input.Error{File: file, Line: sec.line, Field: "column " + strconv.Itoa(i+1),
				Msg: "unknown column " + strconv.Quote(h) + " in a " + kind + " section; its columns are " + strings.Join(known, ", ")}
		}
	}
	need := map[string][]string{"votes": {"party", "votes"}, "districts": {"district"}, "parties": {"party"}}[kind]
	for _, k := range need {
		if _, ok := col[k]; !ok {
			return &input.Error{File: file, Line: sec.line, Field: k, Msg: "missing column in a " + kind + " section"}
		}
	}
	cell := func(rec []string, k string) string {
		if i, ok := col[k]; ok && i < len(rec) {
			return strings.TrimSpace(rec[i])
		}
		return ""
	}
	sc := &s.Scenario
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			return nil
		}
		if err != nil {
			return csvErr(file, sec.line, err)
		}
		line := at()
		for i := len(header); i < len(rec); i++ {
			if strings.TrimSpace(rec[i]) != "" {
				return &input.Error{File: file, Line: line, Field: "column " + strconv.Itoa(i+1), Msg: "a value beyond the header's columns"}
			}
		}
		bad := func(field, msg string) error { return &input.Error{File: file, Line: line, Field: field, Msg: msg} }
		switch kind {
		case "votes":
			if len(sc.Votes) >= MaxVotes {
				return bad("", "more than "+strconv.Itoa(MaxVotes)+" vote rows")
			}
			v := Vote{District: cell(rec, "district"), Party: cell(rec, "party")}
			if v.Party == "" {
				return bad("party", "missing or empty: every vote row names its party")
			}
			d, err := parseCount(cell(rec, "votes"))
			if err != nil {
				return bad("votes", strconv.Quote(v.Party)+": "+err.Error())
			}
			v.Votes = d
			if t := cell(rec, "wins"); t != "" {
				n, err := countOf(t)
				if err != nil {
					return bad("wins", strconv.Quote(v.Party)+": "+err.Error())
				}
				v.Wins = n
			}
			sc.Votes = append(sc.Votes, v)
			s.parts["votes"] = append(s.parts["votes"], place{file, line})
		case "districts":
			if len(sc.Districts) >= MaxDistricts {
				return bad("", "more than "+strconv.Itoa(MaxDistricts)+" districts")
			}
			d := District{Name: cell(rec, "district")}
			if d.Name == "" {
				return bad("district", "missing or empty: every district needs a name")
			}
			if t := cell(rec, "seats"); t != "" {
				n, err := countOf(t)
				if err != nil {
					return bad("seats", strconv.Quote(d.Name)+": "+err.Error())
				}
				d.Seats = n
			}
			if t := cell(rec, "population"); t != "" {
				p, err := parseCount(t)
				if err != nil {
					return bad("population", strconv.Quote(d.Name)+": "+err.Error())
				}
				d.Population = &p
			}
			if t := cell(rec, "other_votes"); t != "" {
				o, err := parseCount(t)
				if err != nil {
					return bad("other_votes", strconv.Quote(d.Name)+": "+err.Error())
				}
				d.OtherVotes = o
			}
			sc.Districts = append(sc.Districts, d)
			s.parts["districts"] = append(s.parts["districts"], place{file, line})
		case "parties":
			if len(sc.Parties) >= MaxParties {
				return bad("", "more than "+strconv.Itoa(MaxParties)+" parties")
			}
			p := Party{Name: cell(rec, "party")}
			if p.Name == "" {
				return bad("party", "missing or empty: every party needs a name")
			}
			if t := cell(rec, "wins"); t != "" {
				n, err := countOf(t)
				if err != nil {
					return bad("wins", strconv.Quote(p.Name)+": "+err.Error())
				}
				p.Wins = n
			}
			for _, b := range []struct {
				key string
				dst *bool
			}{{"exempt", &p.Exempt}, {"independent", &p.Independent}} {
				v, err := boolOf(cell(rec, b.key))
				if err != nil {
					return bad(b.key, strconv.Quote(p.Name)+": "+err.Error())
				}
				*b.dst = v
			}
			sc.Parties = append(sc.Parties, p)
			s.parts["parties"] = append(s.parts["parties"], place{file, line})
		}
	}
}

func csvErr(file string, start int, err error) error {
	var ce *input.CSVError
	if errors.As(err, &ce) {
		return &input.Error{File: file, Line: start + ce.Line - 1, Field: "row", Msg: ce.Error()[strings.Index(ce.Error(), ": ")+2:]}
	}
	return &input.Error{File: file, Line: start, Msg: err.Error()}
}

// countOf reads a whole number of seats or wins.
func countOf(t string) (int, error) {
	n, err := strconv.Atoi(t)
	if err != nil || n < 0 || n > engine.MaxSeats {
		return 0, errors.New(strconv.Quote(t) + " is not a whole number between 0 and " + strconv.Itoa(engine.MaxSeats))
	}
	return n, nil
}

// boolOf reads yes/no, true/false, 1/0 or x; empty is no.
func boolOf(t string) (bool, error) {
	switch strings.ToLower(t) {
	case "", "no", "false", "0", "n":
		return false, nil
	case "yes", "true", "1", "x", "y":
		return true, nil
	}
	return false, errors.New(strconv.Quote(t) + " is not yes or no")
}
