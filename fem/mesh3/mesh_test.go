package mesh3

import (
	"encoding/json"
	"fmt"
	"math"
	"math/rand"
	"sort"
	"strings"
	"testing"

	"gapcert/fem/problem"
	"gapcert/interval"
)

// solid is a polyhedron with its exact volume (elementary geometry,
// common practice).
type solid struct {
	name     string
	vertices [][3]string
	faces    [][]int
	volume   float64
}

var cube = [][3]string{{"0", "0", "0"}, {"1", "0", "0"}, {"1", "1", "0"}, {"0", "1", "0"}, {"0", "0", "1"}, {"1", "0", "1"}, {"1", "1", "1"}, {"0", "1", "1"}}

var solids = []solid{
	{"unit cube", cube, [][]int{{0, 3, 2, 1}, {4, 5, 6, 7}, {0, 1, 5, 4}, {1, 2, 6, 5}, {2, 3, 7, 6}, {3, 0, 4, 7}}, 1},
	// Regular tetrahedron of unit edge: volume √2/12.
	{"regular tetrahedron", [][3]string{{"0", "0", "0"}, {"1", "0", "0"}, {"1/2", "sqrt(3)/2", "0"}, {"1/2", "sqrt(3)/6", "sqrt(6)/3"}},
		[][]int{{0, 2, 1}, {0, 1, 3}, {1, 2, 3}, {2, 0, 3}}, math.Sqrt2 / 12},
	// Regular octahedron with vertices ±e_i: volume 4/3.
	{"regular octahedron", [][3]string{{"1", "0", "0"}, {"-1", "0", "0"}, {"0", "1", "0"}, {"0", "-1", "0"}, {"0", "0", "1"}, {"0", "0", "-1"}},
		[][]int{{0, 2, 4}, {2, 1, 4}, {1, 3, 4}, {3, 0, 4}, {2, 0, 5}, {1, 2, 5}, {3, 1, 5}, {0, 3, 5}}, 4.0 / 3},
	// Unit cube with a pyramid dent of depth 1/4 in its top face: 1 − 1/12.
	{"dented cube", append(append([][3]string{}, cube...), [3]string{"1/2", "1/2", "3/4"}),
		[][]int{{0, 3, 2, 1}, {0, 1, 5, 4}, {1, 2, 6, 5}, {2, 3, 7, 6}, {3, 0, 4, 7}, {4, 5, 8}, {5, 6, 8}, {6, 7, 8}, {7, 4, 8}}, 11.0 / 12},
	// Prism over the triangle (0,0), (1,0), (0,1) of height 2: volume 1.
	{"triangular prism", [][3]string{{"0", "0", "0"}, {"1", "0", "0"}, {"0", "1", "0"}, {"0", "0", "2"}, {"1", "0", "2"}, {"0", "1", "2"}},
		[][]int{{0, 2, 1}, {3, 4, 5}, {0, 1, 4, 3}, {1, 2, 5, 4}, {2, 0, 3, 5}}, 1},
	// Prism of height 1 over the regular pentagon inscribed in the unit
	// circle: volume (5/2)·sin(2π/5) (common practice).
	{"pentagonal prism", pentagonPrism(), [][]int{{0, 4, 3, 2, 1}, {5, 6, 7, 8, 9}, {0, 1, 6, 5}, {1, 2, 7, 6}, {2, 3, 8, 7}, {3, 4, 9, 8}, {4, 0, 5, 9}},
		2.5 * math.Sin(2*math.Pi/5)},
}

func pentagonPrism() [][3]string {
	var v [][3]string
	for _, z := range []string{"0", "1"} {
		for k := range 5 {
			v = append(v, [3]string{fmt.Sprintf("cos(2*%d*pi/5)", k), fmt.Sprintf("sin(2*%d*pi/5)", k), z})
		}
	}
	return v
}

func fromSolid(t testing.TB, s solid) *Mesh {
	t.Helper()
	v, _ := json.Marshal(s.vertices)
	f, _ := json.Marshal(s.faces)
	p, err := problem.Parse([]byte(`{"domain": {"polyhedron": {"vertices": ` + string(v) + `, "faces": ` + string(f) + `}}, "boundary": "dirichlet"}`))
	if err != nil {
		t.Fatal(err)
	}
	ph := p.Polyhedron
	var bnd []BoundaryFace
	for k, tr := range ph.Triangles() {
		bnd = append(bnd, BoundaryFace{tr[0], tr[1], tr[2], ph.TriangleFaces()[k]})
	}
	m, err := FromPolyhedron(ph.Nodes(), ph.Tetrahedra(), bnd)
	if err != nil {
		t.Fatal(err)
	}
	return m
}

