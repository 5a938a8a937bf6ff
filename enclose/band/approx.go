package band

import (
	"errors"
	"math"

	"gapcert/enclose/internal/subspace"
)

// This file only chooses: approximate eigenpairs in floating point. Nothing
// here is a bound.

// ErrNotConverged is returned by LowestEigs when the eigenpairs do not reach
// the accuracy it promises.
var ErrNotConverged = errors.New("band: eigenpairs did not converge")

// ErrNotPositiveDefinite is returned by LowestEigs when M (or a projected
// mass matrix) is not positive definite in floating point.
var ErrNotPositiveDefinite = errors.New("band: mass matrix is not positive definite")

// approxOptions is the floating-point route of LowestEigs: plain subspace
// iteration (one block), input of each solve recomputed as M·x, symmetrised
// projected matrices, dot products summed in index order, converged at
// relative residual 1e-14.
var approxOptions = subspace.Options{
	Tol: 1e-14, Accept: 1e-11,
	KrylovSteps: 1, FreshMassProducts: true, SymmetrizeRitz: true,
	Vec:          subspace.LoopKernels,
	NotConverged: ErrNotConverged, NotPositiveDefinite: ErrNotPositiveDefinite,
}

// LowestEigs returns approximations of the lowest count eigenvalues of
// Kx = λMx (K symmetric, possibly indefinite; M symmetric positive
// definite), ascending, and approximately M-orthonormal eigenvectors
// vecs[i] of length N. The result is deterministic.
//
// Small problems (N ≤ 200) are solved densely (gonum: Cholesky of M, then
// the symmetric eigensolver). Larger ones use shift-invert subspace
// iteration with p = count + 8 vectors, full M-orthonormalisation by
// modified Gram–Schmidt (twice) and Rayleigh–Ritz on the p-dimensional
// subspace at every step, which handles multiple and clustered eigenvalues
// (the iteration of enclose/internal/subspace with one block). The shift σ
// is kept below λ_1 (the float factorization of K − σM has no negative
// pivot) and moved towards the lowest Ritz value as it converges. Iteration
// stops when every wanted pair has relative residual
// ‖Kx − λMx‖₂ ≤ 1e-14·(‖K‖∞ + |λ|‖M‖∞)‖x‖₂; if it stagnates above that,
// pairs down to 1e-11 are accepted, otherwise ErrNotConverged is returned.
//
// LowestEigs panics if the sizes differ or count is not in 1 … N.
func LowestEigs(k, m *Sym, count int) (vals []float64, vecs [][]float64, err error) {
	if k.N != m.N {
		panic("band: dimension mismatch")
	}
	if count < 1 || count > k.N {
		panic("band: eigenpair count out of range")
	}
	return subspace.Lowest(newPencil(k, m), count, approxOptions)
}

// pencil is the banded pencil (K, M) with the factorization of K − σM, as
// the subspace iteration uses it.
type pencil struct {
	k, m    *Sym
	shifted *Sym
	f       LDL
}

func newPencil(k, m *Sym) *pencil {
	return &pencil{k: k, m: m, shifted: NewSym(k.N, max(k.W, m.W))}
}

func (a *pencil) Dim() int                        { return a.k.N }
func (a *pencil) Entries(i, j int) (k, m float64) { return a.k.At(i, j), a.m.At(i, j) }
func (a *pencil) MulKTo(dst, x []float64)         { a.k.MulVecTo(dst, x) }
func (a *pencil) MulMTo(dst, x []float64)         { a.m.MulVecTo(dst, x) }
func (a *pencil) InfNorms() (normK, normM float64) {
	return infNorm(a.k), infNorm(a.m)
}

func (a *pencil) FactorShift(sigma float64) bool {
	w := a.shifted.W
	for i := 0; i < a.k.N; i++ {
		for j := max(0, i-w); j <= i; j++ {
			a.shifted.Data[i*(w+1)+i-j] = a.k.At(i, j) - sigma*a.m.At(i, j)
		}
	}
	return a.f.Factorize(a.shifted) && a.f.NegCount() == 0
}

func (a *pencil) SolveTo(dst, b [][]float64) {
	for c := range b {
		a.f.SolveTo(dst[c], b[c])
	}
}

func (a *pencil) GershgorinRows() (kDiag, kOff, mDiag []float64) {
	k, n := a.k, a.k.N
	kDiag, kOff, mDiag = make([]float64, n), make([]float64, n), make([]float64, n)
	for i := 0; i < n; i++ {
		off := 0.0
		for j := max(0, i-k.W); j <= min(n-1, i+k.W); j++ {
			if j != i {
				off += math.Abs(k.At(i, j))
			}
		}
		kDiag[i], kOff[i], mDiag[i] = k.At(i, i), off, a.m.At(i, i)
	}
	return kDiag, kOff, mDiag
}

func infNorm(s *Sym) float64 {
	r := 0.0
	for i := 0; i < s.N; i++ {
		t := 0.0
		for j := max(0, i-s.W); j <= min(s.N-1, i+s.W); j++ {
			t += math.Abs(s.At(i, j))
		}
		r = math.Max(r, t)
	}
	return r
}
