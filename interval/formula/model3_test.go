package formula

import (
	"math"
	"math/big"
	"math/rand/v2"
	"testing"

	"gapcert/interval"
)

// evalModel3 returns the interval value of the polynomial part of m at
// the reference point (ξ, η, ζ) plus R.
func evalModel3(m Model3, xi, eta, zeta float64) interval.I {
	var acc interval.I
	for i := range m.C {
		for j := range m.C[i] {
			for k, c := range m.C[i][j] {
				acc = acc.Add(c.Mul(interval.Point(xi).PowInt(i)).Mul(interval.Point(eta).PowInt(j)).Mul(interval.Point(zeta).PowInt(k)))
			}
		}
	}
	return acc.Add(m.R)
}

// randomTet returns a tetrahedron with float vertices in [0, s]³ (point
// enclosures) and the float vertices themselves.
func randomTet(rng *rand.Rand, s float64) ([4][3]interval.I, [4][3]float64) {
	var v [4][3]interval.I
	var f [4][3]float64
	for a := range v {
		for c := range v[a] {
			f[a][c] = s * rng.Float64()
			v[a][c] = interval.Point(f[a][c])
		}
	}
	return v, f
}

// exactPoint returns v0 + ξ(v1 − v0) + η(v2 − v0) + ζ(v3 − v0) in exact
// rationals.
func exactPoint(f [4][3]float64, xi, eta, zeta float64) [3]*big.Rat {
	var p [3]*big.Rat
	w := [3]float64{xi, eta, zeta}
	for c := 0; c < 3; c++ {
		v0 := new(big.Rat).SetFloat64(f[0][c])
		p[c] = new(big.Rat).Set(v0)
		for k := 0; k < 3; k++ {
			d := new(big.Rat).Sub(new(big.Rat).SetFloat64(f[k+1][c]), v0)
			p[c].Add(p[c], d.Mul(d, new(big.Rat).SetFloat64(w[k])))
		}
	}
	return p
}

func ratIn(x interval.I, r *big.Rat) bool {
	return new(big.Rat).SetFloat64(x.Lo).Cmp(r) <= 0 && r.Cmp(new(big.Rat).SetFloat64(x.Hi)) <= 0
}

// A rational function evaluated exactly in math/big at random points of
// random tetrahedra lies in its Taylor model (containment), and the
// remainder shrinks with the size of the tetrahedron like h^(q+1)
// (size 1 checks containment only; narrowness: ≤ 1e-6 at order 4 on tetrahedra of size 0.05, ≤ 1e-9 at
// size 0.0125, a quarter of it: 4^5 ≈ 1000 times smaller).
func TestModel3ContainsExactRationalFunction(t *testing.T) {
	e := MustParse("1/(2 + x*y - z) + x^3*z")
	exact := func(p [3]*big.Rat) *big.Rat {
		den := new(big.Rat).Mul(p[0], p[1])
		den.Add(den, big.NewRat(2, 1))
		den.Sub(den, p[2])
		r := new(big.Rat).Inv(den)
		x3 := new(big.Rat).Mul(p[0], p[0])
		x3.Mul(x3, p[0])
		return r.Add(r, x3.Mul(x3, p[2]))
	}
	rng := rand.New(rand.NewPCG(14, 3))
	for _, c := range []struct{ size, tol float64 }{{1, math.Inf(1)}, {0.05, 1e-6}, {0.0125, 1e-9}} {
		size := c.size
		for trial := 0; trial < 40; trial++ {
			v, f := randomTet(rng, size)
			m, err := e.Model3(v, 4)
			if err != nil {
				t.Fatal(err)
			}
			if m.R.Wid() > c.tol {
				t.Errorf("size %g: remainder %v wider than %g", size, m.R, c.tol)
			}
			for k := 0; k < 20; k++ {
				a, b, c := rng.Float64(), rng.Float64(), rng.Float64()
				if a+b+c > 1 {
					continue
				}
				got := evalModel3(m, a, b, c)
				if want := exact(exactPoint(f, a, b, c)); !ratIn(got, want) {
					t.Fatalf("model %v misses exact value %s at (%g, %g, %g)", got, want.FloatString(20), a, b, c)
				}
			}
		}
	}
}

