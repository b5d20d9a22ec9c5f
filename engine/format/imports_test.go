package format_test

import (
	"go/build"
	"testing"
)

// TestLightImports: the packages the WebAssembly engine imports to build
// and write documents (this one, its csv and json encoders, the markup
// tree and the chart) import no package built on reflection.
func TestLightImports(t *testing.T) {
	heavy := map[string]bool{"fmt": true, "reflect": true, "encoding/json": true, "encoding/csv": true, "html/template": true, "text/template": true}
	for _, dir := range []string{".", "csv", "json", "../render", "../render/chart"} {
		p, err := build.ImportDir(dir, 0)
		if err != nil {
			t.Fatal(err)
		}
		for _, imp := range p.Imports {
			if heavy[imp] {
				t.Errorf("%s imports %s", p.ImportPath, imp)
			}
		}
	}
}
