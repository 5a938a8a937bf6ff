package main

import (
	"bytes"
	"path/filepath"
	"runtime"
	"strings"
	"testing"

	"gapcert/fem/problem"
)

const testdata = "../../testdata/problems"

func execute(args ...string) (code int, stdout, stderr string) {
	var out, errb bytes.Buffer
	code = run(args, &out, &errb)
	return code, out.String(), errb.String()
}

func TestValidateGood(t *testing.T) {
	for _, c := range []struct {
		file string
		want []string
	}{
		{"square.json", []string{"polygon with 4 vertices, counterclockwise as given", "convexity:   convex", "diameter:    [1.41421356237309", "area:        1\n", "edge 3 (v3 → v0): dirichlet", "form:      polynomial"}},
		{"clockwise_rectangle.json", []string{"the file lists it clockwise", "edge 0 (v0 → v1): robin, α = 2", "edge 3 (v3 → v0): dirichlet"}},
		{"lshape.json", []string{"convexity:   not convex", "area:        3\n", "form:      general", "first step:  16 triangles of degree 4", "re-entrant corners at vertices [3]"}},
		{"equilateral.json", []string{"v2 = (0.5, sqrt(3)/2 ∈ [0.86602540378443", "claim:       D^2*gap >= 64*pi^2/9"}},
		{"interval_harmonic.json", []string{"domain:      interval (a, b)", "length:      4\n", "boundary:    left dirichlet, right dirichlet", "eigenvalues: 3", "relative width 1e-8"}},
	} {
		file := filepath.Join(testdata, c.file)
		code, out, errs := execute("validate", file)
		if code != exitOK || errs != "" {
			t.Errorf("%s: exit %d, stderr %q", c.file, code, errs)
		}
		p, err := problem.ReadFile(file)
		if err != nil {
			t.Fatal(err)
		}
		for _, w := range append(c.want, "sha256:      "+p.SHA256()) {
			if !strings.Contains(out, w) {
				t.Errorf("%s: output lacks %q:\n%s", c.file, w, out)
			}
		}
	}
}

func TestValidateBad(t *testing.T) {
	file := filepath.Join(testdata, "bad", "many_defects.json")
	code, out, errs := execute("validate", file)
	if code != exitInvalid || out != "" {
		t.Errorf("exit %d, stdout %q", code, out)
	}
	lines := strings.Split(strings.TrimSpace(errs), "\n")
	if len(lines) != 4 {
		t.Fatalf("%d lines, want 4:\n%s", len(lines), errs)
	}
	for _, l := range lines {
		if !strings.HasPrefix(l, file+": ") || !strings.Contains(l, "(hint: ") {
			t.Errorf("line %q lacks the file name or a hint", l)
		}
	}
	if !strings.Contains(lines[1], file+": domain.polygon[2]: repeated vertex") {
		t.Errorf("line 2 is %q", lines[1])
	}
}

func TestCommandLine(t *testing.T) {
	for _, c := range []struct {
		args      []string
		code      int
		out, errs string // substrings
	}{
		{[]string{"version"}, exitOK, "gapcert " + Version + "\ngo:      " + runtime.Version() + "\nos/arch: " + runtime.GOOS + "/" + runtime.GOARCH, ""},
		{[]string{"validate"}, exitFailure, "", "accepts 1 arg"},
		{[]string{"validate", "a", "b"}, exitFailure, "", "accepts 1 arg"},
		{[]string{"validate", filepath.Join(testdata, "no_such_file.json")}, exitFailure, "", "no_such_file.json: no such file"},
		{[]string{"frobnicate"}, exitFailure, "", `unknown command "frobnicate"`},
		{[]string{"--help"}, exitOK, "Exit status: 0 on success", ""},
		{[]string{"help", "validate"}, exitOK, "every defect is listed", ""},
		{[]string{"version", "extra"}, exitFailure, "", "unknown command"},
	} {
		code, out, errs := execute(c.args...)
		if code != c.code || !strings.Contains(out, c.out) || !strings.Contains(errs, c.errs) {
			t.Errorf("%v: exit %d\nstdout %q\nstderr %q", c.args, code, out, errs)
		}
	}
}

// TestHelpTexts checks that every command documents itself.
func TestHelpTexts(t *testing.T) {
	root := newRootCmd(new(bytes.Buffer), new(bytes.Buffer))
	cmds := append(root.Commands(), root)
	for _, c := range cmds {
		if c.Name() == "help" || c.Name() == "completion" {
			continue
		}
		if c.Short == "" || c.Long == "" {
			t.Errorf("command %q lacks Short or Long help", c.Name())
		}
	}
}
