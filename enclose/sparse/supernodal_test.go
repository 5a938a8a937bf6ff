package sparse

import (
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
		{"grid7 9", grid7(9)},
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
	if f.Factorize(analyzePattern(s.Pat, naturalOrder(3)), s) {
		t.Error("zero pivot not reported")
	}
}
