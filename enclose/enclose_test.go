package enclose

import (
	"errors"
	"math"
	"math/big"
	"math/rand/v2"
	"os"
	"testing"

	"gapcert/interval"
)

// pointSym returns the point Sym of a row-major symmetric float matrix.
func pointSym(m []float64, n int) *Sym {
	s := NewSym(n)
	for i := 0; i < n; i++ {
		for j := 0; j <= i; j++ {
			s.Set(i, j, interval.Point(m[i*n+j]))
		}
	}
	return s
}

// randomPencil returns a random symmetric A with entries in [−1, 1] and a
// well-conditioned SPD B = I + E/(2n) (E random symmetric in [−1, 1], so
// ‖E/(2n)‖₂ ≤ 1/2), row-major; fixed seed.
func randomPencil(n int, seed uint64) (a, b []float64) {
	r := rand.New(rand.NewPCG(seed, 7))
	a, b = make([]float64, n*n), make([]float64, n*n)
	for i := 0; i < n; i++ {
		for j := 0; j <= i; j++ {
			x := 2*r.Float64() - 1
			y := (2*r.Float64() - 1) / float64(2*n)
			if i == j {
				y += 1
			}
			a[i*n+j], a[j*n+i] = x, x
			b[i*n+j], b[j*n+i] = y, y
		}
	}
	return a, b
}

// checkEnclosures verifies each enclosure with an exact big.Rat inertia
// count of the point pencil (a, b): #neg(A − lo·B) ≤ i − 1 and
// #neg(A − hi·B) ≥ i prove lo ≤ μ_i ≤ hi (Sylvester), independently of the
// interval elimination.
func checkEnclosures(t *testing.T, name string, a, b []float64, n int, got []interval.I) {
	t.Helper()
	for i, e := range got {
		// An infinite end is true without a check.
		if c, ok := exactNegCount(a, b, n, e.Lo); !math.IsInf(e.Lo, -1) && (!ok || c > i) {
			t.Errorf("%s: μ_%d lower end %g: exact count %d (ok %v), want ≤ %d", name, i+1, e.Lo, c, ok, i)
		}
		if c, ok := exactNegCount(a, b, n, e.Hi); !math.IsInf(e.Hi, 1) && (!ok || c < i+1) {
			t.Errorf("%s: μ_%d upper end %g: exact count %d (ok %v), want ≥ %d", name, i+1, e.Hi, c, ok, i+1)
		}
	}
}

func TestEigenvaluesRandomPointPencils(t *testing.T) {
	for _, tc := range []struct {
		n    int
		seed uint64
	}{{1, 1}, {2, 2}, {3, 3}, {5, 4}, {8, 5}, {13, 6}, {20, 7}} {
		a, b := randomPencil(tc.n, tc.seed)
		got, err := Eigenvalues(pointSym(a, tc.n), pointSym(b, tc.n))
		if err != nil {
			t.Fatalf("n=%d: %v", tc.n, err)
		}
		checkEnclosures(t, "random", a, b, tc.n, got)
		scale := 0.0
		for _, e := range got {
			scale = math.Max(scale, e.Mag())
		}
		for i, e := range got {
			if w := e.Wid() / scale; !(w <= 1e-13) {
				t.Errorf("n=%d: μ_%d = %v: relative width %.2g > 1e-13", tc.n, i+1, e, w)
			}
		}
	}
}

// householderPencil returns enclosures of A = Q diag(mu) Q with the exact
// rational orthogonal Q = I − 2vvᵀ/(vᵀv), so that the eigenvalues of A
// (B = I) are exactly mu (common practice: Householder reflections are
// orthogonal and symmetric).
func householderPencil(mu []int64, v []int64) (*Sym, *Sym) {
	n := len(mu)
	vv := int64(0)
	for _, x := range v {
		vv += x * x
	}
	q := func(i, j int) *big.Rat {
		r := big.NewRat(-2*v[i]*v[j], vv)
		if i == j {
			r.Add(r, big.NewRat(1, 1))
		}
		return r
	}
	a, b := NewSym(n), NewSym(n)
	for i := 0; i < n; i++ {
		b.Set(i, i, interval.Point(1))
		for j := 0; j <= i; j++ {
			s := new(big.Rat)
			for k := 0; k < n; k++ {
				p := new(big.Rat).Mul(q(i, k), q(k, j))
				s.Add(s, p.Mul(p, big.NewRat(mu[k], 1)))
			}
			a.Set(i, j, ratInterval(s))
		}
	}
	return a, b
}

