// Package geneig computes approximate eigenpairs of small dense symmetric
// pencils Ax = λBx with B positive definite, in floating point. Its results
// are choices (starting vectors, trial shifts, Rayleigh–Ritz steps), never
// bounds: callers that prove something verify it separately.
package geneig

import (
	"errors"
	"math"

	"gonum.org/v1/gonum/mat"
)

var (
	// ErrNotPositiveDefinite is returned when the Cholesky factorization
	// of B (or a triangular solve with its factor) fails.
	ErrNotPositiveDefinite = errors.New("geneig: B is not positive definite in floating point")
	// ErrFailed is returned for non-finite input or when the symmetric
	// eigensolver does not converge.
	ErrFailed = errors.New("geneig: the symmetric eigensolver failed")
)

// Solve returns the eigenvalues (ascending) and approximately
// B-orthonormal eigenvectors (columns of a row-major n×n matrix) of the
// dense symmetric pencil (a, b), both row-major n×n: Cholesky B = LLᵀ, then
// the symmetric eigenproblem of L⁻¹AL⁻ᵀ (symmetrised), then x = L⁻ᵀz.
func Solve(a, b []float64, n int) (vals, vecs []float64, err error) {
	for _, v := range a {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, nil, ErrFailed
		}
	}
	var ch mat.Cholesky
	if !ch.Factorize(mat.NewSymDense(n, b)) {
		return nil, nil, ErrNotPositiveDefinite
	}
	var l mat.TriDense
	ch.LTo(&l)
	var w, c mat.Dense
	if err := w.Solve(&l, mat.NewDense(n, n, a)); err != nil { // w = L⁻¹A
		return nil, nil, ErrNotPositiveDefinite
	}
	if err := c.Solve(&l, w.T()); err != nil { // c = L⁻¹AL⁻ᵀ
		return nil, nil, ErrNotPositiveDefinite
	}
	cs := mat.NewSymDense(n, nil)
	for i := 0; i < n; i++ {
		for j := 0; j <= i; j++ {
			cs.SetSym(i, j, (c.At(i, j)+c.At(j, i))/2)
		}
	}
	var es mat.EigenSym
	if !es.Factorize(cs, true) {
		return nil, nil, ErrFailed
	}
	vals = es.Values(nil)
	var z, v mat.Dense
	es.VectorsTo(&z)
	if err := v.Solve(l.T(), &z); err != nil { // v = L⁻ᵀZ
		return nil, nil, ErrNotPositiveDefinite
	}
	vecs = make([]float64, n*n)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			vecs[i*n+j] = v.At(i, j)
		}
	}
	return vals, vecs, nil
}
