package hypothesis

import (
	"fmt"
	"math"
	"math/big"
	"strings"
	"testing"

	"gapcert/certs"
)

// solidFile returns the domain text of the polyhedron with the given
// vertices (exact coordinate texts) and faces (index cycles, either
// orientation).
func solidFile(vs [][3]string, faces [][]int) string {
	var v, f []string
	for _, x := range vs {
		v = append(v, fmt.Sprintf(`["%s","%s","%s"]`, x[0], x[1], x[2]))
	}
	for _, c := range faces {
		f = append(f, strings.ReplaceAll(fmt.Sprint(c), " ", ","))
	}
	return `{"polyhedron": {"vertices": [` + strings.Join(v, ",") + `], "faces": [` + strings.Join(f, ",") + `]}}`
}

// hexahedronFaces are the faces of a hexahedron whose vertices 0–3 are
// the bottom quadrilateral and 4–7 the top one above them, in the same
// cyclic order.
var hexahedronFaces = [][]int{{0, 3, 2, 1}, {4, 5, 6, 7}, {0, 1, 5, 4}, {1, 2, 6, 5}, {2, 3, 7, 6}, {3, 0, 4, 7}}

// parallelepiped returns the hexahedron with bottom face the rectangle
// [0, w] × [0, d] at z = 0 and top face that rectangle shifted by
// (sx, 0, h): a right prism over the rectangle when sx = 0, oblique
// otherwise.
func parallelepiped(w, d, sx, h string) string {
	return solidFile([][3]string{
		{"0", "0", "0"}, {w, "0", "0"}, {w, d, "0"}, {"0", d, "0"},
		{sx, "0", h}, {w + "+" + sx, "0", h}, {w + "+" + sx, d, h}, {sx, d, h},
	}, hexahedronFaces)
}

// rigidMotion returns the box [0, a] × [0, b] × [0, c] (faces
// hexahedronFaces) under x ↦ Rx + s, with the rational rotation
// R = (1/3)·[[2, −1, 2], [2, 2, −1], [−1, 2, 2]] (orthogonal: its rows are
// orthonormal, checked here) and s = (1/7, −2, 5/3); the coordinates are
// exact rationals.
func rigidMotion(t *testing.T, a, b, c int64) string {
	r := [3][3]*big.Rat{}
	for i, row := range [3][3]int64{{2, -1, 2}, {2, 2, -1}, {-1, 2, 2}} {
		for j, x := range row {
			r[i][j] = big.NewRat(x, 3)
		}
	}
	for i := range 3 {
		for j := range 3 {
			d := new(big.Rat)
			for k := range 3 {
				d.Add(d, new(big.Rat).Mul(r[i][k], r[j][k]))
			}
			want := int64(0)
			if i == j {
				want = 1
			}
			if d.Cmp(big.NewRat(want, 1)) != 0 {
				t.Fatalf("R is not orthogonal: row %d · row %d = %v", i, j, d)
			}
		}
	}
	shift := [3]*big.Rat{big.NewRat(1, 7), big.NewRat(-2, 1), big.NewRat(5, 3)}
	var vs [][3]string
	for _, z := range []int64{0, c} {
		for _, xy := range [][2]int64{{0, 0}, {a, 0}, {a, b}, {0, b}} {
			p := [3]int64{xy[0], xy[1], z}
			var q [3]string
			for i := range 3 {
				s := new(big.Rat).Set(shift[i])
				for k := range 3 {
					s.Add(s, new(big.Rat).Mul(r[i][k], big.NewRat(p[k], 1)))
				}
				q[i] = s.RatString()
			}
			vs = append(vs, q)
		}
	}
	return solidFile(vs, hexahedronFaces)
}

// pyramid returns the pyramid over the unit square [0, 1]² at z = 0 with
// apex (ax, ay, h).
func pyramid(ax, ay, h string) string {
	return solidFile([][3]string{{"0", "0", "0"}, {"1", "0", "0"}, {"1", "1", "0"}, {"0", "1", "0"}, {ax, ay, h}},
		[][]int{{0, 3, 2, 1}, {0, 1, 4}, {1, 2, 4}, {2, 3, 4}, {3, 0, 4}})
}

