package tet

import (
	"math/big"
	"sync"

	"gapcert/fem/internal/rattable"
)

// Exact Bernstein calculus on a tetrahedron T with barycentric coordinates
// λ = (λ_0, λ_1, λ_2, λ_3), as the flux space needs it (the names carry the
// prefix rt so that they stay apart from the trial space's own tables).
// For a multi-index α with |α| = n, B^n_α = C(n, α) λ^α with the multinomial
// coefficient C(n, α) = n!/(α_0! α_1! α_2! α_3!). The identities, all exact
// (R. T. Farouki, The Bernstein polynomial basis: a centennial
// retrospective, Comput. Aided Geom. Design 29 (2012) 379–419; the
// integral is the classical formula for barycentric monomials, e.g.
// A. Eisenberg, L. E. Malvern, On finite element integration in natural
// co-ordinates, Int. J. Numer. Methods Eng. 7 (1973) 574–575; page numbers
// of both recalled from memory):
//
//	∫_T λ^a / |T| = 3! a_0! a_1! a_2! a_3! / (|a| + 3)!              (tetrahedron)
//	∫_F μ^a / |F| = 2! a_0! a_1! a_2! / (|a| + 2)!                    (triangle F)
//	λ^γ = Σ_(δ ≥ γ, |δ| = n) C(n − |γ|, δ − γ)/C(n, δ) · B^n_δ          (monomials)
//	B^m_β = Σ_(α ≥ β, |α| = d) C(m, β) C(d − m, α − β)/C(d, α) · B^d_α  (elevation)
//	∂B^n_α/∂λ_j = n B^(n−1)_(α − e_j)                                  (derivative)
//	Σ_α B^n_α = 1, B^n_α ≥ 0 on T                                      (partition of unity)

// rtIndex enumerates the multi-indices of degree n over the four vertices
// in the fixed order α = (n − i − j − l, i, j, l), i = 0..n, j = 0..n − i,
// l = 0..n − i − j.
type rtIndex struct {
	n     int
	alpha [][4]int
	pos   map[[4]int]int
}

// rtFaceIndex enumerates the multi-indices of degree n over the three
// vertices of a face in the order β = (n − i − j, i, j).
type rtFaceIndex struct {
	n     int
	alpha [][3]int
	pos   map[[3]int]int
}

var (
	rtIndexMu    sync.Mutex
	rtIndexCache = map[int]*rtIndex{}
	rtFaceCache  = map[int]*rtFaceIndex{}
)

// rtMulti returns the enumeration of degree n (cached; read-only).
func rtMulti(n int) *rtIndex {
	rtIndexMu.Lock()
	defer rtIndexMu.Unlock()
	if ix, ok := rtIndexCache[n]; ok {
		return ix
	}
	ix := &rtIndex{n: n, pos: map[[4]int]int{}}
	for i := 0; i <= n; i++ {
		for j := 0; j <= n-i; j++ {
			for l := 0; l <= n-i-j; l++ {
				a := [4]int{n - i - j - l, i, j, l}
				ix.pos[a] = len(ix.alpha)
				ix.alpha = append(ix.alpha, a)
			}
		}
	}
	rtIndexCache[n] = ix
	return ix
}

// rtFaceMulti returns the face enumeration of degree n (cached; read-only).
func rtFaceMulti(n int) *rtFaceIndex {
	rtIndexMu.Lock()
	defer rtIndexMu.Unlock()
	if ix, ok := rtFaceCache[n]; ok {
		return ix
	}
	ix := &rtFaceIndex{n: n, pos: map[[3]int]int{}}
	for i := 0; i <= n; i++ {
		for j := 0; j <= n-i; j++ {
			a := [3]int{n - i - j, i, j}
			ix.pos[a] = len(ix.alpha)
			ix.alpha = append(ix.alpha, a)
		}
	}
	rtFaceCache[n] = ix
	return ix
}

// rtDim returns (n+1)(n+2)(n+3)/6, the dimension of P_n on a tetrahedron
// (0 for n < 0).
func rtDim(n int) int {
	if n < 0 {
		return 0
	}
	return (n + 1) * (n + 2) * (n + 3) / 6
}

// rtFaceDim returns (n+1)(n+2)/2, the dimension of P_n on a triangle.
func rtFaceDim(n int) int { return (n + 1) * (n + 2) / 2 }

var (
	rtFactMu    sync.Mutex
	rtFactCache []*big.Int
)

// rtFactorial returns a new big.Int n!.
func rtFactorial(n int) *big.Int {
	rtFactMu.Lock()
	defer rtFactMu.Unlock()
	for len(rtFactCache) <= n {
		k := len(rtFactCache)
		f := big.NewInt(1)
		if k > 0 {
			f.Mul(rtFactCache[k-1], big.NewInt(int64(k)))
		}
		rtFactCache = append(rtFactCache, f)
	}
	return new(big.Int).Set(rtFactCache[max(n, 0)])
}

