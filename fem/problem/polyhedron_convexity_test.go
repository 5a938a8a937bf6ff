package problem

import (
	"fmt"
	"math"
	"math/big"
	"math/rand"
	"testing"
)

// convexTruth decides convexity of a closed embedded polyhedron with
// rational vertices in exact arithmetic, independently of the reader: it
// is convex if and only if, for every face, no two vertices lie strictly
// on opposite sides of the face's plane (all vertices on one closed side
// puts P in that half-space, which must then be the inner one; common
// practice geometry). The plane is spanned by the first three vertices of
// the face that are not collinear, so a non-planar face makes it report
// not convex as well (the reader refuses such faces).
func convexTruth(v [][3]*big.Rat, faces [][]int) bool {
	sub := func(a, b [3]*big.Rat) [3]*big.Rat {
		var d [3]*big.Rat
		for k := range 3 {
			d[k] = new(big.Rat).Sub(a[k], b[k])
		}
		return d
	}
	cross := func(a, b [3]*big.Rat) [3]*big.Rat {
		m := func(x, y, z, w *big.Rat) *big.Rat {
			return new(big.Rat).Sub(new(big.Rat).Mul(x, y), new(big.Rat).Mul(z, w))
		}
		return [3]*big.Rat{m(a[1], b[2], a[2], b[1]), m(a[2], b[0], a[0], b[2]), m(a[0], b[1], a[1], b[0])}
	}
	dot := func(a, b [3]*big.Rat) *big.Rat {
		s := new(big.Rat)
		for k := range 3 {
			s.Add(s, new(big.Rat).Mul(a[k], b[k]))
		}
		return s
	}
	for _, f := range faces {
		var n [3]*big.Rat
		found := false
		for j := 1; j+1 < len(f) && !found; j++ {
			n = cross(sub(v[f[j]], v[f[0]]), sub(v[f[j+1]], v[f[0]]))
			found = n[0].Sign() != 0 || n[1].Sign() != 0 || n[2].Sign() != 0
		}
		pos, neg := false, false
		for _, q := range v {
			switch dot(sub(q, v[f[0]]), n).Sign() {
			case 1:
				pos = true
			case -1:
				neg = true
			}
		}
		if pos && neg {
			return false
		}
	}
	return true
}

// separates reports whether vertex k lies strictly on one side of the
// plane of face f (its first three vertices) and some vertex strictly on
// the other.
func separates(v [][3]*big.Rat, f []int, k int) bool {
	side := func(q [3]*big.Rat) int {
		var a, b, c [3]*big.Rat
		for i := range 3 {
			a[i] = new(big.Rat).Sub(v[f[1]][i], v[f[0]][i])
			b[i] = new(big.Rat).Sub(v[f[2]][i], v[f[0]][i])
			c[i] = new(big.Rat).Sub(q[i], v[f[0]][i])
		}
		m := func(x, y, z, w *big.Rat) *big.Rat {
			return new(big.Rat).Sub(new(big.Rat).Mul(x, y), new(big.Rat).Mul(z, w))
		}
		d := new(big.Rat).Mul(c[0], m(a[1], b[2], a[2], b[1]))
		d.Add(d, new(big.Rat).Mul(c[1], m(a[2], b[0], a[0], b[2])))
		d.Add(d, new(big.Rat).Mul(c[2], m(a[0], b[1], a[1], b[0])))
		return d.Sign()
	}
	s := side(v[k])
	if s == 0 {
		return false
	}
	for _, q := range v {
		if side(q) == -s {
			return true
		}
	}
	return false
}

// ringBipyramid returns a bipyramid over a ring of m points on rational
// directions ((1 − t²)/(1 + t²), 2t/(1 + t²)) with random radii and
// heights, and apexes (0, 0, ±h): star-shaped from the origin, convex or
// not depending on the draw.
func ringBipyramid(rng *rand.Rand, m int) ([][3]*big.Rat, [][]int) {
	var v [][3]*big.Rat
	// Half-angle tangents spread over (−∞, ∞): directions around the circle.
	for k := range m {
		// t = tan(θ/2), θ = 2π(k + jitter)/m, chosen as a rational near it.
		theta := 2 * math.Pi * (float64(k) + 0.3*rng.Float64()) / float64(m)
		tf := math.Tan(theta / 2)
		tf = math.Max(-1<<20, math.Min(tf, 1<<20)) // θ near π: a direction near (−1, 0)
		t := new(big.Rat).SetFrac64(int64(tf*64), 64)
		t2 := new(big.Rat).Mul(t, t)
		den := new(big.Rat).Add(big.NewRat(1, 1), t2)
		c := new(big.Rat).Quo(new(big.Rat).Sub(big.NewRat(1, 1), t2), den)
		s := new(big.Rat).Quo(new(big.Rat).Mul(big.NewRat(2, 1), t), den)
		r := []*big.Rat{big.NewRat(1, 1), big.NewRat(1, 1), big.NewRat(3, 4), big.NewRat(5, 4), big.NewRat(1, 2)}[rng.Intn(5)]
		z := big.NewRat(int64(rng.Intn(9)-4), 16)
		if rng.Intn(2) == 0 {
			z = new(big.Rat)
		}
		v = append(v, [3]*big.Rat{new(big.Rat).Mul(r, c), new(big.Rat).Mul(r, s), z})
	}
	h := big.NewRat(int64(1+rng.Intn(4)), 2)
	v = append(v, [3]*big.Rat{new(big.Rat), new(big.Rat), h}, [3]*big.Rat{new(big.Rat), new(big.Rat), new(big.Rat).Neg(h)})
	var faces [][]int
	for k := range m {
		faces = append(faces, []int{m, k, (k + 1) % m}, []int{m + 1, (k + 1) % m, k})
	}
	return v, faces
}

