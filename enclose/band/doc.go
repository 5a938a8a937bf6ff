// Package band implements symmetric banded matrices for one-dimensional
// finite-element pencils: a floating-point LDLᵀ factorization, approximate
// lowest eigenpairs of Kx = λMx, and a verified upper bound on the number
// of eigenvalues below a shift.
//
// Sym holds float64 data and ISym interval data; an ISym stands for every
// real symmetric matrix with entries in its intervals.
//
// Choosing and proving are kept apart. Factor, LDL.SolveTo and LowestEigs
// compute in floating point at round-to-nearest and only choose (shifts,
// approximate eigenvectors); nothing they return is a bound. CountBelow is
// verified: its count and shift are true for every member of the interval
// pencil, by an interval enclosure of the factorization residual, Weyl's
// monotonicity and Sylvester's law of inertia (see Verified counts).
//
// # Verified counts
//
// Let ([K], [M]) be an interval pencil, mMin > 0 with M ⪰ mMin·I for every
// member M (the caller's bound, see Mass bounds), and σ a float (a
// choice). Factor the float matrix mid(K) − σ·mid(M) ≈ LDLᵀ at
// round-to-nearest (L unit lower triangular; its accuracy does not
// matter). For a member (K, M) let R = (K − σM) − LDLᵀ, a symmetric
// matrix, and let r be an upper bound, over all members, of ‖R‖∞ (the
// largest absolute row sum), enclosed entry by entry in outward rounded
// interval arithmetic. With σ' ≤ σ − r/mMin (rounded down),
//
//	K − σ'M = LDLᵀ + R + (σ − σ')M ⪰ LDLᵀ + R + rI ⪰ LDLᵀ,
//
// since (σ − σ')M ⪰ (σ − σ')mMin·I ⪰ rI and λ_min(R) ≥ −ρ(R) ≥ −‖R‖∞ ≥ −r.
// Weyl's monotonicity theorem (A ⪰ B implies λ_j(A) ≥ λ_j(B) for every j)
// gives #neg(K − σ'M) ≤ #neg(LDLᵀ), which is #neg(D) by Sylvester's law of
// inertia (L is nonsingular). As M is positive definite, K − σ'M =
// M^(1/2)(M^(−1/2)KM^(−1/2) − σ'I)M^(1/2) is congruent to a matrix whose
// negative eigenvalues are the λ − σ' with λ < σ', so
//
//	#{λ : Kx = λMx, λ < σ'} = #neg(K − σ'M) ≤ #neg(D).
//
// Hence if #neg(D) ≤ k − 1 then λ_k ≥ σ' for every member: a verified
// lower bound of the k-th discrete eigenvalue, as the projection bound of
// package enclose needs. A poor factorization only makes r large and σ'
// low; it never makes the count wrong.
//
// # Mass bounds
//
// The callers (packages fem/line and fem/tri) obtain mMin elementwise. If
// the exact mass matrix is M = Σ_T E_Tᵀ M_T E_T, M_T the element matrix on
// the degrees of freedom of element T (E_T the restriction, x_T = E_T x)
// and M_T ⪰ diag(t_(T,i))_(i ∈ T) with every t_(T,i) ≥ 0 (for example
// t_(T,i) = t_T ≤ λ_min(M_T)), then
//
//	xᵀMx = Σ_T x_Tᵀ M_T x_T ≥ Σ_T Σ_(i ∈ T) t_(T,i) x_i² = Σ_i (Σ_(T ∋ i) t_(T,i)) x_i² ≥ min_i (Σ_(T ∋ i) t_(T,i)) |x|².
//
// Removing degrees of freedom (Dirichlet values) keeps the inequality on
// the rest (a principal submatrix of M_T − diag(t_(T,i)) is still
// positive semidefinite). A member M' of the interval matrix differs
// from M by a symmetric E with |E_ij| ≤ wid([M]_ij), so λ_min(M') ≥
// λ_min(M) − ‖E‖₂ ≥ λ_min(M) − ‖E‖∞ (Weyl; ‖E‖₂ = ρ(E) ≤ ‖E‖∞).
//
// References:
//
//	J. J. Sylvester, A demonstration of the theorem that every homogeneous
//	quadratic polynomial is reducible by real orthogonal substitutions to
//	the form of a sum of positive and negative squares, Philosophical
//	Magazine 4 (1852) 138–142.
//	G. H. Golub, C. F. Van Loan, Matrix Computations, 4th ed., Johns Hopkins
//	University Press, 2013 (banded LDLᵀ; Weyl's inequalities).
//	B. N. Parlett, The Symmetric Eigenvalue Problem, SIAM, 1998 (subspace
//	iteration, Rayleigh–Ritz, the generalized problem and shift-invert).
package band
