package main

// The import rules of the module, checked on the import lists that `go
// list` gives for every package. The check lives with the command because
// the command is the top of the layer order, the one package allowed to
// see every other layer: a test here adds no dependency to any library
// package, and no library code needs the rules at run time.

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os/exec"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

// layerOrder is the layer order of the module, bottom first: the folders
// below the module root, each one layer. A package may import packages of
// its own layer and of the layers before it, never of a later one.
var layerOrder = []string{"interval", "enclose", "fem", "temple", "certs", "cmd"}

// allowedModules are the modules outside the standard library that the
// module's packages may import (their own dependencies come with them).
var allowedModules = []string{"gonum.org/v1/gonum", "github.com/spf13/cobra", "gonum.org/v1/plot"}

// packageImports is one package of the module and what it imports.
type packageImports struct {
	Path        string   // import path
	Imports     []string // imports of the package's own files
	TestImports []string // imports of its test files, in-package and external
}

// layerOf returns the index in layerOrder of the layer of the module
// package path, or −1 if the package lies outside the layer folders.
func layerOf(module, path string) int {
	rest, ok := strings.CutPrefix(path, module+"/")
	if !ok {
		return -1
	}
	top, _, _ := strings.Cut(rest, "/")
	return slices.Index(layerOrder, top)
}

// inModule reports whether path is the module or one of its packages.
func inModule(module, path string) bool {
	return path == module || strings.HasPrefix(path, module+"/")
}

// allowedOutside reports whether path, a package outside the module, is in
// the standard library or in an allowed module.
func allowedOutside(path string, standard func(string) bool) bool {
	if standard(path) {
		return true
	}
	for _, m := range allowedModules {
		if path == m || strings.HasPrefix(path, m+"/") {
			return true
		}
	}
	return false
}

// subLayerOf returns the group of a module package inside its layer: the
// layer folder and the next folder below it that is not "internal"
// ("fem/claim" for gapcert/fem/claim/named, "fem/internal/rattable" for
// itself), or the layer folder alone for the layer's own package
// ("certs").
func subLayerOf(module, path string) string {
	parts := strings.Split(strings.TrimPrefix(path, module+"/"), "/")
	n := 1
	for n < len(parts) && parts[n] == "internal" {
		n++
	}
	return strings.Join(parts[:min(n+1, len(parts))], "/")
}

// checkImports returns every breach of the module's import rules, each
// naming the importing and the imported package:
//
//   - every package lies in one of the layer folders of layerOrder;
//   - a package's own files import only packages of its layer or a lower
//     one, the standard library (standard reports whether a path is in it)
//     and the allowed modules;
//   - its test files import only the module's packages, the standard
//     library and the allowed modules (tests may check a package through
//     a higher layer, e.g. a flux of fem/line through the Lehmann–Goerisch
//     bound of temple: they add nothing to the dependency graph);
//   - inside each layer, the sub-layers (subLayerOf) import each other
//     without a cycle (Go forbids cycles of packages, not of folders: a
//     cycle of folders means two concepts that lean on each other).
func checkImports(module string, pkgs []packageImports, standard func(string) bool) []string {
	var bad []string
	edges := map[string]map[string]string{} // sub-layer → imported sub-layer → one package pair
	for _, p := range pkgs {
		from := layerOf(module, p.Path)
		if from < 0 {
			bad = append(bad, fmt.Sprintf("%s lies outside the layer folders %s", p.Path, strings.Join(layerOrder, ", ")))
			continue
		}
		for _, imp := range p.Imports {
			switch {
			case !inModule(module, imp):
				if !allowedOutside(imp, standard) {
					bad = append(bad, fmt.Sprintf("%s imports %s, which is neither the standard library nor one of the allowed modules %s", p.Path, imp, strings.Join(allowedModules, ", ")))
				}
			case layerOf(module, imp) < 0:
				bad = append(bad, fmt.Sprintf("%s imports %s, which lies outside the layer folders", p.Path, imp))
			case layerOf(module, imp) > from:
				bad = append(bad, fmt.Sprintf("%s imports %s: layer %s above layer %s (order %s)", p.Path, imp, layerOrder[layerOf(module, imp)], layerOrder[from], strings.Join(layerOrder, " → ")))
			case layerOf(module, imp) == from:
				a, b := subLayerOf(module, p.Path), subLayerOf(module, imp)
				if a == b {
					continue
				}
				if edges[a] == nil {
					edges[a] = map[string]string{}
				}
				if _, seen := edges[a][b]; !seen {
					edges[a][b] = p.Path + " imports " + imp
				}
			}
		}
		for _, imp := range p.TestImports {
			if !inModule(module, imp) && !allowedOutside(imp, standard) {
				bad = append(bad, fmt.Sprintf("%s (tests) imports %s, which is neither the standard library nor one of the allowed modules %s", p.Path, imp, strings.Join(allowedModules, ", ")))
			}
		}
	}
	for _, cycle := range subLayerCycles(edges) {
		var why []string
		for i := range cycle {
			why = append(why, edges[cycle[i]][cycle[(i+1)%len(cycle)]])
		}
		bad = append(bad, fmt.Sprintf("sub-layers %s → %s import each other in a cycle (%s)", strings.Join(cycle, " → "), cycle[0], strings.Join(why, "; ")))
	}
	return bad
}

