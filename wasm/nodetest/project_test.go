//go:build !js

package nodetest

import (
	"context"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"seatsmith/engine/format"
	"seatsmith/engine/jsondoc"
	"seatsmith/site/projection"
	"seatsmith/wasm/wasmbuild"
)

// projectConfig is the site's projection block for Vessaria (invented
// counts) with the given error model, draws and seed.
func projectConfig(t testing.TB, errModel, rse string, draws int, seed uint64) *jsondoc.Value {
	t.Helper()
	counts, err := os.ReadFile(filepath.Join("..", "..", "site", "content", "scenarios", "vessaria-counts.csv"))
	if err != nil {
		t.Fatal(err)
	}
	v := jsondoc.NewObject().Set("counts", jsondoc.Str(string(counts))).Set("counts_file", jsondoc.Str("vessaria-counts.csv")).
		Set("seats", jsondoc.Int(40)).Set("method", jsondoc.Str("huntington-hill")).Set("min", jsondoc.Int(1)).
		Set("target", jsondoc.Str("2030-04-01")).Set("error", jsondoc.Str(errModel)).Set("rse", jsondoc.Str(rse)).
		Set("draws", jsondoc.Int(draws)).Set("seed", jsondoc.Str(strconv.FormatUint(seed, 10))) // as the form gives it: a JavaScript number cannot hold every seed
	cl := jsondoc.NewObject().Set("id", jsondoc.Str("c")).Set("kind", jsondoc.Str("lose-above")).
		Set("unit", jsondoc.Str("Caldmoor")).Set("p", jsondoc.Str("50%"))
	return v.Set("claims", jsondoc.NewArray(cl))
}

// runProjectUnderNode runs every config in the engine under Node in
// chunks of chunk draws and returns one output line per config.
func runProjectUnderNode(t testing.TB, configs []*jsondoc.Value, chunk int) []*jsondoc.Value {
	t.Helper()
	mods, node := modules(t)
	wasm := filepath.Join(mods, wasmbuild.Analysis.File)
	dir := t.TempDir()
	cases := jsondoc.NewArray()
	for _, c := range configs {
		cases.Append(jsondoc.NewObject().Set("config", c).Set("chunk", jsondoc.Int(chunk)))
	}
	casesPath, outPath := filepath.Join(dir, "cases.json"), filepath.Join(dir, "out.ndjson")
	if err := os.WriteFile(casesPath, jsondoc.Marshal(cases), 0o644); err != nil {
		t.Fatal(err)
	}
	cmd := exec.Command(node, "--stack-size=8192", filepath.Join("testdata", "project.js"), execJS(mods), wasm, casesPath, outPath)
	if msg, err := cmd.CombinedOutput(); err != nil {
		t.Fatalf("node: %v\n%s", err, msg)
	}
	data, err := os.ReadFile(outPath)
	if err != nil {
		t.Fatal(err)
	}
	var out []*jsondoc.Value
	for _, l := range strings.Split(strings.TrimSpace(string(data)), "\n") {
		v, err := jsondoc.Parse([]byte(l))
		if err != nil {
			t.Fatal(err)
		}
		out = append(out, v)
	}
	if len(out) != len(configs) {
		t.Fatalf("node wrote %d results for %d studies", len(out), len(configs))
	}
	return out
}

