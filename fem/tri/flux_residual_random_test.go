package tri

import (
	"math/rand"
	"testing"

	"gapcert/enclose"
	"gapcert/fem/boundary"
	"gapcert/fem/mesh"
	"gapcert/interval"
)

// TestLehmannMatrixAgreesOnRandomFunctions: for trial functions and fluxes
// with random coefficients (no eigenpair structure, so B has entries of
// the size of ρ²A2 and nothing cancels), the residual form
// ρ²(w_i − Tũ_i/ρ, w_j − Tũ_j/ρ)_X and the combination A0 − 2ρA1 + ρ²A2 of
// the Ritz and flux matrices are the same matrix (package temple, The
// residual form of B), so their enclosures must overlap entry by entry,
// for several ρ. A wrong factor of the Piola map or of the barycentric
// gradients, a transposed metric, a missing γ or a wrong weight would
// move the entries by their own size. The meshes are neither symmetric
// nor axis-aligned (a generic triangle, a rotated and moved rectangle),
// with V = x² + y² (a Taylor model of degree > 0), a constant V (the
// degree-0 path of the weighted Gram) and γ ≠ 0, and a Neumann side.
func TestLehmannMatrixAgreesOnRandomFunctions(t *testing.T) {
	generic := polygonMeshOf(t, [][2]interval.I{pt(0, 0), pt(1, 0), {interval.Point(0.3), interval.Point(0.7)}}, [][3]int{{0, 1, 2}}, 2)
	moved, err := mesh.FromPolygon(movedRectangle(1, 0.6, 1), [][3]int{{0, 1, 2}, {0, 2, 3}})
	if err != nil {
		t.Fatal(err)
	}
	moved = moved.Refine()
	mixed := allBC(4, dirichlet)
	mixed[2] = neumann
	cases := []struct {
		name  string
		m     *mesh.Mesh
		bc    []boundary.Condition
		p, k  int
		v     string
		gamma float64
	}{
		{"generic triangle, V = x^2 + y^2, gamma 0.7", generic, allBC(3, dirichlet), 4, 3, "x^2 + y^2", 0.7},
		{"generic triangle, V = 5, gamma 0", generic, allBC(3, dirichlet), 5, 4, "5", 0},
		{"moved rectangle, one Neumann side, V = x^2 + y^2, gamma 1.5", moved, mixed, 4, 3, "x^2 + y^2", 1.5},
		{"moved rectangle, Dirichlet, V = 0, gamma 2", moved, allBC(4, dirichlet), 3, 3, "0", 2},
	}
	rng := rand.New(rand.NewSource(7))
	for _, c := range cases {
		s := NewLagrange(c.m, c.p, c.bc)
		v := mustPotential(t, c.m, c.v, 6)
		g := interval.Point(c.gamma)
		w, err := v.InverseShifted(g, 8)
		if err != nil {
			t.Fatal(err)
		}
		f := NewFlux(c.m, c.k, c.bc)
		const n = 3
		vecs, fluxes := make([][]float64, n), make([][]float64, n)
		for i := range vecs {
			vecs[i], fluxes[i] = make([]float64, s.N()), make([]float64, f.N())
			for l := range vecs[i] {
				vecs[i][l] = rng.NormFloat64()
			}
			for l := range fluxes[i] {
				fluxes[i][l] = rng.NormFloat64()
			}
		}
		a0, a1, err := s.RitzMatrices(vecs, v, g)
		if err != nil {
			t.Fatal(err)
		}
		a2, err := f.LGMatrix(s, vecs, fluxes, v, w, g)
		if err != nil {
			t.Fatal(err)
		}
		for _, rho := range []float64{0.37, 11, 97.25, 4096} {
			res, err := f.LehmannMatrix(s, vecs, fluxes, v, w, g, rho)
			if err != nil {
				t.Fatal(err)
			}
			r := interval.Point(rho)
			plain := enclose.NewSym(n)
			for i := 0; i < n; i++ {
				for j := 0; j <= i; j++ {
					plain.Set(i, j, a0.At(i, j).Sub(a1.At(i, j).Mul(r.MulF(2))).Add(a2.At(i, j).Mul(r.Sqr())))
				}
			}
			for i := 0; i < n; i++ {
				for j := 0; j <= i; j++ {
					a, b := plain.At(i, j), res.At(i, j)
					if a.Lo > b.Hi || b.Lo > a.Hi {
						t.Errorf("%s, ρ = %g: B[%d][%d] combination %v and residual form %v are disjoint", c.name, rho, i, j, a, b)
					}
					// The test discriminates only if both are narrow
					// against the entries (the weights' Taylor
					// remainders, large for random fluxes, make about
					// 1e-3 with V = x² + y²; a wrong term moves an
					// entry by its own size).
					if mag := max(a.Mag(), 1e-300); a.Rad() > 1e-2*mag || b.Rad() > 1e-2*mag {
						t.Errorf("%s, ρ = %g: B[%d][%d] enclosures %v, %v too wide to compare", c.name, rho, i, j, a, b)
					}
				}
			}
		}
	}
}