// regularPyramid returns the pyramid over the regular n-gon inscribed in
// the unit circle at z = 0 (coordinates cos, sin of 2πk/n) with apex
// (0, 0, h).
func regularPyramid(n int, h string) string {
	var vs [][3]string
	base := make([]int, n)
	var faces [][]int
	for k := range n {
		vs = append(vs, [3]string{fmt.Sprintf("cos(2*pi*%d/%d)", k, n), fmt.Sprintf("sin(2*pi*%d/%d)", k, n), "0"})
		base[k] = k
		faces = append(faces, []int{k, (k + 1) % n, n})
	}
	vs = append(vs, [3]string{"0", "0", h})
	return solidFile(vs, append(faces, base))
}

// truncatedTetrahedron returns the Archimedean truncated tetrahedron:
// the regular tetrahedron with vertices (3, 3, 3), (3, −3, −3),
// (−3, 3, −3), (−3, −3, 3) cut at a third of every edge, so its vertices
// are (2a + b)/3 over the ordered edges (a, b), the permutations of
// (3, 1, 1) with an even number of minus signs. Its four triangles lie
// in planes at distance 5/√3 from the centre (the triangle near (3, 3, 3)
// is (3, 1, 1), (1, 3, 1), (1, 1, 3), in x + y + z = 5), its four hexagons
// at distance 3/√3 (the hexagon in the tetrahedron's face x + y + z = −3),
// so no ball touches all eight faces (derived here).
func truncatedTetrahedron() string {
	a := [4][3]int{{3, 3, 3}, {3, -3, -3}, {-3, 3, -3}, {-3, -3, 3}}
	index := map[[2]int]int{}
	var vs [][3]string
	at := func(i, j int) int { // the vertex (2a_i + a_j)/3
		if k, ok := index[[2]int{i, j}]; ok {
			return k
		}
		var q [3]string
		for c := range 3 {
			q[c] = fmt.Sprint((2*a[i][c] + a[j][c]) / 3)
		}
		index[[2]int{i, j}] = len(vs)
		vs = append(vs, q)
		return len(vs) - 1
	}
	var faces [][]int
	for i := range 4 {
		var tri []int
		for j := range 4 {
			if j != i {
				tri = append(tri, at(i, j))
			}
		}
		faces = append(faces, tri)
	}
	for _, f := range [][3]int{{0, 1, 2}, {0, 1, 3}, {0, 2, 3}, {1, 2, 3}} {
		x, y, z := f[0], f[1], f[2]
		faces = append(faces, []int{at(x, y), at(y, x), at(y, z), at(z, y), at(z, x), at(x, z)})
	}
	return solidFile(vs, faces)
}

// rhombicDodecahedron returns the rhombic dodecahedron with vertices
// (±1, ±1, ±1), (±2, 0, 0), (0, ±2, 0), (0, 0, ±2s) (s = "1": the
// Catalan solid; other s: its image under the stretch z ↦ sz, an affine
// map, so the faces stay planar). Its twelve rhombi lie in the planes
// ±x ± y = 2 and ±x ± z/s = 2, ±y ± z/s = 2.
func rhombicDodecahedron(s string) string {
	vs := [][3]string{{"2", "0", "0"}, {"-2", "0", "0"}, {"0", "2", "0"}, {"0", "-2", "0"}, {"0", "0", "2*" + s}, {"0", "0", "-2*" + s}}
	index := map[[3]int]int{}
	for _, x := range []int{1, -1} {
		for _, y := range []int{1, -1} {
			for _, z := range []int{1, -1} {
				index[[3]int{x, y, z}] = len(vs)
				vs = append(vs, [3]string{fmt.Sprint(x), fmt.Sprint(y), fmt.Sprintf("%d*%s", z, s)})
			}
		}
	}
	axis := func(i, sign int) int { return 2*i + (1-sign)/2 } // the vertex 2·sign·e_i
	var faces [][]int
	for _, ij := range [][3]int{{0, 1, 2}, {0, 2, 1}, {1, 2, 0}} {
		i, j, k := ij[0], ij[1], ij[2]
		for _, si := range []int{1, -1} {
			for _, sj := range []int{1, -1} {
				corner := func(sk int) int {
					var c [3]int
					c[i], c[j], c[k] = si, sj, sk
					return index[c]
				}
				faces = append(faces, []int{axis(i, si), corner(1), axis(j, sj), corner(-1)})
			}
		}
	}
	return solidFile(vs, faces)
}

