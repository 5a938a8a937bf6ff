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
	// VOrder is the highest order of the Taylor models of V on a triangle
	// around the disc (default 8). Of these and the second-order and range
	// models on the disc's bounding box (potential.go), the one with the
	// smallest remainder is used. A polynomial V of degree ≤ 12 is
	// modelled with order ≥ its degree, so its model is exact (zero
	// remainder).
	VOrder int
}

// PointEnclosure is the result of EnclosePoint: an enclosure of u(x0) and
// the terms of inequality (D3) of the package doc it is made of,
//
//	U = Approx + Residual + [−1, 1]·(MeanBound + KernelBound).
type PointEnclosure struct {
	// U encloses u(x0).
	U interval.I
	// Approx encloses ũ(x0) (the constant coefficient).
	Approx interval.I
	// Residual encloses ∫_B K r̃ for every λ in the given enclosure, so at
	// λ = λ1.
	Residual interval.I
	// MeanBound ≥ E_B/√(πR²), the bound of the mean of e over B (+∞ if
	// it overflows, and then U is the whole line).
	MeanBound float64
	// KernelBound ≥ ‖K‖_{L²(B)}·sup_B |λ − V|·E_B (+∞ if it overflows).
	KernelBound float64
	// VRange encloses the range of V on B.
	VRange interval.I
	// VRemainder is the remainder τ of the model of V on B
	// (V ∈ P_V + τ); it is 0 for a polynomial V of degree ≤ 12.
	VRemainder interval.I
}

// PotentialError reports that V could not be bounded on a disc (V not
// defined on the disc's bounding box, or no model with a finite
// remainder), so no enclosure was computed.
type PotentialError struct {
	Centre [2]float64
	Radius float64
	Err    error
}

func (e *PotentialError) Error() string {
	return fmt.Sprintf("groundstate: no model of V on the disc of radius %g at (%g, %g): %v",
		e.Radius, e.Centre[0], e.Centre[1], e.Err)
}

func (e *PotentialError) Unwrap() error { return e.Err }

var errUnboundedModel = errors.New("the model does not bound V on the disc")

// EnclosePoint returns an enclosure of u(x0), x0 = d.Centre, for every
// weak solution u ∈ H¹(B) of −Δu + V u = λ1 u on B = B_R(x0) with
// ‖u − ũ‖_{L²(B)} ≤ errB, where ũ is the polynomial of d and λ1 is any
// point of lambda. With u = P₁ũ the projection of the approximate ground
// state on the first eigenspace, B inside the domain Ω and inside one
// element (where ũ is one polynomial), and errB any upper bound of
// ‖ũ − P₁ũ‖_{L²(Ω)} (EigenvectorError gives one), this encloses the
// value at x0 of the ground state P₁ũ. InscribedRadius gives the largest
// radius with B inside a triangular element.
//
// The enclosure is inequality (D3) of the package doc:
//
//	u(x0) ∈ ũ(x0) + ∫_B K r̃ + [−1, 1]·(E_B/√(πR²) + ‖K‖₂·sup_B|λ − V|·E_B),
//
// r̃ = (λ − V)ũ + Δũ, with ‖K‖₂ = R·√(5/(96π)), the integrals of K
// against the monomials of (D4), and V ∈ P_V + τ on B by a model of
// potential.go (a polynomial in x − x0, y − y0 and an interval), so that
// ∫_B K V ũ ∈ ∫_B K P_V ũ + (R²/8)·(τ·range_B ũ) since K ≥ 0 and
// ∫_B K = R²/8. Every term is evaluated in outward rounded interval
// arithmetic, λ over all of lambda.
//
// Hypotheses. Checked here (misuse panics): v non-nil, lambda bounded,
// errB finite and ≥ 0, R > 0 finite, the centre finite, Coef non-empty
// with bounded entries, lambda and the entries valid intervals (Lo ≤ Hi,
// no NaN end; a struct literal may not be). Checked by the computation: V is bounded on B (a
// model with a finite remainder exists), else a *PotentialError. The
// caller's, not checkable here: lambda ∋ λ1, errB ≥ ‖u − ũ‖_{L²(B)},
// B ⊂ Ω and ũ equal to the polynomial on B. If one of
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
	// −∫_B K τ ũ with τ(x) ∈ rho and ũ(x) ∈ range_B ũ: the integrand lies in
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
	// The bounds stay intervals until the end: E/√(πR²) and sup|λ − V| may
	// overflow to +∞ (a huge E on a tiny disc, a huge λ against a huge V),
	// and then the enclosure is the whole line, not a panic.
	supLV := lambda.Sub(vRange).Abs()
	e := interval.Point(errB)
	r := interval.Point(R)
	sqrtPi, _ := interval.Pi().Sqrt()
	mean := e.Div(sqrtPi.Mul(r))
	kernel := kernelL2Factor().Mul(r).Mul(supLV).Mul(e)
	meanBound, kernelBound := mean.Hi, kernel.Hi
	rad := mean.Add(kernel).Hi
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
	case !validBounded(lambda):
		panic("groundstate: the enclosure of λ1 must be a bounded interval (Lo ≤ Hi, finite ends)")
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
			if !validBounded(c) {
				panic("groundstate: the coefficients of the polynomial on the disc must be bounded intervals (Lo ≤ Hi, finite ends)")
			}
		}
	}
}

// validBounded reports whether x is an interval with finite ends and
// Lo ≤ Hi (false for NaN ends), as interval.New would build it; a struct
// literal may not be.
func validBounded(x interval.I) bool {
	return x.Lo <= x.Hi && x.IsBounded()
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
