package line

import (
	"gapcert/interval"
)

// Interval kernels of the Bernstein calculus (identities in tables.go).
// Every function here encloses the exact coefficients of its result for
// every choice of exact inputs inside the interval arguments.

// bernRange returns an enclosure of {Σ b_i B^n_i(ξ) : ξ ∈ [0, 1]}: the hull
// of the coefficients (range identity).
func bernRange(b []interval.I) interval.I {
	r := b[0]
	for _, v := range b[1:] {
		r = r.Hull(v)
	}
	return r
}

// bernDeriv sets dst[i] ⊇ n(b[i+1] − b[i]), i = 0..n−1 (n = len(b) − 1),
// the Bernstein coefficients of the derivative.
func bernDeriv(dst, b []interval.I) {
	n := len(b) - 1
	if len(dst) != n {
		panic("line: derivative length mismatch")
	}
	for i := 0; i < n; i++ {
		dst[i] = b[i+1].Sub(b[i]).MulF(float64(n))
	}
}

// bernElevate sets dst to the coefficients of b raised to degree len(dst)−1.
func bernElevate(dst, b []interval.I) {
	n, m := len(b)-1, len(dst)-1
	if m < n {
		panic("line: elevation to a lower degree")
	}
	if m == n {
		copy(dst, b)
		return
	}
	e := elevationTable(n, m).IV
	for i := 0; i <= m; i++ {
		acc := interval.I{}
		for j := 0; j <= n; j++ {
			if w := e[i*(n+1)+j]; w.Hi != 0 {
				acc = acc.Add(w.Mul(b[j]))
			}
		}
		dst[i] = acc
	}
}

// bernProduct sets dst (length len(a)+len(b)−1) to the coefficients of the
// product of a and b.
func bernProduct(dst, a, b []interval.I) {
	m, n := len(a)-1, len(b)-1
	if len(dst) != m+n+1 {
		panic("line: product length mismatch")
	}
	w := productTable(m, n).IV
	for k := range dst {
		dst[k] = interval.I{}
	}
	for i := 0; i <= m; i++ {
		for j := 0; j <= n; j++ {
			dst[i+j] = dst[i+j].Add(w[i*(n+1)+j].Mul(a[i].Mul(b[j])))
		}
	}
}

// bernFromMonomial sets dst (degree n = len(dst)−1 ≥ len(c)−1) to the
// Bernstein coefficients of Σ_j c_j ξ^j.
func bernFromMonomial(dst, c []interval.I) {
	n := len(dst) - 1
	if len(c) > n+1 {
		panic("line: monomial degree above the Bernstein degree")
	}
	w := monomialTable(n).IV
	for i := 0; i <= n; i++ {
		acc := interval.I{}
		for j := 0; j < len(c) && j <= i; j++ {
			acc = acc.Add(w[i*(n+1)+j].Mul(c[j]))
		}
		dst[i] = acc
	}
}

// bernIntegral returns an enclosure of ∫_0^1 Σ b_i B^n_i = (Σ b_i)/(n+1).
func bernIntegral(b []interval.I) interval.I {
	s := interval.I{}
	for _, v := range b {
		s = s.Add(v)
	}
	return s.DivF(float64(len(b)))
}

// deCasteljau evaluates Σ b_i B^n_i(ξ) in floating point (a choice: used
// for plots and approximate solves only). work must have len(b) entries.
func deCasteljau(b []float64, xi float64, work []float64) float64 {
	copy(work, b)
	for r := len(b) - 1; r > 0; r-- {
		for i := 0; i < r; i++ {
			work[i] = (1-xi)*work[i] + xi*work[i+1]
		}
	}
	return work[0]
}
