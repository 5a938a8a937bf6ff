package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestPlotPolyhedron: plot draws a polyhedron's problem file (the solid
// and two approximate modes on a slice), and refuses a slice that misses
// the solid, a badly written one, a slice for another input and a polygon
// problem, each before computing and writing nothing.
func TestPlotPolyhedron(t *testing.T) {
	dir := t.TempDir()
	cube := filepath.Join(dir, "cube.json")
	body := `{"name": "unit cube", "domain": {"polyhedron": {"vertices": [["0","0","0"],["1","0","0"],["1","1","0"],["0","1","0"],["0","0","1"],["1","0","1"],["1","1","1"],["0","1","1"]],
		"faces": [[0,3,2,1],[4,5,6,7],[0,1,5,4],[1,2,6,5],[2,3,7,6],[3,0,4,7]]}}, "boundary": ["dirichlet", "neumann", "dirichlet", "dirichlet", "dirichlet", "dirichlet"]}`
	square := filepath.Join(dir, "square.json")
	if err := os.WriteFile(cube, []byte(body), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(square, []byte(`{"domain": {"polygon": [["0","0"],["1","0"],["1","1"],["0","1"]]}, "boundary": "dirichlet"}`), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "cube.svg")
	code, stdout, errs := execute("plot", cube, "--slice", "y=1/3", "-o", out)
	if code != exitOK || errs != "" || !strings.Contains(stdout, "on the slice y = 1/3") || !strings.Contains(stdout, "approximations, not bounds") {
		t.Fatalf("exit %d, stdout %q, stderr %q", code, stdout, errs)
	}
	for _, f := range []string{"cube.svg", "cube-mode1.svg", "cube-mode2.svg"} {
		data, err := os.ReadFile(filepath.Join(dir, f))
		if err != nil || len(data) == 0 {
			t.Fatalf("%s: %v", f, err)
		}
		if f != "cube.svg" && !strings.Contains(string(data), "approximation, not a bound") {
			t.Errorf("%s does not say it is an approximation", f)
		}
	}

	refused := filepath.Join(dir, "refused.png")
	for _, c := range []struct {
		args []string
		errs string
	}{
		{[]string{"plot", cube, "--slice", "z=3/2", "-o", refused}, "slice z = 1.5: the plane misses the solid, whose z runs from 0 to 1 (hint: give a value strictly between 0 and 1)"},
		{[]string{"plot", cube, "--slice", "x=0", "-o", refused}, "slice x = 0: the plane misses the solid"},
		{[]string{"plot", cube, "--slice", "z:1/2", "-o", refused}, `slice "z:1/2": want AXIS=VALUE with AXIS x, y or z (hint: --slice z=1/2)`},
		{[]string{"plot", cube, "--x", "a", "-o", refused}, "--x belongs to a sweep; " + cube + " is a problem file"},
		{[]string{"plot", square, "-o", refused}, "a problem file is drawn here only for a polyhedron (hint: certify --plot DIR draws an interval, a polygon, a box or a prism)"},
		{[]string{"plot", filepath.Join(testSweeps, "convex"), "--x", "c", "--quantity", "gap", "--slice", "z=1/2", "-o", refused}, "--slice belongs to the problem file of a polyhedron"},
	} {
		code, _, errs := execute(c.args...)
		if code != exitFailure || !strings.Contains(errs, c.errs) {
			t.Errorf("%v: exit %d, stderr %q, want exit %d and %q", c.args, code, errs, exitFailure, c.errs)
		}
		if _, err := os.Stat(refused); err == nil {
			t.Fatalf("%v: a picture was written", c.args)
		}
	}
}
