package mesh

import (
	"fmt"

	"gapcert/interval"
)

// RefineGraded returns m refined toward polygon vertex corner (node
// corner) by levels rounds of newest-vertex bisection with conforming
// closure. levels = 0 returns a copy of m.
//
// Scheme. Each triangle is stored with its refinement edge as local edge 0
// (opposite local vertex 0, its newest vertex). Before the first round
// every triangle is rotated (which keeps it counterclockwise) so that its
// refinement edge is its longest edge (a choice, by the midpoints of the
// length enclosures; ties to the lowest local index). A round
//
//  1. marks the three edges of every triangle that has node corner;
//  2. closes the marking: while a triangle has a marked edge and an unmarked
//     refinement edge, marks its refinement edge (this ends, since marks are
//     only added);
//  3. puts the exact midpoint on every marked edge (as in Refine) and
//     bisects every triangle (v0, v1, v2) whose refinement edge is marked,
//     with m the midpoint of v1v2, into (m, v0, v1) and (m, v2, v0), whose
//     refinement edges are v0v1 and v2v0 (the parent's edges 2 and 1); a
//     child whose refinement edge is marked is bisected once more in the
//     same way.
//
// Every marked edge is split in every triangle that has it (by step 2 the
// triangle is bisected, and a marked edge other than its refinement edge
// is the refinement edge of a child), and no unmarked edge is split, so the
// mesh stays conforming; bisection of an exact triangle at the exact
// midpoint of an edge tiles it exactly, and boundary midpoints lie exactly
// on their sides. A triangle with the corner has its three edges split in
// a round, so the triangles at the corner shrink geometrically with the
// rounds, and newest-vertex bisection makes at most finitely many
// similarity classes of triangles from each initial one (Sewell 1972;
// Mitchell 1989), so the mesh stays shape regular; shape regularity
// affects how narrow later bounds are, never whether they hold. Old nodes keep their numbers; new nodes and
// triangles are numbered in the order of the rounds, then of the edges and
// triangles, which depends only on m. Child edge vectors are exact half
// sums of the parent's ((m, v0, v1) has e = (e_2, ½e_0, ½(e_1 − e_2))), its
// area exactly half the parent's.
//
// It panics unless 0 ≤ corner < m.NumCorners() and levels ≥ 0.
func (m *Mesh) RefineGraded(corner int, levels int) *Mesh {
	if corner < 0 || corner >= m.corners {
		panic(fmt.Sprintf("mesh: corner %d out of range [0, %d)", corner, m.corners))
	}
	if levels < 0 {
		panic("mesh: negative number of levels")
	}
	r := m.longestEdgeFirst()
	for l := 0; l < levels; l++ {
		r = r.bisectRound(func(tri [3]int) bool { return tri[0] == corner || tri[1] == corner || tri[2] == corner })
	}
	return r
}

// RefineMarked returns m refined by one round of newest-vertex bisection
// with conforming closure (the scheme of RefineGraded) in which the three
// edges of every triangle t with marked[t] are split: marked triangles are
// split into four or more, and their neighbours as the closure requires.
// It panics unless len(marked) == len(m.Tris).
func (m *Mesh) RefineMarked(marked []bool) *Mesh {
	if len(marked) != len(m.Tris) {
		panic("mesh: one mark per triangle required")
	}
	r := m.longestEdgeFirst()
	// longestEdgeFirst keeps the triangle order, so marks carry over.
	t := -1
	return r.bisectRound(func([3]int) bool { t++; return marked[t] })
}

// longestEdgeFirst returns a copy of m whose triangles are rotated so that
// local edge 0 (the refinement edge) is the longest (by the midpoints of
// the length enclosures, a choice; ties to the lowest local index).
func (m *Mesh) longestEdgeFirst() *Mesh {
	r := &Mesh{
		Nodes:   append([][2]interval.I(nil), m.Nodes...),
		Tris:    make([][3]int, len(m.Tris)),
		Bnd:     append([]BoundaryEdge(nil), m.Bnd...),
		corners: m.corners,
		edge:    make([][3][2]interval.I, len(m.Tris)),
		area:    append([]interval.I(nil), m.area...),
	}
	for t, tri := range m.Tris {
		g := m.Geom(t)
		s := 0
		for i := 1; i < 3; i++ {
			if g.EdgeLen[i].Mid() > g.EdgeLen[s].Mid() {
				s = i
			}
		}
		for i := 0; i < 3; i++ {
			r.Tris[t][i] = tri[(i+s)%3]
			r.edge[t][i] = m.edge[t][(i+s)%3]
		}
	}
	return r
}

