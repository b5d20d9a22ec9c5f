package main

import (
	"flag"
	"io"
	"os"
	"strconv"
	"strings"
	"unicode/utf8"

	"golang.org/x/text/unicode/norm"

	"seatsmith/engine"
	"seatsmith/engine/input"
)

// scenarioFlags are the options every scenario-reading command shares.
// Options given on the command line override the file's own values.
type scenarioFlags struct {
	cmd       string // the command, for notes
	ownMethod bool   // -method is this scenario's method (not a list of methods)
	seats     int
	method    string
	min, max  int
	threshold string
	tiebreak  string
	set       map[string]bool
}

func (f *scenarioFlags) bind(fs *flag.FlagSet, withMethod bool) {
	f.cmd, f.ownMethod = fs.Name(), withMethod
	fs.IntVar(&f.seats, "seats", 0, "house size: the number of seats to divide")
	if withMethod {
		fs.StringVar(&f.method, "method", "", "method: "+strings.Join(engine.MethodIDs(), ", ")+"\n(aliases: hare, dhondt, sainte-lague, equal-proportions)")
	}
	fs.IntVar(&f.min, "min", 0, "default minimum seats per unit")
	fs.IntVar(&f.max, "max", 0, "default maximum seats per unit (0: no cap)")
	fs.StringVar(&f.threshold, "threshold", "", "exclude units below this share of the total, e.g. 0.05 or 5%")
	fs.StringVar(&f.tiebreak, "tiebreak", "", "how to settle a tie: none (report it), order (input order), lot:SEED")
}

// overrides checks the options given on the command line and returns them
// as a scenario holding just those values. Call it before reading the
// file, so that a mistake on the command line is reported as such.
func (f *scenarioFlags) overrides(fs *flag.FlagSet) (*engine.Scenario, error) {
	f.set = map[string]bool{}
	fs.Visit(func(fl *flag.Flag) { f.set[fl.Name] = true })
	if !f.ownMethod {
		delete(f.set, "method") // the command's own list of methods
	}
	over := &engine.Scenario{}
	flagErr := func(flagName, msg string) error {
		return usageError("-" + flagName + ": " + msg)
	}
	if f.set["seats"] {
		if f.seats < 1 || f.seats > engine.MaxSeats {
			return nil, flagErr("seats", "must be between 1 and "+strconv.Itoa(engine.MaxSeats))
		}
		over.Seats = f.seats
	}
	if f.set["method"] {
		m, err := engine.ParseMethod(f.method)
		if err != nil {
			return nil, flagErr("method", errMsg(err))
		}
		over.Method = m
	}
	if f.set["min"] {
		if f.min < 0 {
			return nil, flagErr("min", "cannot be negative")
		}
		over.Min = f.min
	}
	if f.set["max"] {
		if f.max < 0 {
			return nil, flagErr("max", "cannot be negative")
		}
		over.Max = f.max
	}
	if f.set["threshold"] {
		th, err := input.ParseShare(f.threshold)
		if err != nil {
			return nil, flagErr("threshold", err.Error())
		}
		over.Threshold = th
	}
	if f.set["tiebreak"] {
		t, err := engine.ParseTieRule(f.tiebreak)
		if err != nil {
			return nil, flagErr("tiebreak", errMsg(err))
		}
		over.Tie = t
	}
	return over, nil
}

// apply copies the options given on the command line (as returned by
// overrides) over the scenario read from a file, and checks that a house
// size is set. given says which settings the file gave itself: a house
// size of 0 given by the file is left for the engine to refuse, so that
// the message names the file and line.
func (f *scenarioFlags) apply(over, sc *engine.Scenario, given map[string]bool) error {
	if f.set["seats"] {
		sc.Seats = over.Seats
	}
	if f.set["method"] {
		sc.Method = over.Method
	}
	if f.set["min"] {
		sc.Min = over.Min
	}
	if f.set["max"] {
		sc.Max = over.Max
	}
	if f.set["threshold"] {
		sc.Threshold = over.Threshold
	}
	if f.set["tiebreak"] {
		sc.Tie = over.Tie
	}
	if sc.Seats == 0 && !given["seats"] {
		return usageError("no house size: give -seats N (or \"seats\" in a JSON scenario)")
	}
	return nil
}

