package sparse

import (
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"testing"

	"gapcert/enclose"
	"gapcert/interval"
)

// The tests of this file check roundoffBound (the a-priori bound of the
// LDLᵀ residual) against exact rational arithmetic on worst cases: every
// entry of the factorization's own residual PᵀSP − LDLᵀ against the
// entrywise inequality proved at roundoffBound, the worst member of
// interval pencils (not random members), factors computed with fused
// multiply-adds (which the compiler may emit for Factorize), hill-climbed
// tiny matrices that push the rounding errors toward the bound, mixed
// scales up to overflow, and verified counts next to eigenvalues.

// exactLDL holds the float factors of an LDL as exact rationals.
type exactLDL struct {
	rows []map[int]*big.Rat // rows[i][q] = L_iq, q < i
	d    []*big.Rat
	absD []*big.Rat
}

func newExactLDL(f *LDL) *exactLDL {
	n := len(f.D)
	e := &exactLDL{rows: make([]map[int]*big.Rat, n), d: make([]*big.Rat, n), absD: make([]*big.Rat, n)}
	for i := range e.rows {
		e.rows[i] = map[int]*big.Rat{}
		e.d[i] = new(big.Rat).SetFloat64(f.D[i])
		e.absD[i] = new(big.Rat).Abs(e.d[i])
	}
	lp := f.Sym.colPtr
	for q := 0; q < n; q++ {
		for p := lp[q]; p < lp[q+1]; p++ {
			e.rows[f.Row[p]][q] = new(big.Rat).SetFloat64(f.Val[p])
		}
	}
	return e
}

// at returns L_iq (1 on the diagonal) or nil outside the pattern.
func (e *exactLDL) at(i, q int) *big.Rat {
	if i == q {
		return big.NewRat(1, 1)
	}
	return e.rows[i][q]
}

// entry returns (LDLᵀ)_ij and (|L||D||Lᵀ|)_ij exactly, j ≤ i.
func (e *exactLDL) entry(i, j int) (v, abs *big.Rat) {
	v, abs = new(big.Rat), new(big.Rat)
	tmp := new(big.Rat)
	add := func(q int) {
		a, b := e.at(i, q), e.at(j, q)
		if a == nil || b == nil {
			return
		}
		tmp.Mul(a, e.d[q])
		tmp.Mul(tmp, b)
		v.Add(v, tmp)
		abs.Add(abs, tmp.Abs(tmp))
	}
	for q := range e.rows[j] {
		add(q)
	}
	add(j)
	return v, abs
}

// gammaRat returns γ_n = nu/(1 − nu), u = 2⁻⁵³, exactly.
func gammaRat(n int) *big.Rat {
	nu := new(big.Rat).SetFrac(big.NewInt(int64(n)), new(big.Int).Lsh(big.NewInt(1), 53))
	return new(big.Rat).Quo(nu, new(big.Rat).Sub(big.NewRat(1, 1), nu))
}

// entryBoundCheck compares every entry of R = PᵀSP − LDLᵀ (S = c.c, the
// float matrix factored into c.f) with the right side of the entrywise
// inequality proved at roundoffBound, both exact:
//
//	|R_ij| ≤ c (|L||D||Lᵀ|)_ij + (1 + c) η₀ (2 mMax + t_j),  j ≤ i,
//
// c = γ_1 + γ_(mMax+1)(1 + γ_1), t_j = Σ_{q≤j} |L_jq||d_q|. It returns the
// smallest ratio bound/|R_ij| over the entries with R_ij ≠ 0 (+∞ if none)
// and an error naming an entry outside the pattern of L + Lᵀ where R does
// not vanish.
func entryBoundCheck(c *Counter) (minRatio float64, err error) {
	f := &c.f
	n := len(f.D)
	e := newExactLDL(f)
	mMax := maxRowOfL(f)
	g1 := gammaRat(1)
	cf := new(big.Rat).Add(g1, new(big.Rat).Mul(gammaRat(mMax+1), new(big.Rat).Add(big.NewRat(1, 1), g1)))
	onePlus := new(big.Rat).Add(big.NewRat(1, 1), cf)
	eta := new(big.Rat).SetFloat64(underflowUnit)
	t := make([]*big.Rat, n)
	for j := 0; j < n; j++ {
		t[j] = new(big.Rat).Set(e.absD[j])
		for q, l := range e.rows[j] {
			t[j].Add(t[j], new(big.Rat).Mul(new(big.Rat).Abs(l), e.absD[q]))
		}
	}
	perm := f.Sym.perm
	minRatio = math.Inf(1)
	for i := 0; i < n; i++ {
		for j := 0; j <= i; j++ {
			v, abs := e.entry(i, j)
			r := new(big.Rat).SetFloat64(c.c.At(perm[i], perm[j]))
			r.Sub(r, v)
			if r.Sign() == 0 {
				continue
			}
			if e.at(i, j) == nil {
				return 0, fmt.Errorf("R_%d,%d = %s outside the pattern of L", i, j, r.FloatString(3))
			}
			r.Abs(r)
			bound := new(big.Rat).Mul(cf, abs)
			under := new(big.Rat).Add(big.NewRat(int64(2*mMax), 1), t[j])
			under.Mul(under, eta)
			under.Mul(under, onePlus)
			bound.Add(bound, under)
			ratio, _ := new(big.Rat).Quo(bound, r).Float64()
			minRatio = math.Min(minRatio, ratio)
		}
	}
	return minRatio, nil
}

