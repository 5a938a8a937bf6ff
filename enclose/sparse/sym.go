package sparse

import (
	"math"

	"gapcert/interval"
)

// Pattern is the sparsity pattern of a symmetric n×n matrix: the lower
// triangle, diagonal included, in compressed sparse column form. Column j
// holds the rows RowIdx[ColPtr[j]:ColPtr[j+1]], strictly ascending, the
// first of which is always j (the diagonal is stored even when zero).
// A Pattern is immutable once built and may be shared by several matrices.
type Pattern struct {
	n      int
	colPtr []int
	rowIdx []int32
}

// N returns the order of the matrix.
func (p *Pattern) N() int { return p.n }

// NNZ returns the number of stored entries of the lower triangle.
func (p *Pattern) NNZ() int { return len(p.rowIdx) }

// ColPtr returns the column pointers (length N+1); the slice must not be
// modified.
func (p *Pattern) ColPtr() []int { return p.colPtr }

// RowIdx returns the row indices (length NNZ); the slice must not be
// modified.
func (p *Pattern) RowIdx() []int32 { return p.rowIdx }

// find returns the position of entry (i, j), i ≥ j, or −1 if it is not
// stored.
func (p *Pattern) find(i, j int) int {
	lo, hi := p.colPtr[j], p.colPtr[j+1]
	for lo < hi {
		mid := int(uint(lo+hi) >> 1)
		switch r := int(p.rowIdx[mid]); {
		case r == i:
			return mid
		case r < i:
			lo = mid + 1
		default:
			hi = mid
		}
	}
	return -1
}

func (p *Pattern) checkIndex(i, j int) (int, int) {
	if i < 0 || j < 0 || i >= p.n || j >= p.n {
		panic("sparse: index out of range")
	}
	if i < j {
		i, j = j, i
	}
	return i, j
}

// Sym is a symmetric float64 matrix on a Pattern: Val[q] is the entry at
// position q of the pattern (and its mirror).
type Sym struct {
	Pat *Pattern
	Val []float64
}

// N returns the order of the matrix.
func (s *Sym) N() int { return s.Pat.n }

// At returns entry (i, j); entries outside the pattern are 0.
func (s *Sym) At(i, j int) float64 {
	i, j = s.Pat.checkIndex(i, j)
	if q := s.Pat.find(i, j); q >= 0 {
		return s.Val[q]
	}
	return 0
}

// MulVecTo sets dst = S x (dst must not alias x).
func (s *Sym) MulVecTo(dst, x []float64) {
	n := s.Pat.n
	if len(dst) != n || len(x) != n {
		panic("sparse: dimension mismatch")
	}
	clear(dst)
	cp, ri, v := s.Pat.colPtr, s.Pat.rowIdx, s.Val
	for j := 0; j < n; j++ {
		q := cp[j]
		xj := x[j]
		acc := v[q] * xj // diagonal
		for q++; q < cp[j+1]; q++ {
			i := ri[q]
			acc += v[q] * x[i]
			dst[i] += v[q] * xj
		}
		dst[j] += acc
	}
}

// ISym is a symmetric matrix of intervals on a Pattern. It stands for every
// real symmetric matrix whose entries lie in the intervals (and are zero
// outside the pattern).
type ISym struct {
	Pat *Pattern
	Val []interval.I
}

// N returns the order of the matrix.
func (s *ISym) N() int { return s.Pat.n }

// At returns entry (i, j); entries outside the pattern are [0, 0].
func (s *ISym) At(i, j int) interval.I {
	i, j = s.Pat.checkIndex(i, j)
	if q := s.Pat.find(i, j); q >= 0 {
		return s.Val[q]
	}
	return interval.I{}
}

// Mid returns the matrix of midpoints on the same pattern (a choice for
// floating-point solves, not a bound).
func (s *ISym) Mid() *Sym {
	m := &Sym{Pat: s.Pat, Val: make([]float64, len(s.Val))}
	for q, v := range s.Val {
		m.Val[q] = v.Mid()
	}
	return m
}

// triplets collects entries (i, j), i ≥ j, in insertion order.
type triplets struct {
	n    int
	i, j []int32
}

func (t *triplets) add(i, j int) {
	if i < 0 || j < 0 || i >= t.n || j >= t.n {
		panic("sparse: index out of range")
	}
	if i < j {
		i, j = j, i
	}
	t.i = append(t.i, int32(i))
	t.j = append(t.j, int32(j))
}

