package groundstate

import (
	"fmt"
	"math"

	"gapcert/interval"
)

// VectorError holds upper bounds of the distance of an approximate
// eigenvector ũ from the first eigenspace, relative to ‖ũ‖².
type VectorError struct {
	// L2 ≥ ‖ũ − P₁ũ‖² / ‖ũ‖² (inequality (E1) of the package doc).
	L2 float64
	// Energy ≥ (a(w, w) + γ‖w‖²) / ‖ũ‖² with w = ũ − P₁ũ (inequality (E2)).
	Energy float64
	// Rayleigh encloses R(ũ) = a(ũ, ũ)/b(ũ, ũ).
	Rayleigh interval.I
}

// NotSeparatedError is the refusal of EigenvectorError: the upper end of
// the Rayleigh quotient is not below the lower end of λ2, so (E1) bounds
// nothing (the bound would be ≥ 1, or λ1 may not be simple).
type NotSeparatedError struct {
	Rayleigh, Lambda2 interval.I
}

func (e *NotSeparatedError) Error() string {
	return fmt.Sprintf("groundstate: the Rayleigh quotient %v of the approximate ground state is not below λ2 ≥ %g; "+
		"refine the approximation or the enclosure of λ2", e.Rayleigh, e.Lambda2.Lo)
}

// EigenvectorError returns upper bounds of ‖ũ − P₁ũ‖²/‖ũ‖² and of the
// shifted energy ‖ũ − P₁ũ‖²_γ/‖ũ‖² for an approximate ground state ũ with
// a(ũ, ũ) ∈ aUU and b(ũ, ũ) = ‖ũ‖² ∈ bUU, given certified enclosures
// lambda1 ∋ λ1 and lambda2 ∋ λ2 of the two lowest eigenvalues (counted
// with multiplicity) and the shift gamma of the energy norm.
//
// Hypotheses (the caller's): ũ lies in the form domain, aUU and bUU enclose
// the exact forms of ũ, lambda1 and lambda2 enclose λ1 and λ2, and
// V + γ ≥ 0 with Robin coefficients ≥ 0 (so that a + γb is a norm). The
// bounds are (E1) and (E2) of the package doc, evaluated in outward rounded
// interval arithmetic:
//
//	L2     ≥ (R − λ1)/(λ2 − λ1),
//	Energy ≥ (R − λ1) + (λ1 + γ)·[0, L2].
//
// Clusters: with lambda2 an enclosure of λ_{m+1} instead of λ2, and P₁
// replaced by the projection P_m on the span of the first m eigenfunctions,
// the same bounds hold for ‖ũ − P_mũ‖² (the proof in the package doc with
// a(u, u) ≥ λ1‖u‖² for u in that span, a(w, w) ≥ λ_{m+1}‖w‖², and then
// a(w, w) = a(ũ, ũ) − a(u, u) ≤ (R − λ1)‖ũ‖² + λ1‖w‖²). This is a bound for
// one vector; the distance between an m-dimensional approximate subspace
// and the exact one is not bounded here.
//
// It returns a *NotSeparatedError, and no bounds, when lambda2.Lo ≤ R.Hi
// (this includes λ1 not certified simple, since R ≥ λ1). It panics if an
// argument is not an interval (Lo > Hi or NaN), if bUU is not positive or
// if lambda1 + gamma < 0 (then V + γ ≥ 0 cannot hold, as λ1 ≥ inf V); the
// part of lambda1 + gamma below 0 is cut off.
func EigenvectorError(aUU, bUU, lambda1, lambda2 interval.I, gamma float64) (VectorError, error) {
	mustBeInterval("a(ũ, ũ)", aUU)
	mustBeInterval("b(ũ, ũ)", bUU)
	mustBeInterval("λ1", lambda1)
	mustBeInterval("λ2", lambda2)
	if !bUU.Positive() {
		panic("groundstate: b(ũ, ũ) must be positive")
	}
	// V + γ ≥ 0 gives λ1 + γ ≥ 0, so the enclosure may be cut at 0.
	shifted, ok := lambda1.AddF(gamma).Intersection(interval.New(0, math.Inf(1)))
	if !ok {
		panic("groundstate: λ1 + γ < 0; the shift does not make the form positive")
	}
	r := aUU.Div(bUU)
	if lambda2.Lo <= r.Hi {
		return VectorError{}, &NotSeparatedError{Rayleigh: r, Lambda2: lambda2}
	}
	// R ≥ λ1 for the exact values (min–max principle), so only the upper
	// end of R − λ1 matters; an upper end below 0 means the enclosures
	// contradict each other.
	excessHi := r.Sub(lambda1).Hi
	if excessHi < 0 {
		panic("groundstate: R(ũ) < λ1 contradicts the min–max principle; the enclosures are wrong")
	}
	excess := interval.New(0, excessHi)
	// λ2 > R ≥ λ1 for the exact values; lambda2 − lambda1 may still contain
	// 0 when lambda1 is wide, and then Div returns the whole line: the bound
	// is +∞ (true, useless).
	l2 := excess.Div(lambda2.Sub(lambda1)).Hi
	energy := excess.Add(shifted.Mul(interval.New(0, l2))).Hi
	return VectorError{L2: l2, Energy: energy, Rayleigh: r}, nil
}
