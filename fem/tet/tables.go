package tet

import (
	"math/big"
	"sync"

	"gapcert/fem/internal/rattable"
)

// This file holds the exact rational tables of the Bernstein calculus on a
// tetrahedron T with barycentric coordinates λ = (λ_0, λ_1, λ_2, λ_3) (and
// on a triangle face, with three). Each table is computed once in
// math/big and kept as the tightest float64 enclosure of every entry
// (proving side) and as the nearest float64 (choosing side).
//
// For a multi-index α with |α| = n the Bernstein polynomial is
// B^n_α = C(n, α) λ^α, C(n, α) = n!/Π α_i!. The identities used, all
// exact (R. T. Farouki, The Bernstein polynomial basis: a centennial
// retrospective, Comput. Aided Geom. Design 29 (2012); the
// integral is the classical formula for barycentric monomials on a
// d-simplex S, e.g. Eisenberg–Malvern 1973):
//
//	∫_S λ^a = d! |S| Π a_i! / (|a| + d)!                     (integral; d = 3 on T, 2 on a face)
//	λ^γ = Σ_(δ≥γ) C(n − |γ|, δ − γ)/C(n, δ) · B^n_δ,  |γ| ≤ n  (monomials)
//	Σ_α B^n_α = 1, B^n_α ≥ 0 on S                            (range)
//
// The last identity makes the value of Σ b_α B^n_α at any point of S a
// convex combination of the b_α, so it lies in their hull.

// index enumerates the multi-indices of degree n in nb components (3: a
// triangle, 4: a tetrahedron; unused components are 0), in the order
// α = (n − i − j − k, i, j, k) for i = 0..n, j = 0..n − i, k = 0..n − i − j
// (for nb = 3: α = (n − i − j, i, j, 0)).
type index struct {
	n, nb int
	alpha [][4]int
	pos   map[[4]int]int
}

var (
	indexMu    sync.Mutex
	indexCache = map[[2]int]*index{}
)

// multiIndex returns the enumeration of degree n in nb components (cached;
// read-only).
func multiIndex(nb, n int) *index {
	indexMu.Lock()
	defer indexMu.Unlock()
	if ix, ok := indexCache[[2]int{nb, n}]; ok {
		return ix
	}
	ix := &index{n: n, nb: nb, pos: map[[4]int]int{}}
	add := func(a [4]int) {
		ix.pos[a] = len(ix.alpha)
		ix.alpha = append(ix.alpha, a)
	}
	for i := 0; i <= n; i++ {
		for j := 0; j <= n-i; j++ {
			if nb == 3 {
				add([4]int{n - i - j, i, j, 0})
				continue
			}
			for k := 0; k <= n-i-j; k++ {
				add([4]int{n - i - j - k, i, j, k})
			}
		}
	}
	indexCache[[2]int{nb, n}] = ix
	return ix
}

// dim3 returns (n+1)(n+2)(n+3)/6, the dimension of P_n on a tetrahedron.
func dim3(n int) int { return (n + 1) * (n + 2) * (n + 3) / 6 }

// dim2 returns (n+1)(n+2)/2, the dimension of P_n on a triangle.
func dim2(n int) int { return (n + 1) * (n + 2) / 2 }

type table = rattable.Table

var tableCache rattable.Cache

func cached(kind byte, a, b, c int, build func() []*big.Rat) *table {
	return tableCache.Get(rattable.Key{Kind: kind, A: a, B: b, C: c}, build)
}

var (
	factMu    sync.Mutex
	factCache []*big.Int
)

// factorial returns a new big.Int n!.
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

// multinom returns C(|α|, α) = |α|!/Π α_i!.
func multinom(a [4]int) *big.Int {
	r := factorial(a[0] + a[1] + a[2] + a[3])
	for _, k := range a {
		r.Quo(r, factorial(k))
	}
	return r
}

func add4(a, b [4]int) [4]int { return [4]int{a[0] + b[0], a[1] + b[1], a[2] + b[2], a[3] + b[3]} }

// baryIntegralRat returns ∫_S λ^a / |S| = d! Π a_i!/(|a| + d)! on a simplex
// of dimension d = nb − 1.
func baryIntegralRat(nb int, a [4]int) *big.Rat {
	num := factorial(nb - 1)
	for _, k := range a {
		num.Mul(num, factorial(k))
	}
	return new(big.Rat).SetFrac(num, factorial(a[0]+a[1]+a[2]+a[3]+nb-1))
}

// tripleTable returns T[(k·N_m + i)·N_n + j] = ∫_S B^r_κ B^m_α B^n_β / |S|
// on a simplex with nb barycentric coordinates (κ, α, β the k-th, i-th,
// j-th multi-indices of degrees r, m, n) = C(r,κ) C(m,α) C(n,β) ∫_S
// λ^(κ+α+β) / |S|. With r = 0 it is the Gram matrix of the Bernstein bases
// of degrees m and n.
func tripleTable(nb, r, m, n int) *table {
	return cached(byte('0'+nb), r, m, n, func() []*big.Rat {
		ir, im, in := multiIndex(nb, r), multiIndex(nb, m), multiIndex(nb, n)
		out := make([]*big.Rat, 0, len(ir.alpha)*len(im.alpha)*len(in.alpha))
		for _, k := range ir.alpha {
			for _, a := range im.alpha {
				for _, b := range in.alpha {
					num := new(big.Int).Mul(multinom(k), multinom(a))
					num.Mul(num, multinom(b))
					w := baryIntegralRat(nb, add4(add4(k, a), b))
					out = append(out, w.Mul(w, new(big.Rat).SetInt(num)))
				}
			}
		}
		return out
	})
}

// monomialTable returns W[k·N_q + t], the coefficient of B^q_δ (δ the
// t-th multi-index of degree q on the tetrahedron) in λ_1^i λ_2^j λ_3^l,
// (i, j, l) the k-th triple of monomialTriples(q): C(q − |γ|, δ − γ)/C(q, δ)
// for δ ≥ γ = (0, i, j, l), else 0.
func monomialTable(q int) *table {
	return cached('m', q, 0, 0, func() []*big.Rat {
		iq := multiIndex(4, q)
		trip := monomialTriples(q)
		out := make([]*big.Rat, 0, len(trip)*len(iq.alpha))
		for _, g := range trip {
			for _, d := range iq.alpha {
				w := new(big.Rat)
				if d[1] >= g[0] && d[2] >= g[1] && d[3] >= g[2] {
					rest := [4]int{d[0], d[1] - g[0], d[2] - g[1], d[3] - g[2]}
					w.SetFrac(multinom(rest), multinom(d))
				}
				out = append(out, w)
			}
		}
		return out
	})
}

// monomialTriples returns the exponent triples (i, j, l), i + j + l ≤ q, in
// the order of monomialTable.
func monomialTriples(q int) [][3]int {
	var out [][3]int
	for i := 0; i <= q; i++ {
		for j := 0; j <= q-i; j++ {
			for l := 0; l <= q-i-j; l++ {
				out = append(out, [3]int{i, j, l})
			}
		}
	}
	return out
}
