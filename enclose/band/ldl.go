package band

import "math"

// LDL is a factorization S = L D Lᵀ of a symmetric banded matrix without
// pivoting, L unit lower triangular with the half-bandwidth W of S and D
// diagonal. It is computed in floating point (a choice, not a bound).
// Data uses the layout of Sym: the diagonal slot of row i holds D_i and the
// slot of (i, j), j < i, holds L_ij.
type LDL struct {
	N, W int
	Data []float64
}

// Factor returns the LDLᵀ factorization of s, or ok = false if a pivot is
// zero or not finite. No pivoting is done, so it is meant for positive
// definite or shifted symmetric matrices whose leading minors do not vanish.
func (s *Sym) Factor() (f *LDL, ok bool) {
	f = &LDL{}
	if !f.Factorize(s) {
		return nil, false
	}
	return f, true
}

// Factorize overwrites f with the LDLᵀ factorization of s, reusing f's
// storage, and reports whether every pivot is nonzero and finite.
func (f *LDL) Factorize(s *Sym) bool {
	n, w := s.N, s.W
	f.N, f.W = n, w
	if cap(f.Data) < len(s.Data) {
		f.Data = make([]float64, len(s.Data))
	}
	f.Data = f.Data[:len(s.Data)]
	copy(f.Data, s.Data)
	d := f.Data
	// ld[k] holds L_ik D_k for the current row i, k = i−w … i−1.
	var ldBuf [16]float64
	ld := ldBuf[:0]
	if w > len(ldBuf) {
		ld = make([]float64, 0, w)
	}
	for i := 0; i < n; i++ {
		lo := max(0, i-w)
		row := i * (w + 1)
		ld = ld[:i-lo]
		for j := lo; j < i; j++ {
			s := d[row+i-j]
			rowj := j * (w + 1)
			for k := max(lo, j-w); k < j; k++ {
				s -= ld[k-lo] * d[rowj+j-k]
			}
			l := s / d[rowj]
			d[row+i-j] = l
			ld[j-lo] = l * d[rowj]
		}
		piv := d[row]
		for k := lo; k < i; k++ {
			piv -= ld[k-lo] * d[row+i-k]
		}
		if piv == 0 || math.IsNaN(piv) || math.IsInf(piv, 0) {
			return false
		}
		d[row] = piv
	}
	return true
}

// D returns the pivot D_i.
func (f *LDL) D(i int) float64 { return f.Data[i*(f.W+1)] }

// L returns L_ij (1 on the diagonal, 0 above it and outside the band).
func (f *LDL) L(i, j int) float64 {
	switch {
	case i == j:
		return 1
	case j > i || i-j > f.W:
		return 0
	}
	return f.Data[i*(f.W+1)+i-j]
}

// NegCount returns the number of negative pivots, which by Sylvester's law
// of inertia is the number of negative eigenvalues of L D Lᵀ (of the
// factored matrix only up to the rounding errors of the factorization; see
// CountBelow for a verified count).
func (f *LDL) NegCount() int {
	n := 0
	for i := 0; i < f.N; i++ {
		if f.Data[i*(f.W+1)] < 0 {
			n++
		}
	}
	return n
}

// SolveTo solves L D Lᵀ x = b, writing x to dst (dst may be b).
func (f *LDL) SolveTo(dst, b []float64) {
	n, w, d := f.N, f.W, f.Data
	if len(dst) != n || len(b) != n {
		panic("band: dimension mismatch")
	}
	copy(dst, b)
	for i := 0; i < n; i++ {
		s := dst[i]
		row := i * (w + 1)
		for j := max(0, i-w); j < i; j++ {
			s -= d[row+i-j] * dst[j]
		}
		dst[i] = s
	}
	for i := 0; i < n; i++ {
		dst[i] /= d[i*(w+1)]
	}
	for i := n - 1; i >= 0; i-- {
		s := dst[i]
		for k := i + 1; k <= min(n-1, i+w); k++ {
			s -= d[k*(w+1)+k-i] * dst[k]
		}
		dst[i] = s
	}
}

// MulVecTo sets dst = S x (dst must not alias x).
func (s *Sym) MulVecTo(dst, x []float64) {
	n, w, d := s.N, s.W, s.Data
	if len(dst) != n || len(x) != n {
		panic("band: dimension mismatch")
	}
	for i := range dst {
		dst[i] = d[i*(w+1)] * x[i]
	}
	for i := 0; i < n; i++ {
		row := i * (w + 1)
		for j := max(0, i-w); j < i; j++ {
			v := d[row+i-j]
			dst[i] += v * x[j]
			dst[j] += v * x[i]
		}
	}
}
