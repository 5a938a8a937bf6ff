package formula

import (
	"errors"
	"math"
	"math/big"
	"math/rand/v2"
	"testing"

	"gapcert/interval"
)

type I = interval.I

func pt(x float64) I { return interval.Point(x) }

// ulps returns the number of float64 steps from x.Lo to x.Hi.
func ulps(x I) int {
	n := 0
	for f := x.Lo; f < x.Hi && n < 1000; f = math.Nextafter(f, math.Inf(1)) {
		n++
	}
	return n
}

func TestEvalConst(t *testing.T) {
	sqrt := func(v int64) *big.Float { return bnew().Sqrt(bf(float64(v))) }
	for _, tc := range []struct {
		src     string
		want    *big.Float
		maxUlps int
		source  string
	}{
		{"1/3", bquo(bf(1), bf(3)), 1, "exact rational, math/big"},
		{"0.1", bnew().SetRat(big.NewRat(1, 10)), 1, "exact rational, math/big"},
		{"2.5e-3*4", bnew().SetRat(big.NewRat(1, 100)), 1, "exact rational, math/big"},
		{"sqrt(3)/2", bquo(sqrt(3), bf(2)), 2, "math/big Sqrt"},
		// cos(π/5) = (1 + √5)/4: common practice identity (golden ratio / 2).
		{"cos(pi/5)", bquo(badd(bf(1), sqrt(5)), bf(4)), 4, "identity cos(π/5) = (1+√5)/4"},
		// sin(π/6) = 1/2, common practice.
		{"sin(pi/6)", bf(0.5), 4, "identity sin(π/6) = 1/2"},
		// e^(ln 2) = 2 and atan(1) = π/4, common practice.
		{"exp(log(2))", bf(2), 4, "identity exp(log 2) = 2"},
		{"4*atan(1)", bpi(), 2, "identity 4 atan 1 = π, π by Machin's formula in math/big"},
		{"2^0.5", sqrt(2), 2, "math/big Sqrt"},
		{"(-2)^3", bf(-8), 0, "exact integer power"},
		{"interval(1, 2)", bf(1), 0, "lower end of the interval constant"},
	} {
		got, err := MustParse(tc.src).EvalConst()
		if err != nil {
			t.Errorf("%s: %v", tc.src, err)
			continue
		}
		if !refContains([2]float64{got.Lo, got.Hi}, tc.want) {
			t.Errorf("%s = %v does not contain %s (%s)", tc.src, got, tc.want.Text('g', 40), tc.source)
		}
		if u := ulps(got); u > tc.maxUlps && tc.src != "interval(1, 2)" {
			t.Errorf("%s = %v is %d ulps wide, want ≤ %d", tc.src, got, u, tc.maxUlps)
		}
	}
}

func TestEvalDomainErrors(t *testing.T) {
	for _, tc := range []struct {
		src string
		box I
		sub string
	}{
		{"1+log(x)", I{Lo: -1, Hi: 1}, "log(x)"},
		{"log(x)", I{Lo: 0, Hi: 1}, "log(x)"},
		{"sqrt(x-1)", I{Lo: 0, Hi: 2}, "sqrt(x-1)"},
		{"1/x", I{Lo: -1, Hi: 1}, "1/x"},
		{"tan(x)", I{Lo: 1, Hi: 2}, "tan(x)"},
		{"x^0.5", I{Lo: -1, Hi: 1}, "x^0.5"},
		{"exp(1/(x-2))", I{Lo: 1, Hi: 3}, "1/(x-2)"},
	} {
		_, err := MustParse(tc.src).Eval(map[string]I{"x": tc.box})
		var ee *EvalError
		var de *interval.DomainError
		if !errors.As(err, &ee) || !errors.As(err, &de) || ee.Sub != tc.sub {
			t.Errorf("%s over %v: got %v, want a domain error in %s", tc.src, tc.box, err, tc.sub)
		}
	}
	// Integer powers are defined for negative bases.
	r, err := MustParse("x^3").Eval(map[string]I{"x": {Lo: -2, Hi: 1}})
	if err != nil || r != (I{Lo: -8, Hi: 1}) {
		t.Errorf("x^3 over [-2,1] = %v, %v", r, err)
	}
	var ue *UnboundError
	if _, err := MustParse("x+y").Eval(map[string]I{"x": pt(1)}); !errors.As(err, &ue) || ue.Name != "y" {
		t.Errorf("missing variable: %v", err)
	}
}

