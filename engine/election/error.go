package election

import "strconv"

// An Error says what is wrong with an election scenario, or why it cannot be
// apportioned. Part names the list the fault is in ("districts", "parties"
// or "votes"; empty for the scenario as a whole), Index the entry in it (-1
// when none), Field the member at fault ("seats", "votes", "district",
// "method", "threshold", ...).
type Error struct {
	Part  string
	Index int
	Field string
	Msg   string
}

func (e *Error) Error() string {
	s := ""
	if e.Part != "" {
		s = e.Part
		if e.Index >= 0 {
			s += "[" + strconv.Itoa(e.Index) + "]"
		}
		if e.Field != "" {
			s += "." + e.Field
		}
	} else {
		s = e.Field
	}
	if s != "" {
		s += ": "
	}
	return s + e.Msg
}

func scenarioErr(field, msg string) *Error { return &Error{Index: -1, Field: field, Msg: msg} }

func districtErr(i int, field, msg string) *Error {
	return &Error{Part: "districts", Index: i, Field: field, Msg: msg}
}

func partyErr(i int, field, msg string) *Error {
	return &Error{Part: "parties", Index: i, Field: field, Msg: msg}
}

func voteErr(i int, field, msg string) *Error {
	return &Error{Part: "votes", Index: i, Field: field, Msg: msg}
}
