package line

import (
	"gonum.org/v1/gonum/integrate/quad"
)

// Interpolate returns coefficients of the projection-based interpolant of f
// (derivative df) in floating point (a choice, e.g. for starting vectors
// and tests): nodal values f(x_k) on the vertex functions, and on each cell
// the bubble coefficients of the H¹-seminorm projection of f − (linear
// interpolant), which is local because the bubble derivatives P̃_(j−1) are
// L²-orthogonal to each other and to constants:
//
//	c_j = (2j − 1) ∫_0^1 h f'(x_k + ξh) P̃_(j−1)(ξ) dξ,   ψ_j' = P̃_(j−1), ‖P̃_(j−1)‖² = 1/(2j−1).
//
// Values at removed (Dirichlet) vertices are dropped. Its H¹ error is
// O(h^p) for smooth f.
func (s *Lagrange) Interpolate(f, df func(x float64) float64) []float64 {
	return s.space.interpolate(f, df)
}

func (s *space) interpolate(f, df func(x float64) float64) []float64 {
	out := make([]float64, s.n)
	nc := s.mesh.Cells()
	for k := 0; k <= nc; k++ {
		var g int
		if k < nc {
			g = s.dof(k, 0)
		} else {
			g = s.dof(nc-1, s.p)
		}
		if g >= 0 {
			out[g] = f(s.mesh.Nodes[k].Mid())
		}
	}
	for k := 0; k < nc; k++ {
		x0, h := s.mesh.Nodes[k].Mid(), s.mesh.H(k).Mid()
		for l := 1; l < s.p; l++ {
			j := l + 1
			integrand := func(xi float64) float64 { return h * df(x0+xi*h) * shiftedLegendre(j-1, xi) }
			out[s.dof(k, l)] = float64(2*j-1) * quad.Fixed(integrand, 0, 1, s.p+10, quad.Legendre{}, 0)
		}
	}
	return out
}

// shiftedLegendre returns P_n(2ξ − 1) by the three-term recurrence
// (n+1)P_(n+1)(x) = (2n+1)xP_n(x) − nP_(n−1)(x) (floating point).
func shiftedLegendre(n int, xi float64) float64 {
	x := 2*xi - 1
	p0, p1 := 1.0, x
	if n == 0 {
		return p0
	}
	for k := 1; k < n; k++ {
		p0, p1 = p1, (float64(2*k+1)*x*p1-float64(k)*p0)/float64(k+1)
	}
	return p1
}