func TestEigenvaluesKnownSpectra(t *testing.T) {
	for _, tc := range []struct {
		name string
		mu   []int64
		v    []int64
	}{
		{"diag(1,2,2,3)", []int64{1, 2, 2, 3}, []int64{0, 0, 0, 1}},
		{"double 2 rotated", []int64{1, 2, 2, 3}, []int64{1, 2, -1, 3}},
		{"triple 5 with -4", []int64{-4, 5, 5, 5, 9}, []int64{3, -1, 4, 1, -5}},
		{"cluster 1e6", []int64{1000000, 1000001, 1000002, 7}, []int64{2, 7, 1, 8}},
	} {
		a, b := householderPencil(tc.mu, tc.v)
		got, err := Eigenvalues(a, b)
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		sorted := append([]int64(nil), tc.mu...)
		for i := range sorted {
			for j := i + 1; j < len(sorted); j++ {
				if sorted[j] < sorted[i] {
					sorted[i], sorted[j] = sorted[j], sorted[i]
				}
			}
		}
		// Width relative to the spectral scale: the data are enclosures of
		// rationals, one ulp of the largest entries wide.
		scale := math.Max(math.Abs(float64(sorted[0])), math.Abs(float64(sorted[len(sorted)-1])))
		for i, e := range got {
			want := float64(sorted[i])
			if !e.Contains(want) {
				t.Errorf("%s: μ_%d = %v does not contain %g", tc.name, i+1, e, want)
			}
			if w := e.Wid() / scale; !(w <= 1e-13) {
				t.Errorf("%s: μ_%d = %v: relative width %.2g", tc.name, i+1, e, w)
			}
		}
	}
}

// thicken returns s with every entry widened by ±r·|entry| + ±r.
func thicken(s *Sym, r float64) *Sym {
	t := NewSym(s.N())
	for i := 0; i < s.N(); i++ {
		for j := 0; j <= i; j++ {
			v := s.At(i, j)
			d := interval.MulUp(r, v.Mag()+1)
			t.Set(i, j, interval.I{Lo: interval.SubDown(v.Lo, d), Hi: interval.AddUp(v.Hi, d)})
		}
	}
	return t
}

// TestEigenvaluesThickPencils checks containment for sampled members of
// thickened pencils: the midpoint, random points and "vertex" points of
// the intervals, each verified by an exact inertia count.
func TestEigenvaluesThickPencils(t *testing.T) {
	r := rand.New(rand.NewPCG(11, 13))
	for _, tc := range []struct {
		n     int
		rad   float64
		width float64 // maximal allowed width relative to the spectrum's scale
	}{{4, 1e-10, 1e-8}, {10, 1e-6, 1e-4}, {6, 1e-2, 1}, {5, 0.3, math.Inf(1)}, {3, 10, math.Inf(1)}} {
		a0, b0 := randomPencil(tc.n, uint64(tc.n)+100)
		a, b := thicken(pointSym(a0, tc.n), tc.rad), thicken(pointSym(b0, tc.n), tc.rad/float64(4*tc.n))
		got, err := Eigenvalues(a, b)
		if errors.Is(err, ErrNotPositiveDefinite) && tc.rad >= 1 {
			continue // a B this thick cannot be proved positive definite
		}
		if err != nil {
			t.Fatalf("n=%d rad=%g: %v", tc.n, tc.rad, err)
		}
		for sample := 0; sample < 6; sample++ {
			am, bm := member(a, r, sample), member(b, r, sample)
			checkEnclosures(t, "thick member", am, bm, tc.n, got)
		}
		scale := 0.0
		for _, v := range got {
			scale = math.Max(scale, math.Max(math.Abs(v.Mid()), 1))
		}
		for i, e := range got {
			if w := e.Wid() / scale; !(w <= tc.width) {
				t.Errorf("n=%d rad=%g: μ_%d = %v too wide", tc.n, tc.rad, i+1, e)
			}
		}
	}
}

