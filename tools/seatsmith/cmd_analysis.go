package main

import (
	"flag"
	"io"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/input"
)

// This file holds what the analysis commands (sweep, paradox, growth,
// admit, diff, measure, house, derived, bias) share.

// methodList reads -method for the analysis commands: "all" (or empty)
// for every method, or ids and aliases separated by commas.
func methodList(s string) ([]engine.Method, error) {
	t := strings.TrimSpace(s)
	if t == "" || strings.EqualFold(t, "all") {
		return engine.Methods(), nil
	}
	var ms []engine.Method
	for _, part := range strings.Split(t, ",") {
		m, err := engine.ParseMethod(part)
		if err != nil {
			return nil, usageError("-method: " + errMsg(err))
		}
		ms = append(ms, m)
	}
	return ms, nil
}

const methodListHelp = "methods: all (the default), or ids separated by commas, such as webster,huntington-hill"

// methodsFlags are the options of a command that applies a list of
// methods to one scenario: the scenario's options (without -method), the
// output's, and -method as a list.
type methodsFlags struct {
	fs      *flag.FlagSet
	sf      scenarioFlags
	of      outputFlags
	method  *string
	formats []string
}

// newMethodsFlags makes the flag set of the command name with its help
// text, the scenario's and the output's options (in formats) and -method
// (described by methodHelp). The command adds its own options to fs.
func newMethodsFlags(e *env, name, help, methodHelp string, formats ...string) *methodsFlags {
	fs := flag.NewFlagSet(name, flag.ContinueOnError)
	fs.SetOutput(e.stderr)
	f := &methodsFlags{fs: fs, formats: formats}
	f.sf.bind(fs, false)
	f.of.bind(fs, formats...)
	f.method = fs.String("method", "all", methodHelp)
	fs.Usage = helpFunc(fs, e.stdout, help)
	return f
}

// parse parses the command line as parseArgs does, then checks the format
// and reads the methods. It returns done when the command should stop at
// once with the given status (help shown, or bad options, reported).
func (f *methodsFlags) parse(e *env, args []string) (ms []engine.Method, status int, done bool) {
	if status, done := parseArgs(f.fs, args); done {
		return nil, status, true
	}
	if err := f.of.check(f.formats...); err != nil {
		return nil, fail(e, f.fs.Name(), err), true
	}
	ms, err := methodList(*f.method)
	if err != nil {
		return nil, fail(e, f.fs.Name(), err), true
	}
	return ms, 0, false
}

// parseArgs parses the command line, with options and file arguments in
// any order ("allot FILE -seats 5" as "allot -seats 5 FILE"); after "--"
// everything is a file argument. It returns done when the command should
// stop at once with the given status (help shown, or bad options).
func parseArgs(fs *flag.FlagSet, args []string) (status int, done bool) {
	var files []string
	rest := args
	for {
		if err := fs.Parse(rest); err != nil {
			if err == flag.ErrHelp {
				return exitOK, true
			}
			return exitUsage, true
		}
		left := fs.Args()
		if used := len(rest) - len(left); used > 0 && rest[used-1] == "--" {
			files = append(files, left...) // everything after "--"
			break
		}
		if len(left) == 0 {
			break
		}
		files = append(files, left[0])
		rest = left[1:]
	}
	// Leave the file arguments as the flag set's arguments.
	fs.Parse(append([]string{"--"}, files...))
	return 0, false
}

// loadFileWith reads the scenario in file with the shared scenario options
// that were given on the command line main, exactly as scenarioFlags.load
// applies them; extra sets further options by name (such as "seats").
func loadFileWith(e *env, main *flag.FlagSet, withMethod bool, file string, extra map[string]string) (*input.Source, error) {
	fs := flag.NewFlagSet(main.Name(), flag.ContinueOnError)
	fs.SetOutput(io.Discard)
	var sf scenarioFlags
	sf.bind(fs, withMethod)
	var err error
	main.Visit(func(fl *flag.Flag) {
		if err == nil && fs.Lookup(fl.Name) != nil {
			err = fs.Set(fl.Name, fl.Value.String())
		}
	})
	for k, v := range extra {
		if err == nil {
			err = fs.Set(k, v)
		}
	}
	if err != nil {
		return nil, usageError(err.Error())
	}
	if err := fs.Parse([]string{"--", file}); err != nil {
		return nil, usageError(err.Error())
	}
	return sf.load(e, fs)
}

// given reports whether the flag was set on the command line.
func given(fs *flag.FlagSet, name string) bool {
	set := false
	fs.Visit(func(fl *flag.Flag) {
		if fl.Name == name {
			set = true
		}
	})
	return set
}

// tieNote warns on standard error when a tie left seats unassigned and
// returns the exit status for it.
func tieNote(e *env, cmd string, unsettled bool) int {
	if !unsettled {
		return exitOK
	}
	io.WriteString(e.stderr, "seatsmith "+cmd+": a tie left seats unassigned; settle it with -tiebreak or by the governing rule\n")
	return exitTie
}
