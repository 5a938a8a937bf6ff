package sparse

import (
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"testing"

	"gapcert/enclose"
	"gapcert/enclose/solvertest"
	"gapcert/interval"
)

// roundoffCounter returns a Counter that always bounds the residual by
// roundoffBound (the a-priori rounding-error bound), whatever the size.
func roundoffCounter(k, m *ISym) *Counter {
	c := NewCounter(k, m)
	c.sharpLimit, c.lossLimit = -1, math.Inf(1)
	return c
}

// exactResidual returns max_i Σ_j |R_ij|, R = Pᵀ(K − σM)P − L D Lᵀ for
// the member (K, M) of the pencil of c given entrywise by member (original
// indices) and the float factors c.f, in exact rational arithmetic (every
// float is an exact rational).
func exactResidual(c *Counter, member func(i, j int) (k, m float64), sigma float64) *big.Rat {
	n := len(c.f.D)
	perm := c.sym.perm
	rat := func(x float64) *big.Rat { return new(big.Rat).SetFloat64(x) }
	l := make([]map[int]*big.Rat, n) // rows of L, strictly lower
	for i := range l {
		l[i] = map[int]*big.Rat{}
	}
	for k := 0; k < n; k++ {
		for q := c.f.Sym.colPtr[k]; q < c.f.Sym.colPtr[k+1]; q++ {
			l[c.f.Row[q]][k] = rat(c.f.Val[q])
		}
	}
	lAt := func(i, q int) *big.Rat {
		if i == q {
			return big.NewRat(1, 1)
		}
		return l[i][q]
	}
	worst, tmp, s := new(big.Rat), new(big.Rat), rat(sigma)
	for i := 0; i < n; i++ {
		rowSum := new(big.Rat)
		for j := 0; j < n; j++ {
			kv, mv := member(perm[i], perm[j])
			e := rat(kv)
			e.Sub(e, tmp.Mul(s, rat(mv)))
			for q := 0; q <= min(i, j); q++ {
				a, b := lAt(i, q), lAt(j, q)
				if a == nil || b == nil {
					continue
				}
				tmp.Mul(a, rat(c.f.D[q]))
				tmp.Mul(tmp, b)
				e.Sub(e, tmp)
			}
			rowSum.Add(rowSum, e.Abs(e))
		}
		if rowSum.Cmp(worst) > 0 {
			worst.Set(rowSum)
		}
	}
	return worst
}

// pointMember returns the member function of a point pencil.
func pointMember(k, m *Sym) func(i, j int) (float64, float64) {
	return func(i, j int) (float64, float64) { return k.At(i, j), m.At(i, j) }
}

// scaled returns 2^e·s (exact unless the entries leave the range of
// doubles; the callers pick e so they do not).
func scaled(s *Sym, e int) *Sym {
	v := make([]float64, len(s.Val))
	for q, x := range s.Val {
		v[q] = math.Ldexp(x, e)
	}
	return &Sym{Pat: s.Pat, Val: v}
}

// twoByTwo returns the symmetric matrix [[a, b], [b, c]].
func twoByTwo(a, b, c float64) *Sym {
	s := NewBuilder(2)
	s.Add(0, 0, a)
	s.Add(1, 0, b)
	s.Add(1, 1, c)
	return s.Build()
}