// worstMemberResidual returns the supremum over all members (K, M) of the
// pencil of c of ‖Pᵀ(K − σM)P − LDLᵀ‖∞, exactly, for the factors c.f (nil
// if an interval end is infinite). For a fixed row the entries depend on
// different entries of K and M, and |k − σm − x| is convex in (k, m), so
// each row sum is largest with every entry at a corner of its box
// [K_ij] × [M_ij].
func worstMemberResidual(c *Counter, sigma float64) *big.Rat {
	f := &c.f
	n := len(f.D)
	e := newExactLDL(f)
	perm := f.Sym.perm
	s := new(big.Rat).SetFloat64(sigma)
	worst := new(big.Rat)
	for i := 0; i < n; i++ {
		row := new(big.Rat)
		for j := 0; j < n; j++ {
			a, b := max(i, j), min(i, j)
			ldl, _ := e.entry(a, b)
			ki, mi := c.k.At(perm[i], perm[j]), c.m.At(perm[i], perm[j])
			big1 := new(big.Rat)
			for _, kv := range [2]float64{ki.Lo, ki.Hi} {
				for _, mv := range [2]float64{mi.Lo, mi.Hi} {
					if math.IsInf(kv, 0) || math.IsInf(mv, 0) {
						return nil
					}
					x := new(big.Rat).SetFloat64(kv)
					x.Sub(x, new(big.Rat).Mul(s, new(big.Rat).SetFloat64(mv)))
					x.Sub(x, ldl)
					x.Abs(x)
					if x.Cmp(big1) > 0 {
						big1 = x
					}
				}
			}
			row.Add(row, big1)
		}
		if row.Cmp(worst) > 0 {
			worst = row
		}
	}
	return worst
}

// factorForBound forms S = mid(K) − σ·mid(M) as CountBelow does and
// factors it into c.f in the order perm (nil: the order of c), leaving
// c ready for roundoffBound. It reports whether the factorization
// succeeded with finite factors. A Counter whose order was replaced must
// not be used for CountBelow afterwards.
func factorForBound(c *Counter, sigma float64, perm []int) bool {
	if perm != nil {
		c.sym = analyzePattern(c.c.Pat, perm)
	}
	return c.factorShifted(sigma)
}

// factorizeFused overwrites f with the factorization of s computed by the
// operations of LDL.Factorize with every update y_j − L_jr ũ_r and
// d_k − L_kr ũ_r as one fused multiply-add (math.FMA: one rounding), as
// the compiler may emit them on arm64 (checked in its assembly). It
// reports whether every pivot is nonzero and finite.
func factorizeFused(f *LDL, sym *Symbolic, s *Sym) bool {
	n := sym.pat.n
	nnz := sym.colPtr[n]
	f.Sym = sym
	f.D, f.Val, f.Row = make([]float64, n), make([]float64, nnz), make([]int32, nnz)
	y := make([]float64, n)
	flag, fill, stack := make([]int, n), make([]int, n), make([]int, n)
	parent, lp, li, lx, d := sym.parent, sym.colPtr, f.Row, f.Val, f.D
	for k := 0; k < n; k++ {
		top := n
		flag[k] = k
		for q := sym.uPtr[k]; q < sym.uPtr[k+1]; q++ {
			i := int(sym.uRow[q])
			y[i] += s.Val[sym.uSrc[q]]
			length := 0
			for ; flag[i] != k; i = parent[i] {
				stack[length] = i
				length++
				flag[i] = k
			}
			for length > 0 {
				top--
				length--
				stack[top] = stack[length]
			}
		}
		dk := y[k]
		y[k] = 0
		for ; top < n; top++ {
			i := stack[top]
			yi := y[i]
			y[i] = 0
			end := lp[i] + fill[i]
			for q := lp[i]; q < end; q++ {
				y[li[q]] = math.FMA(-lx[q], yi, y[li[q]])
			}
			l := yi / d[i]
			dk = math.FMA(-l, yi, dk)
			li[end] = int32(k)
			lx[end] = l
			fill[i]++
		}
		if dk == 0 || math.IsNaN(dk) || math.IsInf(dk, 0) {
			return false
		}
		d[k] = dk
	}
	for _, v := range lx {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return false
		}
	}
	return true
}

// randomScaledSym returns a random symmetric n×n matrix: each off-diagonal
// entry present with probability density, every entry a uniform mantissa
// in ±[1/2, 1) times 2^e, e uniform in [emin, emax], diagonal entries of
// either sign (no dominance: pivots may be small and L may grow).
func randomScaledSym(r *rand.Rand, n int, density float64, emin, emax int) *Sym {
	b := NewBuilder(n)
	val := func() float64 {
		m := 0.5 + r.Float64()/2
		if r.IntN(2) == 0 {
			m = -m
		}
		return math.Ldexp(m, emin+r.IntN(emax-emin+1))
	}
	for i := 0; i < n; i++ {
		b.Add(i, i, val())
		for j := 0; j < i; j++ {
			if r.Float64() < density {
				b.Add(i, j, val())
			}
		}
	}
	return b.Build()
}

