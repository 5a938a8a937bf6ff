package formula

import (
	"math"
	"math/big"
	"math/rand/v2"
	"testing"
)

// evalModel1 returns Σ C[k] ξ^k + R at the float ξ in interval arithmetic.
func evalModel1(m Model1, xi float64) I {
	s := m.R
	p := pt(1)
	for _, c := range m.C {
		s = s.Add(c.Mul(p))
		p = p.MulF(xi)
	}
	return s
}

func evalModel2(m Model2, xi, eta float64) I {
	s := m.R
	for i := range m.C {
		for j := range m.C[i] {
			s = s.Add(m.C[i][j].Mul(pt(xi).PowInt(i)).Mul(pt(eta).PowInt(j)))
		}
	}
	return s
}

func TestModel1ContainsSampledValues(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for _, tf := range testFuncs {
		// Bind y to a point so that the formula is univariate in x.
		yv := 0.5 * (tf.ylo + tf.yhi)
		e := MustParse(tf.src).Bind(map[string]I{"y": pt(yv)})
		for _, q := range []int{1, 2, 5, 9, 16} {
			for trial := 0; trial < 6; trial++ {
				box := randBox(rng, tf.xlo, tf.xhi)
				a, b := pt(box.Lo), pt(box.Hi)
				if trial%2 == 1 { // reversed orientation
					a, b = b, a
				}
				m, err := e.Model1(a, b, q)
				if err != nil {
					t.Errorf("%s q=%d on [%v, %v]: %v", e, q, a, b, err)
					continue
				}
				if len(m.C) != q+1 {
					t.Fatalf("len(C) = %d", len(m.C))
				}
				for s := 0; s < 6; s++ {
					xi := randIn(rng, I{Lo: 0, Hi: 1})
					p := badd(bf(a.Lo), bmul(bf(xi), bsub(bf(b.Lo), bf(a.Lo))))
					v := refEval(e.root, map[string]*big.Float{"x": p})
					got := evalModel1(m, xi)
					if !refContains([2]float64{got.Lo, got.Hi}, v) {
						t.Errorf("%s q=%d on [%v, %v] at ξ=%g: model %v misses %s", e, q, a, b, xi, got, v.Text('g', 20))
					}
				}
			}
		}
	}
}

func TestModel1RemainderRate(t *testing.T) {
	// The Lagrange remainder is O(h^{q+1}): halving h divides the width of
	// R by about 2^{q+1} (Taylor's theorem).
	for _, tc := range []struct {
		src string
		x0  float64
		q   int
	}{
		{"exp(x)", 0.3, 3},
		{"sin(x)*log(2+x)", 0.5, 4},
		{"1/(1+x^2)", -0.7, 6},
		{"sqrt(x)+atan(x)", 1.5, 2},
		{"tan(x)+tanh(x)", 0.2, 5},
	} {
		e := MustParse(tc.src)
		var prev float64
		for k, h := range []float64{0x1p-3, 0x1p-4, 0x1p-5} {
			m, err := e.Model1(pt(tc.x0), pt(tc.x0+h), tc.q)
			if err != nil {
				t.Fatalf("%s: %v", tc.src, err)
			}
			w := m.R.Wid()
			if k > 0 {
				ratio := prev / w
				want := math.Ldexp(1, tc.q+1)
				if ratio < want/2 || ratio > want*4 { // pre-asymptotic overestimation shrinks too
					t.Errorf("%s q=%d: remainder ratio %g, want ≈ %g", tc.src, tc.q, ratio, want)
				}
			}
			prev = w
		}
	}
}

func TestModel1Polynomial(t *testing.T) {
	// A polynomial of degree ≤ q has remainder exactly 0 and coefficients
	// enclosing those of the exact polynomial in ξ: for x^3 - 2*x on [1, 3],
	// x = 1 + 2ξ gives (1+2ξ)^3 - 2(1+2ξ) = -1 + 2ξ + 12ξ² + 8ξ³.
	m, err := MustParse("x^3-2*x").Model1(pt(1), pt(3), 3)
	if err != nil {
		t.Fatal(err)
	}
	if m.R != (I{}) {
		t.Fatalf("R = %v, want [0, 0]", m.R)
	}
	for k, want := range []float64{-1, 2, 12, 8} {
		if !m.C[k].Contains(want) || m.C[k].Wid() > 1e-13 {
			t.Errorf("C[%d] = %v, want ≈ %g", k, m.C[k], want)
		}
	}
	// Degree above q: the excess goes into R, soundly.
	m, err = MustParse("x^3").Model1(pt(0), pt(1), 2)
	if err != nil {
		t.Fatal(err)
	}
	if m.R.Wid() == 0 {
		t.Fatalf("x^3 with q=2: R = %v should be nonzero", m.R)
	}
	for _, xi := range []float64{0, 0.25, 0.5, 1} {
		if !evalModel1(m, xi).Contains(xi * xi * xi) {
			t.Errorf("x^3 q=2 model misses ξ=%g", xi)
		}
	}
}