// bisectRound performs one round of RefineGraded: the edges of the
// triangles for which mark (called once per triangle, in order) is true
// are marked first.
func (m *Mesh) bisectRound(mark func(tri [3]int) bool) *Mesh {
	edges, triEdges := m.Edges()
	// Triangles of each edge (at most two; −1 for none).
	edgeTris := make([][2]int, len(edges))
	for k := range edgeTris {
		edgeTris[k] = [2]int{-1, -1}
	}
	for t := range m.Tris {
		for i := 0; i < 3; i++ {
			k := triEdges[t][i]
			if edgeTris[k][0] < 0 {
				edgeTris[k][0] = t
			} else {
				edgeTris[k][1] = t
			}
		}
	}
	marked := make([]bool, len(edges))
	var queue []int
	for t, tri := range m.Tris {
		if mark(tri) {
			for i := 0; i < 3; i++ {
				k := triEdges[t][i]
				marked[k] = true
				for _, u := range edgeTris[k] {
					if u >= 0 {
						queue = append(queue, u)
					}
				}
			}
		}
	}
	for len(queue) > 0 {
		t := queue[len(queue)-1]
		queue = queue[:len(queue)-1]
		ref := triEdges[t][0]
		if marked[ref] || !(marked[triEdges[t][1]] || marked[triEdges[t][2]]) {
			continue
		}
		marked[ref] = true
		for _, u := range edgeTris[ref] {
			if u >= 0 && u != t {
				queue = append(queue, u)
			}
		}
	}

	r := &Mesh{
		Nodes:   m.Nodes[:len(m.Nodes):len(m.Nodes)],
		corners: m.corners,
	}
	mid := make([]int, len(edges))
	for k, e := range edges {
		mid[k] = -1
		if marked[k] {
			mid[k] = len(r.Nodes)
			r.Nodes = append(r.Nodes, midpoint(m.Nodes[e[0]], m.Nodes[e[1]]))
		}
	}
	for t, tri := range m.Tris {
		te := triEdges[t]
		if !marked[te[0]] {
			r.addTri(tri, m.edge[t], m.area[t])
			continue
		}
		a, b := bisect(tri, m.edge[t], m.area[t], mid[te[0]])
		// a = (m, v0, v1) has refinement edge v0v1 = parent edge 2;
		// b = (m, v2, v0) has v2v0 = parent edge 1.
		for _, c := range []struct {
			child triangle
			edge  int
		}{{a, te[2]}, {b, te[1]}} {
			if !marked[c.edge] {
				r.addTri(c.child.tri, c.child.e, c.child.area)
				continue
			}
			c1, c2 := bisect(c.child.tri, c.child.e, c.child.area, mid[c.edge])
			r.addTri(c1.tri, c1.e, c1.area)
			r.addTri(c2.tri, c2.e, c2.area)
		}
	}
	idx := newEdgeIndex(len(m.Nodes), edges)
	for _, b := range m.Bnd {
		k := idx.find(b.A, b.B)
		if !marked[k] {
			r.Bnd = append(r.Bnd, b)
			continue
		}
		r.Bnd = append(r.Bnd, BoundaryEdge{b.A, mid[k], b.Side}, BoundaryEdge{mid[k], b.B, b.Side})
	}
	return r
}

// triangle is a triangle with enclosures of its exact edge vectors and area.
type triangle struct {
	tri  [3]int
	e    [3][2]interval.I
	area interval.I
}

// bisect splits (v0, v1, v2) at node mid, the exact midpoint of v1v2, into
// (mid, v0, v1) and (mid, v2, v0), with edge vectors (e_2, ½e_0, ½(e_1 −
// e_2)) and (e_1, ½(e_2 − e_1), ½e_0) (from mid = ½(v1 + v2)) and half the
// area each.
func bisect(tri [3]int, e [3][2]interval.I, area interval.I, mid int) (a, b triangle) {
	half0 := halfVec(e[0])
	var d [2]interval.I // ½(e_1 − e_2)
	for c := 0; c < 2; c++ {
		d[c] = e[1][c].Sub(e[2][c]).MulF(0.5)
	}
	halfArea := area.MulF(0.5)
	a = triangle{[3]int{mid, tri[0], tri[1]}, [3][2]interval.I{e[2], half0, d}, halfArea}
	b = triangle{[3]int{mid, tri[2], tri[0]}, [3][2]interval.I{e[1], negVec(d), half0}, halfArea}
	return a, b
}
