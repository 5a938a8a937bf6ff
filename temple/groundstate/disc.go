package groundstate

import (
	"errors"
	"fmt"
	"math"

	"gapcert/interval"
	"gapcert/interval/formula"
)

// Disc is the data of a pointwise enclosure at the centre x0 = Centre of
// the open disc B = B_R(x0), R = Radius, on which the approximate ground
// state ũ is one polynomial:
//
//	ũ(x0 + d) = Σ_a Σ_b Coef[a][b]·d_x^a·d_y^b   for |d| < R,
//
// for some choice of exact coefficients in the enclosures Coef[a][b] (the
// rows may have different lengths). ũ(x0) is that choice's Coef[0][0].
type Disc struct {
	Centre [2]float64
	Radius float64
	Coef   [][]interval.I
}

// DiscOptions controls EnclosePoint. Zero values take the defaults.
type DiscOptions struct {
	// VOrder is the highest order of the Taylor model of V on a triangle
	// around the disc (default 8); the order with the smallest remainder is
	// used. A polynomial V of degree ≤ 12 is modelled with order ≥ its
	// degree, so its model is exact (zero remainder).
	VOrder int
}

// maxExactVDegree is the largest degree of a polynomial V whose model is
// made exact by raising the order.
const maxExactVDegree = 12

// PointEnclosure is the result of EnclosePoint: an enclosure of u(x0) and
// the terms of inequality (D3) of the package doc it is made of,
//
//	U = Approx + Residual + [−1, 1]·(MeanBound + KernelBound).
type PointEnclosure struct {
	// U encloses u(x0).
	U interval.I
	// Approx encloses ũ(x0) (the constant coefficient).
	Approx interval.I
	// Residual encloses ∫_B K r̃ at λ = λ1 (for every λ in the given
	// enclosure).
	Residual interval.I
	// MeanBound ≥ E_B/√(πR²), the bound of the mean of e over B.
	MeanBound float64
	// KernelBound ≥ ‖K‖_{L²(B)}·sup_B |λ − V|·E_B.
	KernelBound float64
	// VRange encloses the range of V on B.
	VRange interval.I
	// VRemainder is the remainder ρ of the model of V on B
	// (V ∈ P_V + ρ); it is 0 for a polynomial V of degree ≤ 12.
	VRemainder interval.I
}

// PotentialError reports that V could not be modelled on the triangle
// around a disc (V not defined or not smooth there), so no enclosure was
// computed.
type PotentialError struct {
	Centre [2]float64
	Radius float64
	Err    error
}

func (e *PotentialError) Error() string {
	return fmt.Sprintf("groundstate: no Taylor model of V around the disc of radius %g at (%g, %g): %v",
		e.Radius, e.Centre[0], e.Centre[1], e.Err)
}

func (e *PotentialError) Unwrap() error { return e.Err }

var errUnboundedModel = errors.New("the Taylor model does not bound V on the disc")