// subLayerCycles returns one cycle of each strongly connected component
// with more than one sub-layer of the graph edges (Tarjan's algorithm; a
// cycle starts at the component's smallest name so that reports are
// stable).
func subLayerCycles(edges map[string]map[string]string) [][]string {
	var nodes []string
	for a, out := range edges {
		nodes = append(nodes, a)
		for b := range out {
			nodes = append(nodes, b)
		}
	}
	slices.Sort(nodes)
	nodes = slices.Compact(nodes)
	successors := func(a string) []string {
		var out []string
		for b := range edges[a] {
			out = append(out, b)
		}
		slices.Sort(out)
		return out
	}
	index, low, onStack := map[string]int{}, map[string]int{}, map[string]bool{}
	var stack []string
	var components [][]string
	var visit func(string)
	visit = func(a string) {
		index[a], low[a] = len(index), len(index)
		stack = append(stack, a)
		onStack[a] = true
		for _, b := range successors(a) {
			if _, seen := index[b]; !seen {
				visit(b)
				low[a] = min(low[a], low[b])
			} else if onStack[b] {
				low[a] = min(low[a], index[b])
			}
		}
		if low[a] == index[a] {
			var comp []string
			for {
				top := stack[len(stack)-1]
				stack = stack[:len(stack)-1]
				onStack[top] = false
				comp = append(comp, top)
				if top == a {
					break
				}
			}
			if len(comp) > 1 {
				components = append(components, comp)
			}
		}
	}
	for _, a := range nodes {
		if _, seen := index[a]; !seen {
			visit(a)
		}
	}
	var cycles [][]string
	for _, comp := range components {
		in := func(x string) bool { return slices.Contains(comp, x) }
		start := slices.Min(comp)
		// Breadth-first search from start back to start inside the
		// component gives a shortest cycle through start.
		prev := map[string]string{}
		queue := []string{start}
		for len(queue) > 0 && prev[start] == "" {
			a := queue[0]
			queue = queue[1:]
			for _, b := range successors(a) {
				if _, seen := prev[b]; in(b) && !seen {
					prev[b] = a
					queue = append(queue, b)
				}
			}
		}
		cycle := []string{start}
		for a := prev[start]; a != start; a = prev[a] {
			cycle = append(cycle, a)
		}
		slices.Reverse(cycle[1:])
		cycles = append(cycles, cycle)
	}
	return cycles
}

