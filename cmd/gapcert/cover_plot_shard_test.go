package main

import (
	"os"
	"strings"
	"testing"
)

// TestPlotCoverShardDirectory: "plot DIR" draws the cover of a shard's
// directory, which holds summary-shard-0-of-2.json and no summary.json
// (before, DIR was taken for a sweep: "--x PARAM is required").
func TestPlotCoverShardDirectory(t *testing.T) {
	t.Chdir(t.TempDir())
	family := `{"template": {"domain": {"interval": ["0", "1"]}, "potential": "c*x^2", "boundary": "dirichlet"},
	  "parameters": [{"name": "c", "range": {"lo": "0", "hi": "4", "count": 2}, "min_cell": "1"}],
	  "claims": ["gap >= 3*pi^2/D^2"], "relative_width": "1e-8"}`
	if err := os.WriteFile("family.json", []byte(family), 0o644); err != nil {
		t.Fatal(err)
	}
	if code, stdout, stderr := execute("cover", "family.json", "--out", "shard0", "--shard", "0/2", "--quiet"); code != exitOK {
		t.Fatalf("cover: exit %d\n%s%s", code, stdout, stderr)
	}
	code, stdout, stderr := execute("plot", "shard0", "--out", "shard0.svg")
	if code != exitOK || !strings.Contains(stdout, "picture written") {
		t.Fatalf("plot of the shard directory: exit %d\n%s%s", code, stdout, stderr)
	}
}
