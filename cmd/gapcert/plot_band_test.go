package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestPlotBandPanel: --band width and --band margin add their panel; the
// refusals come before any picture is written.
func TestPlotBandPanel(t *testing.T) {
	dir := t.TempDir()
	convex := filepath.Join(testSweeps, "convex")
	for panel, want := range map[string]string{
		"width":  "lower panel: width of the certified enclosure of D²·gap/π² (log axis)",
		"margin": "lower panel: certified enclosure of the margin D²·gap/π² − (3 + c²/100)",
	} {
		out := filepath.Join(dir, panel+".svg")
		code, stdout, errs := execute("plot", convex, "--x", "c", "--quantity", "D^2*gap/pi^2", "--threshold", "3 + c^2/100", "--band", panel, "-o", out)
		if code != exitOK || errs != "" || !strings.Contains(stdout, "picture written to") {
			t.Errorf("--band %s: exit %d, stdout %q, stderr %q", panel, code, stdout, errs)
			continue
		}
		if svg, err := os.ReadFile(out); err != nil || !strings.Contains(string(svg), want) {
			t.Errorf("--band %s: picture lacks %q (%v)", panel, want, err)
		}
	}
	out := filepath.Join(dir, "refused.svg")
	for _, c := range []struct {
		args []string
		errs string
	}{
		{[]string{"plot", convex, "--x", "c", "--quantity", "gap", "--band", "margin", "-o", out}, "--band margin draws quantity − threshold (hint: give --threshold EXPR"},
		{[]string{"plot", convex, "--x", "c", "--quantity", "gap", "--band", "widths", "-o", out}, `--band: unknown band panel "widths" (hint: use width`},
		{[]string{"plot", filepath.Join(testSweeps, "triangle"), "--x", "a", "--y", "b", "--claim", "1", "--band", "width", "-o", out}, "--band adds a panel to a band over one parameter"},
	} {
		code, _, errs := execute(c.args...)
		if code != exitFailure || !strings.Contains(errs, c.errs) {
			t.Errorf("%v: exit %d, stderr %q; want %d and %q", c.args, code, errs, exitFailure, c.errs)
		}
	}
	if _, err := os.Stat(out); !os.IsNotExist(err) {
		t.Error("a refused plot wrote a picture")
	}
}
