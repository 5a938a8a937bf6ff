// Package proof holds the proving side of a gapcert certificate: the
// functions that turn verified matrices and verified eigenvalue counts
// into the certified one-sided bounds of the shifted eigenvalues
// Λ_k = λ_k + γ and into the enclosures of λ_k. It contains no choices:
// meshes, approximate eigenvectors, shifts, fluxes and the index N enter
// only as inputs (exact floats or finished interval matrices), and each
// function's guarantee holds for every such input.
//
// A certificate of an eigenvalue λ_k of −Δ + V rests on four results,
// each applied in one function here:
//
//   - min–max principle (Courant–Fischer): RitzUpper;
//   - Sylvester's law of inertia, through the verified counts of a
//     discrete pencil (package enclose, Counter): CountLower and
//     SliceLower;
//   - the projection bound of Liu (2015) (package enclose, Projection
//     bounds): ProjectionLower;
//   - the Lehmann–Goerisch theorem (package temple), with the shift
//     conversions of its own shift γ_B: StageB;
//
// and Enclose combines them: λ_k ∈ [max(stage A, stage B) − γ, Ritz − γ],
// all with directed rounding (package interval). On a product domain with
// a separable problem, ProductSums and ProductGap combine the certified
// enclosures of the factors (separation of variables; order statistics of
// the sums with a lower bound of every sum left out; the least factor
// gap), each proved in its doc comment.
//
// References:
//
//	R. Courant, D. Hilbert, Methods of Mathematical Physics, vol. I, 1953
//	(min–max principle).
//	X. Liu, A framework of verified eigenvalue bounds for self-adjoint
//	differential operators, Appl. Math. Comput. 267 (2015) 341–355.
//	H. Behnke, F. Goerisch, Inclusions for eigenvalues of selfadjoint
//	problems, in: Topics in Validated Computations, Elsevier, 1994, 277–322.
package proof
