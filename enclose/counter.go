package enclose

import (
	"math"

	"gapcert/interval"
)

// Counter gives verified counts for one interval pencil ([K], [M]) of a
// large storage (packages enclose/band and enclose/sparse implement it).
//
// CountBelow(mMin, sigma) returns n and sigmaPrime such that, for every
// member K ∈ [K], M ∈ [M] with λ_min(M) ≥ mMin,
//
//	#{λ : Kx = λMx, λ < sigmaPrime} ≤ n,
//
// so that n ≤ k − 1 proves λ_k ≥ sigmaPrime. mMin > 0 is a caller-verified
// lower bound of λ_min(M) over the members and sigma a trial shift (a
// choice); sigmaPrime ≤ sigma, close to it when the float factorization is
// accurate. ok = false (a factorization breakdown) claims nothing. The
// count is all a Counter promises: n may exceed the true number (it is
// the number below sigma for the float midpoint pencil, up to rounding).
// CountBelow panics if mMin is not a positive finite number or sigma is
// not finite. Implementations compute through CountFromResidual.
type Counter interface {
	CountBelow(mMin, sigma float64) (n int, sigmaPrime float64, ok bool)
}

// CountFromResidual is the verified count of a Counter from a float
// factorization and an enclosed residual, written once for every storage.
//
// factor(sigma) must factor the float matrix Pᵀ(mid(K) − σ·mid(M))P ≈ LDLᵀ
// at round-to-nearest (P a permutation, possibly the identity; L unit lower
// triangular; its accuracy does not matter) and return neg = #neg(D) and r,
// an upper bound over all members (K, M) of ‖R‖∞ (the largest absolute row
// sum) of the symmetric residual R = Pᵀ(K − σM)P − LDLᵀ, enclosed in
// outward rounded arithmetic; ok = false if the factorization broke down.
// CountFromResidual returns n = neg and sigmaPrime = σ − r/mMin rounded
// down (r = NaN is taken as +∞), or (0, σ, false) after a breakdown.
//
// The chain of inequalities, for every member (K, M), with R' = PRPᵀ
// (‖R'‖∞ = ‖R‖∞, a permutation only reorders rows and columns):
//
//	K − σ'M = PLDLᵀPᵀ + R' + (σ − σ')M    (definition of R)
//	        ⪰ PLDLᵀPᵀ + R' + rI            ((σ − σ') ≥ r/mMin ≥ 0, M ⪰ mMin·I)
//	        ⪰ PLDLᵀPᵀ                      (R' symmetric, λ_min(R') ≥ −ρ(R') ≥ −‖R'‖∞ ≥ −r).
//
// Weyl's monotonicity theorem (A ⪰ B implies λ_j(A) ≥ λ_j(B) for every j)
// gives #neg(K − σ'M) ≤ #neg(PLDLᵀPᵀ), which is #neg(D) by Sylvester's law
// of inertia (PL is nonsingular). As M is positive definite,
// K − σ'M = M^(1/2)(M^(−1/2)KM^(−1/2) − σ'I)M^(1/2) is congruent to a
// matrix whose negative eigenvalues are the λ − σ' with λ < σ', so
//
//	#{λ : Kx = λMx, λ < σ'} = #neg(K − σ'M) ≤ #neg(D) = n.
//
// A poor factorization only makes r large and σ' low; it never makes the
// count wrong. σ' is computed as interval.SubDown(σ, interval.DivUp(r,
// mMin)), so σ − σ' ≥ r/mMin holds for the exact reals.
//
// CountFromResidual panics (the misuse panics of every Counter) if mMin is
// not a positive finite number or sigma is not finite.
//
// References:
//
//	G. H. Golub, C. F. Van Loan, Matrix Computations, 4th ed., Johns
//	Hopkins University Press, 2013, §8.1 (Weyl's inequalities, Sylvester's
//	law of inertia).
//	J. J. Sylvester, A demonstration of the theorem that every homogeneous
//	quadratic polynomial is reducible by real orthogonal substitutions to
//	the form of a sum of positive and negative squares, Philosophical
//	Magazine 4 (1852) 138–142.
func CountFromResidual(mMin, sigma float64, factor func(sigma float64) (neg int, r float64, ok bool)) (n int, sigmaPrime float64, ok bool) {
	if !(mMin > 0) || math.IsInf(mMin, 1) {
		panic("enclose: mMin must be a positive finite lower bound of λ_min(M)")
	}
	if math.IsNaN(sigma) || math.IsInf(sigma, 0) {
		panic("enclose: shift must be finite")
	}
	neg, r, ok := factor(sigma)
	if !ok {
		return 0, sigma, false
	}
	if math.IsNaN(r) {
		r = math.Inf(1)
	}
	return neg, interval.SubDown(sigma, interval.DivUp(r, mMin)), true
}
