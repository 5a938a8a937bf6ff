package band

import (
	"math"

	"gapcert/enclose/internal/subspace"
)

// This file only chooses: approximate eigenpairs in floating point. Nothing
// here is a bound.

// ErrNotConverged is returned by LowestEigs when the eigenpairs do not reach
// the accuracy it promises, ErrNotPositiveDefinite when M (or a projected
// mass matrix) is not positive definite in floating point.
var ErrNotConverged, ErrNotPositiveDefinite = subspace.NewErrors("band")

// LowestEigs returns approximations of the lowest count eigenvalues of
// Kx = λMx (K symmetric, possibly indefinite; M symmetric positive
// definite), ascending, and approximately M-orthonormal eigenvectors
// vecs[i] of length N, deterministically. It panics if the sizes differ or
// count is not in 1 … N.
//
// The method is the shift-invert subspace iteration of package
// enclose/internal/subspace (dense for N ≤ 200) with p = count + 8 vectors
// and one block: Rayleigh–Ritz on span((K − σM)⁻¹MX) at every step, the
// solve input M·x recomputed from each vector, the projected matrices
// symmetrised, dot products summed in index order. A pair is accepted at
// relative residual ‖Kx − λMx‖₂ ≤ 1e-14·(‖K‖∞ + |λ|‖M‖∞)‖x‖₂, or at 1e-11
// when the iteration stagnates; else the error is ErrNotConverged.
func LowestEigs(k, m *Sym, count int) (vals []float64, vecs [][]float64, err error) {
	return subspace.Lowest(newPencil(k, m), count, subspace.Options{
		Name: "band", Tol: 1e-14, Accept: 1e-11, KrylovSteps: 1,
		FreshMassProducts: true, SymmetrizeRitz: true, Vec: subspace.LoopKernels,
		NotConverged: ErrNotConverged, NotPositiveDefinite: ErrNotPositiveDefinite,
	})
}

// pencil is the banded pencil (K, M) with the factorization of K − σM, as
// the subspace iteration uses it.
type pencil struct {
	k, m    *Sym
	shifted *Sym
	f       LDL
}

func newPencil(k, m *Sym) *pencil {
	if k.N != m.N {
		panic("band: dimension mismatch")
	}
	return &pencil{k: k, m: m, shifted: NewSym(k.N, max(k.W, m.W))}
}

func (a *pencil) Dim() int                         { return a.k.N }
func (a *pencil) Matrices() (k, m subspace.Matrix) { return a.k, a.m }
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
