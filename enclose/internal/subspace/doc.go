// Package subspace computes approximations of the lowest eigenpairs of a
// large sparse symmetric pencil Kx = λMx (M positive definite) by
// shift-invert subspace iteration with Rayleigh–Ritz, written once against
// the Pencil interface that each matrix storage (enclose/band,
// enclose/sparse) implements. Everything here chooses (approximate
// eigenvectors and shifts); nothing is a bound.
//
// The storages reach the same mathematical algorithm by slightly different
// floating-point routes (Options: the tolerance, the number of Krylov
// blocks, whether the operator input M·x is recomputed, whether the
// projected stiffness matrix is symmetrised, and the dot-product kernel).
// Each storage keeps its own route so that its results, and the
// certificates built on them, stay bit for bit what they were.
//
// References:
//
//	B. N. Parlett, The Symmetric Eigenvalue Problem, SIAM, 1998 (subspace
//	iteration, Krylov subspaces, Rayleigh–Ritz, the generalized problem).
//	R. G. Grimes, J. G. Lewis, H. D. Simon, A shifted block Lanczos
//	algorithm for solving sparse symmetric generalized eigenproblems,
//	SIAM J. Matrix Anal. Appl. 15 (1994) 228–272.
package subspace
