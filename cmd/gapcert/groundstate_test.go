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

// humpFamily is −u″ + 2(1 − x²)u = λu on (−1, 1) with Robin ends over α,
// with the ground state asked for. By symmetry u′(0) = 0, so
// (log u)″(0) = 2 − λ1: not log-concave while λ1 < 2 (α = 0: λ1 ≤ 4/3, the
// mean of V), log-concave once λ1 > 2 = max V (α = 4: the certified λ1 is
// about 3.2, measured).
const humpFamily = `{"name": "hump", "template": {"name": "hump", "domain": {"interval": ["-1", "1"]}, "potential": "2*(1-x^2)",
  "boundary": {"robin": "alpha"}, "points": [["-1"], ["0"], ["1"]]},
  "parameters": [{"name": "alpha", "values": ["0", "4"]}], "relative_width": "1e-8", "ground_state": true}`

// TestSweepGroundStateAndPlots: a family with "ground_state": true prints
// the count of verdicts and writes them into the summary; plot draws them
// against α (--log-concavity) and draws one certificate's ground state
// after re-verifying it; the refusals say why.
func TestSweepGroundStateAndPlots(t *testing.T) {
	dir := t.TempDir()
	fam := filepath.Join(dir, "hump.json")
	if err := os.WriteFile(fam, []byte(humpFamily), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "sweep")
	code, stdout, errs := execute("sweep", fam, "--out", out, "--quiet")
	if code != exitOK || !strings.Contains(stdout, "ground state log-concave: 1 proven, 1 disproven (with a witness), 0 undecided") {
		t.Fatalf("sweep: exit %d, stdout %q, stderr %q", code, stdout, errs)
	}
	csv, err := os.ReadFile(filepath.Join(out, "summary.csv"))
	if err != nil || !strings.Contains(string(csv), ",disproven,convex_interval,") || !strings.Contains(string(csv), ",proven,,") {
		t.Errorf("summary.csv lacks the verdicts (%v):\n%s", err, csv)
	}

	pic := filepath.Join(dir, "verdicts.svg")
	if code, stdout, errs := execute("plot", out, "--x", "alpha", "--log-concavity", "-o", pic); code != exitOK || !strings.Contains(stdout, "picture written to") {
		t.Fatalf("plot --log-concavity: exit %d, stdout %q, stderr %q", code, stdout, errs)
	}
	if svg, err := os.ReadFile(pic); err != nil || !strings.Contains(string(svg), "certified verdicts: is the ground state log-concave?") {
		t.Errorf("verdict picture lacks its title (%v)", err)
	}

	files, _ := filepath.Glob(filepath.Join(out, "p0000-*.cert.json"))
	if len(files) != 1 {
		t.Fatalf("certificates of point 0: %v", files)
	}
	one := filepath.Join(dir, "one.svg")
	if code, stdout, errs := execute("plot", files[0], "-o", one); code != exitOK || !strings.Contains(stdout, "certificate verifies; picture written to") {
		t.Fatalf("plot CERT: exit %d, stdout %q, stderr %q", code, stdout, errs)
	}
	if svg, err := os.ReadFile(one); err != nil || !strings.Contains(string(svg), "log-concave: disproven (certified witness)") || !strings.Contains(string(svg), "at the marked points only") {
		t.Errorf("certificate picture lacks the verdict or the note on the values (%v)", err)
	}

	// An edited verdict does not verify: exit 3, nothing drawn.
	data, _ := os.ReadFile(files[0])
	bad := filepath.Join(dir, "edited.cert.json")
	if err := os.WriteFile(bad, []byte(strings.Replace(string(data), `"log_concavity": "disproven"`, `"log_concavity": "proven"`, 1)), 0o644); err != nil {
		t.Fatal(err)
	}
	refused := filepath.Join(dir, "refused.svg")
	if code, _, errs := execute("plot", bad, "-o", refused); code != exitMismatch || !strings.Contains(errs, "ground_state") {
		t.Errorf("plot of an edited certificate: exit %d, stderr %q", code, errs)
	}
	plain := filepath.Join(dir, "plain.cert.json")
	prob := filepath.Join(dir, "plain.json")
	if err := os.WriteFile(prob, []byte(`{"domain": {"interval": ["0", "1"]}, "boundary": "dirichlet"}`), 0o644); err != nil {
		t.Fatal(err)
	}
	if code, _, errs := execute("certify", prob, "-o", plain); code != exitOK {
		t.Fatalf("certify: exit %d, stderr %q", code, errs)
	}
	for _, c := range []struct {
		args []string
		code int
		errs string
	}{
		{[]string{"plot", plain, "-o", refused}, exitFailure, "has no results.ground_state (hint: certify the problem with --ground-state)"},
		{[]string{"plot", files[0], "--x", "alpha", "-o", refused}, exitFailure, "--x belongs to a sweep"},
		{[]string{"plot", out, "--x", "alpha", "--log-concavity", "--quantity", "gap", "-o", refused}, exitFailure, "--log-concavity draws the ground state's verdicts over one parameter"},
		{[]string{"plot", filepath.Join(testSweeps, "convex"), "--x", "c", "--log-concavity", "-o", refused}, exitFailure, `no point has a ground-state verdict (hint: add "ground_state": true`},
	} {
		code, _, errs := execute(c.args...)
		if code != c.code || !strings.Contains(errs, c.errs) {
			t.Errorf("%v: exit %d, stderr %q; want %d and %q", c.args, code, errs, c.code, c.errs)
		}
	}
	if _, err := os.Stat(refused); !os.IsNotExist(err) {
		t.Error("a refused plot wrote a picture")
	}
}

// TestCertifyShapeMarginNeedsGroundState: a claim naming shape_margin
// (here through @robin_ground_state_not_log_concave) without
// --ground-state is refused before computing, exit 2, nothing written.
func TestCertifyShapeMarginNeedsGroundState(t *testing.T) {
	dir := t.TempDir()
	prob := filepath.Join(dir, "robin.json")
	src := `{"domain":{"polygon":[["0","0"],["2","0"],["1","1"]]},"boundary":{"robin":"1/4"},"claims":["gap > 0","@robin_ground_state_not_log_concave"]}`
	if err := os.WriteFile(prob, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	cert := filepath.Join(dir, "robin.cert.json")
	code, _, errs := execute("certify", prob, "-o", cert)
	if code != exitInvalid || !strings.Contains(errs, "claims[1]") || !strings.Contains(errs, "--ground-state") {
		t.Errorf("exit %d, stderr %q", code, errs)
	}
	if _, err := os.Stat(cert); !os.IsNotExist(err) {
		t.Error("a refused certification wrote a certificate")
	}
}
