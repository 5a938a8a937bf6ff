// Package line implements the one-dimensional finite elements of gapcert:
// meshes of an interval with enclosed nodes, potentials held as cell-wise
// models, the conforming Lagrange spaces P_p used for Rayleigh–Ritz upper
// bounds, the mean-preserving P2 space used for projection lower bounds,
// and the flux space used by the Lehmann–Goerisch bounds, for
//
//	−u'' + V u = λ u on (a, b),  at each end u = 0 (Dirichlet) or
//	∂u/∂n + αu = 0 (Robin, α ≥ 0; Neumann for α = 0),
//
// with a(u, v) = ∫u'v' + ∫Vuv + α_L u(a)v(a) + α_R u(b)v(b), b(u, v) = ∫uv.
//
// Guarantees. Every matrix this package returns as an interval matrix
// (RitzMatrices, MeanP2.Matrices, Flux.LGMatrix) encloses, entry by entry, the
// exact forms for the exact mesh, the exact functions defined by the given
// float64 coefficients, and every exact value of the inputs inside their
// enclosures (nodes, α, γ, potential models). The integrals are exact on
// each cell: functions are restricted to the reference cell [0, 1] in
// Bernstein form, whose products, derivatives and integrals are exact
// rational identities (tables.go), computed in outward-rounded interval
// arithmetic (package interval) from tables enclosed from math/big. The
// non-polynomial part of a potential is carried as a remainder interval and
// bounded by Cauchy–Schwarz. Hypotheses that a theorem needs (V + γ ≥ 0 or
// > 0 on every cell, a positive mass bound) are checked and reported as
// errors, never assumed.
//
// Potentials come from formula Taylor models (FromExpr), from exact
// polynomials (PolynomialPotential) or any ModelFunc; the Lehmann–Goerisch
// weight 1/(V + γ) is derived from them with a verified remainder
// (InverseShifted, InverseShiftedExpr), and Flux.LGMatrix accepts only such a
// weight for the same V and γ.
//
// Functions and files named Approx, approx or choose work at round-to-
// nearest. Their results are choices (approximate eigenvectors, fluxes,
// interpolants), never bounds.
//
// # Remainders
//
// Where a potential (or the weight 1/(V + γ)) is carried on a cell as a
// polynomial P plus a remainder interval R = [r_mid − r_rad, r_mid + r_rad]
// (V(x) − P(x) ∈ R for every x of the cell), the integrals split as
//
//	∫ V u v = ∫ (P + r_mid) u v + ∫ (V − P − r_mid) u v,   |∫ (V − P − r_mid) u v| ≤ r_rad ‖u‖ ‖v‖,
//
// because |V − P − r_mid| ≤ r_rad pointwise and ∫ |uv| ≤ ‖u‖ ‖v‖
// (Cauchy–Schwarz). The first integral is exact (Bernstein products); the
// second is enclosed by ±r_rad ‖u‖ ‖v‖ with the norms from exact Gram
// matrices, rounded up (RemainderBound of package fem/internal/bernstein).
//
// # Projection lower bound (stage A)
//
// MeanP2 carries the relaxed form
//
//	a_lo(u, v) = Σ_T (u', v')_T + Σ_T c_T |T| m_T(u) m_T(v) + α_L u(a)v(a) + α_R u(b)v(b),
//
// c_T the lower end of an enclosure of V + γ on the cell T, verified ≥ 0
// (else a *SignError). By Jensen's inequality |T| m_T(u)² ≤ ∫_T u², so
// a_lo(u, u) ≤ a(u, u) + γ‖u‖² on H = {u ∈ H¹(a, b): u = 0 at Dirichlet
// ends}, and λ_k + γ ≥ λ_k(a_lo). The space V_h (continuous piecewise
// quadratics, degrees of freedom the nodal values and the cell means) is
// conforming, a_h = a_lo, and P_h u is the member with the nodal values
// and cell means of u. The error e = u − P_h u vanishes at every node and
// has zero mean on every cell, which gives
//
//	(H2) a_lo(e, v_h) = Σ_T ∫_T e'v_h' = Σ_T ([e v_h']_∂T − v_h″ ∫_T e) = 0
//
// (v_h″ is constant on T; the mean and end terms vanish with m_T(e) and
// e(a), e(b)), and
//
//	(H3) ‖e‖ ≤ C_h ‖e'‖ = C_h a_lo(e, e)^(1/2),   C_h = h_max/(2π),
//
// since on a cell of length h every e ∈ H¹ with zero end values and zero
// mean has ∫e'² ≥ (2π/h)² ∫e² (the least eigenvalue of −e″ = μe + κ with
// these constraints; the derivation is in the MeanP2 doc). The theorem
// and its proof (package enclose, Projection lower bounds) then give
// λ_k + γ ≥ λ_(h,k)/(1 + C_h² λ_(h,k)), evaluated by enclose.ProjectionLower
// from a verified count (band.Counter) with the mass bound of
// MeanP2.Matrices (package enclose/band, Mass bounds).
//
// # Lehmann–Goerisch fluxes (stage B)
//
// With c = V + γ verified > 0 on every cell (InverseShifted), the shifted
// form M(u, v) = a(u, v) + γ b(u, v) is an inner product on H, and
// Λ_k = λ_k + γ. Let X = L²(a, b) × L²(a, b) × ℝ^r (one component for each
// of the r Robin ends, α ≥ 0) and Tu = (u', √c u, (√α u(e))_e), so
// (Tu, Tv)_X = M(u, v).
// For a trial function ũ ∈ H and a flux σ ∈ H¹(a, b) with σ = 0 at every
// end that is neither Dirichlet nor Robin with α verified > 0 (Flux),
// put, with n = −1 at a and +1 at b,
//
//	w = (σ, (ũ + σ')/√c, (−σ(e)n_e/√α_e at Robin ends with α_e > 0, else 0)).
//
// For every φ ∈ H, integrating φσ' by parts,
//
//	(Tφ, w)_X = ∫φ'σ + ∫φσ' + ∫φũ − Σ_(α_e > 0) φ(e)σ(e)n_e
//	          = ∫φũ + Σ_(all ends) φ(e)σ(e)n_e − Σ_(α_e > 0) φ(e)σ(e)n_e = b(φ, ũ),
//
// because the remaining end terms have φ(e) = 0 (Dirichlet) or σ(e) = 0
// (the other ends). This is the hypothesis (Tφ, w_i)_X = b(φ, ũ_i) of the
// Lehmann–Goerisch theorem (package temple) for every σ_i of the space;
// RitzMatrices encloses
//
//	A0 = M(ũ_i, ũ_j),  A1 = b(ũ_i, ũ_j),
//
// and Flux.LGMatrix encloses
//
//	A2 = (w_i, w_j)_X = ∫σ_iσ_j + ∫(ũ_i + σ_i')(ũ_j + σ_j')/c + Σ_(α_e > 0) σ_i(e)σ_j(e)/α_e.
//
// For an exact eigenpair (u, Λ), σ = u'/Λ gives w = Tu/Λ (as −u″ + cu = Λu
// and u' n = −αu at Robin ends), which has the least ‖w‖_X among all w
// satisfying the identity for ũ = u; MinimizeApprox chooses σ by a
// least-squares solve. The choice of σ affects only sharpness.
//
// References:
//
//	X. Liu, A framework of verified eigenvalue bounds for self-adjoint
//	differential operators, Appl. Math. Comput. 267 (2015) 341–355.
//	H. Behnke, F. Goerisch, Inclusions for eigenvalues of selfadjoint
//	problems, in: J. Herzberger (ed.), Topics in Validated Computations,
//	Elsevier, 1994, 277–322.
//	T. Vejchodský, Flux reconstructions in the Lehmann–Goerisch method for
//	lower bounds on eigenvalues, arXiv:1801.02561 (2018).
package line
