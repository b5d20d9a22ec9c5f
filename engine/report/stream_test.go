package report

import (
	"bytes"
	"encoding/csv"
	"testing"

	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
)

// TestWriteAllotJSONMatchesTree: the streamed document is byte for byte the
// indented tree, for every method, with and without a title and ties.
func TestWriteAllotJSONMatchesTree(t *testing.T) {
	for _, m := range engine.Methods() {
		for _, title := range []string{"", `Wards "north" <b>`} {
			s := demo()
			s.Method = m
			s.Units = append(s.Units, engine.Unit{Name: "Tie A", Population: engine.Whole(1000)}, engine.Unit{Name: "Tie B", Population: engine.Whole(1000)})
			res, err := engine.Allot(&s, engine.Full)
			if err != nil {
				t.Fatal(err)
			}
			var b bytes.Buffer
			if err := WriteAllotJSON(&b, title, res, nil); err != nil {
				t.Fatal(err)
			}
			want := jsondoc.MarshalIndent(Allotment(title, res), "  ")
			if !bytes.Equal(b.Bytes(), want) {
				t.Fatalf("%s: streamed\n%s\nwant\n%s", m, b.Bytes(), want)
			}
			b.Reset()
			WriteAllotJSON(&b, title, res, []string{"margins", "order"})
			v, err := jsondoc.Parse(b.Bytes())
			if err != nil {
				t.Fatal(err)
			}
			if sk := v.Get("skipped"); sk == nil || len(sk.Items) != 2 || sk.Items[0].Text != "margins" {
				t.Fatalf("skipped = %s", jsondoc.Marshal(sk))
			}
		}
	}
}

// TestCSVRecordMatchesEncodingCSV: the CSV writer quotes as encoding/csv
// does.
func TestCSVRecordMatchesEncodingCSV(t *testing.T) {
	cells := []string{"", "plain", "a,b", `say "hi"`, "two\nlines", "cr\rhere", " lead", "\ttab", `\.`, "trail ", "é", "\u00a0nbsp", "x\r\ny"}
	for i := range cells {
		for j := range cells {
			rec := []string{cells[i], cells[j], "end"}
			var b bytes.Buffer
			w := csv.NewWriter(&b)
			w.Write(rec)
			w.Flush()
			if got := AppendCSVRecord(nil, rec); string(got) != b.String() {
				t.Errorf("%q: %q, encoding/csv %q", rec, got, b.String())
			}
		}
	}
}

// TestRowsMatchTable: a table written from rows made on demand is the
// table written from its cells.
func TestRowsMatchTable(t *testing.T) {
	s := demo()
	res, err := engine.Allot(&s, engine.Full)
	if err != nil {
		t.Fatal(err)
	}
	tab := AllotTable(res)
	rows := AllotRows(res)
	for _, c := range []struct {
		name string
		a, b func(*bytes.Buffer) error
	}{
		{"text", func(b *bytes.Buffer) error { return tab.WriteText(b) }, func(b *bytes.Buffer) error { return rows.WriteText(b) }},
		{"markdown", func(b *bytes.Buffer) error { return tab.WriteMarkdown(b) }, func(b *bytes.Buffer) error { return rows.WriteMarkdown(b) }},
		{"csv", func(b *bytes.Buffer) error { return tab.WriteCSV(b) }, func(b *bytes.Buffer) error { return rows.WriteCSV(b) }},
	} {
		var x, y bytes.Buffer
		if err := c.a(&x); err != nil {
			t.Fatal(err)
		}
		if err := c.b(&y); err != nil {
			t.Fatal(err)
		}
		if x.String() != y.String() {
			t.Errorf("%s: table\n%s\nrows\n%s", c.name, x.String(), y.String())
		}
	}
}
