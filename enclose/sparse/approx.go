package sparse

import (
	"errors"
	"math"

	"gapcert/enclose/internal/subspace"
)

// This file only chooses: approximate eigenpairs in floating point. Nothing
// here is a bound.

// ErrNotConverged is returned by LowestEigs when the eigenpairs do not reach
// the accuracy it promises.
var ErrNotConverged = errors.New("sparse: eigenpairs did not converge")

// ErrNotPositiveDefinite is returned by LowestEigs when M (or a projected
// mass matrix) is not positive definite in floating point.
var ErrNotPositiveDefinite = errors.New("sparse: mass matrix is not positive definite")

// approxOptions is the floating-point route of LowestEigs: a block Krylov
// basis of three blocks, solves fed with the products M·x kept by the
// M-orthonormalisation, unsymmetrised projected matrices, gonum's vector
// kernels, converged at relative residual 1e-13.
var approxOptions = subspace.Options{
	Tol: 1e-13, Accept: 1e-11,
	KrylovSteps: 3, FreshMassProducts: false, SymmetrizeRitz: false,
	Vec:          subspace.GonumKernels,
	NotConverged: ErrNotConverged, NotPositiveDefinite: ErrNotPositiveDefinite,
}

// LowestEigs returns approximations of the lowest count eigenvalues of
// Kx = λMx (K symmetric, possibly indefinite; M symmetric positive
// definite), ascending, and approximately M-orthonormal eigenvectors
// vecs[i] of length N. The result is deterministic.
//
// Small problems (N ≤ 200) are solved densely (gonum: Cholesky of M, then
// the symmetric eigensolver). Larger ones use shift-invert block subspace
// iteration with a block of p = count + 8 vectors, accelerated by a block
// Krylov basis [Op X, Op² X, Op³ X], Op = (K − σM)⁻¹M, at every step (the
// iteration of enclose/internal/subspace with three blocks): full
// M-orthonormalisation by modified Gram–Schmidt (twice) and Rayleigh–Ritz
// on the 3p-dimensional basis, keeping the p lowest Ritz vectors. A block
// larger than the multiplicity handles multiple and clustered eigenvalues.
// K − σM is ordered (Order) and analyzed once, on the union of the patterns
// of K and M, and refactored for each shift. The shift σ starts at 0 when
// K factors with no negative pivot (K positive definite, the common case of
// shifted problems), else at a Gershgorin-type estimate below the spectrum;
// it is kept below λ_1 (the float factorization of K − σM has no negative
// pivot) and moved towards the lowest Ritz value as it converges. Iteration
// stops when every wanted pair has relative residual
// ‖Kx − λMx‖₂ ≤ 1e-13·(‖K‖∞ + |λ|‖M‖∞)‖x‖₂; if it stagnates above that,
// pairs down to 1e-11 are accepted, otherwise ErrNotConverged is returned.
//
// LowestEigs panics if the sizes differ or count is not in 1 … N.
func LowestEigs(k, m *Sym, count int) (vals []float64, vecs [][]float64, err error) {
	if k.N() != m.N() {
		panic("sparse: dimension mismatch")
	}
	if count < 1 || count > k.N() {
		panic("sparse: eigenpair count out of range")
	}
	return subspace.Lowest(&pencil{k: k, m: m}, count, approxOptions)
}

// pencil is the sparse pencil (K, M) with the factorization of K − σM, as
// the subspace iteration uses it. The ordering and symbolic analysis of
// the union pattern are done at the first factorization.
type pencil struct {
	k, m         *Sym
	shifted      *Sym
	fromK, fromM []int
	sym          *Symbolic
	f            LDL
	block        []float64 // workspace of the block solves
}

func (a *pencil) Dim() int                        { return a.k.N() }
func (a *pencil) Entries(i, j int) (k, m float64) { return a.k.At(i, j), a.m.At(i, j) }
func (a *pencil) MulKTo(dst, x []float64)         { a.k.MulVecTo(dst, x) }
func (a *pencil) MulMTo(dst, x []float64)         { a.m.MulVecTo(dst, x) }
func (a *pencil) InfNorms() (normK, normM float64) {
	return infNorm(a.k), infNorm(a.m)
}

func (a *pencil) FactorShift(sigma float64) bool {
	if a.sym == nil {
		u, fromK, fromM := union(a.k.Pat, a.m.Pat)
		a.sym, a.fromK, a.fromM = analyzePattern(u, orderPattern(u)), fromK, fromM
		a.shifted = &Sym{Pat: u, Val: make([]float64, u.NNZ())}
		a.block = make([]float64, 4*a.k.N())
	}
	clear(a.shifted.Val)
	for q, v := range a.k.Val {
		a.shifted.Val[at(a.fromK, q)] += v
	}
	for q, v := range a.m.Val {
		a.shifted.Val[at(a.fromM, q)] -= sigma * v
	}
	return a.f.Factorize(a.sym, a.shifted) && a.f.NegCount() == 0
}

func (a *pencil) SolveTo(dst, b [][]float64) { a.f.solveBlockTo(dst, b, a.block) }

func (a *pencil) GershgorinRows() (kDiag, kOff, mDiag []float64) {
	n := a.k.N()
	kDiag, mDiag = make([]float64, n), make([]float64, n)
	kOff = absOffRowSums(a.k)
	for i := 0; i < n; i++ {
		kDiag[i], mDiag[i] = a.k.Val[a.k.Pat.colPtr[i]], a.m.Val[a.m.Pat.colPtr[i]]
	}
	return kDiag, kOff, mDiag
}

func infNorm(s *Sym) float64 {
	off := absOffRowSums(s)
	r := 0.0
	for i, o := range off {
		r = math.Max(r, o+math.Abs(s.Val[s.Pat.colPtr[i]]))
	}
	return r
}

// absOffRowSums returns Σ_{j≠i} |S_ij| for each row i.
func absOffRowSums(s *Sym) []float64 {
	off := make([]float64, s.N())
	for j := 0; j < s.N(); j++ {
		for q := s.Pat.colPtr[j] + 1; q < s.Pat.colPtr[j+1]; q++ {
			a := math.Abs(s.Val[q])
			off[s.Pat.rowIdx[q]] += a
			off[j] += a
		}
	}
	return off
}
