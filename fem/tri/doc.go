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
//     of the projection lower bound of Liu (2015);
//   - Flux: the Raviart–Thomas spaces RT_k ⊂ H(div) (exact rational
//     reference basis, Piola transform) with the Lehmann–Goerisch matrix A2
//     (LGMatrix, METHODS §6), the minimal-norm flux (MinimizeApprox) and
//     refinement indicators (Indicators), both choices.
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
package tri
