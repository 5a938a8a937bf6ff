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
