package tet

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"gapcert/enclose/sparse"
	"gapcert/interval"
)

// Float assembly of the P_p pencil (a + b with V = x² + y² + z²) on the
// Kuhn mesh of 4³ subcubes (384 tetrahedra), Dirichlet faces, p = 2..6;
// the unknowns are reported as a metric.
func BenchmarkAssembleApprox(b *testing.B) {
	m := unitCube(b, 4)
	v, err := NewPotential(m, mustExpr(b, "x^2 + y^2 + z^2"), 2)
	if err != nil {
		b.Fatal(err)
	}
	for p := 2; p <= 6; p++ {
		s := NewLagrange(m, p, allBC(6, dirichlet))
		s.AssembleApprox(v, 0) // tables built once, outside the timing
		b.Run(fmt.Sprintf("p=%d", p), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				s.AssembleApprox(v, 0)
			}
			b.ReportMetric(float64(s.N()), "unknowns")
		})
	}
}

// Verified Ritz matrices of 4 vectors (the interval element integrals
// over every tetrahedron) on the same mesh, p = 2..6.
func BenchmarkRitzMatrices(b *testing.B) {
	m := unitCube(b, 4)
	v, err := NewPotential(m, mustExpr(b, "x^2 + y^2 + z^2"), 2)
	if err != nil {
		b.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(1, 2))
	for p := 2; p <= 6; p++ {
		s := NewLagrange(m, p, allBC(6, dirichlet))
		vecs := make([][]float64, 4)
		for i := range vecs {
			vecs[i] = make([]float64, s.N())
			for k := range vecs[i] {
				vecs[i][k] = rng.NormFloat64()
			}
		}
		if _, _, err := s.RitzMatrices(vecs, v, interval.I{}); err != nil {
			b.Fatal(err)
		}
		b.Run(fmt.Sprintf("p=%d", p), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, _, err := s.RitzMatrices(vecs, v, interval.I{}); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(s.N()), "unknowns")
		})
	}
}

// Approximate eigenvectors (4 lowest pairs, sparse shift-invert subspace
// iteration) of the assembled pencil, p = 2..6 on the same mesh; the
// metrics are the unknowns, the entries of the stiffness matrix's lower
// triangle and of its LDLᵀ factor under the nested-dissection order (the
// fill, which grows faster in 3D than on triangles).
func BenchmarkLowestEigs(b *testing.B) {
	m := unitCube(b, 4)
	v, err := NewPotential(m, mustExpr(b, "0"), 1)
	if err != nil {
		b.Fatal(err)
	}
	for p := 2; p <= 6; p++ {
		s := NewLagrange(m, p, allBC(6, dirichlet))
		k, mm := s.AssembleApprox(v, 0)
		fill := sparse.Analyze(k, sparse.Order(k)).NNZ()
		b.Run(fmt.Sprintf("p=%d", p), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, _, err := sparse.LowestEigs(k, mm, 4); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(s.N()), "unknowns")
			b.ReportMetric(float64(k.Pat.NNZ()), "matrix-nnz")
			b.ReportMetric(float64(fill), "factor-nnz")
		})
	}
}
