package formula

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"
)

func TestGradientHessian(t *testing.T) {
	// Analytic derivatives (common practice calculus).
	for _, tc := range []struct {
		src  string
		grad func(x, y float64) [2]float64
		hess func(x, y float64) [2][2]float64
	}{
		{"x^2+y^2",
			func(x, y float64) [2]float64 { return [2]float64{2 * x, 2 * y} },
			func(x, y float64) [2][2]float64 { return [2][2]float64{{2, 0}, {0, 2}} }},
		{"exp(x+y)",
			func(x, y float64) [2]float64 { e := math.Exp(x + y); return [2]float64{e, e} },
			func(x, y float64) [2][2]float64 { e := math.Exp(x + y); return [2][2]float64{{e, e}, {e, e}} }},
		{"sin(x)*cos(y)",
			func(x, y float64) [2]float64 {
				return [2]float64{math.Cos(x) * math.Cos(y), -math.Sin(x) * math.Sin(y)}
			},
			func(x, y float64) [2][2]float64 {
				return [2][2]float64{{-math.Sin(x) * math.Cos(y), -math.Cos(x) * math.Sin(y)},
					{-math.Cos(x) * math.Sin(y), -math.Sin(x) * math.Cos(y)}}
			}},
		{"x^3*y-log(y)",
			func(x, y float64) [2]float64 { return [2]float64{3 * x * x * y, x*x*x - 1/y} },
			func(x, y float64) [2][2]float64 {
				return [2][2]float64{{6 * x * y, 3 * x * x}, {3 * x * x, 1 / (y * y)}}
			}},
	} {
		e := MustParse(tc.src)
		rng := rand.New(rand.NewPCG(11, 12))
		for trial := 0; trial < 20; trial++ {
			bx, by := randBox(rng, -1, 1), randBox(rng, 0.5, 2)
			env := map[string]I{"x": bx, "y": by}
			g, err := e.Gradient(env, []string{"x", "y"})
			if err != nil {
				t.Fatalf("%s: %v", tc.src, err)
			}
			h, err := e.Hessian(env, []string{"x", "y"})
			if err != nil {
				t.Fatalf("%s: %v", tc.src, err)
			}
			for s := 0; s < 5; s++ {
				px, py := randIn(rng, bx), randIn(rng, by)
				// The analytic values are computed in float64; allow a
				// relative 1e-14 for their own rounding.
				in := func(v I, want float64) bool {
					tol := 1e-14 * math.Max(1, math.Abs(want))
					return v.Lo-tol <= want && want <= v.Hi+tol
				}
				wg, wh := tc.grad(px, py), tc.hess(px, py)
				for i := 0; i < 2; i++ {
					if !in(g[i], wg[i]) {
						t.Errorf("%s grad[%d] over %v×%v = %v misses %g", tc.src, i, bx, by, g[i], wg[i])
					}
					for j := 0; j < 2; j++ {
						if !in(h[i][j], wh[i][j]) {
							t.Errorf("%s hess[%d][%d] = %v misses %g", tc.src, i, j, h[i][j], wh[i][j])
						}
					}
				}
			}
		}
	}
	// Exact on a polynomial: the Hessian of x^2 + y^2 is exactly [[2,0],[0,2]].
	h, err := MustParse("x^2+y^2").Hessian(map[string]I{"x": {Lo: -3, Hi: 5}, "y": {Lo: 1, Hi: 2}}, []string{"x", "y"})
	if err != nil || h[0][0] != pt(2) || h[1][1] != pt(2) || h[0][1] != pt(0) || h[1][0] != pt(0) {
		t.Fatalf("Hessian(x^2+y^2) = %v, %v", h, err)
	}
	// Narrow on a point box.
	h, _ = MustParse("exp(x+y)").Hessian(map[string]I{"x": pt(0.25), "y": pt(0.5)}, []string{"x", "y"})
	if h[0][1].Wid() > 1e-14 {
		t.Errorf("Hessian(exp) at a point too wide: %v", h[0][1])
	}
	// abs is not differentiable across 0.
	var se *SmoothnessError
	if _, err := MustParse("abs(x)").Gradient(map[string]I{"x": {Lo: -1, Hi: 1}}, []string{"x"}); !errors.As(err, &se) {
		t.Errorf("abs across 0: %v", err)
	}
	// A parameter held fixed.
	g, err := MustParse("a*x^2").Gradient(map[string]I{"x": pt(3), "a": pt(2)}, []string{"x"})
	if err != nil || g[0] != pt(12) {
		t.Errorf("d(a x²)/dx = %v, %v", g, err)
	}
}

