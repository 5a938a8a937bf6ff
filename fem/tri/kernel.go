package tri

import (
	"gapcert/interval"
)

// Interval kernels of the Bernstein calculus on one triangle (identities in
// tables.go). Every function here encloses the exact value of its result
// for every choice of exact inputs inside the interval arguments.
//
// Gradients. A polynomial u = Σ_α u_α B^p_α, written as a polynomial U in
// (λ_0, λ_1, λ_2), has ∇u = Σ_k ∂U/∂λ_k ∇λ_k (the λ_k are affine in x) and
// ∂U/∂λ_k = p Σ_(|β|=p−1) u_(β+e_k) B^(p−1)_β. Since Σ_k ∇λ_k = 0,
//
//	∇u = p Σ_β [(u_(β+e_1) − u_(β+e_0)) ∇λ_1 + (u_(β+e_2) − u_(β+e_0)) ∇λ_2] B^(p−1)_β,
//
// so with D_k u = (u_(β+e_k) − u_(β+e_0))_β and g_kl = ∇λ_k·∇λ_l (k, l = 1, 2)
//
//	∫_T ∇u·∇v = p² |T| Σ_(k,l) g_kl (D_k u)ᵀ G^(p−1) (D_l v),
//
// G^n the Gram matrix ∫_T B^n_β B^n_γ / |T| (tripleTable(0, n, n)). The
// differences of exact floats are enclosed by one outward rounded
// subtraction, which keeps the enclosure tight for smooth u.

// diffPairs returns, for degree p and k = 1, 2, the index pairs
// (pos(β + e_k), pos(β + e_0)) over the multi-indices β of degree p − 1.
func diffPairs(p int) [2][][2]int {
	ip, iq := multiIndex(p), multiIndex(p-1)
	var out [2][][2]int
	for k := 1; k <= 2; k++ {
		ek := [3]int{}
		ek[k] = 1
		for _, b := range iq.alpha {
			out[k-1] = append(out[k-1], [2]int{ip.pos[add3(b, ek)], ip.pos[add3(b, [3]int{1, 0, 0})]})
		}
	}
	return out
}

// gradGram returns g_kl ⊇ ∇λ_k·∇λ_l for k, l ∈ {1, 2} (index k−1, l−1).
func gradGram(grad [3][2]interval.I) [2][2]interval.I {
	var g [2][2]interval.I
	for k := 0; k < 2; k++ {
		for l := 0; l <= k; l++ {
			a, b := grad[k+1], grad[l+1]
			g[k][l] = a[0].Mul(b[0]).Add(a[1].Mul(b[1]))
			g[l][k] = g[k][l]
		}
	}
	if g[0][0].Lo < 0 {
		g[0][0].Lo = 0
	}
	if g[1][1].Lo < 0 {
		g[1][1].Lo = 0
	}
	return g
}

// diffF sets dst[β] ⊇ c[pair[β][0]] − c[pair[β][1]] for exact floats c.
func diffF(dst []interval.I, pairs [][2]int, c []float64) {
	for b, pr := range pairs {
		dst[b] = interval.Point(c[pr[0]]).Sub(interval.Point(c[pr[1]]))
	}
}
