//go:build !js

package nodetest

import (
	"bytes"
	"compress/gzip"
	"os"
	"os/exec"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"seatsmith/engine/jsondoc"
	"seatsmith/wasm/wasmbuild"
)

// fiftyUnits is an invented calculator block of fifty units with made-up
// names and populations from tens of thousands to millions, 250 seats,
// Huntington–Hill (the scenario of site/calc's BenchmarkLiveFifty).
func fiftyUnits() string {
	first := []string{"Quell", "Vask", "Orn", "Tirr", "Zeph", "Mour", "Kest", "Brin", "Yalt", "Drov"}
	last := []string{"ara", "ion", "esk", "ith", "umbre"}
	var b strings.Builder
	b.WriteString(`{"version": 1, "title": "Fifty invented units", "seats": 250, "method": "huntington-hill", "units": [`)
	x := uint32(2463534242)
	for i := 0; i < 50; i++ {
		x ^= x << 13
		x ^= x >> 17
		x ^= x << 5
		if i > 0 {
			b.WriteString(", ")
		}
		b.WriteString(`{"name": "` + first[i%10] + last[i/10] + `", "population": ` + strconv.Itoa(20000+int(x%3000000)) + `}`)
	}
	b.WriteString("]}")
	return b.String()
}

// BenchmarkInlining compares the calculator module built with the
// compiler's inlining and without it (-gcflags=all=-l), the rest of the
// release flags the same, in the same run: the median and 90th
// percentile of 200 calculator calls under Node as the bridge makes them
// while a reader edits a fifty-unit calculator comparing every method,
// and the module's gzipped size. The release build takes the smaller
// module when its calls stay well within a frame.
//
//	go test -run '^$' -bench Inlining -benchtime 1x ./wasm/nodetest
func BenchmarkInlining(b *testing.B) {
	_, node := modules(b)
	dir := b.TempDir()
	block := filepath.Join(dir, "block.json")
	if err := os.WriteFile(block, []byte(fiftyUnits()), 0o644); err != nil {
		b.Fatal(err)
	}
	execJS, err := wasmbuild.ExecJS()
	if err != nil {
		b.Fatal(err)
	}
	var base []string
	for _, f := range wasmbuild.Flags {
		if !strings.HasPrefix(f, "-gcflags=") {
			base = append(base, f)
		}
	}
	builds := []struct {
		name  string
		flags []string
	}{
		{"inlined", base},
		{"noinline", append(slices.Clone(base), "-gcflags=all=-l")},
	}
	// The builds take turns, so that the machine's load weighs on both.
	ms := map[string][]float64{}
	wasms := map[string]string{}
	for _, bd := range builds {
		wasm := filepath.Join(dir, bd.name+".wasm")
		if err := wasmbuild.CompileWith("", wasmbuild.Calculator.Package, wasm, bd.flags); err != nil {
			b.Fatal(err)
		}
		data, err := os.ReadFile(wasm)
		if err != nil {
			b.Fatal(err)
		}
		wasms[bd.name] = wasm
		b.ReportMetric(float64(gzipLen(data)), bd.name+"-gzip-bytes")
	}
	for range b.N {
		for _, bd := range builds {
			out := filepath.Join(dir, bd.name+".json")
			cmd := exec.Command(node, "--stack-size=8192", filepath.Join("testdata", "calls.js"), execJS, wasms[bd.name], block, "200", out)
			if msg, err := cmd.CombinedOutput(); err != nil {
				b.Fatalf("node: %v\n%s", err, msg)
			}
			res, err := os.ReadFile(out)
			if err != nil {
				b.Fatal(err)
			}
			v, err := jsondoc.Parse(res)
			if err != nil {
				b.Fatal(err)
			}
			for _, x := range v.Get("ms").Items {
				f, _ := strconv.ParseFloat(x.Text, 64)
				ms[bd.name] = append(ms[bd.name], f)
			}
		}
	}
	med := map[string]float64{}
	for _, bd := range builds {
		m := ms[bd.name]
		slices.Sort(m)
		med[bd.name] = m[len(m)/2]
		b.ReportMetric(m[len(m)/2], bd.name+"-median-ms")
		b.ReportMetric(m[len(m)*9/10], bd.name+"-p90-ms")
	}
	b.ReportMetric(med["noinline"]/med["inlined"], "noinline/inlined")
}

// gzipLen is the size of data compressed by gzip at its best compression.
func gzipLen(data []byte) int {
	var buf bytes.Buffer
	w, _ := gzip.NewWriterLevel(&buf, gzip.BestCompression)
	w.Write(data)
	w.Close()
	return buf.Len()
}
