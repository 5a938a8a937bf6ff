package sparse

import (
	"math"

	"gapcert/interval"
)

// roundoffWork holds the workspaces of roundoffBound, reused across the
// shifts of a Counter (every entry is rewritten at each use).
type roundoffWork struct {
	colSum, weight, row, small, diff []float64
	rowCount                         []int
	entry                            []interval.I
}

// underflowUnit is η₀ = 2⁻¹⁰⁷⁴, the spacing of the subnormal doubles: at
// least the absolute rounding error (at most half of it) of an operation
// whose exact result lies below the smallest normal double 2⁻¹⁰²² in
// magnitude. (2⁻¹⁰⁷⁵ itself is not a double.)
const underflowUnit = 0x1p-1074

// roundoffBound returns r ≥ ‖Pᵀ(K − σM)P − L D Lᵀ‖∞ for every member
// (K, M) of the pencil of c, for the factorization c.f of the float matrix
// S = c.c (mid(K) − σ·mid(M) as computed) by LDL.Factorize (either of
// its algorithms, up-looking or multifrontal), rounded
// upwards, in O(nnz(L) + nnz(K) + nnz(M)) operations; +∞ if a quantity
// overflows. It splits the residual as
//
//	Pᵀ(K − σM)P − LDLᵀ = Pᵀ(K − σM − S)P + (PᵀSP − LDLᵀ)
//
// and bounds the row sums of the two terms separately.
//
// # The enclosed difference
//
// (K − σM − S)_ij is enclosed over all members entry by entry in the
// correctly rounded interval arithmetic of package interval, from the
// interval entries of [K] and [M] and the float S_ij, on the union pattern
// (outside it every term vanishes); the magnitudes are summed in the rows
// of both ends of each off-diagonal entry, rounding upwards.
//
// # The rounding errors of the factorization
//
// What is computed. Let A = PᵀSP, T_kj = {i < j : L_ki and L_ji
// structurally nonzero} for j ≤ k, and let ũ_kj (k > j) denote the float
// that L_kj was divided from. Both algorithms of Factorize compute, for
// every entry j ≤ k of the pattern of L,
//
//	ũ_kj = a_kj − Σ_{i∈T_kj} ũ_ki L_ji,  L_kj = fl(ũ_kj / d_j)   (k > j),
//	d_j  = a_jj − Σ_{i∈T_jj} ũ_ji L_ji,
//
// where each product fl(ũ_ki L_ji) is rounded once (or fused with the
// subtraction that uses it) and each sum is evaluated by rounded additions
// and subtractions along some binary tree whose leaves are a_kj and the
// negated products; an addition with an exact zero operand (the zeroed
// workspaces to which entries of A are added) is exact and is not counted.
// The floats ũ_ki and L_ji are the very ones that are stored or divided,
// and d_j is the pivot stored in D.
//
//   - Up-looking (Davis 2005; LDL.Factorize below supernodeWork
//     multiply-adds): row k of L is found by a sparse triangular solve.
//     With y = 0 it scatters y_r = a_kr (r ≤ k), visits the rows r < k of
//     the pattern of row k of L in an order where every i with L_ri ≠ 0
//     (structurally) comes before r, and at r sets ũ_kr = y_r,
//     L_kr = fl(ũ_kr / d_r), d_k ← fl(d_k − fl(L_kr ũ_kr)) and
//     y_j ← fl(y_j − fl(L_jr ũ_kr)) for the stored L_jr, r < j < k,
//     starting from d_k = a_kk: every sum is a chain, a_kj first, the
//     products subtracted one by one.
//   - Multifrontal (factorizeSupernodal; Duff and Reid 1983, Liu 1992):
//     the columns are grouped into supernodes; the dense front of a
//     supernode is zeroed, receives the entries of A in its columns and
//     then, entry by entry, the update matrices of its children, and its
//     columns are eliminated by panels (factorDense): each entry (k, j)
//     gets fl(· − fl(ũ_ki L_ji)) for the columns i of each panel in turn;
//     what is left below the supernode is its update matrix. The sum of
//     entry (k, j) is thus a tree: a_kj plus the update entries of the
//     children (each a partial sum over the columns of one subtree,
//     computed the same way), then chains over the panels of its own
//     fronts. The columns that reach (k, j) are exactly T_kj: a column i
//     contributes to the fronts that contain both rows k and j, that is
//     when L_ki and L_ji are both structurally nonzero.
//
// Let m = |T_kj| ≤ mMax (mMax the largest number of off-diagonal entries
// in a row of L), u = 2⁻⁵³, γ_n = nu/(1 − nu) and η₀ = 2⁻¹⁰⁷⁴.
//
// (M) Model. For floats x, y and ◦ ∈ {+, −, ·, /}, rounding to nearest
// gives fl(x ◦ y) = (x ◦ y)(1 + δ) + η with |δ| ≤ u, |η| ≤ η₀: if
// |x ◦ y| ≥ 2⁻¹⁰²² the relative error is at most u, below it the floats
// are evenly spaced by 2⁻¹⁰⁷⁴ and the absolute error is at most half that
// (IEEE 754-2019 §4.3.1; Higham 2002 §2.2, model (2.4), with the
// underflow term of §2.3). A fused multiply-add, which the compiler may
// form from the code's x − y·z, computes fl(x − y·z) with one rounding:
// the model with δ = η = 0 for the product, so every bound below, which
// counts one rounding per operation, holds for it too. If every L and D
// is finite, no operation overflowed (an overflow makes ±∞ or NaN, which
// every later operation carries into an entry of L or D, and Factorize
// reports non-finite pivots; Counter checks L).
//
// (S) Sums. Let ŝ be the value of a binary tree of rounded additions whose
// m + 1 leaves are a and the negated rounded products −fl(x_j y_j),
// j = 1 … m (negation is exact). By (M) each product is
// x_j y_j(1 + ε_j) + α_j and each node v computes
// z_v = (z_left + z_right)(1 + δ_v) + β_v. Let v_1, …, v_p be the nodes on
// the path from the leaf a up to the root (p ≤ m), w_i the other subtree
// below v_i, and Q_i = Π_{l≤i}(1 + δ_{v_l}). Dividing
// z_{v_i} = (z_{v_(i−1)} + z_{w_i})(1 + δ_{v_i}) + β_{v_i} (z_{v_0} = a)
// by Q_i and summing over i gives
//
//	ŝ/Q_p = a + Σ_i z_{w_i}/Q_(i−1) + Σ_i β_{v_i}/Q_i.
//
// Expanding z_{w_i} inside w_i in the same way, a product leaf of w_i
// enters as −x_j y_j(1 + ε_j) times the factors (1 + δ) of the nodes
// above it in w_i, divided by Q_(i−1). If w_i has m_i leaves, that is at
// most 1 + (m_i − 1) + (i − 1) factors (1 + δ)^(±1), and m_i ≤ m − i + 1
// because w_1, …, w_(i−1) hold a leaf each: at most m factors. So is
// each β and α term, and Q_p has p ≤ m factors. Each product of at most
// m factors (1 + δ)^(±1) is 1 + θ with |θ| ≤ γ_m (Higham 2002, Lemma
// 3.1), so with |ŝ/Q_p − ŝ| ≤ γ_m|ŝ|
//
//	|a − Σ_j x_j y_j − ŝ| ≤ γ_m (|ŝ| + Σ_j |x_j y_j|) + 2m(1 + γ_m) η₀
//
// (m products and m additions, each with one underflow term). For a
// chain (a first, the products subtracted one by one, the up-looking
// loop) this is Lemma 8.4 of Higham 2002 (no division) with the underflow
// terms added. The constant does not depend on the shape of the tree, so
// the multifrontal algorithm needs no other c than the up-looking one.
//
// (Q) Quotients. L_kr = fl(ũ_kr/d_r) = (ũ_kr/d_r)(1 + ζ) + ω with
// |ζ| ≤ u, |ω| ≤ η₀, so L_kr d_r = ũ_kr(1 + ζ) + ω d_r, and
// ũ_kr = (L_kr − ω) d_r/(1 + ζ) gives
// |ũ_kr| ≤ (1 + γ_1)(|L_kr||d_r| + η₀|d_r|) (1/(1 − u) = 1 + γ_1).
//
// Off-diagonal entries, r < k, T = T_kr. With (S) for ũ_kr
// (x_i y_i = ũ_ki L_ri) and (Q) for ũ_kr and every ũ_ki, i ∈ T,
//
//	R_kr = a_kr − Σ_{i∈T} L_ki d_i L_ri − L_kr d_r
//	     = E + Σ_i L_ri (ũ_ki − L_ki d_i) + (ũ_kr − L_kr d_r),
//
// E = a_kr − Σ_i L_ri ũ_ki − ũ_kr, and |ũ_ki − L_ki d_i| ≤
// γ_1|L_ki||d_i| + (1 + γ_1)η₀|d_i|, |ũ_kr − L_kr d_r| ≤ u|ũ_kr| + η₀|d_r|.
// Collecting, with γ_m + u ≤ γ_(m+1) (Higham 2002, Lemma 3.3) and
//
//	c = γ_1 + γ_(mMax+1)(1 + γ_1)
//
// (c ≥ γ_m(1 + γ_1) + γ_1 and c ≥ (γ_m + u)(1 + γ_1); γ_n increases in n),
//
//	|R_kr| ≤ c (|L||D||Lᵀ|)_kr + (1 + c) η₀ (2 mMax + t_r),
//	t_r = Σ_{i≤r} |L_ri||d_i|   (L_rr = 1).
//
// Diagonal entries. The same steps with (S) for d_k (x_r y_r = ũ_kr L_kr)
// give R_kk = E + Σ_r L_kr(ũ_kr − L_kr d_r), |E| ≤ γ_m(|d_k| + Σ_r
// |L_kr||ũ_kr|) + 2m(1 + γ_m)η₀, hence the same bound with r = k.
//
// Row sums. R is symmetric and vanishes outside the pattern of L + Lᵀ
// (which holds the structure of LDLᵀ: the symbolic analysis is exact), so
// with S_i = Σ_j |L_ji| (column sums of L, unit diagonal included) and
// n_k the number of entries of row k of L + Lᵀ (diagonal included),
//
//	Σ_j |R_kj| ≤ c Σ_j (|L||D||Lᵀ|)_kj + (1 + c) η₀ n_k (2 mMax + max_r t_r)
//	           = c Σ_{i≤k} |L_ki||d_i| S_i + (1 + c) η₀ n_k (2 mMax + max_r t_r).
//
// All quantities are nonnegative; each sum and product is rounded to
// nearest and then stepped up by up (an upper bound of the exact result),
// so by monotonicity the computed r is at least the exact right-hand
// side. The bound relies on Factorize doing exactly the operations listed
// above (either algorithm); TestRoundoffBoundExact and the tests of
// roundoff_worstcase_test.go compare it with the exact residual of the
// output of both algorithms on hard cases.
//
// References:
//
//	N. J. Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed.,
//	SIAM, 2002 (§2.2–2.3 the model of arithmetic, Lemma 3.1, Lemma 3.3, Lemma 8.4;
//	§9.3 and §10.1 the analyses of LU and Cholesky factorization that
//	this follows).
//	I. S. Duff, J. K. Reid, The multifrontal solution of indefinite sparse
//	symmetric linear equations, ACM Trans. Math. Software 9 (1983)
//	302–325.
//	J. W. H. Liu, The multifrontal method for sparse matrix solution:
//	theory and practice, SIAM Review 34 (1992) 82–109.
//	T. A. Davis, Algorithm 849: A concise sparse Cholesky factorization
//	package, ACM Trans. Math. Software 31 (2005) 587–591.
//	IEEE Standard for Floating-Point Arithmetic, IEEE 754-2019.
func (c *Counter) roundoffBound(sigma float64) float64 {
	f := &c.f
	n := len(f.D)
	lp, li, lx, d := f.Sym.colPtr, f.Row, f.Val, f.D
	ws := &c.roundoff
	ws.colSum, ws.weight, ws.row, ws.small = resize(ws.colSum, n), resize(ws.weight, n), resize(ws.row, n), resize(ws.small, n)
	if cap(ws.rowCount) < n {
		ws.rowCount = make([]int, n)
	}
	ws.rowCount = ws.rowCount[:n]
	colSum, weight, row, small, rowCount := ws.colSum, ws.weight, ws.row, ws.small, ws.rowCount
	clear(rowCount)
	// S_i, the off-diagonal counts of the rows, and |d_r| to start t_r.
	for i := 0; i < n; i++ {
		s := 1.0
		for q := lp[i]; q < lp[i+1]; q++ {
			s = up(s + math.Abs(lx[q]))
			rowCount[li[q]]++
		}
		colSum[i] = s
		small[i] = math.Abs(d[i])
	}
	mMax := 0
	for _, m := range rowCount {
		mMax = max(mMax, m)
	}
	// weight_i ≥ |d_i| S_i; row_k ≥ Σ_{i≤k} |L_ki| weight_i; small_r ≥ t_r.
	for i := 0; i < n; i++ {
		weight[i] = up(float64(math.Abs(d[i]) * colSum[i]))
		row[i] = weight[i] // the term i = k (L_kk = 1)
	}
	for i := 0; i < n; i++ {
		w, di := weight[i], math.Abs(d[i])
		for q := lp[i]; q < lp[i+1]; q++ {
			k, l := li[q], math.Abs(lx[q])
			row[k] = up(row[k] + up(float64(l*w)))
			small[k] = up(small[k] + up(float64(l*di)))
		}
	}
	tMax := 0.0
	for _, t := range small {
		tMax = math.Max(tMax, t)
	}
	cf := roundoffFactor(mMax)
	under := up(float64(up(1+cf) * up(float64(underflowUnit*up(float64(2*mMax)+tMax)))))
	diff := c.differenceRows(sigma)
	perm := f.Sym.perm
	r := 0.0
	for k := 0; k < n; k++ {
		entries := float64(1 + rowCount[k] + lp[k+1] - lp[k])
		s := up(up(float64(cf*row[k])) + up(float64(entries*under)))
		s = up(s + diff[perm[k]])
		if math.IsNaN(s) {
			return math.Inf(1)
		}
		r = math.Max(r, s)
	}
	return r
}

