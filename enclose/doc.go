// Package enclose implements verified eigenvalue enclosures of small dense
// symmetric interval matrix pencils.
//
// A pencil is a pair ([A], [B]) of symmetric interval matrices (Sym); it
// stands for every pair (A, B) of real symmetric matrices with entries in
// the intervals. Every count and every bound this package returns holds for
// each member (A, B) with B positive definite, not only for the midpoints:
//
//   - CountBelow returns #{μ : Ax = μBx, μ < τ}, decided by interval
//     symmetric Gaussian elimination of [A] − τ[B] and Sylvester's law of
//     inertia, or reports that the count is undecided;
//   - PositiveDefinite proves that every member of a Sym is positive
//     definite;
//   - Eigenvalues encloses μ_1 ≤ … ≤ μ_n by bisection on verified counts;
//   - ProjectionLower applies the projection lower bound of Liu (2015) to a
//     verified lower bound of a discrete eigenvalue.
//
// Floating point at round-to-nearest (gonum's symmetric eigensolver, the
// pivot order, the trial shifts τ, the congruence transformations) only
// chooses; every decision rests on outward rounded interval arithmetic
// (package gapcert/interval).
//
// # Projection lower bounds
//
// ProjectionLower is the last step of the following theorem, the abstract
// lower bound of Liu (2015) stated and proved here in the relaxed form that
// packages fem/line and fem/tri use, with a real shift γ and a lower form
// a_lo.
//
// Setting. H is a real Hilbert space continuously and compactly embedded in
// L² with dense range, b(u, v) = (u, v) the L² product, a and a_lo
// symmetric bounded forms on H such that a + sb is coercive for some real
// s, a_lo + b is coercive and a_lo(u, u) ≥ 0. (The shift γ of Step 1 need
// not make a + γb coercive: the Crouzeix–Raviart bound of package fem/tri
// applies the theorem with γ = 0 to −Δ, which may have Neumann sides.)
// The eigenvalues of (a, b) and (a_lo, b) on H are the
// min–max values (Courant–Fischer)
//
//	λ_k = min_(E ⊂ H, dim E = k) max_(u ∈ E, u ≠ 0) a(u, u)/b(u, u),
//
// and λ_k(a_lo) likewise; compactness makes them eigenvalues with
// eigenfunctions, and each minimum is attained on the span of the first k
// eigenfunctions.
//
// Step 1 (relaxation). If a_lo(u, u) ≤ a(u, u) + γ b(u, u) for every u ∈ H,
// then λ_k(a_lo) ≤ λ_k + γ: the Rayleigh quotients compare on every
// subspace E, hence so do their min–max values. The forms used here are
//
//	a_lo(u, v) = Σ_T (∇u, ∇v)_T + Σ_T c_T |T| m_T(u) m_T(v) + Σ_(e ⊂ Γ_R) α_e |e| m_e(u) m_e(v)
//
// (in 1D the end terms α u(a)v(a), α u(b)v(b) are kept exactly), where T
// runs over the cells or triangles, e over the Robin edges, m_S(u) =
// (1/|S|) ∫_S u is the mean over S, α_e ≥ 0, and c_T is a number with
// 0 ≤ c_T ≤ V + γ on T. Jensen's inequality for t ↦ t² (equivalently
// Cauchy–Schwarz) gives |S| m_S(u)² = (∫_S u)²/|S| ≤ ∫_S u² for every set S
// of positive measure, so
//
//	c_T |T| m_T(u)² ≤ c_T ∫_T u² ≤ ∫_T (V + γ) u²,   α_e |e| m_e(u)² ≤ α_e ∫_e u²,
//
// both steps needing c_T ≥ 0 and α_e ≥ 0. Summing, a_lo(u, u) ≤ a(u, u) +
// γ‖u‖² on H (the gradient terms are equal on H). The callers check
// c_T ≥ 0 (a *SignError otherwise) and take c_T from an outward enclosure
// of V + γ on T; the sign of γ itself does not matter.
//
// Step 2 (projection). Let V_h be a finite-dimensional space, a_h a
// symmetric form on H + V_h with a_h = a_lo on H × H and a_h(v, v) ≥ 0,
// b positive definite on V_h, λ_(h,1) ≤ … ≤ λ_(h,n) the eigenvalues of
// (a_h, b) on V_h, and P_h: H → V_h linear with
//
//	(H2) a_h(u − P_h u, v_h) = 0 for every u ∈ H, v_h ∈ V_h,
//	(H3) ‖u − P_h u‖ ≤ C_h a_h(u − P_h u, u − P_h u)^(1/2) for every u ∈ H.
//
// Then for k ≤ n, with f(x) = x/(1 + C_h² x),
//
//	λ_k(a_lo) ≥ f(λ_(h,k)).
//
// Proof. Let E be the span of the first k eigenfunctions of (a_lo, b), so
// a_lo(u, u) ≤ λ_k(a_lo) ‖u‖² on E. For u ∈ H put p = P_h u, e = u − p;
// (H2) with v_h = p gives a_lo(u, u) = a_h(p + e, p + e) = a_h(p, p) +
// a_h(e, e). If p = 0 for some u ∈ E, u ≠ 0, then by (H3) ‖u‖² = ‖e‖² ≤
// C_h² a_h(e, e) = C_h² a_lo(u, u) ≤ C_h² λ_k(a_lo) ‖u‖², so C_h > 0 and
// λ_k(a_lo) ≥ 1/C_h² > f(λ_(h,k)). Otherwise P_h maps E one-to-one onto a
// k-dimensional subspace of V_h, and min–max on V_h gives u ∈ E with
// p = P_h u ≠ 0 and a_h(p, p) ≥ λ_(h,k) ‖p‖². If λ_(h,k) = 0 there is
// nothing to prove (f(0) = 0 ≤ λ_k(a_lo)). Else, with x = a_h(p, p)^(1/2)
// and y = a_h(e, e)^(1/2), the triangle inequality, (H3) and Cauchy–Schwarz
// in R² give
//
//	‖u‖ ≤ ‖p‖ + ‖e‖ ≤ λ_(h,k)^(−1/2) x + C_h y ≤ (1/λ_(h,k) + C_h²)^(1/2) (x² + y²)^(1/2),
//
// and x² + y² = a_lo(u, u). Hence λ_k(a_lo) ≥ a_lo(u, u)/‖u‖² ≥
// 1/(1/λ_(h,k) + C_h²) = f(λ_(h,k)). ∎
//
// Together: λ_k + γ ≥ λ_k(a_lo) ≥ f(λ_(h,k)) for every k ≤ dim V_h; no
// separation of eigenvalues is assumed, so clusters and multiple
// eigenvalues are covered.
//
// Step 3 (monotonicity). For x > 0, f(x) = 1/(1/x + C²) increases in x and
// decreases in C²; for x ≤ 0 the bound is trivial. So f may be evaluated at
// any verified lower bound of λ_(h,k) (a verified inertia count, below)
// and any upper bound of C_h, with directed rounding; that is
// ProjectionLower.
//
// # Verified inertia counts
//
// Sylvester's law of inertia: congruent symmetric matrices (C and XᵀCX, X
// nonsingular) have the same numbers of negative, zero and positive
// eigenvalues. For B symmetric positive definite, A − τB =
// B^(1/2)(B^(−1/2)AB^(−1/2) − τI)B^(1/2), so #neg(A − τB) = #{μ < τ : Ax =
// μBx}. CountBelow decides #neg([A] − τ[B]) for all members at once by
// interval symmetric Gaussian elimination: if no pivot interval contains 0,
// every member C has PCPᵀ = LDLᵀ with d_k in the k-th pivot interval, and
// #neg(C) = #neg(D). A count n with #{μ < τ} ≤ i − 1 proves μ_i ≥ τ, and
// #{μ < τ} ≥ i proves μ_i < τ; Eigenvalues bisects on such counts. The
// large sparse pencils of the finite-element spaces are counted the same
// way with a floating-point factorization and an enclosed residual: the
// Counter interface, implemented by packages enclose/band and
// enclose/sparse, and CountFromResidual, which states the inequalities.
//
// # Mass bounds
//
// The callers of a Counter (packages fem/line and fem/tri) obtain mMin,
// the lower bound of λ_min(M) over the members, elementwise. If
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
//	University Press, 2013, §8.1 (Weyl's inequalities), §8.4 (Sturm counts
//	and bisection for symmetric eigenvalues).
//	X. Liu, A framework of verified eigenvalue bounds for self-adjoint
//	differential operators, Applied Mathematics and Computation 267 (2015)
//	341–355.
package enclose
