package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/certs/tampertest"
	"gapcert/interval/decimalio"
)

// TestCertifyAndCheck runs the two commands of a referee's workflow on a
// problem file: certify writes a certificate that check accepts, and an
// edited certificate is rejected with exit status 3.
func TestCertifyAndCheck(t *testing.T) {
	dir := t.TempDir()
	cert := filepath.Join(dir, "harmonic.cert.json")
	code, out, errs := execute("certify", filepath.Join(testdata, "interval_harmonic.json"), "-o", cert, "--rel-width", "1e-8")
	if code != exitOK {
		t.Fatalf("certify: exit %d, stderr %q", code, errs)
	}
	for _, want := range []string{"lambda1", "lambda2", "gap", "D²·gap/π²", "certificate written to " + cert} {
		if !strings.Contains(out, want) {
			t.Errorf("certify output lacks %q:\n%s", want, out)
		}
	}
	if code, out, errs := execute("check", cert); code != exitOK || !strings.Contains(out, "verifies") {
		t.Fatalf("check: exit %d, out %q, stderr %q", code, out, errs)
	}
	data, err := os.ReadFile(cert)
	if err != nil {
		t.Fatal(err)
	}
	// Weaken the first eigenvalue's lower bound by 1e-6: still a valid
	// interval and a true statement, but not the recorded computation.
	c, err := certs.Unmarshal(data)
	if err != nil {
		t.Fatal(err)
	}
	lo, err := decimalio.Parse(c.Results.Eigenvalues[0].Lower)
	if err != nil {
		t.Fatal(err)
	}
	c.Results.Eigenvalues[0].Lower = decimalio.FormatLower(lo.Lo-1e-6, 17)
	editedBytes, err := c.Marshal()
	if err != nil {
		t.Fatal(err)
	}
	edited := string(editedBytes)
	if edited == string(data) {
		t.Fatal("edit changed nothing")
	}
	bad := filepath.Join(dir, "edited.cert.json")
	if err := os.WriteFile(bad, []byte(edited), 0o644); err != nil {
		t.Fatal(err)
	}
	if code, _, errs := execute("check", bad); code != exitMismatch || !strings.Contains(errs, "does not verify") {
		t.Errorf("check of an edited certificate: exit %d, stderr %q", code, errs)
	}
}

