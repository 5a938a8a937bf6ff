package tri_test

import (
	"fmt"
	"math"

	"gapcert/enclose"
	"gapcert/enclose/sparse"
	"gapcert/fem/boundary"
	"gapcert/fem/mesh"
	"gapcert/fem/tri"
	"gapcert/interval"
	"gapcert/interval/formula"
)

// Two-sided verified bounds of the lowest Dirichlet eigenvalue of the unit
// square (exactly 2π² ≈ 19.7392): a Rayleigh–Ritz upper bound from P2 and a
// projection lower bound from the ECR space.
func Example() {
	p := func(x, y float64) [2]interval.I { return [2]interval.I{interval.Point(x), interval.Point(y)} }
	m, err := mesh.FromPolygon([][2]interval.I{p(0, 0), p(1, 0), p(1, 1), p(0, 1)}, [][3]int{{0, 1, 2}, {0, 2, 3}})
	if err != nil {
		panic(err)
	}
	m = m.Refine().Refine().Refine().Refine()
	dir := boundary.Condition{Kind: boundary.Dirichlet}
	bc := []boundary.Condition{dir, dir, dir, dir}
	zero, _ := formula.Parse("0")
	v, err := tri.NewPotential(m, zero, 1)
	if err != nil {
		panic(err)
	}

	// Upper bound: choose an approximate eigenvector in floating point, then
	// enclose its Rayleigh quotient.
	s := tri.NewLagrange(m, 2, bc)
	k, mm := s.AssembleApprox(v, 0)
	_, vecs, err := sparse.LowestEigs(k, mm, 1)
	if err != nil {
		panic(err)
	}
	a0, a1, err := s.RitzMatrices(vecs, v, interval.I{})
	if err != nil {
		panic(err)
	}
	ev, err := enclose.Eigenvalues(a0, a1)
	if err != nil {
		panic(err)
	}

	// Lower bound: a verified count of the ECR pencil below σ, then the
	// projection bound λ_h/(1 + C²λ_h).
	e := tri.NewECR(m, bc)
	ek, em, mMin, err := e.Matrices(v, interval.I{})
	if err != nil {
		panic(err)
	}
	vals, _, err := sparse.LowestEigs(ek.Mid(), em.Mid(), 1)
	if err != nil {
		panic(err)
	}
	n, sigma, ok := sparse.CountBelow(ek, em, mMin, vals[0]*(1-1e-9))
	if !ok || n != 0 {
		panic("count not verified")
	}
	lower := enclose.ProjectionLower(sigma, e.ProjectionConstant())
	fmt.Printf("%.3f ≤ λ_1 ≤ %.3f (2π² = %.4f)\n", math.Floor(lower*1000)/1000, math.Ceil(ev[0].Hi*1000)/1000, 2*math.Pi*math.Pi)
	// Output:
	// 19.568 ≤ λ_1 ≤ 19.740 (2π² = 19.7392)
}
