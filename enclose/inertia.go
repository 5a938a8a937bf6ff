package enclose

import (
	"math"

	"gapcert/interval"
)

// CountBelow returns the number of eigenvalues μ < tau of Ax = μBx, the
// same n for every member (A, B) of the pencil ([A], [B]) with B symmetric
// positive definite, or ok = false if the interval computation cannot decide
// it. tau is an exact float64. The caller is responsible for B being
// positive definite (see PositiveDefinite); it is not checked here.
//
// The chain of reasoning:
//
//  1. [C] = [A] − τ[B] is formed in outward rounded interval arithmetic, so
//     C = A − τB ∈ [C] for every member.
//  2. Symmetric Gaussian elimination of [C] in interval arithmetic, with a
//     symmetric pivot order P chosen from the interval data (a choice),
//     encloses for every member C the pivots d_k of PCPᵀ = LDLᵀ, L unit
//     lower triangular (inclusion monotonicity of interval arithmetic). If
//     no pivot interval contains 0, every member's elimination runs to the
//     end and the sign of each d_k is the sign of its interval.
//  3. C and D = diag(d_k) are congruent (C = (PᵀL) D (PᵀL)ᵀ), so by
//     Sylvester's law of inertia #neg(C) = #neg(D), the number of negative
//     pivot intervals.
//  4. With B = B^{1/2}B^{1/2} positive definite, A − τB =
//     B^{1/2}(B^{−1/2}AB^{−1/2} − τI)B^{1/2} is congruent to
//     B^{−1/2}AB^{−1/2} − τI, whose negative eigenvalues are the μ − τ with
//     μ < τ; Sylvester again gives #neg(A − τB) = #{μ < τ}.
//
// If the direct elimination is undecided, CountBelow repeats it on the
// congruent pencil (XᵀAX, XᵀBX), X the approximate eigenvectors of
// mid(A) − τ mid(B) (a choice), after proving X nonsingular by verifying
// that every member of the enclosure of XᵀX is positive definite; the
// congruence leaves the eigenvalues of the pencil unchanged. Preconditioning
// makes the elimination nearly diagonal, so it decides for τ much closer to
// an eigenvalue.
//
// CountBelow panics if a and b differ in size.
func CountBelow(a, b *Sym, tau float64) (n int, ok bool) {
	if a.n != b.n {
		panic("enclose: dimension mismatch")
	}
	c := shifted(a, b, tau)
	if n, ok = inertiaNeg(c); ok {
		return n, true
	}
	x, okx := chooseShiftedEigenvectors(a, b, tau)
	if !okx || !allFinite(x) {
		return 0, false
	}
	if !PositiveDefinite(congruence(identity(a.n), x)) {
		return 0, false
	}
	return inertiaNeg(congruence(shifted(a, b, tau), x))
}

// PositiveDefinite reports whether every member of s is verified positive
// definite: interval symmetric Gaussian elimination (symmetric pivoting,
// see CountBelow) ends with every pivot interval > 0, so every member is
// congruent to a positive diagonal matrix (Sylvester's law of inertia). A
// false result means "not proved", not "indefinite". The empty matrix is
// positive definite.
func PositiveDefinite(s *Sym) bool {
	neg, ok := inertiaNeg(s)
	return ok && neg == 0
}

// shifted returns an enclosure of A − τB for every member (A, B).
func shifted(a, b *Sym, tau float64) *Sym {
	c := NewSym(a.n)
	for k := range c.data {
		c.data[k] = a.data[k].Sub(b.data[k].MulF(tau))
	}
	return c
}

// identity returns the n×n identity as a point Sym.
func identity(n int) *Sym {
	s := NewSym(n)
	for i := 0; i < n; i++ {
		s.Set(i, i, interval.Point(1))
	}
	return s
}

// congruence returns an enclosure of XᵀCX for every member C of c; x is an
// exact float64 n×n matrix, row-major. The lower triangle of the result is
// computed; XᵀCX is symmetric for symmetric C, so this encloses every entry.
func congruence(c *Sym, x []float64) *Sym {
	n := c.n
	// t = C·X, full n×n interval matrix.
	t := make([]interval.I, n*n)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			var acc interval.I
			for k := 0; k < n; k++ {
				acc = acc.Add(c.At(i, k).MulF(x[k*n+j]))
			}
			t[i*n+j] = acc
		}
	}
	y := NewSym(n)
	for i := 0; i < n; i++ {
		for j := 0; j <= i; j++ {
			var acc interval.I
			for k := 0; k < n; k++ {
				acc = acc.Add(t[k*n+j].MulF(x[k*n+i]))
			}
			y.data[i*(i+1)/2+j] = acc
		}
	}
	return y
}

// inertiaNeg runs interval symmetric Gaussian elimination on a copy of s
// and returns the number of negative pivots, or ok = false if some pivot
// interval is not strictly signed (see elimination.negCount).
func inertiaNeg(s *Sym) (neg int, ok bool) {
	var e elimination
	copy(e.reset(s.n), s.data)
	return e.negCount()
}