// lPrism is the L-shaped prism ([0, 2]² minus (1, 2]²) × [0, 1], not
// convex (the notch's edge at x = y = 1 is re-entrant).
var lPrism = solidFile([][3]string{
	{"0", "0", "0"}, {"2", "0", "0"}, {"2", "1", "0"}, {"1", "1", "0"}, {"1", "2", "0"}, {"0", "2", "0"},
	{"0", "0", "1"}, {"2", "0", "1"}, {"2", "1", "1"}, {"1", "1", "1"}, {"1", "2", "1"}, {"0", "2", "1"},
}, [][]int{{0, 5, 4, 3, 2, 1}, {6, 7, 8, 9, 10, 11}, {0, 1, 7, 6}, {1, 2, 8, 7}, {2, 3, 9, 8}, {3, 4, 10, 9}, {4, 5, 11, 10}, {5, 0, 6, 11}})

// TestCircumsolidShapes decides the inscribed ball and the product of
// circumsolids on solids whose answer is derived by hand:
//
//   - the regular octahedron with vertices ±e_i (edge a = √2): its faces
//     lie in the planes ±x ± y ± z = 1 at distance 1/√3 = a/√6 from the
//     origin (derived here; the inradius a/√6 = a√6/6 of the regular
//     octahedron is also in D. Zwillinger (ed.), CRC Standard
//     Mathematical Tables and Formulae, regular polyhedra, recalled from
//     memory), and with vertices ±e_i/√2 (edge 1, surd coordinates) at
//     distance 1/√6;
//   - a cube and a 2 × 1 × 1 box moved by a rotation with rational entries
//     and a translation (see rigidMotion): a rigid motion keeps the ball
//     and the product structure, so inradius 1/2, and a box;
//   - the oblique parallelepiped over [0, 5/4] × [0, 1] shifted by
//     (3/4, 0, 1): its three pairs of parallel faces are at distances 1
//     (z), 1 (y) and (5/4)·1/√(1 + 9/16) = 1 (the slanted pair, width
//     times cosine of the slant), so the ball of radius 1/2 about its
//     centre touches all six faces: a circumsolid, though no right prism
//     over its base (3·volume/surface area = 3·(5/4)/(15/2) = 1/2);
//   - the oblique prism over the unit square shifted by (3/5, 0, 4/5):
//     the distances of the parallel pairs are 4/5 (z), 1 (y), 4/5
//     (slanted), so no inscribed ball; but it is the right prism of
//     height 1 in y over its face y = 0, the rhombus (0, 0), (1, 0),
//     (8/5, 4/5), (3/5, 4/5) of side 1 (tangential: a rhombus has an
//     incircle, common practice), so a product;
//   - the oblique prism over the unit square shifted by (1/2, 0, 1):
//     distances 1, 1, 1/√(5/4), no ball; the right prism over its face
//     y = 0, the parallelogram of sides 1 and √5/2, which is neither
//     tangential (Pitot's condition, equal sums of opposite sides, common
//     practice, holds for a parallelogram only when it is a rhombus) nor
//     a rectangle; its slanted faces
//     and z faces are no right prism bases (no vertex lies on the normal
//     through another), so no product;
//   - a pyramid over a tangential base with apex at height h above the
//     incentre (inradius ρ) is a circumsolid: every lateral plane
//     contains a side's line at distance ρ from the axis and the apex, so
//     the point at height r on the axis has distance ρ(h − r)/√(h² + ρ²)
//     from each, equal to r for r = ρh/(ρ + √(h² + ρ²)) (derived here).
//     Unit square, ρ = 1/2: h = 2/3 gives r = 1/4, h = 1 gives
//     r = 1/(1 + √5); the regular pentagon of circumradius 1, ρ =
//     cos(π/5), h = 1 gives r = ρ/(ρ + √(1 + ρ²));
//   - the pyramid over the unit square with apex (1/2, b, h), b ≠ 1/2:
//     by symmetry in x the centre has x = 1/2, and the four lateral
//     planes force h = r(1 + 2√(h² + 1/4)) and h = r(1 + √(h² + b²) +
//     √(h² + (1 − b)²)); f(b) = √(h² + b²) + √(h² + (1 − b)²) is strictly
//     convex with its minimum at b = 1/2 only, so no ball for any b ≠ 1/2,
//     however close (derived here); 5 vertices, so no prism;
//   - the regular hexagon of circumradius 1 has inradius √3/2: the right
//     prism over it of height 1 is a product but has no ball, of height
//     √3 it is a circumsolid;
//   - the regular pentagon of circumradius 1 has inradius cos(π/5) ≈ 0.809:
//     the right prism over it of height √2 (coordinates in Q(ζ_40)) is a
//     product and has no ball (√2/2 ≠ cos(π/5)); of height 2cos(π/5) it
//     is a circumsolid; the right prism over the regular heptagon
//     (coordinates in Q(ζ_7)) of height 1 is a product;
//   - the truncated tetrahedron (see truncatedTetrahedron): no ball, 12
//     vertices but no face whose normal line through one vertex meets
//     another, so no product;
//   - the box [0, 1]² × [0, 1 + 10⁻¹²] (a near miss of the cube): no ball
//     (the z faces are 10⁻¹² farther apart than the others) but a box;
//   - the rhombic dodecahedron (see rhombicDodecahedron): every face plane
//     is at distance 2/√2 = √2 from the origin, a circumsolid of inradius
//     √2 (derived here); stretched by 1 + 10⁻¹² in z, the planes
//     ±x ± z/s = 2 move to distance 2/√(1 + 1/s²) ≠ √2: none, and with
//     14 vertices and rhombic faces no right prism either;
//   - the L-shaped prism: not convex, so neither.
func TestCircumsolidShapes(t *testing.T) {
	nearHalf := "0.500000000001" // 1/2 + 10⁻¹², exactly
	rho5 := math.Cos(math.Pi / 5)
	for _, c := range []struct {
		name, domain        string
		circumsolid, produc string
		inradius            float64 // of a circumsolid
		detail              string  // in the product's detail
	}{
		{"octahedron", solidFile([][3]string{{"1", "0", "0"}, {"-1", "0", "0"}, {"0", "1", "0"}, {"0", "-1", "0"}, {"0", "0", "1"}, {"0", "0", "-1"}},
			[][]int{{0, 2, 4}, {2, 1, 4}, {1, 3, 4}, {3, 0, 4}, {2, 0, 5}, {1, 2, 5}, {3, 1, 5}, {0, 3, 5}}),
			certs.Proven, certs.Proven, 1 / math.Sqrt(3), "a circumsolid"},
		{"octahedron of unit edge", solidFile([][3]string{{"sqrt(2)/2", "0", "0"}, {"-sqrt(2)/2", "0", "0"}, {"0", "sqrt(2)/2", "0"}, {"0", "-sqrt(2)/2", "0"}, {"0", "0", "sqrt(2)/2"}, {"0", "0", "-sqrt(2)/2"}},
			[][]int{{0, 2, 4}, {2, 1, 4}, {1, 3, 4}, {3, 0, 4}, {2, 0, 5}, {1, 2, 5}, {3, 1, 5}, {0, 3, 5}}),
			certs.Proven, certs.Proven, 1 / math.Sqrt(6), "a circumsolid"},
		{"moved cube", rigidMotion(t, 1, 1, 1), certs.Proven, certs.Proven, 0.5, "a circumsolid"},
		{"moved box 2×1×1", rigidMotion(t, 2, 1, 1), certs.Disproven, certs.Proven, 0, "a box"},
		{"oblique circumsolid parallelepiped", parallelepiped("5/4", "1", "3/4", "1"), certs.Proven, certs.Proven, 0.5, "a circumsolid"},
		{"oblique prism, rhombus section", parallelepiped("1", "1", "3/5", "4/5"), certs.Disproven, certs.Proven, 0, "tangential polygon face 2"},
		{"oblique prism, parallelogram section", parallelepiped("1", "1", "1/2", "1"), certs.Disproven, certs.Disproven, 0, ""},
		{"square pyramid h = 2/3", pyramid("1/2", "1/2", "2/3"), certs.Proven, certs.Proven, 0.25, "a circumsolid"},
		{"square pyramid h = 1", pyramid("1/2", "1/2", "1"), certs.Proven, certs.Proven, 1 / (1 + math.Sqrt(5)), "a circumsolid"},
		{"pentagonal pyramid", regularPyramid(5, "1"), certs.Proven, certs.Proven, rho5 / (rho5 + math.Sqrt(1+rho5*rho5)), "a circumsolid"},
		{"square pyramid, apex off the axis", pyramid("1/2", "1/3", "1"), certs.Disproven, certs.Disproven, 0, ""},
		{"square pyramid, apex 1e-12 off the axis", pyramid("1/2", nearHalf, "1"), certs.Disproven, certs.Disproven, 0, ""},
		{"hexagonal prism", prismFile(hexagon(), "1"), certs.Disproven, certs.Proven, 0, "tangential polygon face"},
		{"hexagonal prism of height √3", prismFile(hexagon(), "sqrt(3)"), certs.Proven, certs.Proven, math.Sqrt(3) / 2, "a circumsolid"},
		{"pentagonal prism of height √2", prismFile(regularGon(5), "sqrt(2)"), certs.Disproven, certs.Proven, 0, "tangential polygon face"},
		{"pentagonal prism of height 2cos(π/5)", prismFile(regularGon(5), "2*cos(pi/5)"), certs.Proven, certs.Proven, rho5, "a circumsolid"},
		{"heptagonal prism", prismFile(regularGon(7), "1"), certs.Disproven, certs.Proven, 0, "tangential polygon face"},
		{"truncated tetrahedron", truncatedTetrahedron(), certs.Disproven, certs.Disproven, 0, ""},
		{"box 1e-12 off the cube", parallelepiped("1", "1", "0", "1.000000000001"), certs.Disproven, certs.Proven, 0, "a box"},
		{"rhombic dodecahedron", rhombicDodecahedron("1"), certs.Proven, certs.Proven, math.Sqrt2, "a circumsolid"},
		{"rhombic dodecahedron stretched by 1e-12", rhombicDodecahedron("1.000000000001"), certs.Disproven, certs.Disproven, 0, ""},
		{"L-shaped prism", lPrism, certs.Disproven, certs.Disproven, 0, "not convex"},
	} {
		t.Run(c.name, func(t *testing.T) {
			p := parse(t, problemText(c.domain, "0", `"neumann"`))
			h, _ := Decide(CircumsolidPolyhedron, p)
			requireVerdict(t, "circumsolid", h, c.circumsolid)
			if c.inradius > 0 {
				r := insphereRadius(p.Polyhedron)
				if !r.Contains(c.inradius) && math.Abs(r.Mid()-c.inradius) > 4e-16 || r.Hi-r.Lo > 1e-14 {
					t.Errorf("inradius %v, want %v", r, c.inradius)
				}
			}
			h, _ = Decide(CircumsolidProduct, p)
			requireVerdict(t, "circumsolid_product", h, c.produc)
			if !strings.Contains(h.Detail, c.detail) {
				t.Errorf("product detail %q lacks %q", h.Detail, c.detail)
			}
		})
	}
}

