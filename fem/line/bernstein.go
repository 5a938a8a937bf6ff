package line

import (
	"math"

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

// applyF sets dst[i] ⊇ Σ_l t[i*len(c)+l] c[l]: an enclosed rational matrix
// applied to exact float coefficients.
func applyF(dst []interval.I, t []interval.I, c []float64) {
	nc := len(c)
	for i := range dst {
		acc := interval.I{}
		row := t[i*nc : (i+1)*nc]
		for l, cl := range c {
			if cl != 0 {
				acc = acc.Add(row[l].MulF(cl))
			}
		}
		dst[i] = acc
	}
}

// applyI sets dst[i] ⊇ Σ_j g[i*len(b)+j] b[j].
func applyI(dst []interval.I, g []interval.I, b []interval.I) {
	nb := len(b)
	for i := range dst {
		acc := interval.I{}
		row := g[i*nb : (i+1)*nb]
		for j, bj := range b {
			acc = acc.Add(row[j].Mul(bj))
		}
		dst[i] = acc
	}
}

// dotF returns an enclosure of Σ c_i b_i for exact floats c_i.
func dotF(c []float64, b []interval.I) interval.I {
	acc := interval.I{}
	for i, ci := range c {
		if ci != 0 {
			acc = acc.Add(b[i].MulF(ci))
		}
	}
	return acc
}

// dotI returns an enclosure of Σ a_i b_i.
func dotI(a, b []interval.I) interval.I {
	acc := interval.I{}
	for i := range a {
		acc = acc.Add(a[i].Mul(b[i]))
	}
	return acc
}

// weightedGram sets dst[a*(n+1)+b] ⊇ ∫_0^1 P B^n_a B^n_b for P = Σ_k p_k B^r_k
// (r = len(p)−1) plus the constant shift s: the exact weighted Gram
// matrix of the degree-n Bernstein basis. The shift enters every
// coefficient of P (partition of unity).
func weightedGram(dst []interval.I, p []interval.I, shift interval.I, n int) {
	r := len(p) - 1
	t := tripleTable(r, n, n).IV
	n1 := n + 1
	for ab := range dst[:n1*n1] {
		dst[ab] = interval.I{}
	}
	for k := 0; k <= r; k++ {
		pk := p[k].Add(shift)
		blk := t[k*n1*n1 : (k+1)*n1*n1]
		for a := 0; a < n1; a++ {
			for b := a; b < n1; b++ {
				dst[a*n1+b] = dst[a*n1+b].Add(pk.Mul(blk[a*n1+b]))
			}
		}
	}
	for a := 0; a < n1; a++ {
		for b := 0; b < a; b++ {
			dst[a*n1+b] = dst[b*n1+a]
		}
	}
}

// remainderBound returns t ≥ r·√(x)·√(y) for r, x, y ≥ 0 (upper rounded),
// the bound r_rad ‖u‖‖v‖ of a remainder term (package doc, Remainders).
func remainderBound(r, x, y float64) float64 {
	if r == 0 {
		return 0
	}
	if math.IsInf(r, 1) || math.IsNaN(r) {
		return math.Inf(1)
	}
	return interval.MulUp(r, interval.MulUp(interval.SqrtUp(math.Max(x, 0)), interval.SqrtUp(math.Max(y, 0))))
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
