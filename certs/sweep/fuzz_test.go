package sweep

import (
	"os"
	"path/filepath"
	"testing"
)

// FuzzParseFamily: ParseFamily never panics, and a family it accepts has
// as many points as its grid and a parsed problem at each.
func FuzzParseFamily(f *testing.F) {
	files, _ := filepath.Glob(filepath.Join(examples, "*_family.json"))
	for _, file := range files {
		if data, err := os.ReadFile(file); err == nil {
			f.Add(data)
		}
	}
	f.Add([]byte(`{"template": {"domain": {"interval": ["0", "L"]}, "boundary": "dirichlet"}, "parameters": [{"name": "L", "values": ["1", "2"]}]}`))
	f.Fuzz(func(t *testing.T, data []byte) {
		fam, err := ParseFamily(data)
		if err != nil {
			return
		}
		total := 1
		for _, p := range fam.Params {
			total *= len(p.Values)
		}
		if len(fam.Points) != total {
			t.Fatalf("%d points for a grid of %d", len(fam.Points), total)
		}
		for i, pt := range fam.Points {
			if pt.Index != i || pt.Problem == nil {
				t.Fatalf("point %d: index %d, problem %v", i, pt.Index, pt.Problem)
			}
		}
	})
}