// boundsNote says, when -min or -max was given, how many units keep a
// bound of their own from the file (its min and max column, or the
// members of its units), which takes precedence over the option's
// default; "" when none does.
func (f *scenarioFlags) boundsNote(file string, own func(i int) (min, max bool), n int) string {
	var notes []string
	for _, b := range []struct {
		flag, word string
		value      int
		min        bool
	}{{"min", "minimum", f.min, true}, {"max", "maximum", f.max, false}} {
		if !f.set[b.flag] {
			continue
		}
		k := 0
		for i := 0; i < n; i++ {
			mn, mx := own(i)
			if (b.min && mn) || (!b.min && mx) {
				k++
			}
		}
		opt := "-" + b.flag + " " + strconv.Itoa(b.value)
		switch {
		case k == 0:
			continue
		case k == n:
			notes = append(notes, opt+" changes nothing: every unit of "+file+" gives its own "+b.word+
				", which takes precedence over the option's default")
		default:
			notes = append(notes, opt+" is the default for the units without their own "+b.word+": "+strconv.Itoa(k)+" of the "+
				strconv.Itoa(n)+" units of "+file+" give their own, which they keep")
		}
	}
	return strings.Join(notes, "; ")
}

// note writes a note about the command line on standard error.
func (f *scenarioFlags) note(e *env, msg string) {
	if msg != "" {
		io.WriteString(e.stderr, "seatsmith "+f.cmd+": "+msg+"\n")
	}
}

// readOptions are how every command reads its files: names are compared
// in Unicode normalization form C, so that a name written with a composed
// letter and with a letter and a combining mark is one name.
var readOptions = input.Options{NameForm: norm.NFC.String}

// load reads the scenario named by the single file argument and applies
// the options. It returns a located error for bad input.
func (f *scenarioFlags) load(e *env, fs *flag.FlagSet) (*input.Source, error) {
	if fs.NArg() != 1 {
		return nil, usageError("expected one FILE argument (or - for standard input), got " + strconv.Itoa(fs.NArg()))
	}
	over, err := f.overrides(fs)
	if err != nil {
		return nil, err
	}
	r, name, closeFile, err := openArg(e, fs.Arg(0))
	if err != nil {
		return nil, err
	}
	defer closeFile()
	src, err := readOptions.Read(name, r)
	if err != nil {
		return nil, err
	}
	if err := f.apply(over, &src.Scenario, src.Given); err != nil {
		return nil, err
	}
	us := src.Scenario.Units
	f.note(e, f.boundsNote(src.File, func(i int) (bool, bool) { return us[i].Min != nil, us[i].Max != nil }, len(us)))
	return src, nil
}

// openArg opens a file argument, or standard input for "-".
func openArg(e *env, arg string) (r io.Reader, name string, closeFile func(), err error) {
	if arg == "-" {
		return e.stdin, "stdin", func() {}, nil
	}
	file, err := os.Open(arg)
	if err != nil {
		return nil, arg, nil, &input.Error{File: arg, Msg: "cannot read: " + strings.TrimPrefix(err.Error(), "open "+arg+": ")}
	}
	return file, arg, func() { file.Close() }, nil
}

// usageErr is a command-line mistake (exit status 2).
type usageErr struct{ msg string }

func (u *usageErr) Error() string { return u.msg }

func usageError(msg string) error { return &usageErr{msg} }

func errMsg(err error) string {
	if ee, ok := err.(*engine.Error); ok {
		return ee.Msg
	}
	return err.Error()
}

// fail reports err and returns the exit status it calls for.
func fail(e *env, cmd string, err error) int {
	io.WriteString(e.stderr, "seatsmith "+cmd+": "+err.Error()+"\n")
	if _, ok := err.(*usageErr); ok {
		io.WriteString(e.stderr, "run \"seatsmith "+cmd+" -h\" for the options\n")
		return exitUsage
	}
	return exitInput
}

// nameProblem says why a name given on the command line is not one, or
// returns "".
func nameProblem(s string) string {
	if strings.IndexByte(s, 0) >= 0 {
		return "holds a NUL byte"
	}
	if !utf8.ValidString(s) {
		return "is not UTF-8 text"
	}
	return ""
}
