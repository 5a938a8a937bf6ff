package sweepplot

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gapcert/certs/sweep"
)

// TestLoadReadsFamilyStrictly: the family file beside a summary, which
// gives the sweep its name, is read strictly: a name given twice (a reader
// that keeps the last key would title the pictures "fake") is an error
// naming the file.
func TestLoadReadsFamilyStrictly(t *testing.T) {
	dir := t.TempDir()
	summary := `{"format": "` + sweep.SummaryFormat + `", "family": "f.json", "family_sha256": "", "shard": {"index": 0, "count": 1}, "parameters": ["L"], "total_points": 0, "points": []}`
	family := `{"name": "rods", "template": {"domain": {"interval": ["0", "L"]}, "boundary": "dirichlet"}, "parameters": [{"name": "L", "values": ["1"]}]}`
	write := func(name, text string) {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	write("summary.json", summary)
	write(sweep.FamilyFileName, family)
	s, err := Load(dir)
	if err != nil || s.Name != "rods" {
		t.Fatalf("Load: %v, name %q", err, s.Name)
	}
	write(sweep.FamilyFileName, strings.Replace(family, `"name": "rods",`, `"name": "rods", "name": "fake",`, 1))
	if _, err := Load(dir); err == nil || !strings.Contains(err.Error(), sweep.FamilyFileName) || !strings.Contains(err.Error(), `duplicate key "name"`) {
		t.Errorf("Load with a name given twice: %v", err)
	}
}