// testFuncs are formulas with boxes on which they are defined and smooth.
var testFuncs = []struct {
	src      string
	xlo, xhi float64
	ylo, yhi float64
}{
	{"x^2+y^2", -2, 2, -2, 2},
	{"3*x*y-x^3", -2, 2, -2, 2},
	{"exp(-(x^2+y^2)/2)", -2, 2, -2, 2},
	{"sin(x)*cos(y)", -4, 4, -4, 4},
	{"log(1+x^2+y)", -1, 1, 0, 2},
	{"sqrt(x+2)/(y+3)", -1, 1, -1, 1},
	{"tan(x/2)+atan(3*y)", -2, 2, -2, 2},
	{"sinh(x)-cosh(y)+tanh(x*y)", -2, 2, -2, 2},
	{"(x+3)^y", -1, 1, -1, 2},
	{"(x+2)^1.5+2^x", -1, 1, 0, 0},
	{"1/(1+x^2)-y/(2+x)", -1, 1, -1, 1},
	{"abs(x-3)+min(x, y+5)+max(x, -4)", -1, 1, -1, 1},
	{"x^(-2)+cos(pi*x)^3", 0.5, 2, 0, 0},
	{"x^7-2*x^5*y^2+0.1*y^6", -1.5, 1.5, -1.5, 1.5},
}

func TestEvalContainsSampledValues(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, tf := range testFuncs {
		e := MustParse(tf.src)
		for trial := 0; trial < 40; trial++ {
			x := randBox(rng, tf.xlo, tf.xhi)
			y := randBox(rng, tf.ylo, tf.yhi)
			r, err := e.Eval(map[string]I{"x": x, "y": y})
			if err != nil {
				t.Errorf("%s over %v×%v: %v", tf.src, x, y, err)
				continue
			}
			for s := 0; s < 5; s++ {
				px, py := randIn(rng, x), randIn(rng, y)
				v := refEval(e.root, map[string]*big.Float{"x": bf(px), "y": bf(py)})
				if !refContains([2]float64{r.Lo, r.Hi}, v) {
					t.Errorf("%s over %v×%v = %v misses f(%g, %g) = %s", tf.src, x, y, r, px, py, v.Text('g', 20))
				}
			}
		}
		// Narrowness on a point box: a few ulps (interval elementary functions
		// are near-tight; the bound 64 ulps of the magnitude allows for the
		// operation count of these formulas).
		px, py := randIn(rng, I{Lo: tf.xlo, Hi: tf.xhi}), randIn(rng, I{Lo: tf.ylo, Hi: tf.yhi})
		r, err := e.Eval(map[string]I{"x": pt(px), "y": pt(py)})
		if err != nil {
			t.Errorf("%s at point: %v", tf.src, err)
			continue
		}
		if w := r.Wid(); w > 64*0x1p-52*math.Max(r.Mag(), 1) {
			t.Errorf("%s at (%g, %g) = %v: width %g too large", tf.src, px, py, r, w)
		}
	}
}

// randBox returns a random sub-interval of [lo, hi] of random width.
func randBox(rng *rand.Rand, lo, hi float64) I {
	if lo == hi {
		return pt(lo)
	}
	w := (hi - lo) * math.Pow(2, -8*rng.Float64()) * rng.Float64()
	a := lo + (hi-lo-w)*rng.Float64()
	return I{Lo: a, Hi: math.Min(a+w, hi)}
}

// randIn returns a random float in x (its ends included with some weight).
func randIn(rng *rand.Rand, x I) float64 {
	switch rng.IntN(8) {
	case 0:
		return x.Lo
	case 1:
		return x.Hi
	}
	return math.Min(x.Hi, x.Lo+(x.Hi-x.Lo)*rng.Float64())
}

