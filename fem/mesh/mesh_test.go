package mesh

import (
	"math"
	"testing"

	"gapcert/fem/problem"
	"gapcert/interval"
)

// polygons used by the tests, as problem files, so that the vertices and
// the triangulation are those of fem/problem.
var testPolygons = []struct {
	name string
	file string
}{
	{"unit square", `{"domain":{"polygon":[["0","0"],["1","0"],["1","1"],["0","1"]]},"boundary":"dirichlet"}`},
	{"equilateral triangle", `{"domain":{"polygon":[["0","0"],["1","0"],["1/2","sqrt(3)/2"]]},"boundary":"dirichlet"}`},
	// L-shape with its re-entrant corner at vertex 3 = (1, 1).
	{"L-shape", `{"domain":{"polygon":[["0","0"],["2","0"],["2","1"],["1","1"],["1","2"],["0","2"]]},"boundary":"dirichlet"}`},
	{"pentagon", `{"domain":{"polygon":[["1","0"],["cos(2*pi/5)","sin(2*pi/5)"],["cos(4*pi/5)","sin(4*pi/5)"],["cos(6*pi/5)","sin(6*pi/5)"],["cos(8*pi/5)","sin(8*pi/5)"]]},"boundary":"dirichlet"}`},
}

func parsePolygon(t testing.TB, file string) (*problem.Problem, *Mesh) {
	t.Helper()
	p, err := problem.Parse([]byte(file))
	if err != nil {
		t.Fatal(err)
	}
	v := make([][2]interval.I, len(p.Vertices))
	for k, q := range p.Vertices {
		v[k] = [2]interval.I{q[0].Val, q[1].Val}
	}
	m, err := FromPolygon(v, p.Triangles())
	if err != nil {
		t.Fatal(err)
	}
	return p, m
}

// checkMesh verifies the invariants of a mesh of polygon p: conformity
// (checkEdges), positive areas that add up to an enclosure overlapping the
// polygon's area (fem/problem Area), every boundary node's enclosure
// compatible with its side (the cross product (B − A) × (X − A) of the side
// A→B and the node X encloses 0), and the boundary edges of each side
// forming a path from vertex s to vertex s+1.
func checkMesh(t *testing.T, p *problem.Problem, m *Mesh) {
	t.Helper()
	if err := m.checkEdges(); err != nil {
		t.Fatal(err)
	}
	sum := interval.Point(0)
	for k := range m.Tris {
		g := m.Geom(k)
		if !(g.Area.Lo > 0) {
			t.Fatalf("triangle %d: area %v", k, g.Area)
		}
		sum = sum.Add(g.Area)
	}
	if _, ok := sum.Intersection(p.Area()); !ok {
		t.Errorf("areas add up to %v, polygon area %v", sum, p.Area())
	}
	if rel := sum.Wid() / sum.Mid(); rel > 1e-12 {
		t.Errorf("areas add up to %v, relative width %v", sum, rel)
	}
	n := m.NumCorners()
	next := make(map[int]int) // along each side
	for _, b := range m.Bnd {
		a, c := m.Nodes[b.Side], m.Nodes[(b.Side+1)%n]
		for _, x := range [][2]interval.I{m.Nodes[b.A], m.Nodes[b.B]} {
			cross := c[0].Sub(a[0]).Mul(x[1].Sub(a[1])).Sub(c[1].Sub(a[1]).Mul(x[0].Sub(a[0])))
			if !cross.ContainsZero() {
				t.Fatalf("boundary node %v is off side %d: cross product %v", x, b.Side, cross)
			}
		}
		if _, dup := next[b.A]; dup {
			t.Fatalf("two boundary edges leave node %d", b.A)
		}
		next[b.A] = b.B
	}
	for s := 0; s < n; s++ {
		k, steps := s, 0
		for k != (s+1)%n {
			k = next[k]
			if steps++; steps > len(m.Bnd) {
				t.Fatalf("side %d: boundary path does not reach vertex %d", s, (s+1)%n)
			}
		}
	}
}

// TestRefine checks counts, conformity, areas, boundary and HMax after up
// to four red refinements of each test polygon.
func TestRefine(t *testing.T) {
	for _, tc := range testPolygons {
		t.Run(tc.name, func(t *testing.T) {
			p, m := parsePolygon(t, tc.file)
			t0 := len(m.Tris)
			checkMesh(t, p, m)
			for k := 1; k <= 4; k++ {
				h := m.HMax()
				m = m.Refine()
				if want := t0 << (2 * k); len(m.Tris) != want {
					t.Fatalf("level %d: %d triangles, want %d", k, len(m.Tris), want)
				}
				// Euler: V − E + F = 1 for a disk, and boundary edges double.
				edges, _ := m.Edges()
				if len(m.Nodes)-len(edges)+len(m.Tris) != 1 {
					t.Errorf("level %d: V − E + F = %d", k, len(m.Nodes)-len(edges)+len(m.Tris))
				}
				if want := len(p.Vertices) << k; len(m.Bnd) != want {
					t.Errorf("level %d: %d boundary edges, want %d", k, len(m.Bnd), want)
				}
				checkMesh(t, p, m)
				// Red refinement halves every edge exactly; the bound may
				// differ from h/2 only by rounding.
				if hk := m.HMax(); math.Abs(hk-h/2) > 1e-14*h {
					t.Errorf("level %d: HMax %v, previous %v", k, hk, h)
				}
			}
		})
	}
}

// TestNodeWidths reports how wide the node enclosures of a polygon with
// irrational vertices grow under refinement: a midpoint's width is the
// mean of its ends' widths plus rounding, so it may grow by about an ulp
// per level, never more.
func TestNodeWidths(t *testing.T) {
	_, m := parsePolygon(t, testPolygons[3].file)
	w0 := maxNodeWidth(m)
	for k := 1; k <= 6; k++ {
		m = m.Refine()
	}
	g := m.RefineGraded(0, 12)
	w := maxNodeWidth(g)
	t.Logf("pentagon: node width %.3g coarse, %.3g after 6 red levels and 12 graded levels (%d triangles)", w0, w, len(g.Tris))
	if w > w0+18*0x1p-52 {
		t.Errorf("node widths grew from %v to %v", w0, w)
	}
}

func maxNodeWidth(m *Mesh) float64 {
	w := 0.0
	for _, p := range m.Nodes {
		w = math.Max(w, math.Max(p[0].Wid(), p[1].Wid()))
	}
	return w
}
