// Package sparse implements sparse symmetric matrices for finite-element
// pencils on two-dimensional meshes: storage, a fill-reducing ordering, a
// symbolic analysis and a floating-point LDLᵀ factorization without
// pivoting, approximate lowest eigenpairs of Kx = λMx, and a verified upper
// bound on the number of eigenvalues below a shift.
//
// Sym holds float64 data and ISym interval data on a shared Pattern (the
// lower triangle by columns); an ISym stands for every real symmetric
// matrix with entries in its intervals. Builder and IBuilder assemble them
// from element contributions.
//
// Choosing and proving are kept apart. Order (nested dissection), Analyze
// (elimination tree and column counts, reusable across shifts through
// Symbolic), Factor, LDL.SolveTo and LowestEigs compute in floating point
// at round-to-nearest and only choose (orders, shifts, approximate
// eigenvectors); nothing they return is a bound. CountBelow (and Counter,
// which repeats it at many shifts) is verified: its count and shift are
// true for every member of the interval pencil, by an interval enclosure
// of the factorization residual, Weyl's monotonicity and Sylvester's law
// of inertia (see Verified counts). Its soundness does not depend on the accuracy
// of the float factorization, only on the residual enclosure.
//
// # Verified counts
//
// Let ([K], [M]) be an interval pencil, mMin > 0 with M ⪰ mMin·I for every
// member M (the caller's bound, see Mass bounds), and σ a float (a
// choice). Factor the permuted float matrix Pᵀ(mid(K) − σ·mid(M))P ≈ LDLᵀ
// at round-to-nearest (P a fill-reducing permutation, L unit lower
// triangular; its accuracy does not matter). For a member (K, M) let R =
// Pᵀ(K − σM)P − LDLᵀ, a symmetric matrix that vanishes outside the
// pattern of L + Lᵀ, and let r be an upper bound, over all members, of
// ‖R‖∞ (the largest absolute row sum), enclosed entry by entry in outward
// rounded interval arithmetic. With σ' ≤ σ − r/mMin (rounded down) and
// R' = PRPᵀ (‖R'‖∞ = ‖R‖∞),
//
//	K − σ'M = PLDLᵀPᵀ + R' + (σ − σ')M ⪰ PLDLᵀPᵀ + R' + rI ⪰ PLDLᵀPᵀ,
//
// since (σ − σ')M ⪰ (σ − σ')mMin·I ⪰ rI and λ_min(R') ≥ −ρ(R') ≥ −‖R'‖∞ ≥ −r.
// Weyl's monotonicity theorem (A ⪰ B implies λ_j(A) ≥ λ_j(B) for every j)
// gives #neg(K − σ'M) ≤ #neg(PLDLᵀPᵀ), which is #neg(D) by Sylvester's
// law of inertia (PL is nonsingular). As M is positive definite, K − σ'M =
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
//	A. George, J. W. H. Liu, Computer Solution of Large Sparse Positive
//	Definite Systems, Prentice-Hall, 1981 (nested dissection).
//	J. W. H. Liu, The role of elimination trees in sparse factorization,
//	SIAM J. Matrix Anal. Appl. 11 (1990) 134–172.
//	T. A. Davis, Direct Methods for Sparse Linear Systems, SIAM, 2006.
//	B. N. Parlett, The Symmetric Eigenvalue Problem, SIAM, 1998 (subspace
//	iteration, Rayleigh–Ritz, the generalized problem and shift-invert).
package sparse