// goList runs the go command in dir with args and decodes its stream of
// JSON objects into one value of T each.
func goList[T any](t *testing.T, dir string, args ...string) []T {
	t.Helper()
	goCmd, err := exec.LookPath("go")
	if err != nil {
		t.Fatalf("the go command is needed to list the module's imports: %v", err)
	}
	cmd := exec.Command(goCmd, args...)
	cmd.Dir = dir
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	out, err := cmd.Output()
	if err != nil {
		t.Fatalf("go %s: %v\n%s", strings.Join(args, " "), err, stderr.String())
	}
	var all []T
	dec := json.NewDecoder(bytes.NewReader(out))
	for {
		var v T
		if err := dec.Decode(&v); errors.Is(err, io.EOF) {
			return all
		} else if err != nil {
			t.Fatalf("go %s: %v", strings.Join(args, " "), err)
		}
		all = append(all, v)
	}
}

// TestImportLayers checks the module's own import lists (go list, run at
// the module root) against the import rules of checkImports.
func TestImportLayers(t *testing.T) {
	type module struct{ Path, Dir string }
	mods := goList[module](t, ".", "list", "-m", "-json")
	if len(mods) != 1 {
		t.Fatalf("go list -m: %d main modules, want 1", len(mods))
	}
	mod := mods[0]
	type listed struct {
		ImportPath                         string
		Standard                           bool
		Imports, TestImports, XTestImports []string
	}
	var pkgs []packageImports
	for _, p := range goList[listed](t, mod.Dir, "list", "-json=ImportPath,Imports,TestImports,XTestImports", "./...") {
		pkgs = append(pkgs, packageImports{Path: p.ImportPath, Imports: p.Imports, TestImports: append(p.TestImports, p.XTestImports...)})
	}
	// Every package the module's packages and their tests depend on, to
	// tell the standard library apart ("p [q.test]" is p compiled for
	// the tests of q).
	std := map[string]bool{}
	for _, p := range goList[listed](t, mod.Dir, "list", "-deps", "-test", "-json=ImportPath,Standard", "./...") {
		if p.Standard {
			path, _, _ := strings.Cut(p.ImportPath, " ")
			std[path] = true
		}
	}
	if len(pkgs) < len(layerOrder) || !std["fmt"] {
		t.Fatalf("go list found %d packages and fmt in the standard library: %v; the listing is not the module's", len(pkgs), std["fmt"])
	}
	for _, bad := range checkImports(mod.Path, pkgs, func(path string) bool { return std[path] }) {
		t.Error(bad)
	}
	// Tests that import upward, for the record (go test -v).
	var up []string
	for _, p := range pkgs {
		for _, imp := range p.TestImports {
			if inModule(mod.Path, imp) && layerOf(mod.Path, imp) > layerOf(mod.Path, p.Path) {
				up = append(up, filepath.Base(p.Path)+" tests → "+strings.TrimPrefix(imp, mod.Path+"/"))
			}
		}
	}
	slices.Sort(up)
	t.Logf("test files that check a package through a higher layer: %s", strings.Join(slices.Compact(up), ", "))
}

