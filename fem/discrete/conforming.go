package discrete

import (
	"gapcert/enclose"
	"gapcert/interval"
)

// Space is what a conforming space of an element package provides, for
// a potential of type P and float matrices of type M.
type Space[P, M any] interface {
	// N is the dimension of the space.
	N() int
	// AssembleApprox returns the float stiffness and mass matrices of
	// a + shift·b with the potential v (a choice).
	AssembleApprox(v P, shift float64) (k, m M)
	// RitzMatrices is Trial.RitzMatrices with the potential v.
	RitzMatrices(vecs [][]float64, v P, gamma interval.I) (a0, a1 *enclose.Sym, err error)
}

// Conforming is the Trial of a conforming space with the potential of the
// problem and an approximate eigensolver for its float matrices.
type Conforming[S Space[P, M], P, M any] struct {
	Space S
	V     P
	// Lowest returns approximations of the lowest count eigenpairs of
	// the pencil (k, m) (a choice).
	Lowest func(k, m M, count int) (vals []float64, vecs [][]float64, err error)
}

// N returns the dimension of the space.
func (c *Conforming[S, P, M]) N() int { return c.Space.N() }

// ApproxEigenvectors returns the vectors of Lowest on the float matrices
// of a + shift·b.
func (c *Conforming[S, P, M]) ApproxEigenvectors(count int, shift float64) ([][]float64, error) {
	k, m := c.Space.AssembleApprox(c.V, shift)
	_, vecs, err := c.Lowest(k, m, count)
	return vecs, err
}

// RitzMatrices returns the space's Ritz matrices with the potential V.
func (c *Conforming[S, P, M]) RitzMatrices(vecs [][]float64, gamma interval.I) (a0, a1 *enclose.Sym, err error) {
	return c.Space.RitzMatrices(vecs, c.V, gamma)
}
