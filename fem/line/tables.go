package line

import (
	"gapcert/fem/internal/rattable"
	"math/big"
)

// This file holds the exact rational tables of the Bernstein calculus on
// the reference cell [0, 1]. Each table is computed once in math/big and
// kept in two forms: the tightest float64 enclosure of every entry (for
// the proving side) and the nearest float64 (for the choosing side).
//
// Bernstein polynomials of degree n are B^n_i(ξ) = C(n,i) ξ^i (1 − ξ)^(n−i),
// i = 0..n. The identities used (all exact; see R. T. Farouki, The
// Bernstein polynomial basis: a centennial retrospective, Comput. Aided
// Geom. Design 29 (2012)):
//
//	B^m_i B^n_j = C(m,i) C(n,j) / C(m+n,i+j) · B^(m+n)_(i+j)        (product)
//	∫_0^1 B^n_i dξ = 1/(n+1)                                        (integral)
//	d/dξ Σ b_i B^n_i = n Σ (b_(i+1) − b_i) B^(n−1)_i                (derivative)
//	Σ_i B^n_i = 1 and B^n_i ≥ 0 on [0, 1]                           (range)
//	B^n_j = Σ_i C(n,j) C(m−n,i−j) / C(m,i) · B^m_i,  m ≥ n           (elevation)
//	ξ^j = Σ_(i≥j) C(i,j)/C(n,j) · B^n_i                              (monomials)
//
// The range identity gives the enclosure property used throughout: on
// [0, 1] the value of Σ b_i B^n_i is a convex combination of the b_i, so it
// lies in the hull of the coefficients.

// table is an exact rational array with its enclosures and nearest floats.
type table = rattable.Table

type tableKey = rattable.Key

// tableKeyOf names a table of this package by its kind and sizes.
func tableKeyOf(kind byte, a, b, c int) tableKey { return tableKey{Kind: kind, A: a, B: b, C: c} }

var tableCache rattable.Cache

// cached returns the table for key, building it from exact rationals once.
func cached(key tableKey, build func() []*big.Rat) *table { return tableCache.Get(key, build) }

func binom(n, k int) *big.Int {
	if k < 0 || k > n {
		return new(big.Int)
	}
	return new(big.Int).Binomial(int64(n), int64(k))
}

// tripleTable returns T[(k*(m+1)+i)*(n+1)+j] = ∫_0^1 B^r_k B^m_i B^n_j dξ
// = C(r,k) C(m,i) C(n,j) / (C(r+m+n, k+i+j) (r+m+n+1)). With r = 0 it is
// the Gram matrix ∫ B^m_i B^n_j.
func tripleTable(r, m, n int) *table {
	return cached(tableKeyOf('t', r, m, n), func() []*big.Rat {
		out := make([]*big.Rat, (r+1)*(m+1)*(n+1))
		s := r + m + n
		for k := 0; k <= r; k++ {
			for i := 0; i <= m; i++ {
				for j := 0; j <= n; j++ {
					num := new(big.Int).Mul(binom(r, k), binom(m, i))
					num.Mul(num, binom(n, j))
					den := new(big.Int).Mul(binom(s, k+i+j), big.NewInt(int64(s+1)))
					out[(k*(m+1)+i)*(n+1)+j] = new(big.Rat).SetFrac(num, den)
				}
			}
		}
		return out
	})
}

// productTable returns P[i*(n+1)+j] = C(m,i) C(n,j) / C(m+n, i+j), the
// weight of a_i b_j in coefficient i+j of the degree-(m+n) product.
func productTable(m, n int) *table {
	return cached(tableKeyOf('p', m, n, 0), func() []*big.Rat {
		out := make([]*big.Rat, (m+1)*(n+1))
		for i := 0; i <= m; i++ {
			for j := 0; j <= n; j++ {
				num := new(big.Int).Mul(binom(m, i), binom(n, j))
				out[i*(n+1)+j] = new(big.Rat).SetFrac(num, binom(m+n, i+j))
			}
		}
		return out
	})
}

// elevationTable returns E[i*(n+1)+j], the coefficient of B^m_i in B^n_j
// (m ≥ n): C(n,j) C(m−n,i−j) / C(m,i).
func elevationTable(n, m int) *table {
	return cached(tableKeyOf('e', n, m, 0), func() []*big.Rat {
		out := make([]*big.Rat, (m+1)*(n+1))
		for i := 0; i <= m; i++ {
			for j := 0; j <= n; j++ {
				num := new(big.Int).Mul(binom(n, j), binom(m-n, i-j))
				out[i*(n+1)+j] = new(big.Rat).SetFrac(num, binom(m, i))
			}
		}
		return out
	})
}

// monomialTable returns W[i*(n+1)+j], the coefficient of B^n_i in ξ^j:
// C(i,j)/C(n,j) for i ≥ j, else 0.
func monomialTable(n int) *table {
	return cached(tableKeyOf('m', n, 0, 0), func() []*big.Rat {
		out := make([]*big.Rat, (n+1)*(n+1))
		for i := 0; i <= n; i++ {
			for j := 0; j <= n; j++ {
				out[i*(n+1)+j] = new(big.Rat).SetFrac(binom(i, j), binom(n, j))
			}
		}
		return out
	})
}

