package enclose

import (
	"math"

	"gapcert/interval"
)

// ProjectionLower returns a float64 ≤ λ_h/(1 + C_h² λ_h) for every
// λ_h ≥ lamHLower and every constant C_h with |C_h| ≤ ch.Mag(), the
// projection lower bound of Liu (2015; Carstensen–Gedicke 2014 for the
// Crouzeix–Raviart case):
//
//	λ_k ≥ λ_{h,k} / (1 + C_h² λ_{h,k}),
//
// valid when the discrete form a_h is positive semidefinite and the
// projection P_h satisfies (H2) a_h(u − P_h u, v_h) = 0 and
// (H3) ‖u − P_h u‖_b ≤ C_h ‖u − P_h u‖_{a_h} (theorem and proof in the
// package doc, Projection lower bounds). Those hypotheses are the caller's.
//
// Soundness: for x ≥ 0 the map f(x) = x/(1 + c x) increases in x and
// decreases in c ≥ 0, so f evaluated at the lower bound lamHLower of λ_{h,k}
// and at the upper bound c = ch.Mag()² (rounded up) of C_h² is ≤ the true
// f(λ_{h,k}); it is computed as 1/(1/x + c) with every operation rounded
// toward the lower bound. For lamHLower ≤ 0 the formula is not used (for
// −1/C_h² < x ≤ 0 it gives f(x) ≤ x, and for x ≤ −1/C_h² it is
// meaningless); under the theorem's hypotheses the bounded eigenvalue
// (λ_k(a_lo) ≤ λ_k + γ in the package doc) is ≥ 0 ≥ lamHLower anyway, so
// lamHLower is returned unchanged (−∞ stays −∞).
//
// ProjectionLower panics if lamHLower is NaN or +∞ or ch is unbounded.
//
// References:
//
//	X. Liu, A framework of verified eigenvalue bounds for self-adjoint
//	differential operators, Applied Mathematics and Computation 267 (2015)
//	341–355.
//	C. Carstensen, J. Gedicke, Guaranteed lower bounds for eigenvalues,
//	Mathematics of Computation 83 (2014).
func ProjectionLower(lamHLower float64, ch interval.I) float64 {
	if math.IsNaN(lamHLower) || math.IsInf(lamHLower, 1) {
		panic("enclose: lower bound of the discrete eigenvalue must be finite or −Inf")
	}
	if !ch.IsBounded() {
		panic("enclose: projection constant must be bounded")
	}
	if lamHLower <= 0 {
		return lamHLower
	}
	m := ch.Mag()
	c := interval.MulUp(m, m)
	// 1/(1/x + c): 1/x rounded up, sum rounded up, reciprocal rounded down.
	return interval.DivDown(1, interval.AddUp(interval.DivUp(1, lamHLower), c))
}
