package mesh

import (
	"fmt"

	"gapcert/interval"
)

// Mesh is a conforming triangulation of an exact polygon. Nodes[k]
// encloses the exact point P_k (see the package documentation); the first
// nodes are the polygon's vertices in their order, and refinement keeps
// the numbers of existing nodes. Tris lists each triangle's nodes
// counterclockwise; local edge i of a triangle is the edge opposite its
// local vertex i. Bnd lists every boundary edge once, oriented
// counterclockwise along ∂Ω.
//
// A Mesh is made by FromPolygon, Refine or RefineGraded; its fields must
// not be modified, since the element geometry (Geom) is propagated with the
// triangles.
type Mesh struct {
	Nodes [][2]interval.I
	Tris  [][3]int
	Bnd   []BoundaryEdge

	corners int                // number of polygon vertices (= sides)
	edge    [][3][2]interval.I // per triangle, e_i = P_{i+2} − P_{i+1} (local indices mod 3)
	area    []interval.I       // per triangle, its area; Lo > 0
}

// BoundaryEdge is the boundary edge from node A to node B (counterclockwise
// along ∂Ω), which lies on polygon side Side: the side from vertex Side to
// vertex Side+1 (mod the number of vertices).
type BoundaryEdge struct {
	A, B int
	Side int
}

// Geom is the geometry of one triangle, every field an enclosure of the
// exact value for the exact triangle.
type Geom struct {
	Area    interval.I       // area |T|, with Area.Lo > 0
	Grad    [3][2]interval.I // ∇λ_i of the barycentric coordinates λ_0, λ_1, λ_2
	EdgeLen [3]interval.I    // length of the edge opposite local vertex i
	Edge    [3][2]interval.I // edge vector e_i = P_{i+2} − P_{i+1} (local indices mod 3)
	H       float64          // upper bound of the longest edge length
}

// FromPolygon returns the mesh of the polygon with the given vertex
// enclosures whose triangles are tris (indices into vertices), as given by
// fem/problem's Problem.Triangles. The caller guarantees that the exact
// vertices form a simple counterclockwise polygon (fem/problem verifies
// this); FromPolygon does not trust tris but proves that its exact
// triangles tile that polygon conformingly, by checking
//
//  1. every triangle (a, b, c) has the area enclosure
//     ½((b − a) × (c − a)) with a positive lower end, so every exact
//     triangle in the vertex enclosures is counterclockwise and
//     nondegenerate;
//  2. as oriented edges, every edge a→b of a triangle is matched by exactly
//     one b→a of another triangle, except the polygon sides i→i+1, each of
//     which occurs exactly once and is not matched.
//
// Then the 2-chain Σ_T T has boundary Σ_T ∂T = ∂Ω, so for every point p on
// no edge, Σ_T w(∂T, p) = w(∂Ω, p), w the winding number. A positive
// triangle has w(∂T, p) = 1 inside and 0 outside; a simple
// counterclockwise polygon has w(∂Ω, p) = 1 inside and 0 outside (Jordan's
// theorem for polygons). So every point of Ω off the edges lies in exactly
// one triangle and no point outside lies in any: the triangles tile Ω.
// Since the edge matching is by node, no vertex lies inside another
// triangle's edge (it would be covered twice near that vertex), so the
// triangulation is conforming.
func FromPolygon(vertices [][2]interval.I, tris [][3]int) (*Mesh, error) {
	n := len(vertices)
	if n < 3 {
		return nil, fmt.Errorf("mesh: a polygon needs at least 3 vertices, got %d", n)
	}
	for k, v := range vertices {
		if !v[0].IsBounded() || !v[1].IsBounded() {
			return nil, fmt.Errorf("mesh: vertex %d %v is unbounded", k, v)
		}
	}
	if len(tris) == 0 {
		return nil, fmt.Errorf("mesh: no triangles")
	}
	m := &Mesh{
		Nodes:   append([][2]interval.I(nil), vertices...),
		Tris:    append([][3]int(nil), tris...),
		corners: n,
		edge:    make([][3][2]interval.I, len(tris)),
		area:    make([]interval.I, len(tris)),
	}
	for t, tri := range tris {
		for _, k := range tri {
			if k < 0 || k >= n {
				return nil, fmt.Errorf("mesh: triangle %d %v: vertex index %d out of range [0, %d)", t, tri, k, n)
			}
		}
		if tri[0] == tri[1] || tri[1] == tri[2] || tri[2] == tri[0] {
			return nil, fmt.Errorf("mesh: triangle %d %v repeats a vertex", t, tri)
		}
		m.edge[t] = m.nodeEdges(tri)
		m.area[t] = areaOf(m.edge[t])
		if !(m.area[t].Lo > 0) {
			return nil, fmt.Errorf("mesh: triangle %d %v is not verified counterclockwise: its area encloses %v", t, tri, m.area[t])
		}
	}
	for i := 0; i < n; i++ {
		m.Bnd = append(m.Bnd, BoundaryEdge{A: i, B: (i + 1) % n, Side: i})
	}
	if err := m.checkEdges(); err != nil {
		return nil, err
	}
	return m, nil
}