// TestRoundoffBoundExact: the a-priori bound r of roundoffBound is at
// least the exact residual norm of the factors Factorize computed, on
// point pencils chosen to stress each term of the bound: element growth
// at a shift next to an eigenvalue, entries near overflow and in the
// subnormal range, and divisions whose result underflows. r must also stay
// within a factor of the longest row of L (the factor c of the bound)
// times a modest constant of the exact residual.
func TestRoundoffBoundExact(t *testing.T) {
	g7 := grid5Eigs(7)
	near := g7[5] * (1 + 1e-9) // within 1e-9 of the 6th eigenvalue: tiny pivots
	for _, tc := range []struct {
		name  string
		k, m  *Sym
		sigma float64
		// loose: the ratio r/exact may exceed the usual factor (the
		// underflow terms dominate and are bounded crudely).
		loose bool
	}{
		{"random n=40", randomSPD(40, 5, 21), randomSPD(40, 3, 22), 0.3, false},
		{"random n=60 indefinite", randomSPD(60, 6, 23), identity(60), 2.5, false},
		{"grid5 m=7 next to an eigenvalue", grid5(7), identity(49), near, false},
		{"grid5 m=6 scaled 2⁹⁶⁰", scaled(grid5(6), 960), identity(36), 1e291, false},
		{"grid5 m=6 scaled 2⁻¹⁰⁷⁰ (subnormal)", scaled(grid5(6), -1070), identity(36), 0, true},
		{"random n=30 scaled 2⁻¹⁰⁴⁰", scaled(randomSPD(30, 4, 24), -1040), identity(30), 0, true},
		{"grid5 m=14 scaled 2⁻¹⁰⁷²", scaled(grid5(14), -1072), identity(196), 0, true},
		// d_1 = 2⁶⁰, L_21 = fl(3·2⁻¹⁰¹⁵/2⁶⁰) = fl(1.5·2⁻¹⁰⁷⁴) = 2⁻¹⁰⁷³ (tie
		// to even), so R_21 = 3·2⁻¹⁰¹⁵ − 2⁻¹⁰¹³ = −2⁻¹⁰¹⁵: the whole
		// residual is the underflow of one division, scaled by d_1. (The
		// term c·|d_1| of the bound covers it many times over: the case
		// checks containment, not that the underflow term t_r is needed.)
		{"2×2 underflowing division", twoByTwo(0x1p60, 3*0x1p-1015, 1), identity(2), 0, true},
	} {
		for _, alg := range []factorAlgorithm{upLooking, multifrontal} {
			c := roundoffCounter(toISym(tc.k), toISym(tc.m))
			c.f.algorithm = alg
			if _, _, ok := c.CountBelow(1, tc.sigma); !ok {
				t.Fatalf("%s: factorization failed", tc.name)
			}
			r := c.roundoffBound(tc.sigma)
			exact := exactResidual(c, pointMember(tc.k, tc.m), tc.sigma)
			ex, _ := exact.Float64()
			if new(big.Rat).SetFloat64(r).Cmp(exact) < 0 {
				t.Errorf("%s: r = %g below the exact residual %g", tc.name, r, ex)
			}
			sharp := c.sharpResidual(tc.sigma)
			if new(big.Rat).SetFloat64(sharp).Cmp(exact) < 0 {
				t.Errorf("%s: sharp r = %g below the exact residual %g", tc.name, sharp, ex)
			}
			rows := maxRowOfL(&c.f)
			if !tc.loose && r > 64*float64(rows+2)*ex {
				t.Errorf("%s: r = %g, exact %g: above 64·(longest row + 2) = %d times", tc.name, r, ex, 64*(rows+2))
			}
			t.Logf("%s (algorithm %d): r = %.3g, sharp %.3g, exact %.3g, r/exact %.1f, longest row %d", tc.name, alg, r, sharp, ex, r/ex, rows)
		}
	}
}

// maxRowOfL returns the largest number of off-diagonal entries in a row
// of L.
func maxRowOfL(f *LDL) int {
	count := make([]int, len(f.D))
	m := 0
	for _, i := range f.Row {
		count[i]++
		m = max(m, count[i])
	}
	return m
}

// TestRoundoffBoundTerms shows that each term of the bound is needed: on
// a pencil with S = K exactly (σ = 0) the enclosed difference K − σM − S
// is zero and the underflow terms are below 2⁻¹⁰⁰⁰, so only the term
// c·|L||D||Lᵀ| covers the exact residual; on a matrix with subnormal
// entries c·|L||D||Lᵀ| is far below the exact residual, so only the
// underflow term covers it. Dropping
// either term from roundoffBound makes TestRoundoffBoundExact fail; this
// test checks that the cases have that property.
func TestRoundoffBoundTerms(t *testing.T) {
	k := randomSPD(60, 6, 25)
	c := roundoffCounter(toISym(k), toISym(identity(60)))
	if _, _, ok := c.CountBelow(1, 0); !ok {
		t.Fatal("factorization failed")
	}
	for i, d := range c.differenceRows(0) {
		if d != 0 {
			t.Fatalf("row %d: difference %g, want 0 (S = K at σ = 0)", i, d)
		}
	}
	exact, _ := exactResidual(c, pointMember(k, identity(60)), 0).Float64()
	if !(exact > 0x1p-1000) {
		t.Errorf("exact residual %g: the factorization was exact, the case shows nothing", exact)
	}

	// All entries subnormal: every product underflows, and the exact
	// residual is some dozens of units 2⁻¹⁰⁷⁴ while c·|L||D||Lᵀ| is below
	// one unit; only the underflow term 2·mMax·η₀ per entry covers it.
	const side = 14
	sub := scaled(grid5(side), -1072)
	c = roundoffCounter(toISym(sub), toISym(identity(side*side)))
	if _, _, ok := c.CountBelow(1, 0); !ok {
		t.Fatal("factorization failed")
	}
	exact, _ = exactResidual(c, pointMember(sub, identity(side*side)), 0).Float64()
	lld := 0.0
	for k := range c.f.D {
		lld = math.Max(lld, absLDLRowSum(&c.f, k))
	}
	cf := roundoffFactor(maxRowOfL(&c.f))
	if unit := math.SmallestNonzeroFloat64; !(2*cf*lld < unit && exact > 16*unit) {
		t.Errorf("c·‖|L||D||Lᵀ|‖∞ = %g, exact residual %g: the case does not need the underflow term", cf*lld, exact)
	}
}

