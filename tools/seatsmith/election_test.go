package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"seatsmith/engine/jsondoc"
)

// The election command, run through the built binary.

func TestElectionHelp(t *testing.T) {
	out, _, code := cli(t, "", "election", "-h")
	if code != 0 {
		t.Fatalf("exit %d", code)
	}
	for _, want := range []string{"Not an official apportionment", "Examples:", "testdata/demo/vessaria-election.csv", "-overhang"} {
		if !strings.Contains(out, want) {
			t.Errorf("help lacks %q", want)
		}
	}
	out, _, _ = cli(t, "", "help")
	if !strings.Contains(out, "election") {
		t.Errorf("the command list lacks election:\n%s", out)
	}
}

// Every example in the help runs on the demo files.
func TestElectionExamples(t *testing.T) {
	out, _, _ := cli(t, "", "election", "-h")
	n := 0
	for _, line := range strings.Split(out, "\n") {
		line = strings.TrimSpace(line)
		if !strings.HasPrefix(line, "seatsmith election ") {
			continue
		}
		n++
		args := strings.Fields(line)[1:]
		got, errOut, code := cli(t, "", args...)
		if code != 0 {
			t.Errorf("%s: exit %d: %s", line, code, errOut)
		}
		if !strings.Contains(got, "Lantern Party") {
			t.Errorf("%s: output lacks the parties:\n%s", line, got)
		}
	}
	if n < 3 {
		t.Errorf("%d examples, want at least 3", n)
	}
}

