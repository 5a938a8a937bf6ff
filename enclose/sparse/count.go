package sparse

import (
	"math"
	"runtime"
	"sync"
	"sync/atomic"

	"gapcert/enclose"
	"gapcert/interval"
)

// parallelWork is the number of residual multiply-adds above which
// CountBelow spreads the residual enclosure over the available CPUs.
const parallelWork = 1 << 16

// CountBelow returns a verified count for the interval pencil ([K], [M]):
// for every K ∈ [K] and M ∈ [M] with λ_min(M) ≥ mMin,
//
//	#{eigenvalues of Kx = λMx below sigmaPrime} ≤ n.
//
// It is NewCounter(k, m).CountBelow(mMin, sigma); see Counter.CountBelow. A
// Counter saves the ordering and the symbolic analysis when many shifts
// are tried.
func CountBelow(k, m *ISym, mMin, sigma float64) (n int, sigmaPrime float64, ok bool) {
	return NewCounter(k, m).CountBelow(mMin, sigma)
}

// Counter evaluates CountBelow for one interval pencil at many shifts,
// doing the ordering, the symbolic analysis and the permutation of [K] and
// [M] once. It implements enclose.Counter. A Counter is not safe for
// concurrent use; its results are those of CountBelow bit for bit.
type Counter struct {
	k, m         *ISym
	fromK, fromM []int
	sym          *Symbolic
	kLow, mLow   *lowerColumns // Pᵀ[K]P and Pᵀ[M]P, lower triangles
	shiftedM     *lowerColumns // −σ·Pᵀ[M]P for the current σ
	c            *Sym          // mid(K) − σ·mid(M), a choice
	f            LDL
	rows         *lRows // row structure of L, the same for every shift
	work         residualWork
	roundoff     roundoffWork
	// The choice of residual bound (see Residual bounds); tests lower
	// sharpLimit to exercise roundoffBound on small pencils.
	sharpLimit, fallbackLimit int
	lossLimit                 float64
}

// NewCounter prepares CountBelow for the pencil ([K], [M]). It panics if
// the sizes differ.
func NewCounter(k, m *ISym) *Counter {
	if k.N() != m.N() {
		panic("sparse: dimension mismatch")
	}
	if len(k.Val) != k.Pat.NNZ() || len(m.Val) != m.Pat.NNZ() {
		panic("sparse: values do not match the pattern")
	}
	u, fromK, fromM := union(k.Pat, m.Pat)
	sym := analyzePattern(u, orderPattern(u))
	inv := make([]int, u.n)
	for q, v := range sym.perm {
		inv[v] = q
	}
	c := &Counter{k: k, m: m, fromK: fromK, fromM: fromM, sym: sym,
		kLow: permutedLower(k, inv), mLow: permutedLower(m, inv),
		c:          &Sym{Pat: u, Val: make([]float64, u.NNZ())},
		sharpLimit: sharpWorkLimit, fallbackLimit: sharpFallbackLimit, lossLimit: roundoffLossLimit}
	c.shiftedM = &lowerColumns{ptr: c.mLow.ptr, row: c.mLow.row, val: make([]interval.I, len(c.mLow.val))}
	return c
}

