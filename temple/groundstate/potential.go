package groundstate

import (
	"gapcert/interval"
	"gapcert/interval/formula"
)

// This file models V on a disc B_R(x0): a polynomial P_V in
// d = x − x0 with interval coefficients and an interval τ such that
//
//	V(x0 + d) ∈ P_V(d) + τ   for every |d| < R.                      (M)
//
// Several valid models are built and the one with the smallest |τ| is
// used (a choice among proven models; the proof only needs (M)).

// maxExactVDegree is the largest degree of a polynomial V whose model is
// made exact by raising the Taylor order.
const maxExactVDegree = 12

// potentialOnDisc returns a model (M) of v on B_R(x0), from the candidates
// triangleModel (orders 1, …, order, or the degree of a polynomial V of
// degree ≤ 12, which is exact), hessianModel and rangeModel, keeping the one
// with the smallest |τ|. It returns an error only when no candidate
// exists (the error of the highest-order Taylor model).
func potentialOnDisc(v *formula.Expr, x0 [2]float64, R float64, order int) ([][]interval.I, interval.I, error) {
	if p, ok := v.Polynomial(); ok && p.Degree() <= maxExactVDegree {
		if pv, rho, err := triangleModel(v, x0, R, max(order, p.Degree(), 1)); err != nil || rho.Mag() == 0 {
			return pv, rho, err
		}
	}
	var best [][]interval.I
	var bestRho interval.I
	var firstErr error
	consider := func(p [][]interval.I, rho interval.I, err error) {
		switch {
		case err != nil:
			if firstErr == nil {
				firstErr = err
			}
		case best == nil || rho.Mag() < bestRho.Mag():
			best, bestRho = p, rho
		}
	}
	for q := order; q >= 1; q-- {
		consider(triangleModel(v, x0, R, q))
	}
	consider(hessianModel(v, x0, R))
	consider(rangeModel(v, x0, R))
	if best == nil {
		return nil, interval.I{}, firstErr
	}
	return best, bestRho, nil
}

// triangleModel is formula.Expr.Model2 of order q on the right triangle T
// with the exact float vertices p0 = (a0, b0), p0 + (L, 0), p0 + (0, L),
// where a0 ≤ x0 − R, b0 ≤ y0 − R (rounded down) and
// L ≥ (x0 − a0) + (y0 − b0) + √2·R (rounded up), rewritten in powers of d.
// T contains B: on B, x ≥ x0 − R ≥ a0, y ≥ b0, and (x − a0) + (y − b0) ≤
// (x0 − a0) + (y0 − b0) + √2·R ≤ L (the largest value of d_x + d_y on
// |d| ≤ R is √2·R). On T the model gives V ∈ Σ C[i][j] ξ^i η^j + τ with
// ξ = (x − a0)/L = α + β d_x, η = γ + β d_y, α = (x0 − a0)/L,
// γ = (y0 − b0)/L, β = 1/L exactly; the powers (α + β d)^i are expanded in
// interval arithmetic, which contains each exact coefficient.
//
// The remainders of Model2 come from interval jets over T's bounding box
// (about 3.4R wide), which for some V (1/cosh(x)², exp(−x² − y²)) grow
// with the order faster than the Taylor terms shrink once R is not small;
// hence the other candidates.
func triangleModel(v *formula.Expr, x0 [2]float64, R float64, q int) ([][]interval.I, interval.I, error) {
	a0, b0, L := discTriangle(x0, R)
	cx := interval.Point(x0[0]).Sub(interval.Point(a0))
	cy := interval.Point(x0[1]).Sub(interval.Point(b0))
	vert := [3][2]interval.I{
		{interval.Point(a0), interval.Point(b0)},
		{interval.Point(a0).AddF(L), interval.Point(b0)},
		{interval.Point(a0), interval.Point(b0).AddF(L)},
	}
	m, err := v.Model2(vert, q)
	if err != nil {
		return nil, interval.I{}, err
	}
	beta := interval.Point(1).DivF(L)
	px := affinePowers(cx.DivF(L), beta, q)
	py := affinePowers(cy.DivF(L), beta, q)
	out := make([][]interval.I, q+1)
	for a := range out {
		out[a] = make([]interval.I, q+1-a)
	}
	for i, row := range m.C {
		for j, c := range row {
			if c.Lo == 0 && c.Hi == 0 {
				continue
			}
			for a := 0; a <= i; a++ {
				ca := c.Mul(px[i][a])
				for b := 0; b <= j; b++ {
					out[a][b] = out[a][b].Add(ca.Mul(py[j][b]))
				}
			}
		}
	}
	return out, m.R, nil
}

