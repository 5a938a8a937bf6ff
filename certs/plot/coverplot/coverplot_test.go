package coverplot

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"gapcert/certs/cover"
)

// coverDir runs a small cover of V = c·x² on (0, 1), c ∈ [0, 4] (cells
// down to 1/8; the claim gap ≥ 3π² is an equality at c = 0) and returns
// its directory.
func coverDir(t *testing.T) string {
	t.Helper()
	f, err := cover.ParseFamily([]byte(`{"name": "harmonic",
	  "template": {"domain": {"interval": ["0", "1"]}, "potential": "c*x^2", "boundary": "dirichlet"},
	  "parameters": [{"name": "c", "range": {"lo": "0", "hi": "4"}, "min_cell": "1/8"}],
	  "claims": ["gap >= 3*pi^2/D^2"], "relative_width": "1e-9"}`))
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	if _, err := cover.Run(f, dir, cover.RunOptions{Tool: "gapcert test", Now: func() time.Time { return time.Date(2026, 1, 2, 3, 4, 5, 0, time.UTC) }}); err != nil {
		t.Fatal(err)
	}
	return dir
}

func TestDrawCoverCells(t *testing.T) {
	dir := coverDir(t)
	c, err := Load(dir, 0)
	if err != nil {
		t.Fatal(err)
	}
	verdicts := map[string]int{}
	for _, r := range c.Cells {
		verdicts[r.Verdict]++
	}
	if verdicts["undecided"] == 0 || verdicts["holds"] == 0 {
		t.Fatalf("verdicts %v: want undecided cells at c = 0 and cells that hold", verdicts)
	}
	out := filepath.Join(t.TempDir(), "cover.svg")
	if err := Draw(c, out, "svg"); err != nil {
		t.Fatal(err)
	}
	svg, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(svg), "undecided on "+c.Coverage.Undecided) {
		t.Error("the legend does not give the undecided fraction")
	}
	// A summary row that disagrees with its certificate file is refused.
	sum := filepath.Join(dir, "summary.json")
	data, _ := os.ReadFile(sum)
	s, err := cover.UnmarshalSummary(data)
	if err != nil {
		t.Fatal(err)
	}
	s.Cells[0].Verdicts[0] = "fails"
	edited, err := cover.MarshalSummary(s)
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(sum, edited, 0o644); err != nil {
		t.Fatal(err)
	}
	if _, err := Load(dir, 0); err == nil || !strings.Contains(err.Error(), "disagrees") {
		t.Fatalf("edited summary: error %v, want a disagreement", err)
	}
}
