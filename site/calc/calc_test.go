package calc

import (
	"os"
	"strings"
	"testing"

	"seatsmith/engine/jsondoc"
	"seatsmith/site/render"
)

func TestLiveVessaria(t *testing.T) {
	data, err := os.ReadFile("../../testdata/demo/vessaria.json")
	if err != nil {
		t.Fatal(err)
	}
	req := jsondoc.NewObject().Set("block_text", jsondoc.Str(string(data))).Set("id", jsondoc.Str("v")).Set("editor", jsondoc.Boolean(true)).Set("export", jsondoc.Boolean(true))
	resp := Live(req)
	if resp.Get("state").Text != "live" {
		t.Fatalf("state %s: %s", resp.Get("state").Text, jsondoc.Marshal(resp.Get("error")))
	}
	n, ok := render.FromDoc(resp.Get("output"))
	if !ok {
		t.Fatal("output is not a tree")
	}
	h := render.HTML(n)
	if !strings.Contains(h, `data-unit="Orlen" data-seats="12"`) {
		t.Errorf("no Orlen row: %s", h[:400])
	}
	os.WriteFile(os.Getenv("DUMP"), []byte(h), 0o644)
}
