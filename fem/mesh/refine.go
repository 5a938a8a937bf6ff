package mesh

import (
	"fmt"

	"gapcert/interval"
)

// Refine returns the red refinement of m: every triangle (v0, v1, v2) with
// edge midpoints m_i of its edge opposite v_i is replaced by the four
// triangles
//
//	4t:   (v0, m2, m1)   4t+1: (m2, v1, m0)
//	4t+2: (m1, m0, v2)   4t+3: (m2, m0, m1)
//
// (all counterclockwise). The old nodes keep their numbers; the midpoint of
// edge k of m.Edges() is node len(m.Nodes)+k, enclosing the exact midpoint
// (P_a + P_b)/2 computed in interval arithmetic from the enclosures of P_a
// and P_b. A midpoint is made once per edge, so a shared edge is split at
// the same exact point on both sides, and the four children of an exact
// triangle tile it exactly (they are its images under the homotheties of
// ratio ½ at the vertices and of ratio −½ at the centroid). Every boundary
// edge A→B on side s becomes A→M and M→B on side s; M lies exactly on
// side s, since A and B do. The edge vectors of a child are exactly ±½
// those of its parent and its area exactly ¼ of the parent's, which is how
// Geom's enclosures are propagated (intersected with those from the nodes).
func (m *Mesh) Refine() *Mesh {
	m.mustBeBuilt()
	edges, triEdges := m.Edges()
	n0 := len(m.Nodes)
	r := &Mesh{
		Nodes:   make([][2]interval.I, n0, n0+len(edges)),
		Tris:    make([][3]int, 0, 4*len(m.Tris)),
		Bnd:     make([]BoundaryEdge, 0, 2*len(m.Bnd)),
		corners: m.corners,
		edge:    make([][3][2]interval.I, 0, 4*len(m.Tris)),
		area:    make([]interval.I, 0, 4*len(m.Tris)),
	}
	copy(r.Nodes, m.Nodes)
	for _, e := range edges {
		r.Nodes = append(r.Nodes, midpoint(m.Nodes[e[0]], m.Nodes[e[1]]))
	}
	for t, v := range m.Tris {
		te := triEdges[t]
		m0, m1, m2 := n0+te[0], n0+te[1], n0+te[2]
		var h [3][2]interval.I // ½ e_i of the parent
		for i := 0; i < 3; i++ {
			h[i] = halfVec(m.edge[t][i])
		}
		quarter := m.area[t].MulF(0.25)
		r.addTri([3]int{v[0], m2, m1}, h, quarter)
		r.addTri([3]int{m2, v[1], m0}, h, quarter)
		r.addTri([3]int{m1, m0, v[2]}, h, quarter)
		r.addTri([3]int{m2, m0, m1}, [3][2]interval.I{negVec(h[2]), negVec(h[0]), negVec(h[1])}, quarter)
	}
	idx := newEdgeIndex(n0, edges)
	for _, b := range m.Bnd {
		mid := n0 + idx.find(b.A, b.B)
		r.Bnd = append(r.Bnd, BoundaryEdge{b.A, mid, b.Side}, BoundaryEdge{mid, b.B, b.Side})
	}
	return r
}

// addTri appends triangle tri whose exact edge vectors and area are
// enclosed by e and area (propagated from its parent); each is intersected
// with the enclosure computed from the node enclosures, which holds the
// same exact value.
func (m *Mesh) addTri(tri [3]int, e [3][2]interval.I, area interval.I) {
	ne := m.nodeEdges(tri)
	for i := 0; i < 3; i++ {
		for c := 0; c < 2; c++ {
			e[i][c] = intersect(e[i][c], ne[i][c])
		}
	}
	area = intersect(area, areaOf(e))
	if !(area.Lo > 0) {
		panic(fmt.Sprintf("mesh: child triangle %v has area enclosure %v without a positive lower end", tri, area))
	}
	m.Tris = append(m.Tris, tri)
	m.edge = append(m.edge, e)
	m.area = append(m.area, area)
}

// intersect returns x ∩ y for two enclosures of the same exact number.
func intersect(x, y interval.I) interval.I {
	z, ok := x.Intersection(y)
	if !ok {
		panic(fmt.Sprintf("mesh: enclosures %v and %v of the same number are disjoint", x, y))
	}
	return z
}

// midpoint encloses (p + q)/2.
func midpoint(p, q [2]interval.I) [2]interval.I {
	return [2]interval.I{p[0].Add(q[0]).MulF(0.5), p[1].Add(q[1]).MulF(0.5)}
}

func halfVec(v [2]interval.I) [2]interval.I {
	return [2]interval.I{v[0].MulF(0.5), v[1].MulF(0.5)}
}

func negVec(v [2]interval.I) [2]interval.I {
	return [2]interval.I{v[0].Neg(), v[1].Neg()}
}