// prismOver returns the prism of height 1 over the polygon p (counter-
// clockwise), with its top and bottom as single faces and quadrilateral
// sides.
func prismOver(p [][2]*big.Rat) ([][3]*big.Rat, [][]int) {
	m := len(p)
	var v [][3]*big.Rat
	for _, z := range []int64{0, 1} {
		for _, q := range p {
			v = append(v, [3]*big.Rat{q[0], q[1], big.NewRat(z, 1)})
		}
	}
	bottom, top := make([]int, m), make([]int, m)
	for k := range m {
		bottom[k], top[k] = m-1-k, m+k
	}
	faces := [][]int{bottom, top}
	for k := range m {
		faces = append(faces, []int{k, (k + 1) % m, m + (k+1)%m, m + k})
	}
	return v, faces
}

// texts writes the vertices as rationals, or each times the factor
// (a formula read by its enclosure only), which keeps the convexity.
func texts(v [][3]*big.Rat, factor string) [][3]string {
	out := make([][3]string, len(v))
	for i, p := range v {
		for k := range 3 {
			out[i][k] = p[k].RatString()
			if factor != "" && p[k].Sign() != 0 {
				out[i][k] = fmt.Sprintf("%s*(%s)", factor, p[k].RatString())
			}
		}
	}
	return out
}

// TestPolyhedronConvexityAgreesWithExactTruth: the reader's convexity
// verdict on random star-shaped bipyramids (triangles) and prisms over
// random polygons (a face of m vertices and quadrilaterals), with exact
// rational coordinates and with coordinates scaled by exp(1) or cos(1)
// (enclosures only), never says convex for a solid that is not, nor not
// convex for one that is. Each polyhedron the reader accepts counts.
func TestPolyhedronConvexityAgreesWithExactTruth(t *testing.T) {
	rng := rand.New(rand.NewSource(2026))
	counts := map[string]int{}
	check := func(what string, v [][3]*big.Rat, faces [][]int) {
		truth := convexTruth(v, faces)
		for _, factor := range []string{"", "exp(1)", "cos(1)"} {
			p, err := Parse(polyFile(texts(v, factor), faces, `"dirichlet"`))
			if err != nil {
				counts["refused"]++
				continue
			}
			got := p.Convex()
			counts[fmt.Sprintf("%s %q truth %v: %s", what, factor, truth, got)]++
			if got == "convex" && !truth || got == "not convex" && truth {
				t.Errorf("%s × %q: verdict %q, exact truth convex=%v\nvertices %v\nfaces %v", what, factor, got, truth, texts(v, ""), faces)
			}
			if got == "not convex" {
				vtx, face, ok := p.Polyhedron.ReentrantVertex()
				if !ok || !separates(v, faces[face], vtx) {
					t.Errorf("%s × %q: witness vertex %d, face %d (%v) does not show non-convexity", what, factor, vtx, face, ok)
				}
			}
		}
	}
	for trial := 0; trial < 60; trial++ {
		v, faces := ringBipyramid(rng, 3+rng.Intn(6))
		check("bipyramid", v, faces)
	}
	for trial := 0; trial < 40; trial++ {
		m := 4 + rng.Intn(4)
		// A star-shaped polygon: rational directions, radii 1 or 1/2.
		var p [][2]*big.Rat
		v, _ := ringBipyramid(rng, m)
		for k := range m {
			p = append(p, [2]*big.Rat{v[k][0], v[k][1]})
		}
		pv, pf := prismOver(p)
		check("prism", pv, pf)
	}
	var convex, notConvex, accepted int
	for k, n := range counts {
		t.Logf("%4d %s", n, k)
		switch {
		case k == "refused":
		case len(k) > 10 && k[len(k)-10:] == "not convex":
			notConvex += n
			accepted += n
		case len(k) > 6 && k[len(k)-6:] == "convex":
			convex += n
			accepted += n
		default:
			accepted += n
		}
	}
	if convex < 20 || notConvex < 20 {
		t.Errorf("too few decided polyhedra: %d convex, %d not convex of %d accepted", convex, notConvex, accepted)
	}
}