// EnclosePoint returns an enclosure of u(x0), x0 = d.Centre, for every
// weak solution u ∈ H¹(B) of −Δu + V u = λ1 u on B = B_R(x0) with
// ‖u − ũ‖_{L²(B)} ≤ errB, where ũ is the polynomial of d and λ1 is any
// point of lambda. With u = P₁ũ the projection of the approximate ground
// state on the first eigenspace, B inside the domain Ω and inside one
// element (where ũ is one polynomial), and errB any upper bound of
// ‖ũ − P₁ũ‖_{L²(Ω)} (EigenvectorError gives one), this encloses the
// value at x0 of the ground state P₁ũ.
//
// The enclosure is inequality (D3) of the package doc:
//
//	u(x0) ∈ ũ(x0) + ∫_B K r̃ + [−1, 1]·(E_B/√(πR²) + ‖K‖₂·sup_B|λ − V|·E_B),
//
// r̃ = (λ − V)ũ + Δũ, with ‖K‖₂ = R·√(5/(96π)), the integrals of K
// against the monomials of (D4), and V = P_V + ρ on B by a Taylor model
// (formula.Expr.Model2 on a right triangle containing B, rewritten in
// powers of x − x0, y − y0), so that ∫_B K V ũ ∈ ∫_B K P_V ũ +
// (R²/8)·(ρ·range_B ũ) since K ≥ 0 and ∫_B K = R²/8. Every term is
// evaluated in outward rounded interval arithmetic, λ over all of lambda.
//
// Hypotheses. Checked here (misuse panics): v non-nil, lambda bounded,
// errB finite and ≥ 0, R > 0 finite, the centre finite, Coef non-empty
// with bounded entries. Checked by the computation: V has a Taylor model
// (so it is defined, smooth and bounded) on a triangle containing B, else a
// *PotentialError. The caller's, not checkable here: lambda ∋ λ1, errB ≥
// ‖u − ũ‖_{L²(B)}, B ⊂ Ω and ũ equal to the polynomial on B. If one of
// those fails the result can be false: too small an errB drops part of the
// mean and kernel terms, a wrong λ shifts the residual term by
// (λ − λ1)∫_B K ũ (see the tests).
func EnclosePoint(v *formula.Expr, lambda interval.I, errB float64, d Disc, opt DiscOptions) (PointEnclosure, error) {
	checkDisc(v, lambda, errB, d)
	if opt.VOrder <= 0 {
		opt.VOrder = 8
	}
	R := d.Radius
	pv, rho, err := potentialOnDisc(v, d.Centre, R, opt.VOrder)
	if err != nil {
		return PointEnclosure{}, &PotentialError{Centre: d.Centre, Radius: R, Err: err}
	}
	u := d.Coef
	// r̃ = λũ + Δũ − P_V ũ as one polynomial (interval coefficients).
	res := addPoly(addPoly(scalePoly(u, lambda), laplacianPoly(u)), scalePoly(mulPoly(pv, u), interval.Point(-1)))
	var residual interval.I
	for a, row := range res {
		for b, c := range row {
			if c.Lo == 0 && c.Hi == 0 {
				continue
			}
			residual = residual.Add(c.Mul(kernelMoment(a, b, R)))
		}
	}
	// −∫_B K ρ ũ with ρ(x) ∈ rho and ũ(x) ∈ range_B ũ: the integrand lies in
	// rho·range pointwise and K ≥ 0, so the integral lies in (∫_B K)·that.
	kernelMass := interval.Point(R).Sqr().DivF(8)
	if rho.Lo != 0 || rho.Hi != 0 {
		residual = residual.Sub(kernelMass.Mul(rho.Mul(rangeOnBox(u, R))))
	}
	vRange := rangeOnBox(pv, R).Add(rho)
	if !vRange.IsBounded() {
		// (D3) needs V ∈ L^∞(B); the model must show it.
		return PointEnclosure{}, &PotentialError{Centre: d.Centre, Radius: R, Err: errUnboundedModel}
	}
	supLV := lambda.Sub(vRange).Mag()
	e := interval.Point(errB)
	r := interval.Point(R)
	sqrtPi, _ := interval.Pi().Sqrt()
	meanBound := e.Div(sqrtPi.Mul(r)).Hi
	kernelBound := kernelL2Factor().Mul(r).Mul(interval.Point(supLV)).Mul(e).Hi
	rad := interval.Point(meanBound).Add(interval.Point(kernelBound)).Hi
	approx := coefAt(u, 0, 0)
	return PointEnclosure{
		U:           approx.Add(residual).Add(interval.New(-rad, rad)),
		Approx:      approx,
		Residual:    residual,
		MeanBound:   meanBound,
		KernelBound: kernelBound,
		VRange:      vRange,
		VRemainder:  rho,
	}, nil
}

// checkDisc panics on the misuse EnclosePoint can detect.
func checkDisc(v *formula.Expr, lambda interval.I, errB float64, d Disc) {
	switch {
	case v == nil:
		panic("groundstate: nil potential")
	case !lambda.IsBounded():
		panic("groundstate: the enclosure of λ1 must be bounded")
	case math.IsNaN(errB) || math.IsInf(errB, 0) || errB < 0:
		panic("groundstate: the L² error bound must be finite and ≥ 0")
	case !(d.Radius > 0) || math.IsInf(d.Radius, 0):
		panic("groundstate: the disc radius must be finite and > 0")
	case math.IsNaN(d.Centre[0]) || math.IsInf(d.Centre[0], 0) || math.IsNaN(d.Centre[1]) || math.IsInf(d.Centre[1], 0):
		panic("groundstate: the disc centre must be finite")
	case len(d.Coef) == 0:
		panic("groundstate: the polynomial on the disc has no coefficients")
	}
	for _, row := range d.Coef {
		for _, c := range row {
			if !c.IsBounded() {
				panic("groundstate: the coefficients of the polynomial on the disc must be bounded")
			}
		}
	}
}

