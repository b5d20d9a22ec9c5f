package main

import "testing"

func TestRootFree(t *testing.T) {
	for _, c := range []struct{ in, want string }{
		{".a { margin: 1.5rem 0 0.6rem; }\n", ".a { margin: calc(var(--sc-root-size,1rem)*1.5) 0 calc(var(--sc-root-size,1rem)*0.6); }\n"},
		{".a { font: 1rem/1.6 serif; gap: .25rem; }", ".a { font: calc(var(--sc-root-size,1rem)*1)/1.6 serif; gap: calc(var(--sc-root-size,1rem)*.25); }"},
		{"@media (max-width: 40rem) {\n  .a { padding: 0.8rem; }\n}\n", "@media (max-width: 40rem) {\n  .a { padding: calc(var(--sc-root-size,1rem)*0.8); }\n}\n"},
		{".a { width: 12em; border: 1px solid; } /* remove */", ".a { width: 12em; border: 1px solid; } /* remove */"},
	} {
		if got := string(rootFree([]byte(c.in))); got != c.want {
			t.Errorf("rootFree(%q)\n got %q\nwant %q", c.in, got, c.want)
		}
	}
}
