// Package tet implements the finite elements of gapcert on tetrahedral
// meshes of a polyhedron, for
//
//	−Δu + V u = λ u in Ω,  u = 0 on Dirichlet faces,
//	∂u/∂n + αu = 0 on Robin faces (α ≥ 0; Neumann for α = 0),
//
// with a(u, v) = ∫∇u·∇v + ∫Vuv + Σ_F α_F ∫_F uv and b(u, v) = ∫uv:
//
//   - Mesh: what the spaces need of a conforming tetrahedral mesh (node
//     enclosures, tetrahedra, boundary faces with their polyhedron face),
//     checked (positive orientation verified, faces shared by at most two
//     tetrahedra, the faces of one tetrahedron exactly the boundary faces),
//     with the global edge and face numbering and interval geometry;
//   - Potential: V held per tetrahedron as a Bernstein polynomial with
//     interval coefficients plus a remainder interval (from the Taylor
//     models formula.Expr.Model3; exact for polynomials of degree ≤ q),
//     with a range enclosure per tetrahedron;
//   - Lagrange: conforming P_p (any p ≥ 1) in the Bernstein basis, for
//     Rayleigh–Ritz upper bounds (RitzMatrices) and float assembly
//     (AssembleApprox) to choose approximate eigenvectors.
//
// Guarantees. Every interval matrix this package returns encloses, entry
// by entry, the exact forms for the exact mesh (every exact node inside
// its enclosure), the exact functions defined by the given float64
// coefficients, and every exact value of the inputs inside their
// enclosures (α, γ, potential models). The integrals are exact on each
// tetrahedron: functions are in Bernstein form in the barycentric
// coordinates, whose products, gradients and integrals are exact rational
// identities (tables.go, Lagrange.RitzMatrices), evaluated in outward
// rounded interval arithmetic (package interval) from tables enclosed from
// math/big. The non-polynomial part of V is carried as a remainder and
// bounded by Cauchy–Schwarz.
//
// Functions named Approx work at round-to-nearest: their results are
// choices (approximate eigenvectors), never bounds.
//
// # Remainders
//
// Where V is carried on a tetrahedron T as a polynomial P plus a remainder
// interval R = [r_mid − r_rad, r_mid + r_rad] (V(x) − P(x) ∈ R for every
// x ∈ T), the integrals split as
//
//	∫_T V u v = ∫_T (P + r_mid) u v + ∫_T (V − P − r_mid) u v,   |∫_T (V − P − r_mid) u v| ≤ r_rad ‖u‖_T ‖v‖_T,
//
// because |V − P − r_mid| ≤ r_rad pointwise and ∫_T |uv| ≤ ‖u‖_T ‖v‖_T
// (Cauchy–Schwarz); the first integral is exact (Bernstein products), the
// second is enclosed by ±r_rad ‖u‖_T ‖v‖_T with the norms from exact Gram
// matrices (RemainderBound of package fem/internal/bernstein).
package tet
