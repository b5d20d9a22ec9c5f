package election

import (
	"errors"
	"strconv"

	"seatsmith/engine/input"
)

// A Source is an election scenario read from one or more files, with what
// is needed to place later errors in them.
type Source struct {
	Title    string
	Scenario Scenario
	// Given records which scenario-level members the input set ("system",
	// "method", "seats", "threshold", ...), so that command-line options
	// can fill in the rest.
	Given map[string]bool

	// where each list entry and each scenario member was read
	parts  map[string][]place
	fields map[string]place
	file   string
}

type place struct {
	file string
	line int
}

func newSource(file string) *Source {
	return &Source{Given: map[string]bool{}, parts: map[string][]place{}, fields: map[string]place{}, file: file}
}

// Locate turns an *Error about this source's scenario into an
// *input.Error naming the file and line of the entry or member at fault.
// Other errors are returned unchanged.
func (s *Source) Locate(err error) error {
	var ee *Error
	if !errors.As(err, &ee) {
		return err
	}
	out := &input.Error{File: s.file, Msg: ee.Msg}
	if ee.Part != "" {
		out.Field = ee.Part
		if ee.Index >= 0 {
			out.Field += "[" + strconv.Itoa(ee.Index) + "]"
			if ps := s.parts[ee.Part]; ee.Index < len(ps) {
				out.File, out.Line = ps[ee.Index].file, ps[ee.Index].line
			}
		}
		if ee.Field != "" {
			out.Field += "." + ee.Field
		}
		return out
	}
	out.Field = ee.Field
	if pl, ok := s.fields[ee.Field]; ok {
		out.File, out.Line = pl.file, pl.line
	} else if pl, ok := s.fields[baseField(ee.Field)]; ok {
		out.File, out.Line = pl.file, pl.line
	}
	return out
}

// baseField is "thresholds" for "thresholds[2]".
func baseField(f string) string {
	for i := range f {
		if f[i] == '[' {
			return f[:i]
		}
	}
	return f
}

// Line returns the file and line where entry k of part ("districts",
// "parties" or "votes") was read; line 0 when unknown.
func (s *Source) Line(part string, k int) (string, int) {
	if ps := s.parts[part]; k >= 0 && k < len(ps) {
		return ps[k].file, ps[k].line
	}
	return s.file, 0
}

// Compute apportions the source's scenario and locates any error in its
// files.
func (s *Source) Compute() (*Result, error) {
	res, err := Compute(&s.Scenario)
	if err != nil {
		return nil, s.Locate(err)
	}
	return res, nil
}
