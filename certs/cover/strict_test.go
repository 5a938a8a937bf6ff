package cover

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gapcert/certs"
)

// TestStrictReading: cell certificates and summaries with a repeated key,
// a case variant of a key or an unknown key are refused.
func TestStrictReading(t *testing.T) {
	f := mustFamily(t, strings.Replace(harmonicFamily, `"1/256"`, `"5/4"`, 1))
	dir := t.TempDir()
	if _, err := Run(f, dir, testOptions()); err != nil {
		t.Fatal(err)
	}
	cells, _ := filepath.Glob(filepath.Join(dir, "cell-*"+cellSuffix))
	cell, err := os.ReadFile(cells[0])
	if err != nil {
		t.Fatal(err)
	}
	sum, err := os.ReadFile(filepath.Join(dir, "summary.json"))
	if err != nil {
		t.Fatal(err)
	}
	edits := map[string]func(string) string{
		"repeated key": func(s string) string { return strings.Replace(s, `"verdict": `, `"verdict": "holds", "verdict": `, 1) },
		"case variant": func(s string) string { return strings.Replace(s, `"verdict": `, `"Verdict": `, 1) },
		"unknown key":  func(s string) string { return strings.Replace(s, `"verdict": `, `"verdicts_extra": 1, "verdict": `, 1) },
	}
	for name, edit := range edits {
		bad := edit(string(cell))
		if bad == string(cell) {
			t.Fatalf("%s: the edit did not apply", name)
		}
		_, err := UnmarshalCell([]byte(bad))
		var fe *certs.FormatError
		if !errors.As(err, &fe) {
			t.Errorf("cell, %s: error %v, want a *certs.FormatError", name, err)
		}
		if _, _, err := CheckCell([]byte(bad), dir, nil); err == nil {
			t.Errorf("cell, %s: CheckCell accepted it", name)
		}
		if _, err := UnmarshalSummary([]byte(edit(string(sum)))); err == nil {
			t.Errorf("summary, %s: accepted", name)
		}
	}
	// An intact cell verifies.
	if _, _, err := CheckCell(cell, dir, nil); err != nil {
		t.Fatal(err)
	}
}

// TestExampleCoverFamilies: the example cover families in
// testdata/examples read, with the dependences they are examples of
// (nondecreasing coefficients, or the vertices of a triangle).
func TestExampleCoverFamilies(t *testing.T) {
	files, _ := filepath.Glob(filepath.Join("..", "..", "testdata", "examples", "*_cover.json"))
	if len(files) < 2 {
		t.Fatalf("%d example cover families, want at least 2", len(files))
	}
	for _, file := range files {
		data, err := os.ReadFile(file)
		if err != nil {
			t.Fatal(err)
		}
		f, err := ParseFamily(data)
		if err != nil {
			t.Fatalf("%s: %v", file, err)
		}
		for _, d := range f.Dependences {
			if d.Direction != 1 && !d.geometric() {
				t.Errorf("%s: parameter %s has direction %d, want nondecreasing or a vertex of the triangle", file, d.Param, d.Direction)
			}
		}
	}
}
