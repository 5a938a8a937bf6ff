// Package certify runs the certification pipeline on a problem and writes a
// certificate, and re-checks a certificate by recomputing it.
//
// For a problem −u″ + Vu = λu on an interval (Dirichlet or Robin at each
// end; Robin with α = 0 is Neumann) the pipeline is, with a shift γ chosen
// so that c = V + γ ≥ π²/D² > 0 on the domain and Λ_k = λ_k + γ:
//
//  1. Upper bounds (Rayleigh–Ritz, min–max): approximate eigenvectors of the
//     conforming P_p pencil are chosen in floating point; the N×N matrices
//     a(u_i,u_j) + γ b(u_i,u_j) and b(u_i,u_j) are enclosed in interval
//     arithmetic, and the eigenvalues of that interval pencil bound Λ_1..Λ_N
//     from above (Courant–Fischer; see package enclose).
//  2. Lower bounds, stage A (projection bound of Liu 2015, METHODS §5): the
//     mean-preserving P2 space with the relaxed potential c_T ≤ inf_T(V+γ),
//     verified inertia counts of the discrete pencil (package enclose/band),
//     and Λ_k ≥ λ_{h,k}/(1 + C_h²λ_{h,k}) with C_h = h_max/(2π). Valid for
//     every index, clusters included.
//  3. Lower bounds, stage B (Lehmann–Goerisch, METHODS §6, package temple):
//     with N chosen so that the stage-A lower bound ρ̂ of Λ_{N+1} exceeds the
//     Ritz upper bound of Λ_N, trial functions from step 1 and fluxes σ_i in
//     continuous P_q chosen by a least-squares solve.
//
// On a polygon the same three stages use conforming Bernstein P_p on a
// triangle mesh of the exact polygon, (enriched) Crouzeix–Raviart elements
// for stage A and Raviart–Thomas fluxes for stage B, which has its own
// shift γ_B ≥ γ (ρ̂ and its bounds are converted between the shifts with
// directed rounding). The trial mesh is refined uniformly, graded toward
// singular corners and refined adaptively there (the marks are recorded).
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
// Check recomputes a certificate from its recorded problem and method with
// the same deterministic code and demands that every recorded bound be
// reproduced digit for digit, that the problem hash match, and that the
// claims be re-evaluated to the same verdicts. Of the refinement record it
// verifies what the recorded step determines: "target reached" exactly when
// the recomputed widths meet the target, and a refinement cap or a missing
// separation on the recorded step.
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
