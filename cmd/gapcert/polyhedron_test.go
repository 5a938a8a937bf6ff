package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestPolyhedronCommands: validate describes a polyhedron (outward faces,
// exact volume and surface area) and certify refuses it with exit status 2
// and the true reason, writing nothing.
func TestPolyhedronCommands(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "cube.json")
	body := `{"domain": {"polyhedron": {"vertices": [["0","0","0"],["1","0","0"],["1","1","0"],["0","1","0"],["0","0","1"],["1","0","1"],["1","1","1"],["0","1","1"]],
		"faces": [[0,3,2,1],[4,7,6,5],[0,1,5,4],[1,2,6,5],[2,3,7,6],[3,0,4,7]]}}, "boundary": "dirichlet"}`
	if err := os.WriteFile(file, []byte(body), 0o644); err != nil {
		t.Fatal(err)
	}
	code, out, errs := execute("validate", file)
	if code != exitOK {
		t.Fatalf("validate: exit %d, stderr %q", code, errs)
	}
	// The unit cube: volume 1 and surface area 6, exact rationals.
	for _, want := range []string{"polyhedron with 8 vertices and 6 faces", "1 face(s) listed inward", "volume:      1\n", "surface:     6\n", "convexity:   convex", "face 1 [4 5 6 7]: dirichlet", "polyhedra cannot be certified yet"} {
		if !strings.Contains(out, want) {
			t.Errorf("validate output lacks %q:\n%s", want, out)
		}
	}
	cert := filepath.Join(dir, "cube.cert.json")
	code, _, errs = execute("certify", file, "-o", cert)
	if code != exitInvalid || !strings.Contains(errs, "domain.polyhedron: polyhedra cannot be certified yet") {
		t.Errorf("certify: exit %d, stderr %q", code, errs)
	}
	if _, err := os.Stat(cert); err == nil {
		t.Error("a certificate was written for a polyhedron")
	}
}
