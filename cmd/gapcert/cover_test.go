package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestReadmeCoverWorkflow runs the commands of the README's section
// "Covering parameter ranges" as written, with its family file saved as
// harmonic.json: two shards, their merge (which proves the tiling), the
// picture; then check on a merged cell certificate, and check on an
// edited copy (exit 3).
func TestReadmeCoverWorkflow(t *testing.T) {
	data, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	section := readmeSection(t, string(data), "Covering parameter ranges")
	family := readmeFamily(t, section)
	cmds := readmeCommands(section)
	var kinds []string
	for _, c := range cmds {
		kinds = append(kinds, c[0])
	}
	if got := strings.Join(kinds, " "); got != "cover cover merge plot" {
		t.Fatalf("the README's commands are %q, want two shards, a merge and a picture", got)
	}
	t.Chdir(t.TempDir())
	if err := os.WriteFile("harmonic.json", []byte(family), 0o644); err != nil {
		t.Fatal(err)
	}
	var merged string
	for _, args := range cmds {
		code, stdout, stderr := execute(args...)
		if code != exitOK {
			t.Fatalf("gapcert %s: exit %d\nstdout:\n%s\nstderr:\n%s", strings.Join(args, " "), code, stdout, stderr)
		}
		if args[0] == "merge" {
			merged = stdout
		}
	}
	// The README states the coverage of the merged run.
	if !strings.Contains(merged, "holds on 0.99609375, fails on 0, undecided on 0.00390625") || !strings.Contains(section, "0.99609375") {
		t.Errorf("merge output:\n%s\ndoes not give the README's coverage", merged)
	}
	cells, _ := filepath.Glob(filepath.Join("cover", "merged", "cell-*.cell.json"))
	if len(cells) == 0 {
		t.Fatal("no cell certificates in the merged directory")
	}
	if code, stdout, stderr := execute("check", cells[0]); code != exitOK || !strings.Contains(stdout, "cell certificate verifies") {
		t.Fatalf("check %s: exit %d\n%s%s", cells[0], code, stdout, stderr)
	}
	cell, _ := os.ReadFile(cells[0])
	edited := strings.Replace(string(cell), `"lower": "`, `"lower": "1`, 1)
	bad := filepath.Join("cover", "merged", "edited.cell.json")
	if err := os.WriteFile(bad, []byte(edited), 0o644); err != nil {
		t.Fatal(err)
	}
	if code, _, stderr := execute("check", bad); code != exitMismatch {
		t.Errorf("check of an edited cell: exit %d, want %d\n%s", code, exitMismatch, stderr)
	}
}

// TestCoverRefusesBeforeComputing: an invalid family exits 2 naming the
// defect and writes nothing.
func TestCoverRefusesBeforeComputing(t *testing.T) {
	t.Chdir(t.TempDir())
	for name, c := range map[string]struct{ family, want string }{
		"min_cell missing": {`{"template": {"domain": {"interval": ["0","1"]}, "potential": "c*x^2", "boundary": "dirichlet"},
		  "parameters": [{"name": "c", "range": {"lo": "0", "hi": "5"}}]}`, "has no min_cell"},
		"sign change": {`{"template": {"domain": {"interval": ["0","2"]}, "potential": "sin(c*x)", "boundary": "dirichlet"},
		  "parameters": [{"name": "c", "range": {"lo": "0", "hi": "5"}, "min_cell": "1/64"}]}`, "takes both signs"},
	} {
		if err := os.WriteFile("f.json", []byte(c.family), 0o644); err != nil {
			t.Fatal(err)
		}
		code, _, stderr := execute("cover", "f.json", "--out", "out")
		if code != exitInvalid || !strings.Contains(stderr, c.want) {
			t.Errorf("%s: exit %d, stderr %q; want %d and %q", name, code, stderr, exitInvalid, c.want)
		}
		if _, err := os.Stat("out"); err == nil {
			t.Errorf("%s: the output directory was created", name)
		}
	}
}