// member returns a member of s: the midpoint (sample 0), the lower ends
// (1), the upper ends (2) or random points.
func member(s *Sym, r *rand.Rand, sample int) []float64 {
	n := s.N()
	m := make([]float64, n*n)
	for i := 0; i < n; i++ {
		for j := 0; j <= i; j++ {
			v := s.At(i, j)
			var x float64
			switch sample {
			case 0:
				x = v.Mid()
			case 1:
				x = v.Lo
			case 2:
				x = v.Hi
			default:
				x = v.Lo + r.Float64()*(v.Hi-v.Lo)
				x = math.Min(math.Max(x, v.Lo), v.Hi)
			}
			m[i*n+j], m[j*n+i] = x, x
		}
	}
	return m
}

func TestCountBelow(t *testing.T) {
	a, b := householderPencil([]int64{1, 2, 2, 3}, []int64{1, 2, -1, 3})
	for _, tc := range []struct {
		tau    float64
		want   int
		wantOK bool
	}{{0, 0, true}, {0.5, 0, true}, {1.5, 1, true}, {2, 0, false}, {2.000001, 3, true}, {1.999999, 1, true}, {3.5, 4, true}, {-1e300, 0, true}} {
		n, ok := CountBelow(a, b, tc.tau)
		if ok != tc.wantOK || (ok && n != tc.want) {
			t.Errorf("CountBelow(τ=%g) = %d, %v; want %d, %v (eigenvalues 1, 2, 2, 3)", tc.tau, n, ok, tc.want, tc.wantOK)
		}
	}
	// [[0, 1], [1, 0]] needs the preconditioned pass: no diagonal pivot.
	z := pointSym([]float64{0, 1, 1, 0}, 2)
	if n, ok := CountBelow(z, identity(2), 0); !ok || n != 1 {
		t.Errorf("CountBelow([[0,1],[1,0]], I, 0) = %d, %v; want 1, true (eigenvalues ±1)", n, ok)
	}
}

func TestPositiveDefinite(t *testing.T) {
	for _, tc := range []struct {
		name string
		m    []float64
		n    int
		want bool
	}{
		{"empty", nil, 0, true},
		{"identity", []float64{1, 0, 0, 1}, 2, true},
		{"[[2,1],[1,2]] eigenvalues 1, 3", []float64{2, 1, 1, 2}, 2, true},
		{"[[1,2],[2,1]] eigenvalues -1, 3", []float64{1, 2, 2, 1}, 2, false},
		{"singular [[1,1],[1,1]]", []float64{1, 1, 1, 1}, 2, false},
		{"[[0,0],[0,1]]", []float64{0, 0, 0, 1}, 2, false},
	} {
		if got := PositiveDefinite(pointSym(tc.m, tc.n)); got != tc.want {
			t.Errorf("PositiveDefinite(%s) = %v, want %v", tc.name, got, tc.want)
		}
	}
	// The Hilbert matrix H_ij = 1/(i+j+1) is positive definite (common
	// practice: it is a Gram matrix of monomials in L²(0, 1)); its
	// tightest enclosure for n = 8 (condition ~1.5e10) is still proved.
	h := NewSym(8)
	for i := 0; i < 8; i++ {
		for j := 0; j <= i; j++ {
			h.Set(i, j, ratInterval(big.NewRat(1, int64(i+j+1))))
		}
	}
	if !PositiveDefinite(h) {
		t.Errorf("PositiveDefinite(Hilbert 8) = false")
	}
	if _, err := Eigenvalues(identity(2), pointSym([]float64{1, 2, 2, 1}, 2)); !errors.Is(err, ErrNotPositiveDefinite) {
		t.Errorf("Eigenvalues with indefinite B: err = %v", err)
	}
}

