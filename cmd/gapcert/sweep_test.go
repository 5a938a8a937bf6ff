package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

const examples = "../../testdata/examples"

// TestSweepBadInput: an invalid family file or shard exits with status 2,
// says what is wrong and writes nothing.
func TestSweepBadInput(t *testing.T) {
	good := filepath.Join(examples, "convex_potential_family.json")
	const tmpl = `"template": {"domain": {"interval": ["-1", "1"]}, "potential": "c*x^2", "boundary": "dirichlet"}`
	for _, c := range []struct {
		name, family string // family text, or "" for the good example
		args         []string
		want         string
	}{
		{"count 0", `{` + tmpl + `, "parameters": [{"name": "c", "range": {"lo": "0", "hi": "1", "count": 0}}]}`, nil, "parameters[0].range.count: empty range: count is 0"},
		{"lo above hi", `{` + tmpl + `, "parameters": [{"name": "c", "range": {"lo": "2", "hi": "1", "count": 3}}]}`, nil, "parameters[0].range: empty range: lo 2 is above hi 1"},
		{"unknown parameter", `{` + tmpl + `, "parameters": [{"name": "k", "values": ["1"]}]}`, nil, "template.potential: point 0 (k=1):"},
		{"shard 5/4", "", []string{"--shard", "5/4"}, `--shard: "5/4": shard index 5 is not below the number of shards 4`},
		{"shard 0/0", "", []string{"--shard", "0/0"}, `"0/0": the number of shards must be at least 1`},
		{"junk shard", "", []string{"--shard", "first/4"}, `"first/4": i and n must be non-negative decimal integers`},
		{"shard without n", "", []string{"--shard", "3"}, `"3" is not of the form i/n`},
	} {
		dir := t.TempDir()
		file := good
		if c.family != "" {
			file = filepath.Join(dir, "family.json")
			if err := os.WriteFile(file, []byte(c.family), 0o644); err != nil {
				t.Fatal(err)
			}
		}
		out := filepath.Join(dir, "out")
		code, stdout, stderr := execute(append([]string{"sweep", file, "--out", out}, c.args...)...)
		if code != exitInvalid || stdout != "" || !strings.Contains(stderr, c.want) {
			t.Errorf("%s: exit %d, stdout %q, stderr %q; want exit 2 and %q", c.name, code, stdout, stderr, c.want)
		}
		if c.family != "" && !strings.HasPrefix(stderr, file+": ") {
			t.Errorf("%s: stderr does not start with the file name: %q", c.name, stderr)
		}
		if _, err := os.Stat(out); err == nil {
			t.Errorf("%s: %s was created", c.name, out)
		}
	}
}

// TestSweepMergeCommands: two shards and a merge from the command line;
// the undecided point (c = 0, where Lavine's bound gap ≥ 3π²/D² for
// convex V, Proc. Amer. Math. Soc. 121 (1994) 815–821, is an equality:
// V = 0 on (−1, 1) has gap exactly 3π²/4, common practice) is
// listed; a second merge into the same directory is refused; a tampered
// certificate makes sweep and merge exit with status 3.
func TestSweepMergeCommands(t *testing.T) {
	family := filepath.Join(examples, "convex_potential_family.json")
	root := t.TempDir()
	dirs := []string{filepath.Join(root, "s0"), filepath.Join(root, "s1")}
	for i, dir := range dirs {
		code, stdout, stderr := execute("sweep", family, "--shard", []string{"0/2", "1/2"}[i], "--out", dir)
		if code != exitOK || stderr != "" {
			t.Fatalf("shard %d: exit %d, stderr %q", i, code, stderr)
		}
		if !strings.Contains(stdout, "summary written to "+filepath.Join(dir, "summary-shard-"+[]string{"0", "1"}[i]+"-of-2.json")) {
			t.Errorf("shard %d: stdout %q", i, stdout)
		}
	}
	merged := filepath.Join(root, "merged")
	code, stdout, stderr := execute(append([]string{"merge", "--out", merged}, dirs...)...)
	if code != exitOK || stderr != "" {
		t.Fatalf("merge: exit %d, stderr %q", code, stderr)
	}
	for _, want := range []string{"11 points, every certificate verifies", "point 0 (c=0): undecided gap >= 3*pi^2/D^2", "claims: 10 all hold, 1 undecided, 0 fail"} {
		if !strings.Contains(stdout, want) {
			t.Errorf("merge output lacks %q:\n%s", want, stdout)
		}
	}
	for _, f := range []string{"summary.json", "summary.csv"} {
		if _, err := os.Stat(filepath.Join(merged, f)); err != nil {
			t.Error(err)
		}
	}
	if code, _, stderr := execute(append([]string{"merge", "--out", merged}, dirs...)...); code != exitFailure || !strings.Contains(stderr, "not overwritten") {
		t.Errorf("second merge: exit %d, stderr %q", code, stderr)
	}

	certsOf, _ := filepath.Glob(filepath.Join(dirs[1], "*.cert.json"))
	data, err := os.ReadFile(certsOf[0])
	if err != nil {
		t.Fatal(err)
	}
	edited := strings.Replace(string(data), `"verdict": "holds"`, `"verdict": "fails"`, 1)
	if edited == string(data) {
		t.Fatal("nothing to tamper with")
	}
	if err := os.WriteFile(certsOf[0], []byte(edited), 0o644); err != nil {
		t.Fatal(err)
	}
	code, _, stderr = execute("sweep", family, "--shard", "1/2", "--out", dirs[1])
	if code != exitMismatch || !strings.Contains(stderr, "rejected") || !strings.Contains(stderr, "not overwritten") {
		t.Errorf("sweep over a tampered certificate: exit %d, stderr %q", code, stderr)
	}
	if now, _ := os.ReadFile(certsOf[0]); string(now) != edited {
		t.Error("the tampered certificate was overwritten")
	}
	code, _, stderr = execute(append([]string{"merge", "--out", filepath.Join(root, "merged2")}, dirs...)...)
	if code != exitMismatch || !strings.Contains(stderr, "tampered point") || !strings.Contains(stderr, "missing point") {
		t.Errorf("merge over a tampered certificate: exit %d, stderr %q", code, stderr)
	}
}
