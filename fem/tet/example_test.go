package tet_test

import (
	"fmt"
	"math"

	"gapcert/enclose"
	"gapcert/enclose/sparse"
	"gapcert/fem/boundary"
	"gapcert/fem/mesh3"
	"gapcert/fem/tet"
	"gapcert/interval"
	"gapcert/interval/formula"
)

// Two-sided verified bounds of the lowest Dirichlet eigenvalue of the
// tetrahedron with vertices (0,0,0), (1,0,0), (1,1,0), (1,1,1) (the
// orthoscheme 0 ≤ z ≤ y ≤ x ≤ 1, exactly 14π² ≈ 138.17; the test of the
// orthoscheme derives it): a Rayleigh–Ritz upper bound from P_4 on 8
// tetrahedra and a projection lower bound from the ECR space on 512.
func Example() {
	up := orthoschemeMesh(1)   // 8 tetrahedra for the Ritz bound (P_4)
	down := orthoschemeMesh(3) // 512 tetrahedra for the ECR bound
	bc := []boundary.Condition{{Kind: boundary.Dirichlet}}
	zero, _ := formula.Parse("0")
	v, err := tet.NewPotential(up, zero, 1)
	if err != nil {
		panic(err)
	}
	vd, err := tet.NewPotential(down, zero, 1)
	if err != nil {
		panic(err)
	}

	// Upper bound: choose an approximate eigenvector in floating point,
	// then enclose its Rayleigh quotient.
	s := tet.NewLagrange(up, 4, bc)
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
	e := tet.NewECR(down, bc)
	ek, em, mMin, err := e.Matrices(vd, interval.I{})
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
	fmt.Printf("%.2f ≤ λ_1 ≤ %.2f (14π² = %.2f)\n", math.Floor(lower*100)/100, math.Ceil(ev[0].Hi*100)/100, 14*math.Pi*math.Pi)
	// Output:
	// 79.13 ≤ λ_1 ≤ 139.84 (14π² = 138.17)
}

// orthoschemeMesh returns the orthoscheme 0 ≤ z ≤ y ≤ x ≤ 1 as one
// tetrahedron refined levels times (Bey's red refinement, package
// fem/mesh3: 8^levels tetrahedra), all boundary faces on side 0.
func orthoschemeMesh(levels int) *tet.Mesh {
	pt := func(x, y, z float64) [3]interval.I {
		return [3]interval.I{interval.Point(x), interval.Point(y), interval.Point(z)}
	}
	nodes := [][3]interval.I{pt(0, 0, 0), pt(1, 0, 0), pt(1, 1, 0), pt(1, 1, 1)}
	tt := [4]int{0, 1, 2, 3}
	var bnd []mesh3.BoundaryFace
	for _, lf := range mesh3.LocalFaces {
		bnd = append(bnd, mesh3.BoundaryFace{A: tt[lf[0]], B: tt[lf[1]], C: tt[lf[2]]})
	}
	m3, err := mesh3.FromPolyhedron(nodes, [][4]int{tt}, bnd)
	if err != nil {
		panic(err)
	}
	for range levels {
		m3 = m3.Refine()
	}
	m, err := tet.NewMesh(m3, 1)
	if err != nil {
		panic(err)
	}
	return m
}
