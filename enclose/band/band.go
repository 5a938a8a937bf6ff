package band

import "gapcert/interval"

// Sym is a symmetric banded n×n float64 matrix with half-bandwidth w:
// entries (i, j) with |i − j| > w are zero. Entry (i, j), j ≤ i, is stored at
// Data[i*(w+1)+(i−j)]; the diagonal is Data[i*(w+1)].
type Sym struct {
	N, W int
	Data []float64
}

// NewSym returns the n×n zero matrix of half-bandwidth w.
func NewSym(n, w int) *Sym {
	if n < 0 || w < 0 {
		panic("band: negative size")
	}
	return &Sym{N: n, W: w, Data: make([]float64, n*(w+1))}
}

func index(n, w, i, j int) int {
	if j > i {
		i, j = j, i
	}
	if i >= n || j < 0 || i-j > w {
		panic("band: index outside the band")
	}
	return i*(w+1) + (i - j)
}

// At returns entry (i, j); entries outside the band are 0.
func (s *Sym) At(i, j int) float64 {
	if i-j > s.W || j-i > s.W {
		return 0
	}
	return s.Data[index(s.N, s.W, i, j)]
}

// Add adds v to entry (i, j) (and so to (j, i)).
func (s *Sym) Add(i, j int, v float64) { s.Data[index(s.N, s.W, i, j)] += v }

// ISym is a symmetric banded matrix of intervals, stored like Sym. It
// stands for every real symmetric matrix whose entries lie in the intervals
// (zero outside the band).
type ISym struct {
	N, W int
	Data []interval.I
}

// NewISym returns the n×n zero interval matrix of half-bandwidth w.
func NewISym(n, w int) *ISym {
	if n < 0 || w < 0 {
		panic("band: negative size")
	}
	return &ISym{N: n, W: w, Data: make([]interval.I, n*(w+1))}
}

// At returns entry (i, j); entries outside the band are [0, 0].
func (s *ISym) At(i, j int) interval.I {
	if i-j > s.W || j-i > s.W {
		return interval.I{}
	}
	return s.Data[index(s.N, s.W, i, j)]
}

// Add adds v to entry (i, j) (and so to (j, i)) in interval arithmetic.
func (s *ISym) Add(i, j int, v interval.I) {
	k := index(s.N, s.W, i, j)
	s.Data[k] = s.Data[k].Add(v)
}

// Mid returns the matrix of midpoints (a choice for floating-point solves,
// not a bound).
func (s *ISym) Mid() *Sym {
	m := NewSym(s.N, s.W)
	for k, v := range s.Data {
		m.Data[k] = v.Mid()
	}
	return m
}