// rtMultinom returns |a|!/Π a_j! for a nonnegative multi-index a.
func rtMultinom(a ...int) *big.Int {
	s := 0
	for _, k := range a {
		s += k
	}
	r := rtFactorial(s)
	for _, k := range a {
		r.Quo(r, rtFactorial(k))
	}
	return r
}

// rtBaryIntegral returns ∫_T λ^a / |T| = 6 Π a_j! / (|a| + 3)!.
func rtBaryIntegral(a [4]int) *big.Rat {
	num := big.NewInt(6)
	for _, k := range a {
		num.Mul(num, rtFactorial(k))
	}
	return new(big.Rat).SetFrac(num, rtFactorial(a[0]+a[1]+a[2]+a[3]+3))
}

// rtFaceIntegral returns ∫_F μ^a / |F| = 2 Π a_j! / (|a| + 2)!.
func rtFaceIntegral(a [3]int) *big.Rat {
	num := big.NewInt(2)
	for _, k := range a {
		num.Mul(num, rtFactorial(k))
	}
	return new(big.Rat).SetFrac(num, rtFactorial(a[0]+a[1]+a[2]+2))
}

var rtTables rattable.Cache

// rtTripleRat returns T[(κ·N_m + α)·N_n + β] = ∫_T B^r_κ B^m_α B^n_β / |T|
// exactly; with r = 0 the Gram matrix of degrees m and n.
func rtTripleRat(r, m, n int) []*big.Rat {
	ir, im, in := rtMulti(r), rtMulti(m), rtMulti(n)
	out := make([]*big.Rat, 0, len(ir.alpha)*len(im.alpha)*len(in.alpha))
	for _, k := range ir.alpha {
		ck := rtMultinom(k[:]...)
		for _, a := range im.alpha {
			cka := new(big.Int).Mul(ck, rtMultinom(a[:]...))
			for _, b := range in.alpha {
				num := new(big.Int).Mul(cka, rtMultinom(b[:]...))
				s := [4]int{k[0] + a[0] + b[0], k[1] + a[1] + b[1], k[2] + a[2] + b[2], k[3] + a[3] + b[3]}
				w := rtBaryIntegral(s)
				out = append(out, w.Mul(w, new(big.Rat).SetInt(num)))
			}
		}
	}
	return out
}

// rtTriple returns the enclosed and rounded table of rtTripleRat.
func rtTriple(r, m, n int) *rattable.Table {
	return rtTables.Get(rattable.Key{Kind: 't', A: r, B: m, C: n}, func() []*big.Rat { return rtTripleRat(r, m, n) })
}

// rtElevationRat returns E[α·N_m + β], the coefficient of B^d_α in B^m_β
// (m ≤ d): C(m, β) C(d − m, α − β)/C(d, α) for α ≥ β, else 0.
func rtElevationRat(m, d int) []*big.Rat {
	im, id := rtMulti(m), rtMulti(d)
	out := make([]*big.Rat, 0, len(im.alpha)*len(id.alpha))
	for _, a := range id.alpha {
		for _, b := range im.alpha {
			w := new(big.Rat)
			if a[0] >= b[0] && a[1] >= b[1] && a[2] >= b[2] && a[3] >= b[3] {
				num := new(big.Int).Mul(rtMultinom(b[:]...), rtMultinom(a[0]-b[0], a[1]-b[1], a[2]-b[2], a[3]-b[3]))
				w.SetFrac(num, rtMultinom(a[:]...))
			}
			out = append(out, w)
		}
	}
	return out
}

// rtElevation returns the enclosed and rounded table of rtElevationRat.
func rtElevation(m, d int) *rattable.Table {
	return rtTables.Get(rattable.Key{Kind: 'E', A: m, B: d}, func() []*big.Rat { return rtElevationRat(m, d) })
}

// rtFaceGram returns G[α·N + β] = ∫_F B^k_α B^k_β / |F| on a triangle F
// (N = rtFaceDim(k)).
func rtFaceGram(k int) *rattable.Table {
	return rtTables.Get(rattable.Key{Kind: 'f', A: k}, func() []*big.Rat {
		ix := rtFaceMulti(k)
		out := make([]*big.Rat, 0, len(ix.alpha)*len(ix.alpha))
		for _, a := range ix.alpha {
			for _, b := range ix.alpha {
				num := new(big.Int).Mul(rtMultinom(a[:]...), rtMultinom(b[:]...))
				w := rtFaceIntegral([3]int{a[0] + b[0], a[1] + b[1], a[2] + b[2]})
				out = append(out, w.Mul(w, new(big.Rat).SetInt(num)))
			}
		}
		return out
	})
}
