package tri

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"gapcert/interval"
)

// bernValue evaluates Σ b_α B^q_α(λ) at float barycentric λ with the
// midpoints of b (a float check helper).
func bernValue(b []interval.I, q int, l [3]float64) float64 {
	val := 0.0
	for r, a := range multiIndex(q).alpha {
		w := float64(multinom(a).Int64())
		for j := 0; j < 3; j++ {
			w *= math.Pow(l[j], float64(a[j]))
		}
		val += b[r].Mid() * w
	}
	return val
}

// At random points of every triangle, V (evaluated in float64 by package
// math, an outside reference) lies in Range(t) and within the remainder
// of the model's polynomial part; polynomial V gives R = 0 and the exact
// polynomial (degree raised to the polynomial's degree).
func TestPotentialModelsAndRanges(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	cases := []struct {
		src   string
		f     func(x, y float64) float64
		order int
		exact bool
	}{
		{"x^2 + y^2", func(x, y float64) float64 { return x*x + y*y }, 1, true},
		{"x*y^3 - 2*x + 1/3", func(x, y float64) float64 { return x*y*y*y - 2*x + 1.0/3 }, 2, true},
		{"sin(3*x)*y", func(x, y float64) float64 { return math.Sin(3*x) * y }, 5, false},
		{"exp(-x*y)", func(x, y float64) float64 { return math.Exp(-x * y) }, 4, false},
		// Kinks on the grid lines x = 1/2, y = 1/2: each closed triangle
		// lies on one side, where the function is linear (exact models).
		{"abs(x - 1/2) + min(y, 1 - y)", func(x, y float64) float64 { return math.Abs(x-0.5) + math.Min(y, 1-y) }, 1, true},
		// A kink along the diagonals, which the bounding boxes of the
		// diagonal triangles straddle but each triangle lies on one side
		// of (decided on the triangle itself): exact.
		{"abs(x - y)", func(x, y float64) float64 { return math.Abs(x - y) }, 3, true},
		// A kink across triangles: range models there.
		{"abs(x - y - 1/8)", func(x, y float64) float64 { return math.Abs(x - y - 0.125) }, 3, false},
	}
	m := unitSquare(t, 2)
	for _, c := range cases {
		v := mustPotential(t, m, c.src, c.order)
		if v.Exact() != c.exact {
			t.Errorf("%s: Exact() = %v", c.src, v.Exact())
		}
		for tr := range m.Tris {
			vert := m.Vertices(tr)
			bern, rem := v.Model(tr)
			for k := 0; k < 20; k++ {
				l1, l2 := rng.Float64(), rng.Float64()
				if l1+l2 > 1 {
					l1, l2 = 1-l1, 1-l2
				}
				l := [3]float64{1 - l1 - l2, l1, l2}
				x := l[0]*vert[0][0].Mid() + l[1]*vert[1][0].Mid() + l[2]*vert[2][0].Mid()
				y := l[0]*vert[0][1].Mid() + l[1]*vert[1][1].Mid() + l[2]*vert[2][1].Mid()
				fv := c.f(x, y)
				if r := v.Range(tr); !(r.Lo <= fv+1e-14 && fv-1e-14 <= r.Hi) {
					t.Errorf("%s triangle %d: V(%g, %g) = %g outside range %v", c.src, tr, x, y, fv, r)
				}
				d := fv - bernValue(bern, v.Degree(), l)
				if !(rem.Lo-1e-13 <= d && d <= rem.Hi+1e-13) {
					t.Errorf("%s triangle %d: V − P = %g outside remainder %v", c.src, tr, d, rem)
				}
			}
		}
	}
}

// Projection.Matrices refuses V + γ not verified ≥ 0 (the Jensen step of
// a_h needs c_T ≥ 0) with a *SignError naming the triangle, and accepts a
// shift that makes it nonnegative.
func TestProjectionSignError(t *testing.T) {
	m := unitSquare(t, 1)
	v := mustPotential(t, m, "x - 1/2", 1)
	for _, s := range []*Projection{NewCR(m, allBC(4, dirichlet)), NewECR(m, allBC(4, dirichlet))} {
		_, _, _, err := s.Matrices(v, interval.I{})
		var se *SignError
		if !errors.As(err, &se) || se.Need != "≥ 0" || !(se.Range.Lo < 0) {
			t.Errorf("enriched=%v: got %v, want a SignError", s.Enriched(), err)
		}
		if _, _, _, err := s.Matrices(v, interval.Point(0.5)); err != nil {
			t.Errorf("enriched=%v with γ = 1/2: %v", s.Enriched(), err)
		}
	}
}