// sameJSON reports the first place where a and b differ: strings,
// booleans and structure exactly, numbers by their float64 value (Go and
// JavaScript may write the same number differently, 1e-05 and 0.00001).
func sameJSON(path string, a, b *jsondoc.Value) string {
	if a.Kind != b.Kind {
		return path + ": " + a.Kind.String() + " against " + b.Kind.String()
	}
	switch a.Kind {
	case jsondoc.Number:
		x, _ := strconv.ParseFloat(a.Text, 64)
		y, _ := strconv.ParseFloat(b.Text, 64)
		if x != y {
			return path + ": " + a.Text + " against " + b.Text
		}
	case jsondoc.String:
		if a.Text != b.Text {
			return path + ": " + strconv.Quote(a.Text) + " against " + strconv.Quote(b.Text)
		}
	case jsondoc.Bool:
		if a.Bool != b.Bool {
			return path + ": booleans differ"
		}
	case jsondoc.Array:
		if len(a.Items) != len(b.Items) {
			return path + ": " + strconv.Itoa(len(a.Items)) + " items against " + strconv.Itoa(len(b.Items))
		}
		for i := range a.Items {
			if d := sameJSON(path+"["+strconv.Itoa(i)+"]", a.Items[i], b.Items[i]); d != "" {
				return d
			}
		}
	case jsondoc.Object:
		if len(a.Fields) != len(b.Fields) {
			return path + ": " + strconv.Itoa(len(a.Fields)) + " members against " + strconv.Itoa(len(b.Fields))
		}
		for i, f := range a.Fields {
			if b.Fields[i].Key != f.Key {
				return path + ": member " + f.Key + " against " + b.Fields[i].Key
			}
			if d := sameJSON(path+"."+f.Key, f.Value, b.Fields[i].Value); d != "" {
				return d
			}
		}
	}
	return ""
}

// TestProjectionUnderNode runs the projection block's study in the
// WebAssembly engine, in chunks as the page's worker makes them, and
// checks that its projection document equals the native format.ProjectionJSON
// of the same block with the same seed, draw for draw.
func TestProjectionUnderNode(t *testing.T) {
	type study struct {
		errModel, rse string
		draws         int
		seed          uint64
	}
	studies := []study{{"normal", "3%", 2000, 2030}, {"lognormal", "5%", 777, 1}, {"normal", "0.01", 300, 18446744073709551615}}
	var configs []*jsondoc.Value
	for _, s := range studies {
		configs = append(configs, projectConfig(t, s.errModel, s.rse, s.draws, s.seed))
	}
	got := runProjectUnderNode(t, configs, 137)
	for i, cfgDoc := range configs {
		cfg, err := projection.Parse("", 0, cfgDoc)
		if err != nil {
			t.Fatal(err)
		}
		s, err := cfg.Run(context.Background())
		if err != nil {
			t.Fatal(err)
		}
		want := format.ProjectionJSON(s)
		doc := got[i].Get("document")
		if doc == nil {
			t.Fatalf("study %d: the engine gave %s", i, jsondoc.Marshal(got[i]))
		}
		if d := sameJSON("document", want, doc); d != "" {
			t.Errorf("study %d (%+v): the WebAssembly document differs from the native one at %s", i, studies[i], d)
		}
		holds := cfg.Claims[0].Check(s).Holds
		if c := got[i].Get("claims").Items[0].Get("holds"); c.Bool != holds {
			t.Errorf("study %d: the claim holds %v in the browser engine, %v natively", i, c.Bool, holds)
		}
	}
}

// BenchmarkProjectionDraws compares the draws a second of the WebAssembly
// engine under Node with the native engine on one goroutine, in the same
// run: the study is the site's Vessaria block with 20,000 draws.
func BenchmarkProjectionDraws(b *testing.B) {
	const draws = 20000
	cfgDoc := projectConfig(b, "normal", "3%", draws, 7)
	cfg, err := projection.Parse("", 0, cfgDoc)
	if err != nil {
		b.Fatal(err)
	}
	var wasmMS float64
	for i := 0; i < b.N; i++ {
		out := runProjectUnderNode(b, []*jsondoc.Value{cfgDoc}, 500)
		ms, _ := strconv.ParseFloat(out[0].Get("ms").Text, 64)
		wasmMS += ms
	}
	start := time.Now()
	for i := 0; i < b.N; i++ {
		if _, err := cfg.Run(context.Background()); err != nil {
			b.Fatal(err)
		}
	}
	native := float64(draws*b.N) / time.Since(start).Seconds()
	wasm := float64(draws*b.N) / (wasmMS / 1000)
	b.ReportMetric(wasm, "wasm-draws/s")
	b.ReportMetric(native, "native-draws/s")
	b.ReportMetric(wasm/native, "wasm/native")
}
