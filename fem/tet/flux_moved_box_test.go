package tet

import (
	"math"
	"testing"

	"gapcert/fem/boundary"
	"gapcert/interval"
)

// fluxMovedMesh returns m with every vertex x mapped to R·(S x) + b, S =
// diag(scale), R = R_x R_z the exact rational rotation with R_z: cos 3/5,
// sin 4/5 and R_x: cos 5/13, sin 12/13 (Pythagorean triples; R = r/845
// with the integer matrix r below), b = (1/3, −2/7, 5). Every factor is
// enclosed, so the moved enclosures hold the exact images; det(RS) > 0
// keeps each cell positively oriented, and the face numbers are kept, so
// conditions chosen on m apply to the moved mesh.
func fluxMovedMesh(m fluxMesh, scale [3]interval.I) fluxMesh {
	r := [3][3]float64{{507, -676, 0}, {260, 195, -780}, {624, 468, 325}}
	b := [3]interval.I{interval.Point(1).DivF(3), interval.Point(-2).DivF(7), interval.Point(5)}
	out := fluxMesh{owners: m.owners, nodes: m.nodes, cells: make([]RTCell, len(m.cells))}
	for k, c := range m.cells {
		d := c
		for v := range 4 {
			for i := range 3 {
				s := b[i]
				for j := range 3 {
					if r[i][j] != 0 {
						s = s.Add(c.Vertices[v][j].Mul(scale[j]).MulF(r[i][j]).DivF(845))
					}
				}
				d.Vertices[v][i] = s
			}
		}
		out.cells[k] = d
	}
	return out
}

// TestFluxMovedMatrixIsRotation checks that r/845 of fluxMovedMesh is a
// rotation: rᵀr = 845² I and det r = 845³ (exact integers).
func TestFluxMovedMatrixIsRotation(t *testing.T) {
	r := [3][3]int64{{507, -676, 0}, {260, 195, -780}, {624, 468, 325}}
	for i := range 3 {
		for j := range 3 {
			var s int64
			for k := range 3 {
				s += r[k][i] * r[k][j]
			}
			if want := map[bool]int64{true: 845 * 845, false: 0}[i == j]; s != want {
				t.Fatalf("(rᵀr)[%d][%d] = %d, want %d", i, j, s, want)
			}
		}
	}
	det := r[0][0]*(r[1][1]*r[2][2]-r[1][2]*r[2][1]) - r[0][1]*(r[1][0]*r[2][2]-r[1][2]*r[2][0]) + r[0][2]*(r[1][0]*r[2][1]-r[1][1]*r[2][0])
	if det != 845*845*845 {
		t.Fatalf("det r = %d, want 845³", det)
	}
}

