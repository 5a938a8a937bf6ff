package coverplot

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gapcert/certs/cover"
)

// TestLoadRefusesCoverageThatTheCellsDoNotGive edits the coverage of the
// claim in a summary whose rows are intact (the legend would state it),
// and repeats a row (the fractions would count it twice): both are
// refused, since the legend's fractions must be those of the cells drawn.
func TestLoadRefusesCoverageThatTheCellsDoNotGive(t *testing.T) {
	dir := coverDir(t)
	sum := filepath.Join(dir, "summary.json")
	data, err := os.ReadFile(sum)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := Load(dir, 0); err != nil {
		t.Fatalf("intact summary: %v", err)
	}
	for _, c := range []struct {
		name string
		edit func(s *cover.Summary)
	}{
		{"coverage", func(s *cover.Summary) {
			s.Claims[0].Coverage = cover.Coverage{Holds: "1", Fails: "0", Undecided: "0"}
		}},
		{"repeated row", func(s *cover.Summary) { s.Cells = append(s.Cells, s.Cells[len(s.Cells)-1]) }},
	} {
		s, err := cover.UnmarshalSummary(data)
		if err != nil {
			t.Fatal(err)
		}
		c.edit(s)
		edited, err := cover.MarshalSummary(s)
		if err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(sum, edited, 0o644); err != nil {
			t.Fatal(err)
		}
		if _, err := Load(dir, 0); err == nil || !strings.Contains(err.Error(), "summary") {
			t.Errorf("%s edited: error %v, want a refusal", c.name, err)
		}
	}
}
