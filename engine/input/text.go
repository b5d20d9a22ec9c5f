package input

import (
	"strconv"
	"strings"
	"unicode/utf8"
)

// Options change how a scenario is read. The zero Options read names as
// they are written.
type Options struct {
	// NameForm, when set, puts every unit's name in the form in which
	// names are compared, such as Unicode normalization form C (the
	// command-line tool passes norm.NFC.String from golang.org/x/text), so
	// that "Café" written with a composed é and with e and a combining
	// accent is one unit. Names are kept in that form.
	NameForm func(string) string
}

// textProblem says what makes s unfit as text, or returns "": a NUL byte
// or bytes that are not UTF-8.
func textProblem(s string) string {
	if k := strings.IndexByte(s, 0); k >= 0 {
		return "holds a NUL byte (byte " + strconv.Itoa(k+1) + "); names and numbers are text"
	}
	if !utf8.ValidString(s) {
		k := 0
		for k < len(s) {
			r, size := utf8.DecodeRuneInString(s[k:])
			if r == utf8.RuneError && size == 1 {
				break
			}
			k += size
		}
		return "is not UTF-8 text (byte " + strconv.Itoa(k+1) + " is 0x" + strconv.FormatUint(uint64(s[k]), 16) +
			"); save the file as UTF-8"
	}
	return ""
}

// name puts a unit's name in the options' form.
func (o Options) name(s string) string {
	s = strings.TrimSpace(s)
	if o.NameForm != nil {
		s = o.NameForm(s)
	}
	return s
}

// nameSeen finds names that differ as written but are one name in the
// options' form, so that the message can say why two names that look
// different are the same.
type nameSeen struct {
	form  bool
	first map[string]nameAt
}

type nameAt struct {
	unit    int
	written string
}

func newNameSeen(o Options) *nameSeen {
	if o.NameForm == nil {
		return &nameSeen{}
	}
	return &nameSeen{form: true, first: map[string]nameAt{}}
}

// check records unit k's name, written as in the file, and returns a
// message when an earlier unit has the same name in the options' form but
// was written differently. Names written identically are left to the
// engine's check.
func (ns *nameSeen) check(k int, written, name string, line func(int) int) string {
	if !ns.form {
		return ""
	}
	if at, ok := ns.first[name]; ok {
		if at.written != written {
			return strconv.Quote(name) + ": the same name as unit " + strconv.Itoa(at.unit+1) + lineText(line(at.unit)) +
				", written with other Unicode characters (a composed letter against a letter and a combining mark); " +
				"names are compared in Unicode normalization form C"
		}
		return ""
	}
	ns.first[name] = nameAt{k, written}
	return ""
}

func lineText(l int) string {
	if l <= 0 {
		return ""
	}
	return " (line " + strconv.Itoa(l) + ")"
}