// hexagon returns the regular hexagon of circumradius 1 (exact texts).
func hexagon() [][2]string {
	var out [][2]string
	for k := range 6 {
		out = append(out, [2]string{fmt.Sprintf("cos(pi*%d/3)", k), fmt.Sprintf("sin(pi*%d/3)", k)})
	}
	return out
}

// regularGon returns the regular n-gon of circumradius 1, counterclockwise
// (exact texts cos, sin of 2πk/n).
func regularGon(n int) [][2]string {
	var out [][2]string
	for k := range n {
		out = append(out, [2]string{fmt.Sprintf("cos(2*pi*%d/%d)", k, n), fmt.Sprintf("sin(2*pi*%d/%d)", k, n)})
	}
	return out
}

// TestCircumsolidNearMissEnclosed: the box [0, 1]² × [0, 1 + 2⁻⁴⁰·exp(0)]
// (2⁻⁴⁰ ≈ 9.1·10⁻¹³; exp(0) is not read exactly, but its enclosure is the
// point 1, so the reader can decide the faces planar) is no circumsolid,
// decided by enclosures (the residual, about 10⁻¹², is far wider than
// rounding), and its
// product structure is left undecided (right prisms are decided only for
// exact coordinates), never guessed.
func TestCircumsolidNearMissEnclosed(t *testing.T) {
	p := parse(t, problemText(parallelepiped("1", "1", "0", "1+exp(0)/1099511627776"), "0", `"dirichlet"`))
	h, _ := Decide(CircumsolidPolyhedron, p)
	requireVerdict(t, "box 2^-40 off the cube", h, certs.Disproven)
	h, _ = Decide(CircumsolidProduct, p)
	requireVerdict(t, "box 2^-40 off the cube: product", h, certs.Undecided)
}

