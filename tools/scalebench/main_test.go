package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestGenAndAllot writes a small table and apportions it both ways.
func TestGenAndAllot(t *testing.T) {
	var table, errs bytes.Buffer
	if code := run([]string{"gen", "-units", "50"}, &table, &errs); code != 0 {
		t.Fatalf("gen: exit %d: %s", code, errs.String())
	}
	lines := strings.Split(strings.TrimSpace(table.String()), "\n")
	if len(lines) != 51 || lines[0] != "name,population" || !strings.HasPrefix(lines[1], "district-1,") {
		t.Fatalf("gen wrote %d lines, starting %q", len(lines), lines[:2])
	}
	dir := t.TempDir()
	in := filepath.Join(dir, "t.csv")
	if err := os.WriteFile(in, table.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, lean := range []bool{false, true} {
		out := filepath.Join(dir, "out.csv")
		args := []string{"allot", "-method", "webster", "-seats", "500", "-detail", "margins", "-o", out}
		if lean {
			args = append(args, "-lean")
		}
		var log bytes.Buffer
		errs.Reset()
		if code := run(append(args, in), &log, &errs); code != 0 {
			t.Fatalf("allot (lean %v): exit %d: %s", lean, code, errs.String())
		}
		got, err := os.ReadFile(out)
		if err != nil {
			t.Fatal(err)
		}
		if rows := strings.Count(string(got), "\n"); rows != 51 || !strings.HasPrefix(string(got), "method,house_size,default_min,default_max,threshold,tie_rule,unit,population,") {
			t.Fatalf("allot (lean %v) wrote %d lines", lean, rows)
		}
		if !strings.Contains(log.String(), "allot") {
			t.Fatalf("no step report: %q", log.String())
		}
	}
	if code := run([]string{"allot", "-detail", "some", in}, &table, &errs); code != 2 {
		t.Fatalf("unknown detail: exit %d", code)
	}
}