// hierarchicalRat returns the exact Bernstein coefficients of degree p of
// the local hierarchical basis on [0, 1], as H[i*(p+1)+l] = coefficient of
// B^p_i in basis function l:
//
//	l = 0:        1 − ξ                        (left vertex function)
//	l = 1..p−1:   ψ_(l+1)(ξ) = ∫_0^ξ P̃_l(t) dt  (bubble of degree l+1)
//	l = p:        ξ                            (right vertex function)
//
// where P̃_l(t) = P_l(2t − 1) is the shifted Legendre polynomial. Its
// Bernstein coefficients are (−1)^(l−k) C(l,k) (checked in the tests against the monomial form), so ψ_j
// has the degree-j coefficients d_k = (1/j) Σ_(i<k) (−1)^(j−1−i) C(j−1,i),
// d_0 = d_j = 0 (∫_0^1 P̃_l = 0 for l ≥ 1): the bubbles vanish at both ends.
func hierarchicalRat(p int) []*big.Rat {
	out := make([]*big.Rat, (p+1)*(p+1))
	for i := range out {
		out[i] = new(big.Rat)
	}
	for i := 0; i <= p; i++ {
		out[i*(p+1)+0].SetFrac64(int64(p-i), int64(p))
		out[i*(p+1)+p].SetFrac64(int64(i), int64(p))
	}
	for l := 1; l < p; l++ {
		j := l + 1
		d := make([]*big.Rat, j+1)
		sum := new(big.Int)
		for k := 0; k <= j; k++ {
			d[k] = new(big.Rat).SetFrac(sum, big.NewInt(int64(j)))
			if k < j {
				term := binom(j-1, k)
				if (j-1-k)%2 == 1 {
					term.Neg(term)
				}
				sum.Add(sum, term)
			}
		}
		// elevate from degree j to degree p
		for i := 0; i <= p; i++ {
			acc := new(big.Rat)
			for k := 0; k <= j && k <= i; k++ {
				if i-k > p-j {
					continue
				}
				num := new(big.Int).Mul(binom(j, k), binom(p-j, i-k))
				w := new(big.Rat).SetFrac(num, binom(p, i))
				acc.Add(acc, w.Mul(w, d[k]))
			}
			out[i*(p+1)+l] = acc
		}
	}
	return out
}

// hierarchicalTable is hierarchicalRat(p) enclosed.
func hierarchicalTable(p int) *table {
	return cached(tableKeyOf('h', p, 0, 0), func() []*big.Rat { return hierarchicalRat(p) })
}

// hierarchicalGramTables returns the exact local stiffness and mass
// matrices of the hierarchical basis on [0, 1]:
//
//	K[a*(p+1)+b] = ∫_0^1 φ_a' φ_b',   M[a*(p+1)+b] = ∫_0^1 φ_a φ_b,
//
// from the Bernstein coefficients (hierarchicalRat), the derivative rule
// and the Gram identity ∫B^n_i B^n_j = C(n,i)C(n,j)/(C(2n,i+j)(2n+1)).
// Working with these exact matrices keeps the enclosures of ∫u'v' and
// ∫uv free of the cancellation of high-degree Bernstein sums (the bubble
// block of K is diagonal: 1/(2j−1) for ψ_j).
func hierarchicalGramTables(p int) (k, m *table) {
	build := func(stiff bool) []*big.Rat {
		t := hierarchicalRat(p)
		p1 := p + 1
		n := p
		coef := t
		if stiff {
			n = p - 1
			coef = make([]*big.Rat, p*p1)
			for i := 0; i < p; i++ {
				for l := 0; l < p1; l++ {
					d := new(big.Rat).Sub(t[(i+1)*p1+l], t[i*p1+l])
					coef[i*p1+l] = d.Mul(d, big.NewRat(int64(p), 1))
				}
			}
		}
		n1 := n + 1
		gram := make([]*big.Rat, n1*n1)
		for i := 0; i < n1; i++ {
			for j := 0; j < n1; j++ {
				num := new(big.Int).Mul(binom(n, i), binom(n, j))
				den := new(big.Int).Mul(binom(2*n, i+j), big.NewInt(int64(2*n+1)))
				gram[i*n1+j] = new(big.Rat).SetFrac(num, den)
			}
		}
		out := make([]*big.Rat, p1*p1)
		gc := make([]*big.Rat, n1*p1)
		for i := 0; i < n1; i++ {
			for l := 0; l < p1; l++ {
				acc := new(big.Rat)
				for j := 0; j < n1; j++ {
					acc.Add(acc, new(big.Rat).Mul(gram[i*n1+j], coef[j*p1+l]))
				}
				gc[i*p1+l] = acc
			}
		}
		for a := 0; a < p1; a++ {
			for b := 0; b < p1; b++ {
				acc := new(big.Rat)
				for i := 0; i < n1; i++ {
					acc.Add(acc, new(big.Rat).Mul(coef[i*p1+a], gc[i*p1+b]))
				}
				out[a*p1+b] = acc
			}
		}
		return out
	}
	k = cached(tableKeyOf('K', p, 0, 0), func() []*big.Rat { return build(true) })
	m = cached(tableKeyOf('M', p, 0, 0), func() []*big.Rat { return build(false) })
	return k, m
}