func TestProjectionLower(t *testing.T) {
	// Exact value x/(1 + c²x) in math/big rational arithmetic.
	exact := func(x, c float64) *big.Rat {
		xr, cr := new(big.Rat).SetFloat64(x), new(big.Rat).SetFloat64(c)
		d := new(big.Rat).Mul(cr, cr)
		d.Mul(d, xr)
		d.Add(d, big.NewRat(1, 1))
		return d.Quo(xr, d)
	}
	for _, tc := range []struct{ x, c float64 }{
		{1, 0}, {9.869604401089358, 0.1}, {1e-300, 1}, {1e300, 1e-3}, {2.5, 1e-8}, {40, 0.3183098861837907},
	} {
		got := ProjectionLower(tc.x, interval.I{Lo: tc.c / 2, Hi: tc.c})
		e := exact(tc.x, tc.c)
		if new(big.Rat).SetFloat64(got).Cmp(e) > 0 {
			t.Errorf("ProjectionLower(%g, %g) = %g exceeds the exact value %s", tc.x, tc.c, got, e.FloatString(20))
		}
		ef, _ := e.Float64()
		if d := (ef - got) / ef; d > 1e-15 { // three directed roundings
			t.Errorf("ProjectionLower(%g, %g) = %g, exact %g: relative gap %.2g", tc.x, tc.c, got, ef, d)
		}
	}
	for _, x := range []float64{0, -3, math.Inf(-1)} {
		if got := ProjectionLower(x, interval.Point(0.5)); got != x {
			t.Errorf("ProjectionLower(%g) = %g, want %g", x, got, x)
		}
	}
}

func benchmarkEigenvalues(bm *testing.B, n int) {
	a, b := randomPencil(n, 42)
	as, bs := pointSym(a, n), pointSym(b, n)
	bm.ReportAllocs()
	for bm.Loop() {
		if _, err := Eigenvalues(as, bs); err != nil {
			bm.Fatal(err)
		}
	}
}

func BenchmarkEigenvalues5(b *testing.B)  { benchmarkEigenvalues(b, 5) }
func BenchmarkEigenvalues10(b *testing.B) { benchmarkEigenvalues(b, 10) }
func BenchmarkEigenvalues20(b *testing.B) { benchmarkEigenvalues(b, 20) }

// TestEigenvaluesUnboundedData: entries that are unbounded intervals leave
// nothing to decide near the midpoint eigenvalues; the result must still be
// sound (here: every enclosure contains the eigenvalues of sampled members)
// and nothing may panic.
func TestEigenvaluesUnboundedData(t *testing.T) {
	for _, bad := range []interval.I{interval.Entire(), {Lo: 0, Hi: math.Inf(1)}, {Lo: math.Inf(-1), Hi: -1}} {
		a := pointSym([]float64{2, 1, 0, 1, 3, 1, 0, 1, 4}, 3)
		a.Set(2, 0, bad)
		got, err := Eigenvalues(a, identity(3))
		if err != nil {
			t.Fatalf("%v: %v", bad, err)
		}
		for _, off := range []float64{-1e6, -2, 0, 0.5, 7, 1e6} {
			if !bad.Contains(off) {
				continue
			}
			m := []float64{2, 1, off, 1, 3, 1, off, 1, 4}
			checkEnclosures(t, "unbounded entry", m, []float64{1, 0, 0, 0, 1, 0, 0, 0, 1}, 3, got)
		}
		// A decided count must be that of every member (for c ≤ −1 the
		// determinant −c²/2 + 2c − 11/8 of A − 2.5I stays negative, so a
		// decision is possible there).
		if n, ok := CountBelow(a, identity(3), 2.5); ok {
			for _, off := range []float64{-1e6, -2, -1, 0, 0.5, 7, 1e6} {
				if !bad.Contains(off) {
					continue
				}
				m := []float64{2, 1, off, 1, 3, 1, off, 1, 4}
				if c, okc := exactNegCount(m, []float64{1, 0, 0, 0, 1, 0, 0, 0, 1}, 3, 2.5); okc && c != n {
					t.Errorf("%v: CountBelow = %d, member a31 = %g has %d", bad, n, off, c)
				}
			}
		}
	}
}

