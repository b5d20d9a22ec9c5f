package main

import (
	"bytes"
	"errors"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"strings"
	"testing"
)

// The CLI is tested the way people use it: TestMain builds the binary once
// and each test runs it as a separate process.

var binary string

func TestMain(m *testing.M) {
	dir, err := os.MkdirTemp("", "seatsmith-cli")
	if err != nil {
		panic(err)
	}
	binary = filepath.Join(dir, "seatsmith")
	if runtime.GOOS == "windows" {
		binary += ".exe"
	}
	out, err := exec.Command("go", "build", "-o", binary, ".").CombinedOutput()
	if err != nil {
		os.Stderr.Write(out)
		os.RemoveAll(dir)
		os.Exit(1)
	}
	code := m.Run()
	os.RemoveAll(dir)
	os.Exit(code)
}

// cli runs the built binary with args in the repository root, feeding
// stdin, and returns what it printed and its exit status.
func cli(t *testing.T, stdin string, args ...string) (stdout, stderr string, code int) {
	t.Helper()
	cmd := exec.Command(binary, args...)
	cmd.Dir = repoRoot(t)
	cmd.Stdin = strings.NewReader(stdin)
	var o, e bytes.Buffer
	cmd.Stdout, cmd.Stderr = &o, &e
	err := cmd.Run()
	var exit *exec.ExitError
	switch {
	case err == nil:
	case errors.As(err, &exit):
		code = exit.ExitCode()
	default:
		t.Fatalf("running seatsmith %v: %v", args, err)
	}
	if code < 0 {
		t.Fatalf("seatsmith %v was killed (a crash?): %s", args, e.String())
	}
	if strings.Contains(e.String(), "panic:") || strings.Contains(e.String(), "goroutine ") {
		t.Fatalf("seatsmith %v panicked:\n%s", args, e.String())
	}
	return o.String(), e.String(), code
}

func repoRoot(t *testing.T) string {
	t.Helper()
	wd, err := os.Getwd()
	if err != nil {
		t.Fatal(err)
	}
	return filepath.Join(wd, "..", "..")
}
