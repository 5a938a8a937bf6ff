package cover

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"gapcert/certs/sweep"
)

// TestMergeOfShardsWithOwnCornerCertificates runs two shards at different
// times, so that the corner shared by the two boxes of the first split is
// certified in each shard with different bytes (its provenance time), and
// demands that the merged directory stand alone: every cell certificate
// in it verifies with the corner files beside it, and a second merge of
// the merged directory succeeds.
func TestMergeOfShardsWithOwnCornerCertificates(t *testing.T) {
	text := strings.Replace(strings.Replace(harmonicFamily, `"1/256"`, `"5/8"`, 1), `"count": 4`, `"count": 2`, 1)
	f := mustFamily(t, text)
	d0, d1 := t.TempDir(), t.TempDir()
	for i, d := range []string{d0, d1} {
		opt := testOptions()
		opt.Shard = sweep.Shard{Index: i, Count: 2}
		at := fixedNow().Add(time.Duration(i) * time.Hour)
		opt.Now = func() time.Time { return at }
		if _, err := Run(f, d, opt); err != nil {
			t.Fatal(err)
		}
	}
	shared := 0
	for _, p := range mustGlob(t, filepath.Join(d0, "corner-*")) {
		a, _ := os.ReadFile(p)
		b, err := os.ReadFile(filepath.Join(d1, filepath.Base(p)))
		if err == nil && string(a) != string(b) {
			shared++
		}
	}
	if shared == 0 {
		t.Fatal("the shards share no corner certified with different bytes; the test does not test anything")
	}
	for _, out := range []string{t.TempDir(), d1} {
		if _, err := Merge([]string{d0, d1}, out, MergeOptions{}); err != nil {
			t.Fatal(err)
		}
		for _, p := range mustGlob(t, filepath.Join(out, "cell-*"+cellSuffix)) {
			data, _ := os.ReadFile(p)
			if _, _, err := CheckCell(data, out, nil); err != nil {
				t.Errorf("merged into %s: %s does not verify: %v", out, filepath.Base(p), err)
			}
		}
		if _, err := Merge([]string{out}, t.TempDir(), MergeOptions{}); err != nil {
			t.Errorf("merge of the merged directory: %v", err)
		}
		if out == d1 {
			break
		}
	}
}

func mustGlob(t *testing.T, pattern string) []string {
	t.Helper()
	m, err := filepath.Glob(pattern)
	if err != nil || len(m) == 0 {
		t.Fatalf("no files %s (%v)", pattern, err)
	}
	return m
}