// naturalOrderOf returns 0 … n−1.
func naturalOrderOf(n int) []int {
	p := make([]int, n)
	for i := range p {
		p[i] = i
	}
	return p
}

// boundCase is one factorization to check: a point or interval pencil,
// a shift and an elimination order (nil: the Counter's own).
type boundCase struct {
	name  string
	k, m  *ISym
	sigma float64
	perm  []int
	fused bool // factor with fused multiply-adds (factorizeFused)
	// algorithm of Factorize (the zero value: chosen by size, so the
	// up-looking one on these small cases).
	algorithm factorAlgorithm
}

// checkBoundCase factors the case and checks, exactly, the entrywise
// inequality of the factorization's residual and r ≥ the worst member's
// residual. It returns the two ratios (bound/|R_ij| minimum, r/worst) and
// max |L_ij| (the growth), or ok = false if the factorization failed (or
// r = +∞, which says nothing).
func checkBoundCase(t *testing.T, tc boundCase) (entryRatio, rowRatio, growth float64, ok bool) {
	t.Helper()
	c := roundoffCounter(tc.k, tc.m)
	c.f.algorithm = tc.algorithm
	if !factorForBound(c, tc.sigma, tc.perm) {
		return 0, 0, 0, false
	}
	if tc.fused {
		var g LDL
		if !factorizeFused(&g, c.sym, c.c) {
			return 0, 0, 0, false
		}
		c.f = g
	}
	r := c.roundoffBound(tc.sigma)
	if math.IsInf(r, 1) {
		return 0, 0, 0, false
	}
	if math.IsNaN(r) || r < 0 {
		t.Errorf("%s: r = %g", tc.name, r)
		return 0, 0, 0, false
	}
	for _, v := range c.f.Val {
		growth = math.Max(growth, math.Abs(v))
	}
	entryRatio, err := entryBoundCheck(c)
	if err != nil {
		t.Errorf("%s: %v", tc.name, err)
	}
	if entryRatio < 1 {
		t.Errorf("%s: an entry of the factorization's residual exceeds the entrywise bound (ratio %g)", tc.name, entryRatio)
	}
	worst := worstMemberResidual(c, tc.sigma)
	if worst == nil {
		return entryRatio, math.Inf(1), growth, true
	}
	if new(big.Rat).SetFloat64(r).Cmp(worst) < 0 {
		w, _ := worst.Float64()
		t.Errorf("%s: r = %g below the worst member's residual %g", tc.name, r, w)
	}
	w, _ := worst.Float64()
	return entryRatio, r / w, growth, true
}

// summary collects the smallest ratios seen over a family of cases.
type summary struct {
	cases, failed              int
	minEntry, minRatio, growth float64
}

func newSummary() *summary { return &summary{minEntry: math.Inf(1), minRatio: math.Inf(1)} }

// add checks the case as given and, unless it is fused, once more with
// the multifrontal algorithm.
func (s *summary) add(t *testing.T, tc boundCase) {
	t.Helper()
	cases := []boundCase{tc}
	if !tc.fused && tc.algorithm == automatic {
		mf := tc
		mf.name, mf.algorithm = tc.name+" multifrontal", multifrontal
		cases = append(cases, mf)
	}
	for _, tc := range cases {
		e, r, g, ok := checkBoundCase(t, tc)
		if !ok {
			s.failed++
			continue
		}
		s.cases++
		s.growth = math.Max(s.growth, g)
		s.minEntry, s.minRatio = math.Min(s.minEntry, e), math.Min(s.minRatio, r)
	}
}

func (s *summary) log(t *testing.T, name string) {
	t.Logf("%s: %d cases checked (%d factorizations failed or r = +∞): min bound/|R_ij| %.4g, min r/‖R‖∞ %.6g, max |L_ij| %.3g",
		name, s.cases, s.failed, s.minEntry, s.minRatio, s.growth)
	if s.cases == 0 {
		t.Errorf("%s: no case checked", name)
	}
}

// TestRoundoffBoundRandomExact: on random symmetric matrices of orders
// 2 … 12 with random patterns (dense to sparse), indefinite diagonals,
// entries over ranges of scales, the Counter's order and the natural
// order, plain and fused arithmetic, every entry of the factorization's
// residual obeys the entrywise inequality and r covers the exact residual.
func TestRoundoffBoundRandomExact(t *testing.T) {
	rnd := rand.New(rand.NewPCG(31, 32))
	scales := [][2]int{{0, 0}, {-20, 20}, {-1074, -1000}, {-1060, -1040}, {960, 1000}, {-300, 300}}
	for _, sc := range scales {
		s := newSummary()
		for trial := 0; trial < 60; trial++ {
			n := 2 + rnd.IntN(11)
			density := []float64{1, 0.5, 0.2}[trial%3]
			k := randomScaledSym(rnd, n, density, sc[0], sc[1])
			var perm []int
			if trial%2 == 1 {
				perm = naturalOrderOf(n)
			}
			s.add(t, boundCase{name: fmt.Sprintf("scales 2^%v trial %d", sc, trial), k: toISym(k),
				m: toISym(identity(n)), sigma: 0, perm: perm, fused: trial%4 >= 2})
		}
		s.log(t, fmt.Sprintf("entries 2^[%d, %d]", sc[0], sc[1]))
	}
}

