package cover

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestResumedSummaryCountsTheCornersTheCellsUse reruns a cover after one
// cell certificate was removed: the summary's corner count is the number
// of distinct corner files its cells name, as after the first run (not
// the number of corners the rerun itself touched).
func TestResumedSummaryCountsTheCornersTheCellsUse(t *testing.T) {
	f := mustFamily(t, strings.Replace(harmonicFamily, `"1/256"`, `"5/16"`, 1))
	dir := t.TempDir()
	s, err := Run(f, dir, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	named := map[string]bool{}
	for _, r := range s.Cells {
		data, err := os.ReadFile(filepath.Join(dir, r.File))
		if err != nil {
			t.Fatal(err)
		}
		c, err := UnmarshalCell(data)
		if err != nil {
			t.Fatal(err)
		}
		named[c.Low.File], named[c.High.File] = true, true
	}
	if s.Corners != len(named) {
		t.Fatalf("first run: %d corners in the summary, the cells name %d", s.Corners, len(named))
	}
	if err := os.Remove(filepath.Join(dir, s.Cells[0].File)); err != nil {
		t.Fatal(err)
	}
	s2, err := Run(f, dir, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	if s2.Corners != len(named) {
		t.Errorf("rerun: %d corners in the summary, the cells name %d", s2.Corners, len(named))
	}
}
