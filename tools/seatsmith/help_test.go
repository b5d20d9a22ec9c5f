package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// splitArgs splits a command line as a shell would for the examples:
// words separated by spaces, double quotes keeping a word together.
func splitArgs(s string) []string {
	var out []string
	var cur strings.Builder
	quoted, have := false, false
	for _, r := range s {
		switch {
		case r == '"':
			quoted, have = !quoted, true
		case r == ' ' && !quoted:
			if have {
				out = append(out, cur.String())
			}
			cur.Reset()
			have = false
		default:
			cur.WriteRune(r)
			have = true
		}
	}
	if have {
		out = append(out, cur.String())
	}
	return out
}

// runExample runs one example command line and checks that it works: exit
// status 0, or 3 where the example holds a tie. Files it would write go to
// a temporary folder.
func runExample(t *testing.T, line string) {
	t.Helper()
	args := splitArgs(line)
	dir := t.TempDir()
	for i := range args {
		if args[i] == "-o" && i+1 < len(args) {
			args[i+1] = filepath.Join(dir, filepath.Base(args[i+1]))
		}
	}
	_, errOut, code := cli(t, "", args...)
	if code != 0 && code != exitTie {
		t.Errorf("example %q: exit %d: %s", line, code, errOut)
	}
	for _, a := range args {
		if strings.HasPrefix(a, "testdata/") {
			if _, err := os.Stat(filepath.Join(repoRoot(t), a)); err != nil {
				t.Errorf("example %q names %s, which does not exist", line, a)
			}
		}
	}
}

// TestHelpExamplesWork runs every example in every command's help.
func TestHelpExamplesWork(t *testing.T) {
	n := 0
	for name := range commands {
		out, _, code := cli(t, "", name, "-h")
		if code != 0 {
			t.Errorf("%s -h: exit %d", name, code)
		}
		examples := false
		for _, l := range strings.Split(out, "\n") {
			switch {
			case strings.HasPrefix(l, "Examples:"):
				examples = true
			case examples && strings.HasPrefix(l, "  seatsmith "):
				runExample(t, strings.TrimPrefix(l, "  seatsmith "))
				n++
			case examples && strings.TrimSpace(l) == "":
				examples = false
			}
		}
	}
	if n < 2*len(commands) {
		t.Errorf("only %d examples in the help of %d commands", n, len(commands))
	}
}

// TestReadmeExamplesWork runs every seatsmith command line the README
// shows.
func TestReadmeExamplesWork(t *testing.T) {
	b, err := os.ReadFile(filepath.Join(repoRoot(t), "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, l := range strings.Split(string(b), "\n") {
		if !strings.HasPrefix(l, "    ") {
			continue // not a code line
		}
		l = strings.TrimSpace(strings.TrimPrefix(strings.TrimSpace(l), "$"))
		for _, p := range []string{"go run ./tools/seatsmith ", "seatsmith "} {
			if strings.HasPrefix(l, p) && !strings.Contains(l, "COMMAND") {
				runExample(t, strings.TrimPrefix(l, p))
				n++
				break
			}
		}
	}
	if n < 5 {
		t.Errorf("only %d examples found in the README", n)
	}
}

// TestReadmeSaysHowToBuild: the README names the Go version go.mod asks
// for, how to install the command and how long the suite takes.
func TestReadmeSaysHowToBuild(t *testing.T) {
	root := repoRoot(t)
	readme, err := os.ReadFile(filepath.Join(root, "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	mod, err := os.ReadFile(filepath.Join(root, "go.mod"))
	if err != nil {
		t.Fatal(err)
	}
	version := ""
	for _, l := range strings.Split(string(mod), "\n") {
		if strings.HasPrefix(l, "go ") {
			version = strings.TrimSpace(strings.TrimPrefix(l, "go "))
		}
	}
	text := strings.Join(strings.Fields(string(readme)), " ")
	for _, want := range []string{"Go " + version + " or later", "go install ./tools/seatsmith", "go test ./...", "takes about"} {
		if !strings.Contains(text, want) {
			t.Errorf("README does not say %q", want)
		}
	}
}