// TestRoundoffBoundLongRows: patterns that make m (the terms summed into
// one y slot, and the longest row of L) large: an arrow matrix whose hub
// is eliminated last (row n−1 of L full), the same with the hub first
// (L full: ũ_r sums r terms), two hubs (every update of row n−1 lands in
// the slot of n−2), a dense matrix, and a dense one whose leading pivot
// is 1e-13 (growth 1e13); each at a shift next to an eigenvalue of (K, I),
// where pivots are small and L grows.
func TestRoundoffBoundLongRows(t *testing.T) {
	rnd := rand.New(rand.NewPCG(33, 34))
	const n = 32
	arrow := func(hubs []int) *Sym {
		b := NewBuilder(n)
		for i := 0; i < n; i++ {
			b.Add(i, i, 4+rnd.Float64())
			if i+1 < n {
				b.Add(i, i+1, rnd.Float64()-0.5)
			}
		}
		for _, h := range hubs {
			for i := 0; i < n; i++ {
				if i != h {
					b.Add(i, h, rnd.Float64()-0.5)
				}
			}
		}
		return b.Build()
	}
	reversed := make([]int, n)
	for i := range reversed {
		reversed[i] = n - 1 - i
	}
	// A dense matrix with a leading pivot 1e-13 (natural order): L grows
	// by 1e13 in its first column and D by as much after it.
	tiny := randomScaledSym(rnd, n, 1, -1, 1)
	tiny.Val[tiny.Pat.colPtr[0]] = 1e-13
	s := newSummary()
	for _, tc := range []struct {
		name string
		k    *Sym
		perm []int
	}{
		{"tiny leading pivot", tiny, naturalOrderOf(n)},
		{"hub last", arrow([]int{n - 1}), naturalOrderOf(n)},
		{"hub first (L full)", arrow([]int{n - 1}), reversed},
		{"two hubs last", arrow([]int{n - 2, n - 1}), naturalOrderOf(n)},
		{"dense", randomScaledSym(rnd, n, 1, -2, 2), naturalOrderOf(n)},
		{"hub, Counter's order", arrow([]int{n / 2}), nil},
	} {
		eig := denseGeneralizedEigs(t, tc.k, identity(n))
		shifts := []float64{0.5 * (eig[0] + eig[1]), eig[n/2] * (1 + 1e-12), eig[n/2]}
		if tc.k == tiny {
			shifts = []float64{0, 1e-13 * (1 - 0x1p-20)} // leading pivot 1e-13, about 1e-19
		}
		for _, sigma := range shifts {
			for _, fused := range []bool{false, true} {
				s.add(t, boundCase{name: fmt.Sprintf("%s σ=%g fused=%v", tc.name, sigma, fused),
					k: toISym(tc.k), m: toISym(identity(n)), sigma: sigma, perm: tc.perm, fused: fused})
			}
		}
	}
	s.log(t, "long rows")
}

// TestRoundoffBoundWorstMember: for interval pencils with wide entries
// (relative widths 1e-12 … 1, intervals containing 0, a wide mass matrix
// multiplied by a large shift) r covers the residual of the worst member,
// computed exactly at the corners of every entry's box.
func TestRoundoffBoundWorstMember(t *testing.T) {
	rnd := rand.New(rand.NewPCG(35, 36))
	widen := func(s *Sym, rho float64, straddle bool) *ISym {
		v := make([]interval.I, len(s.Val))
		for q, x := range s.Val {
			w := rho * math.Abs(x) * rnd.Float64()
			lo, hi := x-w, x+w
			if straddle && rnd.IntN(4) == 0 {
				lo = -math.Abs(hi)
			}
			v[q] = interval.I{Lo: lo, Hi: hi}
		}
		return &ISym{Pat: s.Pat, Val: v}
	}
	s := newSummary()
	for trial := 0; trial < 24; trial++ {
		n := 3 + rnd.IntN(10)
		k, m := randomSPD(n, 3, uint64(100+trial)), randomSPD(n, 2, uint64(200+trial))
		rho := []float64{1e-12, 1e-6, 1e-2, 1}[trial%4]
		sigma := []float64{0.5, 3, 1e6}[trial%3]
		s.add(t, boundCase{name: fmt.Sprintf("trial %d ρ=%g σ=%g", trial, rho, sigma),
			k: widen(k, rho, trial%2 == 0), m: widen(m, rho, false), sigma: sigma})
	}
	s.log(t, "interval pencils")

	// An unbounded entry makes r = +∞, never a finite or NaN number.
	k := toISym(randomSPD(5, 2, 37))
	k.Val[1] = interval.I{Lo: math.Inf(-1), Hi: math.Inf(1)}
	c := roundoffCounter(k, toISym(identity(5)))
	if !factorForBound(c, 0.5, nil) {
		t.Fatal("factorization failed")
	}
	if r := c.roundoffBound(0.5); !math.IsInf(r, 1) {
		t.Errorf("unbounded entry: r = %g, want +Inf", r)
	}
}

