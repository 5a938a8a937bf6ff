package formula

import (
	"math/rand/v2"
	"os"
	"testing"
)

// TestKinkModelsContainValues tries to break the Taylor models of
// abs, min and max on cells and triangles that touch a kink: on its
// boundary (vertices or whole edges on the kink, axis-parallel or not),
// and nested kinks. For every model that is returned (an error is always
// allowed), the model at sample points (ξ, η) must meet the interval
// evaluation of the expression at the enclosed point v0 + ξd1 + ηd2: both
// contain the exact value there, so disjoint enclosures would be a false
// model. Inputs are random with a fixed seed; GAPCERT_LONG=1 runs 10 times
// as many (the default count catches, for instance, the closed branch rule applied on sub-boxes of a triangle, which the long count catches within 0.5 s too).
func TestKinkModelsContainValues(t *testing.T) {
	srcs := []string{
		"abs(x - y)",
		"abs(x + 2*y - 1/2)",
		"min(x, y) + max(x, y)^2",
		"abs(abs(x - y) - x)",
		"max(x - y, 0)^3 + abs(y)",
		"exp(abs(x - y)) * min(1 - x, 1 + y)",
		"abs(x*y - 1/4) + abs(x)",
		"1/(3 + abs(x - y))",
		"sqrt(1 + abs(y - 2*x))",
		"max(abs(x), abs(y))",
		"min(x^2, y)",
		"abs(sin(3*x) - y)",
	}
	trials := 2000
	if os.Getenv("GAPCERT_LONG") != "" {
		trials *= 10
	}
	rng := rand.New(rand.NewPCG(11, 12))
	// Points on the kink lines of the expressions above, to snap vertices
	// to: y = x, x + 2y = 1/2, x = 0, y = 0, y = 2x.
	snap := func(p [2]float64) [2]float64 {
		switch rng.IntN(6) {
		case 0:
			return [2]float64{p[0], p[0]}
		case 1:
			return [2]float64{0.5 - 2*p[1], p[1]}
		case 2:
			return [2]float64{0, p[1]}
		case 3:
			return [2]float64{p[0], 0}
		case 4:
			return [2]float64{p[0], 2 * p[0]}
		}
		return p
	}
	dyadic := func() float64 { return float64(rng.IntN(65)-32) / 32 }
	models, failures := 0, 0
	for _, src := range srcs {
		e := MustParse(src)
		for trial := 0; trial < trials; trial++ {
			var v [3][2]float64
			for i := range v {
				v[i] = snap([2]float64{dyadic(), dyadic()})
			}
			if rng.IntN(3) == 0 {
				// An edge on a kink line through two snapped points of the
				// same line.
				k := rng.IntN(5)
				for i := 0; i < 2; i++ {
					p := [2]float64{dyadic(), dyadic()}
					switch k {
					case 0:
						v[i] = [2]float64{p[0], p[0]}
					case 1:
						v[i] = [2]float64{0.5 - 2*p[1], p[1]}
					case 2:
						v[i] = [2]float64{0, p[1]}
					case 3:
						v[i] = [2]float64{p[0], 0}
					case 4:
						v[i] = [2]float64{p[0], 2 * p[0]}
					}
				}
			}
			cross := (v[1][0]-v[0][0])*(v[2][1]-v[0][1]) - (v[1][1]-v[0][1])*(v[2][0]-v[0][0])
			if cross == 0 {
				continue
			}
			var vi [3][2]I
			for i := range v {
				vi[i] = [2]I{pt(v[i][0]), pt(v[i][1])}
			}
			q := 1 + rng.IntN(5)
			m, err := e.Model2(vi, q)
			if err != nil {
				failures++
				continue
			}
			models++
			for s := 0; s < 40; s++ {
				xi, eta := float64(rng.IntN(33))/32, float64(rng.IntN(33))/32
				if xi+eta > 1 {
					xi, eta = 1-xi, 1-eta
				}
				x := vi[0][0].Add(vi[1][0].Sub(vi[0][0]).MulF(xi)).Add(vi[2][0].Sub(vi[0][0]).MulF(eta))
				y := vi[0][1].Add(vi[1][1].Sub(vi[0][1]).MulF(xi)).Add(vi[2][1].Sub(vi[0][1]).MulF(eta))
				f, err := e.Eval(map[string]I{"x": x, "y": y})
				if err != nil {
					continue
				}
				if _, ok := evalModel2(m, xi, eta).Intersection(f); !ok {
					t.Fatalf("%s on %v (order %d) at (ξ, η) = (%g, %g): model %v misses f ∈ %v", src, v, q, xi, eta, evalModel2(m, xi, eta), f)
				}
			}
		}
	}
	// 1D: cells with an end on a kink (or the kink inside).
	for _, src := range []string{"abs(x - 1/4)", "min(x, 1/2 - x)", "abs(abs(x) - 1/2)", "max(x^2 - 1/4, 0)^2", "exp(abs(x))", "abs(x^3 - x)"} {
		e := MustParse(src)
		for trial := 0; trial < trials; trial++ {
			a, b := dyadic(), dyadic()
			if rng.IntN(2) == 0 {
				a = []float64{0.25, 0.5, -0.5, 0, 1}[rng.IntN(5)]
			}
			if a == b {
				continue
			}
			if a > b {
				a, b = b, a
			}
			q := 1 + rng.IntN(6)
			m, err := e.Model1(pt(a), pt(b), q)
			if err != nil {
				continue
			}
			for s := 0; s <= 32; s++ {
				xi := float64(s) / 32
				f, err := e.Eval(map[string]I{"x": pt(a).Add(pt(b).Sub(pt(a)).MulF(xi))})
				if err != nil {
					continue
				}
				if _, ok := evalModel1(m, xi).Intersection(f); !ok {
					t.Fatalf("%s on [%g, %g] (order %d) at ξ = %g: model %v misses f ∈ %v", src, a, b, q, xi, evalModel1(m, xi), f)
				}
			}
		}
	}
	t.Logf("%d triangle models checked, %d refused", models, failures)
}
