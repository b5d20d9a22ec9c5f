// Command seatsmith is the analyst's command-line tool: it apportions
// seats by any standard method, explains every seat, and compares methods.
//
// Run "seatsmith help" for the commands, and "seatsmith COMMAND -h" for the
// options of one.
package main

import (
	"io"
	"os"
	"os/signal"
	"sort"
	"strings"
	"syscall"

	"seatsmith/engine/format"
)

// Exit statuses.
const (
	exitOK    = 0
	exitInput = 1 // bad input or a scenario that cannot be apportioned
	exitUsage = 2 // bad command line
	exitTie   = 3 // a tie left seats unassigned
)

// A command is one subcommand of seatsmith.
type command struct {
	name    string
	summary string
	run     func(env *env, args []string) int
}

var commands = map[string]*command{}

// register adds a subcommand; each command's file calls it from init.
func register(c *command) { commands[c.name] = c }

// env is what a command reads and writes.
type env struct {
	stdin          io.Reader
	stdout, stderr io.Writer
}

func main() {
	// A signal stops the program at once; the output file in the making
	// is removed first, and the file it was to replace stays as it was.
	sig := make(chan os.Signal, 1)
	signal.Notify(sig, os.Interrupt, syscall.SIGTERM, syscall.SIGHUP)
	go func() {
		s := <-sig
		removeTemporaries()
		io.WriteString(os.Stderr, "seatsmith: stopped ("+s.String()+")\n")
		code := 130
		if n, ok := s.(syscall.Signal); ok {
			code = 128 + int(n)
		}
		os.Exit(code)
	}()
	os.Exit(run(&env{os.Stdin, os.Stdout, os.Stderr}, os.Args[1:]))
}

func run(e *env, args []string) int {
	if len(args) == 0 {
		usage(e.stderr)
		return exitUsage
	}
	name := args[0]
	switch name {
	case "help", "-h", "-help", "--help":
		if len(args) > 1 {
			if c, ok := commands[args[1]]; ok {
				return c.run(e, []string{"-h"})
			}
		}
		usage(e.stdout)
		return exitOK
	}
	c, ok := commands[name]
	if !ok {
		io.WriteString(e.stderr, "seatsmith: unknown command "+quote(name)+"\n\n")
		usage(e.stderr)
		return exitUsage
	}
	return c.run(e, args[1:])
}

func usage(w io.Writer) {
	var b strings.Builder
	b.WriteString(`seatsmith divides a fixed number of seats among units in proportion to
their populations, by any standard apportionment method, and explains
every seat.

Usage: seatsmith COMMAND [options] FILE

FILE is a CSV table (name,population[,min,max]) or a JSON scenario; "-"
reads standard input.

Commands:
`)
	names := make([]string, 0, len(commands))
	for n := range commands {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, n := range names {
		b.WriteString("  " + n + strings.Repeat(" ", max(1, 10-len(n))) + commands[n].summary + "\n")
	}
	b.WriteString(`
Run "seatsmith COMMAND -h" for a command's options and examples.

Exit status: 0 done, 1 bad input, 2 bad command line, 3 a tie left seats
unassigned (choose -tiebreak to settle it).

` + format.Wrap(format.Caution, 76) + "\n")
	io.WriteString(w, b.String())
}

func quote(s string) string { return "\"" + s + "\"" }
