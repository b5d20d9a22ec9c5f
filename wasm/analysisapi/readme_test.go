package analysisapi

import (
	"os"
	"strconv"
	"strings"
	"testing"
)

// The limits table of wasm/README.md lists every limit of the modules, at
// the value limits() returns.
func TestLimitsDocumented(t *testing.T) {
	text, err := os.ReadFile("../README.md")
	if err != nil {
		t.Fatal(err)
	}
	documented := map[string]string{}
	for _, line := range strings.Split(string(text), "\n") {
		cells := strings.Split(line, "|")
		if len(cells) < 4 || !strings.HasPrefix(strings.TrimSpace(cells[1]), "`") {
			continue
		}
		key := strings.Trim(strings.TrimSpace(cells[1]), "`")
		documented[key] = strings.ReplaceAll(strings.TrimSpace(cells[2]), ",", "")
	}
	_, limits := Module()
	for _, l := range limits {
		got, ok := documented[l.Key]
		if !ok {
			t.Errorf("limit %s is not in the README's table", l.Key)
			continue
		}
		if got != strconv.Itoa(l.Value) {
			t.Errorf("limit %s: the README says %s, limits() %d", l.Key, got, l.Value)
		}
	}
}
