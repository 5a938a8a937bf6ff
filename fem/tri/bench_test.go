package tri

import (
	"fmt"
	"math"
	"testing"

	"gapcert/interval"
)

// Assembly of the float pencil for P2 on the unit square with Dirichlet
// sides, (2·2^lev − 1)² DOFs: about 1.6·10⁴, 6.5·10⁴, 2.6·10⁵ and 1.05·10⁶.
func BenchmarkAssembleApproxP2(b *testing.B) {
	for _, lev := range []int{6, 7, 8, 9} {
		m := unitSquare(b, lev)
		s := NewLagrange(m, 2, allBC(4, dirichlet))
		v := mustPotential(b, m, "x^2 + y^2", 2)
		b.Run(fmt.Sprintf("dofs=%d", s.N()), func(b *testing.B) {
			for b.Loop() {
				s.AssembleApprox(v, 0)
			}
		})
	}
}

// Verified Ritz matrices of 4 vectors for P3 on the unit square.
func BenchmarkRitzMatricesP3(b *testing.B) {
	for _, lev := range []int{5, 6, 7} {
		m := unitSquare(b, lev)
		s := NewLagrange(m, 3, allBC(4, dirichlet))
		v := mustPotential(b, m, "x^2 + y^2", 2)
		vecs := make([][]float64, 4)
		for i := range vecs {
			vecs[i] = s.Interpolate(func(x, y float64) float64 {
				return math.Sin(float64(i+1)*math.Pi*x) * math.Sin(math.Pi*y)
			})
		}
		b.Run(fmt.Sprintf("dofs=%d", s.N()), func(b *testing.B) {
			for b.Loop() {
				if _, _, err := s.RitzMatrices(vecs, v, interval.I{}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// Interval matrices of the ECR space (3 edge means + 1 element mean per
// triangle), about 1.2·10⁴, 4.9·10⁴ and 2·10⁵ DOFs.
func BenchmarkECRMatrices(b *testing.B) {
	for _, lev := range []int{5, 6, 7} {
		m := unitSquare(b, lev)
		s := NewECR(m, allBC(4, dirichlet))
		v := mustPotential(b, m, "x^2 + y^2", 2)
		b.Run(fmt.Sprintf("dofs=%d", s.N()), func(b *testing.B) {
			for b.Loop() {
				if _, _, _, err := s.Matrices(v, interval.I{}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