// CountBelow returns a verified count for the pencil of c: for every
// member (K, M) with λ_min(M) ≥ mMin,
//
//	#{eigenvalues of Kx = λMx below sigmaPrime} ≤ n.
//
// sigma is a trial shift (a choice), mMin > 0 a caller-verified lower bound
// of λ_min(M) over all members of [M]. CountBelow forms the floating-point
// matrix S = mid(K) − σ·mid(M) on the union of the patterns of [K] and [M],
// orders it (Order), factors PᵀSP = L D Lᵀ (Symbolic.Factor) and returns
// n = #neg(D) and sigmaPrime = σ − r/mMin (rounded down), where r is an
// upper bound, over all members, of the largest absolute row sum of the
// residual
//
//	R = Pᵀ(K − σM)P − L D Lᵀ.
//
// The inequalities that make this a proof are stated and cited at
// enclose.CountFromResidual. The pattern of L (with the unit diagonal)
// contains the permuted pattern of K − σM (the symbolic analysis is done on
// the union pattern), so R vanishes outside the pattern of L + Lᵀ. Each
// entry of R on it, R_ij = (K − σM)_{perm[i], perm[j]} − Σ_{q ≤ j} L_iq D_q
// L_jq (i ≥ j, L_jj = 1), is enclosed in interval arithmetic from the
// interval entries of [K], [M] and the floating-point numbers L_iq, D_q,
// column by column of L (the sums of products step one ulp outward after
// each rounded operation, see residualColumn; the row sums are rounded
// upwards), or, for large pencils, bounded by the enclosed difference
// Pᵀ(K − σM − S)P plus the a-priori rounding-error bound of the
// factorization proved at roundoffBound (see Residual bounds below for
// the choice). ok = false if the factorization broke down (zero or
// non-finite pivot, non-finite L).
//
// The residual is enclosed in parallel over blocks of columns; every entry
// is enclosed by the same operations in the same order whatever the number
// of CPUs, and the row sums and their maximum are taken sequentially, so
// the result does not depend on GOMAXPROCS.
//
// CountBelow panics if mMin is not a positive finite number or sigma is
// not finite.
func (c *Counter) CountBelow(mMin, sigma float64) (n int, sigmaPrime float64, ok bool) {
	return enclose.CountFromResidual(mMin, sigma, func(sigma float64) (int, float64, bool) {
		return c.factorResidual(mMin, sigma)
	})
}

// factorShifted forms S = mid(K) − σ·mid(M) on the union pattern and
// factors it into c.f, reporting whether every pivot is nonzero and
// finite and every entry of L finite. S is a choice; its rounding errors
// are part of the residual R.
func (c *Counter) factorShifted(sigma float64) bool {
	clear(c.c.Val)
	for q, v := range c.k.Val {
		c.c.Val[at(c.fromK, q)] += v.Mid()
	}
	for q, v := range c.m.Val {
		c.c.Val[at(c.fromM, q)] -= sigma * v.Mid()
	}
	if !c.f.Factorize(c.sym, c.c) {
		return false
	}
	for _, v := range c.f.Val {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return false
		}
	}
	return true
}

// factorResidual factors Pᵀ(mid(K) − σ·mid(M))P and bounds its residual
// (see CountBelow and Residual bounds).
func (c *Counter) factorResidual(mMin, sigma float64) (neg int, r float64, ok bool) {
	if !c.factorShifted(sigma) {
		return 0, 0, false
	}
	neg = c.f.NegCount()
	if work := c.sym.sharpResidualWork(); work > c.sharpLimit {
		r = c.roundoffBound(sigma)
		if r <= c.lossLimit*math.Abs(sigma)*mMin || work > c.fallbackLimit {
			return neg, r, true
		}
	} else {
		r = math.Inf(1)
	}
	return neg, math.Min(r, c.sharpResidual(sigma)), true
}

// sharpResidual returns the residual bound of residualBound for the
// current factorization at the shift sigma.
func (c *Counter) sharpResidual(sigma float64) float64 {
	if c.rows == nil {
		c.rows = newLRows(&c.f)
	}
	// Interval entries of −σ·Pᵀ[M]P; those of Pᵀ[K]P are kept apart and
	// both are summed into the residual.
	ms := interval.Point(-sigma)
	for q, v := range c.mLow.val {
		c.shiftedM.val[q] = v.Mul(ms)
	}
	return residualBound(&c.f, c.rows, c.kLow, c.shiftedM, &c.work)
}

// lowerColumns is a permuted lower triangle by columns with interval
// values; rows within a column are in no particular order.
type lowerColumns struct {
	ptr []int
	row []int32
	val []interval.I
}