// A polynomial of degree ≤ q has remainder exactly 0 and a model that is
// the polynomial itself up to rounding of its coefficients.
func TestModel3PolynomialIsExact(t *testing.T) {
	e := MustParse("x^2 + y^2 + z^2 - 3*x*z")
	rng := rand.New(rand.NewPCG(2, 9))
	for trial := 0; trial < 30; trial++ {
		v, f := randomTet(rng, 1)
		m, err := e.Model3(v, 2)
		if err != nil {
			t.Fatal(err)
		}
		if m.R != (interval.I{}) {
			t.Fatalf("remainder %v, want [0, 0]", m.R)
		}
		a, b, c := 0.125, 0.25, 0.5
		got := evalModel3(m, a, b, c)
		p := exactPoint(f, a, b, c)
		want := new(big.Rat)
		for i := 0; i < 3; i++ {
			want.Add(want, new(big.Rat).Mul(p[i], p[i]))
		}
		want.Sub(want, new(big.Rat).Mul(big.NewRat(3, 1), new(big.Rat).Mul(p[0], p[2])))
		if !ratIn(got, want) {
			t.Fatalf("model %v misses %s", got, want.FloatString(20))
		}
		if got.Wid() > 1e-13 {
			t.Errorf("model value %v too wide", got)
		}
	}
}

// RangeTetrahedron contains the values at the vertices and refuses a
// domain error on the box.
func TestRangeTetrahedron(t *testing.T) {
	v := [4][3]interval.I{}
	pts := [4][3]float64{{0, 0, 0}, {1, 0, 0}, {0, 1, 0}, {0, 0, 1}}
	for a := range v {
		for c := range v[a] {
			v[a][c] = interval.Point(pts[a][c])
		}
	}
	r, err := MustParse("x + 2*y + 3*z").RangeTetrahedron(v)
	if err != nil || !r.Contains(0) || !r.Contains(3) || r.Hi > 6 {
		t.Errorf("range %v, %v; want ⊇ [0, 3] within the box [0, 6]", r, err)
	}
	if _, err := MustParse("log(x)").RangeTetrahedron(v); err == nil {
		t.Error("log(x) on a tetrahedron touching x = 0: no error")
	}
}

// A kink along a face that is not axis-parallel: |x − y| and max(x, y) on
// the tetrahedron (0,0,0), (0,0,1), (0,1,1), (1,1,1) (inside x ≤ y, with
// a face on x = y) take the branch y − x, resp. y, on the whole
// tetrahedron: exact models (zero remainder) whose values contain the
// exact ones, although the bounding box straddles x = y.
func TestModel3KinkAlongSlantedFace(t *testing.T) {
	pts := [4][3]float64{{0, 0, 0}, {0, 0, 1}, {0, 1, 1}, {1, 1, 1}}
	var v [4][3]interval.I
	for a := range v {
		for c := range v[a] {
			v[a][c] = interval.Point(pts[a][c])
		}
	}
	for _, src := range []string{"abs(x - y)", "max(x, y) - y + (y - x)"} {
		m, err := MustParse(src).Model3(v, 1)
		if err != nil {
			t.Fatalf("%s: %v", src, err)
		}
		if m.R != (interval.I{}) {
			t.Errorf("%s: remainder %v, want [0, 0]", src, m.R)
		}
		rng := rand.New(rand.NewPCG(1, 1))
		for k := 0; k < 20; k++ {
			a, b, c := rng.Float64()/3, rng.Float64()/3, rng.Float64()/3
			p := exactPoint(pts, a, b, c)
			want := new(big.Rat).Sub(p[1], p[0]) // y − x ≥ 0 inside
			if got := evalModel3(m, a, b, c); !ratIn(got, want) {
				t.Fatalf("%s: model %v misses %s", src, got, want.FloatString(20))
			}
		}
	}
	// Without a decided sign (a tetrahedron across x = y) the kink is an
	// error, not a wrong model.
	v[0] = [3]interval.I{interval.Point(1), interval.Point(0), interval.Point(0)}
	if _, err := MustParse("abs(x - y)").Model3(v, 1); err == nil {
		t.Error("a kink inside the tetrahedron gave a model")
	}
}
