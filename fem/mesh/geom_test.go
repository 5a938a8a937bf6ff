package mesh

import (
	"math"
	"math/big"
	"testing"

	"gapcert/interval"
)

const prec = 200 // bits of the math/big reference values (≈ 60 digits)

func bigOf(x float64) *big.Float { return new(big.Float).SetPrec(prec).SetFloat64(x) }

func bigSqrt(x *big.Float) *big.Float { return new(big.Float).SetPrec(prec).Sqrt(x) }

// containsBig reports whether x ∋ v.
func containsBig(x interval.I, v *big.Float) bool {
	return bigOf(x.Lo).Cmp(v) <= 0 && v.Cmp(bigOf(x.Hi)) <= 0
}

// ulps returns the width of x in units of the last place of its magnitude.
func ulps(x interval.I) float64 {
	m := math.Max(math.Abs(x.Lo), math.Abs(x.Hi))
	return x.Wid() / (math.Nextafter(m, math.Inf(1)) - m)
}

// TestGeomEquilateral checks Geom on the red refinements of the
// equilateral triangle with vertices (0, 0), (1, 0), (1/2, √3/2): every
// child at level k is equilateral with side s = 2^−k, area √3 s²/4, and
// barycentric gradients of length 2/(√3 s) normal to its edges, which are
// ±s times the parent's edge vectors (elementary geometry). The exact
// values come from math/big at 200 bits; every enclosure must contain them
// and stay within a few ulps however deep the refinement.
func TestGeomEquilateral(t *testing.T) {
	_, m := parsePolygon(t, testPolygons[1].file)
	sqrt3 := bigSqrt(bigOf(3))
	// Unit edge vectors of the coarse triangle, both signs.
	var dirs [][2]*big.Float
	half := bigOf(0.5)
	h3 := new(big.Float).SetPrec(prec).Quo(sqrt3, bigOf(2))
	for _, d := range [][2]*big.Float{{bigOf(1), bigOf(0)}, {new(big.Float).Neg(half), h3}, {new(big.Float).Neg(half), new(big.Float).Neg(h3)}} {
		dirs = append(dirs, d, [2]*big.Float{new(big.Float).Neg(d[0]), new(big.Float).Neg(d[1])})
	}
	worst := 0.0
	for k := 0; k <= 7; k++ {
		s := math.Ldexp(1, -k)
		area := new(big.Float).SetPrec(prec).Mul(sqrt3, bigOf(s*s/4))
		gradLen := new(big.Float).SetPrec(prec).Quo(bigOf(2/s), sqrt3)
		for tr := range m.Tris {
			g := m.Geom(tr)
			if !containsBig(g.Area, area) {
				t.Fatalf("level %d triangle %d: area %v misses √3/4·%v", k, tr, g.Area, s*s)
			}
			worst = math.Max(worst, ulps(g.Area))
			for i := 0; i < 3; i++ {
				if !g.EdgeLen[i].Contains(s) {
					t.Fatalf("level %d triangle %d: edge length %v misses %v", k, tr, g.EdgeLen[i], s)
				}
				worst = math.Max(worst, ulps(g.EdgeLen[i]))
				// ∇λ_i = |∇λ_i|·rot(d) for one of the six directions d.
				found := 0
				for _, d := range dirs {
					gx := new(big.Float).SetPrec(prec).Mul(gradLen, new(big.Float).Neg(d[1]))
					gy := new(big.Float).SetPrec(prec).Mul(gradLen, d[0])
					if containsBig(g.Grad[i][0], gx) && containsBig(g.Grad[i][1], gy) {
						found++
					}
				}
				if found != 1 {
					t.Fatalf("level %d triangle %d: gradient %d %v matches %d exact directions", k, tr, i, g.Grad[i], found)
				}
				for c := 0; c < 2; c++ {
					if g.Grad[i][c].Mag() > 0.1 { // components ≈ 0 are 0 or a tiny exact interval
						worst = math.Max(worst, ulps(g.Grad[i][c]))
					}
				}
			}
		}
		m = m.Refine()
	}
	t.Logf("widest Geom enclosure: %.0f ulps", worst)
	if worst > 8 {
		t.Errorf("Geom enclosures up to %v ulps wide", worst)
	}
}

