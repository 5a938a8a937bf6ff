package tri

import (
	"math"
	"testing"

	"gapcert/fem/mesh"
	"gapcert/interval"
)

// A linear f has Bernstein coefficients f(Σ α_i v_i/p), its values at the
// control points (degree elevation of the barycentric form f = Σ f(v_i)λ_i;
// common practice). Setting every global coefficient to f at the control
// point of its local multi-index checks, independently of Eval and of the
// assembly, that the DOF numbering puts each local α at the same geometric
// control point in every triangle sharing it (edge DOFs of p ≥ 3 are shared
// by two triangles that traverse the edge in opposite directions), and that
// Monomials reproduces f, f_x and f_y about a centre in each triangle.
func TestMonomialsReproduceLinearFunctions(t *testing.T) {
	third := interval.Point(1).DivF(3)
	poly := [][2]interval.I{pt(0, 0), {interval.Point(1), third}, pt(1.25, 1), {third, interval.Point(1.5)}, {third.Neg(), interval.Point(0.75)}}
	m, err := mesh.FromPolygon(poly, [][3]int{{0, 1, 2}, {0, 2, 3}, {0, 3, 4}})
	if err != nil {
		t.Fatal(err)
	}
	m = m.Refine()
	f := func(x, y float64) float64 { return 3 + 2*x - 5*y }
	for _, p := range []int{1, 2, 3, 4, 5} {
		s := NewLagrange(m, p, allBC(5, robin(interval.Point(0.5))))
		vec := make([]float64, s.N())
		set := make([]bool, s.N())
		ix := multiIndex(p)
		for tr := range m.Tris {
			v := m.Vertices(tr)
			for l, a := range ix.alpha {
				var cx, cy float64
				for i := range 3 {
					cx += float64(a[i]) * v[i][0].Mid() / float64(p)
					cy += float64(a[i]) * v[i][1].Mid() / float64(p)
				}
				g := s.dofs[tr][l]
				val := f(cx, cy)
				if set[g] && math.Abs(vec[g]-val) > 1e-12 {
					t.Fatalf("p=%d: DOF %d is at control point value %.17g in one triangle and %.17g in triangle %d (local %v)", p, g, vec[g], val, tr, a)
				}
				vec[g], set[g] = val, true
			}
		}
		for tr := range m.Tris {
			v := m.Vertices(tr)
			x0 := [2]float64{(v[0][0].Mid() + v[1][0].Mid() + 2*v[2][0].Mid()) / 4, (v[0][1].Mid() + v[1][1].Mid() + 2*v[2][1].Mid()) / 4}
			c, ok := s.Monomials(vec, tr, x0)
			if !ok {
				t.Fatalf("p=%d triangle %d: area not certified", p, tr)
			}
			// Containment up to the rounding of the control-point values
			// (1e-11), and narrow (measured: 1.6e-9 for the degree-5
			// coefficients at p = 5, from cancellation in the products).
			near := func(x interval.I, want float64) bool {
				return x.Lo-1e-11 <= want && want <= x.Hi+1e-11 && x.Wid() < 1e-8
			}
			if !near(c[0][0], f(x0[0], x0[1])) || !near(c[1][0], 2) || !near(c[0][1], -5) {
				t.Fatalf("p=%d triangle %d: c00 %v c10 %v c01 %v, want %.17g, 2, -5", p, tr, c[0][0], c[1][0], c[0][1], f(x0[0], x0[1]))
			}
			for a, row := range c {
				for b, x := range row {
					if a+b >= 2 && !near(x, 0) {
						t.Fatalf("p=%d triangle %d: c[%d][%d] = %v, want 0", p, tr, a, b, x)
					}
				}
			}
		}
	}
}
