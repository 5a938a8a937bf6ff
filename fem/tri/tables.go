package tri

import (
	"gapcert/fem/internal/rattable"
	"math/big"
	"sync"
)

// This file holds the exact rational tables of the Bernstein calculus on a
// triangle T with barycentric coordinates λ = (λ_0, λ_1, λ_2). Each table is
// computed once in math/big and kept as the tightest float64 enclosure of
// every entry (proving side) and as the nearest float64 (choosing side).
//
// For a multi-index α = (α_0, α_1, α_2) with |α| = n the Bernstein
// polynomial is B^n_α = C(n, α) λ^α, C(n, α) = n!/(α_0! α_1! α_2!). The
// identities used, all exact (R. T. Farouki, The Bernstein polynomial basis:
// a centennial retrospective, Comput. Aided Geom. Design 29 (2012); the
// integral is the classical formula for barycentric monomials, e.g.
// Eisenberg–Malvern 1973):
//
//	∫_T λ_0^a λ_1^b λ_2^c = 2|T| a! b! c! / (a + b + c + 2)!         (integral)
//	∫_T B^n_α = |T| / C(n + 2, 2)                                     (from it)
//	λ^γ = Σ_(δ≥γ) C(n − |γ|, δ − γ)/C(n, δ) · B^n_δ,  |γ| ≤ n         (monomials)
//	Σ_α B^n_α = 1, B^n_α ≥ 0 on T                                     (range)
//
// The last identity makes the value of Σ b_α B^n_α at any point of T a
// convex combination of the b_α, so it lies in their hull.

// index enumerates the multi-indices of degree n in the fixed order
// α = (n − i − j, i, j) for i = 0..n, j = 0..n − i.
type index struct {
	n     int
	alpha [][3]int
	pos   map[[3]int]int
}

var (
	indexMu    sync.Mutex
	indexCache = map[int]*index{}
)

// multiIndex returns the enumeration of degree n (cached; read-only).
func multiIndex(n int) *index {
	indexMu.Lock()
	defer indexMu.Unlock()
	if ix, ok := indexCache[n]; ok {
		return ix
	}
	ix := &index{n: n, pos: map[[3]int]int{}}
	for i := 0; i <= n; i++ {
		for j := 0; j <= n-i; j++ {
			a := [3]int{n - i - j, i, j}
			ix.pos[a] = len(ix.alpha)
			ix.alpha = append(ix.alpha, a)
		}
	}
	indexCache[n] = ix
	return ix
}

// dim returns (n+1)(n+2)/2, the dimension of P_n on a triangle.
func dim(n int) int { return (n + 1) * (n + 2) / 2 }

// table is an exact rational array with its enclosures and nearest floats.
type table = rattable.Table

type tableKey = rattable.Key

// tableKeyOf names a table of this package by its kind and sizes.
func tableKeyOf(kind byte, a, b, c int) tableKey { return tableKey{Kind: kind, A: a, B: b, C: c} }

var tableCache rattable.Cache

// cached returns the table for key, building it from exact rationals once.
func cached(key tableKey, build func() []*big.Rat) *table { return tableCache.Get(key, build) }

// factorial returns a new big.Int n! (from a cache of the factorials
// computed so far; the tables need them up to a few dozen, many times).
func factorial(n int) *big.Int {
	factMu.Lock()
	defer factMu.Unlock()
	for len(factCache) <= n {
		k := len(factCache)
		f := big.NewInt(1)
		if k > 0 {
			f.Mul(factCache[k-1], big.NewInt(int64(k)))
		}
		factCache = append(factCache, f)
	}
	return new(big.Int).Set(factCache[max(n, 0)])
}

var (
	factMu    sync.Mutex
	factCache []*big.Int
)

func binom(n, k int) *big.Int {
	if k < 0 || k > n {
		return new(big.Int)
	}
	return new(big.Int).Binomial(int64(n), int64(k))
}

// multinom returns C(|α|, α) = |α|!/(α_0! α_1! α_2!).
func multinom(a [3]int) *big.Int {
	r := factorial(a[0] + a[1] + a[2])
	for _, k := range a {
		r.Quo(r, factorial(k))
	}
	return r
}

func add3(a, b [3]int) [3]int { return [3]int{a[0] + b[0], a[1] + b[1], a[2] + b[2]} }

// baryIntegralRat returns ∫_T λ_0^a λ_1^b λ_2^c / |T| = 2 a! b! c!/(a+b+c+2)!.
func baryIntegralRat(a [3]int) *big.Rat {
	num := new(big.Int).Mul(factorial(a[0]), factorial(a[1]))
	num.Mul(num, factorial(a[2]))
	num.Lsh(num, 1)
	return new(big.Rat).SetFrac(num, factorial(a[0]+a[1]+a[2]+2))
}