func TestRangeTriangle(t *testing.T) {
	// log(x + y - 1/2) is defined on the triangle (1,0),(0,1),(1,1), where
	// x + y ≥ 1, but not on its bounding box [0,1]²; its range there is
	// [log(1/2), log(3/2)] (the function increases in x + y).
	v := [3][2]I{{pt(1), pt(0)}, {pt(0), pt(1)}, {pt(1), pt(1)}}
	e := MustParse("log(x+y-1/2)")
	if _, err := e.Eval(map[string]I{"x": {Lo: 0, Hi: 1}, "y": {Lo: 0, Hi: 1}}); err == nil {
		t.Fatal("log(x+y-1/2) should fail on the bounding box")
	}
	r, err := e.RangeTriangle(v)
	if err != nil {
		t.Fatalf("RangeTriangle: %v", err)
	}
	if !(r.Lo <= -math.Ln2 && r.Hi >= math.Log(1.5)) || r.Lo < -math.Ln2-1e-12 || r.Hi > math.Log(1.5)+1e-9 {
		t.Fatalf("RangeTriangle(log(x+y-1/2)) = %v, want ⊇ [log 0.5, log 1.5] and narrow", r)
	}
	v = [3][2]I{{pt(0), pt(0)}, {pt(1), pt(0)}, {pt(0), pt(1)}}
	// sqrt(1 - x - y) is defined on this triangle but on no box around any
	// part of its hypotenuse; its range is [0, 1] (it decreases in x + y).
	e = MustParse("sqrt(1-x-y)")
	if r, err = e.RangeTriangle(v); err != nil {
		t.Fatalf("RangeTriangle(sqrt(1-x-y)): %v", err)
	}
	if !(r.Lo <= 0 && r.Hi >= 1) || r.Lo < 0 || r.Hi > 1+1e-15 {
		t.Fatalf("RangeTriangle(sqrt(1-x-y)) = %v, want [0, 1]", r)
	}
	// Over the triangle itself, x - y on (0,0),(1,1),(1,1.01) has range
	// [-0.01, 0], while its bounding box gives [-1.01, 1].
	thin := [3][2]I{{pt(0), pt(0)}, {pt(1), pt(1)}, {pt(1), pt(1.01)}}
	if r, err = MustParse("x-y").RangeTriangle(thin); err != nil || r.Lo < -0.0100001 || r.Hi > 1e-15 || !r.Contains(-0.01) {
		t.Fatalf("RangeTriangle(x-y) on a thin triangle = %v, %v", r, err)
	}
	// log(x) on a triangle touching x = 0 cannot be enclosed.
	if _, err := MustParse("log(x)").RangeTriangle(v); err == nil {
		t.Fatal("log(x) on a triangle touching x = 0 should fail")
	}
	// Sampled containment on random triangles.
	rng := rand.New(rand.NewPCG(3, 4))
	for _, tf := range testFuncs {
		e := MustParse(tf.src)
		for trial := 0; trial < 10; trial++ {
			tri := randTriangle(rng, tf.xlo, tf.xhi, tf.ylo, tf.yhi)
			r, err := e.RangeTriangle(tri)
			if err != nil {
				t.Errorf("%s on %v: %v", tf.src, tri, err)
				continue
			}
			for s := 0; s < 5; s++ {
				p := triPoint(rng, tri)
				v := refEval(e.root, map[string]*big.Float{"x": p[0], "y": p[1]})
				if !refContains([2]float64{r.Lo, r.Hi}, v) {
					t.Errorf("%s on %v = %v misses %s", tf.src, tri, r, v.Text('g', 20))
				}
			}
		}
	}
}

// randTriangle returns a random triangle with float (point) vertices in
// the box.
func randTriangle(rng *rand.Rand, xlo, xhi, ylo, yhi float64) [3][2]I {
	bx, by := randBox(rng, xlo, xhi), randBox(rng, ylo, yhi)
	var v [3][2]I
	for k := range v {
		v[k] = [2]I{pt(randIn(rng, bx)), pt(randIn(rng, by))}
	}
	return v
}

// triPoint returns an exact point v0 + ξ(v1 − v0) + η(v2 − v0) of the
// triangle (point vertices) with random floats ξ, η ≥ 0, ξ + η ≤ 1, and
// the pair (ξ, η).
func triPoint(rng *rand.Rand, v [3][2]I) [2]*big.Float {
	p, _, _ := triPointXi(rng, v)
	return p
}

func triPointXi(rng *rand.Rand, v [3][2]I) ([2]*big.Float, float64, float64) {
	xi, eta := rng.Float64(), rng.Float64()
	switch rng.IntN(6) {
	case 0:
		xi, eta = 0, 0
	case 1:
		xi, eta = 1, 0
	case 2:
		xi, eta = 0, 1
	}
	if xi+eta > 1 {
		xi, eta = 1-xi, 1-eta
	}
	var p [2]*big.Float
	for i := range p {
		a, b, c := bf(v[0][i].Lo), bf(v[1][i].Lo), bf(v[2][i].Lo)
		p[i] = badd(a, badd(bmul(bf(xi), bsub(b, a)), bmul(bf(eta), bsub(c, a))))
	}
	return p, xi, eta
}
