package report

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestReadRefusesAmbiguousFormat: a JSON file in a directory whose
// "format" key is given twice, or spelled in another case, is not left out
// as "not a certificate" but refused as a certificate that is not read
// strictly (a reader that keeps the last key would take the first file
// below for a certificate).
func TestReadRefusesAmbiguousFormat(t *testing.T) {
	for _, c := range []struct{ text, want string }{
		{`{"format": "gapcert.sweep-summary/v1", "format": "gapcert.certificate/v1"}`, `format: duplicate key "format"`},
		{`{"Format": "gapcert.certificate/v1"}`, `no "format" field`},
	} {
		dir := t.TempDir()
		if err := os.WriteFile(filepath.Join(dir, "c.json"), []byte(c.text), 0o644); err != nil {
			t.Fatal(err)
		}
		_, err := Read(dir)
		if err == nil || !strings.Contains(err.Error(), "c.json") || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error %v, want %q", c.text, err, c.want)
		}
	}
}
