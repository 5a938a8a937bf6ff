package enclose

import "gapcert/interval"

// Sym is a dense symmetric n×n matrix of intervals. It stands for the set
// of all real symmetric matrices whose entries lie in the intervals; every
// statement this package makes about a Sym holds for each member of that
// set. Only the lower triangle is stored: entry (i, j), j ≤ i, is at
// data[i*(i+1)/2+j].
type Sym struct {
	n    int
	data []interval.I
}

// NewSym returns the n×n zero interval matrix.
func NewSym(n int) *Sym {
	if n < 0 {
		panic("enclose: negative dimension")
	}
	return &Sym{n: n, data: make([]interval.I, n*(n+1)/2)}
}

// N returns the dimension.
func (s *Sym) N() int { return s.n }

func (s *Sym) index(i, j int) int {
	if i < 0 || j < 0 || i >= s.n || j >= s.n {
		panic("enclose: index out of range")
	}
	if j > i {
		i, j = j, i
	}
	return i*(i+1)/2 + j
}

// At returns entry (i, j) = entry (j, i).
func (s *Sym) At(i, j int) interval.I { return s.data[s.index(i, j)] }

// Set sets entries (i, j) and (j, i) to v.
func (s *Sym) Set(i, j int, v interval.I) { s.data[s.index(i, j)] = v }

// Mid returns the float64 matrix of midpoints, row-major n×n (a choice for
// approximate computations, not a bound).
func (s *Sym) Mid() []float64 {
	m := make([]float64, s.n*s.n)
	for i := 0; i < s.n; i++ {
		for j := 0; j <= i; j++ {
			v := s.data[i*(i+1)/2+j].Mid()
			m[i*s.n+j], m[j*s.n+i] = v, v
		}
	}
	return m
}
