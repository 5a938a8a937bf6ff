package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/interval"
	"gapcert/interval/decimalio"
)

// TestPolyhedronMixedFacesCommands: certify and check end to end on a
// polyhedron with one Dirichlet face (z = 0) and five Neumann faces, one
// of them listed inward. The unit cube then separates into Neumann in x
// and y (j²π², j ≥ 0) and Dirichlet–Neumann in z ((l − 1/2)²π², l ≥ 1;
// common practice): λ1 = π²/4, λ2 = 5π²/4 (twice). The written
// certificate contains both and verifies; edits of a face's condition, of
// the degree out of range and of the stage-A levels beyond the memory
// budget are reported with their exit status before anything is
// recomputed.
func TestPolyhedronMixedFacesCommands(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "cube.json")
	body := `{"domain": {"polyhedron": {"vertices": [["0","0","0"],["1","0","0"],["1","1","0"],["0","1","0"],["0","0","1"],["1","0","1"],["1","1","1"],["0","1","1"]],
		"faces": [[0,3,2,1],[4,5,6,7],[0,4,5,1],[2,3,7,6],[1,2,6,5],[0,4,7,3]]}},
		"boundary": ["dirichlet", "neumann", "neumann", "neumann", "neumann", "neumann"]}`
	if err := os.WriteFile(file, []byte(body), 0o644); err != nil {
		t.Fatal(err)
	}
	cert := filepath.Join(dir, "cube.cert.json")
	code, out, errs := execute("certify", file, "--rel-width", "5e-3", "-o", cert)
	if code != exitOK {
		t.Fatalf("certify: exit %d, stderr %q", code, errs)
	}
	if !strings.Contains(out, "target 5e-3: reached") {
		t.Errorf("certify output:\n%s", out)
	}
	data, err := os.ReadFile(cert)
	if err != nil {
		t.Fatal(err)
	}
	c, err := certs.Unmarshal(data)
	if err != nil {
		t.Fatal(err)
	}
	pi2 := interval.Pi().Sqr()
	for k, want := range []interval.I{pi2.DivF(4), pi2.MulF(5).DivF(4)} {
		lo, err1 := decimalio.Parse(c.Results.Eigenvalues[k].Lower)
		hi, err2 := decimalio.Parse(c.Results.Eigenvalues[k].Upper)
		if err1 != nil || err2 != nil {
			t.Fatal(err1, err2)
		}
		if !(lo.Lo <= want.Lo && want.Hi <= hi.Hi) || hi.Hi-lo.Lo > 5e-3*want.Hi {
			t.Errorf("λ%d ∈ [%v, %v], want a narrow enclosure of %v", k+1, lo.Lo, hi.Hi, want)
		}
	}
	if code, out, errs := execute("check", cert); code != exitOK || !strings.Contains(out, "verifies") {
		t.Fatalf("check: exit %d, stdout %q, stderr %q", code, out, errs)
	}
	for _, e := range []struct {
		name, old, new string
		code           int
		want           string
	}{
		{"a face's condition", `"dirichlet",`, `"neumann",`, exitMismatch, "problem_sha256"},
		{"degree out of range", `"degree": 3,`, `"degree": 13,`, exitMismatch, "method.degree 13 out of range (1 to 12 on polyhedra)"},
		{"flux degree out of range", `"flux_degree": 3,`, `"flux_degree": 13,`, exitMismatch, "method.flux_degree 13 out of range (0 to 12 on polyhedra)"},
		{"stage-A levels beyond memory", `"stage_a_refinements": 2,`, `"stage_a_refinements": 6,`, exitInvalid, "more than the memory budget"},
	} {
		if !strings.Contains(string(data), e.old) {
			t.Fatalf("%s: no %s in the certificate", e.name, e.old)
		}
		bad := filepath.Join(dir, "edited.cert.json")
		if err := os.WriteFile(bad, []byte(strings.Replace(string(data), e.old, e.new, 1)), 0o644); err != nil {
			t.Fatal(err)
		}
		if code, _, errs := execute("check", bad); code != e.code || !strings.Contains(errs, e.want) {
			t.Errorf("%s: exit %d, stderr %q; want exit %d naming %q", e.name, code, errs, e.code, e.want)
		}
	}
}