func TestModel1Errors(t *testing.T) {
	for _, tc := range []struct {
		src  string
		a, b float64
	}{
		{"abs(x)", -1, 1},
		{"sqrt(x)", 0, 1},
		{"log(x)", -1, 1},
		{"min(x, 0)", -1, 1},
		{"x*y", 0, 1},
	} {
		if _, err := MustParse(tc.src).Model1(pt(tc.a), pt(tc.b), 3); err == nil {
			t.Errorf("%s on [%g, %g]: want an error", tc.src, tc.a, tc.b)
		}
	}
	// With a decided branch abs is smooth.
	m, err := MustParse("abs(x)").Model1(pt(-2), pt(-1), 3)
	if err != nil || m.R != (I{}) || !evalModel1(m, 0.5).Contains(1.5) {
		t.Errorf("abs(x) on [-2, -1]: %v %v", m, err)
	}
}

func TestModel2ContainsSampledValues(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	for _, tf := range testFuncs {
		e := MustParse(tf.src)
		for _, q := range []int{1, 3, 6, 10} {
			for trial := 0; trial < 4; trial++ {
				tri := randTriangle(rng, tf.xlo, tf.xhi, tf.ylo, tf.yhi)
				m, err := e.Model2(tri, q)
				if err != nil {
					t.Errorf("%s q=%d on %v: %v", tf.src, q, tri, err)
					continue
				}
				for s := 0; s < 6; s++ {
					p, xi, eta := triPointXi(rng, tri)
					v := refEval(e.root, map[string]*big.Float{"x": p[0], "y": p[1]})
					got := evalModel2(m, xi, eta)
					if !refContains([2]float64{got.Lo, got.Hi}, v) {
						t.Errorf("%s q=%d on %v at (%g, %g): %v misses %s", tf.src, q, tri, xi, eta, got, v.Text('g', 20))
					}
				}
			}
		}
	}
}

func TestModel2Polynomial(t *testing.T) {
	tri := [3][2]I{{pt(0), pt(0)}, {pt(1), pt(0)}, {pt(0.5), pt(2)}}
	for _, src := range []string{"x^2+y^2", "3*x*y-x^3"} {
		for _, q := range []int{3, 5} {
			m, err := MustParse(src).Model2(tri, q)
			if err != nil {
				t.Fatal(err)
			}
			if m.R != (I{}) {
				t.Errorf("%s q=%d: R = %v, want exactly [0, 0]", src, q, m.R)
			}
		}
	}
	// x² + y² with x = ξ + η/2, y = 2η: ξ² + ξη + (17/4)η².
	m, _ := MustParse("x^2+y^2").Model2(tri, 2)
	want := [][]float64{{0, 0, 4.25}, {0, 1}, {1}}
	for i := range want {
		for j := range want[i] {
			if c := m.C[i][j]; !c.Contains(want[i][j]) || c.Wid() > 1e-13 {
				t.Errorf("C[%d][%d] = %v, want %g", i, j, c, want[i][j])
			}
		}
	}
}

func TestModel2RemainderRate(t *testing.T) {
	e := MustParse("exp(x)*cos(y)")
	var prev float64
	const q = 3
	for k, h := range []float64{0x1p-3, 0x1p-4, 0x1p-5} {
		tri := [3][2]I{{pt(0.2), pt(0.1)}, {pt(0.2 + h), pt(0.1)}, {pt(0.2), pt(0.1 + h)}}
		m, err := e.Model2(tri, q)
		if err != nil {
			t.Fatal(err)
		}
		w := m.R.Wid()
		if k > 0 {
			if r := prev / w; r < 8 || r > 32 {
				t.Errorf("remainder ratio %g, want ≈ 16", r)
			}
		}
		prev = w
	}
}