// kernelL2Factor encloses √(5/(96π)), the L² norm of K over the disc of
// radius 1 ((D2) of the package doc; ‖K‖_{L²(B_R)} = R·√(5/(96π))).
func kernelL2Factor() interval.I {
	s, _ := interval.Point(5).Div(interval.Point(96).Mul(interval.Pi())).Sqrt()
	return s
}

// kernelMoment encloses ∫_B K(|d|) d_x^a d_y^b dd over B = B_R(0), by (D4)
// of the package doc: 0 unless a and b are even, else
//
//	2 R^{n+2} (a−1)!! (b−1)!! / ((n+2)² (n+4) n!!),  n = a + b.
func kernelMoment(a, b int, R float64) interval.I {
	if a%2 != 0 || b%2 != 0 {
		return interval.I{}
	}
	n := a + b
	c := interval.Point(2)
	for k := 1; k < a; k += 2 {
		c = c.MulF(float64(k))
	}
	for k := 1; k < b; k += 2 {
		c = c.MulF(float64(k))
	}
	for k := 2; k <= n; k += 2 {
		c = c.DivF(float64(k))
	}
	c = c.DivF(float64(n + 2)).DivF(float64(n + 2)).DivF(float64(n + 4))
	return c.Mul(interval.Point(R).PowInt(n + 2))
}

