package tri

import (
	"math"
	"testing"

	"gapcert/interval"
)

// The Rayleigh quotient of any nonzero H¹₀ function is ≥ λ_1 = 2π² on the
// unit square (min–max; λ_1 = π²(1² + 1²), separation of variables, common
// practice), and for the interpolant of the eigenfunction sin(πx)sin(πy)
// it exceeds 2π² by O(h^(2p)).
func TestRitzQuotientSineConverges(t *testing.T) {
	for _, p := range []int{1, 2, 3, 4} {
		prev := math.NaN()
		for lev := 1; lev <= 4; lev++ {
			if p >= 3 && lev > 3 {
				break
			}
			m := unitSquare(t, lev)
			s := NewLagrange(m, p, allBC(4, dirichlet))
			v := mustPotential(t, m, "0", 1)
			x := s.Interpolate(func(x, y float64) float64 { return math.Sin(math.Pi*x) * math.Sin(math.Pi*y) })
			a0, a1, err := s.RitzMatrices([][]float64{x}, v, interval.I{})
			if err != nil {
				t.Fatal(err)
			}
			q := quotient(a0, a1)
			if !(q.Lo >= twoPi2.Lo) {
				t.Errorf("p=%d level %d: quotient %v below 2π²", p, lev, q)
			}
			err1 := q.Mid() - twoPi2.Mid()
			t.Logf("p=%d h=2^-%d quotient %v excess %.3e width %.1e", p, lev, q, err1, q.Wid())
			if !math.IsNaN(prev) && err1 > 1e-11 {
				rate := math.Log2(prev / err1)
				if rate < float64(2*p)-0.6 {
					t.Errorf("p=%d level %d: rate %.2f, want about %d", p, lev, rate, 2*p)
				}
			}
			prev = err1
		}
	}
}
