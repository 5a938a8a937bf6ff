package formula

import (
	"math"
	"math/big"
	"math/rand/v2"
	"os"
	"testing"
)

// widen returns an interval of relative width about 2⁻²⁰ around t.
func widen(t float64) I {
	d := math.Max(math.Abs(t), 1) * 0x1p-20
	return I{Lo: t - d, Hi: t + d}
}

func TestModelsWithIntervalVertices(t *testing.T) {
	// The models must hold for every exact end / vertex inside the given
	// enclosures, not only for their midpoints.
	rng := rand.New(rand.NewPCG(13, 14))
	for _, tf := range testFuncs {
		e := MustParse(tf.src)
		ex := e.Bind(map[string]I{"y": pt(0.5 * (tf.ylo + tf.yhi))})
		for trial := 0; trial < 4; trial++ {
			box := randBox(rng, tf.xlo+0.01, tf.xhi-0.01)
			A, B := widen(box.Lo), widen(box.Hi)
			m, err := ex.Model1(A, B, 6)
			if err != nil {
				t.Errorf("%s on [%v, %v]: %v", ex, A, B, err)
				continue
			}
			for s := 0; s < 6; s++ {
				a, b, xi := randIn(rng, A), randIn(rng, B), randIn(rng, I{Lo: 0, Hi: 1})
				p := badd(bf(a), bmul(bf(xi), bsub(bf(b), bf(a))))
				v := refEval(ex.root, map[string]*big.Float{"x": p})
				if got := evalModel1(m, xi); !refContains([2]float64{got.Lo, got.Hi}, v) {
					t.Errorf("%s a=%g b=%g ξ=%g: %v misses %s", ex, a, b, xi, got, v.Text('g', 20))
				}
			}
			tri := randTriangle(rng, tf.xlo+0.01, tf.xhi-0.01, tf.ylo+0.01, tf.yhi-0.01)
			var V [3][2]I
			for k := range V {
				V[k] = [2]I{widen(tri[k][0].Lo), widen(tri[k][1].Lo)}
				if tf.ylo == tf.yhi {
					V[k][1] = pt(tf.ylo)
				}
			}
			m2, err := e.Model2(V, 5)
			if err != nil {
				t.Errorf("%s on %v: %v", tf.src, V, err)
				continue
			}
			for s := 0; s < 6; s++ {
				var exact [3][2]I
				for k := range exact {
					exact[k] = [2]I{pt(randIn(rng, V[k][0])), pt(randIn(rng, V[k][1]))}
				}
				p, xi, eta := triPointXi(rng, exact)
				v := refEval(e.root, map[string]*big.Float{"x": p[0], "y": p[1]})
				if got := evalModel2(m2, xi, eta); !refContains([2]float64{got.Lo, got.Hi}, v) {
					t.Errorf("%s on %v at (%g, %g): %v misses %s", tf.src, exact, xi, eta, got, v.Text('g', 20))
				}
			}
		}
	}
}

// randTree returns a random formula in x and y built from every operation
// of the grammar; sub-expressions that may leave a function's domain are
// common, and the campaign below skips boxes with domain errors.
func randTree(rng *rand.Rand, depth int) *Expr {
	if depth == 0 || rng.IntN(4) == 0 {
		switch rng.IntN(5) {
		case 0:
			return Var("x")
		case 1:
			return Var("y")
		case 2:
			return MustParse("pi")
		}
		return MustParse([]string{"0.5", "3", "1/3", "2.25", "0.1"}[rng.IntN(5)])
	}
	a := randTree(rng, depth-1)
	switch rng.IntN(14) {
	case 0:
		return Add(a, randTree(rng, depth-1))
	case 1:
		return Sub(a, randTree(rng, depth-1))
	case 2, 3:
		return Mul(a, randTree(rng, depth-1))
	case 4:
		return Div(a, randTree(rng, depth-1))
	case 5:
		return MustParse("(" + a.String() + ")^" + []string{"2", "3", "-1", "0.5"}[rng.IntN(4)])
	}
	fn := []string{"exp", "log", "sin", "cos", "tan", "atan", "sinh", "cosh", "tanh", "sqrt", "abs", "min", "max"}[rng.IntN(13)]
	if fn == "min" || fn == "max" {
		return MustParse(fn + "(" + a.String() + ", " + randTree(rng, depth-1).String() + ")")
	}
	return MustParse(fn + "(" + a.String() + ")")
}

func TestRandomFormulas(t *testing.T) {
	trees, boxes := 150, 8
	if os.Getenv("GAPCERT_LONG") == "1" {
		trees, boxes = 5000, 20
	}
	rng := rand.New(rand.NewPCG(15, 16))
	var evals, models, ranges int
	for n := 0; n < trees; n++ {
		e := randTree(rng, 4)
		if os.Getenv("GAPCERT_DEBUG") != "" {
			t.Log(e)
		}
		if again := MustParse(e.String()); again.String() != e.String() {
			t.Fatalf("round trip %q → %q", e, again)
		}
		for k := 0; k < boxes; k++ {
			x, y := randBox(rng, -3, 3), randBox(rng, -3, 3)
			if r, err := e.Eval(map[string]I{"x": x, "y": y}); err == nil {
				evals++
				for s := 0; s < 3; s++ {
					px, py := randIn(rng, x), randIn(rng, y)
					v, ok := refEvalOK(e.root, map[string]*big.Float{"x": bf(px), "y": bf(py)})
					if ok && !refContains([2]float64{r.Lo, r.Hi}, v) {
						t.Errorf("%s over %v×%v = %v misses f(%g,%g) = %s", e, x, y, r, px, py, v.Text('g', 20))
					}
				}
			}
			tri := randTriangle(rng, -3, 3, -3, 3)
			if r, err := e.RangeTriangle(tri); err == nil {
				ranges++
				for s := 0; s < 3; s++ {
					p := triPoint(rng, tri)
					v, ok := refEvalOK(e.root, map[string]*big.Float{"x": p[0], "y": p[1]})
					if ok && !refContains([2]float64{r.Lo, r.Hi}, v) {
						t.Errorf("%s on %v = %v misses %s", e, tri, r, v.Text('g', 20))
					}
				}
			}
			ex := e.Bind(map[string]I{"y": pt(randIn(rng, y))})
			if m, err := ex.Model1(pt(x.Lo), pt(x.Hi), 1+rng.IntN(8)); err == nil {
				models++
				for s := 0; s < 3; s++ {
					xi := randIn(rng, I{Lo: 0, Hi: 1})
					p := badd(bf(x.Lo), bmul(bf(xi), bsub(bf(x.Hi), bf(x.Lo))))
					v, ok := refEvalOK(ex.root, map[string]*big.Float{"x": p})
					if got := evalModel1(m, xi); ok && !refContains([2]float64{got.Lo, got.Hi}, v) {
						t.Errorf("%s on [%g, %g] at ξ=%g: model %v misses %s", ex, x.Lo, x.Hi, xi, got, v.Text('g', 20))
					}
				}
			}
		}
	}
	t.Logf("%d trees: %d box enclosures, %d triangle ranges and %d Taylor models checked", trees, evals, ranges, models)
	if evals < trees || ranges < trees || models < trees/2 {
		t.Errorf("too few successful evaluations (%d, %d)", evals, models)
	}
}
