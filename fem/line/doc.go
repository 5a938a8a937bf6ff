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
// (RitzMatrices, MeanP2.Matrices, LGMatrices) encloses, entry by entry, the
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
// (InverseShifted, InverseShiftedExpr), and LGMatrices accepts only such a
// weight for the same V and γ.
//
// Functions and files named Approx, approx or choose work at round-to-
// nearest. Their results are choices (approximate eigenvectors, fluxes,
// interpolants), never bounds.
package line
