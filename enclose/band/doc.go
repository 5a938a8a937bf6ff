// Package band implements symmetric banded matrices for one-dimensional
// finite-element pencils: a floating-point LDLᵀ factorization, approximate
// lowest eigenpairs of Kx = λMx, and a verified upper bound on the number
// of eigenvalues below a shift.
//
// Sym holds float64 data and ISym interval data; an ISym stands for every
// real symmetric matrix with entries in its intervals.
//
// Choosing and proving are kept apart. Factor, LDL.SolveTo and LowestEigs
// compute in floating point at round-to-nearest and only choose (shifts,
// approximate eigenvectors); nothing they return is a bound. CountBelow is
// verified: its count and shift are true for every member of the interval
// pencil, by an interval enclosure of the factorization residual, Weyl's
// monotonicity and Sylvester's law of inertia (see Verified counts).
//
// # Verified counts
//
// Counter.CountBelow factors mid(K) − σ·mid(M) ≈ LDLᵀ at round-to-nearest
// (L has the bandwidth of the pencil, so the residual R = (K − σM) − LDLᵀ
// is banded too), encloses r ≥ ‖R‖∞ over all members entry by entry in
// outward rounded interval arithmetic, and hands #neg(D) and r to
// enclose.CountFromResidual. Its doc comment states and proves the count
// #{λ : Kx = λMx, λ < σ'} ≤ #neg(D) for σ' = σ − r/mMin rounded down
// (Weyl's monotonicity theorem and Sylvester's law of inertia). Hence if
// #neg(D) ≤ k − 1 then λ_k ≥ σ' for every member. A poor factorization
// only makes r large and σ' low; it never makes the count wrong.
//
// # Mass bounds
//
// mMin, a lower bound of λ_min(M) over the members, is the callers'
// (packages fem/line and fem/tri); the elementwise bound they use is
// derived in package enclose (Mass bounds).
//
// References:
//
//	J. J. Sylvester, A demonstration of the theorem that every homogeneous
//	quadratic polynomial is reducible by real orthogonal substitutions to
//	the form of a sum of positive and negative squares, Philosophical
//	Magazine 4 (1852) 138–142.
//	G. H. Golub, C. F. Van Loan, Matrix Computations, 4th ed., Johns Hopkins
//	University Press, 2013 (banded LDLᵀ; Weyl's inequalities).
//	B. N. Parlett, The Symmetric Eigenvalue Problem, SIAM, 1998 (subspace
//	iteration, Rayleigh–Ritz, the generalized problem and shift-invert).
package band