// TestRefineKeepsTiling checks, at levels 0–3, that the volume enclosures
// sum to an enclosure of the exact volume (narrow), that the face check of
// FromPolyhedron passes again, that the boundary faces keep their labels
// and number, and that Edges, Faces and BoundaryOwners are consistent.
func TestRefineKeepsTiling(t *testing.T) {
	for _, s := range solids {
		t.Run(s.name, func(t *testing.T) {
			m := fromSolid(t, s)
			nb := len(m.Bnd)
			for level := 0; level <= 3; level++ {
				if level > 0 {
					m = m.Refine()
				}
				var sum interval.I
				for k := range m.Tets {
					sum = sum.Add(m.Geom(k).Volume)
				}
				tol := 8 * s.volume * 0x1p-52 // the exact volume rounded, and its float evaluation
				if !(sum.Lo <= s.volume+tol && s.volume-tol <= sum.Hi) {
					t.Errorf("level %d: volumes sum to %v, exact %v", level, sum, s.volume)
				}
				if w := sum.Wid(); w > 1e-12*s.volume {
					t.Errorf("level %d: volume sum %v is wide (%g)", level, sum, w)
				}
				if err := m.checkFaces(); err != nil {
					t.Errorf("level %d: %v", level, err)
				}
				if len(m.Bnd) != nb<<(2*level) {
					t.Errorf("level %d: %d boundary faces, want %d", level, len(m.Bnd), nb<<(2*level))
				}
				checkTopology(t, m)
			}
		})
	}
}

// checkTopology checks Edges, Faces and BoundaryOwners against Tets and
// Euler's formula V − E + F − T = 1 for a tetrahedralised ball.
func checkTopology(t *testing.T, m *Mesh) {
	t.Helper()
	edges, tetEdges := m.Edges()
	faces, tetFaces := m.Faces()
	for k, tet := range m.Tets {
		for j, le := range LocalEdges {
			e := edges[tetEdges[k][j]]
			a, b := min(tet[le[0]], tet[le[1]]), max(tet[le[0]], tet[le[1]])
			if e != [2]int{a, b} {
				t.Fatalf("tet %d local edge %d is %v, want %v", k, j, e, [2]int{a, b})
			}
		}
		for i, lf := range LocalFaces {
			f := []int{tet[lf[0]], tet[lf[1]], tet[lf[2]]}
			sort.Ints(f)
			if faces[tetFaces[k][i]] != [3]int{f[0], f[1], f[2]} {
				t.Fatalf("tet %d local face %d is %v, want %v", k, i, faces[tetFaces[k][i]], f)
			}
		}
	}
	if chi := len(m.Nodes) - len(edges) + len(faces) - len(m.Tets); chi != 1 {
		t.Errorf("V − E + F − T = %d, want 1", chi)
	}
	for j, o := range m.BoundaryOwners() {
		tet, b := m.Tets[o[0]], m.Bnd[j]
		f := LocalFaces[o[1]]
		got := [3]int{tet[f[0]], tet[f[1]], tet[f[2]]}
		ok := false
		for r := range 3 {
			ok = ok || got == [3]int{[]int{b.A, b.B, b.C}[r], []int{b.A, b.B, b.C}[(r+1)%3], []int{b.A, b.B, b.C}[(r+2)%3]}
		}
		if !ok {
			t.Fatalf("boundary face %d %v: owner face %v", j, b, got)
		}
	}
}

// shapeKey returns the similarity class of a tetrahedron: its six squared
// edge lengths, sorted and divided by the largest, rounded to 1e-9.
func shapeKey(g Geom) [6]int64 {
	var l [6]float64
	for j := range 6 {
		l[j] = g.EdgeLen[j].Mid() * g.EdgeLen[j].Mid()
	}
	sort.Float64s(l[:])
	var k [6]int64
	for j := range 6 {
		k[j] = int64(math.Round(l[j] / l[5] * 1e9))
	}
	return k
}

