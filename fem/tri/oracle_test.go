package tri

import (
	"math"
	"testing"

	"gapcert/enclose"
	"gapcert/enclose/sparse"
	"gapcert/fem/boundary"
	"gapcert/fem/mesh"
	"gapcert/interval"
)

// piI encloses π (math.Pi is the float64 just below π).
var piI = interval.I{Lo: math.Pi, Hi: math.Nextafter(math.Pi, 4)}

// verifiedBounds returns, for k = 1..count, a verified upper bound of λ_k
// (Rayleigh–Ritz in P_p with enclose.Eigenvalues) and a verified lower
// bound (ECR or CR projection: λ_(h,k) ≥ σ′ from sparse.CountBelow, then
// enclose.ProjectionLower), for V = 0 (γ = 0).
func verifiedBounds(t *testing.T, m *mesh.Mesh, bc []boundary.Condition, p, count int, enriched bool) (lower, upper []float64) {
	t.Helper()
	v := mustPotential(t, m, "0", 1)
	s := NewLagrange(m, p, bc)
	k, mm := s.AssembleApprox(v, 0)
	_, vecs, err := sparse.LowestEigs(k, mm, count+1)
	if err != nil {
		t.Fatal(err)
	}
	a0, a1, err := s.RitzMatrices(vecs, v, interval.I{})
	if err != nil {
		t.Fatal(err)
	}
	ev, err := enclose.Eigenvalues(a0, a1)
	if err != nil {
		t.Fatal(err)
	}
	var proj *Projection
	if enriched {
		proj = NewECR(m, bc)
	} else {
		proj = NewCR(m, bc)
	}
	pk, pm, mMin, err := proj.Matrices(v, interval.I{})
	if err != nil {
		t.Fatal(err)
	}
	vals, _, err := sparse.LowestEigs(pk.Mid(), pm.Mid(), count)
	if err != nil {
		t.Fatal(err)
	}
	c := proj.ProjectionConstant()
	for i := 0; i < count; i++ {
		upper = append(upper, ev[i].Hi)
		sigma := vals[i] - 1e-6*math.Max(1, math.Abs(vals[i]))
		n, sp, ok := sparse.CountBelow(pk, pm, mMin, sigma)
		lo := math.Inf(-1)
		if ok && n <= i {
			lo = enclose.ProjectionLower(sp, c)
		}
		lower = append(lower, lo)
	}
	return lower, upper
}

func equilateral(t *testing.T, levels int) *mesh.Mesh {
	t.Helper()
	s3, _ := interval.Point(3).Sqrt()
	top := [2]interval.I{interval.Point(0.5), s3.DivF(2)}
	m, err := mesh.FromPolygon([][2]interval.I{pt(0, 0), pt(1, 0), top}, [][3]int{{0, 1, 2}})
	if err != nil {
		t.Fatal(err)
	}
	for i := 0; i < levels; i++ {
		m = m.Refine()
	}
	return m
}

// Verified two-sided bounds against closed forms:
//   - equilateral triangle, side 1: Dirichlet λ = (16π²/9)(m² + mn + n²),
//     m, n ≥ 1: 16π²/3, 112π²/9 (twice); Neumann m, n ≥ 0: 0, 16π²/9
//     (twice) (Lamé; M. A. Pinsky, SIAM J. Math. Anal. 11 (1980));
//   - unit square, Dirichlet on x = 0, 1 and Neumann on y = 0, 1:
//     π²(m² + n²), m ≥ 1, n ≥ 0: π², 2π², 4π² (separation of variables,
//     common practice);
//   - L-shaped domain (−1, 1)² ∖ [0, 1)², Dirichlet: λ_1 ≈ 9.6397238
//     (recalled from memory; only its position inside the bounds is used,
//     with a margin of 1e-6).
func TestVerifiedBoundsClosedForms(t *testing.T) {
	pi2 := piI.Sqr()
	c := pi2.MulF(16).DivF(9)
	square := func(t *testing.T) *mesh.Mesh { return unitSquare(t, 3) }
	lshape := func(t *testing.T) *mesh.Mesh {
		m, err := mesh.FromPolygon([][2]interval.I{pt(-1, -1), pt(1, -1), pt(1, 0), pt(0, 0), pt(0, 1), pt(-1, 1)},
			[][3]int{{0, 1, 2}, {0, 2, 3}, {0, 3, 4}, {0, 4, 5}})
		if err != nil {
			t.Fatal(err)
		}
		return m.Refine().Refine().Refine()
	}
	cases := []struct {
		name     string
		mesh     func(*testing.T) *mesh.Mesh
		bc       []boundary.Condition
		want     []interval.I
		enriched bool
		relWidth []float64 // demanded (upper − lower)/truth where truth > 0 (measured widths plus a quarter; stage A is O(h²))
	}{
		{"equilateral Dirichlet", func(t *testing.T) *mesh.Mesh { return equilateral(t, 3) }, allBC(3, dirichlet),
			[]interval.I{c.MulF(3), c.MulF(7), c.MulF(7)}, true, []float64{0.10, 0.21, 0.21}},
		{"equilateral Neumann", func(t *testing.T) *mesh.Mesh { return equilateral(t, 3) }, allBC(3, neumann),
			[]interval.I{{}, c, c}, true, []float64{0, 0.037, 0.037}},
		{"square mixed, CR", square, []boundary.Condition{neumann, dirichlet, neumann, dirichlet},
			[]interval.I{pi2, pi2.MulF(2), pi2.MulF(4)}, false, []float64{0.041, 0.065, 0.15}},
		{"square mixed, ECR", square, []boundary.Condition{neumann, dirichlet, neumann, dirichlet},
			[]interval.I{pi2, pi2.MulF(2), pi2.MulF(4)}, true, []float64{0.041, 0.065, 0.15}},
		{"L-shape Dirichlet", lshape, allBC(6, dirichlet),
			[]interval.I{{Lo: 9.6397238 - 1e-6, Hi: 9.6397238 + 1e-6}}, true, []float64{0.14}},
		{"L-shape Dirichlet, graded", func(t *testing.T) *mesh.Mesh { return lshape(t).RefineGraded(3, 6) }, allBC(6, dirichlet),
			[]interval.I{{Lo: 9.6397238 - 1e-6, Hi: 9.6397238 + 1e-6}}, true, []float64{0.11}},
	}
	for _, tc := range cases {
		lo, up := verifiedBounds(t, tc.mesh(t), tc.bc, 3, len(tc.want), tc.enriched)
		for i, w := range tc.want {
			if !(lo[i] <= w.Lo && w.Hi <= up[i]) {
				t.Errorf("%s λ_%d: [%.8g, %.8g] does not contain %v", tc.name, i+1, lo[i], up[i], w)
			}
			if w.Lo > 0 {
				if r := (up[i] - lo[i]) / w.Lo; r > tc.relWidth[i] {
					t.Errorf("%s λ_%d: relative width %.3g > %.3g", tc.name, i+1, r, tc.relWidth[i])
				}
			}
			t.Logf("%s λ_%d ∈ [%.8g, %.8g], truth %.8g", tc.name, i+1, lo[i], up[i], w.Mid())
		}
	}
}
