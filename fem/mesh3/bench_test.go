package mesh3

import "testing"

// BenchmarkRefine measures one red refinement of the unit cube's cone
// mesh from 49 152 to 393 216 tetrahedra.
func BenchmarkRefine(b *testing.B) {
	m := fromSolid(b, solids[0])
	for range 4 {
		m = m.Refine()
	}
	b.ReportAllocs()
	for b.Loop() {
		r := m.Refine()
		if len(r.Tets) != 12<<15 {
			b.Fatal(len(r.Tets))
		}
	}
}

// BenchmarkGeom measures Geom over the 49 152 tetrahedra of the unit
// cube's cone mesh refined four times.
func BenchmarkGeom(b *testing.B) {
	m := fromSolid(b, solids[0])
	for range 4 {
		m = m.Refine()
	}
	for b.Loop() {
		for t := range m.Tets {
			m.Geom(t)
		}
	}
}

// BenchmarkNumbering measures Edges and Faces on the same mesh.
func BenchmarkNumbering(b *testing.B) {
	m := fromSolid(b, solids[0])
	for range 4 {
		m = m.Refine()
	}
	b.ReportAllocs()
	for b.Loop() {
		m.Edges()
		m.Faces()
	}
}

// BenchmarkRefineToward measures the grading of the L-shaped prism's cone
// mesh (20 tetrahedra) by five levels toward its re-entrant edge (10,290
// tetrahedra), with the proof of the graded tiling.
func BenchmarkRefineToward(b *testing.B) {
	m := fromSolid(b, lPrism)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := m.RefineToward([]Target{{3, 9, 5}}); err != nil {
			b.Fatal(err)
		}
	}
}
