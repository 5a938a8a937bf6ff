package sweepplot

import (
	"flag"
	"os"
	"path/filepath"
	"testing"
	"time"

	"gapcert/certs/sweep"
)

var update = flag.Bool("update", false, "recompute the sweeps in testdata/sweeps and rewrite the golden files")

// sweepNames are the sweeps of the tests: testdata/families/NAME.json run
// by sweep.Run into testdata/sweeps/NAME (with -update).
var sweepNames = []string{"convex", "triangle", "robin", "robin_mixed", "hump"}

func sweepDir(name string) string { return filepath.Join("testdata", "sweeps", name) }

// TestTestdataSweeps recomputes the testdata sweeps with -update, and
// otherwise loads each one, which cross-checks its summary with its
// certificate files. Each sweep is a subtest, so that -run
// 'TestTestdataSweeps/NAME' -update recomputes one of them.
func TestTestdataSweeps(t *testing.T) {
	for _, name := range sweepNames {
		t.Run(name, func(t *testing.T) { testdataSweep(t, name) })
	}
}

func testdataSweep(t *testing.T, name string) {
	if *update {
		data, err := os.ReadFile(filepath.Join("testdata", "families", name+".json"))
		if err != nil {
			t.Fatal(err)
		}
		f, err := sweep.ParseFamily(data)
		if err != nil {
			t.Fatal(err)
		}
		if err := os.RemoveAll(sweepDir(name)); err != nil {
			t.Fatal(err)
		}
		now := time.Date(2025, 1, 2, 3, 4, 5, 0, time.UTC)
		if _, err := sweep.Run(f, sweepDir(name), sweep.RunOptions{FamilyName: name + ".json", Tool: "gapcert 0.1.0-dev", Now: func() time.Time { return now }}); err != nil {
			t.Fatal(err)
		}
	}
	s, err := Load(sweepDir(name))
	if err != nil {
		t.Fatal(err)
	}
	if s.Missing != 0 {
		t.Errorf("%s: %d certificate files missing", name, s.Missing)
	}
}
