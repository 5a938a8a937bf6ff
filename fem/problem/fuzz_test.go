package problem

import (
	"os"
	"path/filepath"
	"testing"
)

// FuzzParse checks that Parse never panics and that an accepted problem's
// canonical text is accepted again with the same canonical text.
func FuzzParse(f *testing.F) {
	for _, pattern := range []string{"*.json", "bad/*.json"} {
		files, _ := filepath.Glob(filepath.Join(testdata, pattern))
		for _, file := range files {
			data, err := os.ReadFile(file)
			if err != nil {
				f.Fatal(err)
			}
			f.Add(data)
		}
	}
	// Problems with points (the key is optional in every file above).
	f.Add([]byte(`{"domain":{"interval":["0","pi"]},"boundary":"dirichlet","points":[["0"],["pi/2"],["1/3"]]}`))
	f.Add([]byte(`{"domain":{"polygon":[["0","0"],["2","0"],["2","2"],["1","1"],["0","2"]]},"boundary":"dirichlet","points":[["1","1/2"],["sqrt(2)/2","1/3"]]}`))
	f.Fuzz(func(t *testing.T, data []byte) {
		p, err := Parse(data)
		if err != nil {
			if p != nil {
				t.Fatal("problem returned with an error")
			}
			return
		}
		c := p.Canonical()
		q, err := Parse(c)
		if err != nil {
			t.Fatalf("canonical text rejected: %v\n%s", err, c)
		}
		if string(q.Canonical()) != string(c) {
			t.Fatalf("canonical text not stable:\n%s\n%s", c, q.Canonical())
		}
	})
}

func BenchmarkParse(b *testing.B) {
	for _, name := range []string{"square.json", "lshape.json", "equilateral.json"} {
		data, err := os.ReadFile(filepath.Join(testdata, name))
		if err != nil {
			b.Fatal(err)
		}
		b.Run(name, func(b *testing.B) {
			for b.Loop() {
				if _, err := Parse(data); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
