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
	// Polyhedra: the unit cube (one face listed inward), and a cube with a
	// pyramid dent with a point and a potential in x, y, z.
	f.Add([]byte(`{"domain":{"polyhedron":{"vertices":[["0","0","0"],["1","0","0"],["1","1","0"],["0","1","0"],["0","0","1"],["1","0","1"],["1","1","1"],["0","1","1"]],"faces":[[0,3,2,1],[4,7,6,5],[0,1,5,4],[1,2,6,5],[2,3,7,6],[3,0,4,7]]}},"boundary":"dirichlet"}`))
	f.Add([]byte(`{"domain":{"polyhedron":{"vertices":[["0","0","0"],["1","0","0"],["1","1","0"],["0","1","0"],["0","0","1"],["1","0","1"],["1","1","1"],["0","1","1"],["1/2","1/2","3/4"]],"faces":[[0,3,2,1],[0,1,5,4],[1,2,6,5],[2,3,7,6],[3,0,4,7],[4,5,8],[5,6,8],[6,7,8],[7,4,8]]}},"boundary":["dirichlet","neumann",{"robin":"1"},"dirichlet","dirichlet","dirichlet","dirichlet","dirichlet","dirichlet"],"potential":"x*y+z^2","points":[["1/2","1/2","1/2"]]}`))
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