// absLDLRowSum returns Σ_j (|L||D||Lᵀ|)_kj = Σ_{i≤k} |L_ki||d_i| S_i in
// float arithmetic (an estimate for tests).
func absLDLRowSum(f *LDL, k int) float64 {
	lp := f.Sym.colPtr
	colSum := func(i int) float64 {
		s := 1.0
		for q := lp[i]; q < lp[i+1]; q++ {
			s += math.Abs(f.Val[q])
		}
		return s
	}
	sum := math.Abs(f.D[k]) * colSum(k)
	for i := 0; i < k; i++ {
		for q := lp[i]; q < lp[i+1]; q++ {
			if int(f.Row[q]) == k {
				sum += math.Abs(f.Val[q]) * math.Abs(f.D[i]) * colSum(i)
			}
		}
	}
	return sum
}

// TestRoundoffBoundThick: for a pencil with wide interval entries the
// bound covers the exact residual of random members (each stored entry at
// its lower or upper end or in between).
func TestRoundoffBoundThick(t *testing.T) {
	rnd := rand.New(rand.NewPCG(11, 12))
	for _, rho := range []float64{1e-9, 1e-3} {
		k, m := randomSPD(40, 5, 26), randomSPD(40, 3, 27)
		thick := func(s *Sym) *ISym {
			v := make([]interval.I, len(s.Val))
			for q, x := range s.Val {
				w := rho * math.Abs(x)
				v[q] = interval.I{Lo: x - w, Hi: x + w}
			}
			return &ISym{Pat: s.Pat, Val: v}
		}
		ik, im := thick(k), thick(m)
		c := roundoffCounter(ik, im)
		const sigma = 0.7
		if _, _, ok := c.CountBelow(1, sigma); !ok {
			t.Fatal("factorization failed")
		}
		r := c.roundoffBound(sigma)
		for trial := 0; trial < 6; trial++ {
			pick := func(s *ISym) *Sym {
				v := make([]float64, len(s.Val))
				for q, x := range s.Val {
					switch trial {
					case 0:
						v[q] = x.Lo
					case 1:
						v[q] = x.Hi
					default:
						v[q] = x.Lo + rnd.Float64()*(x.Hi-x.Lo)
						v[q] = math.Max(x.Lo, math.Min(x.Hi, v[q]))
					}
				}
				return &Sym{Pat: s.Pat, Val: v}
			}
			km, mm := pick(ik), pick(im)
			exact := exactResidual(c, pointMember(km, mm), sigma)
			ex, _ := exact.Float64()
			if new(big.Rat).SetFloat64(r).Cmp(exact) < 0 {
				t.Errorf("ρ = %g member %d: r = %g below the exact residual %g", rho, trial, r, ex)
			}
			if trial < 2 && r > 8*ex {
				t.Errorf("ρ = %g member %d: r = %g, exact %g: the width should dominate", rho, trial, r, ex)
			}
		}
	}
}

