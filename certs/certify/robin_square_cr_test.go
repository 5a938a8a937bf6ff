package certify

import (
	"math"
	"testing"

	"gapcert/interval"
)

// robin1D returns the two lowest eigenvalues of −u″ on (0, 1) with
// u′ = αu at 0 and u′ = −αu at 1: μ = (2x)² with x tan x = α/2 (even mode,
// x ∈ (0, π/2)) or −x cot x = α/2 (odd mode, x ∈ (π/2, π)) (separation
// of the symmetric interval; Watts, Essentials of Applied Mathematics,
// 2007, Tables A.1–A.2 list such roots), by float bisection (common
// practice; accurate to a few ulps).
func robin1D(alpha float64) (float64, float64) {
	root := func(g func(float64) float64, lo, hi float64) float64 {
		for it := 0; it < 200; it++ {
			mid := (lo + hi) / 2
			if g(mid) < 0 {
				lo = mid
			} else {
				hi = mid
			}
		}
		return (lo + hi) / 2
	}
	even := root(func(x float64) float64 { return x*math.Tan(x) - alpha/2 }, 1e-300, math.Pi/2-1e-15)
	odd := root(func(x float64) float64 { return -x/math.Tan(x) - alpha/2 }, math.Pi/2+1e-15, math.Pi-1e-15)
	return 4 * even * even, 4 * odd * odd
}

// TestRobinSquareCR certifies −Δu + 7u on the unit square with
// Robin α on every side (constant V, no Neumann side: the plain
// Crouzeix–Raviart stage A with its form constant c), where λ2 = λ3 is a
// double eigenvalue, against the sums of the 1D Robin eigenvalues, and
// the same with robin 0 on one pair of opposite sides (enriched space).
func TestRobinSquareCR(t *testing.T) {
	sq := `[["0","0"],["1","0"],["1","1"],["0","1"]]`
	for _, alpha := range []string{"1", "30"} {
		a := map[string]float64{"1": 1, "30": 30}[alpha]
		m1, m2 := robin1D(a)
		truth := []float64{2*m1 + 7, m1 + m2 + 7, m1 + m2 + 7}
		r := `{"robin":"` + alpha + `"}`
		src := polygonText(sq, "7", []string{r, r, r, r}, 3)
		p, c, lambda := certifyPolygon(t, src, 1e-6)
		if c.Method == nil {
			t.Fatal("no method")
		}
		for k, tr := range truth {
			requireEnclosure(t, src, lambda[k], interval.I{Lo: tr * (1 - 4e-15), Hi: tr * (1 + 4e-15)}, scaleOf(p), 1e-4)
		}
	}
	// robin 0 on the bottom and top: y Neumann (nπ)², x Robin α = 1.
	m1, m2 := robin1D(1)
	pi2 := math.Pi * math.Pi
	truth := []float64{m1 + 7, m2 + 7, m1 + pi2 + 7}
	if m1+pi2 < m2 {
		truth[1], truth[2] = m1+pi2+7, m2+7
	}
	r, z := `{"robin":"1"}`, `{"robin":"0"}`
	src := polygonText(sq, "7", []string{z, r, z, r}, 3)
	p, _, lambda := certifyPolygon(t, src, 1e-6)
	for k, tr := range truth {
		requireEnclosure(t, src, lambda[k], interval.I{Lo: tr * (1 - 4e-15), Hi: tr * (1 + 4e-15)}, scaleOf(p), 1e-4)
	}
}
