package tri

import (
	"math"
	"testing"

	"gapcert/interval"
	"gapcert/temple"
)

// lgLowest runs the Lehmann–Goerisch bound with the first n trial
// functions and the flux space of degree k, shift gamma and rho.
func lgLowest(t *testing.T, s *Lagrange, vecs [][]float64, k int, bc []BC, v *Potential, gamma, rho float64) []float64 {
	t.Helper()
	g := interval.Point(gamma)
	w, err := v.InverseShifted(g, 8)
	if err != nil {
		t.Fatal(err)
	}
	f := NewFlux(s.Mesh(), k, bc)
	fluxes, err := f.MinimizeApprox(s, vecs, w)
	if err != nil {
		t.Fatal(err)
	}
	a0, a1, err := s.RitzMatrices(vecs, v, g)
	if err != nil {
		t.Fatal(err)
	}
	a2, err := f.LGMatrix(s, vecs, fluxes, v, w, g)
	if err != nil {
		t.Fatal(err)
	}
	lower, err := temple.LehmannGoerisch(a0, a1, a2, rho)
	if err != nil {
		t.Fatal(err)
	}
	return lower
}

// Exact-eigenpair sanity check (METHODS §6): on the unit square with
// Dirichlet sides, u = sin πx sin πy is an eigenfunction with
// Λ = 2π² + γ (separation of variables, common practice). Its degree-8
// interpolant with the optimal RT_7 flux and ρ = 5π²·0.999 + γ ≤ Λ_2 must
// give a lower bound below Λ and within 1e-9 of it.
func TestLGExactEigenpairSquare(t *testing.T) {
	m := unitSquare(t, 1)
	bc := allBC(4, dirichlet)
	s := NewLagrange(m, 8, bc)
	u := s.Interpolate(func(x, y float64) float64 { return math.Sin(math.Pi*x) * math.Sin(math.Pi*y) })
	const gamma = 1
	v := mustPotential(t, m, "0", 1)
	rho := 5*math.Pi*math.Pi*0.999 + gamma
	lower := lgLowest(t, s, [][]float64{u}, 7, bc, v, gamma, rho)
	exact := twoPi2.AddF(gamma)
	if !(lower[0] <= exact.Lo) {
		t.Fatalf("lower bound %.17g above Λ_1 = %.17g", lower[0], exact.Lo)
	}
	if rel := (exact.Hi - lower[0]) / exact.Hi; rel > 1e-9 {
		t.Fatalf("lower bound %.17g is %.2g below Λ_1 = %.17g", lower[0], rel, exact.Hi)
	}
	t.Logf("Λ_1 ≥ %.17g, exact %.17g, relative gap %.2g", lower[0], exact.Mid(), (exact.Hi-lower[0])/exact.Hi)
}
