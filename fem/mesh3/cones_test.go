package mesh3

import (
	"encoding/json"
	"math/rand/v2"
	"slices"
	"testing"

	"gapcert/fem/problem"
)

// TestConesIndependentOfTriangleOrder checks that Cones gives the same
// mesh (nodes, tetrahedra with their local vertex order, boundary faces),
// and so the same refinements, whatever the order of the triangles and
// their starting vertices, and that its volume enclosures sum to an
// enclosure of the exact volume of each solid.
func TestConesIndependentOfTriangleOrder(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 14))
	for _, s := range solids {
		t.Run(s.name, func(t *testing.T) {
			v, _ := json.Marshal(s.vertices)
			f, _ := json.Marshal(s.faces)
			p, err := problem.Parse([]byte(`{"domain": {"polyhedron": {"vertices": ` + string(v) + `, "faces": ` + string(f) + `}}, "boundary": "dirichlet"}`))
			if err != nil {
				t.Fatal(err)
			}
			ph := p.Polyhedron
			apex := len(ph.Vertices)
			want, err := Cones(ph.Nodes(), apex, ph.Triangles(), ph.TriangleFaces())
			if err != nil {
				t.Fatal(err)
			}
			checkVolume(t, want, s.volume)
			tris, faces := slices.Clone(ph.Triangles()), slices.Clone(ph.TriangleFaces())
			for range 3 {
				rng.Shuffle(len(tris), func(i, j int) {
					tris[i], tris[j] = tris[j], tris[i]
					faces[i], faces[j] = faces[j], faces[i]
				})
				for k := range tris {
					for range rng.IntN(3) {
						tris[k] = [3]int{tris[k][1], tris[k][2], tris[k][0]}
					}
				}
				got, err := Cones(ph.Nodes(), apex, tris, faces)
				if err != nil {
					t.Fatal(err)
				}
				if !slices.Equal(got.Tets, want.Tets) || !slices.Equal(got.Bnd, want.Bnd) {
					t.Fatalf("shuffled triangles give another mesh:\n%v\nwant\n%v", got.Tets, want.Tets)
				}
				if r, w := got.Refine(), want.Refine(); !slices.Equal(r.Tets, w.Tets) || !slices.Equal(r.Nodes, w.Nodes) {
					t.Fatal("shuffled triangles give another refinement")
				}
			}
		})
	}
}

// checkVolume checks that the volume enclosures of m sum to an enclosure
// of the exact volume (given rounded), within 1e-12.
func checkVolume(t *testing.T, m *Mesh, volume float64) {
	t.Helper()
	lo, hi := 0.0, 0.0
	for k := range m.Tets {
		g := m.Geom(k)
		lo += g.Volume.Lo
		hi += g.Volume.Hi
	}
	if !(lo <= volume+1e-14 && volume-1e-14 <= hi && hi-lo < 1e-12) {
		t.Errorf("volumes sum to [%v, %v], want about %v", lo, hi, volume)
	}
}

// TestConesMisuse checks the panics of Cones on inconsistent input.
func TestConesMisuse(t *testing.T) {
	p, err := problem.Parse([]byte(`{"domain": {"polyhedron": {"vertices": [["0","0","0"],["1","0","0"],["0","1","0"],["0","0","1"]], "faces": [[0,2,1],[0,1,3],[1,2,3],[2,0,3]]}}, "boundary": "dirichlet"}`))
	if err != nil {
		t.Fatal(err)
	}
	ph := p.Polyhedron
	for name, call := range map[string]func(){
		"lengths":      func() { Cones(ph.Nodes(), 4, ph.Triangles(), ph.TriangleFaces()[1:]) },
		"apex":         func() { Cones(ph.Nodes(), 5, ph.Triangles(), ph.TriangleFaces()) },
		"apex in face": func() { Cones(ph.Nodes(), 0, ph.Triangles(), ph.TriangleFaces()) },
	} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("%s: no panic", name)
				}
			}()
			call()
		}()
	}
}
