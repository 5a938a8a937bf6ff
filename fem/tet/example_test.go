package tet_test

import (
	"fmt"
	"math"
	"sort"

	"gapcert/enclose"
	"gapcert/enclose/sparse"
	"gapcert/fem/boundary"
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
	up := orthoschemeMesh(2)   // 8 tetrahedra for the Ritz bound (P_4)
	down := orthoschemeMesh(8) // 512 tetrahedra for the ECR bound
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

// orthoschemeMesh returns the Kuhn tetrahedra of the n³ subcubes of the
// unit cube that lie in 0 ≤ z ≤ y ≤ x ≤ 1 (6n³ of them tile the cube; the
// planes x = y, y = z cut subcubes only along Kuhn faces), all boundary
// faces on side 0.
func orthoschemeMesh(n int) *tet.Mesh {
	var nodes [][3]interval.I
	id := map[[3]int]int{}
	for i := 0; i <= n; i++ {
		for j := 0; j <= i; j++ {
			for k := 0; k <= j; k++ {
				id[[3]int{i, j, k}] = len(nodes)
				nodes = append(nodes, [3]interval.I{interval.Point(float64(i)).DivF(float64(n)),
					interval.Point(float64(j)).DivF(float64(n)), interval.Point(float64(k)).DivF(float64(n))})
			}
		}
	}
	// A Kuhn tetrahedron raises one axis at a time from a subcube's lowest
	// corner; it is kept when all its vertices have i ≥ j ≥ k.
	var tets [][4]int
	for i := 0; i < n; i++ {
		for j := 0; j <= i; j++ {
			for k := 0; k <= j; k++ {
				for q, path := range [6][3]int{{0, 1, 2}, {1, 2, 0}, {2, 0, 1}, {0, 2, 1}, {1, 0, 2}, {2, 1, 0}} {
					p := [3]int{i, j, k}
					tt := [4]int{id[p]}
					ok := true
					for s, axis := range path {
						p[axis]++
						nd, in := id[p]
						ok = ok && in
						tt[s+1] = nd
					}
					if !ok {
						continue
					}
					if q >= 3 { // odd permutation: swap for positive orientation
						tt[1], tt[2] = tt[2], tt[1]
					}
					tets = append(tets, tt)
				}
			}
		}
	}
	// Boundary faces: the faces of exactly one tetrahedron.
	count := map[[3]int]int{}
	face := func(tt [4]int, i int) [3]int {
		var f [3]int
		k := 0
		for j := 0; j < 4; j++ {
			if j != i {
				f[k] = tt[j]
				k++
			}
		}
		return f
	}
	key := func(f [3]int) [3]int {
		s := f[:]
		sort.Ints(s)
		return [3]int{s[0], s[1], s[2]}
	}
	for _, tt := range tets {
		for i := 0; i < 4; i++ {
			count[key(face(tt, i))]++
		}
	}
	var bnd []tet.BoundaryFace
	for _, tt := range tets {
		for i := 0; i < 4; i++ {
			if f := face(tt, i); count[key(f)] == 1 {
				bnd = append(bnd, tet.BoundaryFace{Nodes: f})
			}
		}
	}
	m, err := tet.NewMesh(nodes, tets, bnd, 1)
	if err != nil {
		panic(err)
	}
	return m
}
