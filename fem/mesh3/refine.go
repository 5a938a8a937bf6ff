package mesh3

import (
	"fmt"

	"gapcert/interval"
)

// beyChildren lists the eight children of Bey's red refinement of a
// tetrahedron (x0, x1, x2, x3) in its refinement order, as points of the
// parent: 0 … 3 its vertices and 4 … 9 the midpoints x01, x02, x03, x12,
// x13, x23. The first four are the corner tetrahedra (the images of the
// parent under the homotheties of ratio ½ at its vertices); the last four
// split the inner octahedron along its diagonal x02–x13. beySign is the
// orientation of each child in this order relative to its parent's.
// (Recalled from Bey 1995; the orientations are computed on the reference
// tetrahedron: det = +⅛, +⅛, +⅛, +⅛, +⅛, −⅛, +⅛, −⅛ times the parent's.)
var (
	beyChildren = [8][4]int{
		{0, 4, 5, 6}, {4, 1, 7, 8}, {5, 7, 2, 9}, {6, 8, 9, 3},
		{4, 5, 6, 8}, {4, 5, 7, 8}, {5, 6, 8, 9}, {5, 7, 8, 9},
	}
	beySign = [8]bool{true, true, true, true, true, false, true, false}
	// beyPoint[p] holds the weights of point p on the parent's edge
	// vectors e_1, e_2, e_3 (refinement order) in units of ½:
	// x_p − x_0 = ½ Σ_j beyPoint[p][j] e_j.
	beyPoint = [10][3]float64{
		{0, 0, 0}, {2, 0, 0}, {0, 2, 0}, {0, 0, 2},
		{1, 0, 0}, {0, 1, 0}, {0, 0, 1}, {1, 1, 0}, {1, 0, 1}, {0, 1, 1},
	}
)

// Refine returns the red refinement of m after Bey: every tetrahedron is
// replaced by its eight children (beyChildren), each of volume exactly ⅛
// of the parent's; they tile the parent exactly (the four corner
// tetrahedra, and the inner octahedron split by its diagonal x02–x13 into
// four tetrahedra around that diagonal). The old nodes keep their
// numbers; the midpoint of edge k of m.Edges() is node len(m.Nodes)+k,
// enclosing the exact midpoint (P_a + P_b)/2 computed in interval
// arithmetic from the enclosures of P_a and P_b. A midpoint is made once
// per edge, so a shared face is split into the same four triangles from
// both sides. Every boundary triangle (A, B, C) of face f becomes the four
// triangles (A, m_AB, m_CA), (m_AB, B, m_BC), (m_CA, m_BC, C),
// (m_AB, m_BC, m_CA) of face f, which are the faces of the children on
// it with the same orientation; the midpoints lie exactly in face f. Each
// child is stored positively oriented: when its refinement order is
// negatively oriented its local vertices 2 and 3 are exchanged in Tets,
// and the refinement order is restored before it is refined again, so the
// shapes follow Bey's rule.
func (m *Mesh) Refine() *Mesh {
	m.mustBeBuilt()
	edges, _ := m.Edges()
	n0 := len(m.Nodes)
	r := &Mesh{
		Nodes:   make([][3]interval.I, n0, n0+len(edges)),
		Tets:    make([][4]int, 0, 8*len(m.Tets)),
		Bnd:     make([]BoundaryFace, 0, 4*len(m.Bnd)),
		given:   m.given,
		parents: append(m.parents[:len(m.parents):len(m.parents)], edges...),
		swap:    make([]bool, 0, 8*len(m.Tets)),
		edge:    make([][3][3]interval.I, 0, 8*len(m.Tets)),
		vol:     make([]interval.I, 0, 8*len(m.Tets)),
	}
	copy(r.Nodes, m.Nodes)
	for _, e := range edges {
		p, q := m.Nodes[e[0]], m.Nodes[e[1]]
		r.Nodes = append(r.Nodes, [3]interval.I{p[0].Add(q[0]).MulF(0.5), p[1].Add(q[1]).MulF(0.5), p[2].Add(q[2]).MulF(0.5)})
	}
	idx := newEdgeIndex(n0, edges)
	mid := func(a, b int) int { return n0 + idx.find(a, b) }
	for t, tet := range m.Tets {
		order, e := tet, m.edge[t]
		if m.swap[t] {
			order[2], order[3] = order[3], order[2]
			e[1], e[2] = e[2], e[1]
		}
		var pts [10]int
		copy(pts[:4], order[:])
		for k, le := range [6][2]int{{0, 1}, {0, 2}, {0, 3}, {1, 2}, {1, 3}, {2, 3}} {
			pts[4+k] = mid(order[le[0]], order[le[1]])
		}
		// pos[p] encloses x_p − x_0 from the parent's edge vectors.
		var pos [10][3]interval.I
		for p, w := range beyPoint {
			for c := range 3 {
				var s interval.I
				for j := range 3 {
					if w[j] != 0 {
						s = s.Add(e[j][c].MulF(0.5 * w[j]))
					}
				}
				pos[p][c] = s
			}
		}
		eighth := m.vol[t].MulF(0.125)
		for k, ch := range beyChildren {
			child := [4]int{pts[ch[0]], pts[ch[1]], pts[ch[2]], pts[ch[3]]}
			var ce [3][3]interval.I
			for j := 1; j < 4; j++ {
				for c := range 3 {
					ce[j-1][c] = pos[ch[j]][c].Sub(pos[ch[0]][c])
				}
			}
			swap := beySign[k] == m.swap[t] // the child's refinement order is negative
			if swap {
				child[2], child[3] = child[3], child[2]
				ce[1], ce[2] = ce[2], ce[1]
			}
			r.addTet(child, swap, ce, eighth)
		}
	}
	for _, b := range m.Bnd {
		ab, bc, ca := mid(b.A, b.B), mid(b.B, b.C), mid(b.C, b.A)
		r.Bnd = append(r.Bnd,
			BoundaryFace{b.A, ab, ca, b.Face}, BoundaryFace{ab, b.B, bc, b.Face},
			BoundaryFace{ca, bc, b.C, b.Face}, BoundaryFace{ab, bc, ca, b.Face})
	}
	return r
}

// addTet appends the positively oriented tetrahedron tet whose exact edge
// vectors and volume are enclosed by e and vol (propagated from its
// parent); each is intersected with the enclosure computed from the node
// enclosures, which holds the same exact value.
func (m *Mesh) addTet(tet [4]int, swap bool, e [3][3]interval.I, vol interval.I) {
	ne := m.nodeEdges(tet)
	for j := range 3 {
		for c := range 3 {
			e[j][c] = intersect(e[j][c], ne[j][c])
		}
	}
	vol = intersect(vol, volumeOf(e))
	if !(vol.Lo > 0) {
		panic(fmt.Sprintf("mesh3: child tetrahedron %v has volume enclosure %v without a positive lower end", tet, vol))
	}
	m.Tets = append(m.Tets, tet)
	m.swap = append(m.swap, swap)
	m.edge = append(m.edge, e)
	m.vol = append(m.vol, vol)
}

// intersect returns x ∩ y for two enclosures of the same exact number.
func intersect(x, y interval.I) interval.I {
	z, ok := x.Intersection(y)
	if !ok {
		panic(fmt.Sprintf("mesh3: enclosures %v and %v of the same number are disjoint", x, y))
	}
	return z
}
