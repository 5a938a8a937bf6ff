package groundstate

import (
	"math"
	"math/rand"
	"testing"

	"gapcert/interval"
)

func pointVertices(p [3][2]float64) [3][2]interval.I {
	var v [3][2]interval.I
	for i := range p {
		v[i] = [2]interval.I{interval.Point(p[i][0]), interval.Point(p[i][1])}
	}
	return v
}

// The equilateral triangle of side 1 has inradius √3/6 at its incentre
// (1/2, √3/6) (common practice); at random points of it the radius is the
// distance to the boundary (distTriangle, float) up to rounding, in both
// orientations, and no point of the circle is outside the triangle for
// certain. Points outside or on a side, and degenerate triangles, give
// ok = false.
func TestInscribedRadius(t *testing.T) {
	s3 := math.Sqrt(3)
	tri := [3][2]float64{{0, 0}, {1, 0}, {0.5, s3 / 2}}
	cw := [3][2]float64{tri[0], tri[2], tri[1]}
	R, ok := InscribedRadius(pointVertices(tri), [2]float64{0.5, s3 / 6})
	if !ok || R > s3/6*(1+1e-15) || R < s3/6*(1-1e-14) {
		t.Errorf("incentre: R = %.17g, ok %v, want √3/6 = %.17g", R, ok, s3/6)
	}
	rng := rand.New(rand.NewSource(13))
	for range 1000 {
		p := randomInTriangle(rng)
		for _, vs := range [][3][2]float64{tri, cw} {
			R, ok := InscribedRadius(pointVertices(vs), p)
			d := distTriangle(p)
			if d < 1e-12 {
				continue
			}
			if !ok || math.Abs(R-d) > 1e-13 {
				t.Fatalf("at %v: R = %g, ok %v, distance %g", p, R, ok, d)
			}
			// No circle point is outside for certain: barycentric-free test
			// by the three side lines, in interval arithmetic.
			for k := range 64 {
				th := interval.Pi().MulF(2 * float64(k) / 64)
				cx := interval.Point(p[0]).Add(interval.Cos(th).MulF(R))
				cy := interval.Point(p[1]).Add(interval.Sin(th).MulF(R))
				// the sides y = 0, y = √3x, y = √3(1 − x)
				sq3, _ := interval.Point(3).Sqrt()
				if cy.Hi < 0 || sq3.Mul(cx).Sub(cy).Hi < 0 || sq3.Mul(interval.Point(1).Sub(cx)).Sub(cy).Hi < 0 {
					t.Fatalf("at %v, R = %g: circle point (%v, %v) outside", p, R, cx, cy)
				}
			}
		}
	}
	for _, p := range [][2]float64{{0.5, 0}, {2, 0.1}, {0.5, -1e-300}, {0, 0}} {
		if R, ok := InscribedRadius(pointVertices(tri), p); ok {
			t.Errorf("%v: ok with R = %g", p, R)
		}
	}
	if _, ok := InscribedRadius(pointVertices([3][2]float64{{0, 0}, {1, 1}, {2, 2}}), [2]float64{1, 1}); ok {
		t.Error("degenerate triangle accepted")
	}
	// Vertex enclosures: the radius holds for every exact vertex in them.
	v := pointVertices(tri)
	v[2][1] = interval.New(s3/2-1e-3, s3/2+1e-3)
	Rw, ok := InscribedRadius(v, [2]float64{0.3, 0.3})
	Rn, _ := InscribedRadius(pointVertices(tri), [2]float64{0.3, 0.3})
	if !ok || Rw >= Rn {
		t.Errorf("wide vertex: R = %g, point vertices %g", Rw, Rn)
	}
}
