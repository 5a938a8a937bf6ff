package sweep

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gapcert/certs"
	"gapcert/certs/tampertest"
)

// robinRectangleFamily has one point: the rectangle (0, 3/2) × (0, 1) with
// Robin coefficient 1 and the built-in claim @robin_comparison, whose
// certificate embeds the reference certificate of a Robin interval.
const robinRectangleFamily = `{"template": {"domain": {"polygon": [["0", "0"], ["3/2", "0"], ["3/2", "1"], ["0", "1"]]},
  "boundary": {"robin": "a"}, "claims": ["@robin_comparison"]},
  "parameters": [{"name": "a", "values": ["1"]}], "relative_width": "0.05"}`

// TestMergeRefusesTamperedKeys: Merge refuses a certificate that JSON
// readers read differently (each variant of package tampertest: keys
// given twice with the false value first or last, keys in another case,
// two problem objects, keys the format does not define in method and in
// an embedded reference certificate), naming the path of the defect, and
// writes nothing; the untampered directory merges. Each variant's Seen
// field states what a reader that matches keys exactly and keeps the last
// of two equal keys (Python's json module) would take from the file.
func TestMergeRefusesTamperedKeys(t *testing.T) {
	dir := t.TempDir()
	s, err := Run(mustFamily(t, []byte(robinRectangleFamily)), dir, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(dir, s.Points[0].File)
	good, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	c, err := certs.Unmarshal(good)
	if err != nil {
		t.Fatal(err)
	}
	ref := -1
	for i, r := range c.Claims {
		if r.Reference != nil {
			ref = i
		}
	}
	if ref < 0 {
		t.Fatal("the fixture has no embedded reference certificate")
	}
	out := filepath.Join(t.TempDir(), "merged")
	for _, v := range tampertest.Variants(ref) {
		edited := v.Edit(good)
		if edited == nil {
			t.Errorf("%s: the variant does not apply to the fixture", v.Name)
			continue
		}
		if err := os.WriteFile(path, edited, 0o644); err != nil {
			t.Fatal(err)
		}
		_, err := Merge([]string{dir}, out, MergeOptions{})
		var me *MergeError
		if !errors.As(err, &me) || len(me.Issues) == 0 || me.Issues[0].Kind != IssueTampered || !strings.Contains(me.Issues[0].Msg, v.Path+": ") {
			t.Errorf("%s: error %v, want a tampered certificate at %s (a Python reader sees %s)", v.Name, err, v.Path, v.Seen)
		}
		if _, err := os.Stat(out); err == nil {
			t.Fatalf("%s: a refused merge wrote %s", v.Name, out)
		}
	}
	if err := os.WriteFile(path, good, 0o644); err != nil {
		t.Fatal(err)
	}
	if _, err := Merge([]string{dir}, out, MergeOptions{}); err != nil {
		t.Errorf("the untampered certificate: %v", err)
	}
}

// TestUnmarshalSummaryStrict: summaries are read strictly as well.
func TestUnmarshalSummaryStrict(t *testing.T) {
	good := `{"format": "` + SummaryFormat + `", "family": "f.json", "family_sha256": "", "shard": {"index": 0, "count": 1}, "parameters": ["a"], "total_points": 1, "points": [{"index": 0, "params": {"a": "1"}, "file": "", "problem_sha256": "", "certificate_sha256": "", "rel_width": "", "eigenvalues": [], "gap": {"lower": "0", "upper": "1"}, "diameter": {"lower": "1", "upper": "1"}, "gap_d2_over_pi2": {"lower": "0", "upper": "1"}, "claims": [], "verdict": "", "status": "error", "error": "x"}]}`
	if _, err := UnmarshalSummary([]byte(good)); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct{ old, new, want string }{
		{`"total_points": 1,`, `"total_points": 1, "total_points": 2,`, "total_points: duplicate key"},
		{`"gap": {"lower": "0",`, `"gap": {"lower": "0", "Lower": "-1",`, "points[0].gap.Lower: unknown key"},
		{`"status": "error"`, `"Status": "computed", "status": "error"`, "points[0].Status: unknown key"},
		{`"index": 0, "count": 1`, `"index": 0, "count": 1, "of": 2`, "shard.of: unknown key"},
	} {
		if !strings.Contains(good, c.old) {
			t.Fatalf("the fixture lacks %q", c.old)
		}
		_, err := UnmarshalSummary([]byte(strings.Replace(good, c.old, c.new, 1)))
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error %v, want %q", c.new, err, c.want)
		}
	}
}