// TestImportRulesOnFixtures runs checkImports on made-up import lists: a
// clean graph passes, and each kind of breach is reported with the two
// packages it concerns.
func TestImportRulesOnFixtures(t *testing.T) {
	std := func(path string) bool {
		return !strings.Contains(strings.Split(path, "/")[0], ".") && !inModule("m", path)
	}
	clean := []packageImports{
		{Path: "m/interval", Imports: []string{"math", "math/big"}},
		{Path: "m/enclose", Imports: []string{"m/interval", "gonum.org/v1/gonum/mat"}},
		{Path: "m/enclose/internal/geneig", Imports: []string{"gonum.org/v1/gonum/mat"}},
		{Path: "m/enclose/band", Imports: []string{"m/enclose/internal/geneig", "m/enclose"}},
		{Path: "m/fem/claim", Imports: []string{"m/interval"}},
		{Path: "m/fem/claim/named", Imports: []string{"m/fem/claim"}},
		{Path: "m/fem/problem", Imports: []string{"m/fem/claim/named", "m/fem/problem/strictjson"}},
		{Path: "m/fem/line", Imports: []string{"m/fem/problem", "m/enclose/band"}, TestImports: []string{"m/temple", "testing"}},
		{Path: "m/temple", Imports: []string{"m/enclose"}},
		{Path: "m/certs", Imports: []string{"m/fem/claim"}},
		{Path: "m/certs/certify", Imports: []string{"m/certs", "m/temple", "m/fem/line"}},
		{Path: "m/certs/plot", Imports: []string{"gonum.org/v1/plot/vg"}},
		{Path: "m/cmd/gapcert", Imports: []string{"m/certs/certify", "m/certs/plot", "github.com/spf13/cobra"}},
	}
	if bad := checkImports("m", clean, std); len(bad) > 0 {
		t.Fatalf("a graph that keeps the rules is refused: %q", bad)
	}
	with := func(extra ...packageImports) []packageImports { return append(slices.Clone(clean), extra...) }
	for _, tc := range []struct {
		what string
		pkgs []packageImports
		want []string // substrings of the one report
	}{
		{"the problem reader reaching up to the certificates", with(packageImports{Path: "m/fem/problem", Imports: []string{"m/certs/named"}}),
			[]string{"m/fem/problem imports m/certs/named", "layer certs above layer fem"}},
		{"an element package calling the theorem above it", with(packageImports{Path: "m/fem/tri", Imports: []string{"m/temple"}}),
			[]string{"m/fem/tri imports m/temple", "layer temple above layer fem"}},
		{"a solver importing the command", with(packageImports{Path: "m/enclose/sparse", Imports: []string{"m/cmd/gapcert"}}),
			[]string{"m/enclose/sparse imports m/cmd/gapcert", "layer cmd above layer enclose"}},
		{"a dependency outside the allowed modules", with(packageImports{Path: "m/interval/decimalio", Imports: []string{"github.com/shopspring/decimal"}}),
			[]string{"m/interval/decimalio imports github.com/shopspring/decimal", "neither the standard library"}},
		{"a module whose name only starts like an allowed one", with(packageImports{Path: "m/certs/plot", Imports: []string{"gonum.org/v1/plotter"}}),
			[]string{"m/certs/plot imports gonum.org/v1/plotter"}},
		{"a test dependency outside the allowed modules", with(packageImports{Path: "m/temple", TestImports: []string{"github.com/stretchr/testify/assert"}}),
			[]string{"m/temple (tests) imports github.com/stretchr/testify/assert"}},
		{"a package outside the layer folders", with(packageImports{Path: "m/util", Imports: []string{"fmt"}}),
			[]string{"m/util lies outside the layer folders"}},
		{"an import of a package outside the layer folders", with(packageImports{Path: "m/certs/sweep", Imports: []string{"m/internal/pool"}}),
			[]string{"m/certs/sweep imports m/internal/pool, which lies outside the layer folders"}},
		{"the claim catalogue and the problem reader leaning on each other", with(packageImports{Path: "m/fem/claim/named", Imports: []string{"m/fem/claim", "m/fem/problem"}}),
			[]string{"sub-layers fem/claim → fem/problem → fem/claim", "m/fem/claim/named imports m/fem/problem", "m/fem/problem imports m/fem/claim/named"}},
		{"a three-folder cycle through an internal package", with(
			packageImports{Path: "m/certs/internal/pool", Imports: []string{"m/certs/sweep"}},
			packageImports{Path: "m/certs/sweep", Imports: []string{"m/certs/certify"}},
			packageImports{Path: "m/certs/certify", Imports: []string{"m/certs", "m/certs/internal/pool"}}),
			[]string{"sub-layers certs/certify → certs/internal/pool → certs/sweep → certs/certify"}},
	} {
		bad := checkImports("m", tc.pkgs, std)
		if len(bad) != 1 {
			t.Errorf("%s: %d reports, want 1: %q", tc.what, len(bad), bad)
			continue
		}
		for _, w := range tc.want {
			if !strings.Contains(bad[0], w) {
				t.Errorf("%s: report %q does not say %q", tc.what, bad[0], w)
			}
		}
	}
}
