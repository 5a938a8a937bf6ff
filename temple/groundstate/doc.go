// Package groundstate certifies statements about the ground state (the
// first eigenfunction) of −u″ + V u = λ u, given certified enclosures of the
// lowest eigenvalues: how far an approximate eigenvector is from the first
// eigenspace, pointwise enclosures of the one-dimensional ground state and
// its derivative, and whether the one-dimensional ground state is
// log-concave.
//
// Every number returned as a bound is the end of a chain of outward rounded
// operations of package interval; every product is written float64(a*b).
// Floating point at round-to-nearest only chooses step sizes and
// subdivisions. Each function states the inequality it relies on in its doc
// comment; the theorems used by the package are these.
//
// # Eigenvector error (EigenvectorError)
//
// Setting: a(·,·) symmetric and bounded below on a Hilbert space H with
// compact embedding into L², b(·,·) the L² product, eigenvalues λ1 < λ2 ≤ …
// (λ2 counted with multiplicity, so λ1 < λ2 means λ1 is simple), E₁ the
// eigenspace of λ1 and P₁ the b-orthogonal projection on E₁. For ũ ∈ H write
// ũ = u + w with u = P₁ũ and w ⊥ E₁. Then a(u, w) = λ1·b(u, w) = 0, and
// w lies in the closed span of the eigenfunctions of λ2, λ3, …, so
// a(w, w) ≥ λ2‖w‖² (expansion in the eigenbasis). Hence
//
//	a(ũ, ũ) = a(u, u) + a(w, w) ≥ λ1‖u‖² + λ2‖w‖² = λ1‖ũ‖² + (λ2 − λ1)‖w‖²,
//
// that is, with R(ũ) = a(ũ, ũ)/b(ũ, ũ),
//
//	‖ũ − P₁ũ‖² / ‖ũ‖² ≤ (R(ũ) − λ1)/(λ2 − λ1).                       (E1)
//
// The same computation gives the energy of the error exactly:
// a(w, w) = a(ũ, ũ) − λ1‖u‖² = (R(ũ) − λ1)‖ũ‖² + λ1‖w‖². When V may be
// negative the energy norm is the shifted one, ‖v‖²_γ = a(v, v) + γ‖v‖² with
// a constant γ such that V + γ ≥ 0 (and Robin coefficients ≥ 0), which makes
// a + γb positive definite; then
//
//	‖w‖²_γ / ‖ũ‖² = (R(ũ) − λ1) + (λ1 + γ)‖w‖²/‖ũ‖²
//	             ≤ (R(ũ) − λ1)·(λ2 + γ)/(λ2 − λ1)                    (E2)
//
// by (E1), as λ1 + γ ≥ 0. (E1) is the Rayleigh-quotient bound of Algorithm I
// of Liu and Vejchodský for a single vector; with λ2 replaced by λ_{m+1} and
// E₁ by the span of the first m eigenfunctions the same lines bound
// ‖ũ − P_mũ‖² (for one vector; the subspace version for several vectors is
// not implemented here).
//
// # One-dimensional ground state (Shoot, Enclose)
//
// On an interval [a, b] with V continuous and separated boundary conditions
// (Dirichlet, Neumann, or Robin ∂u/∂n + αu = 0 with the outward normal), the
// first eigenvalue λ1 is simple and its eigenfunction has no zero in the open
// interval (a, b); the k-th eigenfunction has exactly k − 1 interior zeros
// (Sturm's oscillation theorem; Coddington–Levinson, ch. 8, for real
// separated conditions). The ground state u* therefore has u*(a) ≠ 0 or
// u*′(a) ≠ 0 (else u* ≡ 0 by uniqueness for the initial value problem), and
// u* is a positive multiple of the solution u_{λ1} of the initial value
// problem u″ = (V − λ1)u with the data
//
//	Dirichlet  u(a) = 0, u′(a) = 1;
//	Neumann    u(a) = 1, u′(a) = 0;
//	Robin      u(a) = 1, u′(a) = α   (−u′(a) + αu(a) = 0, normal −x),
//
// and mirrored at the right end (u(b) = 0, u′(b) = −1; u(b) = 1, u′(b) = 0;
// u(b) = 1, u′(b) = −α). With only an enclosure [λ] ∋ λ1 known, Shoot
// encloses the whole family {u_λ : λ ∈ [λ]}; the ground state, normalised at
// that end, is one of its members, so every enclosure of the family holds for
// it. Each end is shot inward: near an end where V > λ1 the solution
// normalised there grows inward and the other solution decays, so errors are
// damped rather than amplified. Enclose shoots from both ends to a split
// point; the two halves carry different (positive) normalisations.
//
// Why shooting rather than the eigenvector bounds: a one-dimensional
// Sobolev inequality turns (E1) and (E2) into pointwise bounds whose width
// is of the order of the square root of R(ũ) − λ1, and it needs an
// approximate eigenvector; the shot needs only [λ], and its width is of the
// order of the width of [λ] (sin x with a λ1 enclosure of width 2e-12:
// width 1.3e-12 at π/2, see the tests).
//
// The validated integration of the 2×2 linear system y′ = A(x)y,
// A = [[0, 1], [V − λ, 0]] is described with Shoot: per step an a priori
// enclosure and a Picard iteration on Taylor models with interval
// coefficients, and the fundamental matrix propagated apart from the initial
// vector against the wrapping effect.
//
// # Log-concavity in one dimension (LogConcavity)
//
// Where u > 0, (log u)″ = (u u″ − u′²)/u² = g/u² with
//
//	g := (V − λ1)u² − u′²,
//
// and g is invariant under u ↦ cu up to the factor c², so its sign does not
// depend on the normalisation. The ground state is log-concave on [a, b] iff
// g ≤ 0 on (a, b). Where V ≤ λ1 on a cell, g ≤ 0 without knowing u. A point
// with g > 0 (and u > 0) is a point where log u is strictly convex, a
// certified failure.
//
// References:
//
//	X. Liu and T. Vejchodský, Fully computable a posteriori error bounds
//	for eigenfunctions, arXiv:1904.07903 (Algorithm I).
//	E. A. Coddington and N. Levinson, Theory of Ordinary Differential
//	Equations, McGraw-Hill, 1955, ch. 8 (Sturm–Liouville theory;
//	chapter recalled from memory).
//	R. J. Lohner, Enclosing the solutions of ordinary initial and boundary
//	value problems, in: Computer Arithmetic, Teubner, 1987, 255–286.
//	N. S. Nedialkov, K. R. Jackson and G. F. Corliss, Validated solutions
//	of initial value problems for ordinary differential equations, Appl.
//	Math. Comput. 105 (1999) 21–68.
//	K. Makino and M. Berz, Taylor models and other validated functional
//	inclusion methods, Int. J. Pure Appl. Math. 4 (2003) 379–456.
package groundstate