// The box (0, 3/2) × (0, 1/2) × (0, 1) (the unit cube scaled by S =
// diag(3/2, 1/2, 1)), rotated by R and translated as in fluxMovedMesh: the
// Laplacian commutes with rigid motions, so its eigenvalues are those of
// the box, by separation of variables (common practice):
//
//   - Dirichlet: π²(4a²/9 + 4b² + c²), a, b, c ≥ 1: 49π²/9 (1, 1, 1),
//     61π²/9 (2, 1, 1), 76π²/9 (1, 1, 2), then 81π²/9 (3, 1, 1);
//   - Neumann: a, b, c ≥ 0: 0, 4π²/9 (1, 0, 0), π² (0, 0, 1),
//     13π²/9 (1, 0, 1), 16π²/9 (2, 0, 0);
//   - Robin with α = 1 on the face x = 3/2 of the box, Dirichlet on the
//     others: μ + π²(4b² + c²) with μ = s²/L², L = 3/2, s a root of
//     s cos s + αL sin s = 0 (u = sin(sx/L); one root in each
//     ((j − ½)π, jπ), see TestFluxLehmannGoerischUnitCubeMixedAndRobin):
//     λ_1 = μ_1 + 5π², λ_2 = μ_2 + 5π² (μ_2 < 12 < μ_1 + 3π²).
//
// TestFluxLehmannGoerischMovedBox checks that the Ritz and
// Lehmann–Goerisch bounds on the moved Kuhn mesh of 3³ subcubes (P_3,
// RT_2) contain these values (ρ ≤ Λ_(N+1) from the closed forms) and are
// narrow.
func TestFluxLehmannGoerischMovedBox(t *testing.T) {
	const gamma = 10
	pi2 := fluxPiSquaredTimes(1)
	ninth := func(c float64) interval.I { return pi2.MulF(c).DivF(9) }
	s1 := fluxRobinRoot(t, 1.5, 1.6, 3.1)
	s2 := fluxRobinRoot(t, 1.5, 4.72, 6.2)
	mu := func(s interval.I) interval.I { return s.Sqr().MulF(4).DivF(9) }
	scale := [3]interval.I{interval.Point(1.5), interval.Point(0.5), interval.Point(1)}
	robin := boundary.Condition{Kind: boundary.Robin, Alpha: interval.Point(1)}
	dir := boundary.Condition{Kind: boundary.Dirichlet}
	for _, c := range []struct {
		name     string
		cond     func(x [3]float64) boundary.Condition // on the unit cube, before moving
		gamma    float64
		want     []interval.I // λ_1 … λ_N
		next     interval.I   // λ_(N+1)
		maxWidth float64      // about twice the widest enclosure measured when written
	}{
		{"dirichlet", func([3]float64) boundary.Condition { return dir }, gamma,
			[]interval.I{ninth(49), ninth(61)}, ninth(76), 10},
		{"neumann", func([3]float64) boundary.Condition { return boundary.Condition{Kind: boundary.Neumann} }, 1,
			[]interval.I{interval.Point(0), ninth(4), pi2}, ninth(13), 4e-3},
		{"robin", func(x [3]float64) boundary.Condition {
			if x[0] == 1 {
				return robin
			}
			return dir
		}, gamma, []interval.I{mu(s1).Add(pi2.MulF(5))}, mu(s2).Add(pi2.MulF(5)), 0.9},
	} {
		t.Run(c.name, func(t *testing.T) {
			m := fluxKuhnMesh(3, nil, nil)
			bnd := m.boundaryWhere(c.cond)
			rho := interval.SubDown(c.next.Lo+c.gamma, 1e-9*c.next.Lo)
			// Also with scrambled vertex numbers and local orders (the face
			// numbers, and so the conditions, are kept), so that the
			// Neumann and Robin faces meet the cells in every local
			// position and orientation (Dirichlet faces scrambled: see
			// TestFluxLehmannGoerischUnitCubeDirichlet).
			for _, scrambled := range []bool{false, true} {
				if scrambled && c.name == "dirichlet" {
					continue
				}
				mm := m
				if scrambled {
					mm = fluxScrambled(m, 7)
				}
				r := fluxLGBounds(t, fluxMovedMesh(mm, scale), bnd, 3, 2, len(c.want), c.gamma, rho)
				for i, w := range c.want {
					if !(r.lower[i] <= w.Lo && w.Hi <= r.upper[i]) {
						t.Fatalf("scrambled %v: λ_%d ∈ [%.12g, %.12g] misses %v", scrambled, i+1, r.lower[i], r.upper[i], w)
					}
					if wd := r.upper[i] - r.lower[i]; wd > c.maxWidth || math.IsNaN(wd) {
						t.Errorf("scrambled %v: λ_%d ∈ [%.12g, %.12g]: width %.3g above %.3g", scrambled, i+1, r.lower[i], r.upper[i], wd, c.maxWidth)
					}
					t.Logf("scrambled %v: λ_%d ∈ [%.10g, %.10g] (exact %.10g), width %.3g", scrambled, i+1, r.lower[i], r.upper[i], w.Mid(), r.upper[i]-r.lower[i])
				}
			}
		})
	}
}

// TestFluxLehmannGoerischMovedOrthoscheme checks the orthoscheme
// 0 ≤ x ≤ y ≤ z ≤ 1 scaled by 2 and moved by the rotation and translation
// of fluxMovedMesh: its Dirichlet eigenvalues are those of
// TestFluxLehmannGoerischOrthoscheme divided by 4, 14π²/4 and 21π²/4
// (then 26π²/4, which gives ρ). The relative widths must stay within the
// limits of that test for the same mesh and degrees (n = 4, p = 3, k = 2).
func TestFluxLehmannGoerischMovedOrthoscheme(t *testing.T) {
	keep := func(c [3]float64) bool { return c[0] < c[1] && c[1] < c[2] }
	truth := []interval.I{fluxPiSquaredTimes(14).DivF(4), fluxPiSquaredTimes(21).DivF(4)}
	const gamma = 25
	rho := (26*math.Pi*math.Pi/4 + gamma) * (1 - 1e-9)
	m := fluxKuhnMesh(4, keep, nil)
	two := interval.Point(2)
	r := fluxLGBounds(t, fluxMovedMesh(m, [3]interval.I{two, two, two}), fluxDirichletAll(m), 3, 2, 2, gamma, rho)
	for i, tr := range truth {
		if !(r.lower[i] <= tr.Lo && tr.Hi <= r.upper[i]) {
			t.Fatalf("λ_%d ∈ [%.12g, %.12g] misses %v", i+1, r.lower[i], r.upper[i], tr)
		}
		rel := (r.upper[i] - r.lower[i]) / tr.Mid()
		if maxRel := [2]float64{0.04, 0.4}[i]; rel > maxRel {
			t.Errorf("λ_%d relative width %.3g above %.3g", i+1, rel, maxRel)
		}
		t.Logf("λ_%d ∈ [%.10g, %.10g] (exact %.10g), relative width %.3g", i+1, r.lower[i], r.upper[i], tr.Mid(), rel)
	}
}
