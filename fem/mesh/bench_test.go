package mesh

import "testing"

// BenchmarkRefine measures one red refinement of the L-shape mesh from
// 262 144 to 1 048 576 triangles.
func BenchmarkRefine(b *testing.B) {
	_, m := parsePolygon(b, testPolygons[2].file)
	for range 8 {
		m = m.Refine()
	}
	b.ReportAllocs()
	for b.Loop() {
		r := m.Refine()
		if len(r.Tris) != 1<<20 {
			b.Fatal(len(r.Tris))
		}
	}
}

// BenchmarkRefineGraded measures 10 graded levels toward the re-entrant
// corner of the L-shape after 6 red refinements (16 384 triangles).
func BenchmarkRefineGraded(b *testing.B) {
	_, m := parsePolygon(b, testPolygons[2].file)
	for range 6 {
		m = m.Refine()
	}
	b.ReportAllocs()
	for b.Loop() {
		m.RefineGraded(3, 10)
	}
}

// BenchmarkGeom measures Geom over a mesh of 65 536 triangles.
func BenchmarkGeom(b *testing.B) {
	_, m := parsePolygon(b, testPolygons[1].file)
	for range 8 {
		m = m.Refine()
	}
	for b.Loop() {
		for t := range m.Tris {
			m.Geom(t)
		}
	}
}