// discTriangle returns the corner (a0, b0) and the leg L of the right
// triangle of triangleModel, which contains B_R(x0).
func discTriangle(x0 [2]float64, R float64) (a0, b0, L float64) {
	a0 = interval.SubDown(x0[0], R)
	b0 = interval.SubDown(x0[1], R)
	cx := interval.Point(x0[0]).Sub(interval.Point(a0))
	cy := interval.Point(x0[1]).Sub(interval.Point(b0))
	sqrt2, _ := interval.Point(2).Sqrt()
	return a0, b0, cx.Add(cy).Add(sqrt2.MulF(R)).Hi
}

// discBox returns the environment of the box [x0 − R, x0 + R]² (rounded
// outward), which contains B_R(x0).
func discBox(x0 [2]float64, R float64) map[string]interval.I {
	return map[string]interval.I{
		"x": interval.New(interval.SubDown(x0[0], R), interval.AddUp(x0[0], R)),
		"y": interval.New(interval.SubDown(x0[1], R), interval.AddUp(x0[1], R)),
	}
}

// hessianModel is the second-order Taylor expansion at x0 with the
// Lagrange remainder: for V of class C² on the box Q = [x0 − R, x0 + R]²
// and |d| < R (the segment from x0 to x0 + d lies in B ⊂ Q),
//
//	V(x0 + d) = V(x0) + ∇V(x0)·d + ½ dᵀ∇²V(ζ) d,  ζ on the segment.
//
// With H ⊇ ∇²V(Q) (formula.Expr.Hessian, which also proves V smooth on Q)
// and M its midpoint matrix, P_V = V(x0) + ∇V(x0)·d + ½ dᵀM d (interval
// coefficients from the point evaluations) and τ = ½(H_xx − M_xx)·[0, R²] +
// (H_xy − M_xy)·[−R²/2, R²/2] + ½(H_yy − M_yy)·[0, R²], as d_x², d_y² ≤ R²
// and |d_x d_y| ≤ (d_x² + d_y²)/2 ≤ R²/2.
func hessianModel(v *formula.Expr, x0 [2]float64, R float64) ([][]interval.I, interval.I, error) {
	at := map[string]interval.I{"x": interval.Point(x0[0]), "y": interval.Point(x0[1])}
	vars := []string{"x", "y"}
	c0, err := v.Eval(at)
	if err != nil {
		return nil, interval.I{}, err
	}
	g, err := v.Gradient(at, vars)
	if err != nil {
		return nil, interval.I{}, err
	}
	h, err := v.Hessian(discBox(x0, R), vars)
	if err != nil {
		return nil, interval.I{}, err
	}
	mid := func(t interval.I) interval.I { return interval.Point(t.Mid()) }
	mxx, mxy, myy := mid(h[0][0]), mid(h[0][1]), mid(h[1][1])
	r2 := interval.Point(R).Sqr().Hi
	sq := interval.New(0, r2)
	cross := interval.New(-r2, r2).DivF(2)
	rho := h[0][0].Sub(mxx).Mul(sq).DivF(2).
		Add(h[0][1].Sub(mxy).Mul(cross)).
		Add(h[1][1].Sub(myy).Mul(sq).DivF(2))
	p := [][]interval.I{
		{c0, g[1], myy.DivF(2)},
		{g[0], mxy},
		{mxx.DivF(2)},
	}
	return p, rho, nil
}

// rangeModel is P_V = m, τ = r − m for an enclosure r of the range of V on
// the box [x0 − R, x0 + R]² ⊇ B (formula.Expr.Eval) and the float m nearest
// its midpoint: V ∈ m + (r − m) at every point of B whatever the
// smoothness of V (a kink of abs, min or max inside B is allowed), as long
// as V is bounded there.
func rangeModel(v *formula.Expr, x0 [2]float64, R float64) ([][]interval.I, interval.I, error) {
	r, err := v.Eval(discBox(x0, R))
	if err != nil {
		return nil, interval.I{}, err
	}
	if !r.IsBounded() {
		return nil, interval.I{}, errUnboundedModel
	}
	m := interval.Point(r.Mid())
	return [][]interval.I{{m}}, r.Sub(m), nil
}