// TestRefineShapeClasses counts the similarity classes among the
// descendants of each initial tetrahedron over four refinements: Bey
// (1995) proves at most three congruence classes per tetrahedron for his
// red refinement, and similar classes across levels coincide, so at most
// three similarity classes (plus the initial shape when it is not among
// them) may appear. Mirror images count as similar here (the key is the
// multiset of edge lengths), which can only lower the count.
func TestRefineShapeClasses(t *testing.T) {
	for _, s := range solids {
		t.Run(s.name, func(t *testing.T) {
			m := fromSolid(t, s)
			n0 := len(m.Tets)
			classes := make([]map[[6]int64]bool, n0)
			for i := range classes {
				classes[i] = map[[6]int64]bool{}
			}
			for level := 1; level <= 4; level++ {
				m = m.Refine()
				per := len(m.Tets) / n0 // children stay in their ancestor's block
				for k := range m.Tets {
					classes[k/per][shapeKey(m.Geom(k))] = true
				}
			}
			for i, c := range classes {
				if len(c) > 3 {
					t.Errorf("initial tetrahedron %d: %d similarity classes among its descendants", i, len(c))
				}
			}
		})
	}
}

// TestGeom checks the barycentric gradients against the edge vectors
// (∇λ_i · (P_j − P_0) = δ_ij − δ_i0) and the diameter bound on a refined
// regular tetrahedron.
func TestGeom(t *testing.T) {
	m := fromSolid(t, solids[1]).Refine().Refine()
	for k := range m.Tets {
		g := m.Geom(k)
		for i := range 4 {
			for j := 1; j < 4; j++ {
				want := 0.0
				switch {
				case i == j:
					want = 1
				case i == 0:
					want = -1
				}
				d := g.Grad[i][0].Mul(g.Edge[j-1][0]).Add(g.Grad[i][1].Mul(g.Edge[j-1][1])).Add(g.Grad[i][2].Mul(g.Edge[j-1][2]))
				if !d.Contains(want) || d.Wid() > 1e-12 {
					t.Fatalf("tet %d: ∇λ_%d·e_%d = %v, want %v", k, i, j, d, want)
				}
			}
		}
		if g.H > m.HMax() || !(g.Diam.Lo > 0) {
			t.Fatalf("tet %d: diameter %v, HMax %v", k, g.Diam, m.HMax())
		}
	}
	// Level 2 of the cone tetrahedra over the unit-edge tetrahedron: the
	// longest edge is 1/4 (a boundary edge) or a quarter of an apex edge.
	if h := m.HMax(); h < 0.25 || h > 0.3 {
		t.Errorf("HMax %v", h)
	}
}

// TestFromPolyhedronRejects checks that FromPolyhedron refuses inputs whose
// tetrahedra do not provably tile the surface's interior.
func TestFromPolyhedronRejects(t *testing.T) {
	p := func(x, y, z float64) [3]interval.I {
		return [3]interval.I{interval.Point(x), interval.Point(y), interval.Point(z)}
	}
	nodes := [][3]interval.I{p(0, 0, 0), p(1, 0, 0), p(0, 1, 0), p(0, 0, 1)}
	bnd := []BoundaryFace{{1, 2, 3, 0}, {0, 3, 2, 1}, {0, 1, 3, 2}, {0, 2, 1, 3}}
	if _, err := FromPolyhedron(nodes, [][4]int{{0, 1, 2, 3}}, bnd); err != nil {
		t.Fatalf("the unit tetrahedron: %v", err)
	}
	for _, c := range []struct {
		name  string
		nodes [][3]interval.I
		tets  [][4]int
		bnd   []BoundaryFace
		want  string
	}{
		{"negative orientation", nodes, [][4]int{{0, 2, 1, 3}}, bnd, "not verified positively oriented"},
		{"flat", append(nodes[:3:3], p(1, 1, 0)), [][4]int{{0, 1, 2, 3}}, bnd, "not verified positively oriented"},
		{"boundary orientation", nodes, [][4]int{{0, 1, 2, 3}}, []BoundaryFace{{1, 3, 2, 0}, {0, 3, 2, 1}, {0, 1, 3, 2}, {0, 2, 1, 3}}, "same orientation"},
		{"missing boundary", nodes, [][4]int{{0, 1, 2, 3}}, append(bnd[:3:3], BoundaryFace{1, 2, 3, 0}), "not the face of exactly one"},
		{"uncovered face", nodes, [][4]int{{0, 1, 2, 3}}, bnd[:3], "at least 4"},
		{"index", nodes, [][4]int{{0, 1, 2, 4}}, bnd, "out of range"},
		{"overlap", append(nodes[:4:4], p(0.1, 0.1, 0.1)), [][4]int{{0, 1, 2, 3}, {4, 1, 2, 3}}, bnd, "face"},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := FromPolyhedron(c.nodes, c.tets, c.bnd)
			if err == nil || !strings.Contains(err.Error(), c.want) {
				t.Errorf("error %v, want %q", err, c.want)
			}
		})
	}
}