// permutedLower returns the lower triangle of PᵀSP by columns (inv is the
// inverse permutation).
func permutedLower(s *ISym, inv []int) *lowerColumns {
	n, p := s.Pat.n, s.Pat
	lc := &lowerColumns{ptr: make([]int, n+1), row: make([]int32, p.NNZ()), val: make([]interval.I, p.NNZ())}
	for j := 0; j < n; j++ {
		for q := p.colPtr[j]; q < p.colPtr[j+1]; q++ {
			lc.ptr[min(inv[p.rowIdx[q]], inv[j])+1]++
		}
	}
	for j := 0; j < n; j++ {
		lc.ptr[j+1] += lc.ptr[j]
	}
	next := append([]int(nil), lc.ptr[:n]...)
	for j := 0; j < n; j++ {
		for q := p.colPtr[j]; q < p.colPtr[j+1]; q++ {
			x, y := inv[p.rowIdx[q]], inv[j]
			col := min(x, y)
			lc.row[next[col]] = int32(max(x, y))
			lc.val[next[col]] = s.Val[q]
			next[col]++
		}
	}
	return lc
}

// lRows is the row structure of L with the positions of its entries and a
// work estimate per column.
type lRows struct {
	// Row j holds the entries L_jk, k < j, ascending k, at positions
	// pos[ptr[j]:ptr[j+1]] of L, in the columns col[·].
	ptr  []int
	pos  []int
	col  []int32
	work []int // work[j+1] − work[j]: multiply-adds of residual column j
}

func newLRows(f *LDL) *lRows {
	n := len(f.D)
	lp := f.Sym.colPtr
	t := &lRows{ptr: make([]int, n+1), pos: make([]int, len(f.Row)), col: make([]int32, len(f.Row)), work: make([]int, n+1)}
	for _, i := range f.Row {
		t.ptr[i+1]++
	}
	for j := 0; j < n; j++ {
		t.ptr[j+1] += t.ptr[j]
	}
	next := append([]int(nil), t.ptr[:n]...)
	for k := 0; k < n; k++ {
		for q := lp[k]; q < lp[k+1]; q++ {
			i := f.Row[q]
			t.pos[next[i]], t.col[next[i]] = q, int32(k)
			next[i]++
		}
	}
	for j := 0; j < n; j++ {
		w := 1 + lp[j+1] - lp[j]
		for e := t.ptr[j]; e < t.ptr[j+1]; e++ {
			w += lp[t.col[e]+1] - t.pos[e]
		}
		t.work[j+1] = t.work[j] + w
	}
	return t
}

// residualWork holds the magnitudes of the residual entries and the row
// sums, reused across the shifts of a Counter (every entry is rewritten
// at each use).
type residualWork struct {
	magD, magL, sum []float64
}

// residualBound returns r ≥ max_i Σ_j |R_ij| for R = A + B − L D Lᵀ and
// every A ∈ [A], B ∈ [B] (both on the pattern of L), rounded upwards. ws
// is a workspace.
func residualBound(f *LDL, t *lRows, a, b *lowerColumns, ws *residualWork) float64 {
	n := len(f.D)
	lp := f.Sym.colPtr
	work := t.work
	ws.magD, ws.magL, ws.sum = resize(ws.magD, n), resize(ws.magL, len(f.Row)), resize(ws.sum, n)
	magD, magL, sum := ws.magD, ws.magL, ws.sum
	clear(sum)
	columns := func(from, to int, acc []interval.I, mark []int32) {
		for j := from; j < to; j++ {
			residualColumn(f, t, a, b, j, acc, mark, magD, magL)
		}
	}
	workers := runtime.GOMAXPROCS(0)
	if workers > 1 && work[n] > parallelWork {
		blocks := 16 * workers
		bounds := make([]int, 0, blocks+1)
		bounds = append(bounds, 0)
		for j := 1; j < n; j++ {
			if len(bounds) < blocks && work[j] >= work[n]/blocks*len(bounds) {
				bounds = append(bounds, j)
			}
		}
		bounds = append(bounds, n)
		var nextBlock atomic.Int64
		var wg sync.WaitGroup
		for w := 0; w < workers; w++ {
			wg.Add(1)
			go func() {
				defer wg.Done()
				acc, mark := make([]interval.I, n), make([]int32, n)
				for {
					bl := int(nextBlock.Add(1)) - 1
					if bl >= len(bounds)-1 {
						return
					}
					columns(bounds[bl], bounds[bl+1], acc, mark)
				}
			}()
		}
		wg.Wait()
	} else {
		columns(0, n, make([]interval.I, n), make([]int32, n))
	}
	for j := 0; j < n; j++ {
		sum[j] = interval.AddUp(sum[j], magD[j])
		for q := lp[j]; q < lp[j+1]; q++ {
			i := f.Row[q]
			sum[i] = interval.AddUp(sum[i], magL[q])
			sum[j] = interval.AddUp(sum[j], magL[q])
		}
	}
	r := 0.0
	for _, s := range sum {
		if math.IsNaN(s) {
			return math.Inf(1)
		}
		r = math.Max(r, s)
	}
	return r
}