// tripleTable returns T[(k·N_m + i)·N_n + j] = ∫_T B^r_κ B^m_α B^n_β / |T|
// (κ, α, β the k-th, i-th, j-th multi-indices of degrees r, m, n)
// = C(r,κ) C(m,α) C(n,β) ∫_T λ^(κ+α+β) / |T| (the integral formula). With
// r = 0 it is the Gram matrix of the Bernstein bases of degrees m and n.
func tripleTable(r, m, n int) *table {
	return cached(tableKeyOf('t', r, m, n), func() []*big.Rat {
		ir, im, in := multiIndex(r), multiIndex(m), multiIndex(n)
		out := make([]*big.Rat, 0, len(ir.alpha)*len(im.alpha)*len(in.alpha))
		for _, k := range ir.alpha {
			for _, a := range im.alpha {
				for _, b := range in.alpha {
					num := new(big.Int).Mul(multinom(k), multinom(a))
					num.Mul(num, multinom(b))
					w := baryIntegralRat(add3(add3(k, a), b))
					out = append(out, w.Mul(w, new(big.Rat).SetInt(num)))
				}
			}
		}
		return out
	})
}

// monomialTable returns W[k·N_q + t], the coefficient of B^q_δ (δ the
// t-th multi-index of degree q) in λ_1^i λ_2^j, where (i, j) is the k-th
// pair of monomialPairs(q): C(q − i − j, δ − γ)/C(q, δ) for δ ≥ γ =
// (0, i, j), else 0.
func monomialTable(q int) *table {
	return cached(tableKeyOf('m', q, 0, 0), func() []*big.Rat { return monomialRats(q) })
}

// monomialRats returns the exact entries of monomialTable(q).
func monomialRats(q int) []*big.Rat {
	iq := multiIndex(q)
	pairs := monomialPairs(q)
	out := make([]*big.Rat, 0, len(pairs)*len(iq.alpha))
	for _, ij := range pairs {
		g := [3]int{0, ij[0], ij[1]}
		for _, d := range iq.alpha {
			w := new(big.Rat)
			if d[1] >= g[1] && d[2] >= g[2] {
				rest := [3]int{d[0], d[1] - g[1], d[2] - g[2]}
				w.SetFrac(multinom(rest), multinom(d))
			}
			out = append(out, w)
		}
	}
	return out
}

// elevationTable returns E[α·N_m + β], the coefficient of B^d_α in
// B^m_β (m ≤ d): from B^m_β = B^m_β Σ_(|γ|=d−m) B^(d−m)_γ,
// E = C(m, β) C(d − m, α − β)/C(d, α) for α ≥ β, else 0 (Farouki 2012).
func elevationTable(m, d int) *table {
	return cached(tableKeyOf('E', m, d, 0), func() []*big.Rat {
		im, id := multiIndex(m), multiIndex(d)
		out := make([]*big.Rat, 0, len(im.alpha)*len(id.alpha))
		for _, a := range id.alpha {
			for _, b := range im.alpha {
				w := new(big.Rat)
				if a[0] >= b[0] && a[1] >= b[1] && a[2] >= b[2] {
					num := new(big.Int).Mul(multinom(b), multinom([3]int{a[0] - b[0], a[1] - b[1], a[2] - b[2]}))
					w.SetFrac(num, multinom(a))
				}
				out = append(out, w)
			}
		}
		return out
	})
}

// monomialPairs returns the exponent pairs (i, j), i + j ≤ q, in the order
// of monomialTable: i = 0..q, j = 0..q − i.
func monomialPairs(q int) [][2]int {
	var out [][2]int
	for i := 0; i <= q; i++ {
		for j := 0; j <= q-i; j++ {
			out = append(out, [2]int{i, j})
		}
	}
	return out
}

// edgeGramTable returns G[i·(p+1) + j] = ∫_0^1 B^p_i B^p_j dt =
// C(p,i) C(p,j) / (C(2p, i+j)(2p+1)), the Gram matrix of the univariate
// Bernstein basis on an edge parametrised by t ∈ [0, 1].
func edgeGramTable(p int) *table {
	return cached(tableKeyOf('e', p, 0, 0), func() []*big.Rat {
		out := make([]*big.Rat, 0, (p+1)*(p+1))
		for i := 0; i <= p; i++ {
			for j := 0; j <= p; j++ {
				num := new(big.Int).Mul(binom(p, i), binom(p, j))
				den := new(big.Int).Mul(binom(2*p, i+j), big.NewInt(int64(2*p+1)))
				out = append(out, new(big.Rat).SetFrac(num, den))
			}
		}
		return out
	})
}
