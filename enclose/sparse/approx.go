package sparse

import (
	"math"

	"gapcert/enclose/internal/subspace"
)

// Approximate eigenpairs in floating point: choices only, never bounds.

// Errors of LowestEigs: the pairs missed the promised accuracy, or M (or a
// projected mass matrix) is not positive definite in floating point.
var ErrNotConverged, ErrNotPositiveDefinite = subspace.NewErrors("sparse")

// LowestEigs approximates the count lowest eigenpairs of the pencil
// Kx = λMx, with K symmetric (indefinite allowed) and M symmetric positive
// definite: eigenvalues ascending, eigenvectors of length N approximately
// M-orthonormal; the same input gives the same bits. Sizes that differ, or
// a count outside 1 … N, panic.
//
// It runs the iteration of package enclose/internal/subspace (a dense
// solve up to N = 200) with a block of count + 8 vectors and a Krylov
// basis of three blocks [Op X, Op² X, Op³ X], Op = (K − σM)⁻¹M, on which
// Rayleigh–Ritz runs at each step; the solves take the products M·x kept
// by the M-orthonormalisation, and dot products use gonum's kernels.
// K − σM is ordered (Order) and analyzed once on the union of the patterns
// of K and M and refactored for each shift. Pairs converge at relative
// residual 1e-13 (‖Kx − λMx‖₂ over (‖K‖∞ + |λ|‖M‖∞)‖x‖₂), or 1e-11 when
// progress stalls; otherwise ErrNotConverged.
//
// Reference: R. G. Grimes, J. G. Lewis, H. D. Simon, A shifted block
// Lanczos algorithm for solving sparse symmetric generalized
// eigenproblems, SIAM J. Matrix Anal. Appl. 15 (1994) 228–272.
func LowestEigs(k, m *Sym, count int) (vals []float64, vecs [][]float64, err error) {
	if k.N() != m.N() {
		panic("sparse: dimension mismatch")
	}
	return subspace.Lowest(&pencil{k: k, m: m}, count, subspace.Options{
		Name: "sparse", Tol: 1e-13, Accept: 1e-11, KrylovSteps: 3, Vec: subspace.GonumKernels,
		NotConverged: ErrNotConverged, NotPositiveDefinite: ErrNotPositiveDefinite,
	})
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

func (a *pencil) Dim() int                         { return a.k.N() }
func (a *pencil) Matrices() (k, m subspace.Matrix) { return a.k, a.m }
func (a *pencil) InfNorms() (normK, normM float64) {
	return infNorm(a.k), infNorm(a.m)
}

func (a *pencil) FactorShift(sigma float64) bool {
	if a.sym == nil {
		u, fromK, fromM := union(a.k.Pat, a.m.Pat)
		a.sym, a.fromK, a.fromM = analyzePattern(u, orderPattern(u)), fromK, fromM
		a.shifted = &Sym{Pat: u, Val: make([]float64, u.NNZ())}
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

func (a *pencil) SolveTo(dst, b [][]float64) { a.f.solveBlockTo(dst, b, &a.block) }

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
