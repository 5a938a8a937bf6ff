// Package enclose implements verified eigenvalue enclosures of small dense
// symmetric interval matrix pencils.
//
// A pencil is a pair ([A], [B]) of symmetric interval matrices (Sym); it
// stands for every pair (A, B) of real symmetric matrices with entries in
// the intervals. Every count and every bound this package returns holds for
// each member (A, B) with B positive definite, not only for the midpoints:
//
//   - CountBelow returns #{μ : Ax = μBx, μ < τ}, decided by interval
//     symmetric Gaussian elimination of [A] − τ[B] and Sylvester's law of
//     inertia, or reports that the count is undecided;
//   - PositiveDefinite proves that every member of a Sym is positive
//     definite;
//   - Eigenvalues encloses μ_1 ≤ … ≤ μ_n by bisection on verified counts;
//   - ProjectionLower applies the projection lower bound of Liu (2015) to a
//     verified lower bound of a discrete eigenvalue.
//
// Floating point at round-to-nearest (gonum's symmetric eigensolver, the
// pivot order, the trial shifts τ, the congruence transformations) only
// chooses; every decision rests on outward rounded interval arithmetic
// (package gapcert/interval).
//
// References:
//
//	J. J. Sylvester, A demonstration of the theorem that every homogeneous
//	quadratic polynomial is reducible by real orthogonal substitutions to
//	the form of a sum of positive and negative squares, Philosophical
//	Magazine 4 (1852) 138–142.
//	G. H. Golub, C. F. Van Loan, Matrix Computations, 4th ed., Johns Hopkins
//	University Press, 2013, §8.4 (Sturm counts and bisection for symmetric
//	eigenvalues).
//	X. Liu, A framework of verified eigenvalue bounds for self-adjoint
//	differential operators, Applied Mathematics and Computation 267 (2015)
//	341–355.
package enclose