func TestPolynomial(t *testing.T) {
	for _, tc := range []struct {
		src    string
		ok     bool
		degree int
	}{
		{"x^2+y^2", true, 2},
		{"3*x*y-x^3", true, 3},
		{"(x+1)^4-x^4", true, 3},
		{"x/2+y/pi", true, 1},
		{"sqrt(2)*x*y^2", true, 3},
		{"-(x-y)^2", true, 2},
		{"7", true, 0},
		{"x-x", true, -1}, // the zero polynomial
		{"x/y", false, 0},
		{"sqrt(x)", false, 0},
		{"sin(x)", false, 0},
		{"x^0.5", false, 0},
		{"x^y", false, 0},
		{"a*x", false, 0},
		{"abs(x)", false, 0},
		{"1/(x+1)", false, 0},
		{"x^100", false, 0},
	} {
		p, ok := MustParse(tc.src).Polynomial()
		if ok != tc.ok {
			t.Errorf("%s: ok = %v, want %v", tc.src, ok, tc.ok)
			continue
		}
		if ok && p.Degree() != tc.degree {
			t.Errorf("%s: degree %d, want %d", tc.src, p.Degree(), tc.degree)
		}
	}
	// (x+1)^4 - x^4 = 4x³ + 6x² + 4x + 1, exact integer coefficients.
	p, _ := MustParse("(x+1)^4-x^4").Polynomial()
	for k, want := range map[[2]int]float64{{3, 0}: 4, {2, 0}: 6, {1, 0}: 4, {0, 0}: 1, {4, 0}: 0} {
		if p.Coef[k] != pt(want) {
			t.Errorf("coef %v = %v, want %g", k, p.Coef[k], want)
		}
	}

}

// TestHessianEvenPowersKeepSign: squaring in the jets (powInt) encloses
// each coefficient of u² by one product per unordered pair and u_a² by
// interval Sqr, so even powers keep their sign on boxes around 0. Exact
// ranges by calculus (common practice): ∂²/∂x² x⁴ = 12x² ∈ [0, 12] on
// [−1, 1]; ∂²/∂x² x⁶ = 30x⁴ ∈ [0, 30·(1/2)⁴] on [−1/2, 1/2]; ∂²/∂x² of
// (x + y)⁴ is 12(x + y)² ∈ [0, 48] on [−1, 1]²; the mixed entry of
// x²y² is 4xy ∈ [−4, 4].
func TestHessianEvenPowersKeepSign(t *testing.T) {
	for _, c := range []struct {
		src    string
		box    I
		i, j   int
		lo, hi float64 // the exact range of the entry
		slack  float64 // the enclosure may exceed it by this much at most
	}{
		{"x^4", I{Lo: -1, Hi: 1}, 0, 0, 0, 12, 0},
		{"x^4+y^4", I{Lo: -1, Hi: 1}, 1, 1, 0, 12, 0},
		{"x^6", I{Lo: -0.5, Hi: 0.5}, 0, 0, 0, 30.0 / 16, 0},
		{"(x+y)^4", I{Lo: -1, Hi: 1}, 0, 0, 0, 48, 0},
		{"x^2*y^2", I{Lo: -1, Hi: 1}, 0, 1, -4, 4, 0},
		{"x^4", I{Lo: 0.5, Hi: 1}, 0, 0, 3, 12, 1e-12},
	} {
		h, err := MustParse(c.src).Hessian(map[string]I{"x": c.box, "y": c.box}, []string{"x", "y"})
		if err != nil {
			t.Fatalf("%s: %v", c.src, err)
		}
		got := h[c.i][c.j]
		if !(got.Lo <= c.lo && c.hi <= got.Hi) {
			t.Errorf("%s: H[%d][%d] = %v misses the exact range [%g, %g]", c.src, c.i, c.j, got, c.lo, c.hi)
		}
		if got.Lo < c.lo-c.slack || got.Hi > c.hi+c.slack {
			t.Errorf("%s: H[%d][%d] = %v, wider than the exact range [%g, %g]", c.src, c.i, c.j, got, c.lo, c.hi)
		}
	}
}