// potentialOnDisc returns a polynomial P_V in (x − x0, y − y0) and an
// interval rho with V(x) ∈ P_V(x − x0) + rho for every x in the disc
// B_R(x0).
//
// The model is formula.Expr.Model2 on the right triangle T with the exact
// float vertices p0 = (a0, b0), p0 + (L, 0), p0 + (0, L), where a0 ≤ x0 − R,
// b0 ≤ y0 − R (rounded down) and L ≥ (x0 − a0) + (y0 − b0) + √2·R (rounded
// up). T contains B: on B, x ≥ x0 − R ≥ a0, y ≥ b0, and
// (x − a0) + (y − b0) ≤ (x0 − a0) + (y0 − b0) + √2·R ≤ L (the largest value
// of d_x + d_y on |d| ≤ R is √2·R). On T the model gives V ∈ Σ C[i][j] ξ^i
// η^j + rho with ξ = (x − a0)/L = α + β d_x, η = γ + β d_y, α = (x0 − a0)/L,
// γ = (y0 − b0)/L, β = 1/L exactly; the powers (α + β d)^i are expanded in
// interval arithmetic, which contains each exact coefficient.
func potentialOnDisc(v *formula.Expr, x0 [2]float64, R float64, order int) ([][]interval.I, interval.I, error) {
	if p, ok := v.Polynomial(); ok && p.Degree() <= maxExactVDegree {
		order = max(order, p.Degree(), 1)
	}
	a0 := interval.SubDown(x0[0], R)
	b0 := interval.SubDown(x0[1], R)
	cx := interval.Point(x0[0]).Sub(interval.Point(a0))
	cy := interval.Point(x0[1]).Sub(interval.Point(b0))
	sqrt2, _ := interval.Point(2).Sqrt()
	L := cx.Add(cy).Add(sqrt2.MulF(R)).Hi
	vert := [3][2]interval.I{
		{interval.Point(a0), interval.Point(b0)},
		{interval.Point(a0).AddF(L), interval.Point(b0)},
		{interval.Point(a0), interval.Point(b0).AddF(L)},
	}
	m, err := chooseModel(v, vert, order)
	if err != nil {
		return nil, interval.I{}, err
	}
	beta := interval.Point(1).DivF(L)
	q := len(m.C) - 1
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

// chooseModel returns the Taylor model of v on the triangle vert with the
// smallest remainder among the orders 1, …, order (a polynomial V of degree
// ≤ order has remainder 0 at order). Every candidate is a valid model; the
// choice only decides which is used. The remainders of formula.Model2 come
// from interval jets over the triangle's bounding box, which can grow with
// the order faster than the Taylor terms shrink on a large triangle (for
// instance 1/cosh(x)² on a triangle of diameter 1), so the highest order is
// not always the best. It returns the error of the last order tried when no
// order gives a model.
func chooseModel(v *formula.Expr, vert [3][2]interval.I, order int) (formula.Model2, error) {
	best, err := v.Model2(vert, order)
	if err != nil || best.R.Mag() == 0 {
		return best, err
	}
	for q := order - 1; q >= 1; q-- {
		m, err := v.Model2(vert, q)
		if err == nil && m.R.Mag() < best.R.Mag() {
			best = m
		}
	}
	return best, nil
}

// affinePowers returns p[i][k], enclosures of the coefficient of d^k in
// (alpha + beta·d)^i for i ≤ n, by repeated multiplication (each step
// encloses the exact convolution).
func affinePowers(alpha, beta interval.I, n int) [][]interval.I {
	p := make([][]interval.I, n+1)
	p[0] = []interval.I{interval.Point(1)}
	for i := 1; i <= n; i++ {
		p[i] = make([]interval.I, i+1)
		for k, c := range p[i-1] {
			p[i][k] = p[i][k].Add(c.Mul(alpha))
			p[i][k+1] = p[i][k+1].Add(c.Mul(beta))
		}
	}
	return p
}

// coefAt returns p[a][b], or 0 where p has no such entry.
func coefAt(p [][]interval.I, a, b int) interval.I {
	if a < len(p) && b < len(p[a]) {
		return p[a][b]
	}
	return interval.I{}
}

// addPoly returns p + q (coefficientwise).
func addPoly(p, q [][]interval.I) [][]interval.I {
	out := make([][]interval.I, max(len(p), len(q)))
	for a := range out {
		n := 0
		if a < len(p) {
			n = len(p[a])
		}
		if a < len(q) {
			n = max(n, len(q[a]))
		}
		out[a] = make([]interval.I, n)
		for b := range out[a] {
			out[a][b] = coefAt(p, a, b).Add(coefAt(q, a, b))
		}
	}
	return out
}

// scalePoly returns t·p for every t in the interval t.
func scalePoly(p [][]interval.I, t interval.I) [][]interval.I {
	out := make([][]interval.I, len(p))
	for a, row := range p {
		out[a] = make([]interval.I, len(row))
		for b, c := range row {
			out[a][b] = c.Mul(t)
		}
	}
	return out
}

// mulPoly returns p·q (the coefficient convolution).
func mulPoly(p, q [][]interval.I) [][]interval.I {
	nb := func(r [][]interval.I) int {
		n := 0
		for _, row := range r {
			n = max(n, len(row))
		}
		return n
	}
	if len(p) == 0 || len(q) == 0 {
		return nil
	}
	out := make([][]interval.I, len(p)+len(q)-1)
	w := nb(p) + nb(q) - 1
	for a := range out {
		out[a] = make([]interval.I, max(w, 0))
	}
	for a, row := range p {
		for b, c := range row {
			if c.Lo == 0 && c.Hi == 0 {
				continue
			}
			for i, qrow := range q {
				for j, d := range qrow {
					out[a+i][b+j] = out[a+i][b+j].Add(c.Mul(d))
				}
			}
		}
	}
	return out
}

// laplacianPoly returns Δp: the term c d_x^a d_y^b contributes
// a(a−1) c d_x^{a−2} d_y^b + b(b−1) c d_x^a d_y^{b−2}.
func laplacianPoly(p [][]interval.I) [][]interval.I {
	w := 0
	for _, row := range p {
		w = max(w, len(row))
	}
	out := make([][]interval.I, len(p))
	for a := range out {
		out[a] = make([]interval.I, w)
	}
	for a, row := range p {
		for b, c := range row {
			if a >= 2 {
				out[a-2][b] = out[a-2][b].Add(c.MulF(float64(a * (a - 1))))
			}
			if b >= 2 {
				out[a][b-2] = out[a][b-2].Add(c.MulF(float64(b * (b - 1))))
			}
		}
	}
	return out
}

// rangeOnBox encloses {p(d) : |d_x|, |d_y| ≤ R}, a superset of the range of
// p on the disc B_R(0), by Horner's scheme in d_x over Horner in d_y
// (inclusion isotone).
func rangeOnBox(p [][]interval.I, R float64) interval.I {
	box := interval.New(-R, R)
	var s interval.I
	for a := len(p) - 1; a >= 0; a-- {
		var t interval.I
		for b := len(p[a]) - 1; b >= 0; b-- {
			t = t.Mul(box).Add(p[a][b])
		}
		s = s.Mul(box).Add(t)
	}
	return s
}
