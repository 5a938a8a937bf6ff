// Package tet implements the finite elements of gapcert on tetrahedral
// meshes of a polyhedron, for
//
//	−Δu + V u = λ u in Ω,  u = 0 on Dirichlet faces,
//	∂u/∂n + αu = 0 on Robin faces (α ≥ 0; Neumann for α = 0),
//
// with a(u, v) = ∫∇u·∇v + ∫Vuv + Σ_F α_F ∫_F uv and b(u, v) = ∫uv:
//
//   - Mesh: a view of a mesh of package fem/mesh3 (its proved tiling, node
//     and geometry enclosures, edge and face numbering, boundary faces with
//     their polyhedron face) with the number of faces that carry boundary
//     conditions;
//   - Potential: V held per tetrahedron as a Bernstein polynomial with
//     interval coefficients plus a remainder interval (from the Taylor
//     models formula.Expr.Model3; exact for polynomials of degree ≤ q),
//     with a range enclosure per tetrahedron;
//   - Lagrange: conforming P_p (any p ≥ 1) in the Bernstein basis, for
//     Rayleigh–Ritz upper bounds (RitzMatrices) and float assembly
//     (AssembleApprox) to choose approximate eigenvectors;
//   - Projection: the stage-A spaces CR (Crouzeix–Raviart, face means) and
//     ECR (enriched, P1 + span{|x|²}: face and element means) with the
//     interval matrices of their relaxed forms and the constants of the
//     projection lower bound (see Projection lower bound);
//   - Trial and StageA: the interfaces of package fem/discrete
//     (discretisation.go), with the sparse solvers and verified counts of
//     package enclose/sparse.
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
// bounded by Cauchy–Schwarz. Hypotheses a theorem needs (positive
// orientation of every tetrahedron, V + γ ≥ 0 on every tetrahedron, an
// invertible local ECR DOF matrix, a positive mass bound) are checked and
// reported as errors (*SignError and others), never assumed.
//
// ProjectionConstant returns an upper bound of the constant of (H3), with
// the inequality derived below.
//
// Functions and files named Approx or approx, and Interpolate, Eval and
// EvalLocal, work at round-to-nearest: their results are choices
// (approximate eigenvectors, interpolants, values for pictures), never
// bounds.
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
//
// # Projection lower bound (stage A)
//
// The theorem and its proof are in the doc of package enclose (Projection
// lower bounds; X. Liu, A framework of verified eigenvalue bounds for
// self-adjoint differential operators, Appl. Math. Comput. 267 (2015)
// 341–355): for a form a_h on H + V_h with a_h ≤ a + γb on H and a
// projection P_h: H → V_h with
//
//	(H2) a_h(u − P_h u, v_h) = 0 for every v_h ∈ V_h,
//	(H3) ‖u − P_h u‖ ≤ C_h a_h(u − P_h u, u − P_h u)^(1/2),
//
// λ_k + γ ≥ λ_(h,k)/(1 + C_h² λ_(h,k)), λ_(h,k) the k-th eigenvalue of
// (a_h, b) on V_h. Here are the space-specific steps. H = {u ∈ H¹(Ω):
// u = 0 on Dirichlet faces}, m_S the mean over S, Γ_R the Robin faces
// (α ≥ 0), c_T the lower end of an enclosure of V + γ on T (verified
// ≥ 0, else a *SignError), and the forms, broken over the tetrahedra, are
//
//	CR:  a_h(u, v) = Σ_T (∇u, ∇v)_T + Σ_(F ⊂ Γ_R) α_F |F| m_F(u) m_F(v)   (+ c b(u, v), see CR shift),
//	ECR: a_h(u, v) = Σ_T (∇u, ∇v)_T + Σ_T c_T |T| m_T(u) m_T(v) + Σ_(F ⊂ Γ_R) α_F |F| m_F(u) m_F(v).
//
// On H both are ≤ a + γb (CR without its c term: ≤ the form of −Δ with
// the Robin terms), by Jensen's inequality |S| m_S(u)² ≤ ∫_S u². P_h u is
// the member with the face means (and, for ECR, element means) of u;
// Dirichlet face means of u ∈ H are 0, so e = u − P_h u has zero mean on
// every face of every tetrahedron, and for ECR on every tetrahedron.
//
// (H2). Every v_h of either space has, on each tetrahedron, a constant
// Laplacian and a constant normal derivative on each plane face (CR: ∇v_h
// is constant; ECR adds |x|², with ∇ = 2x, Δ = 6, and x·n constant on a
// plane), so by Green's formula
//
//	∫_T ∇e·∇v_h = −Δv_h ∫_T e + Σ_(F ⊂ ∂T) ∂_n v_h|_F ∫_F e = 0
//
// (for CR Δv_h = 0, so the element mean of e is not needed), and every
// mean term of a_h vanishes on e.
//
// (H3). a_h(e, e) ≥ Σ_T ‖∇e‖²_T (the mean terms are ≥ 0). For ECR, e has
// zero mean on T, and the Poincaré inequality below gives C_T = h_T/π
// (≈ 0.3183 h_T). For CR, on each tetrahedron T (convex, diameter
// h_T, its longest edge; centroid x_c; edge lengths ℓ), split ‖e‖²_T =
// ‖e − m_T(e)‖²_T + |T| m_T(e)²:
//
//   - ‖e − m_T(e)‖_T ≤ (h_T/π) ‖∇e‖_T, the Poincaré inequality for
//     bounded convex domains of any dimension with diameter h_T, the
//     best constant in terms of the diameter alone (L. E. Payne, H. F.
//     Weinberger, An optimal Poincaré inequality for convex domains, Arch.
//     Rational Mech. Anal. 5 (1960) 286–292; its proof in higher
//     dimensions was completed by M. Bebendorf, A note on the Poincaré
//     inequality for convex domains, Z. Anal. Anwend. 22 (2003) 751–756 —
//     volume and pages of both recalled from memory).
//   - div((x − x_c)e) = 3e + (x − x_c)·∇e, and (x − x_c)·n_F is constant
//     on each (plane) face F, so the divergence theorem and the zero face
//     means give 3∫_T e = −∫_T (x − x_c)·∇e. By Cauchy–Schwarz,
//     |T| m_T(e)² = (∫_T e)²/|T| ≤ (1/9)(∫_T |x − x_c|²/|T|) ‖∇e‖²_T.
//     With x − x_c = Σ_i λ_i (v_i − x_c), Σ_i (v_i − x_c) = 0 and
//     ∫_T λ_i λ_j/|T| = (1 + δ_ij)/20, ∫_T |x − x_c|²/|T| = Σ_i |v_i −
//     x_c|²/20 = (Σ_(edges) ℓ²)/80 (the sum of squared distances to the
//     centroid is (1/4) Σ_(i<j) |v_i − v_j|²).
//
// So for CR ‖e‖_T ≤ C_T ‖∇e‖_T with C_T² = h_T²/π² + (Σ ℓ²)/720 ≤ (1/π² +
// 1/120) h_T² (six edges, each ≤ h_T): C_T ≤ 0.3312 h_T. Summing over
// T, ‖e‖² ≤ max_T C_T² Σ_T ‖∇e‖²_T ≤ C_h² a_h(e, e), C_h = max_T C_T
// (ProjectionConstant, from enclosures of the edge lengths, rounded up).
// The same argument in n dimensions gives κ² = 1/π² + 1/(2n(n + 1)(n + 2))
// (n = 2: κ² = 1/π² + 1/48, κ ≈ 0.3495; the constant √(1/j_(1,1)² + 1/48)
// ≈ 0.2984 used for triangles, by C. Carstensen, J. Gedicke, Guaranteed
// lower bounds for eigenvalues, Math. Comp. 83 (2014) 2605–2629, and in
// package fem/tri, replaces h/π by h/j_(1,1), j_(1,1) = 3.8317… the first
// zero of J_1, the mean-zero Poincaré constant of triangles (Laugesen–
// Siudeja), for which no tetrahedral counterpart is used here. We could
// confirm that paper by its abstract but did not see a statement for
// n = 3; the derivation above does not depend on it).
//
// CR shift. CR does not preserve element means, so its form carries one
// constant c = max(0, min_T c_T) (CRShift; c_T the lower end of an
// enclosure of V + γ on T, verified ≥ 0, else a *SignError): the matrices
// of Projection.Matrices are those of a_h + c b. The theorem applied with
// V = 0 and γ = 0 gives f(μ_(h,k)) ≤ λ_k(−Δ + Robin), f(x) = x/(1 + C_h²
// x), μ_(h,k) the eigenvalues of a_h, and min–max with V + γ ≥ c on Ω
// gives λ_k(−Δ + Robin) + c ≤ λ_k + γ. So λ_k + γ ≥ c + f(μ_(h,k)), from
// a verified lower bound of μ_(h,k) + c (package enclose/sparse,
// CountBelow) and the mass bound of Projection.Matrices.
//
// # Raviart–Thomas fluxes on tetrahedra (stage B)
//
// The flux space of the Lehmann–Goerisch bounds on a tetrahedral mesh of
// a polyhedron Ω is the Raviart–Thomas space RT_k ⊂ H(div; Ω), k ≥ 0
// (P.-A. Raviart, J.-M. Thomas, A mixed finite element method for 2nd
// order elliptic problems, Springer LNM 606, 1977; J.-C. Nédélec, Mixed
// finite elements in R³, Numer. Math. 35 (1980) 315–341; D. Boffi,
// F. Brezzi, M. Fortin, Mixed Finite Element Methods and Applications,
// Springer, 2013, §2.3.1; its section numbers here are recalled from
// memory).
//
// Reference element. T̂ has the vertices ξ_0 = 0, ξ_1 = e_1, ξ_2 = e_2,
// ξ_3 = e_3, barycentric λ_0 = 1 − ξ − η − ζ, λ_1 = ξ, λ_2 = η, λ_3 = ζ, and
//
//	RT_k(T̂) = P_k³ + x P̃_k,   dim = (k + 1)(k + 2)(k + 4)/2,
//
// P̃_k the homogeneous polynomials of degree k. Its members have components
// of degree ≤ k + 1 (kept in Bernstein form of degree n = k + 1),
// divergence in P_k, and on each face a normal component in P_k (the part
// x·h, h ∈ P̃_k, has x·ν̂ = const·h on a face, the constant being 0 on the
// faces through the origin). Local face i is the face opposite vertex i,
// with its vertices in increasing local order, and ν̂_i is its outward
// normal times twice its area: ν̂_0 = (1, 1, 1), ν̂_1 = −e_1, ν̂_2 = −e_2,
// ν̂_3 = −e_3.
//
// Basis. For a face F = {a < b < c} the Whitney field
//
//	φ_F = 2(λ_a ∇λ_b × ∇λ_c + λ_b ∇λ_c × ∇λ_a + λ_c ∇λ_a × ∇λ_b)
//
// lies in RT_0 = {u + s x : u ∈ R³, s ∈ R}, its normal component vanishes
// on the other three faces, and on F it is constant (the trace property of
// Whitney forms: D. N. Arnold, R. S. Falk, R. Winther, Finite element
// exterior calculus, homological techniques, and applications, Acta
// Numer. 15 (2006) 1–155, §4; here checked exactly for the four faces of
// T̂, rtWhitneyFlux). For q ∈ P_k, q φ_F ∈ RT_k: with φ_F = u + s x and
// q = q_< + q_k, q_k homogeneous of degree k, q u + s q_< x ∈ P_k³ and
// s q_k x ∈ x P̃_k. The basis of RT_k is that of Arnold, Falk and Winther
// (Geometric decompositions and local bases for spaces of finite element
// differential forms, Comput. Methods Appl. Mech. Engrg. 198 (2009)
// 1660–1672, §9: λ^α φ_σ with |α| = k and α_i = 0 for i < min σ), in the
// Bernstein scaling B^k_α = C(k, α) λ^α:
//
//   - face functions: for face i and a multi-index β of degree k over its
//     vertices, B^k_α φ_F/(φ_F·ν̂_i), α = β on F and α_i = 0. Its flux
//     density σ̂·ν̂_i is B^k_β on face i, and 0 on the other faces;
//   - interior functions: B^k_α φ_F with F the face opposite vertex c + 1,
//     c = 0, 1, 2, and α = γ + e_(c+1), |γ| = k − 1. The factor λ_(c+1)
//     vanishes on F, so the normal component is 0 on all of ∂T̂.
//
// Their number, 4(k + 1)(k + 2)/2 + 3k(k + 1)(k + 2)/6 = (k + 1)(k + 2)(k +
// 4)/2, is dim RT_k, and they are independent (Arnold–Falk–Winther 2009;
// tested exactly against the basis dual to the classical degrees of
// freedom for k ≤ 3, and by the rank modulo a prime for k ≤ 12). The
// degrees of freedom are therefore the coefficients in this basis: on
// face i the degree-k Bernstein coefficients of the flux density
// g_i = σ̂·ν̂_i, inside the coefficients of the interior functions. Since
// B^k_α λ_a = (α_a + 1)/(k + 1) · B^(k+1)_(α+e_a), every Bernstein
// coefficient of degree n = k + 1 is a small rational: the basis is kept,
// scaled to integers (rtRef), as the coefficients of its three components
// and of its divergence, and rtBasisRat checks every normal trace exactly.
// Unlike a basis dual to interior moments, whose coefficients grow with k
// (to 5e10 at k = 11, with cancellation of 4e6 in the float mass matrix),
// these coefficients stay small (for k ≤ 12 at most 24 in the components
// and 364 in the divergence, after scaling), so the float
// matrices of the flux choice keep their accuracy at high degree.
//
// Piola transform. A tetrahedron T with vertices v_0, …, v_3 is x = v_0 +
// Jξ, J = [v_1 − v_0, v_2 − v_0, v_3 − v_0], det J = 6|T| > 0 (positive
// orientation, verified from the enclosures: NewFlux). A member of RT_k(T)
// is σ(x) = J σ̂(ξ)/det J. Then div σ = (div̂ σ̂)/det J (Boffi–Brezzi–Fortin
// 2013, §2.1.3; by the chain rule, div σ = Σ_(a,c) ∂_a(J_(ac) σ̂_c)/det J =
// Σ_(a,c,b) J_(ac) (J⁻¹)_(ba) ∂̂_b σ̂_c/det J = div̂ σ̂/det J), and for a
// face with vertices A, B, C (images of
// Â, B̂, Ĉ) the cofactor identity (Ja) × (Jb) = det J · J^(−T)(a × b),
// valid for every 3×3 matrix J, gives
//
//	ν = (B − A) × (C − A) = det J · J^(−T) ν̂,   ν̂ = (B̂ − Â) × (Ĉ − Â),
//	σ(x)·ν = (J σ̂/det J)·(det J J^(−T) ν̂) = σ̂(ξ)·ν̂
//
// at corresponding points, exactly. With det J > 0 the map keeps outward
// normals outward, so the flux density σ·ν_i of the physical face i
// (outward normal times twice the area) is the reference one: its
// Bernstein coefficients are the face DOFs.
//
// Conformity (H(div)). A face of the mesh with global vertex numbers
// a < b < c has the global normal ν_F = (P_b − P_a) × (P_c − P_a) and its
// global DOFs are the degree-k Bernstein coefficients of σ·ν_F in the
// barycentric coordinates of (P_a, P_b, P_c). In a cell, local face i with
// vertices j_1 < j_2 < j_3 has (P_(j_2) − P_(j_1)) × (P_(j_3) − P_(j_1)) =
// (−1)^i ν_i: the oriented boundary of the positively oriented simplex
// [v_0, v_1, v_2, v_3] is Σ_i (−1)^i [v_0, …, v̂_i, …, v_3], and the term
// i = 0, [v_1, v_2, v_3], is outward (on T̂, (ξ_2 − ξ_1) × (ξ_3 − ξ_1) =
// (1, 1, 1)). The cross product (B − A) × (C − A) is alternating in
// (A, B, C), so ν_F = sgn(π)(−1)^i ν_i, π the permutation that sorts the
// global numbers of (j_1, j_2, j_3). Hence σ·ν_i = s σ·ν_F with
// s = sgn(π)(−1)^i, and the local DOF of a multi-index is s times the
// global DOF of the multi-index that gives each vertex of the face the
// same exponent (the same Bernstein polynomial on the face). The two cells of
// an interior face therefore have normal traces σ·ν_F that are the same
// polynomial on the face (the same exact values of the global DOFs), the
// normal component is continuous across every interior face, and the
// piecewise field lies in H(div; Ω): for φ ∈ C_c^∞(Ω), Green's formula on
// each cell gives ∫_Ω σ·∇φ = Σ_T (−∫_T φ div σ + ∫_∂T φ σ·n_T), the face
// integrals cancel in pairs (σ·n_T = −σ·n_T′ on the face shared by T and
// T′) and φ = 0 on ∂Ω, so the weak divergence of σ is its cellwise
// divergence, in L²(Ω) (Boffi–Brezzi–Fortin 2013, §2.1). This is
// combinatorial: it holds for the exact mesh inside the vertex enclosures
// and any float coefficients, given positive orientation.
//
// Boundary. On a boundary face where the flux must vanish (Neumann, or
// Robin with α not verified > 0: fem/boundary, Condition.FluxFree) the
// face DOFs are removed (exactly 0), so σ·n = 0 there. On Dirichlet faces
// they are free, on Robin faces with α > 0 they are free and enter the
// norm with the weight 1/α.
//
// Lehmann–Goerisch. With c = V + γ_B verified > 0, M(u, v) = a(u, v) +
// γ_B b(u, v), X = L²(Ω)³ × L²(Ω) × L²(Γ_R) and Tu = (∇u, √c u,
// √α u|_(Γ_R)), (Tu, Tv)_X = M(u, v). For a trial function ũ ∈ H and a
// flux σ put w = (σ, (ũ + div σ)/√c, −(σ·n)/√α on Robin faces with α > 0,
// 0 elsewhere). Green's formula ∫_Ω ∇φ·σ + ∫_Ω φ div σ = ∫_∂Ω φ σ·n (for
// φ ∈ H¹(Ω), σ ∈ H(div; Ω) with a piecewise polynomial normal trace)
// gives, for every φ ∈ H,
//
//	(Tφ, w)_X = ∫∇φ·σ + ∫φ div σ + ∫φũ − ∫_(Γ_R, α>0) φ σ·n = b(φ, ũ),
//
// because on the rest of ∂Ω either φ = 0 (Dirichlet) or σ·n = 0. That is
// the hypothesis of the Lehmann–Goerisch theorem (package temple), and
// Flux.LGMatrix encloses
//
//	A2_ij = (w_i, w_j)_X = (σ_i, σ_j) + ((ũ_i + div σ_i)/c, ũ_j + div σ_j) + Σ_(F ⊂ Γ_R, α_F > 0) ∫_F (σ_i·n)(σ_j·n)/α_F.
//
// The weight 1/c enters per cell as a Bernstein polynomial Q plus a
// remainder interval R (FluxWeight), and the term with R is bounded by
// Cauchy–Schwarz, |∫(R − r_mid) f g| ≤ r_rad ‖f‖‖g‖ (package
// fem/internal/bernstein, Remainders). For V = 0 the weight is the
// constant 1/γ_B enclosed (FluxConstantWeight); a potential V ≠ 0 needs
// a FluxWeight from the trial side's model of 1/(V + γ_B).
//
// The flux is chosen (Flux.ChooseApprox) by the normal equations of
// ‖w‖²_X over RT_k, a plain sparse solve in floating point: a choice, any
// σ is admissible in LGMatrix. Flux.Indicators measures per cell how far
// the fluxes are from ∇ũ_i/Λ_i (a choice, for refinement).
//
// Guarantees and inputs. Flux.LGMatrix encloses, entry by entry, A2 for
// the exact mesh (every exact vertex inside its enclosure), the exact
// functions given by the float coefficients of the fluxes and of the
// trial functions, and every exact value inside the enclosures of α and
// of the weight model. The integrals are exact on each cell: the fields
// are in Bernstein form in the barycentric coordinates, and products,
// divergences, elevations and integrals are exact rational identities
// (raviart_tables.go), evaluated in outward rounded interval arithmetic
// from tables enclosed from math/big; the reference coefficients are
// combined with the float coefficients by error-free transformations
// (fluxExactCombination). What the code checks: positive orientation of
// every cell (det J > 0 from the enclosures, else a
// *FluxOrientationError), a bounded weight model, γ_B > 0 for V = 0.
// What the caller supplies and the doc of each input states: the cells (RTCell: vertex enclosures,
// global vertex and face numbers; the tiling of Ω is the mesh's proof),
// the boundary conditions of the boundary faces, a trial space on the
// same cells (FluxTrial: exact Bernstein coefficients per cell) and a
// weight that encloses 1/(V + γ_B) (FluxWeight). Functions named Approx
// work at round-to-nearest: their results are choices, never bounds.
package tet
