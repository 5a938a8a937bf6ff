package sparse

import (
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"slices"
	"testing"
)

// factorBoth factors s under perm by the up-looking and the multifrontal
// algorithm.
func factorBoth(t *testing.T, s *Sym, perm []int) (up, mf *LDL) {
	t.Helper()
	sym := analyzePattern(s.Pat, perm)
	up, mf = &LDL{algorithm: upLooking}, &LDL{algorithm: multifrontal}
	if !up.Factorize(sym, s) {
		t.Fatal("up-looking factorization failed")
	}
	if !mf.Factorize(sym, s) {
		t.Fatal("multifrontal factorization failed")
	}
	return up, mf
}

// TestMultifrontalAgrees: the multifrontal factors have the row indices of
// the up-looking ones and the same values up to rounding, on 2D and 3D
// grids (nested dissection: wide supernodes), random sparse matrices and
// shifted indefinite pencils.
func TestMultifrontalAgrees(t *testing.T) {
	k, m := p1Square(12)
	cases := []struct {
		name string
		s    *Sym
	}{
		{"grid5 20", grid5(20)},
		{"grid7 7", grid7(7)},
		{"random SPD", randomSPD(300, 6, 3)},
		{"P1 shifted", shifted(k, m, 60)},
	}
	for _, tc := range cases {
		for _, perm := range [][]int{orderPattern(tc.s.Pat), naturalOrder(tc.s.N())} {
			up, mf := factorBoth(t, tc.s, perm)
			if !slices.Equal(up.Row, mf.Row) {
				t.Fatalf("%s: row indices differ", tc.name)
			}
			if up.NegCount() != mf.NegCount() {
				t.Errorf("%s: negative pivots %d and %d", tc.name, up.NegCount(), mf.NegCount())
			}
			worst := 0.0
			for i := range up.D {
				worst = math.Max(worst, math.Abs(up.D[i]-mf.D[i])/math.Abs(up.D[i]))
			}
			for q := range up.Val {
				worst = math.Max(worst, math.Abs(up.Val[q]-mf.Val[q])/(1+math.Abs(up.Val[q])))
			}
			if worst > 1e-9 {
				t.Errorf("%s: factors differ by %.3g", tc.name, worst)
			}
			if r := maxResidual(tc.s, mf); r > 1e-10 {
				t.Errorf("%s: residual %.3g", tc.name, r)
			}
		}
	}
}

// TestMultifrontalDeterministic: the multifrontal factors are the same bits
// on 1, 2 and 4 CPUs, with fronts large enough for the split update.
func TestMultifrontalDeterministic(t *testing.T) {
	s := grid7(14)
	r := rand.New(rand.NewPCG(5, 6))
	for q := range s.Val {
		s.Val[q] *= 1 + 0.1*r.Float64()
	}
	sym := analyzePattern(s.Pat, orderPattern(s.Pat))
	if sym.factorWork() < 4*parallelFrontWork {
		t.Fatalf("too small: %d multiply-adds", sym.factorWork())
	}
	defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(0))
	var first *LDL
	for _, procs := range []int{1, 2, 4} {
		runtime.GOMAXPROCS(procs)
		f := &LDL{algorithm: multifrontal}
		if !f.Factorize(sym, s) {
			t.Fatal("factorization failed")
		}
		if first == nil {
			first = f
			continue
		}
		if !slices.Equal(first.D, f.D) || !slices.Equal(first.Val, f.Val) {
			t.Errorf("GOMAXPROCS=%d: factors differ from GOMAXPROCS=1", procs)
		}
	}
	// Refactoring with the same workspaces (kept zero between fronts), of
	// another matrix and then of the first again.
	d, v := slices.Clone(first.D), slices.Clone(first.Val)
	if !first.Factorize(sym, shifted(s, identity(s.N()), 100)) || !first.Factorize(sym, s) {
		t.Fatal("refactorization failed")
	}
	if !slices.Equal(d, first.D) || !slices.Equal(v, first.Val) {
		t.Error("refactoring with kept workspaces changes the factors")
	}
}

// TestMultifrontalBreakdown: a zero pivot is reported.
func TestMultifrontalBreakdown(t *testing.T) {
	b := NewBuilder(3)
	b.Add(0, 0, 1)
	b.Add(1, 0, 1)
	b.Add(1, 1, 1)
	b.Add(2, 2, 1)
	s := b.Build()
	f := &LDL{algorithm: multifrontal}
	sym := analyzePattern(s.Pat, naturalOrder(3))
	if f.Factorize(sym, s) {
		t.Error("zero pivot not reported")
	}
	// The failure leaves no stale front behind.
	s.Val[0] = 2
	fresh := &LDL{algorithm: multifrontal}
	if !f.Factorize(sym, s) || !fresh.Factorize(sym, s) {
		t.Fatal("factorization failed")
	}
	if !slices.Equal(f.D, fresh.D) || !slices.Equal(f.Val, fresh.Val) {
		t.Errorf("after a failure: D = %v, L = %v; fresh: D = %v, L = %v", f.D, f.Val, fresh.D, fresh.Val)
	}
}

// perturbed returns s with every entry multiplied by 1 + ρ·U(−1, 1).
func perturbed(s *Sym, rho float64, r *rand.Rand) *Sym {
	v := make([]float64, len(s.Val))
	for q, x := range s.Val {
		v[q] = x * (1 + rho*(2*r.Float64()-1))
	}
	return &Sym{Pat: s.Pat, Val: v}
}

