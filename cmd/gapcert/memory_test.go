package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestMemoryLimitParse: sizes are exact decimals with a binary unit
// (IEC 80000-13: KiB = 2¹⁰ bytes … TiB = 2⁴⁰) or whole bytes, rounded down
// to whole bytes; anything else is refused with a hint.
func TestMemoryLimitParse(t *testing.T) {
	for _, c := range []struct {
		text string
		want int64
	}{
		{"", 0},
		{"4GiB", 4 << 30},
		{"512MiB", 512 << 20},
		{"1.5GiB", 3 << 29},
		{"16384KiB", 16 << 20},
		{"1TiB", 1 << 40},
		{"17179869184", 16 << 30},
		{"0.1GiB", 107374182}, // 0.1·2³⁰ = 107374182.4, rounded down
	} {
		m := memoryLimitFlag{text: c.text}
		if err := m.parse(); err != nil || m.bytes != c.want {
			t.Errorf("%q: %d, %v; want %d", c.text, m.bytes, err, c.want)
		}
	}
	for _, c := range []struct{ text, want string }{
		{"4GB", "want a number and a unit"},
		{"4 GiB", "want a number and a unit"},
		{"-1GiB", "want a number and a unit"},
		{"1e9", "want a number and a unit"},
		{"1.GiB", "want a number and a unit"},
		{".5GiB", "want a number and a unit"},
		{"1.2.3GiB", "want a number and a unit"},
		{"GiB", "want a number and a unit"},
		{"4gib", "want a number and a unit"},
		{"1000.5", "must be whole"},
		{"15MiB", "below 16MiB"},
		{"0GiB", "below 16MiB"},
		{"1025TiB", "above the largest budget"},
	} {
		m := memoryLimitFlag{text: c.text}
		err := m.parse()
		if err == nil || !strings.Contains(err.Error(), c.want) || !strings.Contains(err.Error(), "hint: --memory-limit 4GiB") {
			t.Errorf("%q: %v; want an error with %q and a hint", c.text, err, c.want)
		}
	}
}

// TestMemoryLimitFlag: a bad --memory-limit is refused before anything is
// computed or written (exit 1) by certify, sweep and cover; a budget below
// the first step of the unit cube refuses it (exit 2, sizes in MiB); a
// budget that fits only the first step stops with the memory reason, and
// that certificate verifies.
func TestMemoryLimitFlag(t *testing.T) {
	dir := t.TempDir()
	good := filepath.Join(testdata, "interval_harmonic.json")
	out := filepath.Join(dir, "out.cert.json")
	family := filepath.Join("..", "..", "testdata", "examples", "convex_potential_family.json")
	coverFamily := filepath.Join("..", "..", "testdata", "examples", "harmonic_cover.json")
	for _, args := range [][]string{
		{"certify", good, "-o", out, "--memory-limit", "4GB"},
		{"demo", "-o", out, "--memory-limit", "1MiB"},
		{"sweep", family, "--out", filepath.Join(dir, "sw"), "--memory-limit", "lots"},
		{"cover", coverFamily, "--out", filepath.Join(dir, "cv"), "--memory-limit", "2 GiB"},
	} {
		if code, _, errs := execute(args...); code != exitFailure || !strings.Contains(errs, "--memory-limit") {
			t.Errorf("%v: exit %d, stderr %q; want %d naming --memory-limit", args, code, errs, exitFailure)
		}
	}
	for _, f := range []string{out, filepath.Join(dir, "sw"), filepath.Join(dir, "cv")} {
		if _, err := os.Stat(f); err == nil {
			t.Errorf("%s was written", f)
		}
	}

	cube := writeProblem(t, dir, `{"domain": {"polyhedron": {"vertices": [["0","0","0"],["1","0","0"],["1","1","0"],["0","1","0"],["0","0","1"],["1","0","1"],["1","1","1"],["0","1","1"]],
		"faces": [[0,3,2,1],[4,5,6,7],[0,1,5,4],[1,2,6,5],[2,3,7,6],[3,0,4,7]]}}, "boundary": "dirichlet", "eigenvalues": 2}`)
	code, _, errs := execute("certify", cube, "-o", out, "--memory-limit", "16MiB", "--rel-width", "1e-3")
	if code != exitInvalid || !strings.Contains(errs, "the first mesh would need about") || !strings.Contains(errs, "memory budget of 16.0 MiB") {
		t.Errorf("16MiB: exit %d, stderr %q; want %d and the first mesh refused", code, errs, exitInvalid)
	}
	if _, err := os.Stat(out); err == nil {
		t.Errorf("%s was written", out)
	}
	code, stdout, errs := execute("certify", cube, "-o", out, "--memory-limit", "64MiB", "--rel-width", "1e-3", "-q")
	if code != exitOK || !strings.Contains(stdout, "refinement stopped: memory budget") {
		t.Fatalf("64MiB: exit %d, stderr %q, stdout:\n%s", code, errs, stdout)
	}
	if code, _, errs := execute("check", out); code != exitOK {
		t.Errorf("check: exit %d, %s", code, errs)
	}
}

// TestMemoryLimitVerify: check, report, merge and plot re-verify with
// --memory-limit as the budget of each recomputation: a budget below a
// certificate's recipe refuses it before allocating (exit 2, naming the
// budget), the default and a sufficient budget verify it, and a malformed
// value is refused first (exit 1).
func TestMemoryLimitVerify(t *testing.T) {
	dir := t.TempDir()
	cube := writeProblem(t, dir, `{"domain": {"polyhedron": {"vertices": [["0","0","0"],["1","0","0"],["1","1","0"],["0","1","0"],["0","0","1"],["1","0","1"],["1","1","1"],["0","1","1"]],
		"faces": [[0,3,2,1],[4,5,6,7],[0,1,5,4],[1,2,6,5],[2,3,7,6],[3,0,4,7]]}}, "boundary": "dirichlet", "eigenvalues": 2}`)
	cert := filepath.Join(dir, "cube.cert.json")
	if code, _, errs := execute("certify", cube, "-o", cert, "--memory-limit", "64MiB", "--rel-width", "1e-3", "-q"); code != exitOK {
		t.Fatalf("certify: exit %d, %s", code, errs)
	}
	for _, c := range []struct {
		args []string
		code int
		want string
	}{
		{[]string{"check", cert, "--memory-limit", "16MiB"}, exitInvalid, "memory budget of 16.0 MiB"},
		{[]string{"check", cert, "--memory-limit", "64MiB"}, exitOK, ""},
		{[]string{"check", cert, "--memory-limit", "64 MiB"}, exitFailure, "--memory-limit"},
		{[]string{"report", cert, "--memory-limit", "16MiB"}, exitInvalid, "memory budget of 16.0 MiB"},
		{[]string{"report", cert, "--memory-limit", "lots"}, exitFailure, "--memory-limit"},
		{[]string{"merge", dir, "--out", filepath.Join(dir, "m"), "--memory-limit", "2GB"}, exitFailure, "--memory-limit"},
		{[]string{"plot", filepath.Join(testdata, "interval_harmonic.json"), "--out", filepath.Join(dir, "p.png"), "--memory-limit", "1GiB"}, exitFailure, "belongs to a certificate drawn alone"},
	} {
		code, _, errs := execute(c.args...)
		if code != c.code || !strings.Contains(errs, c.want) {
			t.Errorf("%v: exit %d, stderr %q; want %d and %q", c.args, code, errs, c.code, c.want)
		}
	}
}
