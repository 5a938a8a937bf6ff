// Package certify runs the certification pipeline on a problem and writes a
// certificate, and re-checks a certificate by recomputing it.
//
// For a problem −u″ + Vu = λu on an interval (Dirichlet or Robin at each
// end; Robin with α = 0 is Neumann) the pipeline is, with a shift γ chosen
// so that c = V + γ ≥ π²/D² > 0 on the domain (γ < 0 when V is bounded
// below by more than π²/D²) and Λ_k = λ_k + γ:
//
//  1. Upper bounds (Rayleigh–Ritz, min–max): approximate eigenvectors of the
//     conforming P_p pencil are chosen in floating point; the N×N matrices
//     a(u_i,u_j) + γ b(u_i,u_j) and b(u_i,u_j) are enclosed in interval
//     arithmetic, and the eigenvalues of that interval pencil bound Λ_1..Λ_N
//     from above (Courant–Fischer; see package enclose).
//  2. Lower bounds, stage A (projection bound of Liu 2015, proved in the doc
//     of package enclose; the space in the doc of package fem/line): the
//     mean-preserving P2 space with the relaxed potential c_T ≤ inf_T(V+γ),
//     verified inertia counts of the discrete pencil (package enclose/band),
//     and Λ_k ≥ λ_{h,k}/(1 + C_h²λ_{h,k}) with C_h = h_max/(2π). Valid for
//     every index, clusters included.
//  3. Lower bounds, stage B (Lehmann–Goerisch, proved in the doc of package
//     temple; fluxes in the doc of package fem/line):
//     with N chosen so that the stage-A lower bound ρ̂ of Λ_{N+1} exceeds the
//     Ritz upper bound of Λ_N, trial functions from step 1 and fluxes σ_i in
//     continuous P_q chosen by a least-squares solve.
//
// On a polygon the same three stages use conforming Bernstein P_p on a
// triangle mesh of the exact polygon, (enriched) Crouzeix–Raviart elements
// for stage A and Raviart–Thomas fluxes for stage B, which has its own
// shift γ_B ≥ γ (ρ̂ and its bounds are converted between the shifts with
// directed rounding). The trial mesh is refined uniformly, graded toward
// singular corners (each by a depth from its exponent; the stage-A mesh
// by its own rule) and refined adaptively there (the marks are recorded);
// near singular corners the driver chooses the kind of each step by its
// measured gain per second (polygon_steps.go).
//
// The enclosure of λ_k is [max(stage A, stage B) − γ, Ritz − γ]; the gap
// λ₂ − λ₁ is enclosed by [ℓ₂ − u₁, u₂ − ℓ₁]. The driver refines the mesh and
// the degree until the requested relative width is met or no step can help
// within the budget, and records in the certificate's method the target,
// why refinement stopped (Refinement, the Stop constants) and each
// enclosure's widths (Width). A run can be cancelled through its context;
// it then returns the best verified step.
//
// A thin polygon starts from a mesh with extra vertices on its long sides
// (exact points A + (j/k)(B − A) of its sides, enclosed), triangulated by
// clipping the best-shaped ears; mesh.FromPolygon proves that the
// triangles tile the polygon, so this, like every mesh, is only a choice.
//
// A product of intervals and polygons with a separable potential
// (package fem/problem) is certified by separation of variables
// (product.go): each factor is certified as a lone problem with its part
// of the potential, the product's λ_k are order statistics of the sums of
// the factors' enclosures, decided by a lower bound of every sum left out
// (proof.ProductSums: the theorem and its proof), and the gap is the
// least of the factors' gaps (proof.ProductGap). The factors' eigenvalue
// counts come from a coarse first pass, their targets from the product's
// target and the sizes of their eigenvalues (choices). The product's
// certificate embeds every factor's certificate in its method
// (ProductMethod); Check re-verifies each of them by recomputation and
// recomputes the combination. A product of two intervals whose potential
// does not separate is certified as its rectangle, a polygon.
//
// Check reads a certificate strictly (package strictjson: no repeated or
// case-variant keys, no unknown keys, at every depth, the method and the
// embedded reference certificates included), recomputes it from its
// recorded problem and method with the same deterministic code and
// demands that the recorded results, claims and method equal the
// recomputed ones field for field, that the problem be written in its
// canonical form and its hash match. Of the refinement record
// (method.refinement) it verifies what the recorded step determines:
// "target reached" exactly when the recomputed widths meet the target,
// and a refinement cap or a missing separation on the recorded step; the
// other stop reasons (time, memory, stalled widths, an interrupt) are
// records of the run, accepted when the recomputed widths miss the target.
//
// # Where things are
//
// The proving side is package certify/proof: what is enclosed and by
// which theorem (Ritz upper bounds, count-to-bound, projection bounds,
// Lehmann–Goerisch with the shift conversions, the enclosures of λ_k). It
// holds no choices; the interval matrices it is given come from the
// element packages through the interfaces of package fem/discrete
// (fem/line and fem/tri, files discretisation.go), whose interval sides
// carry their own guarantees.
//
// The method is written once: compute.go runs the stages of one
// computation, stagea.go places the shifts of the verified stage-A counts
// (the discretisation's ShiftSearch, spectrum slicing), loop.go is the
// refinement loop of Certify. Every choice of a dimension is in its
// discretisation: interval.go (meshes with kink nodes, the interval
// refinement rule), polygon.go, polygon_refine.go and polygon_steps.go
// (first mesh, singular corners and their exponents, grading, Dörfler
// marks, extra indices, the polygon refinement rule and the choice of
// steps by gain per second), thin.go (first meshes of thin polygons). recipe.go
// chooses the first recipe and the shifts, memory.go estimates memory,
// result.go and certificate.go write the results, check.go re-checks.
//
// # Stage B and its shift
//
// Stage B needs ρ̂ ≤ Λ_(N+1). N is an index ≥ the requested count m
// whose stage-A lower bound ρ̂ of Λ_(N+1) exceeds the Ritz upper bound of
// Λ_N (chooseN); ρ̂ ≤ Λ_(N+1) holds by stage A. chooseN starts from the
// least such index and raises N by at most 2 to a separating index whose
// amplification Λ_m/(ρ̂ − Λ_m) of λ_m's error is at most half as large,
// when that factor exceeds 2 (a close Λ_(N+1), such as the third
// eigenvalue of a domain whose λ_2 is double, costs digits otherwise). The separation ρ̂ > Λ_N,
// which the theorem does not need, lets all N bounds appear (at most as
// many pencil eigenvalues μ_i are negative as there are Λ_k below ρ̂) and
// keeps ρ̂ away from Λ_1..Λ_N, near which the Lehmann matrix is nearly
// singular (its positive definiteness is verified, package temple). It
// also gives Λ_N < Λ_(N+1), so no multiple eigenvalue is split between the
// indices N and N + 1.
//
// N is sought among the indices bounded: the requested m and the method's
// extra_indices more (Ritz upper bounds of Λ_1..Λ_(m+extra), stage-A
// lower bounds of Λ_1..Λ_(m+extra+1)); 3 by default. A thin polygon has a
// cluster whose spacings are below the stage-A deficit for many indices
// (the 1:200 rectangle: λ_k = π²(1 + k²/200²), spacing (2k + 1)π²/200²,
// relative 10⁻⁴ at k = 1 against a stage-A deficit of 5·10⁻³ at 1.5·10⁵
// unknowns), so the polygon driver raises extra_indices, up to 64, to
// the count its floating-point extrapolation of the bounds predicts
// (neededExtra), and records it; Check replays it. Past the first m + 4
// indices the stage-A bounds come from spectrum slicing (sliceStageA):
// the verified count of the stage-A pencil at a shift σ, at most n
// eigenvalues below σ′, gives λ_(h,j) ≥ σ′ for every j ≥ n + 1, and
// λ_(h,j) ≥ λ_(h,i) for j ≥ i; each index keeps the largest bound so
// found. These are the same verified counts as for the first indices,
// only at other shifts, so ρ̂ ≤ Λ_(N+1) holds as before.
//
// On polygons stage B uses its own shift γ_B (the certificate's
// flux_gamma), so it bounds Λ^B_k = λ_k + γ_B. The stage-A bound ρ̂ of
// λ_(N+1) + γ and the stage-B bounds ℓ_k of Λ^B_k are converted with
// directed rounding, γ and γ_B being exact floats (↓ rounds down):
//
//	ρ̂_B = ((ρ̂ − γ)↓ + γ_B)↓ ≤ (λ_(N+1) + γ − γ) + γ_B = Λ^B_(N+1),
//	((ℓ_k − γ_B)↓ + γ)↓ ≤ (λ_k + γ_B − γ_B) + γ = λ_k + γ,
//
// since each rounded-down result is ≤ the exact result of its rounded
// inputs and + and − are monotone. The matrices A0, A1 are enclosed afresh
// with γ_B, and the weight 1/(V + γ_B) requires V + γ_B > 0 verified on
// every triangle (fem/tri InverseShifted; an error otherwise). These are
// the only hypotheses: any γ_B with V + γ_B > 0 is sound.
//
// The value of γ_B is a choice, not a consequence of a theorem. It is
// γ_B = max(γ, 2·osc V − inf V) rounded up (roundShift), osc V = sup V −
// inf V taken from enclosures over the domain, so that V + γ_B ≥ 2·osc V
// on Ω (when osc V is finite and positive; else γ_B = γ). Heuristic
// reason, not a proof: on each triangle the weight is a Taylor model of 1/(V +
// γ_B) (package interval/formula); around the value c_0 = V(x_0) + γ_B at
// the expansion point, 1/(c_0 + δ) = Σ_n (−δ)^n/c_0^(n+1) with δ = V −
// V(x_0), |δ| ≤ osc V, so the ratio |δ|/c_0 ≤ 1/2 and the Taylor
// coefficients and the remainder shrink geometrically even on the coarsest
// mesh, where a triangle may see all of osc V. With the small γ of stage A
// (c_0 down to π²/D², possibly far below osc V) the ratio can exceed 1 and
// the remainders grow with the order until the mesh is fine. Stage A keeps
// the small γ because the projection bound loses accuracy with C_h²(λ + γ).
// The rule was chosen from measurements (recorded beside initialRecipe),
// not derived.
//
// References:
//
//	X. Liu, A framework of verified eigenvalue bounds for self-adjoint
//	differential operators, Appl. Math. Comput. 267 (2015) 341–355.
//	H. Behnke, F. Goerisch, Inclusions for eigenvalues of selfadjoint
//	problems, in: Topics in Validated Computations, Elsevier, 1994, 277–322.
//	R. Courant, D. Hilbert, Methods of Mathematical Physics, vol. I, 1953
//	(min–max principle).
package certify
