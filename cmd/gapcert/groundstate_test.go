package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gapcert/certs"
)

// TestCertifyGroundStateAndCheck: certify --ground-state writes
// results.ground_state (the double well V = 6(x² − 1)² on (−5/2, 5/2) is
// not log-concave: V(0) = 6 exceeds λ1 ≈ 3.741, so u″ > 0 at its
// symmetric dip), prints it, and check verifies it and rejects an edited
// verdict.
func TestCertifyGroundStateAndCheck(t *testing.T) {
	dir := t.TempDir()
	prob := filepath.Join(dir, "well.json")
	src := `{"name":"double well","domain":{"interval":["-5/2","5/2"]},"potential":"6*(x^2-1)^2","boundary":"dirichlet","points":[["0"],["1"]]}`
	if err := os.WriteFile(prob, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	cert := filepath.Join(dir, "well.cert.json")
	code, out, errs := execute("certify", prob, "-o", cert, "--rel-width", "1e-8", "--ground-state")
	if code != exitOK {
		t.Fatalf("certify: exit %d, stderr %q", code, errs)
	}
	for _, want := range []string{"ground state (positive, unit L2 norm)", "log-concave: disproven", "witness (convex_interval)", "u(0) ∈ [", "u(1) ∈ ["} {
		if !strings.Contains(out, want) {
			t.Errorf("certify output lacks %q:\n%s", want, out)
		}
	}
	data, err := os.ReadFile(cert)
	if err != nil {
		t.Fatal(err)
	}
	c, err := certs.Unmarshal(data)
	if err != nil {
		t.Fatal(err)
	}
	if gs := c.Results.GroundState; gs == nil || gs.LogConcavity != certs.Disproven || len(gs.Points) != 2 {
		t.Fatalf("results.ground_state %+v", gs)
	}
	if code, out, errs := execute("check", cert); code != exitOK || !strings.Contains(out, "verifies") {
		t.Fatalf("check: exit %d, out %q, stderr %q", code, out, errs)
	}
	bad := filepath.Join(dir, "edited.cert.json")
	edited := strings.Replace(string(data), `"log_concavity": "disproven"`, `"log_concavity": "proven"`, 1)
	if edited == string(data) {
		t.Fatal("edit changed nothing")
	}
	if err := os.WriteFile(bad, []byte(edited), 0o644); err != nil {
		t.Fatal(err)
	}
	if code, _, errs := execute("check", bad); code != exitMismatch || !strings.Contains(errs, "ground_state") {
		t.Errorf("check of an edited verdict: exit %d, stderr %q", code, errs)
	}
}