// TestRoundoffBoundMixedScales: entries from 1e-300 to 1e300 in one
// matrix. Either the factorization fails (overflow makes a non-finite
// pivot or L entry), or r is +∞, or r covers the exact residual; a finite
// r below it would be a lie. Also one overflow made on purpose.
func TestRoundoffBoundMixedScales(t *testing.T) {
	rnd := rand.New(rand.NewPCG(38, 39))
	s := newSummary()
	for trial := 0; trial < 80; trial++ {
		n := 2 + rnd.IntN(6)
		k := randomScaledSym(rnd, n, 0.7, -997, 997)
		var perm []int
		if trial%2 == 1 {
			perm = naturalOrderOf(n)
		}
		s.add(t, boundCase{name: fmt.Sprintf("trial %d", trial), k: toISym(k), m: toISym(identity(n)),
			sigma: 0, perm: perm, fused: trial%3 == 0})
	}
	s.log(t, "mixed scales 2^[-997, 997]")
	if s.failed == 0 {
		t.Errorf("no overflow happened: the case does not test it")
	}

	// L_21 = 2¹⁰⁰⁰/2⁻⁵⁰ overflows: the factorization must refuse.
	c := roundoffCounter(toISym(twoByTwo(0x1p-50, 0x1p1000, 1)), toISym(identity(2)))
	if factorForBound(c, 0, naturalOrderOf(2)) {
		t.Errorf("overflowing L accepted: L = %v, D = %v", c.f.Val, c.f.D)
	}
	if _, _, ok := roundoffCounter(toISym(twoByTwo(0x1p-50, 0x1p1000, 1)), toISym(identity(2))).CountBelow(1, 0.5); ok {
		t.Errorf("CountBelow accepted an overflowing factorization")
	}
}

// TestRoundoffBoundHillClimb searches small dense matrices (natural
// order, M = I, σ = 0 so S = K and only the rounding errors of Factorize
// remain) for the largest ratio |R_ij| / bound_ij, mutating entries by a
// few ulps or redrawing them, in plain and fused arithmetic, in regimes
// where the relative errors dominate (normal entries) and where the
// underflow terms do (entries a few thousand units 2⁻¹⁰⁷⁴; a huge
// diagonal with off-diagonal entries whose quotients underflow). The
// ratio must stay below 1 (the entrywise inequality); the largest found
// is logged and must come near enough to 1 to show the search bites.
func TestRoundoffBoundHillClimb(t *testing.T) {
	rnd := rand.New(rand.NewPCG(40, 41))
	type regime struct {
		name string
		n    int
		// draw returns a fresh value for entry (i, j).
		draw func(i, j int) float64
		// least ratio the search must reach (a failing search shows nothing).
		least float64
	}
	regimes := []regime{
		{"normal 2×2", 2, func(i, j int) float64 { return 0.5 + rnd.Float64() }, 0.2},
		{"normal 3×3", 3, func(i, j int) float64 { return 0.5 + rnd.Float64() }, 0.2},
		{"subnormal 3×3", 3, func(i, j int) float64 { return float64(1+rnd.IntN(1<<12)) * 0x1p-1074 }, 0.05},
		{"underflowing quotients 3×3", 3, func(i, j int) float64 {
			if i == j {
				return math.Ldexp(0.5+rnd.Float64(), 40+rnd.IntN(30))
			}
			return float64(1+rnd.IntN(1<<8)) * 0x1p-1040
		}, 0.02},
	}
	type variant struct {
		fused     bool
		algorithm factorAlgorithm
	}
	for _, rg := range regimes {
		for _, vr := range []variant{{false, upLooking}, {true, upLooking}, {false, multifrontal}} {
			fused := vr.fused
			n := rg.n
			build := func(v []float64) *Sym {
				b := NewBuilder(n)
				q := 0
				for i := 0; i < n; i++ {
					for j := 0; j <= i; j++ {
						b.Add(i, j, v[q])
						q++
					}
				}
				return b.Build()
			}
			score := func(v []float64) float64 {
				c := roundoffCounter(toISym(build(v)), toISym(identity(n)))
				c.f.algorithm = vr.algorithm
				if !factorForBound(c, 0, naturalOrderOf(n)) {
					return 0
				}
				if fused {
					var g LDL
					if !factorizeFused(&g, c.sym, c.c) {
						return 0
					}
					c.f = g
				}
				e, err := entryBoundCheck(c)
				if err != nil {
					t.Fatal(err)
				}
				return 1 / e
			}
			ij := func(q int) (int, int) { // position q of the lower triangle by rows
				i := 0
				for q > i {
					q -= i + 1
					i++
				}
				return i, q
			}
			best := 0.0
			for restart := 0; restart < 3; restart++ {
				vals := make([]float64, n*(n+1)/2)
				for q := range vals {
					vals[q] = rg.draw(ij(q))
				}
				cur := score(vals)
				for it := 0; it < 160; it++ {
					next := append([]float64(nil), vals...)
					q := rnd.IntN(len(next))
					if rnd.IntN(5) == 0 {
						next[q] = rg.draw(ij(q))
					} else {
						next[q] = math.Float64frombits(math.Float64bits(next[q]) + uint64(rnd.IntN(64)) - 32)
					}
					if v := score(next); v >= cur {
						vals, cur = next, v
					}
				}
				best = math.Max(best, cur)
			}
			t.Logf("%s %+v: largest |R_ij|/bound_ij found %.3f", rg.name, vr, best)
			if !(best < 1) {
				t.Errorf("%s %+v: the entrywise inequality fails (ratio %g)", rg.name, vr, best)
			}
			if best < rg.least {
				t.Errorf("%s %+v: the search found only %g: it does not approach the bound", rg.name, vr, best)
			}
		}
	}
}