// compress sorts the triplets (with the n diagonal entries added) by column
// and row and merges duplicates. It returns the pattern and, for each
// triplet, its position in the pattern.
func (t *triplets) compress() (*Pattern, []int) {
	n, m := t.n, len(t.i)
	// Counting sort by row, then a stable counting sort by column: rows
	// ascend within each column. Diagonal entries are the pseudo-triplets
	// m … m+n−1.
	row := func(e int) int32 {
		if e >= m {
			return int32(e - m)
		}
		return t.i[e]
	}
	col := func(e int) int32 {
		if e >= m {
			return int32(e - m)
		}
		return t.j[e]
	}
	byRow := bucket(n, m+n, nil, row)
	byCol := bucket(n, m+n, byRow, col)
	p := &Pattern{n: n, colPtr: make([]int, n+1)}
	where := make([]int, m)
	p.rowIdx = make([]int32, 0, n+m/2)
	lastR, lastC := int32(-1), int32(-1)
	for _, e := range byCol {
		r, c := row(e), col(e)
		if r != lastR || c != lastC {
			p.rowIdx = append(p.rowIdx, r)
			p.colPtr[c+1]++
			lastR, lastC = r, c
		}
		if e < m {
			where[e] = len(p.rowIdx) - 1
		}
	}
	for c := 0; c < n; c++ {
		p.colPtr[c+1] += p.colPtr[c]
	}
	p.rowIdx = p.rowIdx[:len(p.rowIdx):len(p.rowIdx)]
	return p, where
}

// bucket returns the items in (0 … total−1 if in is nil, else the order of
// in) stably sorted by key ∈ [0, n).
func bucket(n, total int, in []int, key func(int) int32) []int {
	count := make([]int, n+1)
	for e := 0; e < total; e++ {
		count[key(e)+1]++
	}
	for k := 0; k < n; k++ {
		count[k+1] += count[k]
	}
	out := make([]int, total)
	for x := 0; x < total; x++ {
		e := x
		if in != nil {
			e = in[x]
		}
		k := key(e)
		out[count[k]] = e
		count[k]++
	}
	return out
}

// Builder assembles a Sym from entries; duplicates are summed and (i, j)
// and (j, i) are the same entry.
type Builder struct {
	t triplets
	v []float64
}

// NewBuilder returns a builder of an n×n matrix.
func NewBuilder(n int) *Builder {
	if n < 0 || n > math.MaxInt32 {
		panic("sparse: matrix order out of range")
	}
	return &Builder{t: triplets{n: n}}
}

// Add adds v to entry (i, j) (and so to (j, i)).
func (b *Builder) Add(i, j int, v float64) {
	b.t.add(i, j)
	b.v = append(b.v, v)
}

// Build returns the matrix. The builder may be reused afterwards; it keeps
// its entries.
func (b *Builder) Build() *Sym {
	p, where := b.t.compress()
	s := &Sym{Pat: p, Val: make([]float64, p.NNZ())}
	for e, q := range where {
		s.Val[q] += b.v[e]
	}
	return s
}

// IBuilder assembles an ISym from interval entries; duplicates are summed
// in interval arithmetic.
type IBuilder struct {
	t triplets
	v []interval.I
}

// NewIBuilder returns a builder of an n×n interval matrix.
func NewIBuilder(n int) *IBuilder {
	if n < 0 || n > math.MaxInt32 {
		panic("sparse: matrix order out of range")
	}
	return &IBuilder{t: triplets{n: n}}
}

// Add adds v to entry (i, j) (and so to (j, i)).
func (b *IBuilder) Add(i, j int, v interval.I) {
	b.t.add(i, j)
	b.v = append(b.v, v)
}

// Build returns the interval matrix: each entry encloses the exact sum of
// the intervals added to it.
func (b *IBuilder) Build() *ISym {
	p, where := b.t.compress()
	s := &ISym{Pat: p, Val: make([]interval.I, p.NNZ())}
	for e, q := range where {
		s.Val[q] = s.Val[q].Add(b.v[e])
	}
	return s
}

// union returns the pattern holding the entries of a and b, and the maps
// from the positions of a and of b into it. If a == b it returns a and
// identity maps (nil).
func union(a, b *Pattern) (u *Pattern, fromA, fromB []int) {
	if a.n != b.n {
		panic("sparse: dimension mismatch")
	}
	if a == b {
		return a, nil, nil
	}
	n := a.n
	u = &Pattern{n: n, colPtr: make([]int, n+1), rowIdx: make([]int32, 0, max(a.NNZ(), b.NNZ()))}
	fromA, fromB = make([]int, a.NNZ()), make([]int, b.NNZ())
	for j := 0; j < n; j++ {
		p, pe := a.colPtr[j], a.colPtr[j+1]
		q, qe := b.colPtr[j], b.colPtr[j+1]
		for p < pe || q < qe {
			var r int32
			switch {
			case q == qe || (p < pe && a.rowIdx[p] < b.rowIdx[q]):
				r = a.rowIdx[p]
				fromA[p] = len(u.rowIdx)
				p++
			case p == pe || b.rowIdx[q] < a.rowIdx[p]:
				r = b.rowIdx[q]
				fromB[q] = len(u.rowIdx)
				q++
			default:
				r = a.rowIdx[p]
				fromA[p], fromB[q] = len(u.rowIdx), len(u.rowIdx)
				p++
				q++
			}
			u.rowIdx = append(u.rowIdx, r)
		}
		u.colPtr[j+1] = len(u.rowIdx)
	}
	return u, fromA, fromB
}

// at maps a position through a union map (nil is the identity).
func at(m []int, q int) int {
	if m == nil {
		return q
	}
	return m[q]
}