func TestModel2Subdivision(t *testing.T) {
	// log(x + y - 1/2) is analytic on the triangle (1,0),(0,1),(1,1) but not
	// on its bounding box; the remainder comes from sub-triangles.
	tri := [3][2]I{{pt(1), pt(0)}, {pt(0), pt(1)}, {pt(1), pt(1)}}
	e := MustParse("log(x+y-1/2)")
	m, err := e.Model2(tri, 4)
	if err != nil {
		t.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(9, 10))
	for s := 0; s < 50; s++ {
		p, xi, eta := triPointXi(rng, tri)
		v := refEval(e.root, map[string]*big.Float{"x": p[0], "y": p[1]})
		got := evalModel2(m, xi, eta)
		if !refContains([2]float64{got.Lo, got.Hi}, v) {
			t.Errorf("at (%g, %g): %v misses %s", xi, eta, got, v.Text('g', 20))
		}
	}
	if m.R.Wid() > 50 { // sub-triangle boxes near the edge x+y=1 reach x+y=3/4
		t.Errorf("R = %v too wide", m.R)
	}
}

func TestModelsNarrow(t *testing.T) {
	// On an element of width 1/16 a model of order q is accurate to about
	// h^{q+1}·|f^{(q+1)}|/(q+1)!/2^{q+1} plus rounding; the limits below
	// leave a factor of about 100 over the values measured.
	for _, tc := range []struct {
		src  string
		q    int
		maxW float64
	}{
		{"exp(x)", 8, 1e-14},
		{"sin(3*x)*log(2+x)", 8, 1e-10},
		{"2*5*cos(2*x)", 12, 1e-12},
		{"1/(1+x^2)", 16, 1e-13},
	} {
		m, err := MustParse(tc.src).Model1(pt(0.25), pt(0.3125), tc.q)
		if err != nil {
			t.Fatal(err)
		}
		var w float64
		for _, xi := range []float64{0, 0.3, 0.5, 1} {
			w = math.Max(w, evalModel1(m, xi).Wid())
		}
		if w > tc.maxW {
			t.Errorf("%s q=%d: model width %g > %g (R = %v)", tc.src, tc.q, w, tc.maxW, m.R)
		}
		t.Logf("%s q=%d: width %.3g", tc.src, tc.q, w)
	}
	tri := [3][2]I{{pt(0.25), pt(0.25)}, {pt(0.3125), pt(0.25)}, {pt(0.25), pt(0.3125)}}
	for _, tc := range []struct {
		src  string
		q    int
		maxW float64
	}{
		{"exp(-(x^2+y^2))", 6, 1e-9},
		{"sin(x)*cos(y)", 8, 1e-13},
	} {
		m, err := MustParse(tc.src).Model2(tri, tc.q)
		if err != nil {
			t.Fatal(err)
		}
		w := math.Max(evalModel2(m, 1.0/3, 1.0/3).Wid(), evalModel2(m, 1, 0).Wid())
		if w > tc.maxW {
			t.Errorf("%s q=%d: model width %g > %g (R = %v)", tc.src, tc.q, w, tc.maxW, m.R)
		}
		t.Logf("%s q=%d: width %.3g", tc.src, tc.q, w)
	}
}