// nodeEdges returns enclosures of the edge vectors e_i = P_{i+2} − P_{i+1}
// of the triangle with the given nodes, from the node enclosures.
func (m *Mesh) nodeEdges(tri [3]int) [3][2]interval.I {
	var e [3][2]interval.I
	for i := 0; i < 3; i++ {
		p, q := m.Nodes[tri[(i+1)%3]], m.Nodes[tri[(i+2)%3]]
		e[i] = [2]interval.I{q[0].Sub(p[0]), q[1].Sub(p[1])}
	}
	return e
}

// areaOf encloses the area ½ e_1 × e_2 = ½ (P_1 − P_0) × (P_2 − P_0) of a
// triangle from enclosures of its edge vectors.
func areaOf(e [3][2]interval.I) interval.I {
	return e[1][0].Mul(e[2][1]).Sub(e[1][1].Mul(e[2][0])).MulF(0.5)
}

// checkEdges verifies condition 2 of FromPolygon and its refined form:
// every interior edge is in exactly two triangles with opposite
// orientations, and every edge in one triangle only is a boundary edge of
// Bnd with the same orientation; every boundary edge occurs once.
func (m *Mesh) checkEdges() error {
	edges, triEdges := m.Edges()
	type use struct{ fwd, back, bnd int } // a→b in triangles, b→a in triangles, in Bnd (either way)
	uses := make([]use, len(edges))
	for t, tri := range m.Tris {
		for i := 0; i < 3; i++ {
			a, b := tri[(i+1)%3], tri[(i+2)%3]
			if a < b {
				uses[triEdges[t][i]].fwd++
			} else {
				uses[triEdges[t][i]].back++
			}
		}
	}
	idx := newEdgeIndex(len(m.Nodes), edges)
	for j, be := range m.Bnd {
		k := idx.find(be.A, be.B)
		if k < 0 {
			return fmt.Errorf("mesh: boundary edge %d (%d→%d) is no triangle's edge", j, be.A, be.B)
		}
		uses[k].bnd++
		u := uses[k]
		if u.bnd != 1 || u.fwd+u.back != 1 || (be.A < be.B) != (u.fwd == 1) {
			return fmt.Errorf("mesh: boundary edge %d (%d→%d) is not the edge of exactly one triangle with the same orientation", j, be.A, be.B)
		}
	}
	for k, u := range uses {
		if u.bnd == 0 && (u.fwd != 1 || u.back != 1) {
			return fmt.Errorf("mesh: edge %d–%d is in %d triangles as %d→%d and %d the other way, and is not a boundary edge",
				edges[k][0], edges[k][1], u.fwd, edges[k][0], edges[k][1], u.back)
		}
	}
	return nil
}

// NumCorners returns the number of polygon vertices (and sides); nodes
// 0 … NumCorners()−1 are the vertices.
func (m *Mesh) NumCorners() int { return m.corners }

// Vertices returns the node enclosures of triangle t in its local order.
func (m *Mesh) Vertices(t int) [3][2]interval.I {
	tri := m.Tris[t]
	return [3][2]interval.I{m.Nodes[tri[0]], m.Nodes[tri[1]], m.Nodes[tri[2]]}
}

// Geom returns enclosures of the geometry of triangle t. With the edge
// vectors e_i = P_{i+2} − P_{i+1} (local indices mod 3) of the
// counterclockwise exact triangle,
//
//	|T| = ½ e_1 × e_2,   ∇λ_i = (−e_{i,y}, e_{i,x}) / (2|T|),   |e_i| = √(e_{i,x}² + e_{i,y}²):
//
// λ_i is affine, vanishes on edge i and equals 1 at vertex i, whose
// distance from edge i is 2|T|/|e_i|, and (−e_y, e_x) is the normal of e_i
// pointing into a counterclockwise triangle. The edge vectors and the area
// are those propagated by the constructors (each an enclosure of the exact
// value, intersected with the enclosure from the nodes).
func (m *Mesh) Geom(t int) Geom {
	m.mustBeBuilt()
	e, a := m.edge[t], m.area[t]
	var g Geom
	g.Area = a
	g.Edge = e
	twice := a.MulF(2)
	for i := 0; i < 3; i++ {
		g.Grad[i] = [2]interval.I{e[i][1].Neg().Div(twice), e[i][0].Div(twice)}
		g.EdgeLen[i] = edgeLength(e[i])
		if h := g.EdgeLen[i].Hi; h > g.H {
			g.H = h
		}
	}
	return g
}

// edgeLength encloses √(x² + y²) for the vector enclosure v.
func edgeLength(v [2]interval.I) interval.I {
	l, ok := v[0].Sqr().Add(v[1].Sqr()).Sqrt()
	if !ok {
		panic("mesh: square root of a negative sum of squares")
	}
	return l
}

// HMax returns an upper bound of max_T h_T, h_T the longest edge of T.
func (m *Mesh) HMax() float64 {
	m.mustBeBuilt()
	h := 0.0
	for t := range m.Tris {
		for i := 0; i < 3; i++ {
			if l := edgeLength(m.edge[t][i]).Hi; l > h {
				h = l
			}
		}
	}
	return h
}

// mustBeBuilt panics unless m carries the geometry of its triangles, as
// every mesh made by FromPolygon, Refine or RefineGraded does.
func (m *Mesh) mustBeBuilt() {
	if len(m.edge) != len(m.Tris) || len(m.area) != len(m.Tris) {
		panic("mesh: Mesh not made by FromPolygon, Refine or RefineGraded")
	}
}
