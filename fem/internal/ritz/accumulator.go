package ritz

import (
	"gapcert/enclose"
	"gapcert/interval"
)

// Accumulator is a lower-triangular sum of interval contributions to an
// n×n symmetric matrix. The zero value is not usable; use NewAccumulator.
type Accumulator struct {
	n int
	v []interval.I // packed lower triangle, row by row
}

// NewAccumulator returns an n×n accumulator with every entry [0, 0].
func NewAccumulator(n int) *Accumulator {
	if n < 0 {
		panic("ritz: negative dimension")
	}
	return &Accumulator{n: n, v: make([]interval.I, n*(n+1)/2)}
}

// Add adds x to entry (i, j), j ≤ i: the sum encloses every sum of exact
// values inside the enclosures added so far.
func (a *Accumulator) Add(i, j int, x interval.I) {
	if j > i || i >= a.n || j < 0 {
		panic("ritz: entry outside the lower triangle")
	}
	k := i*(i+1)/2 + j
	a.v[k] = a.v[k].Add(x)
}

// Sym returns the accumulated matrix as an enclose.Sym (the upper triangle
// mirrors the lower one).
func (a *Accumulator) Sym() *enclose.Sym {
	s := enclose.NewSym(a.n)
	for i := 0; i < a.n; i++ {
		for j := 0; j <= i; j++ {
			s.Set(i, j, a.v[i*(i+1)/2+j])
		}
	}
	return s
}
