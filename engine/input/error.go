package input

import (
	"errors"
	"strconv"

	"seatsmith/engine"
)

// An Error is bad input located by file, line (1-based; 0 when unknown) and
// field.
type Error struct {
	File  string
	Line  int
	Field string
	Msg   string
}

func (e *Error) Error() string {
	s := e.File
	if s == "" {
		s = "input"
	}
	if e.Line > 0 {
		s += ":" + strconv.Itoa(e.Line)
	}
	s += ": "
	if e.Field != "" {
		s += e.Field + ": "
	}
	return s + e.Msg
}

// A Source is a scenario read from a file, with what is needed to place
// later errors in that file.
type Source struct {
	File     string
	Title    string
	Scenario engine.Scenario
	// Given records which scenario-level members the file set ("seats",
	// "method", "min", "max", "threshold", "tie"), so that command-line
	// options can fill in the rest.
	Given map[string]bool

	unitLines  []int
	fieldLines map[string]int
}

// Locate turns an *engine.Error about this source's scenario into an *Error
// naming the file and line of the unit or field at fault. Other errors are
// returned unchanged.
func (s *Source) Locate(err error) error {
	var ee *engine.Error
	if !errors.As(err, &ee) {
		return err
	}
	e := &Error{File: s.File, Field: ee.Field, Msg: ee.Msg}
	if ee.Unit >= 0 && ee.Unit < len(s.unitLines) {
		e.Line = s.unitLines[ee.Unit]
		e.Field = ee.Field
		if ee.Name != "" {
			e.Msg = strconv.Quote(ee.Name) + ": " + ee.Msg
		}
	} else if l, ok := s.fieldLines[ee.Field]; ok {
		e.Line = l
	}
	return e
}

// UnitLine returns the line on which unit i was read, or 0.
func (s *Source) UnitLine(i int) int {
	if i >= 0 && i < len(s.unitLines) {
		return s.unitLines[i]
	}
	return 0
}
