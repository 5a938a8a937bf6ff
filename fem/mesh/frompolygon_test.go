package mesh

import (
	"math"
	"strings"
	"testing"

	"gapcert/interval"
)

func pts(xy ...float64) [][2]interval.I {
	var v [][2]interval.I
	for k := 0; k+1 < len(xy); k += 2 {
		v = append(v, [2]interval.I{interval.Point(xy[k]), interval.Point(xy[k+1])})
	}
	return v
}

// TestFromPolygonRejects checks that FromPolygon refuses every input whose
// triangles do not provably tile the polygon.
func TestFromPolygonRejects(t *testing.T) {
	square := pts(0, 0, 1, 0, 1, 1, 0, 1)
	wide := pts(0, 0, 1, 0, 0, 1)
	wide[2][1] = interval.New(-1, 1) // apex may lie on the base line
	cases := []struct {
		name     string
		vertices [][2]interval.I
		tris     [][3]int
		want     string
	}{
		{"two vertices", pts(0, 0, 1, 0), [][3]int{{0, 1, 0}}, "at least 3"},
		{"no triangles", square, nil, "no triangles"},
		{"index out of range", square, [][3]int{{0, 1, 4}, {0, 2, 3}}, "out of range"},
		{"repeated vertex", square, [][3]int{{0, 1, 1}, {0, 2, 3}}, "repeats"},
		{"clockwise", square, [][3]int{{0, 2, 1}, {0, 2, 3}}, "counterclockwise"},
		{"undecided orientation", wide, [][3]int{{0, 1, 2}}, "counterclockwise"},
		{"degenerate", pts(0, 0, 1, 0, 2, 0, 1, 1), [][3]int{{0, 1, 2}, {0, 2, 3}}, "counterclockwise"},
		{"side missing", square, [][3]int{{0, 1, 2}}, "boundary edge"},
		{"overlap", square, [][3]int{{0, 1, 2}, {0, 2, 3}, {0, 1, 3}}, "edge"},
		{"crossing diagonals", square, [][3]int{{0, 1, 2}, {1, 2, 3}}, "edge"},
		{"unbounded vertex", [][2]interval.I{square[0], square[1], {interval.Point(1), interval.New(1, math.Inf(1))}}, [][3]int{{0, 1, 2}}, "unbounded"},
	}
	for _, tc := range cases {
		_, err := FromPolygon(tc.vertices, tc.tris)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: error %v, want one containing %q", tc.name, err, tc.want)
		}
	}
	if _, err := FromPolygon(square, [][3]int{{0, 1, 2}, {0, 2, 3}}); err != nil {
		t.Errorf("valid square rejected: %v", err)
	}
}

// TestEdges checks the edge list of refined meshes: strictly increasing
// pairs (a < b), every local edge found at its index, and 3F = 2E − B
// (each interior edge in two triangles, each boundary edge in one).
func TestEdges(t *testing.T) {
	for _, pol := range testPolygons {
		_, m := parsePolygon(t, pol.file)
		for _, g := range []*Mesh{m, m.Refine().Refine(), m.Refine().RefineGraded(0, 3)} {
			edges, triEdges := g.Edges()
			for k, e := range edges {
				if !(e[0] < e[1]) || (k > 0 && !(edges[k-1][0] < e[0] || edges[k-1][0] == e[0] && edges[k-1][1] < e[1])) {
					t.Fatalf("%s: edges not strictly sorted at %d: %v", pol.name, k, e)
				}
			}
			for tr, tri := range g.Tris {
				for i := 0; i < 3; i++ {
					a, b := tri[(i+1)%3], tri[(i+2)%3]
					if a > b {
						a, b = b, a
					}
					if edges[triEdges[tr][i]] != [2]int{a, b} {
						t.Fatalf("%s: triangle %d local edge %d is %v, want %v", pol.name, tr, i, edges[triEdges[tr][i]], [2]int{a, b})
					}
				}
			}
			if 3*len(g.Tris) != 2*len(edges)-len(g.Bnd) {
				t.Errorf("%s: 3F = %d, 2E − B = %d", pol.name, 3*len(g.Tris), 2*len(edges)-len(g.Bnd))
			}
		}
	}
}

// TestCheckEdgesDetects checks that the conformity check used by the tests
// finds a reversed triangle, a hanging node and a missing boundary edge.
func TestCheckEdgesDetects(t *testing.T) {
	_, m := parsePolygon(t, testPolygons[0].file)
	m = m.Refine()
	reversed := m.Refine()
	reversed.Tris[5][1], reversed.Tris[5][2] = reversed.Tris[5][2], reversed.Tris[5][1]
	hanging := m.Refine()
	hanging.Tris = append(hanging.Tris[:4:4], m.Tris[1:]...) // children of triangle 0 next to unrefined triangles
	missing := m.Refine()
	missing.Bnd = missing.Bnd[1:]
	for _, c := range []struct {
		name string
		m    *Mesh
	}{{"reversed", reversed}, {"hanging node", hanging}, {"missing boundary edge", missing}} {
		if err := c.m.checkEdges(); err == nil {
			t.Errorf("%s: not detected", c.name)
		}
	}
}
