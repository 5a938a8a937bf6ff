package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

const reportCerts = "../../certs/report/testdata/certs"

// copyInto copies files of src into dir.
func copyInto(t *testing.T, dir, src string, names ...string) {
	t.Helper()
	for _, n := range names {
		data, err := os.ReadFile(filepath.Join(src, n))
		if err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(filepath.Join(dir, n), data, 0o644); err != nil {
			t.Fatal(err)
		}
	}
}

func TestReport(t *testing.T) {
	dir := t.TempDir()
	copyInto(t, dir, reportCerts, "dirichlet_0_pi.cert.json", "mathieu_q1.cert.json", "square.cert.json")
	if err := os.WriteFile(filepath.Join(dir, "summary.json"), []byte(`{"format": "gapcert.sweep-summary/v1"}`), 0o644); err != nil {
		t.Fatal(err)
	}
	code, out, errs := execute("report", dir, "--format", "markdown", "--no-check")
	if code != exitOK {
		t.Fatalf("exit %d, stderr %s", code, errs)
	}
	for _, w := range []string{"| problem | λ1 | λ2 |", "| Mathieu potential 2cos(2x), Dirichlet | -0.110248816992<sub>34</sub><sup>07</sup> |", "not re-verified", "listed after the table", "  square.cert.json\n"} {
		if !strings.Contains(out, w) {
			t.Errorf("output lacks %q:\n%s", w, out)
		}
	}
	if want := filepath.Join(dir, "summary.json") + `: left out: format "gapcert.sweep-summary/v1" is not a certificate`; !strings.Contains(errs, want) {
		t.Errorf("stderr %q lacks %q", errs, want)
	}

	// Re-verified (interval certificates: fast), LaTeX to a file, bracket notation.
	one := t.TempDir()
	copyInto(t, one, reportCerts, "dirichlet_0_pi.cert.json", "mathieu_q1.cert.json")
	file := filepath.Join(one, "table.tex")
	code, out, errs = execute("report", one, "-o", file, "--notation", "bracket")
	if code != exitOK || out != "" || errs != "" {
		t.Fatalf("exit %d, stdout %q, stderr %q", code, out, errs)
	}
	tex, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	list := filepath.Join(one, "table.sha256")
	for _, w := range []string{`\begin{longtable}`, `$[-0.11024881699234, -0.11024881699207]$`, "every certificate re-verified by recomputation with gapcert " + Version, "listed in " + strings.ReplaceAll(list, "_", `\_`)} {
		if !strings.Contains(string(tex), w) {
			t.Errorf("table lacks %q:\n%s", w, tex)
		}
	}
	if l, err := os.ReadFile(list); err != nil || strings.Count(string(l), ".cert.json\n") != 2 {
		t.Errorf("list of certificate hashes %q (%v)", l, err)
	}
}

func TestReportFailures(t *testing.T) {
	dir := t.TempDir()
	copyInto(t, dir, reportCerts, "mathieu_q1.cert.json")
	cert := filepath.Join(dir, "mathieu_q1.cert.json")
	data, err := os.ReadFile(cert)
	if err != nil {
		t.Fatal(err)
	}
	// A certificate whose λ1 upper end was edited (still well formed).
	edited := strings.Replace(string(data), `"-0.11024881699207433"`, `"-0.11024881699207432"`, 1)
	if edited == string(data) {
		t.Fatal("the edit did not apply")
	}
	bad := filepath.Join(dir, "edited.cert.json")
	if err := os.WriteFile(bad, []byte(edited), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		args []string
		code int
		errs string
	}{
		{[]string{"report", bad}, exitMismatch, bad + ": certificate does not verify"},
		{[]string{"report", dir}, exitMismatch, bad + ": certificate does not verify"},
		{[]string{"report", "../../testdata/problems/square.json"}, exitFailure, `no "format" field`},
		{[]string{"report", cert, "--format", "html"}, exitFailure, `unknown format "html"`},
		{[]string{"report", cert, "--notation", "pm"}, exitFailure, `unknown notation "pm"`},
		{[]string{"report", cert, "--width-digits", "0"}, exitFailure, "--width-digits 0"},
		{[]string{"report", filepath.Join(dir, "none.json")}, exitFailure, "no such file"},
		{[]string{"report", t.TempDir()}, exitFailure, "no gapcert certificates"},
	} {
		code, _, errs := execute(c.args...)
		if code != c.code || !strings.Contains(errs, c.errs) {
			t.Errorf("%v: exit %d, stderr %q; want %d and %q", c.args, code, errs, c.code, c.errs)
		}
	}
}
