package formula

import (
	"errors"
	"math/big"
	"math/rand/v2"
	"testing"

	"gapcert/interval"
)

// TestModel3KinksOnRandomTetrahedra checks containment for a potential
// with three kinks along slanted planes, abs(x + y − 1)(1 + z²) +
// min(x, 2y − z) + x·max(3z − x, y), on random tetrahedra (fixed seed):
// half of them with a face on the plane x + y = 1 (vertices (a, 1 − a, c)
// with dyadic a, c, exact in float64) and the fourth vertex on either
// side, the others anywhere near a random point of [0, 1]³ (every vertex
// within 1/16 of a centre per coordinate). Model3 either returns a
// *SmoothnessError (a kink it cannot decide) or a model whose value at
// random points contains the exact value computed in math/big; the tests
// also require that the face-on-the-plane tetrahedra are modelled (the
// abs kink decided on the tetrahedron) at least once in a while.
func TestModel3KinksOnRandomTetrahedra(t *testing.T) {
	e := MustParse("abs(x + y - 1)*(1 + z^2) + min(x, 2*y - z) + x*max(3*z - x, y)")
	exact := func(p [3]*big.Rat) *big.Rat {
		x, y, z := p[0], p[1], p[2]
		r := new(big.Rat).Add(x, y)
		r.Sub(r, big.NewRat(1, 1))
		r.Abs(r)
		zz := new(big.Rat).Mul(z, z)
		r.Mul(r, zz.Add(zz, big.NewRat(1, 1)))
		b := new(big.Rat).Mul(big.NewRat(2, 1), y)
		b.Sub(b, z)
		if x.Cmp(b) < 0 {
			r.Add(r, x)
		} else {
			r.Add(r, b)
		}
		a := new(big.Rat).Mul(big.NewRat(3, 1), z)
		a.Sub(a, x)
		if a.Cmp(y) < 0 {
			a.Set(y)
		}
		return r.Add(r, a.Mul(a, x))
	}
	rng := rand.New(rand.NewPCG(14, 7))
	// dyadic returns a multiple of 1/1024 within 1/16 of c (exact floats).
	dyadic := func(c float64) float64 { return float64(int(c*1024)+rng.IntN(129)-64) / 1024 }
	modelled, onPlane, refused := 0, 0, 0
	for trial := 0; trial < 400; trial++ {
		var f [4][3]float64
		plane := trial%2 == 0
		cen := [3]float64{rng.Float64(), rng.Float64(), rng.Float64()}
		if plane {
			cen[1] = 1 - cen[0]
		}
		for a := range f {
			if plane && a < 3 {
				s := dyadic(cen[0])
				f[a] = [3]float64{s, 1 - s, dyadic(cen[2])}
				continue
			}
			f[a] = [3]float64{dyadic(cen[0]), dyadic(cen[1]), dyadic(cen[2])}
		}
		var v [4][3]interval.I
		for a := range v {
			for c := range v[a] {
				v[a][c] = interval.Point(f[a][c])
			}
		}
		m, err := e.Model3(v, 3)
		if err != nil {
			var se *SmoothnessError
			if !errors.As(err, &se) {
				t.Fatalf("trial %d: %v", trial, err)
			}
			refused++
			continue
		}
		modelled++
		if plane {
			onPlane++
		}
		for k := 0; k < 30; k++ {
			a, b, c := rng.Float64(), rng.Float64(), rng.Float64()
			if a+b+c > 1 {
				continue
			}
			got := evalModel3(m, a, b, c)
			if want := exact(exactPoint(f, a, b, c)); !ratIn(got, want) {
				t.Fatalf("trial %d: model %v misses the exact value %s at (%g, %g, %g) of %v", trial, got, want.FloatString(20), a, b, c, f)
			}
		}
	}
	t.Logf("%d tetrahedra modelled (%d with a face on x + y = 1), %d refused", modelled, onPlane, refused)
	if onPlane < 100 {
		t.Errorf("only %d tetrahedra with a face on the kink plane were modelled", onPlane)
	}
}
