package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestPolyhedronCommands: validate describes a polyhedron (outward faces,
// exact volume and surface area, the first step's tetrahedra), certify
// writes a certificate of the unit cube with Neumann faces (λ1 = 0, λ2 =
// π² ≈ 9.8696, separation of variables, common practice) and check
// verifies it.
func TestPolyhedronCommands(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "cube.json")
	body := `{"domain": {"polyhedron": {"vertices": [["0","0","0"],["1","0","0"],["1","1","0"],["0","1","0"],["0","0","1"],["1","0","1"],["1","1","1"],["0","1","1"]],
		"faces": [[0,3,2,1],[4,7,6,5],[0,1,5,4],[1,2,6,5],[2,3,7,6],[3,0,4,7]]}}, "boundary": "neumann"}`
	if err := os.WriteFile(file, []byte(body), 0o644); err != nil {
		t.Fatal(err)
	}
	code, out, errs := execute("validate", file)
	if code != exitOK {
		t.Fatalf("validate: exit %d, stderr %q", code, errs)
	}
	// The unit cube: volume 1 and surface area 6, exact rationals.
	for _, want := range []string{"polyhedron with 8 vertices and 6 faces", "1 face(s) listed inward", "volume:      1\n", "surface:     6\n", "convexity:   convex", "face 1 [4 5 6 7]: neumann", "96 tetrahedra of degree 3"} {
		if !strings.Contains(out, want) {
			t.Errorf("validate output lacks %q:\n%s", want, out)
		}
	}
	cert := filepath.Join(dir, "cube.cert.json")
	code, out, errs = execute("certify", file, "--rel-width", "1e-2", "-o", cert)
	if code != exitOK {
		t.Fatalf("certify: exit %d, stderr %q", code, errs)
	}
	if !strings.Contains(out, "9.8") {
		t.Errorf("certify output does not show λ2 near π²:\n%s", out)
	}
	if code, out, errs := execute("check", cert); code != exitOK || !strings.Contains(out, "verifies") {
		t.Errorf("check: exit %d, stdout %q, stderr %q", code, out, errs)
	}
}
