// Package tri implements the finite elements of gapcert on triangle meshes
// of a polygon (package fem/mesh), for
//
//	−Δu + V u = λ u in Ω,  u = 0 on Dirichlet sides,
//	∂u/∂n + αu = 0 on Robin sides (α ≥ 0; Neumann for α = 0),
//
// with a(u, v) = ∫∇u·∇v + ∫Vuv + Σ_e α_e ∫_e uv and b(u, v) = ∫uv:
//
//   - Potential: V held per triangle as a Bernstein polynomial with interval
//     coefficients plus a remainder interval (from formula Taylor models;
//     exact for polynomials), with a range enclosure per triangle;
//   - Lagrange: conforming P_p (any p ≥ 1) in the Bernstein basis, for
//     Rayleigh–Ritz upper bounds (RitzMatrices) and float assembly
//     (AssembleApprox) to choose approximate eigenvectors;
//   - Projection: the stage-A spaces CR and ECR (enriched Crouzeix–Raviart)
//     with the interval matrices of the relaxed form a_h and the constant
//     of the projection lower bound of Liu (2015) (see Projection lower bound);
//   - Flux: the Raviart–Thomas spaces RT_k ⊂ H(div) (exact rational
//     reference basis, Piola transform) with the Lehmann–Goerisch matrix A2
//     (LGMatrix, see Lehmann–Goerisch fluxes), the minimal-norm flux
//     (MinimizeApprox: hybridised, in a basis that separates the
//     divergence-free fields, so that it stays accurate on triangles of
//     any size) and refinement indicators (Indicators), both choices.
//
// Guarantees. Every interval matrix this package returns (RitzMatrices,
// Projection.Matrices, Flux.LGMatrix) encloses, entry by entry, the exact forms for the
// exact mesh (every exact node inside its enclosure), the exact functions
// defined by the given float64 coefficients, and every exact value of the
// inputs inside their enclosures (α, γ, potential models). The integrals
// are exact on each triangle: functions are in Bernstein form in the
// barycentric coordinates, whose products, gradients and integrals are
// exact rational identities (tables.go, kernel.go), evaluated in outward
// rounded interval arithmetic (package interval) from tables enclosed from
// math/big. The non-polynomial part of V is carried as a remainder and
// bounded by Cauchy–Schwarz. Hypotheses a theorem needs (V + γ ≥ 0 on
// every triangle, an invertible local DOF matrix, a positive mass bound)
// are checked and reported as errors (*SignError and others), never
// assumed. ProjectionConstant returns an upper bound of the constant of
// (H3), with the inequality and its source in its doc comment.
//
// The constant of (H3). Both stage-A spaces use Liu's Crouzeix–Raviart
// interpolation constant, confirmed in the restatement by C. You, H. Xie
// and X. Liu (Guaranteed eigenvalue bounds for the Steklov eigenvalue
// problem, arXiv:1808.08148v1, p. 8), Lemma 3.2, equation (3.12):
//
//	"For any triangle element K, whose longest edge length is denoted by
//	h_K, we have ‖u − Π_h u‖_(0,K) ≤ 0.1893 h_K |u − Π_h u|_(1,K)
//	∀u ∈ H¹(K)."
//
// with Π_h the Crouzeix–Raviart interpolation operator (edge means, their
// equation (3.10)), credited there to X. Liu, A framework of verified
// eigenvalue bounds for self-adjoint differential operators, Appl. Math.
// Comput. 267 (2015) 341–355. The bound is stated with the number 0.1893
// itself (an upper bound of the optimal constant), h_K the longest edge,
// and the only hypothesis on the error is zero edge means. So it holds for
// the CR error and also for the ECR error (zero edge means and zero element
// mean: its CR interpolant is 0). The code encloses the decimal 0.1893 and
// the longest edge and rounds C_T = 0.1893 h_T up. It replaces the
// constants used before, h_T/j_(1,1) ≈ 0.2610 h_T for ECR (mean-zero
// Poincaré inequality, Laugesen–Siudeja 2010) and ≈ 0.2984 h_T for CR (a
// derivation from the edge-mean condition), both larger.
//
// Functions and files named Approx or approx, and Interpolate and Eval,
// work at round-to-nearest: their results are choices (approximate
// eigenvectors, interpolants, plot values), never bounds.
//
// # Remainders
//
// Where V (or the weight 1/(V + γ)) is carried on a triangle T as a
// polynomial P plus a remainder interval R = [r_mid − r_rad, r_mid + r_rad]
// (V(x) − P(x) ∈ R for every x ∈ T), the integrals split as
//
//	∫_T V u v = ∫_T (P + r_mid) u v + ∫_T (V − P − r_mid) u v,   |∫_T (V − P − r_mid) u v| ≤ r_rad ‖u‖_T ‖v‖_T,
//
// because |V − P − r_mid| ≤ r_rad pointwise and ∫_T |uv| ≤ ‖u‖_T ‖v‖_T
// (Cauchy–Schwarz). The first integral is exact (Bernstein products); the
// second is enclosed by ±r_rad ‖u‖_T ‖v‖_T with the norms from exact Gram
// matrices, rounded up (RemainderBound of package fem/internal/bernstein).
//
// # Projection lower bound (stage A)
//
// The theorem and its proof are in the doc of package enclose (Projection
// lower bounds); here are the space-specific steps. H = {u ∈ H¹(Ω): u = 0
// on Dirichlet sides}, m_S the mean over S, c_T the lower end of an
// enclosure of V + γ on T, verified ≥ 0 (else a *SignError), Γ_R the
// Robin sides (α ≥ 0). The forms, broken over the triangles, are
//
//	ECR: a_h(u, v) = Σ_T (∇u, ∇v)_T + Σ_T c_T |T| m_T(u) m_T(v) + Σ_(e ⊂ Γ_R) α_e |e| m_e(u) m_e(v),
//	CR:  a_h(u, v) = Σ_T (∇u, ∇v)_T + Σ_(e ⊂ Γ_R) α_e |e| m_e(u) m_e(v)   (+ c(u, v), see below).
//
// On H both are ≤ a + γb by Jensen's inequality |S| m_S(u)² ≤ ∫_S u² (for
// CR without its c term: ≤ the form of −Δ with the Robin terms). P_h u is
// the member with the edge means (and, for ECR, element means) of u;
// Dirichlet edge means of u ∈ H are 0, so e = u − P_h u has zero mean on
// every edge of every triangle, and for ECR on every triangle.
//
// (H2). Every v_h of either space has, on each triangle, a constant
// Laplacian and a constant normal derivative on each straight edge (CR:
// ∇v_h is constant; ECR adds x² + y², with ∇ = 2(x, y), Δ = 4, and
// (x, y)·n constant on a line). Green's formula on T gives
//
//	∫_T ∇e·∇v_h = −Δv_h ∫_T e + Σ_(E ⊂ ∂T) ∂_n v_h|_E ∫_E e = 0
//
// (for CR Δv_h = 0, so the element mean of e is not needed), and every
// mean term of a_h vanishes on e. So a_h(e, v_h) = 0.
//
// (H3). a_h(e, e) ≥ Σ_T ‖∇e‖²_T (the mean terms are ≥ 0, and vanish on e).
// If ‖e‖_T ≤ C_T ‖∇e‖_T on every triangle, summing gives ‖e‖² ≤
// max_T C_T² Σ_T ‖∇e‖²_T ≤ C_h² a_h(e, e) with C_h = max_T C_T.
// ProjectionConstant returns Liu's C_T = 0.1893 h_T (above; its doc comment
// is authoritative). Two elementary local constants, larger but derived
// here from first principles, bound the same quantity and are the
// fallback should that published constant ever be in doubt (h_T the
// longest edge, ℓ_0, ℓ_1, ℓ_2 the edge lengths of T):
//
//   - ECR: e has zero mean on T, and the optimal Poincaré inequality for
//     triangles (Laugesen–Siudeja 2010), ∫_T v² ≤ (h_T/j_(1,1))² ∫_T |∇v|²
//     for v ∈ H¹(T) with zero mean, j_(1,1) = 3.8317… the first positive
//     zero of the Bessel function J_1, gives C_T = h_T/j_(1,1) ≈ 0.2610 h_T
//     (the code divides by 3.8317 < j_(1,1), which only enlarges it).
//   - CR: e has zero edge means only. With x_c the centroid,
//     div((x − x_c)e) = 2e + (x − x_c)·∇e and (x − x_c)·n is constant on
//     each edge, so the divergence theorem gives 2∫_T e = −∫_T (x − x_c)·∇e.
//     With ∫_T |x − x_c|² = |T|(ℓ_0² + ℓ_1² + ℓ_2²)/36 (polar moment of
//     inertia about the centroid) and Cauchy–Schwarz, |T| m_T(e)² ≤
//     ((ℓ_0² + ℓ_1² + ℓ_2²)/144) ‖∇e‖²_T. As ‖e‖²_T = ‖e − m_T(e)‖²_T +
//     |T| m_T(e)² and e − m_T(e) has zero mean,
//     C_T² = (ℓ_0² + ℓ_1² + ℓ_2²)/144 + h_T²/j_(1,1)² ≤ (1/48 + 1/j_(1,1)²) h_T²,
//     so C_T ≤ 0.2984 h_T.
//
// CR shift. CR does not preserve element means, so its form carries one
// constant c = min_T c_T ≥ 0 (CRShift) instead of per-triangle mean terms:
// the matrices of Projection.Matrices are those of a_h + c b, with
// eigenvalues μ_(h,k) + c, μ_(h,k) those of a_h. The theorem applied with
// V = 0 and γ = 0 (a_h ≤ the form of −Δ with the Robin terms on H) gives
// f(μ_(h,k)) ≤ λ_k(−Δ + Robin), f(x) = x/(1 + C_h² x), and min–max with
// V + γ ≥ c on Ω gives λ_k(−Δ + Robin) + c ≤ λ_k + γ.
// So λ_k + γ ≥ c + f(μ_(h,k)) ≥ f(μ_(h,k) + c), the last step as f is
// increasing with 0 < f' ≤ 1 on [0, ∞). Either bound may be used, from a
// verified lower bound of μ_(h,k) + c (package enclose/sparse, CountBelow)
// and the mass bound of Projection.Matrices (package enclose/sparse, Mass
// bounds). Both spaces are sound for every V and every side condition;
// which one serves stage A is a choice of package certs/certify.
//
// # Lehmann–Goerisch fluxes (stage B)
//
// With c = V + γ verified > 0 on every triangle (InverseShifted), M(u, v)
// = a(u, v) + γ b(u, v) is an inner product on H and Λ_k = λ_k + γ. Let
// X = L²(Ω)² × L²(Ω) × L²(Γ_R) and Tu = (∇u, √c u, √α u|_(Γ_R)), so
// (Tu, Tv)_X = M(u, v). A flux σ ∈ RT_k (Flux) lies in H(div; Ω), with a
// piecewise polynomial normal trace σ·n on ∂Ω, and σ·n = 0 on every side
// that is neither Dirichlet nor Robin with α verified > 0 (its edge
// degrees of freedom are removed). For a trial function ũ ∈ H put
//
//	w = (σ, (ũ + div σ)/√c, −(σ·n)/√α on Robin sides with α > 0, 0 on the other Robin sides).
//
// For φ ∈ H, Green's formula ∫_Ω ∇φ·σ + ∫_Ω φ div σ = ∫_∂Ω φ σ·n gives
//
//	(Tφ, w)_X = ∫∇φ·σ + ∫φ div σ + ∫φũ − ∫_(Γ_R, α > 0) φ σ·n
//	          = ∫φũ + ∫_∂Ω φ σ·n − ∫_(Γ_R, α > 0) φ σ·n = b(φ, ũ),
//
// because on the rest of ∂Ω either φ = 0 (Dirichlet) or σ·n = 0. This is
// the hypothesis (Tφ, w_i)_X = b(φ, ũ_i) of the Lehmann–Goerisch theorem
// (package temple) for every choice of σ_i, and with A0 = M(ũ_i, ũ_j),
// A1 = b(ũ_i, ũ_j) (Lagrange.RitzMatrices) Flux.LGMatrix encloses
//
//	A2 = (w_i, w_j)_X = (σ_i, σ_j) + ((ũ_i + div σ_i)/c, ũ_j + div σ_j) + Σ_(e ⊂ Γ_R, α_e > 0) ∫_e (σ_i·n)(σ_j·n)/α_e,
//
// with 1/c from the model of InverseShifted and its remainder (Remainders
// above). For an exact eigenpair (u, Λ), σ = ∇u/Λ gives w = Tu/Λ (as
// −Δu + cu = Λu and ∂_n u = −αu on Γ_R), the w of least norm for ũ = u;
// MinimizeApprox chooses σ by a least-squares solve, a choice that affects
// only sharpness.
//
// Without Robin sides, Flux.LehmannMatrix encloses the matrix B = A0 −
// 2ρA1 + ρ²A2 of the theorem itself, in the residual form ρ²(w_i −
// Tũ_i/ρ, w_j − Tũ_j/ρ)_X (package temple, The residual form of B), with
// σ_i − ∇ũ_i/ρ formed coefficient by coefficient on each triangle: for
// approximate eigenpairs the combination of the enclosures of A0, A1 and
// A2 loses the digits they share, which the residual form never has.
//
// References:
//
//	X. Liu, A framework of verified eigenvalue bounds for self-adjoint
//	differential operators, Appl. Math. Comput. 267 (2015) 341–355.
//	R. S. Laugesen, B. A. Siudeja, Minimizing Neumann fundamental tones of
//	triangles: an optimal Poincaré inequality, J. Differential Equations
//	249 (2010) 118–135.
//	J. Hu, Y. Huang, Q. Lin, Lower bounds for eigenvalues of elliptic
//	operators: by nonconforming finite element methods, J. Sci. Comput. 61
//	(2014) 196–221.
//	H. Behnke, F. Goerisch, Inclusions for eigenvalues of selfadjoint
//	problems, in: J. Herzberger (ed.), Topics in Validated Computations,
//	Elsevier, 1994, 277–322.
//	T. Vejchodský, Flux reconstructions in the Lehmann–Goerisch method for
//	lower bounds on eigenvalues, arXiv:1801.02561 (2018).
//	F. Brezzi, M. Fortin, Mixed and Hybrid Finite Element Methods,
//	Springer, 1991.
//	D. N. Arnold, F. Brezzi, Mixed and nonconforming finite element
//	methods: implementation, postprocessing and error estimates, RAIRO
//	Modél. Math. Anal. Numér. 19 (1985) 7–32.
package tri