// TestModelsKinkOnTheBoundary: abs, min and max whose argument is ≥ 0 or
// ≤ 0 on the box, touching 0, are modelled by the smooth branch (it equals
// the function at every point of the box), exactly for these piecewise
// linear functions. The centre still needs a strict sign, a kink inside
// the box is still an error, and derivatives at the kink are still refused
// (|x| has none at 0).
func TestModelsKinkOnTheBoundary(t *testing.T) {
	for _, tc := range []struct {
		src        string
		a, b       float64
		at, want   float64 // ξ and f(a + ξ(b − a))
		wantRemain bool
	}{
		{"abs(x)", -1, 0, 0.25, 0.75, false},
		{"abs(x)", 0, 2, 0.25, 0.5, false},
		{"min(x, 1-x)", 0, 0.5, 0.5, 0.25, false},
		{"min(x, 1-x)", 0.5, 1, 0.5, 0.25, false},
		{"max(x, 1-x)", 0.5, 1, 1, 1, false},
		{"abs(abs(x) - 1/2)", 0, 0.5, 0, 0.5, false},
		{"exp(abs(x))", -1, 0, 1, 1, true},
	} {
		m, err := MustParse(tc.src).Model1(pt(tc.a), pt(tc.b), 3)
		if err != nil {
			t.Errorf("%s on [%g, %g]: %v", tc.src, tc.a, tc.b, err)
			continue
		}
		if !tc.wantRemain && m.R != (I{}) {
			t.Errorf("%s on [%g, %g]: remainder %v, want 0 (piecewise linear)", tc.src, tc.a, tc.b, m.R)
		}
		if got := evalModel1(m, tc.at); !got.Contains(tc.want) {
			t.Errorf("%s on [%g, %g] at ξ = %g: %v misses %g", tc.src, tc.a, tc.b, tc.at, got, tc.want)
		}
	}
	for _, tc := range []struct {
		src  string
		a, b float64
	}{
		{"abs(x)", -1, 1},       // kink inside
		{"abs(x)", -1, 1e-300},  // just across 0
		{"abs(x^2 - 1)", -1, 1}, // centre 0 is not a kink, but x^2 − 1 ≤ 0 touches 0 at both ends: allowed
	} {
		_, err := MustParse(tc.src).Model1(pt(tc.a), pt(tc.b), 3)
		if tc.src == "abs(x^2 - 1)" {
			if err != nil {
				t.Errorf("%s on [%g, %g]: %v", tc.src, tc.a, tc.b, err)
			}
			continue
		}
		if err == nil {
			t.Errorf("%s on [%g, %g]: want an error", tc.src, tc.a, tc.b)
		}
	}
	// −x² ≤ 0 on [−1, 1] but is 0 at the centre: the centre has no strict
	// sign, so no model is claimed (a centre branch +(−x²) would be wrong).
	if _, err := MustParse("abs(-x^2)").Model1(pt(-1), pt(1), 3); err == nil {
		t.Errorf("abs(-x^2) on [-1, 1]: want an error (no strict sign at the centre)")
	}
	// A triangle with an edge on x = 0 (x ≥ 0 on its bounding box).
	tri := [3][2]I{{pt(0), pt(0)}, {pt(1), pt(0)}, {pt(0), pt(1)}}
	m, err := MustParse("abs(x) + abs(y)").Model2(tri, 2)
	if err != nil || m.R != (I{}) || !evalModel2(m, 0.25, 0.5).Contains(0.75) {
		t.Errorf("|x| + |y| on the unit triangle: %v %v", m, err)
	}
	// A kink along a diagonal edge: decided on the triangle itself, though
	// the bounding box straddles it.
	lower := [3][2]I{{pt(0), pt(0)}, {pt(1), pt(0)}, {pt(1), pt(1)}}
	for _, tc := range []struct {
		src  string
		want float64 // at (ξ, η) = (0.5, 0.25): the point (0.75, 0.25)
	}{
		{"abs(x - y)", 0.5},
		{"min(x, y) + max(x, y)^2", 0.25 + 0.75*0.75},
		{"abs(abs(x - y) - x)", 0.25},
	} {
		m, err := MustParse(tc.src).Model2(lower, 2)
		if err != nil || m.R != (I{}) || !evalModel2(m, 0.5, 0.25).Contains(tc.want) {
			t.Errorf("%s on the lower unit triangle: %v %v", tc.src, m, err)
		}
	}
	// Derivatives stay strict.
	if _, err := MustParse("abs(x)").Gradient(map[string]I{"x": {Lo: -1, Hi: 0}}, []string{"x"}); err == nil {
		t.Errorf("gradient of abs(x) on [-1, 0]: want an error")
	}
}

// TestKinks: the exact float zeros of affine arguments of abs and of the
// argument differences of min and max, sorted and without repeats; other
// kinks are not listed.
func TestKinks(t *testing.T) {
	for _, tc := range []struct {
		src  string
		want []float64
	}{
		{"abs(x)", []float64{0}},
		{"abs(x - 1) + min(x, 3 - x)", []float64{1, 1.5}},
		{"abs(2*x + 1/2) + abs((x - 3/8)/5) + abs(-x + 3/8)", []float64{-0.25, 0.375}},
		{"max(x/3, 1/4)", []float64{0.75}},
		{"abs(x - 1/3)", []float64{}},     // not a float
		{"abs(x - 0.1)", []float64{}},     // 1/10 is not a float
		{"abs(x^2 - 1)", []float64{}},     // not affine
		{"abs(x - pi)", []float64{}},      // not rational
		{"sin(abs(x - 2))", []float64{2}}, // nested
		{"x^2 + 1", []float64{}},
	} {
		got := MustParse(tc.src).Kinks()
		if len(got) != len(tc.want) {
			t.Errorf("%s: kinks %v, want %v", tc.src, got, tc.want)
			continue
		}
		for i := range got {
			if got[i] != tc.want[i] {
				t.Errorf("%s: kinks %v, want %v", tc.src, got, tc.want)
				break
			}
		}
	}
}