// TestCircumsolidCyclotomicNearMiss: the pyramid over the regular
// heptagon of circumradius 1 with apex (0, 0, 1) is a circumsolid (a
// pyramid over a tangential base with apex above the incentre, see
// TestCircumsolidShapes: inradius ρ/(ρ + √(1 + ρ²)), ρ = cos(π/7)),
// decided exactly in Q(ζ_7); with the apex moved to (10⁻¹², 0, 1) it is
// not (the lateral faces' distances from any axis point differ), and the
// decision must not say proven — the residual's terms lie in different
// square classes and their enclosure does not exclude 0 at 10⁻¹², so
// undecided is the expected answer, disproven acceptable.
func TestCircumsolidCyclotomicNearMiss(t *testing.T) {
	p := parse(t, problemText(regularPyramid(7, "1"), "0", `"neumann"`))
	h, _ := Decide(CircumsolidPolyhedron, p)
	requireVerdict(t, "heptagonal pyramid", h, certs.Proven)
	rho := math.Cos(math.Pi / 7)
	if r, want := insphereRadius(p.Polyhedron), rho/(rho+math.Sqrt(1+rho*rho)); math.Abs(r.Mid()-want) > 1e-15 || r.Wid() > 1e-14 {
		t.Errorf("inradius %v, want %v", r, want)
	}
	off := strings.Replace(regularPyramid(7, "1"), `["0","0","1"]`, `["1/10^12","0","1"]`, 1)
	p = parse(t, problemText(off, "0", `"neumann"`))
	for _, name := range []string{CircumsolidPolyhedron, CircumsolidProduct} {
		if h, _ := Decide(name, p); h.Verdict == certs.Proven {
			t.Errorf("%s of the heptagonal pyramid with its apex 1e-12 off the axis: proven (%s)", name, h.Detail)
		}
	}
}
