package enclose

import (
	"gapcert/enclose/internal/geneig"
	"sort"

	"gonum.org/v1/gonum/mat"
)

// This file only chooses: approximate eigenpairs of midpoint matrices in
// floating point. Nothing here is a bound.

// chooseShiftedEigenvectors returns approximate orthonormal eigenvectors of
// mid(A) − τ mid(B) as the columns of a row-major n×n matrix.
func chooseShiftedEigenvectors(a, b *Sym, tau float64) (x []float64, ok bool) {
	n := a.n
	am, bm := a.Mid(), b.Mid()
	for k := range am {
		am[k] -= tau * bm[k]
	}
	var es mat.EigenSym
	if !es.Factorize(mat.NewSymDense(n, am), true) {
		return nil, false
	}
	var v mat.Dense
	es.VectorsTo(&v)
	return denseData(&v, n), true
}

// choosePencilEigen returns approximate eigenvalues μ_1 ≤ … ≤ μ_n of the
// midpoint pencil mid(A)x = μ mid(B)x and approximately mid(B)-orthonormal
// eigenvectors (columns of a row-major n×n matrix): Cholesky mid(B) = LLᵀ,
// then the symmetric eigenproblem of L⁻¹ mid(A) L⁻ᵀ.
func choosePencilEigen(a, b *Sym) (vals, x []float64, ok bool) {
	vals, x, err := geneig.Solve(a.Mid(), b.Mid(), a.n)
	return vals, x, err == nil
}

// denseData copies an n×n gonum matrix into a row-major slice.
func denseData(m *mat.Dense, n int) []float64 {
	x := make([]float64, n*n)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			x[i*n+j] = m.At(i, j)
		}
	}
	return x
}

// chooseDiagonalGuess returns the sorted ratios of midpoint diagonals,
// a crude starting point for the shift search when the midpoint pencil
// cannot be solved in floating point.
func chooseDiagonalGuess(a, b *Sym) []float64 {
	g := make([]float64, a.n)
	for i := range g {
		g[i] = a.At(i, i).Mid() / b.At(i, i).Mid()
	}
	sort.Float64s(g)
	return g
}