// TestRoundoffUpWithFusedProduct: the compiler fuses up(a*b) in
// roundoffBound into fl(a·b + δ) with δ = fl(|fl(a·b)|·2⁻⁵²) + 2⁻¹⁰⁷⁴ (one
// rounding; seen in the arm64 and amd64 v3 assembly). That is still ≥ the
// exact a·b: fl(a·b + δ) ≥ fl(a·b) (monotone rounding), and if a·b >
// fl(a·b) then a·b + δ > fl(a·b) + δ ≥ succ(fl(a·b)) ≥ a·b. Checked
// exactly on products at the ends of the range and with ties.
func TestRoundoffUpWithFusedProduct(t *testing.T) {
	rnd := rand.New(rand.NewPCG(42, 43))
	check := func(a, b float64) {
		p := float64(a * b)
		delta := float64(math.Abs(p)*0x1p-52) + 0x1p-1074
		fused := math.FMA(a, b, delta)
		if math.IsInf(fused, 1) {
			return
		}
		exact := new(big.Rat).Mul(new(big.Rat).SetFloat64(a), new(big.Rat).SetFloat64(b))
		if new(big.Rat).SetFloat64(fused).Cmp(exact) < 0 {
			t.Errorf("fl(%g·%g + δ) = %g below the exact product", a, b, fused)
		}
	}
	for i := 0; i < 20000; i++ {
		a := math.Ldexp(1+rnd.Float64(), rnd.IntN(2100)-1075)
		b := math.Ldexp(1+rnd.Float64(), rnd.IntN(200)-100)
		check(a, b)
		check(a, 1+math.Ldexp(float64(rnd.IntN(8)), -52))
	}
	for _, ab := range [][2]float64{{0x1p-1074, 0.5}, {0x1p-1074, 0.75}, {3 * 0x1p-1074, 0.5},
		{0x1p-1022, 1 - 0x1p-53}, {math.MaxFloat64, 1 - 0x1p-53}, {1 + 0x1p-52, 1 + 0x1p-52}} {
		check(ab[0], ab[1])
	}
}

// TestRoundoffCountNearEigenvalues: with the a-priori residual bound only,
// counts of random indefinite-shift pencils at shifts within a few ulps of
// a verified eigenvalue (enclose.Eigenvalues) never count fewer
// eigenvalues than lie certainly below σ', and between eigenvalues the
// count is exact.
func TestRoundoffCountNearEigenvalues(t *testing.T) {
	rnd := rand.New(rand.NewPCG(44, 45))
	checked := 0
	for trial := 0; trial < 6; trial++ {
		n := 6 + rnd.IntN(10)
		k, m := randomScaledSym(rnd, n, 0.4, -3, 3), randomSPD(n, 2, uint64(300+trial))
		dk, dm, id := enclose.NewSym(n), enclose.NewSym(n), enclose.NewSym(n)
		for i := 0; i < n; i++ {
			id.Set(i, i, interval.Point(1))
			for j := 0; j <= i; j++ {
				dk.Set(i, j, interval.Point(k.At(i, j)))
				dm.Set(i, j, interval.Point(m.At(i, j)))
			}
		}
		eig, err := enclose.Eigenvalues(dk, dm)
		if err != nil {
			t.Fatal(err)
		}
		me, err := enclose.Eigenvalues(dm, id)
		if err != nil {
			t.Fatal(err)
		}
		mMin := me[0].Lo
		for _, alg := range []factorAlgorithm{upLooking, multifrontal} {
			c := roundoffCounter(toISym(k), toISym(m))
			c.f.algorithm = alg
			for i, e := range eig {
				mid := e.Mid()
				for _, sigma := range []float64{mid, math.Nextafter(mid, math.Inf(1)), mid * (1 + 1e-13), mid * (1 - 1e-13)} {
					got, sp, ok := c.CountBelow(mMin, sigma)
					if !ok {
						continue
					}
					checked++
					below := 0
					for _, v := range eig {
						if v.Hi < sp {
							below++
						}
					}
					if below > got {
						t.Errorf("trial %d eigenvalue %d σ=%g: %d eigenvalues below σ'=%g, count %d", trial, i, sigma, below, sp, got)
					}
				}
				if i+1 < n && e.Hi < eig[i+1].Lo {
					sigma := (e.Hi + eig[i+1].Lo) / 2
					if got, _, ok := c.CountBelow(mMin, sigma); ok && got != i+1 {
						t.Errorf("trial %d algorithm %d: σ=%g between eigenvalues %d and %d: count %d", trial, alg, sigma, i+1, i+2, got)
					}
				}
			}
		}
	}
	t.Logf("%d counts next to eigenvalues checked", checked)
}