// TestRoundoffBoundMultifrontalTrees checks the entrywise inequality of
// roundoffBound exactly, and r against the exact residual, for the
// multifrontal algorithm on cases where its sums are trees, not chains:
// nested dissection of a 3D grid (update matrices of several children
// added into one entry) at shifts next to an eigenvalue (tiny pivots,
// growth), random sparse matrices under nested dissection at mixed and
// subnormal scales, a dense matrix of two panels with a tiny leading
// pivot, and an arrow whose hub row of L holds every column. The factors
// must differ from the up-looking ones somewhere (else the case shows
// nothing new).
func TestRoundoffBoundMultifrontalTrees(t *testing.T) {
	rnd := rand.New(rand.NewPCG(61, 62))
	g := perturbed(grid7(5), 0.2, rnd)
	eig := denseGeneralizedEigs(t, g, identity(g.N()))
	dense := randomScaledSym(rnd, 48, 1, -2, 2)
	dense.Val[dense.Pat.colPtr[0]] = 1e-13
	const na = 60
	ab := NewBuilder(na)
	for i := 0; i < na; i++ {
		ab.Add(i, i, 4+rnd.Float64())
		if i+1 < na {
			ab.Add(i, i+1, rnd.Float64()-0.5)
		}
		if i != na-1 {
			ab.Add(i, na-1, rnd.Float64()-0.5)
		}
	}
	arrow := ab.Build()
	type tcase struct {
		name  string
		k     *Sym
		sigma float64
		perm  []int
	}
	cases := []tcase{
		{"grid7 between eigenvalues", g, 0.5 * (eig[3] + eig[4]), nil},
		{"grid7 next to an eigenvalue", g, eig[8] * (1 + 1e-12), nil},
		{"dense 48, leading pivot 1e-13", dense, 0, naturalOrderOf(48)},
		{"arrow 60, hub last", arrow, 4.5, naturalOrderOf(na)},
	}
	for _, sc := range [][2]int{{-20, 20}, {-1074, -1000}, {960, 1000}, {-300, 300}} {
		s := randomScaledSym(rnd, 80, 0.05, sc[0], sc[1])
		cases = append(cases, tcase{fmt.Sprintf("random 80 scales 2^%v", sc), s, 0, nil})
	}
	s := newSummary()
	differ := 0
	for _, tc := range cases {
		bc := boundCase{name: tc.name, k: toISym(tc.k), m: toISym(identity(tc.k.N())), sigma: tc.sigma,
			perm: tc.perm, algorithm: multifrontal}
		s.add(t, bc)
		c := roundoffCounter(bc.k, bc.m)
		c.f.algorithm = upLooking
		if !factorForBound(c, tc.sigma, tc.perm) {
			continue
		}
		up := append([]float64(nil), c.f.Val...)
		upD := append([]float64(nil), c.f.D...)
		c.f.algorithm = multifrontal
		if !factorForBound(c, tc.sigma, tc.perm) {
			continue
		}
		n := 0
		for q := range up {
			if up[q] != c.f.Val[q] {
				n++
			}
		}
		for q := range upD {
			if upD[q] != c.f.D[q] {
				n++
			}
		}
		t.Logf("%s: %d of %d entries of L and D differ from the up-looking ones", tc.name, n, len(up)+len(upD))
		differ += n
	}
	s.log(t, "multifrontal trees")
	if differ == 0 {
		t.Error("the multifrontal factors equal the up-looking ones everywhere: no tree tested")
	}
}

// TestCountBelowMultifrontalNearEigenvalues: verified counts with the
// a-priori residual bound only and the multifrontal factorization, on a
// perturbed 7-point grid (nested dissection: fronts with several
// children) with a perturbed mass matrix, at shifts within 10⁻¹³ … 10⁻⁶
// (relative) of its eigenvalues (the dense solver of
// enclose/internal/geneig, accurate to about 10⁻¹³ relative here): no
// eigenvalue lies below σ' beyond the count, and the count exceeds no
// eigenvalue count below σ.
func TestCountBelowMultifrontalNearEigenvalues(t *testing.T) {
	rnd := rand.New(rand.NewPCG(71, 72))
	k := perturbed(grid7(7), 0.3, rnd)
	m := perturbed(identity(k.N()), 0.2, rnd)
	eig := denseGeneralizedEigs(t, k, m)
	c := roundoffCounter(toISym(k), toISym(m))
	c.f.algorithm = multifrontal
	const tol = 1e-11 // relative accuracy claimed for the dense eigenvalues, with room
	checked := 0
	for i := 0; i < len(eig); i += 17 {
		e := eig[i]
		for _, rel := range []float64{-1e-6, -1e-10, -1e-13, 1e-13, 1e-10, 1e-6} {
			sigma := e * (1 + rel)
			got, sp, ok := c.CountBelow(0.79, sigma) // M is diagonal with entries in [0.8, 1.2]
			if !ok {
				t.Fatalf("σ=%g: count failed", sigma)
			}
			certainlyBelow, possiblyBelow := 0, 0
			for _, v := range eig {
				if v*(1+tol) < sp {
					certainlyBelow++
				}
				if v*(1-tol) < sigma {
					possiblyBelow++
				}
			}
			if certainlyBelow > got || got > possiblyBelow {
				t.Errorf("eigenvalue %d σ=%g (σ'=%g): count %d, eigenvalues certainly below σ' %d, possibly below σ %d",
					i, sigma, sp, got, certainlyBelow, possiblyBelow)
			}
			checked++
		}
	}
	t.Logf("%d counts checked", checked)
}
