package main

import (
	"image/png"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

const testSweeps = "../../certs/plot/sweepplot/testdata/sweeps"

func TestPlot(t *testing.T) {
	dir := t.TempDir()
	band, cells, robin := filepath.Join(dir, "band.svg"), filepath.Join(dir, "map.png"), filepath.Join(dir, "robin.svg")
	for _, args := range [][]string{
		{"plot", filepath.Join(testSweeps, "convex"), "--x", "c", "--quantity", "D^2*gap/pi^2", "--threshold", "3 + c^2/100", "--out", band},
		{"plot", filepath.Join(testSweeps, "robin"), "--x", "alpha", "--quantity", "gap", "--reference", "robin_interval_gap", "--out", robin},
		{"plot", filepath.Join(testSweeps, "triangle", "summary.json"), "--x", "a", "--y", "b", "--claim", "D^2*gap >= 75.35", "-o", cells},
	} {
		code, out, errs := execute(args...)
		if code != exitOK || errs != "" || !strings.Contains(out, "picture written to") {
			t.Errorf("%v: exit %d, stdout %q, stderr %q", args, code, out, errs)
		}
	}
	svg, err := os.ReadFile(band)
	if err != nil || !strings.Contains(string(svg), "certified enclosures of D²·gap/π²") {
		t.Errorf("band picture: %v", err)
	}
	svg, err = os.ReadFile(robin)
	if err != nil || !strings.Contains(string(svg), "reference: certified enclosure of robin_interval_gap at each point") {
		t.Errorf("band with a reference: %v", err)
	}
	f, err := os.Open(cells)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	if _, err := png.Decode(f); err != nil {
		t.Errorf("map picture: %v", err)
	}
}

func TestPlotFailures(t *testing.T) {
	out := filepath.Join(t.TempDir(), "p.png")
	convex, triangle := filepath.Join(testSweeps, "convex"), filepath.Join(testSweeps, "triangle")
	edited := t.TempDir()
	names, err := os.ReadDir(convex)
	if err != nil {
		t.Fatal(err)
	}
	for _, n := range names {
		copyInto(t, edited, convex, n.Name())
	}
	summary := filepath.Join(edited, "summary.json")
	data, err := os.ReadFile(summary)
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(summary, []byte(strings.Replace(string(data), `"2.4674011002`, `"2.4674011001`, 1)), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		args []string
		code int
		errs string
	}{
		{[]string{"plot", convex, "--x", "c", "--quantity", "gap"}, exitFailure, "--out FILE.png or FILE.svg is required"},
		{[]string{"plot", convex, "--quantity", "gap", "--out", out}, exitFailure, "--x PARAM is required"},
		{[]string{"plot", convex, "--x", "c", "--out", out}, exitFailure, "give --quantity EXPR"},
		{[]string{"plot", triangle, "--x", "a", "--y", "b", "--out", out}, exitFailure, "a map needs --claim"},
		{[]string{"plot", triangle, "--x", "a", "--y", "b", "--claim", "1", "--quantity", "gap", "--out", out}, exitFailure, "--quantity, --reference and --threshold belong to a band"},
		{[]string{"plot", triangle, "--x", "a", "--y", "b", "--claim", "1", "--reference", "robin_interval_gap", "--out", out}, exitFailure, "--reference and --threshold belong to a band"},
		{[]string{"plot", convex, "--x", "c", "--quantity", "gap", "--reference", "robin_interval_gap", "--out", out}, exitFailure, "point 0: reference \"robin_interval_gap\" names robin_interval_gap, which the point does not have: the point has no claim @robin_comparison"},
		{[]string{"plot", convex, "--x", "k", "--quantity", "gap", "--out", out}, exitFailure, `unknown parameter "k"`},
		{[]string{"plot", convex, "--x", "c", "--quantity", "gap +", "--out", out}, exitFailure, `quantity "gap +"`},
		{[]string{"plot", convex, "--x", "c", "--quantity", "gap", "--out", filepath.Join(t.TempDir(), "p.jpg")}, exitFailure, `unknown picture format "jpg"`},
		{[]string{"plot", edited, "--x", "c", "--quantity", "gap", "--out", out}, exitMismatch, "point 0 and its certificate"},
	} {
		code, _, errs := execute(c.args...)
		if code != c.code || !strings.Contains(errs, c.errs) {
			t.Errorf("%v: exit %d, stderr %q; want %d and %q", c.args, code, errs, c.code, c.errs)
		}
	}
}

// TestPlotAndCertifyPlot: the plot command and the --plot option of
// certify are different things and both work.
func TestPlotAndCertifyPlot(t *testing.T) {
	dir := t.TempDir()
	code, out, errs := execute("certify", filepath.Join(testdata, "interval_harmonic.json"), "-o", filepath.Join(dir, "h.cert.json"), "--rel-width", "1e-4", "--plot", dir)
	if code != exitOK {
		t.Fatalf("certify --plot: exit %d, stderr %s", code, errs)
	}
	if !strings.Contains(out, filepath.Join(dir, "modes.png")) {
		t.Errorf("certify --plot did not draw the modes:\n%s", out)
	}
	if code, _, errs := execute("plot", dir, "--x", "c", "--quantity", "gap", "--out", filepath.Join(dir, "p.png")); code != exitFailure || !strings.Contains(errs, dir+": not a sweep directory (no family.json, no summary.json") {
		t.Errorf("plot of a directory without a summary: exit %d, stderr %q", code, errs)
	}
}
