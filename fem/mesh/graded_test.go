package mesh

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestRefineGraded checks conformity, areas and boundary of graded meshes
// (alone, after and before red refinement) and that the triangles at the
// corner shrink by about half per level.
func TestRefineGraded(t *testing.T) {
	cases := []struct {
		polygon, corner, pre, levels int
	}{
		{0, 0, 0, 6},
		{1, 2, 1, 5},
		{2, 3, 0, 8}, // the L-shape's re-entrant corner
		{2, 3, 2, 6},
		{3, 1, 1, 5},
	}
	for _, tc := range cases {
		pol := testPolygons[tc.polygon]
		t.Run(pol.name, func(t *testing.T) {
			p, m := parsePolygon(t, pol.file)
			for k := 0; k < tc.pre; k++ {
				m = m.Refine()
			}
			h0 := cornerH(m, tc.corner)
			g := m.RefineGraded(tc.corner, tc.levels)
			checkMesh(t, p, g)
			edges, _ := g.Edges()
			if len(g.Nodes)-len(edges)+len(g.Tris) != 1 {
				t.Errorf("V − E + F = %d", len(g.Nodes)-len(edges)+len(g.Tris))
			}
			// Two rounds split each corner triangle's edges twice; allow
			// a factor 2 for the shape of the first bisections.
			if h := cornerH(g, tc.corner); h > 2*h0*math.Pow(0.5, float64(tc.levels)) {
				t.Errorf("corner triangles have h = %v after %d levels from %v", h, tc.levels, h0)
			}
			checkMesh(t, p, g.Refine())
			if len(g.RefineGraded(tc.corner, 0).Tris) != len(g.Tris) {
				t.Error("RefineGraded with 0 levels changed the mesh")
			}
		})
	}
}

// cornerH returns the largest edge bound of the triangles with the node.
func cornerH(m *Mesh, node int) float64 {
	h := 0.0
	for t, tri := range m.Tris {
		if tri[0] == node || tri[1] == node || tri[2] == node {
			h = math.Max(h, m.Geom(t).H)
		}
	}
	return h
}

// gradingRatio returns max h_T/d_T^μ over the triangles T of m without the
// node, where d_T is the least distance from the node to a vertex of T
// (from the midpoints of the enclosures: a measurement, not a bound).
func gradingRatio(m *Mesh, node int, mu float64) float64 {
	c := m.Nodes[node]
	worst := 0.0
	for t, tri := range m.Tris {
		if tri[0] == node || tri[1] == node || tri[2] == node {
			continue
		}
		d := math.Inf(1)
		for _, k := range tri {
			d = math.Min(d, math.Hypot(m.Nodes[k][0].Mid()-c[0].Mid(), m.Nodes[k][1].Mid()-c[1].Mid()))
		}
		worst = math.Max(worst, m.Geom(t).H/math.Pow(d, mu))
	}
	return worst
}

// TestGradingLShape reports h_T ≤ c·d_T for the graded L-shape: the
// constant must not grow with the number of levels (geometric grading).
func TestGradingLShape(t *testing.T) {
	_, m := parsePolygon(t, testPolygons[2].file)
	m = m.Refine().Refine()
	var first float64
	for _, levels := range []int{2, 4, 8, 12} {
		g := m.RefineGraded(3, levels)
		c := gradingRatio(g, 3, 1)
		t.Logf("levels %2d: %6d triangles, corner h %.3g, max h_T/d_T %.3f", levels, len(g.Tris), cornerH(g, 3), c)
		if first == 0 {
			first = c
		}
		if c > 2*first+1 {
			t.Errorf("levels %d: h_T/d_T up to %v, at 2 levels %v", levels, c, first)
		}
	}
}

// TestRefineMarked: rounds of marked bisection on random marks keep the
// mesh a conforming exact tiling (checkMesh: areas, edge matching,
// boundary, V − E + F = 1), a round with marks adds triangles, and a round
// with no marks changes nothing.
func TestRefineMarked(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for _, pol := range testPolygons {
		t.Run(pol.name, func(t *testing.T) {
			p, m := parsePolygon(t, pol.file)
			m = m.Refine()
			for round := 0; round < 4; round++ {
				marked := make([]bool, len(m.Tris))
				var maxMarked float64
				for i := range marked {
					marked[i] = rng.IntN(4) == 0
					if marked[i] {
						maxMarked = math.Max(maxMarked, m.Geom(i).Area.Hi)
					}
				}
				r := m.RefineMarked(marked)
				checkMesh(t, p, r)
				edges, _ := r.Edges()
				if len(r.Nodes)-len(edges)+len(r.Tris) != 1 {
					t.Errorf("V − E + F = %d", len(r.Nodes)-len(edges)+len(r.Tris))
				}
				if len(r.Tris) <= len(m.Tris) && maxMarked > 0 {
					t.Errorf("round %d: %d triangles after marking, %d before", round, len(r.Tris), len(m.Tris))
				}
				m = r
			}
			if n := len(m.RefineMarked(make([]bool, len(m.Tris))).Tris); n != len(m.Tris) {
				t.Errorf("a round without marks changed %d triangles into %d", len(m.Tris), n)
			}
		})
	}
}