// TestFactorizeScatterOneEntryPerSlot: the bound takes the scatter
// y_r = 0 + a_kr of Factorize as exact, which needs every slot of column k
// of the permuted upper triangle to receive one entry of S. Builders merge
// duplicates and union merges the entries of [K] and [M]; checked on
// pencils built with repeated and mirrored entries, in random orders.
func TestFactorizeScatterOneEntryPerSlot(t *testing.T) {
	rnd := rand.New(rand.NewPCG(46, 47))
	for trial := 0; trial < 20; trial++ {
		n := 2 + rnd.IntN(30)
		k, m := NewIBuilder(n), NewIBuilder(n)
		for e := 0; e < 4*n; e++ {
			i, j := rnd.IntN(n), rnd.IntN(n)
			k.Add(i, j, interval.Point(1))
			k.Add(j, i, interval.Point(1)) // the mirror: the same entry
			if rnd.IntN(2) == 0 {
				m.Add(i, j, interval.Point(1))
			}
		}
		for i := 0; i < n; i++ {
			k.Add(i, i, interval.Point(1))
			m.Add(i, i, interval.Point(1))
		}
		c := NewCounter(k.Build(), m.Build())
		perm := rnd.Perm(n)
		for _, sym := range []*Symbolic{c.sym, analyzePattern(c.c.Pat, perm)} {
			for col := 0; col < n; col++ {
				seen := map[int32]bool{}
				for q := sym.uPtr[col]; q < sym.uPtr[col+1]; q++ {
					if seen[sym.uRow[q]] {
						t.Fatalf("trial %d: column %d of the permuted upper triangle holds row %d twice", trial, col, sym.uRow[q])
					}
					seen[sym.uRow[q]] = true
				}
			}
		}
	}
}

// TestRoundoffCountThickMembers: for interval pencils with relative widths
// up to 1e-4, the count with the a-priori residual bound is true for
// members at the corners and inside the boxes: no member has more
// eigenvalues (enclosed by enclose.Eigenvalues, a verified dense method)
// certainly below σ' than the count.
func TestRoundoffCountThickMembers(t *testing.T) {
	rnd := rand.New(rand.NewPCG(48, 49))
	checked := 0
	for trial := 0; trial < 4; trial++ {
		n := 6 + rnd.IntN(6)
		k, m := randomScaledSym(rnd, n, 0.5, -2, 2), randomSPD(n, 2, uint64(400+trial))
		rho := []float64{1e-10, 1e-4}[trial%2]
		widen := func(s *Sym) *ISym {
			v := make([]interval.I, len(s.Val))
			for q, x := range s.Val {
				w := rho * math.Abs(x)
				v[q] = interval.I{Lo: x - w, Hi: x + w}
			}
			return &ISym{Pat: s.Pat, Val: v}
		}
		ik, im := widen(k), widen(m)
		members := make([][2]*enclose.Sym, 0, 4)
		for pick := 0; pick < 4; pick++ {
			dk, dm := enclose.NewSym(n), enclose.NewSym(n)
			for i := 0; i < n; i++ {
				for j := 0; j <= i; j++ {
					choose := func(x interval.I) float64 {
						switch pick {
						case 0:
							return x.Lo
						case 1:
							return x.Hi
						}
						return math.Max(x.Lo, math.Min(x.Hi, x.Lo+rnd.Float64()*(x.Hi-x.Lo)))
					}
					dk.Set(i, j, interval.Point(choose(ik.At(i, j))))
					dm.Set(i, j, interval.Point(choose(im.At(i, j))))
				}
			}
			members = append(members, [2]*enclose.Sym{dk, dm})
		}
		// mMin: a lower bound of λ_min over the box of M (Weyl: λ_min(M) ≥
		// λ_min(mid) − ‖M − mid‖₂, and ‖M − mid‖₂ ≤ ‖M − mid‖∞ ≤ the
		// largest row sum of the widths Hi − Lo ≥ |M_ij − mid_ij|).
		mid, id := enclose.NewSym(n), enclose.NewSym(n)
		radius := 0.0
		for i := 0; i < n; i++ {
			id.Set(i, i, interval.Point(1))
			row := 0.0
			for j := 0; j < n; j++ {
				x := im.At(i, j)
				row = interval.AddUp(row, interval.SubUp(x.Hi, x.Lo))
				if j <= i {
					mid.Set(i, j, interval.Point(x.Mid()))
				}
			}
			radius = math.Max(radius, row)
		}
		me, err := enclose.Eigenvalues(mid, id)
		if err != nil {
			t.Fatal(err)
		}
		mMin := interval.SubDown(me[0].Lo, radius)
		if !(mMin > 0) {
			t.Fatalf("trial %d: mass matrix not certainly positive definite", trial)
		}
		eigs := make([][]interval.I, len(members))
		for p, mb := range members {
			if eigs[p], err = enclose.Eigenvalues(mb[0], mb[1]); err != nil {
				t.Fatal(err)
			}
		}
		c := roundoffCounter(ik, im)
		for _, e := range eigs[0] {
			for _, sigma := range []float64{e.Mid(), e.Mid() * (1 + 1e-6), e.Mid() * (1 - 1e-6)} {
				got, sp, ok := c.CountBelow(mMin, sigma)
				if !ok {
					continue
				}
				checked++
				for p, ev := range eigs {
					below := 0
					for _, v := range ev {
						if v.Hi < sp {
							below++
						}
					}
					if below > got {
						t.Errorf("trial %d member %d σ=%g: %d eigenvalues below σ'=%g, count %d", trial, p, sigma, below, sp, got)
					}
				}
			}
		}
	}
	t.Logf("%d counts checked against 4 members each", checked)
}

