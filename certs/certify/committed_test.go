package certify

import (
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestCommittedCertificatesVerify re-checks every certificate committed
// to the repository (testdata of the report and sweep-picture packages):
// a change of the method that alters a bound must come with regenerated
// testdata (DEVELOPERS.md, "-update"), or the files the project ships as
// examples of its evidence would no longer verify.
func TestCommittedCertificatesVerify(t *testing.T) {
	root := filepath.Join("..", "..")
	var paths []string
	err := filepath.WalkDir(root, func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if d.IsDir() && strings.HasPrefix(d.Name(), ".") && path != root {
			return filepath.SkipDir
		}
		if !d.IsDir() && strings.HasSuffix(d.Name(), ".cert.json") {
			paths = append(paths, path)
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	if len(paths) < 30 {
		t.Fatalf("found %d committed certificates, expected the report and sweep testdata (at least 30)", len(paths))
	}
	for _, path := range paths {
		data, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		if err := Check(data); err != nil {
			t.Errorf("%s: %v", path, err)
		}
	}
}