// roundoffFactor returns a float ≥ c = γ_1 + γ_(m+1)(1 + γ_1),
// γ_n = nu/(1 − nu), u = 2⁻⁵³ (see Counter.roundoffBound). It panics if
// (m + 1)u ≥ 1/2 (never, for a matrix that fits in memory).
func roundoffFactor(m int) float64 {
	gamma := func(n int) float64 {
		nu := float64(n) * 0x1p-53 // exact: n < 2⁵², a power-of-two scaling
		if !(nu < 0.5) {
			panic("sparse: too many terms for the rounding-error bound")
		}
		return interval.DivUp(nu, interval.SubDown(1, nu))
	}
	g1 := gamma(1)
	return interval.AddUp(g1, interval.MulUp(gamma(m+1), interval.AddUp(1, g1)))
}

// differenceRows returns, indexed by the rows of the unpermuted pencil,
// upper bounds of the absolute row sums of K − σM − S over all members,
// S = c.c the float matrix that was factored, enclosed entrywise in
// interval arithmetic (see Counter.roundoffBound).
func (c *Counter) differenceRows(sigma float64) []float64 {
	u := c.c.Pat
	ws := &c.roundoff
	nnz := u.NNZ()
	if cap(ws.entry) < nnz {
		ws.entry = make([]interval.I, nnz)
	}
	entry := ws.entry[:nnz]
	clear(entry)
	for q, v := range c.k.Val {
		e := at(c.fromK, q)
		entry[e] = entry[e].Add(v)
	}
	ms := interval.Point(-sigma)
	for q, v := range c.m.Val {
		e := at(c.fromM, q)
		entry[e] = entry[e].Add(v.Mul(ms))
	}
	ws.diff = resize(ws.diff, u.n)
	diff := ws.diff
	clear(diff)
	for j := 0; j < u.n; j++ {
		for q := u.colPtr[j]; q < u.colPtr[j+1]; q++ {
			i := int(u.rowIdx[q])
			m := magnitude(entry[q].Sub(interval.Point(c.c.Val[q])))
			diff[i] = interval.AddUp(diff[i], m)
			if i != j {
				diff[j] = interval.AddUp(diff[j], m)
			}
		}
	}
	return diff
}
