// Package groundstate certifies statements about the ground state (the
// first eigenfunction) of −Δu + V u = λ u, given certified enclosures of the
// lowest eigenvalues: how far an approximate eigenvector is from the first
// eigenspace, pointwise enclosures of the one-dimensional ground state and
// its derivative, whether the one-dimensional ground state is log-concave,
// pointwise enclosures of a two-dimensional ground state at the centres of
// discs, and certified witnesses that a two-dimensional ground state is not
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
// # Two-dimensional pointwise enclosures (EnclosePoint)
//
// Setting: Ω ⊂ R² open, u ∈ H¹(Ω) a weak solution of −Δu + V u = λ1 u (the
// boundary conditions play no part: everything here is interior), B =
// B_R(x0) an open disc in Ω on which V is bounded and the approximate ground
// state ũ is one polynomial, e = u − ũ, and E_B ≥ ‖e‖_{L²(B)}. For
// u = P₁ũ, ‖e‖_{L²(B)} ≤ ‖e‖_{L²(Ω)}, which (E1) bounds.
//
// Regularity. Δu = (V − λ1)u ∈ L²(B) as V ∈ L^∞(B), so u ∈ H²(B′) for
// every disc B′ with closure in B (interior H² regularity, Gilbarg and
// Trudinger, Theorem 8.8), and in two dimensions H² functions are
// continuous (Sobolev embedding W^{m,p} ⊂ C for mp > n; Adams and
// Fournier, Theorem 4.12), so u(x0) is defined.
// Only V ∈ L^∞(B) is needed (V may have kinks); EnclosePoint proves it by
// a model V ∈ P_V + τ with a finite remainder on a set containing B. Also
// −Δe = (λ1 − V)e + r̃ ∈ L²(B) with
//
//	r̃ := (λ1 − V)ũ + Δũ,
//
// since −Δu = (λ1 − V)u. ũ must be one polynomial on all of B: across an
// element edge a continuous piecewise polynomial has a jump of its normal
// derivative, and Δũ has a part concentrated on the edge that r̃ lacks.
//
// Mean-value identity with a source. For ρ < R, G_ρ(x) = (1/2π)
// log(ρ/|x − x0|) is the Green function of B_ρ with pole x0 (zero on ∂B_ρ,
// −ΔG_ρ = δ_{x0}, ∂G_ρ/∂n = −1/(2πρ) on ∂B_ρ), and Green's representation
// formula (Gilbarg and Trudinger, §2.4) gives for w ∈ C²(closure B_ρ)
//
//	w(x0) = (1/(2πρ))∫_{∂B_ρ} w ds + ∫_{B_ρ} G_ρ·(−Δw) dx.
//
// Both sides are continuous in the H²(B_ρ) norm (the point value by the
// embedding, the boundary mean by the trace theorem, the last term as
// G_ρ ∈ L²(B_ρ)), and smooth functions are dense in H²(B_ρ), so it holds
// for e. (Check with w = |x − x0|²: 0 = ρ² − 4·∫_{B_ρ} G_ρ = ρ² − 4·ρ²/4.) Multiply by 2ρ/R² and integrate over ρ ∈ (0, R): the boundary
// means give (1/(πR²))∫_B e (polar coordinates), and by Fubini (K below is
// in L²(B) and −Δe ∈ L²(B)) the volume terms give ∫_B K(|x − x0|)(−Δe)
// with
//
//	K(r) = ∫_r^R (2ρ/R²)(1/2π) log(ρ/r) dρ
//	     = (1/(πR²))·((R²/2) log(R/r) − (R² − r²)/4)
//	     = (1/2π)·(log(R/r) − (1 − r²/R²)/2),
//
// from ∫ ρ log(ρ/r) dρ = (ρ²/2) log(ρ/r) − ρ²/4. Hence
//
//	e(x0) = (1/(πR²))∫_B e + ∫_B K·(−Δe).                              (D1)
//
// K ≥ 0 and K(R) = 0: with t = r/R, k(t) = −log t − (1 − t²)/2 has
// k(1) = 0 and k′(t) = t − 1/t < 0 on (0, 1). (Check: e = −|x − x0|²/4 has
// −Δe = 1, e(x0) = 0 and mean −R²/8, so ∫_B K = R²/8.)
//
// Norms of K. With ∫_0^1 t^m (−log t) dt = 1/(m+1)² and
// ∫_0^1 t^m (log t)² dt = 2/(m+1)³,
//
//	∫_B K = R² ∫_0^1 k(t) t dt = R²(1/4 − 1/8) = R²/8 = ‖K‖_{L¹(B)},
//	‖K‖²_{L²(B)} = (R²/2π) ∫_0^1 k(t)² t dt
//	            = (R²/2π)(1/4 + 1/8 + 1/24 − 1/4 + 1/16 − 1/8) = 5R²/(96π).  (D2)
//
// The enclosure. Put −Δe = (λ1 − V)e + r̃ into (D1) and apply the
// Cauchy–Schwarz inequality to the first two terms:
//
//	u(x0) ∈ ũ(x0) + ∫_B K r̃ + [−1, 1]·(E_B/√(πR²) + ‖K‖_{L²(B)}·sup_B|λ1 − V|·E_B).  (D3)
//
// The signed ∫_B K r̃ is kept (it lies in ±|∫_B K r̃|). λ1 is known only
// as an enclosure [λ], and every term is evaluated for all λ ∈ [λ]; the
// result holds at λ = λ1.
//
// Monomials. In polar coordinates d = x − x0 = r(cos θ, sin θ), with
// n = a + b,
//
//	∫_B K d_x^a d_y^b = ∫_0^R K(r) r^{n+1} dr · ∫_0^{2π} cos^a θ sin^b θ dθ.
//
// The angular integral is 0 unless a and b are both even (θ ↦ π − θ
// changes the sign of cos θ, θ ↦ −θ that of sin θ), and then
// 2B((a+1)/2, (b+1)/2) = 2π (a−1)!!(b−1)!!/n!! (Wallis). The radial
// integral is (R^{n+2}/2π)∫_0^1 k(t) t^{n+1} dt = (R^{n+2}/2π)(1/(n+2)² −
// 1/((n+2)(n+4))) = (R^{n+2}/2π)·2/((n+2)²(n+4)). So
//
//	∫_B K d_x^a d_y^b = 2R^{n+2}(a−1)!!(b−1)!! / ((n+2)²(n+4)·n!!)   (a, b even).  (D4)
//
// With a model V ∈ P_V + τ on B (P_V a polynomial, τ an interval: a
// Taylor model on a triangle containing B, a second-order expansion with
// Lagrange remainder over the bounding box, or the range of V there),
// r̃ = λũ + Δũ − P_V ũ − τ(x)ũ: the polynomial part is integrated with
// (D4), and τ(x)ũ(x) ∈ τ·range_B ũ at each point, so with K ≥ 0 its
// integral lies in (R²/8)·τ·range_B ũ.
//
// Width against R (points near the boundary). The width of (D3) is
//
//	2E_B/(√π·R) + 2R·√(5/(96π))·sup_B|λ − V|·E_B + width(∫_B K r̃),
//
// the last term of order R²·(wid[λ] + wid τ)·sup|ũ| plus rounding. E_B
// comes from a global bound and does not shrink with B, so for a fixed
// bound the first term, which grows like 1/R, dominates as soon as
// √(5/96)·sup|λ − V|·R² < 1 (the ratio of the second term to the first).
// Near ∂Ω the disc must fit in Ω (and in one element), so R ≤ dist(x0, ∂Ω)
// and the width grows like E/dist(x0, ∂Ω) (with Dirichlet conditions u
// itself vanishes there, so the relative width grows faster). A driver
// should therefore use, at each point, the largest disc inside the
// element containing it (InscribedRadius; the incircle when x0 is the
// incentre), and pick evaluation points away from element edges; a
// sharper treatment of points near ∂Ω (reflected kernels for half-discs)
// is not done here.
//
// # A witness of failure of log-concavity (CertifyMidpoint)
//
// For λ1 simple the ground state φ1 does not change sign: |φ1| ∈ H¹ has
// the same Rayleigh quotient (|∇|φ|| = |∇φ| almost everywhere, Gilbarg and
// Trudinger, Lemma 7.6; the boundary and potential terms only see φ²), so
// it is an eigenfunction of λ1 too, and simplicity gives |φ1| = ±φ1. Take
// φ1 ≥ 0. u = P₁ũ = cφ1, and a certified u(x) > 0 gives c > 0. A log-concave
// function f ≥ 0 on a convex Ω satisfies f((x+y)/2) ≥ √(f(x)f(y)), that is
// f(m)² ≥ f(x)f(y) with m = (x + y)/2 (concavity of log f at the midpoint
// where f(x), f(y) > 0; log f = −∞ is allowed only outside a convex set,
// which then contains m). So one triple with
//
//	u(m)² < u(x)·u(y),  u(x), u(y) > 0,
//
// certified by enclosures, shows that u, hence φ1 = u/c, is not
// log-concave. The three enclosures must be of the same u: the same ũ and
// the same bound E ≥ ‖ũ − P₁ũ‖_{L²(Ω)}, which bounds the error on each of
// the three discs.
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
//	D. Gilbarg and N. S. Trudinger, Elliptic Partial Differential
//	Equations of Second Order, 2nd ed., Springer, 1983 (§2.4, Lemma 7.6,
//	Theorem 8.8; numbering recalled from memory).
//	R. A. Adams and J. J. F. Fournier, Sobolev Spaces, 2nd ed., Academic
//	Press, 2003 (Theorem 4.12; numbering recalled from memory).
package groundstate