// residualColumn sets magD[j] ≥ |R_jj| and magL[q] ≥ |R_ij| for the
// entries q of column j of L (row i), where
// R_ij = A_ij + B_ij − Σ_{k<j} L_jk D_k L_ik − L_ij D_j (L_jj = 1). acc and
// mark are workspaces of length n; mark[i] must not equal j+1 on entry.
//
// The sums are accumulated in interval arithmetic that steps one ulp
// outward after each operation rounded to nearest (cheaper than the
// correctly rounded operations of package interval): for floats a, b and
// ◦ ∈ {+, −, ·}, the exact a ◦ b lies in
// [down(fl(a ◦ b)), up(fl(a ◦ b))], because round to nearest errs by at
// most half the spacing of the floats around the result (IEEE 754-2019
// §4.3.1; a result rounded to +∞ comes from an exact value beyond
// MaxFloat64, and a result rounded to −∞ yields a NaN end). Every product
// is written float64(a*b) so that no fused multiply-add changes the
// rounding.
func residualColumn(f *LDL, rows *lRows, a, b *lowerColumns, j int,
	acc []interval.I, mark []int32, magD, magL []float64) {
	lp, li, lx, d := f.Sym.colPtr, f.Row, f.Val, f.D
	tag := int32(j + 1)
	acc[j], mark[j] = interval.I{}, tag
	for q := lp[j]; q < lp[j+1]; q++ {
		acc[li[q]], mark[li[q]] = interval.I{}, tag
	}
	for _, s := range [2]*lowerColumns{a, b} {
		for q := s.ptr[j]; q < s.ptr[j+1]; q++ {
			i := s.row[q]
			if mark[i] != tag {
				panic("sparse: entry outside the pattern of L (symbolic analysis is wrong)")
			}
			acc[i] = acc[i].Add(s.val[q])
		}
	}
	for e := rows.ptr[j]; e < rows.ptr[j+1]; e++ {
		p, k := rows.pos[e], rows.col[e]
		ljk := lx[p]
		w := float64(ljk * d[k])
		cl, ch := down(w), up(w) // ∋ L_jk D_k
		acc[j] = subProduct(acc[j], cl, ch, ljk)
		for q := p + 1; q < lp[k+1]; q++ {
			i := li[q]
			if mark[i] != tag {
				panic("sparse: fill outside the pattern of L (symbolic analysis is wrong)")
			}
			acc[i] = subProduct(acc[i], cl, ch, lx[q])
		}
	}
	magD[j] = magnitude(subProduct(acc[j], 1, 1, d[j]))
	for q := lp[j]; q < lp[j+1]; q++ {
		w := float64(lx[q] * d[j])
		magL[q] = magnitude(subProduct(acc[li[q]], down(w), up(w), 1))
	}
}

// subProduct returns an enclosure of acc − c·x for c ∈ [cl, ch], stepping
// one ulp outward after each rounded operation (see residualColumn). The
// exact products cl·x and ch·x are ordered like their rounded values
// (rounding is monotonic), so min(p1, p2) is the rounding of the smaller
// exact product, which down then bounds from below; likewise for max and
// up.
func subProduct(acc interval.I, cl, ch, x float64) interval.I {
	p1, p2 := float64(cl*x), float64(ch*x)
	pl, ph := down(min(p1, p2)), up(max(p1, p2))
	return interval.I{Lo: down(acc.Lo - ph), Hi: up(acc.Hi - pl)}
}

