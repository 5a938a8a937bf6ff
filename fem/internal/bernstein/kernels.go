package bernstein

import (
	"math"

	"gapcert/interval"
)

// ApplyF sets dst[i] ⊇ Σ_l t[i·len(c) + l] c[l]: an enclosed exact matrix
// (row-major, len(dst) rows) applied to exact float coefficients. Zero
// coefficients are skipped (their terms are exactly 0).
func ApplyF(dst []interval.I, t []interval.I, c []float64) {
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

// ApplyI sets dst[i] ⊇ Σ_j g[i·len(b) + j] b[j]. Terms with b[j] = [0, 0]
// are skipped: interval.I.Mul returns exactly [+0, +0] for them, whatever
// the other factor, so skipping leaves every sum unchanged.
func ApplyI(dst []interval.I, g []interval.I, b []interval.I) {
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

// DotF returns an enclosure of Σ c_i b_i for exact floats c_i.
func DotF(c []float64, b []interval.I) interval.I {
	acc := interval.I{}
	for i, ci := range c {
		if ci != 0 {
			acc = acc.Add(b[i].MulF(ci))
		}
	}
	return acc
}

// DotI returns an enclosure of Σ a_i b_i.
func DotI(a, b []interval.I) interval.I {
	acc := interval.I{}
	for i := range a {
		acc = acc.Add(a[i].Mul(b[i]))
	}
	return acc
}

// WeightedGram sets dst[a·nb + b] ⊇ Σ_k (w_k + s) T_k[a·nb + b] for the
// basis of nb functions, where triple holds len(w) consecutive nb×nb
// blocks T_k ∋ ∫_K B^q_k φ_a φ_b / |K| (the triple-product table of the
// weight's Bernstein basis B^q and the basis φ). For P = Σ_k w_k B^q_k this
// is ∫_K (P + s) φ_a φ_b / |K|, the exact weighted Gram matrix: the constant
// s enters every coefficient of P because the B^q_k sum to 1 (partition of
// unity). The upper triangle is accumulated and mirrored, so dst is
// exactly symmetric. It panics if triple or dst is too short.
func WeightedGram(dst []interval.I, triple []interval.I, w []interval.I, s interval.I, nb int) {
	nn := nb * nb
	if len(dst) < nn || len(triple) < len(w)*nn {
		panic("bernstein: weighted Gram table or destination too short")
	}
	for ab := range dst[:nn] {
		dst[ab] = interval.I{}
	}
	for k := range w {
		wk := w[k].Add(s)
		blk := triple[k*nn : (k+1)*nn]
		for a := 0; a < nb; a++ {
			for b := a; b < nb; b++ {
				dst[a*nb+b] = dst[a*nb+b].Add(wk.Mul(blk[a*nb+b]))
			}
		}
	}
	for a := 0; a < nb; a++ {
		for b := 0; b < a; b++ {
			dst[a*nb+b] = dst[b*nb+a]
		}
	}
}

// RemainderBound returns t with
//
//	t ≥ r·√x·√y   for all reals r, x, y ≥ 0,
//
// the bound r_rad ‖u‖‖v‖ of a remainder term (package doc, Remainders)
// when x ≥ ‖u‖² and y ≥ ‖v‖². Each product and square root is rounded up
// (interval.MulUp, interval.SqrtUp), and slightly negative x or y (upper
// bounds of a norm² that rounding left below 0) count as 0, which only
// raises t since the true norms are ≥ 0.
//
// Special arguments: r = 0 gives exactly 0 (the term vanishes for any
// finite norms). Otherwise an infinite or NaN r, x or y gives +Inf, the
// only bound that holds when an argument carries no information; without
// this guard MulUp would return 0 for ∞·0 (its 0·∞ = 0 convention) and
// state a finite bound for an unbounded norm.
func RemainderBound(r, x, y float64) float64 {
	if r == 0 {
		return 0
	}
	if math.IsInf(r, 0) || math.IsNaN(r) || math.IsInf(x, 1) || math.IsInf(y, 1) || math.IsNaN(x) || math.IsNaN(y) {
		return math.Inf(1)
	}
	return interval.MulUp(r, interval.MulUp(interval.SqrtUp(math.Max(x, 0)), interval.SqrtUp(math.Max(y, 0))))
}
