package tet

import (
	"strings"
	"testing"

	"gapcert/interval"
)

// NewMesh refuses what the spaces cannot use, each with its reason, and
// its volume enclosures sum to an enclosure of the cube's volume 1.
func TestNewMeshChecks(t *testing.T) {
	pts := [][3]float64{{0, 0, 0}, {1, 0, 0}, {0, 1, 0}, {0, 0, 1}}
	nodes := make([][3]interval.I, len(pts))
	for i, p := range pts {
		nodes[i] = [3]interval.I{interval.Point(p[0]), interval.Point(p[1]), interval.Point(p[2])}
	}
	tt := [4]int{0, 1, 2, 3}
	all := func() []BoundaryFace {
		var b []BoundaryFace
		for i := 0; i < 4; i++ {
			b = append(b, BoundaryFace{Nodes: faceNodes(tt, i)})
		}
		return b
	}
	if _, err := NewMesh(nodes, [][4]int{tt}, all(), 1); err != nil {
		t.Fatalf("reference tetrahedron refused: %v", err)
	}
	for _, c := range []struct {
		name string
		tets [][4]int
		bnd  []BoundaryFace
		want string
	}{
		{"negative orientation", [][4]int{{0, 2, 1, 3}}, all(), "positive orientation"},
		{"node out of range", [][4]int{{0, 1, 2, 7}}, all(), "outside"},
		{"missing boundary face", [][4]int{tt}, all()[:3], "not a boundary face"},
		{"face listed twice", [][4]int{tt}, append(all(), all()[0]), "listed twice"},
		{"side out of range", [][4]int{tt}, []BoundaryFace{{Nodes: [3]int{1, 2, 3}, Side: 3}}, "side 3"},
	} {
		_, err := NewMesh(nodes, c.tets, c.bnd, 1)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error %v, want one mentioning %q", c.name, err, c.want)
		}
	}
	m := unitCube(t, 3)
	var vol interval.I
	for k := 0; k < m.NumTets(); k++ {
		vol = vol.Add(m.Geom(k).Volume)
	}
	if !vol.Contains(1) || vol.Wid() > 1e-13 {
		t.Errorf("volumes of the 162 tetrahedra sum to %v, want a narrow enclosure of 1", vol)
	}
}

// Misuse panics: a degree below 1, the wrong number of side conditions, a
// vector of the wrong length, a potential on another mesh.
func TestMisusePanics(t *testing.T) {
	m := unitCube(t, 1)
	other := unitCube(t, 1)
	v, err := NewPotential(other, mustExpr(t, "0"), 1)
	if err != nil {
		t.Fatal(err)
	}
	own, err := NewPotential(m, mustExpr(t, "0"), 1)
	if err != nil {
		t.Fatal(err)
	}
	s := NewLagrange(m, 2, allBC(6, neumann))
	for name, f := range map[string]func(){
		"degree 0":            func() { NewLagrange(m, 0, allBC(6, dirichlet)) },
		"five conditions":     func() { NewLagrange(m, 2, allBC(5, dirichlet)) },
		"CR, five conditions": func() { NewCR(m, allBC(5, dirichlet)) },
		"short vector":        func() { _, _, _ = s.RitzMatrices([][]float64{{1}}, own, interval.I{}) },
		"foreign potential":   func() { s.AssembleApprox(v, 0) },
	} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("%s: no panic", name)
				}
			}()
			f()
		}()
	}
}
