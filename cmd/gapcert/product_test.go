package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestProductCertifyAndCheck: a box given as a product of intervals is
// validated, certified and checked end to end; an edited factor
// certificate inside it fails the check; an invalid factor exits 2 with
// its path.
func TestProductCertifyAndCheck(t *testing.T) {
	file := filepath.Join(testdata, "box_mixed.json")
	code, out, errs := execute("validate", file)
	if code != exitOK || !strings.Contains(out, "product of 3 factors, coordinates x, y, z") || !strings.Contains(out, "volume:      1") {
		t.Fatalf("validate: exit %d, out %q, stderr %q", code, out, errs)
	}
	dir := t.TempDir()
	cert := filepath.Join(dir, "box.cert.json")
	code, out, errs = execute("certify", file, "-o", cert)
	if code != exitOK || !strings.Contains(out, "lambda3") || !strings.Contains(out, "holds      volume <= 1") {
		t.Fatalf("certify: exit %d, out %q, stderr %q", code, out, errs)
	}
	if code, out, errs := execute("check", cert); code != exitOK || !strings.Contains(out, "verifies") {
		t.Fatalf("check: exit %d, out %q, stderr %q", code, out, errs)
	}
	data, err := os.ReadFile(cert)
	if err != nil {
		t.Fatal(err)
	}
	// The first factor's certificate is embedded in the method; edit its
	// first upper bound's last digit.
	s := string(data)
	at := strings.Index(s, `"factors"`)
	up := strings.Index(s[at:], `"upper": "`) + at + len(`"upper": "`)
	end := strings.Index(s[up:], `"`) + up
	last := s[end-1]
	edited := s[:end-1] + string('0'+(last-'0'+1)%10) + s[end:]
	bad := filepath.Join(dir, "edited.cert.json")
	if err := os.WriteFile(bad, []byte(edited), 0o644); err != nil {
		t.Fatal(err)
	}
	if code, _, errs := execute("check", bad); code != exitMismatch || !strings.Contains(errs, "method.factors[0].certificate") {
		t.Errorf("check of an edited factor: exit %d, stderr %q", code, errs)
	}
	code, _, errs = execute("certify", filepath.Join(testdata, "bad", "product_factor_invalid.json"), "-o", filepath.Join(dir, "x.json"))
	if code != exitInvalid || !strings.Contains(errs, "domain.product[0].polygon") {
		t.Errorf("invalid factor: exit %d, stderr %q", code, errs)
	}
}
