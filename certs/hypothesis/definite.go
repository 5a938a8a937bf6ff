package hypothesis

import "gapcert/interval"

// positiveDefiniteByShift reports whether every symmetric matrix H with
// H_ij = H_ji ∈ h[i][j] (i ≤ j) is positive definite. It succeeds where
// the principal minors of the interval matrix fail from cancellation
// (for 2I + a·J with a ∈ [2.4, 3.3], J the all-ones matrix, the
// determinant's expansion over the entries has a negative lower end
// though every such matrix has eigenvalues ≥ 2).
//
// Test used. Let M be the symmetric float matrix of the midpoints of the
// enclosures, r_ij ≥ |H_ij − M_ij| their radii and σ ≥ (Σ_ij r_ij²)^{1/2}.
// E = H − M is symmetric with ‖E‖₂ ≤ ‖E‖_F ≤ σ, so by Weyl's inequality
// λ_min(H) ≥ λ_min(M) − ‖E‖₂ ≥ λ_min(M − σI) (R. A. Horn and C. R.
// Johnson, Matrix Analysis, Cambridge University Press 1985, Theorem
// 4.3.1; the same test in S. M. Rump, Verification of positive
// definiteness, BIT 46 (2006) 433–452; both recalled from memory). The
// symmetric matrix M − σI is positive definite if and only if its
// Cholesky factorisation has positive pivots (common practice); the
// factorisation is computed in interval arithmetic, so it encloses the
// exact pivots, and the test succeeds when every pivot's enclosure is
// > 0. Then λ_min(H) > 0 for every such H.
func positiveDefiniteByShift(h [][]interval.I) bool {
	n := len(h)
	mid := make([][]float64, n)
	var r2 interval.I
	for i := range n {
		mid[i] = make([]float64, n)
		for j := range n {
			e := h[min(i, j)][max(i, j)]
			if !e.IsBounded() {
				return false
			}
			mid[i][j] = e.Mid()
			r := interval.Point(e.Rad())
			r2 = r2.Add(r.Mul(r))
		}
	}
	s, _ := r2.Sqrt() // r2 ≥ 0
	sigma := interval.Point(s.Hi)
	l := make([][]interval.I, n)
	for k := range n {
		l[k] = make([]interval.I, n)
	}
	for k := range n {
		pivot := interval.Point(mid[k][k]).Sub(sigma)
		for j := range k {
			pivot = pivot.Sub(l[k][j].Sqr())
		}
		if !(pivot.Lo > 0) { // also refuses NaN
			return false
		}
		lkk, _ := pivot.Sqrt() // pivot > 0
		l[k][k] = lkk
		for i := k + 1; i < n; i++ {
			x := interval.Point(mid[i][k])
			for j := range k {
				x = x.Sub(l[i][j].Mul(l[k][j]))
			}
			l[i][k] = x.Div(lkk)
		}
	}
	return true
}