// congruencePencil returns the integer pencil A = Pᵀ diag(mu) P, B = PᵀP:
// Ax = μBx ⇔ Pᵀ(diag(mu) − μI)Px = 0, so for nonsingular P the
// eigenvalues are exactly mu (common practice). Integer entries are exact
// float64s, so the pencil is a point pencil.
func congruencePencil(mu []int64, p [][]int64) (*Sym, *Sym) {
	n := len(mu)
	a, b := NewSym(n), NewSym(n)
	for i := 0; i < n; i++ {
		for j := 0; j <= i; j++ {
			var sa, sb int64
			for k := 0; k < n; k++ {
				sa += p[k][i] * mu[k] * p[k][j]
				sb += p[k][i] * p[k][j]
			}
			a.Set(i, j, interval.Point(float64(sa)))
			b.Set(i, j, interval.Point(float64(sb)))
		}
	}
	return a, b
}

func TestEigenvaluesGeneralizedKnown(t *testing.T) {
	// Unit upper triangular P (det 1), and a fuller P.
	p1 := [][]int64{{1, 2, -1, 3}, {0, 1, 4, -2}, {0, 0, 1, 5}, {0, 0, 0, 1}}
	p2 := [][]int64{{2, 1, 0}, {1, 1, 1}, {0, 1, 3}} // det = 2(3 − 1) − 1(3 − 0) = 1
	for _, tc := range []struct {
		name string
		mu   []int64
		p    [][]int64
		want []float64 // sorted mu
	}{
		{"simple", []int64{3, -1, 7, 2}, p1, []float64{-1, 2, 3, 7}},
		{"double", []int64{5, 5, -2, 9}, p1, []float64{-2, 5, 5, 9}},
		{"quadruple", []int64{4, 4, 4, 4}, p1, []float64{4, 4, 4, 4}},
		{"3×3", []int64{1, 0, -6}, p2, []float64{-6, 0, 1}},
	} {
		a, b := congruencePencil(tc.mu, tc.p)
		got, err := Eigenvalues(a, b)
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		for i, e := range got {
			if !e.Contains(tc.want[i]) {
				t.Errorf("%s: μ_%d = %v does not contain %g", tc.name, i+1, e, tc.want[i])
			}
			if w := e.Wid() / 9; !(w <= 1e-12) {
				t.Errorf("%s: μ_%d = %v: width %.2g relative to the scale 9", tc.name, i+1, e, w)
			}
		}
	}
}

// TestEigenvaluesLongCampaign sweeps many random point and thick pencils up
// to n = 16, each checked by exact rational inertia counts (GAPCERT_LONG=1
// only; a few minutes).
func TestEigenvaluesLongCampaign(t *testing.T) {
	if os.Getenv("GAPCERT_LONG") != "1" {
		t.Skip("set GAPCERT_LONG=1")
	}
	r := rand.New(rand.NewPCG(2026, 12))
	for trial := 0; trial < 100; trial++ {
		n := 1 + r.IntN(16)
		a0, b0 := randomPencil(n, uint64(trial)+1000)
		rad := []float64{0, 1e-14, 1e-9, 1e-4}[trial%4]
		a, b := thicken(pointSym(a0, n), rad), thicken(pointSym(b0, n), rad/float64(4*n))
		got, err := Eigenvalues(a, b)
		if err != nil {
			t.Fatalf("trial %d (n=%d, rad=%g): %v", trial, n, rad, err)
		}
		for sample := 0; sample < 2; sample++ {
			checkEnclosures(t, "campaign", member(a, r, sample), member(b, r, sample), n, got)
		}
	}
}