// TestGeomDyadic checks Geom against exact rational geometry on meshes of
// polygons with small integer vertices, whose nodes (midpoints of dyadic
// points) are exact floats: the area ½ (P1 − P0) × (P2 − P0), the gradients
// (−e_y, e_x)/(2|T|) and the squared edge lengths are computed in big.Rat
// from the nodes and must be contained, with narrow enclosures.
func TestGeomDyadic(t *testing.T) {
	for _, tc := range []struct{ polygon, corner int }{{0, 0}, {2, 3}} {
		pol := tc.polygon
		_, m := parsePolygon(t, testPolygons[pol].file)
		for _, g := range []*Mesh{m.Refine().Refine().Refine(), m.Refine().RefineGraded(tc.corner, 10)} {
			worst := 0.0
			for tr := range g.Tris {
				var p [3][2]*big.Rat
				for j, v := range g.Vertices(tr) {
					if !v[0].IsPoint() || !v[1].IsPoint() {
						t.Fatalf("node %v of triangle %d is not a float point", v, tr)
					}
					p[j] = [2]*big.Rat{new(big.Rat).SetFloat64(v[0].Lo), new(big.Rat).SetFloat64(v[1].Lo)}
				}
				sub := func(a, b *big.Rat) *big.Rat { return new(big.Rat).Sub(a, b) }
				mul := func(a, b *big.Rat) *big.Rat { return new(big.Rat).Mul(a, b) }
				area := mul(big.NewRat(1, 2), sub(mul(sub(p[1][0], p[0][0]), sub(p[2][1], p[0][1])), mul(sub(p[1][1], p[0][1]), sub(p[2][0], p[0][0]))))
				geom := g.Geom(tr)
				if !containsRat(geom.Area, area) {
					t.Fatalf("triangle %d: area %v misses %v", tr, geom.Area, area.FloatString(20))
				}
				worst = math.Max(worst, ulps(geom.Area))
				twice := mul(big.NewRat(2, 1), area)
				for i := 0; i < 3; i++ {
					a, b := p[(i+1)%3], p[(i+2)%3]
					ex, ey := sub(b[0], a[0]), sub(b[1], a[1])
					gx, gy := new(big.Rat).Quo(new(big.Rat).Neg(ey), twice), new(big.Rat).Quo(ex, twice)
					if !containsRat(geom.Grad[i][0], gx) || !containsRat(geom.Grad[i][1], gy) {
						t.Fatalf("triangle %d: gradient %d %v misses (%v, %v)", tr, i, geom.Grad[i], gx, gy)
					}
					l2 := new(big.Rat).Add(mul(ex, ex), mul(ey, ey))
					if !containsRat(geom.EdgeLen[i].Sqr(), l2) {
						t.Fatalf("triangle %d: edge length %v misses √%v", tr, geom.EdgeLen[i], l2)
					}
					worst = math.Max(worst, ulps(geom.EdgeLen[i]))
					for c := 0; c < 2; c++ {
						if !geom.Grad[i][c].IsPoint() {
							worst = math.Max(worst, ulps(geom.Grad[i][c]))
						}
					}
				}
			}
			if worst > 4 {
				t.Errorf("%s: Geom enclosures up to %v ulps wide", testPolygons[pol].name, worst)
			}
		}
	}
}

func containsRat(x interval.I, v *big.Rat) bool {
	lo, hi := new(big.Rat).SetFloat64(x.Lo), new(big.Rat).SetFloat64(x.Hi)
	return lo.Cmp(v) <= 0 && v.Cmp(hi) <= 0
}

// TestPentagonArea checks that the areas of a refined and graded regular
// pentagon with circumradius 1 add up to an enclosure of its exact area
// (5/2) sin(2π/5) = (5/8)√(10 + 2√5) (elementary geometry), 200-bit
// math/big, with a relative width below 1e-12.
func TestPentagonArea(t *testing.T) {
	_, m := parsePolygon(t, testPolygons[3].file)
	exact := bigSqrt(new(big.Float).SetPrec(prec).Add(bigOf(10), new(big.Float).SetPrec(prec).Mul(bigOf(2), bigSqrt(bigOf(5)))))
	exact.Mul(exact, bigOf(5.0/8))
	for _, g := range []*Mesh{m.Refine().Refine().Refine().Refine(), m.Refine().RefineGraded(0, 8).Refine()} {
		sum := interval.Point(0)
		for tr := range g.Tris {
			sum = sum.Add(g.Geom(tr).Area)
		}
		if !containsBig(sum, exact) {
			t.Errorf("%d triangles: areas add up to %v, exact %v", len(g.Tris), sum, exact.Text('g', 20))
		}
		rel := sum.Wid() / sum.Mid()
		t.Logf("%d triangles: relative width %.2g", len(g.Tris), rel)
		if rel > 1e-12 {
			t.Errorf("%d triangles: relative width %v of the area sum", len(g.Tris), rel)
		}
	}
}
