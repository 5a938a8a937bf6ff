// Package sparse implements sparse symmetric matrices for finite-element
// pencils on two- and three-dimensional meshes: storage, a fill-reducing
// ordering, a symbolic analysis and a floating-point LDLᵀ factorization
// without pivoting, approximate lowest eigenpairs of Kx = λMx, and a
// verified upper bound on the number of eigenvalues below a shift.
//
// Sym holds float64 data and ISym interval data on a shared Pattern (the
// lower triangle by columns); an ISym stands for every real symmetric
// matrix with entries in its intervals. Builder and IBuilder assemble them
// from element contributions.
//
// # Factorization
//
// LDL.Factorize has two numeric algorithms with the same result pattern
// (L in the columns of the Symbolic, D): the up-looking algorithm (row k
// of L by a sparse triangular solve along the elimination tree; Davis
// 2005) for small matrices, and from 2²¹ multiply-adds the multifrontal
// algorithm (Duff and Reid 1983, Liu 1992): columns with nested patterns
// form supernodes, each supernode's dense front receives the entries of
// the matrix and the update matrices of its children and is eliminated
// by panels of dense register-blocked updates; independent subtrees of
// the supernode tree run concurrently and the updates of large fronts are
// split over idle CPUs. The fill of three-dimensional meshes makes the
// fronts large (the stage-A pencil of the unit cube with 96,768 unknowns
// has 1.9·10⁷ entries in L and 1.7·10¹⁰ flops), where the dense kernels
// and the two CPUs matter. The operations on each entry and their order
// do not depend on the number of CPUs, so the factors are the same bits
// whatever GOMAXPROCS. Both algorithms compute each entry as the matrix
// entry minus the same products, summed along different trees; the
// rounding-error bound of the verified counts (Counter.roundoffBound)
// covers every tree with one constant. Block solves (LowestEigs) sweep L
// once for up to 16 right-hand sides, the groups on the available CPUs.
//
// Choosing and proving are kept apart. Order (nested dissection), Analyze
// (elimination tree and column counts, reusable across shifts through
// Symbolic), Factor, LDL.SolveTo and LowestEigs compute in floating point
// at round-to-nearest and only choose (orders, shifts, approximate
// eigenvectors); nothing they return is a bound. CountBelow (and Counter,
// which repeats it at many shifts) is verified: its count and shift are
// true for every member of the interval pencil, by an interval enclosure
// of the factorization residual, Weyl's monotonicity and Sylvester's law
// of inertia (see Verified counts). Its soundness does not depend on the accuracy
// of the float factorization, only on the residual enclosure.
//
// # Verified counts
//
// Counter.CountBelow factors the permuted float matrix
// Pᵀ(mid(K) − σ·mid(M))P ≈ LDLᵀ at round-to-nearest (P a fill-reducing
// permutation; the residual R = Pᵀ(K − σM)P − LDLᵀ vanishes outside the
// pattern of L + Lᵀ), bounds r ≥ ‖R‖∞ over all members, and hands
// #neg(D) and r to enclose.CountFromResidual. r comes from one of two
// enclosures: every entry of R by its defining sum in outward rounded
// arithmetic (sharp, Σ_k ℓ_k² operations for columns of length ℓ_k), or
// the entrywise enclosure of K − σM − S (S the float matrix factored)
// plus an a-priori rounding-error bound of the factorization,
// c·Σ_i |L_ki||d_i|S_i per row with c ≈ (longest row of L)·2⁻⁵³ and S_i
// the column sums of |L| (O(nnz(L)) operations; Higham 2002, Lemmas 3.1
// and 8.4, with underflow terms). Large pencils use the second when its
// loss is small (Counter, Residual bounds). Its doc comment states and proves the count
// #{λ : Kx = λMx, λ < σ'} ≤ #neg(D) for σ' = σ − r/mMin rounded down
// (Weyl's monotonicity theorem and Sylvester's law of inertia). Hence if
// #neg(D) ≤ k − 1 then λ_k ≥ σ' for every member. A poor factorization
// only makes r large and σ' low; it never makes the count wrong.
//
// # Mass bounds
//
// mMin, a lower bound of λ_min(M) over the members, is the callers'
// (packages fem/line, fem/tri and fem/tet); the elementwise bound they use is
// derived in package enclose (Mass bounds).
//
// References:
//
//	J. J. Sylvester, A demonstration of the theorem that every homogeneous
//	quadratic polynomial is reducible by real orthogonal substitutions to
//	the form of a sum of positive and negative squares, Philosophical
//	Magazine 4 (1852) 138–142.
//	A. George, J. W. H. Liu, Computer Solution of Large Sparse Positive
//	Definite Systems, Prentice-Hall, 1981 (nested dissection).
//	J. W. H. Liu, The role of elimination trees in sparse factorization,
//	SIAM J. Matrix Anal. Appl. 11 (1990) 134–172.
//	T. A. Davis, Direct Methods for Sparse Linear Systems, SIAM, 2006.
//	T. A. Davis, Algorithm 849: A concise sparse Cholesky factorization
//	package, ACM Trans. Math. Software 31 (2005) 587–591.
//	I. S. Duff, J. K. Reid, The multifrontal solution of indefinite sparse
//	symmetric linear equations, ACM Trans. Math. Software 9 (1983)
//	302–325.
//	J. W. H. Liu, The multifrontal method for sparse matrix solution:
//	theory and practice, SIAM Review 34 (1992) 82–109.
//	N. J. Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed.,
//	SIAM, 2002 (rounding-error analysis of the factorization).
//	B. N. Parlett, The Symmetric Eigenvalue Problem, SIAM, 1998 (subspace
//	iteration, Rayleigh–Ritz, the generalized problem and shift-invert).
package sparse
