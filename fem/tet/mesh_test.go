package tet

import (
	"strings"
	"testing"

	"gapcert/fem/mesh3"
	"gapcert/interval"
)

// NewMesh refuses a boundary face whose side has no condition, and the
// view keeps fem/mesh3's numbering and geometry: its volume enclosures
// sum to an enclosure of the cube's volume 1.
func TestNewMeshChecks(t *testing.T) {
	nodes := [][3]interval.I{{}, {interval.Point(1), {}, {}}, {{}, interval.Point(1), {}}, {{}, {}, interval.Point(1)}}
	tt := [4]int{0, 1, 2, 3}
	var bnd []mesh3.BoundaryFace
	for i, lf := range mesh3.LocalFaces {
		bnd = append(bnd, mesh3.BoundaryFace{A: tt[lf[0]], B: tt[lf[1]], C: tt[lf[2]], Face: i})
	}
	m3, err := mesh3.FromPolyhedron(nodes, [][4]int{tt}, bnd)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := NewMesh(m3, 4); err != nil {
		t.Fatalf("reference tetrahedron refused: %v", err)
	}
	if _, err := NewMesh(m3, 3); err == nil || !strings.Contains(err.Error(), "face 3, outside [0, 3)") {
		t.Errorf("a side without a condition: error %v", err)
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