// Zurich's city parliament, 4 March 2018, through the binary: the
// published seats (sources in engine/election/testdata/README.md) and a
// document of the documented shape.
func TestElectionZurichJSON(t *testing.T) {
	out, errOut, code := cli(t, "", "election", "-format", "json", "engine/election/testdata/zurich-2018.json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	v, err := jsondoc.Parse([]byte(out))
	if err != nil {
		t.Fatalf("not JSON: %v", err)
	}
	if v.Get("kind").Text != "election-result" || v.Get("system").Text != "biproportional" || v.Get("seats").Text != "125" {
		t.Errorf("kind %s, system %s, seats %s", v.Get("kind").Text, v.Get("system").Text, v.Get("seats").Text)
	}
	want := map[string]string{"SP": "43", "SVP": "17", "FDP": "21", "Grüne": "16", "glp": "14", "AL": "10", "EVP/BDP": "4"}
	for _, p := range v.Get("parties").Items {
		if got := p.Get("seats").Text; got != want[p.Get("name").Text] {
			t.Errorf("%s: %s seats, want %s", p.Get("name").Text, got, want[p.Get("name").Text])
		}
		if d := p.Get("divisor"); d == nil || d.Kind != jsondoc.String {
			t.Errorf("%s: divisor %v, want a string", p.Get("name").Text, d)
		}
	}
	for _, d := range v.Get("districts").Items {
		for _, k := range []string{"name", "seats", "divisor"} {
			if d.Get(k).IsNull() {
				t.Errorf("district lacks %s", k)
			}
		}
	}
	cells := v.Get("cells").Items
	if len(cells) != 63 {
		t.Errorf("%d cells, want 63", len(cells))
	}
	// Published: SP 4 seats in district 1+2, EVP/BDP 2 in district 11.
	for _, c := range cells {
		for _, k := range []string{"district", "party", "votes", "seats"} {
			if c.Get(k) == nil {
				t.Fatalf("cell lacks %s", k)
			}
		}
		d, p, s := c.Get("district").Text, c.Get("party").Text, c.Get("seats").Text
		if (d == "1+2" && p == "SP" && s != "4") || (d == "11" && p == "EVP/BDP" && s != "2") {
			t.Errorf("%s in %s: %s seats", p, d, s)
		}
	}
	if ties := v.Get("ties"); ties.Kind != jsondoc.Array || len(ties.Items) != 0 {
		t.Errorf("ties %v", ties)
	}
	if c := v.Get("certificate"); c.IsNull() || !c.Get("strict").Bool || !c.Get("checked").Bool {
		t.Errorf("certificate %v", c)
	}
}

// New Zealand 2008 through the binary: 122 seats with two overhang seats.
func TestElectionNewZealand(t *testing.T) {
	out, errOut, code := cli(t, "", "election", "engine/election/testdata/new-zealand-2008.json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	flat := strings.Join(strings.Fields(out), " ")
	for _, want := range []string{"122 seats", "House of 120 before overhang", "Māori Party"} {
		if !strings.Contains(flat, want) {
			t.Errorf("output lacks %q:\n%s", want, out)
		}
	}
}

func TestElectionFormats(t *testing.T) {
	args := []string{"election", "-system", "districts", "-method", "dhondt"}
	demo := "testdata/demo/vessaria-election.csv"
	out, _, code := cli(t, "", append(args, "-format", "csv", demo)...)
	// CSV is data: the settings lead every row, marks are true or false.
	head := "system,method,upper_method,house_size,base_seats,compensatory,overhang_rule,upper_basis,threshold,threshold_scope,threshold_base,alternative_wins,tie_rule,"
	if code != 0 || !strings.HasPrefix(out, head+"district,party,votes,seats,excluded,tied,unassigned\n") ||
		!strings.Contains(out, "\ndistricts,jefferson,,60,,,,,0,,,,none,Orlen,Lantern Party,512300,8,false,false,0\n") {
		t.Errorf("csv cells (exit %d):\n%s", code, out)
	}
	out, _, _ = cli(t, "", append(args, "-format", "csv", "-table", "parties", demo)...)
	if !strings.HasPrefix(out, head+"party,votes,qualified,reason,exempt,seats,") || !strings.Contains(out, ",Lantern Party,1428840,true,no threshold,false,23,") {
		t.Errorf("csv parties:\n%s", out)
	}
	out, _, _ = cli(t, "", append(args, "-format", "markdown", demo)...)
	if !strings.Contains(out, "### Seats by district and party") || !strings.Contains(out, "| Orlen ") || !strings.Contains(out, "> Not an official") {
		t.Errorf("markdown:\n%s", out)
	}
	_, errOut, code := cli(t, "", append(args, "-format", "csv", "-table", "matrix", demo)...)
	if code != 2 || !strings.Contains(errOut, "-table: unknown table") {
		t.Errorf("bad -table: exit %d, %s", code, errOut)
	}
}

// The districts' seats may come from a second file; standard input works.
func TestElectionTwoFiles(t *testing.T) {
	dir := t.TempDir()
	seats := filepath.Join(dir, "seats.csv")
	os.WriteFile(seats, []byte("district,seats\nNorth,5\nSouth,3\n"), 0o644)
	votes := "district,party,votes\nNorth,Lantern,5200\nNorth,Harbour,3100\nSouth,Lantern,900\nSouth,Harbour,2950\n"
	out, errOut, code := cli(t, votes, "election", "-system", "districts", "-method", "sainte-lague", "-format", "csv", "-table", "parties", "-", seats)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if !strings.Contains(out, ",Lantern,6100,true,no threshold,false,4,") || !strings.Contains(out, ",Harbour,6050,true,no threshold,false,4,") {
		t.Errorf("parties:\n%s", out)
	}
}

func TestElectionBadInput(t *testing.T) {
	dir := t.TempDir()
	write := func(name, body string) string {
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	unknown := write("unknown.csv", "district,party,votes\nNorth,A,10\nSouth,B,7\n\ndistrict,seats\nNorth,3\n")
	negative := write("neg.json", "{\n  \"kind\": \"election\",\n  \"system\": \"districts\",\n  \"method\": \"dhondt\",\n  \"districts\": [{\"name\": \"North\", \"seats\": 3}],\n  \"votes\": [\n    {\"district\": \"North\", \"party\": \"A\", \"votes\": \"-4\"}\n  ]\n}\n")
	noseats := write("noseats.csv", "district,party,votes\nNorth,A,10\n\ndistrict,seats\nNorth,\n")
	infeasible := write("infeasible.csv", "district,party,votes\nNorth,A,10\nNorth,B,10\nSouth,A,10\n\ndistrict,seats\nNorth,1\nSouth,1\n")
	for _, tc := range []struct {
		args []string
		code int
		want string
	}{
		{[]string{"election", "-system", "districts", "-method", "dhondt", unknown}, 1, "unknown.csv:3: votes[1].district: unknown district \"South\""},
		{[]string{"election", negative}, 1, "neg.json:7: votes[0].votes: \"A\": \"-4\" is not a count: counts cannot be negative"},
		{[]string{"election", "-system", "districts", "-method", "dhondt", noseats}, 1, "noseats.csv:5: districts[0].seats"},
		{[]string{"election", "-system", "biproportional", "-method", "adams", infeasible}, 1, "no lower apportionment exists"},
		{[]string{"election", "-method", "dhondt", unknown}, 2, "no system: give -system"},
		{[]string{"election", "-system", "proportional", unknown}, 2, "-system: unknown system \"proportional\""},
		{[]string{"election", "-system", "biproportional", "-method", "hamilton", unknown}, 1, "needs a divisor method"},
		{[]string{"election", "-threshold-scope", "district", unknown}, 2, "qualify -threshold"},
		{[]string{"election", "-system", "districts", "-method", "dhondt", "-threshold", "150%", unknown}, 2, "-threshold:"},
		{[]string{"election", "-system", "districts", "-method", "dhondt", filepath.Join(dir, "missing.csv")}, 1, "missing.csv: cannot read"},
		{[]string{"election"}, 2, "expected FILE"},
	} {
		_, errOut, code := cli(t, "", tc.args...)
		if code != tc.code || !strings.Contains(errOut, tc.want) {
			t.Errorf("%v: exit %d, stderr %q; want exit %d and %q", tc.args[1:], code, errOut, tc.code, tc.want)
		}
	}
}

// A tie leaves seats unassigned (exit 3) until a rule settles it.
func TestElectionTie(t *testing.T) {
	in := "district,party,votes\nNorth,A,100\nNorth,B,100\nSouth,A,100\nSouth,B,100\n\ndistrict,seats\nNorth,1\nSouth,1\n"
	out, errOut, code := cli(t, in, "election", "-system", "biproportional", "-method", "webster", "-")
	if code != 3 {
		t.Fatalf("exit %d, want 3: %s", code, errOut)
	}
	if !strings.Contains(strings.Join(strings.Fields(out), " "), "TIE (lower): A in North, B in North, A in South, B in South contest 2 seats; left unassigned") {
		t.Errorf("tie not reported:\n%s", out)
	}
	out, errOut, code = cli(t, in, "election", "-system", "biproportional", "-method", "webster", "-tiebreak", "order", "-format", "json", "-")
	if code != 0 {
		t.Fatalf("with a rule: exit %d: %s", code, errOut)
	}
	v, err := jsondoc.Parse([]byte(out))
	if err != nil {
		t.Fatal(err)
	}
	ties := v.Get("ties").Items
	if len(ties) != 1 || ties[0].Get("stage").Text != "lower" || len(ties[0].Get("winners").Items) != 2 {
		t.Errorf("ties: %s", out)
	}
	w := ties[0].Get("winners").Items[0]
	if w.Get("district").Text != "North" || w.Get("party").Text != "A" {
		t.Errorf("input order gave the first seat to %s in %s", w.Get("party").Text, w.Get("district").Text)
	}
}

// An election's files are read as every command reads its files: names
// compared in Unicode normalization form C, text that is not text refused
// by file and line, a file that is not a table refused at its start, an
// endless input refused at a limit it names.
func TestElectionInputAsEveryInput(t *testing.T) {
	args := []string{"election", "-system", "districts", "-method", "dhondt", "-format", "csv", "-table", "parties", "-"}
	// "Café" composed in North, decomposed in South: one party.
	in := "district,party,votes\nNorth,Caf\u00e9,10\nNorth,Mill,6\nSouth,Cafe\u0301,12\nSouth,Mill,4\n\ndistrict,seats\nNorth,2\nSouth,2\n"
	out, errOut, code := cli(t, in, args...)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if recs := checkCSVData(t, out); len(recs) != 3 || !strings.Contains(out, ",Café,22,") {
		t.Errorf("the two spellings were taken for two parties:\n%s", out)
	}
	utf16 := string([]byte{0xFF, 0xFE, 'd', 0, 'i', 0, 's', 0})
	for _, c := range []struct{ in, want string }{
		{"district,party,votes\nNorth,Caf\xe9,10\n\ndistrict,seats\nNorth,3\n", "stdin:2: votes[0].party: the text is not UTF-8 text"},
		{"district,party,votes\nNorth,A\x00,10\n\ndistrict,seats\nNorth,3\n", "stdin:2: holds a NUL byte (byte 29): this is not a text file"},
		{utf16, "stdin:1: the file is UTF-16 text (it starts with a UTF-16 byte-order mark); save it as UTF-8"},
		{"[{\"kind\": \"election\"}]", "stdin:1: a JSON array; an election scenario is a JSON object"},
		{"{\"kind\": \"election\", \"districts\": [{\"name\": \"N\\u0000\", \"seats\": 1}], \"votes\": []}", "districts[0].name: the text holds a NUL byte"},
	} {
		_, errOut, code := cli(t, c.in, args...)
		if code != 1 || !strings.Contains(errOut, c.want) {
			t.Errorf("exit %d, %q; want %q", code, errOut, c.want)
		}
	}
	_, errOut, code = cli(t, "", "election", "-system", "districts", "-method", "dhondt", "/dev/zero")
	if code != 1 || !strings.Contains(errOut, "/dev/zero:1: holds a NUL byte (byte 1)") {
		t.Errorf("/dev/zero: exit %d, %q", code, errOut)
	}
	if testing.Short() {
		return
	}
	// An endless table stops at the limit (the readers hold an election
	// whole).
	var b strings.Builder
	b.WriteString("district,party,votes\n")
	for b.Len() <= 128<<20 {
		b.WriteString("North,Lantern Party,100\n")
	}
	_, errOut, code = cli(t, b.String(), args...)
	if code != 1 || !strings.Contains(errOut, "stdin: the file is larger than the limit of 128 MiB for an election") {
		t.Errorf("endless input: exit %d, %q", code, errOut)
	}
}