// TestCertifyBadInput: an invalid problem exits 2 and names the defect; a
// bad flag value exits 1.
func TestCertifyBadInput(t *testing.T) {
	dir := t.TempDir()
	write := func(name, body string) string {
		path := filepath.Join(dir, name)
		if err := os.WriteFile(path, []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
		return path
	}
	for _, tc := range []struct{ name, body, want string }{
		{"log.json", `{"domain":{"interval":["-1","1"]},"potential":"log(x)","boundary":"dirichlet"}`, "potential"},
		{"pole.json", `{"domain":{"interval":["0","1"]},"potential":"1/x","boundary":"dirichlet"}`, "potential"},
		{"nan.json", `{"domain":{"interval":["0","NaN"]},"boundary":"dirichlet"}`, "domain.interval[1]"},
		{"overflow.json", `{"domain":{"interval":["0","10"]},"potential":"exp(exp(exp(x)))","boundary":"dirichlet"}`, "unbounded above"},
	} {
		code, _, errs := execute("certify", write(tc.name, tc.body), "-o", filepath.Join(dir, "out.json"))
		if code != exitInvalid || !strings.Contains(errs, tc.want) {
			t.Errorf("%s: exit %d, stderr %q (want 2 and %q)", tc.name, code, errs, tc.want)
		}
	}
	good := filepath.Join(testdata, "interval_harmonic.json")
	if code, _, _ := execute("certify", good, "--rel-width", "2"); code != exitFailure {
		t.Errorf("--rel-width 2: exit %d, want %d", code, exitFailure)
	}
	if _, err := os.Stat(filepath.Join(dir, "out.json")); err == nil {
		t.Error("a certificate was written for an invalid problem")
	}
}

// TestPlotFlag: --plot draws the mesh and two modes of a polygon problem.
func TestPlotFlag(t *testing.T) {
	dir := t.TempDir()
	code, out, errs := execute("certify", filepath.Join(testdata, "square.json"), "-o", filepath.Join(dir, "c.json"), "--rel-width", "0.3", "--plot", dir)
	if code != exitOK {
		t.Fatalf("certify --plot: exit %d, stderr %q", code, errs)
	}
	for _, name := range []string{"mesh.png", "mesh.svg", "mode1.png", "mode1.svg", "mode2.png", "mode2.svg"} {
		if _, err := os.Stat(filepath.Join(dir, name)); err != nil {
			t.Errorf("%s not written: %v", name, err)
		}
	}
	if !strings.Contains(out, "not part of the proof") {
		t.Errorf("output does not say the pictures are approximations:\n%s", out)
	}
}

// TestDemo: the built-in problem certifies without a file.
func TestDemo(t *testing.T) {
	cert := filepath.Join(t.TempDir(), "demo.cert.json")
	code, out, errs := execute("demo", "-o", cert)
	if code != exitOK {
		t.Fatalf("demo: exit %d, stderr %q", code, errs)
	}
	// The double well is not convex, so the fundamental gap bound may and
	// does fail (gap 1.1428 < 3π²/25 = 1.1844) with that hypothesis disproven.
	if !strings.Contains(out, "double well") || !strings.Contains(out, "holds      gap > 0") ||
		!strings.Contains(out, "fails      @fundamental_gap") || !strings.Contains(out, "hypothesis convex_potential: disproven") {
		t.Errorf("demo output:\n%s", out)
	}
	if code, _, errs := execute("check", cert); code != exitOK {
		t.Errorf("check of the demo certificate: exit %d, stderr %q", code, errs)
	}
}

// TestTamperedCertificateExitCodes: check and merge exit with status 3 on
// every tamper variant of package tampertest (keys given twice with the
// false value first or last, keys in another case, two problem objects,
// keys the format does not define in method and in an embedded reference
// certificate), name the path of the defect, and merge writes nothing;
// the untampered certificate verifies. Each variant's Seen field states
// what a reader that matches keys exactly and keeps the last of two equal
// keys (Python's json module) would take from the file.
func TestTamperedCertificateExitCodes(t *testing.T) {
	root := t.TempDir()
	family := filepath.Join(root, "robin.json")
	if err := os.WriteFile(family, []byte(`{"template": {"domain": {"polygon": [["0", "0"], ["3/2", "0"], ["3/2", "1"], ["0", "1"]]},
	  "boundary": {"robin": "a"}, "claims": ["@robin_comparison"]},
	  "parameters": [{"name": "a", "values": ["1"]}], "relative_width": "0.05"}`), 0o644); err != nil {
		t.Fatal(err)
	}
	dir := filepath.Join(root, "sweep")
	if code, _, errs := execute("sweep", family, "--out", dir); code != exitOK {
		t.Fatalf("sweep: exit %d, stderr %q", code, errs)
	}
	files, _ := filepath.Glob(filepath.Join(dir, "*.cert.json"))
	if len(files) != 1 {
		t.Fatalf("certificates %v", files)
	}
	cert := files[0]
	good, err := os.ReadFile(cert)
	if err != nil {
		t.Fatal(err)
	}
	if code, _, errs := execute("check", cert); code != exitOK {
		t.Fatalf("check of the untampered certificate: exit %d, stderr %q", code, errs)
	}
	out := filepath.Join(root, "merged")
	for _, v := range tampertest.Variants(0) {
		edited := v.Edit(good)
		if edited == nil {
			t.Errorf("%s: the variant does not apply", v.Name)
			continue
		}
		if err := os.WriteFile(cert, edited, 0o644); err != nil {
			t.Fatal(err)
		}
		if code, _, errs := execute("check", cert); code != exitMismatch || !strings.Contains(errs, v.Path+": ") {
			t.Errorf("check, %s: exit %d, stderr %q; want 3 and the path %s (a Python reader sees %s)", v.Name, code, errs, v.Path, v.Seen)
		}
		if code, _, errs := execute("merge", "--out", out, dir); code != exitMismatch || !strings.Contains(errs, v.Path+": ") {
			t.Errorf("merge, %s: exit %d, stderr %q; want 3 and the path %s", v.Name, code, errs, v.Path)
		}
		if _, err := os.Stat(out); err == nil {
			t.Fatalf("merge, %s: a refused merge wrote %s", v.Name, out)
		}
	}
}