// TestRoundoffBoundRowTight: a 2×2 matrix on which the exact residual
// norm is 2/3 of r, so r holds where it is tightest and no smaller factor
// c than about 2/3 of the proved one would do. With d_1 = 1 − 29·2⁻⁵³,
// a_21 = 2²⁰(1 + β·2⁻⁵²), β = 47453125 (β² ≈ 2⁵¹, so that L_21·a_21 lies
// next to a midpoint between floats) and a_22 = succ(fl(L_21·a_21)):
// L_21 = fl(a_21/d_1) and fl(L_21·a_21) both round up by almost half an
// ulp, so R_21 = a_21 − L_21 d_1 ≈ −u·a_21 and R_22 = (fl(L_21 a_21) −
// L_21 a_21) + L_21 R_21 ≈ 2u·L_21 a_21 in magnitude with equal signs,
// while the bound of row 2 is c(|L_21||d_1|(1 + |L_21|) + |d_2|) ≈
// 3u·L_21² d_1 (d_2 = 2⁻¹², c ≈ 3u): ‖R‖∞/r → 2/3. (Found by a search over
// β and d_1; the numbers are checked exactly below.)
func TestRoundoffBoundRowTight(t *testing.T) {
	d1, a21 := 0x1.fffffffffffe3p-01, 0x1.0000002d413c5p+20
	a22 := 0x1.0000005a8279ap+40
	if p := float64(float64(a21/d1) * a21); a22 != math.Nextafter(p, math.Inf(1)) {
		t.Fatalf("a_22 = %x, want succ(fl(L_21·a_21)) = succ(%x)", a22, p)
	}
	k := twoByTwo(d1, a21, a22)
	c := roundoffCounter(toISym(k), toISym(identity(2)))
	if !factorForBound(c, 0, naturalOrderOf(2)) {
		t.Fatal("factorization failed")
	}
	r := c.roundoffBound(0)
	exact := exactResidual(c, pointMember(k, identity(2)), 0)
	ratio, _ := new(big.Rat).Quo(exact, new(big.Rat).SetFloat64(r)).Float64()
	t.Logf("‖R‖∞/r = %.6f (r = %g)", ratio, r)
	if !(ratio < 1) {
		t.Errorf("r = %g below the exact residual (ratio %g)", r, ratio)
	}
	if ratio < 0.66 {
		t.Errorf("‖R‖∞/r = %g: the case lost its tightness (want ≥ 0.66)", ratio)
	}
}

// TestRoundoffBoundDifferencePermuted: the enclosed difference
// K − σM − S is summed by the rows of the unpermuted pencil and must be
// added to the factorization term of the same row after the elimination
// order. The case makes a mismatch visible: row 0 (eliminated last, the
// order reversed) holds the only wide entry (K_00 of radius 1e-10) and
// the only O(1) pivot, the other rows are of size 1e-8, so r with the
// difference of row 0 moved to another row would fall below the worst
// member's residual, W/2 plus the rounding error of the last pivot.
func TestRoundoffBoundDifferencePermuted(t *testing.T) {
	const n = 4
	b := NewIBuilder(n)
	b.Add(0, 0, interval.I{Lo: 3.1 - 1e-10, Hi: 3.1 + 1e-10})
	for i := 1; i < n; i++ {
		b.Add(i, i, interval.Point(1e-8*(1+float64(i)/7)))
		b.Add(i, 0, interval.Point(1e-9*(0.3+float64(i)/10)))
		if i+1 < n {
			b.Add(i+1, i, interval.Point(1e-10*float64(i)))
		}
	}
	k := b.Build()
	c := roundoffCounter(k, toISym(identity(n)))
	reversed := []int{3, 2, 1, 0}
	if !factorForBound(c, 0, reversed) {
		t.Fatal("factorization failed")
	}
	// The case needs a rounding error in the last pivot (row 0).
	if f, _ := exactResidual(c, pointMember(k.Mid(), identity(n)), 0).Float64(); !(f > 1e-20) {
		t.Fatalf("factorization residual %g: the last pivot was exact, the case shows nothing", f)
	}
	r := c.roundoffBound(0)
	worst := worstMemberResidual(c, 0)
	w, _ := worst.Float64()
	if new(big.Rat).SetFloat64(r).Cmp(worst) < 0 {
		t.Errorf("r = %.17g below the worst member's residual %.17g", r, w)
	}
	t.Logf("r = %.17g, worst member %.17g", r, w)
}