// elimination is the workspace of interval symmetric Gaussian elimination:
// the lower triangle of the working matrix (layout of Sym) and the pivot
// order.
type elimination struct {
	n   int
	w   []interval.I
	ord []int
}

// reset sizes the workspace for n×n and returns the matrix storage to fill.
func (e *elimination) reset(n int) []interval.I {
	e.n = n
	if cap(e.w) < n*(n+1)/2 {
		e.w, e.ord = make([]interval.I, n*(n+1)/2), make([]int, n)
	}
	e.w, e.ord = e.w[:n*(n+1)/2], e.ord[:n]
	return e.w
}

// negShifted encloses A − τB into the workspace and returns its verified
// number of negative eigenvalues, the same for every member: by the
// diagonal test negWeyl if that decides, else by elimination (see
// CountBelow).
func (e *elimination) negShifted(a, b *Sym, tau float64) (neg int, ok bool) {
	w := e.reset(a.n)
	for k := range w {
		w[k] = a.data[k].Sub(b.data[k].MulF(tau))
	}
	if neg, ok = e.negWeyl(); ok {
		return neg, true
	}
	return e.negCount()
}

// negWeyl tries to decide the inertia of every member of the workspace
// matrix from its diagonal alone: with D = diag(d_i), d_i the midpoints of
// the diagonal intervals (a choice), and r ≥ max_i Σ_j |C_ij − D_ij| for
// every member C (outward rounded), ‖C − D‖₂ ≤ ‖C − D‖∞ ≤ r for symmetric
// C − D, and Weyl's inequality |λ_k(C) − λ_k(D)| ≤ ‖C − D‖₂ puts λ_k(C)
// within r of the k-th smallest d_i. So if every |d_i| > r, every member
// has exactly #{d_i < 0} negative eigenvalues. O(n²); nearly diagonal
// matrices (congruences by approximate eigenvectors) are decided here
// unless the shift is close to an eigenvalue.
//
// References:
//
//	H. Weyl, Das asymptotische Verteilungsgesetz der Eigenwerte linearer
//	partieller Differentialgleichungen, Math. Ann. 71 (1912) 441–479.
func (e *elimination) negWeyl() (neg int, ok bool) {
	n, w := e.n, e.w
	r := 0.0
	for i := 0; i < n; i++ {
		s := 0.0
		for j := 0; j < n; j++ {
			if j == i {
				v := w[i*(i+1)/2+i]
				s = interval.AddUp(s, v.Sub(interval.Point(v.Mid())).Mag())
				continue
			}
			ii, jj := max(i, j), min(i, j)
			s = interval.AddUp(s, w[ii*(ii+1)/2+jj].Mag())
		}
		r = math.Max(r, s)
	}
	if math.IsNaN(r) || math.IsInf(r, 1) {
		return 0, false
	}
	for i := 0; i < n; i++ {
		d := w[i*(i+1)/2+i].Mid()
		switch {
		case d > r:
		case d < -r:
			neg++
		default:
			return 0, false
		}
	}
	return neg, true
}

// negCount eliminates the workspace matrix in place. At each step the pivot
// is the remaining diagonal entry of largest mignitude (a choice; ties go to
// the lower position, so the result is deterministic).
//
// For every member S of the matrix the exact elimination with the same
// symmetric pivot order produces pivots inside the computed pivot
// intervals, so when ok is true every member S has #neg(S) = neg
// (Sylvester's law of inertia, see CountBelow).
func (e *elimination) negCount() (neg int, ok bool) {
	n, w, ord := e.n, e.w, e.ord
	for i := range ord {
		ord[i] = i
	}
	idx := func(p, q int) int {
		i, j := ord[p], ord[q]
		if j > i {
			i, j = j, i
		}
		return i*(i+1)/2 + j
	}
	for p := 0; p < n; p++ {
		best, bestMig := p, -1.0
		for q := p; q < n; q++ {
			if g := w[idx(q, q)].Mig(); g > bestMig {
				best, bestMig = q, g
			}
		}
		ord[p], ord[best] = ord[best], ord[p]
		piv := w[idx(p, p)]
		// Decide only strictly signed pivots (this also rejects NaN ends,
		// which cannot arise from valid intervals but would otherwise be
		// read as positive).
		switch {
		case piv.Lo > 0:
		case piv.Hi < 0:
			neg++
		default:
			return 0, false
		}
		for j := p + 1; j < n; j++ {
			cjp := w[idx(j, p)]
			if cjp.Lo == 0 && cjp.Hi == 0 {
				continue
			}
			l := cjp.Div(piv)
			for k := p + 1; k < j; k++ {
				ik := idx(j, k)
				w[ik] = w[ik].Sub(l.Mul(w[idx(k, p)]))
			}
			jj := idx(j, j)
			w[jj] = w[jj].Sub(cjp.Sqr().Div(piv))
		}
	}
	return neg, true
}

// allFinite reports whether no entry of x is NaN or infinite.
func allFinite(x []float64) bool {
	for _, v := range x {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return false
		}
	}
	return true
}
