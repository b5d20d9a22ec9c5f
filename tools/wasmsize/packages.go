package main

import (
	"os"
	"os/exec"
	"regexp"
	"sort"
	"strings"

	"seatsmith/wasm/wasmbuild"
)

// heavyPackages are the packages that weigh most for what they give a
// WebAssembly module (reflection, formatting, the operating system), whose
// importers wasmsize names.
var heavyPackages = []string{"fmt", "reflect", "encoding/json", "encoding/csv", "text/template", "html/template", "os"}

// namedFlags are the release flags with the linker keeping the name
// section (-s dropped): the code is the same, with function names.
func namedFlags() []string {
	var out []string
	for _, f := range wasmbuild.Flags {
		if strings.HasPrefix(f, "-ldflags=") {
			var keep []string
			for _, x := range strings.Fields(strings.TrimPrefix(f, "-ldflags=")) {
				if x != "-s" {
					keep = append(keep, x)
				}
			}
			f = "-ldflags=" + strings.Join(keep, " ")
		}
		out = append(out, f)
	}
	return out
}

// attribute builds pkg again keeping function names and adds up the code
// of each package into b.Packages; it also finds who imports the heavy
// packages.
func attribute(b *build, dir, pkg, out string) error {
	if err := wasmbuild.CompileWith(dir, pkg, out, namedFlags()); err != nil {
		return err
	}
	data, err := os.ReadFile(out)
	if err != nil {
		return err
	}
	m, err := readModule(data)
	if err != nil {
		return err
	}
	deps, err := listDeps(dir, pkg)
	if err != nil {
		return err
	}
	paths := map[string]string{}
	for _, d := range deps {
		paths[mangle.ReplaceAllString(d.path, "_")] = d.path
	}
	if len(deps) > 0 {
		paths["main"] = deps[len(deps)-1].path // the program's own package comes last
	}
	b.Packages = map[string]int{}
	for _, f := range m.funcs {
		b.Packages[packageOf(f.name, paths)] += f.size
	}
	b.Funcs = append([]function(nil), m.funcs...)
	sort.SliceStable(b.Funcs, func(i, j int) bool { return b.Funcs[i].size > b.Funcs[j].size })
	b.Importers = importers(deps, heavyPackages)
	return nil
}

// A dep is one package a program is built from, with its imports.
type dep struct {
	path    string
	imports []string
}

// listDeps runs go list -deps for js/wasm: every package pkg is built
// from, dependencies first.
func listDeps(dir, pkg string) ([]dep, error) {
	cmd := exec.Command("go", "list", "-deps", "-f", "{{.ImportPath}}{{range .Imports}} {{.}}{{end}}", pkg)
	cmd.Dir = dir
	cmd.Env = append(os.Environ(), "GOOS=js", "GOARCH=wasm")
	var stderr strings.Builder
	cmd.Stderr = &stderr
	out, err := cmd.Output()
	if err != nil {
		return nil, &listError{pkg, err, stderr.String()}
	}
	var deps []dep
	for _, l := range strings.Split(strings.TrimSpace(string(out)), "\n") {
		f := strings.Fields(l)
		if len(f) > 0 {
			deps = append(deps, dep{f[0], f[1:]})
		}
	}
	return deps, nil
}

type listError struct {
	pkg    string
	err    error
	stderr string
}

func (e *listError) Error() string {
	return "go list -deps " + e.pkg + ": " + e.err.Error() + "\n" + strings.TrimSpace(e.stderr)
}

// importers maps each of the packages heavy that deps hold to the
// packages of deps that import it, sorted.
func importers(deps []dep, heavy []string) map[string][]string {
	want := map[string]bool{}
	for _, h := range heavy {
		want[h] = true
	}
	in := map[string]bool{}
	for _, d := range deps {
		in[d.path] = true
	}
	out := map[string][]string{}
	for _, d := range deps {
		for _, imp := range d.imports {
			if want[imp] && in[imp] {
				out[imp] = append(out[imp], d.path)
			}
		}
	}
	for _, v := range out {
		sort.Strings(v)
	}
	return out
}

// The linker writes function names with every character other than
// letters, digits, '_' and '.' replaced by '_' (cmd/link's wasm writer).
var mangle = regexp.MustCompile(`[^\w.]`)

// packageOf returns the package of a mangled function name: the longest
// known package path that, followed by '.', begins the name. Functions of
// no package (type equality and hash functions, wrappers) are grouped by
// their prefix.
func packageOf(name string, paths map[string]string) string {
	best := ""
	for i := 0; i < len(name); i++ {
		if name[i] != '.' {
			continue
		}
		if p, ok := paths[name[:i]]; ok && len(p) > len(best) {
			best = p
		}
	}
	if best != "" {
		return best
	}
	if i := strings.IndexAny(name, "._"); i > 0 {
		return "(" + name[:i] + ")"
	}
	return "(other)"
}

type pkgSize struct {
	path             string
	module, baseline int
}

// topPackages lists the n packages with the most code in m, largest
// first, with their code in the minimal program.
func topPackages(m, minimal *build, n int) []pkgSize {
	var ps []pkgSize
	for p, size := range m.Packages {
		ps = append(ps, pkgSize{p, size, minimal.Packages[p]})
	}
	sort.Slice(ps, func(i, j int) bool {
		if ps[i].module != ps[j].module {
			return ps[i].module > ps[j].module
		}
		return ps[i].path < ps[j].path
	})
	if len(ps) > n {
		ps = ps[:n]
	}
	return ps
}
