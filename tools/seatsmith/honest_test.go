package main

import (
	"errors"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// The tests in this file hold the command line to saying what it does
// with every input: options in any order, bounds from two places, names as
// people read them, files that are not tables, and output files.

func TestOptionsAfterTheFile(t *testing.T) {
	before, _, code := cli(t, "", "allot", "-method", "webster", "-seats", "40", "-format", "csv", demoCSV)
	if code != 0 {
		t.Fatalf("exit %d", code)
	}
	for _, args := range [][]string{
		{"allot", demoCSV, "-method", "webster", "-seats", "40", "-format", "csv"},
		{"allot", "-method", "webster", demoCSV, "-seats", "40", "-format", "csv"},
	} {
		out, errOut, code := cli(t, "", args...)
		if code != 0 || out != before {
			t.Errorf("%v: exit %d, %s; output differs from the options given first", args, code, errOut)
		}
	}
	// After "--" everything is a file: "-seats" is then a second file.
	_, errOut, code := cli(t, "", "allot", "-method", "webster", "--", demoCSV, "-seats", "40")
	if code != 2 || !strings.Contains(errOut, "expected one FILE argument (or - for standard input), got 3") {
		t.Errorf("after --: exit %d, %s", code, errOut)
	}
	// Two files where one is expected say so.
	_, errOut, code = cli(t, "", "allot", demoCSV, demoJSON, "-method", "webster")
	if code != 2 || !strings.Contains(errOut, "expected one FILE argument (or - for standard input), got 2") {
		t.Errorf("two files: exit %d, %s", code, errOut)
	}
}

// TestBoundsFromTwoPlaces: a unit's own minimum in the file takes
// precedence over -min, and the command line says so.
func TestBoundsFromTwoPlaces(t *testing.T) {
	out, errOut, code := cli(t, "", "allot", "-method", "webster", "-seats", "40", "-min", "2", "-format", "json", demoCSV)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if !strings.Contains(errOut, "seatsmith allot: -min 2 changes nothing: every unit of testdata/demo/vessaria.csv gives its own minimum, which takes precedence over the option's default") {
		t.Errorf("no note on standard error: %q", errOut)
	}
	plain, _, _ := cli(t, "", "allot", "-method", "webster", "-seats", "40", "-format", "json", demoCSV)
	if out != plain {
		t.Errorf("-min changed the result although every unit has its own minimum")
	}
	in := "name,population,min\nA,5000,\nB,3000,3\nC,100,\n"
	_, errOut, code = cli(t, in, "allot", "-method", "webster", "-seats", "10", "-min", "2", "-")
	if code != 0 || !strings.Contains(errOut, "-min 2 is the default for the units without their own minimum: 1 of the 3 units of stdin give their own, which they keep") {
		t.Errorf("exit %d: %q", code, errOut)
	}
	// No note when the file gives none.
	_, errOut, _ = cli(t, "name,population\nA,6\nB,3\n", "allot", "-method", "webster", "-seats", "4", "-min", "1", "-")
	if errOut != "" {
		t.Errorf("unexpected note: %q", errOut)
	}
}

// TestNamesAsPeopleReadThem: "Café" composed and decomposed is one unit;
// text that is not UTF-8, or holds a NUL byte, is refused by file, line
// and field.
func TestNamesAsPeopleReadThem(t *testing.T) {
	dir := t.TempDir()
	composed, decomposed := "Caf\u00e9", "Cafe\u0301"
	base := filepath.Join(dir, "base.csv")
	prop := filepath.Join(dir, "prop.csv")
	writeFile(t, base, "name,population\n"+composed+",5000\nMill,3000\n")
	writeFile(t, prop, "name,population\n"+decomposed+",5200\nMill,3000\n")
	out, errOut, code := cli(t, "", "diff", "-method", "webster", "-seats", "8", "-format", "json", base, prop)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	v := parseJSON(t, out)
	for _, u := range v.Get("units").Items {
		if s := u.Get("status").Text; s == "added" || s == "removed" {
			t.Errorf("%q is %s: the two spellings were taken for two units", u.Get("name").Text, s)
		}
	}
	_, errOut, code = cli(t, "name,population\n"+composed+",5\n"+decomposed+",3\n", "allot", "-method", "webster", "-seats", "4", "-")
	if code != 1 || !strings.Contains(errOut, "stdin:3: name: \"Café\": the same name as unit 1 (line 2), written with other Unicode characters") {
		t.Errorf("duplicate in two forms: exit %d, %q", code, errOut)
	}
	for _, tc := range []struct{ in, want string }{
		{"name,population\nCaf\xe9,5\n", "stdin:2: name: the text is not UTF-8 text (byte 4 is 0xe9); save the file as UTF-8"},
		{"name,population\nA\x00,5\n", "stdin:2: holds a NUL byte (byte 18): this is not a text file"},
		{"{\"units\": [\n{\"name\": \"A\\u0000\", \"population\": 5}]}", "stdin:2: units[0].name: the text holds a NUL byte"},
	} {
		_, errOut, code := cli(t, tc.in, "allot", "-method", "webster", "-seats", "4", "-")
		if code != 1 || !strings.Contains(errOut, tc.want) {
			t.Errorf("exit %d, %q; want %q", code, errOut, tc.want)
		}
	}
	_, errOut, code = cli(t, "", "admit", "-seats", "40", "-name", "Orle\u0301n", "-population", "5", demoCSV)
	if code != 0 {
		t.Errorf("admit: exit %d, %s", code, errOut)
	}
}

// TestInputThatIsNotATable: a JSON array, UTF-16 text, /dev/zero and bad
// settings get messages that say what is wrong, naming the file.
func TestInputThatIsNotATable(t *testing.T) {
	dir := t.TempDir()
	utf16 := []byte{0xFF, 0xFE}
	for _, r := range "name,population\nA,5\n" {
		utf16 = append(utf16, byte(r), 0)
	}
	u16 := filepath.Join(dir, "units16.csv")
	if err := os.WriteFile(u16, utf16, 0o644); err != nil {
		t.Fatal(err)
	}
	arr := filepath.Join(dir, "array.json")
	writeFile(t, arr, "[\n  {\"name\": \"A\", \"population\": 5}\n]\n")
	zero := filepath.Join(dir, "zero.json")
	writeFile(t, zero, "{\n  \"seats\": 0,\n  \"method\": \"webster\",\n  \"units\": [{\"name\": \"A\", \"population\": 5}]\n}\n")
	th := filepath.Join(dir, "th.json")
	writeFile(t, th, "{\n  \"threshold\": \"0.0000000001\",\n  \"units\": [{\"name\": \"A\", \"population\": 5}]\n}\n")
	for _, tc := range []struct {
		args []string
		code int
		want string
	}{
		{[]string{"allot", "-method", "webster", "-seats", "3", u16}, 1, "units16.csv:1: the file is UTF-16 text (it starts with a UTF-16 byte-order mark); save it as UTF-8"},
		{[]string{"allot", "-method", "webster", "-seats", "3", arr}, 1, "array.json:1: a JSON array; a scenario is a JSON object with a units member"},
		{[]string{"allot", "-method", "webster", "-seats", "3", "/dev/zero"}, 1, "/dev/zero:1: holds a NUL byte (byte 1): this is not a text file"},
		{[]string{"project", "-method", "webster", "-seats", "3", "/dev/zero"}, 1, "/dev/zero:1: holds a NUL byte"},
		{[]string{"allot", zero}, 1, "zero.json:2: seats: the house size must be at least 1, not 0"},
		{[]string{"compare", zero}, 1, "zero.json:2: seats: the house size must be at least 1, not 0"},
		{[]string{"sweep", zero}, 1, "zero.json:2: seats: the house size must be at least 1, not 0"},
		{[]string{"allot", "-method", "webster", "-seats", "3", th}, 1, "th.json:2: threshold: \"0.0000000001\" has more than 9 decimal places; a threshold takes at most 9 (7 in a percentage)"},
		{[]string{"allot", "-method", "webster", "-seats", "3", "-threshold", "0.00000001%", demoCSV}, 2, "-threshold: \"0.00000001%\" has more than 7 decimal places"},
	} {
		_, errOut, code := cli(t, "", tc.args...)
		if code != tc.code || !strings.Contains(errOut, tc.want) {
			t.Errorf("%v: exit %d, %q; want exit %d and %q", tc.args, code, errOut, tc.code, tc.want)
		}
	}
}

// TestRunawayInputsAreRefused: requests that would grow without bound
// are refused at once, naming the limit.
func TestRunawayInputsAreRefused(t *testing.T) {
	for _, tc := range []struct {
		args []string
		want string
	}{
		{[]string{"allot", "-method", "webster", "-seats", "1000000000", "-order", demoCSV},
			"-order: the seat order lists every seat and is held in memory, so it is listed for at most 1000000 seats, not 1000000000"},
		{[]string{"sweep", "-from", "1", "-to", "1000000", demoCSV},
			"-from/-to: 1000000 house sizes by 8 methods is more than the limit of 1000000 apportionments in one run"},
		{[]string{"paradox", "-method", "webster", "-from", "1", "-to", "3000000", demoCSV},
			"-from/-to: 3000000 house sizes is more than the limit of 1000000 apportionments in one run"},
		{[]string{"sweep", "-method", "webster", "-from", "1", "-to", "1000000", "-"},
			"-from/-to: 1000000 house sizes of 30 units is more than the limit of 10000000 seat counts in one run"},
	} {
		var in strings.Builder
		in.WriteString("name,population\n")
		for i := 0; i < 30; i++ {
			in.WriteString("U" + strings.Repeat("x", i) + ",1000\n")
		}
		_, errOut, code := cli(t, in.String(), tc.args...)
		if code != 2 || !strings.Contains(errOut, tc.want) {
			t.Errorf("%v: exit %d, %q; want %q", tc.args, code, errOut, tc.want)
		}
	}
}

// TestOutputFile: -o keeps the replaced file's permissions, names a
// folder given in its place, and leaves no temporary file.
func TestOutputFile(t *testing.T) {
	dir := t.TempDir()
	dst := filepath.Join(dir, "result.txt")
	writeFile(t, dst, "old\n")
	if err := os.Chmod(dst, 0o644); err != nil {
		t.Fatal(err)
	}
	_, errOut, code := cli(t, "", "compare", "-o", dst, demoJSON)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	st, err := os.Stat(dst)
	if err != nil || st.Mode().Perm() != 0o644 {
		t.Errorf("mode after -o: %v, %v; want 0644", st.Mode(), err)
	}
	if err := os.Chmod(dst, 0o640); err != nil {
		t.Fatal(err)
	}
	cli(t, "", "compare", "-o", dst, demoJSON)
	if st, _ := os.Stat(dst); st.Mode().Perm() != 0o640 {
		t.Errorf("mode after -o: %v, want 0640", st.Mode())
	}
	// A link is followed: the file it points to is replaced.
	link := filepath.Join(dir, "link.txt")
	if err := os.Symlink(dst, link); err == nil {
		cli(t, "", "allot", "-format", "csv", "-o", link, demoJSON)
		if l, err := os.Lstat(link); err != nil || l.Mode()&os.ModeSymlink == 0 {
			t.Errorf("the link was replaced by a file")
		}
		if b, _ := os.ReadFile(dst); !strings.Contains(string(b), "Orlen") {
			t.Errorf("the file linked to was not written")
		}
	}
	_, errOut, code = cli(t, "", "compare", "-o", dir, demoJSON)
	if code != 2 || !strings.Contains(errOut, "-o: "+dir+" is a folder; name the file to write, such as "+filepath.Join(dir, "result.txt")) {
		t.Errorf("-o DIR: exit %d, %q", code, errOut)
	}
	_, errOut, code = cli(t, "", "compare", "-o", filepath.Join(dir, "none", "x.txt"), demoJSON)
	if code != 2 || !strings.Contains(errOut, "-o: the folder "+filepath.Join(dir, "none")+" does not exist") {
		t.Errorf("-o in a missing folder: exit %d, %q", code, errOut)
	}
	entries, _ := os.ReadDir(dir)
	for _, e := range entries {
		if strings.HasPrefix(e.Name(), ".seatsmith-") {
			t.Errorf("temporary file left: %s", e.Name())
		}
	}
}

// TestQuotaViolationNotBlamedOnIdleBounds: under Adams every unit gets a
// seat of itself, so the demo's minimum of one does not cause Orlen's
// shortfall, and the paradox report does not say it does.
func TestQuotaViolationNotBlamedOnIdleBounds(t *testing.T) {
	out, errOut, code := cli(t, "", "paradox", "-method", "adams", "-from", "40", "-to", "40", demoJSON)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if !strings.Contains(out, "Orlen gets 12 seats, below its lower quota 13") {
		t.Errorf("violation not listed:\n%s", out)
	}
	if strings.Contains(out, "minimums") {
		t.Errorf("the violation is blamed on the minimums:\n%s", out)
	}
}

// TestSignalLeavesNoTemporaryFile: a run stopped by a signal while it
// writes -o FILE removes its temporary file and leaves FILE as it was.
// The run sweeps a million house sizes, whose table takes seconds to
// write, and is stopped once its temporary file appears.
func TestSignalLeavesNoTemporaryFile(t *testing.T) {
	if testing.Short() {
		t.Skip("writes a large sweep")
	}
	dir := t.TempDir()
	dst := filepath.Join(dir, "sweep.txt")
	writeFile(t, dst, "the previous result\n")
	cmd := exec.Command(binary, "sweep", "-method", "webster", "-from", "1", "-to", "1000000", "-o", dst, demoCSV)
	cmd.Dir = repoRoot(t)
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	seen := false
	for deadline := time.Now().Add(60 * time.Second); time.Now().Before(deadline) && !seen; time.Sleep(2 * time.Millisecond) {
		entries, _ := os.ReadDir(dir)
		for _, e := range entries {
			seen = seen || strings.HasPrefix(e.Name(), ".seatsmith-")
		}
	}
	if !seen {
		cmd.Process.Kill()
		cmd.Wait()
		t.Fatal("no temporary file appeared while the sweep was written")
	}
	cmd.Process.Signal(syscall.SIGTERM)
	err := cmd.Wait()
	var exit *exec.ExitError
	if !errors.As(err, &exit) || exit.ExitCode() != 128+int(syscall.SIGTERM) {
		t.Errorf("stopped run: %v, want exit status %d", err, 128+int(syscall.SIGTERM))
	}
	entries, _ := os.ReadDir(dir)
	for _, e := range entries {
		if strings.HasPrefix(e.Name(), ".seatsmith-") {
			t.Errorf("temporary file left: %s", e.Name())
		}
	}
	if b, _ := os.ReadFile(dst); string(b) != "the previous result\n" {
		t.Errorf("the file was changed: %.60q", b)
	}
}

// TestEndlessInputsStopAtALimit: an input that never ends is refused at a
// limit the message names: a CSV record of more than 1 MiB, a JSON
// document of more than 64 MiB (it is parsed whole).
func TestEndlessInputsStopAtALimit(t *testing.T) {
	long := "name,population\n" + strings.Repeat("a", 2<<20)
	_, errOut, code := cli(t, long, "allot", "-method", "webster", "-seats", "3", "-")
	if code != 1 || !strings.Contains(errOut, "stdin:2: column 1: a record longer than 1 MiB: this does not look like a table") {
		t.Errorf("endless record: exit %d, %q", code, errOut)
	}
	if testing.Short() {
		return
	}
	var b strings.Builder
	b.WriteString("{\"units\": [\n")
	for b.Len() <= 64<<20 {
		b.WriteString("{\"name\": \"x\", \"population\": 1},\n")
	}
	for _, cmd := range []string{"allot", "project"} {
		_, errOut, code = cli(t, b.String(), cmd, "-method", "webster", "-seats", "3", "-")
		if code != 1 || !strings.Contains(errOut, "stdin: the JSON document is larger than the limit of 64 MiB; give a large table as CSV") {
			t.Errorf("%s, endless JSON: exit %d, %q", cmd, code, errOut)
		}
	}
}
