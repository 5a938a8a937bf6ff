package tri

import (
	"math"

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

// applyI sets dst[i] ⊇ Σ_j g[i·len(b) + j] b[j].
func applyI(dst []interval.I, g []interval.I, b []interval.I) {
	nb := len(b)
	for i := range dst {
		acc := interval.I{}
		row := g[i*nb : (i+1)*nb]
		for j, bj := range b {
			if bj.Lo == 0 && bj.Hi == 0 {
				continue
			}
			acc = acc.Add(row[j].Mul(bj))
		}
		dst[i] = acc
	}
}

// applyF sets dst[i] ⊇ Σ_j g[i·len(c) + j] c[j] for exact floats c.
func applyF(dst []interval.I, g []interval.I, c []float64) {
	nc := len(c)
	for i := range dst {
		acc := interval.I{}
		row := g[i*nc : (i+1)*nc]
		for j, cj := range c {
			if cj != 0 {
				acc = acc.Add(row[j].MulF(cj))
			}
		}
		dst[i] = acc
	}
}

// dotI returns an enclosure of Σ a_i b_i.
func dotI(a, b []interval.I) interval.I {
	acc := interval.I{}
	for i := range a {
		acc = acc.Add(a[i].Mul(b[i]))
	}
	return acc
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

// weightedGram sets dst[a·N_p + b] ⊇ ∫_T (P + s) B^p_α B^p_β / |T| for
// P = Σ_κ w_κ B^q_κ (q the degree of len(w) coefficients) and the constant
// s: the exact weighted Gram matrix of the degree-p basis. The shift enters
// every coefficient of P (partition of unity).
func weightedGram(dst []interval.I, w []interval.I, q int, s interval.I, p int) {
	t := tripleTable(q, p, p).IV
	np := dim(p)
	nn := np * np
	for ab := range dst[:nn] {
		dst[ab] = interval.I{}
	}
	for k := range w {
		wk := w[k].Add(s)
		blk := t[k*nn : (k+1)*nn]
		for a := 0; a < np; a++ {
			for b := a; b < np; b++ {
				dst[a*np+b] = dst[a*np+b].Add(wk.Mul(blk[a*np+b]))
			}
		}
	}
	for a := 0; a < np; a++ {
		for b := 0; b < a; b++ {
			dst[a*np+b] = dst[b*np+a]
		}
	}
}

// remainderBound returns t ≥ r·√x·√y for r, x, y ≥ 0 (upper rounded): the
// bound r_rad ‖u‖‖v‖ of a remainder term (Cauchy–Schwarz; package doc,
// Remainders).
func remainderBound(r, x, y float64) float64 {
	if r == 0 {
		return 0
	}
	if math.IsInf(r, 1) || math.IsNaN(r) || math.IsInf(x, 1) || math.IsInf(y, 1) {
		return math.Inf(1)
	}
	return interval.MulUp(r, interval.MulUp(interval.SqrtUp(math.Max(x, 0)), interval.SqrtUp(math.Max(y, 0))))
}