// TestFromPolyhedronRandom feeds random tetrahedra over random nodes
// (fixed seed) to FromPolyhedron, which must return a mesh or an error and
// never panic; an accepted input must pass the face check again.
func TestFromPolyhedronRandom(t *testing.T) {
	rng := rand.New(rand.NewSource(3))
	for it := 0; it < 2000; it++ {
		n := 4 + rng.Intn(4)
		nodes := make([][3]interval.I, n)
		for i := range nodes {
			for c := range 3 {
				nodes[i][c] = interval.Point(float64(rng.Intn(3)))
			}
		}
		tets := make([][4]int, 1+rng.Intn(3))
		for k := range tets {
			for j := range 4 {
				tets[k][j] = rng.Intn(n+1) - rng.Intn(2)
			}
		}
		bnd := make([]BoundaryFace, rng.Intn(6))
		for k := range bnd {
			bnd[k] = BoundaryFace{rng.Intn(n), rng.Intn(n), rng.Intn(n), k}
		}
		m, err := FromPolyhedron(nodes, tets, bnd)
		if err == nil {
			if err := m.checkFaces(); err != nil {
				t.Fatalf("accepted, then %v", err)
			}
			m.Refine()
		}
	}
}

// TestGeomUnitTetrahedron: on the tetrahedron 0, e_1, e_2, e_3 the
// barycentric coordinates are λ_i = x_i (i = 1, 2, 3) and
// λ_0 = 1 − x − y − z, the volume is 1/6, and the edges have lengths 1
// (from the origin) and √2 (common practice).
func TestGeomUnitTetrahedron(t *testing.T) {
	p := func(x, y, z float64) [3]interval.I {
		return [3]interval.I{interval.Point(x), interval.Point(y), interval.Point(z)}
	}
	m, err := FromPolyhedron([][3]interval.I{p(0, 0, 0), p(1, 0, 0), p(0, 1, 0), p(0, 0, 1)}, [][4]int{{0, 1, 2, 3}},
		[]BoundaryFace{{1, 2, 3, 0}, {0, 3, 2, 1}, {0, 1, 3, 2}, {0, 2, 1, 3}})
	if err != nil {
		t.Fatal(err)
	}
	g := m.Geom(0)
	want := [4][3]float64{{-1, -1, -1}, {1, 0, 0}, {0, 1, 0}, {0, 0, 1}}
	for i := range 4 {
		for k := range 3 {
			if x := g.Grad[i][k]; !x.Contains(want[i][k]) || x.Wid() > 1e-15 {
				t.Errorf("∇λ_%d[%d] = %v, want %v", i, k, x, want[i][k])
			}
		}
	}
	if !g.Volume.Contains(1.0/6) || g.Volume.Wid() > 1e-16 {
		t.Errorf("volume %v", g.Volume)
	}
	for j, le := range LocalEdges {
		w := 1.0
		if le[0] != 0 {
			w = math.Sqrt2
		}
		if x := g.EdgeLen[j]; !x.Contains(w) || x.Wid() > 1e-15 {
			t.Errorf("edge %v length %v, want %v", le, x, w)
		}
	}
	if !g.Diam.Contains(math.Sqrt2) || g.H < math.Sqrt2 {
		t.Errorf("diameter %v, H %v", g.Diam, g.H)
	}
}

// TestRefineEnclosureWidths bounds the growth of the geometry enclosures
// under refinement: after four levels of the regular tetrahedron (sqrt
// coordinates) the volume enclosures are within 1e-14 relative width.
func TestRefineEnclosureWidths(t *testing.T) {
	m := fromSolid(t, solids[1])
	for range 4 {
		m = m.Refine()
	}
	worst := 0.0
	for k := range m.Tets {
		v := m.Geom(k).Volume
		worst = math.Max(worst, v.Wid()/v.Lo)
	}
	if worst > 1e-14 {
		t.Errorf("relative width of a volume enclosure %g", worst)
	}
	t.Logf("largest relative width of a volume enclosure after 4 levels: %.3g", worst)
}
