package groundstate

import (
	"math"
	"math/rand"
	"testing"

	"gapcert/interval"
	"gapcert/interval/formula"
)

// evalPoly encloses p(d) at the point enclosures d (Horner).
func evalPoly(p [][]interval.I, dx, dy interval.I) interval.I {
	var s interval.I
	for a := len(p) - 1; a >= 0; a-- {
		var t interval.I
		for b := len(p[a]) - 1; b >= 0; b-- {
			t = t.Mul(dy).Add(p[a][b])
		}
		s = s.Mul(dx).Add(t)
	}
	return s
}

// Every model of potential.go satisfies (M): V(x0 + d) ∈ P_V(d) + τ at
// 300 random points of the disc (V by interval evaluation at the point,
// d = x − x0 enclosed exactly), for smooth, rational, polynomial and
// kinked V; a polynomial V of degree ≤ 12 has τ = 0.
func TestPotentialModelsContainV(t *testing.T) {
	rng := rand.New(rand.NewSource(9))
	for _, src := range []string{
		"-2/cosh(x)^2 - 2/cosh(y)^2",
		"exp(-x^2 - y^2)",
		"cos(3*x)*sin(y) + x",
		"(x^3 - x)^2 + y^2 - 3*x^2",
		"x^4/4 + y^2 - abs(x) - 1",
		"0",
	} {
		v := formula.MustParse(src)
		poly, isPoly := v.Polynomial()
		for _, x0 := range [][2]float64{{0.3, -1.2}, {0, 0.5}, {-0.7, 0.1}} {
			for _, R := range []float64{0.6, 0.1, 0.003} {
				type cand struct {
					name string
					p    [][]interval.I
					rho  interval.I
					err  error
				}
				var cs []cand
				for _, q := range []int{1, 4, 8} {
					p, rho, err := triangleModel(v, x0, R, q)
					cs = append(cs, cand{"triangle", p, rho, err})
				}
				p, rho, err := hessianModel(v, x0, R)
				cs = append(cs, cand{"hessian", p, rho, err})
				p, rho, err = rangeModel(v, x0, R)
				cs = append(cs, cand{"range", p, rho, err})
				p, rho, err = potentialOnDisc(v, x0, R, 8)
				cs = append(cs, cand{"chosen", p, rho, err})
				if err != nil {
					t.Fatalf("%s at %v, R = %g: no model: %v", src, x0, R, err)
				}
				if isPoly && poly.Degree() <= maxExactVDegree && rho.Mag() != 0 {
					t.Errorf("%s: polynomial V with remainder %v", src, rho)
				}
				for _, c := range cs {
					if c.err != nil {
						continue
					}
					for range 300 {
						r := R * math.Sqrt(rng.Float64()) * (1 - 1e-9)
						th := 2 * math.Pi * rng.Float64()
						pt := [2]float64{x0[0] + r*math.Cos(th), x0[1] + r*math.Sin(th)}
						dx := interval.Point(pt[0]).Sub(interval.Point(x0[0]))
						dy := interval.Point(pt[1]).Sub(interval.Point(x0[1]))
						if math.Hypot(dx.Mag(), dy.Mag()) >= R {
							continue
						}
						want, err := v.Eval(map[string]interval.I{"x": interval.Point(pt[0]), "y": interval.Point(pt[1])})
						if err != nil {
							t.Fatal(err)
						}
						got := evalPoly(c.p, dx, dy).Add(c.rho)
						if _, ok := got.Intersection(want); !ok || (want.Wid() < got.Wid()/4 && !want.Subset(got)) {
							t.Fatalf("%s, %s model at %v, R = %g: V(%v) = %v not in %v", src, c.name, x0, R, pt, want, got)
						}
					}
				}
			}
		}
	}
}

// The triangle of triangleModel contains the disc (no point of 4,096 on
// the circle, enclosed in interval arithmetic, is outside for certain:
// x < a0, y < b0 or (x − a0) + (y − b0) > L; a leg 1e-12 relative shorter
// would put the tangent point outside) and is not much larger than the smallest such
// right triangle (leg (2 + √2)R).
func TestDiscTriangleContainsDisc(t *testing.T) {
	for _, x0 := range [][2]float64{{0.3, -1.2}, {1e6, 1e-9}, {0.1, 0.2}} {
		for _, R := range []float64{1, 0.1, 1e-7} {
			a0, b0, L := discTriangle(x0, R)
			pi := interval.Pi()
			for k := range 4096 {
				th := pi.MulF(2 * float64(k) / 4096)
				x := interval.Point(x0[0]).Add(interval.Cos(th).MulF(R))
				y := interval.Point(x0[1]).Add(interval.Sin(th).MulF(R))
				sum := x.Sub(interval.Point(a0)).Add(y.Sub(interval.Point(b0)))
				// Outside for certain (an enclosure of a point on the circle
				// reaches a little beyond it, so only a decided exit counts).
				if x.Hi < a0 || y.Hi < b0 || sum.Lo > L {
					t.Fatalf("x0 %v R %g: circle point (%v, %v) outside the triangle (%g, %g, %g)", x0, R, x, y, a0, b0, L)
				}
			}
			if L > (2+math.Sqrt2)*R*(1+1e-9)+4*math.Abs(x0[0])*0x1p-52+4*math.Abs(x0[1])*0x1p-52 {
				t.Errorf("x0 %v R %g: leg %g, want about %g", x0, R, L, (2+math.Sqrt2)*R)
			}
		}
	}
}
