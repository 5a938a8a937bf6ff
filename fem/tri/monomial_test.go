package tri

import (
	"math"
	"math/big"
	"math/rand"
	"testing"

	"gapcert/fem/mesh"
	"gapcert/interval"
)

// exactBernstein returns the exact value at (x, y) of the function with
// coefficients vec on triangle t of s, for the exact vertices verts (one
// choice of points inside the vertex enclosures), in math/big.
func exactBernstein(s *Lagrange, vec []float64, t int, verts [3][2]float64, x, y float64) *big.Rat {
	r := func(f float64) *big.Rat { return new(big.Rat).SetFloat64(f) }
	cross := func(px, py, qx, qy *big.Rat) *big.Rat {
		a := new(big.Rat).Mul(px, qy)
		return a.Sub(a, new(big.Rat).Mul(py, qx))
	}
	sub := func(a, b float64) *big.Rat { return new(big.Rat).Sub(r(a), r(b)) }
	det := cross(sub(verts[1][0], verts[0][0]), sub(verts[1][1], verts[0][1]), sub(verts[2][0], verts[0][0]), sub(verts[2][1], verts[0][1]))
	var lam [3]*big.Rat
	for i := range 3 {
		j, k := (i+1)%3, (i+2)%3
		c := cross(sub(verts[k][0], verts[j][0]), sub(verts[k][1], verts[j][1]), sub(x, verts[j][0]), sub(y, verts[j][1]))
		lam[i] = c.Quo(c, det)
	}
	sum := new(big.Rat)
	for l, a := range multiIndex(s.p).alpha {
		g := s.dofs[t][l]
		if g < 0 {
			continue
		}
		term := new(big.Rat).SetInt(multinom(a))
		term.Mul(term, r(vec[g]))
		for i := range 3 {
			for range a[i] {
				term.Mul(term, lam[i])
			}
		}
		sum.Add(sum, term)
	}
	return sum
}

// evalMonomials encloses Σ c[a][b] d_x^a d_y^b at d = (x, y) − x0.
func evalMonomials(c [][]interval.I, x0 [2]float64, x, y float64) interval.I {
	dx := interval.Point(x).Sub(interval.Point(x0[0]))
	dy := interval.Point(y).Sub(interval.Point(x0[1]))
	var s interval.I
	for a, row := range c {
		for b, v := range row {
			s = s.Add(v.Mul(dx.PowInt(a)).Mul(dy.PowInt(b)))
		}
	}
	return s
}

// The monomial form on a triangle contains the exact value of the
// Bernstein form (computed in math/big) at random points of the triangle,
// for the three choices Lo, Mid, Hi of exact vertices in the mesh's
// enclosures (a pentagon with non-representable vertices such as 1/3,
// refined once, so most vertex enclosures have width > 0), and is narrow.
func TestMonomialsContainBernsteinForm(t *testing.T) {
	third := interval.Point(1).DivF(3)
	poly := [][2]interval.I{pt(0, 0), {interval.Point(1), third}, pt(1.25, 1), {third, interval.Point(1.5)}, {third.Neg(), interval.Point(0.75)}}
	m, err := mesh.FromPolygon(poly, [][3]int{{0, 1, 2}, {0, 2, 3}, {0, 3, 4}})
	if err != nil {
		t.Fatal(err)
	}
	m = m.Refine()
	rng := rand.New(rand.NewSource(7))
	for _, p := range []int{1, 3, 5} {
		s := NewLagrange(m, p, allBC(5, robin(interval.Point(0.5))))
		vec := make([]float64, s.N())
		for i := range vec {
			vec[i] = rng.Float64()*2 - 1
		}
		worst := 0.0
		for tr := range m.Tris {
			v := m.Vertices(tr)
			for trial := range 4 {
				// A random point of the triangle (from the midpoints) and a
				// centre near it.
				l1, l2 := rng.Float64(), rng.Float64()
				if l1+l2 > 1 {
					l1, l2 = 1-l1, 1-l2
				}
				x := (1-l1-l2)*v[0][0].Mid() + l1*v[1][0].Mid() + l2*v[2][0].Mid()
				y := (1-l1-l2)*v[0][1].Mid() + l1*v[1][1].Mid() + l2*v[2][1].Mid()
				x0 := [2]float64{x + 0.01*float64(trial-2), y - 0.003*float64(trial)}
				c, ok := s.Monomials(vec, tr, x0)
				if !ok {
					t.Fatalf("p=%d triangle %d: area not certified", p, tr)
				}
				enc := evalMonomials(c, x0, x, y)
				for _, pick := range []func(interval.I) float64{func(i interval.I) float64 { return i.Lo }, interval.I.Mid, func(i interval.I) float64 { return i.Hi }} {
					var verts [3][2]float64
					for i := range 3 {
						verts[i] = [2]float64{pick(v[i][0]), pick(v[i][1])}
					}
					truth := exactBernstein(s, vec, tr, verts, x, y)
					lo, hi := new(big.Rat).SetFloat64(enc.Lo), new(big.Rat).SetFloat64(enc.Hi)
					if truth.Cmp(lo) < 0 || truth.Cmp(hi) > 0 {
						f, _ := truth.Float64()
						t.Fatalf("p=%d triangle %d: %v does not contain the exact value %.17g", p, tr, enc, f)
					}
				}
				if f := s.Eval(vec, x, y); !(math.Abs(f-enc.Mid()) <= 1e-9*(1+math.Abs(f))) {
					t.Errorf("p=%d triangle %d: Eval %.17g far from the enclosure %v", p, tr, f, enc)
				}
				worst = math.Max(worst, enc.Wid())
			}
		}
		// Narrow: the vertex enclosures are a few ulps wide.
		if worst > 1e-11 {
			t.Errorf("p=%d: widest enclosure %.3g, want ≤ 1e-11", p, worst)
		}
		t.Logf("p=%d: widest enclosure of a point value %.3g", p, worst)
	}
}

// Monomials panics on a vector of the wrong length, a triangle index out
// of range and a non-finite centre.
func TestMonomialsMisusePanics(t *testing.T) {
	s := NewLagrange(unitSquare(t, 0), 2, allBC(4, dirichlet))
	for name, f := range map[string]func(){
		"vector length": func() { s.Monomials(make([]float64, s.N()+1), 0, [2]float64{0.5, 0.2}) },
		"triangle":      func() { s.Monomials(make([]float64, s.N()), 2, [2]float64{0.5, 0.2}) },
		"centre":        func() { s.Monomials(make([]float64, s.N()), 0, [2]float64{math.NaN(), 0.2}) },
	} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("%s: no panic", name)
				}
			}()
			f()
		}()
	}
}