// TestRoundoffCountClosedForm: with the a-priori residual bound the count
// is the true count between the eigenvalues of the 5-point Laplacian
// (closed form, grid5Eigs) and of a random pencil (enclosed by
// enclose.Eigenvalues, a verified dense method), at shifts between
// eigenvalues and next to them, and σ' stays close to σ.
func TestRoundoffCountClosedForm(t *testing.T) {
	e := grid5Eigs(20)
	c := roundoffCounter(toISym(grid5(20)), toISym(identity(400)))
	shifts := midGaps(e, 20)
	shifts = append(shifts, e[3]*(1+1e-12), e[7]*(1-1e-12))
	for _, sigma := range shifts {
		n, sp, ok := c.CountBelow(1, sigma)
		if !ok {
			t.Errorf("σ=%g: factorization failed", sigma)
			continue
		}
		if got := countBelow(e, sp); got > n {
			t.Errorf("σ=%g: unsound, %d eigenvalues below σ'=%g, n = %d", sigma, got, sp, n)
		}
		if want := countBelow(e, sigma); n != want {
			t.Errorf("σ=%g: n = %d, want %d", sigma, n, want)
		}
		if (sigma-sp)/sigma > 1e-9 && sigma-e[countBelow(e, sigma)-1] > 1e-6*sigma {
			t.Errorf("σ=%g: σ' = %g, relative loss %g", sigma, sp, (sigma-sp)/sigma)
		}
	}

	const n = 30
	k, m := randomSPD(n, 5, 28), randomSPD(n, 3, 29)
	dk, dm := enclose.NewSym(n), enclose.NewSym(n)
	for i := 0; i < n; i++ {
		for j := 0; j <= i; j++ {
			dk.Set(i, j, interval.Point(k.At(i, j)))
			dm.Set(i, j, interval.Point(m.At(i, j)))
		}
	}
	eig, err := enclose.Eigenvalues(dk, dm)
	if err != nil {
		t.Fatal(err)
	}
	mMin := 0.0 // λ_min(M) ≥ the least eigenvalue of (M, I), enclosed
	{
		id := enclose.NewSym(n)
		for i := 0; i < n; i++ {
			id.Set(i, i, interval.Point(1))
		}
		me, err := enclose.Eigenvalues(dm, id)
		if err != nil {
			t.Fatal(err)
		}
		mMin = me[0].Lo
	}
	c = roundoffCounter(toISym(k), toISym(m))
	for i := 0; i+1 < n; i++ {
		if !(eig[i].Hi < eig[i+1].Lo) {
			continue
		}
		sigma := (eig[i].Hi + eig[i+1].Lo) / 2
		got, sp, ok := c.CountBelow(mMin, sigma)
		if !ok {
			t.Errorf("σ=%g: factorization failed", sigma)
			continue
		}
		if got != i+1 {
			t.Errorf("σ=%g: n = %d, want %d", sigma, got, i+1)
		}
		// Soundness: every eigenvalue certainly below σ' is counted.
		below := 0
		for _, v := range eig {
			if v.Hi < sp {
				below++
			}
		}
		if below > got {
			t.Errorf("σ=%g: %d eigenvalues below σ'=%g, n = %d", sigma, below, sp, got)
		}
		if (sigma-sp)/sigma > 1e-10 {
			t.Errorf("σ=%g: σ' = %g, relative loss %g", sigma, sp, (sigma-sp)/sigma)
		}
	}
}

// TestCountBelowResidualChoice: below the work limit the sharp bound
// alone gives σ'; above it the a-priori bound is kept within the loss
// limit, the smaller of both beyond it, and the a-priori bound whatever
// its loss above the fallback limit.
func TestCountBelowResidualChoice(t *testing.T) {
	k, m := toISym(grid5(12)), toISym(identity(144))
	const sigma = 100.0
	c := NewCounter(k, m)
	_, sp, ok := c.CountBelow(1, sigma)
	if !ok {
		t.Fatal("factorization failed")
	}
	sharp, roundoff := c.sharpResidual(sigma), c.roundoffBound(sigma)
	if !(sharp < roundoff) {
		t.Fatalf("sharp %g, a priori %g: the case does not tell them apart", sharp, roundoff)
	}
	loss := func(r float64) float64 { return interval.SubDown(sigma, interval.DivUp(r, 1)) }
	for _, tc := range []struct {
		name              string
		sharpLimit, fback int
		lossLimit         float64
		want              float64
	}{
		{"small pencil", sharpWorkLimit, sharpFallbackLimit, roundoffLossLimit, loss(sharp)},
		{"within the loss limit", -1, sharpFallbackLimit, 1, loss(roundoff)},
		{"beyond the loss limit", -1, sharpFallbackLimit, 0, loss(sharp)},
		{"beyond the fallback limit", -1, -1, 0, loss(roundoff)},
	} {
		c.sharpLimit, c.fallbackLimit, c.lossLimit = tc.sharpLimit, tc.fback, tc.lossLimit
		if _, sp, _ = c.CountBelow(1, sigma); sp != tc.want {
			t.Errorf("%s: σ' = %v, want %v", tc.name, sp, tc.want)
		}
	}
}

