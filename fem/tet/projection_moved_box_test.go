package tet

import (
	"testing"

	"gapcert/enclose"
	"gapcert/fem/boundary"
	"gapcert/fem/mesh3"
	"gapcert/interval"
)

// movedUnitCube returns the Kuhn mesh of [0, 1]³ with n³ subcubes, every
// node x mapped to R·(S x) + b as in fluxMovedMesh (S = diag(scale), R the
// exact rational rotation r/845, b = (1/3, −2/7, 5)), every factor
// enclosed; the sides keep the cube's numbers (x = 0, x = 1, …, z = 1).
func movedUnitCube(t *testing.T, n int, scale [3]interval.I) *Mesh {
	t.Helper()
	m := unitCube(t, n)
	r := [3][3]float64{{507, -676, 0}, {260, 195, -780}, {624, 468, 325}}
	b := [3]interval.I{interval.Point(1).DivF(3), interval.Point(-2).DivF(7), interval.Point(5)}
	nodes := make([][3]interval.I, len(m.nodes))
	for k, x := range m.nodes {
		for i := range 3 {
			s := b[i]
			for j := range 3 {
				if r[i][j] != 0 {
					s = s.Add(x[j].Mul(scale[j]).MulF(r[i][j]).DivF(845))
				}
			}
			nodes[k][i] = s
		}
	}
	m3, err := mesh3.FromPolyhedron(nodes, m.tets, m.bnd)
	if err != nil {
		t.Fatal(err)
	}
	moved, err := NewMesh(m3, m.sides)
	if err != nil {
		t.Fatal(err)
	}
	return moved
}

// stageALowerBC is stageALowerOf (V = 0) with one condition per side.
func stageALowerBC(t *testing.T, space func(*Mesh, []boundary.Condition) *Projection, m *Mesh, bc []boundary.Condition, gamma float64, count int) []float64 {
	t.Helper()
	v, err := NewPotential(m, mustExpr(t, "0"), 1)
	if err != nil {
		t.Fatal(err)
	}
	sa, err := NewStageA(space(m, bc), v, interval.Point(gamma), count)
	if err != nil {
		t.Fatal(err)
	}
	ch, shift, mMin := sa.ProjectionConstant(), sa.FormShift(), sa.MassMin()
	out := make([]float64, count)
	for k := 1; k <= count; k++ {
		approx, err := sa.Locate(k, 0)
		if err != nil {
			t.Fatal(err)
		}
		n, sp, ok := sa.CountBelow(mMin, approx*(1-1e-8))
		if !ok || n > k-1 {
			t.Fatalf("count below the located eigenvalue %d (%v): %d, ok %v", k, approx, n, ok)
		}
		mu := max(interval.SubDown(sp, shift), 0)
		out[k-1] = interval.AddDown(enclose.ProjectionLower(mu, ch), shift)
	}
	return out
}

// TestStageAMovedBox checks the CR and ECR lower bounds and the P_3 Ritz
// upper bounds of the box (0, 3/2) × (0, 1/2) × (0, 1) moved by the
// exact rotation and translation of fluxMovedMesh against the closed forms
// of TestFluxLehmannGoerischMovedBox (shifted by γ): Dirichlet, Neumann,
// and Robin α = 1 on the face x = 3/2 with Dirichlet on the others. The
// Ritz bounds must lie within 6e-2 relative (P_3 on 2³ subcubes; 3.1e-2
// measured for the Dirichlet λ_2 when written).
func TestStageAMovedBox(t *testing.T) {
	pi2 := fluxPiSquaredTimes(1)
	ninth := func(c float64) interval.I { return pi2.MulF(c).DivF(9) }
	s1 := fluxRobinRoot(t, 1.5, 1.6, 3.1)
	robinLambda1 := s1.Sqr().MulF(4).DivF(9).Add(pi2.MulF(5))
	scale := [3]interval.I{interval.Point(1.5), interval.Point(0.5), interval.Point(1)}
	robinBC := allBC(6, dirichlet)
	robinBC[1] = boundary.Condition{Kind: boundary.Robin, Alpha: interval.Point(1)}
	for _, c := range []struct {
		name  string
		bc    []boundary.Condition
		gamma float64
		want  []interval.I // λ_1 … λ_N (not shifted)
	}{
		{"dirichlet", allBC(6, dirichlet), 0, []interval.I{ninth(49), ninth(61)}},
		{"neumann", allBC(6, neumann), 1, []interval.I{interval.Point(0), ninth(4), pi2}},
		{"robin", robinBC, 0, []interval.I{robinLambda1}},
	} {
		t.Run(c.name, func(t *testing.T) {
			m := movedUnitCube(t, 2, scale)
			v, err := NewPotential(m, mustExpr(t, "0"), 1)
			if err != nil {
				t.Fatal(err)
			}
			up := ritzBounds(t, NewLagrange(m, 3, c.bc), v, c.gamma, len(c.want))
			for name, space := range map[string]func(*Mesh, []boundary.Condition) *Projection{"CR": NewCR, "ECR": NewECR} {
				lo := stageALowerBC(t, space, movedUnitCube(t, 4, scale), c.bc, c.gamma, len(c.want))
				for k, w := range c.want {
					e := w.AddF(c.gamma)
					if lo[k] > e.Lo || up[k].Hi < e.Hi {
						t.Fatalf("%s: Λ_%d = %v outside [%v, %v]", name, k+1, e, lo[k], up[k].Hi)
					}
					if r := relErr(up[k].Hi, e); r > 6e-2 {
						t.Errorf("Ritz bound %v of Λ_%d = %v: relative error %.3g above 6e-2", up[k].Hi, k+1, e, r)
					}
					t.Logf("%s: Λ_%d = %.10g ∈ [%.8g, %.10g]", name, k+1, e.Mid(), lo[k], up[k].Hi)
				}
			}
		})
	}
}
