package csv

import (
	"bytes"
	"encoding/csv"
	"testing"
)

// TestRecordMatchesEncodingCSV: the CSV writer quotes as encoding/csv
// does.
func TestRecordMatchesEncodingCSV(t *testing.T) {
	cells := []string{"", "plain", "a,b", `say "hi"`, "two\nlines", "cr\rhere", " lead", "\ttab", `\.`, "trail ", "é", "\u00a0nbsp", "x\r\ny"}
	for i := range cells {
		for j := range cells {
			rec := []string{cells[i], cells[j], "end"}
			var b bytes.Buffer
			w := csv.NewWriter(&b)
			w.Write(rec)
			w.Flush()
			if got := AppendRecord(nil, rec); string(got) != b.String() {
				t.Errorf("%q: %q, encoding/csv %q", rec, got, b.String())
			}
		}
	}
}

func TestGuard(t *testing.T) {
	for in, want := range map[string]string{"-2+3": "'-2+3", "=1": "'=1", "+1": "'+1", "@a": "'@a", "\tx": "'\tx", "\rx": "'\rx", "-5": "'-5", "North": "North", "": ""} {
		if got := Guard(in); got != want {
			t.Errorf("Guard(%q) = %q, want %q", in, got, want)
		}
	}
}