// TestRoundoffConformance runs the solver conformance suite with the
// a-priori residual bound in every count.
func TestRoundoffConformance(t *testing.T) {
	solvertest.Run(t, solvertest.Impl{
		LowestEigs: func(n int, e []solvertest.Entry, count int) ([]float64, [][]float64, error) {
			k, m := NewBuilder(n), NewBuilder(n)
			for _, x := range e {
				k.Add(x.I, x.J, x.K)
				m.Add(x.I, x.J, x.M)
			}
			return LowestEigs(k.Build(), m.Build(), count)
		},
		NewCounter: func(n int, e []solvertest.IEntry) enclose.Counter {
			k, m := NewIBuilder(n), NewIBuilder(n)
			for _, x := range e {
				k.Add(x.I, x.J, x.K)
				m.Add(x.I, x.J, x.M)
			}
			return roundoffCounter(k.Build(), m.Build())
		},
	})
}

// grid7 returns the 7-point Laplacian (1/h²)·(6, −1, …, −1) on the m³
// interior nodes of the unit cube, h = 1/(m+1): seven entries per row,
// like the Crouzeix–Raviart stiffness matrix of a tetrahedral mesh, and a
// three-dimensional fill under nested dissection.
func grid7(m int) *Sym {
	h := 1 / float64(m+1)
	c := 1 / (h * h)
	b := NewBuilder(m * m * m)
	for z := 0; z < m; z++ {
		for y := 0; y < m; y++ {
			for x := 0; x < m; x++ {
				i := (z*m+y)*m + x
				b.Add(i, i, 6*c)
				if x+1 < m {
					b.Add(i, i+1, -c)
				}
				if y+1 < m {
					b.Add(i, i+m, -c)
				}
				if z+1 < m {
					b.Add(i, i+m*m, -c)
				}
			}
		}
	}
	return b.Build()
}

// BenchmarkResidualBounds compares the two residual bounds of CountBelow
// on the 7-point Laplacian of the cube (identity mass, σ = 0.99 λ_2 =
// 0.99·(4/h²)(2 sin²(πh/2) + sin²(πh))): the sharp interval enclosure of
// every residual entry against the a-priori rounding-error bound, after
// one factorization (timed separately). Metrics: the relative losses
// r/σ of each bound in units of 1e-9. About 12k, 50k and 97k unknowns (the largest takes
// about 20 minutes of CPU for the sharp bound).
func BenchmarkResidualBounds(b *testing.B) {
	for _, m := range []int{23, 37, 46} {
		n := m * m * m
		k := grid7(m)
		h := 1 / float64(m+1)
		s1, s2 := math.Sin(math.Pi*h/2), math.Sin(math.Pi*h)
		sigma := 0.99 * 4 / (h * h) * (2*s1*s1 + s2*s2)
		c := NewCounter(toISym(k), toISym(identity(n)))
		if _, _, ok := c.CountBelow(1, sigma); !ok {
			b.Fatal("factorization failed")
		}
		b.Run(fmt.Sprintf("n=%d/factor", n), func(b *testing.B) {
			for b.Loop() {
				c.f.Factorize(c.sym, c.c)
			}
			b.ReportMetric(float64(c.f.NNZ()), "nnzL")
			b.ReportMetric(float64(maxRowOfL(&c.f)), "longest-row")
		})
		b.Run(fmt.Sprintf("n=%d/roundoff", n), func(b *testing.B) {
			var r float64
			for b.Loop() {
				r = c.roundoffBound(sigma)
			}
			b.ReportMetric(r/sigma*1e9, "loss-1e-9")
		})
		b.Run(fmt.Sprintf("n=%d/sharp", n), func(b *testing.B) {
			var r float64
			for b.Loop() {
				r = c.sharpResidual(sigma)
			}
			b.ReportMetric(r/sigma*1e9, "loss-1e-9")
			b.ReportMetric(peakRSS(), "peakRSS-MiB")
		})
	}
}