// up returns a float ≥ succ(x), the successor of x, so an upper bound of
// every real number that rounds to nearest to x; up(+∞) = +∞, and
// up(−∞) and up(NaN) are NaN (a NaN end makes the residual bound +∞).
//
// With δ = fl(fl(|x|·2⁻⁵²) + 2⁻¹⁰⁷⁴): if x is subnormal or zero, δ ≥ 2⁻¹⁰⁷⁴,
// the spacing there; if x is normal, |x|·2⁻⁵² is at least the spacing of
// the floats next to x, and the product is exact unless subnormal, when
// its rounding error (≤ 2⁻¹⁰⁷⁵) is covered by the exact subnormal addition
// of 2⁻¹⁰⁷⁴. So x + δ ≥ succ(x) and, rounding being monotonic,
// fl(x + δ) ≥ succ(x). This is the successor formula of Rump, Zimmermann,
// Boldo and Melquiond with the slightly larger factor 2⁻⁵².
//
// References:
//
//	S. M. Rump, P. Zimmermann, S. Boldo, G. Melquiond, Computing
//	predecessor and successor in rounding to nearest, BIT 49 (2009)
//	419–431.
func up(x float64) float64 {
	return x + (float64(math.Abs(x)*0x1p-52) + 0x1p-1074)
}

// down returns a float ≤ pred(x), symmetric to up.
func down(x float64) float64 {
	return x - (float64(math.Abs(x)*0x1p-52) + 0x1p-1074)
}

// magnitude returns max(|lo|, |hi|), or +∞ if an end is NaN.
func magnitude(x interval.I) float64 {
	m := max(math.Abs(x.Lo), math.Abs(x.Hi))
	if math.IsNaN(m) {
		return math.Inf(1)
	}
	return m
}

// Residual bounds. CountBelow has two enclosures of ‖R‖∞: the sharp one of
// residualBound, which encloses every entry of R by its defining sum in
// interval arithmetic (n + nnz(L) + Σ_k ℓ_k(ℓ_k + 1)/2 operations, ℓ_k
// the length of column k of L), and the a-priori one of roundoffBound, a
// rounding-error analysis of Factorize (O(nnz(L)) operations, larger by a
// factor of about the longest row of L). Both are sound; the choice only
// trades time for the loss σ − σ'. Below sharpWorkLimit the sharp bound
// alone is used, as it always was; above it the a-priori bound is kept
// when its loss r/mMin is at most roundoffLossLimit·|σ| (or the limit set
// by SetRoundoffLoss), and otherwise the smaller of the two is returned,
// unless the sharp bound would cost more than sharpFallbackLimit
// operations (measured: 3.6·10⁹ took 72 s on the 7-point Laplacian with
// 50k unknowns; 97k unknowns need about 1000 s), when the a-priori bound
// is returned whatever its loss.
const (
	sharpWorkLimit     = 1 << 26
	sharpFallbackLimit = 1 << 33
	roundoffLossLimit  = 0x1p-30
)

// SetRoundoffLoss sets the relative loss up to which CountBelow keeps the
// a-priori residual bound on large pencils: it is kept when
// r/mMin ≤ rel·|σ| (default 2⁻³⁰; see Residual bounds). A choice that
// trades the corrected shift σ' against time: both bounds are sound. It
// panics unless rel ≥ 0.
func (c *Counter) SetRoundoffLoss(rel float64) {
	if !(rel >= 0) {
		panic("sparse: the accepted loss must be nonnegative")
	}
	c.lossLimit = rel
}

// sharpResidualWork returns the number of interval multiply-adds of
// residualBound for factors with the structure of sym.
func (sym *Symbolic) sharpResidualWork() int {
	n := sym.pat.n
	w := n + sym.colPtr[n]
	for k := 0; k < n; k++ {
		l := sym.colPtr[k+1] - sym.colPtr[k]
		w += l * (l + 1) / 2
	}
	return w
}
