package mesh3

import (
	"fmt"
	"sort"

	"gapcert/interval"
)

// Mesh is a conforming tetrahedralisation of an exact polyhedron.
// Nodes[k] encloses the exact point P_k (see the package documentation);
// the first nodes are those given to FromPolyhedron, and refinement keeps
// the numbers of existing nodes. Tets lists each tetrahedron's nodes in a
// positively oriented order: det(P_1 − P_0, P_2 − P_0, P_3 − P_0) > 0.
// Local edge j of a tetrahedron joins its local vertices LocalEdges[j];
// local face i is the face opposite local vertex i, with the outward
// vertex order LocalFaces[i]. Bnd lists every boundary face once, outward
// oriented.
//
// A Mesh is made by FromPolyhedron, Refine or RefineToward; its fields must not be
// modified, since the element geometry (Geom) and the refinement order are
// carried with the tetrahedra.
type Mesh struct {
	Nodes [][3]interval.I
	Tets  [][4]int
	Bnd   []BoundaryFace

	given   int                // number of nodes given to FromPolyhedron
	parents [][2]int           // node given+k is the exact midpoint of nodes parents[k]
	swap    []bool             // the refinement order of Tets[t] exchanges its local vertices 2 and 3
	edge    [][3][3]interval.I // per tetrahedron, e_j = P_j − P_0 (j = 1, 2, 3; local order of Tets)
	vol     []interval.I       // per tetrahedron, its volume; Lo > 0
}

// BoundaryFace is the boundary triangle (A, B, C), counterclockwise seen
// from outside the polyhedron, which lies in polyhedron face Face.
type BoundaryFace struct {
	A, B, C int
	Face    int
}

// LocalEdges lists the local vertices of the six edges of a tetrahedron.
var LocalEdges = [6][2]int{{0, 1}, {0, 2}, {0, 3}, {1, 2}, {1, 3}, {2, 3}}

// LocalFaces lists, for each local vertex i, the face opposite it in the
// order that is counterclockwise seen from outside a positively oriented
// tetrahedron.
var LocalFaces = [4][3]int{{1, 2, 3}, {0, 3, 2}, {0, 1, 3}, {0, 2, 1}}

// Geom is the geometry of one tetrahedron, every field an enclosure of the
// exact value for the exact tetrahedron.
type Geom struct {
	Volume  interval.I       // |T|, with Volume.Lo > 0
	Grad    [4][3]interval.I // ∇λ_i of the barycentric coordinates λ_0 … λ_3
	EdgeLen [6]interval.I    // lengths of the edges LocalEdges
	Edge    [3][3]interval.I // e_j = P_j − P_0, j = 1, 2, 3
	Diam    interval.I       // the diameter, the longest edge
	H       float64          // upper bound of the diameter
}

// FromPolyhedron returns the mesh with the given node enclosures whose
// tetrahedra are tets (indices into nodes) and whose boundary triangles
// are bnd, as given by fem/problem's Polyhedron (Nodes, Tetrahedra,
// Triangles and TriangleFaces). The caller guarantees that bnd lists the
// triangles of a triangulation of a closed embedded surface, each
// outward oriented, with the polyhedron P inside (fem/problem verifies
// this). FromPolyhedron does not trust tets but proves that its exact
// tetrahedra tile P conformingly, by checking
//
//  1. every tetrahedron (a, b, c, d) has the volume enclosure
//     det(b − a, c − a, d − a)/6 with a positive lower end, so every
//     exact tetrahedron in the node enclosures is positively oriented and
//     nondegenerate;
//  2. as oriented triangles, every face of a tetrahedron (oriented
//     outward, LocalFaces) is matched by exactly one face of another
//     tetrahedron with the same nodes and the opposite orientation, except
//     the triangles of bnd, each of which is the face of exactly one
//     tetrahedron with the same orientation and is not matched.
//
// Then the 3-chain Σ_T T has boundary Σ_T ∂T = Σ bnd = ∂P, so for every
// point p on no face, Σ_T w(∂T, p) = w(∂P, p), w the winding number (the
// degree of the map of the surface to the unit sphere around p), which is
// additive over 2-chains and vanishes on pairs of opposite triangles. A
// positively oriented tetrahedron has w(∂T, p) = 1 inside and 0 outside;
// a closed embedded surface oriented outward has w = 1 inside the solid it
// bounds and 0 outside (Jordan–Brouwer separation theorem for polyhedral
// surfaces, e.g. Moise 1977). So every point of P off the faces lies in
// exactly one tetrahedron and no point outside P lies in any: the
// tetrahedra tile P. Since the faces are matched by their nodes, no node
// lies in the relative interior of another tetrahedron's face or edge:
// the tetrahedra around that face or edge cover a neighbourhood of the
// node in P, and the tetrahedron with that vertex would cover points near
// it a second time. So two tetrahedra meet in a common face, edge, vertex
// or not at all.
func FromPolyhedron(nodes [][3]interval.I, tets [][4]int, bnd []BoundaryFace) (*Mesh, error) {
	n := len(nodes)
	for k, v := range nodes {
		for c := range 3 {
			if !v[c].IsBounded() {
				return nil, fmt.Errorf("mesh3: node %d %v is unbounded", k, v)
			}
		}
	}
	if len(tets) == 0 {
		return nil, fmt.Errorf("mesh3: no tetrahedra")
	}
	if len(bnd) < 4 {
		return nil, fmt.Errorf("mesh3: a closed surface needs at least 4 boundary triangles, got %d", len(bnd))
	}
	m := &Mesh{
		Nodes: append([][3]interval.I(nil), nodes...),
		Tets:  append([][4]int(nil), tets...),
		Bnd:   append([]BoundaryFace(nil), bnd...),
		given: n,
		swap:  make([]bool, len(tets)),
		edge:  make([][3][3]interval.I, len(tets)),
		vol:   make([]interval.I, len(tets)),
	}
	for t, tet := range tets {
		for _, k := range tet {
			if k < 0 || k >= n {
				return nil, fmt.Errorf("mesh3: tetrahedron %d %v: node index %d out of range [0, %d)", t, tet, k, n)
			}
		}
		for i := range 4 {
			for j := i + 1; j < 4; j++ {
				if tet[i] == tet[j] {
					return nil, fmt.Errorf("mesh3: tetrahedron %d %v repeats a node", t, tet)
				}
			}
		}
		m.edge[t] = m.nodeEdges(tet)
		m.vol[t] = volumeOf(m.edge[t])
		if !(m.vol[t].Lo > 0) {
			return nil, fmt.Errorf("mesh3: tetrahedron %d %v is not verified positively oriented: its volume encloses %v", t, tet, m.vol[t])
		}
	}
	for j, b := range bnd {
		for _, k := range []int{b.A, b.B, b.C} {
			if k < 0 || k >= n {
				return nil, fmt.Errorf("mesh3: boundary triangle %d: node index %d out of range [0, %d)", j, k, n)
			}
		}
	}
	if err := m.checkFaces(); err != nil {
		return nil, err
	}
	return m, nil
}

// nodeEdges encloses the edge vectors P_j − P_0 (j = 1, 2, 3) of the
// tetrahedron with the given nodes, from the node enclosures.
func (m *Mesh) nodeEdges(tet [4]int) [3][3]interval.I {
	var e [3][3]interval.I
	p := m.Nodes[tet[0]]
	for j := 1; j < 4; j++ {
		q := m.Nodes[tet[j]]
		for c := range 3 {
			e[j-1][c] = q[c].Sub(p[c])
		}
	}
	return e
}

// cross encloses u × v.
func cross(u, v [3]interval.I) [3]interval.I {
	return [3]interval.I{
		u[1].Mul(v[2]).Sub(u[2].Mul(v[1])),
		u[2].Mul(v[0]).Sub(u[0].Mul(v[2])),
		u[0].Mul(v[1]).Sub(u[1].Mul(v[0])),
	}
}

func dot(u, v [3]interval.I) interval.I {
	return u[0].Mul(v[0]).Add(u[1].Mul(v[1])).Add(u[2].Mul(v[2]))
}

// volumeOf encloses det(e_1, e_2, e_3)/6 = e_1·(e_2 × e_3)/6, the signed
// volume of the tetrahedron with edge vectors e_j = P_j − P_0.
func volumeOf(e [3][3]interval.I) interval.I {
	return dot(e[0], cross(e[1], e[2])).Div(interval.Point(6))
}

// faceKey is a triangle's nodes sorted increasingly and whether the given
// order is an even permutation of the sorted one (the same orientation).
func faceKey(a, b, c int) (key [3]int, even bool) {
	even = true
	if a > b {
		a, b, even = b, a, !even
	}
	if b > c {
		b, c, even = c, b, !even
	}
	if a > b {
		a, b, even = b, a, !even
	}
	return [3]int{a, b, c}, even
}

// checkFaces verifies condition 2 of FromPolyhedron.
func (m *Mesh) checkFaces() error {
	type use struct{ even, odd, bnd int } // faces of tetrahedra with each orientation; boundary triangles
	uses := make(map[[3]int]*use, 2*len(m.Tets))
	get := func(k [3]int) *use {
		u := uses[k]
		if u == nil {
			u = &use{}
			uses[k] = u
		}
		return u
	}
	for _, tet := range m.Tets {
		for _, f := range LocalFaces {
			k, even := faceKey(tet[f[0]], tet[f[1]], tet[f[2]])
			if even {
				get(k).even++
			} else {
				get(k).odd++
			}
		}
	}
	for j, b := range m.Bnd {
		k, even := faceKey(b.A, b.B, b.C)
		u := uses[k]
		if u == nil {
			return fmt.Errorf("mesh3: boundary triangle %d (%d, %d, %d) is no tetrahedron's face", j, b.A, b.B, b.C)
		}
		u.bnd++
		same := u.even
		if !even {
			same = u.odd
		}
		if u.bnd != 1 || u.even+u.odd != 1 || same != 1 {
			return fmt.Errorf("mesh3: boundary triangle %d (%d, %d, %d) is not the face of exactly one tetrahedron with the same orientation", j, b.A, b.B, b.C)
		}
	}
	keys := make([][3]int, 0, len(uses))
	for k := range uses {
		keys = append(keys, k)
	}
	sort.Slice(keys, func(i, j int) bool { return less3(keys[i], keys[j]) })
	for _, k := range keys {
		if u := uses[k]; u.bnd == 0 && (u.even != 1 || u.odd != 1) {
			return fmt.Errorf("mesh3: face %v is in %d tetrahedra with one orientation and %d with the other, and is not a boundary triangle", k, u.even, u.odd)
		}
	}
	return nil
}

func less3(a, b [3]int) bool {
	for i := range 3 {
		if a[i] != b[i] {
			return a[i] < b[i]
		}
	}
	return false
}

// NumGiven returns the number of nodes given to FromPolyhedron; nodes
// 0 … NumGiven()−1 are those nodes.
func (m *Mesh) NumGiven() int { return m.given }

// Vertices returns the node enclosures of tetrahedron t in its local
// order.
func (m *Mesh) Vertices(t int) [4][3]interval.I {
	tet := m.Tets[t]
	return [4][3]interval.I{m.Nodes[tet[0]], m.Nodes[tet[1]], m.Nodes[tet[2]], m.Nodes[tet[3]]}
}

// Geom returns enclosures of the geometry of tetrahedron t. With the edge
// vectors e_j = P_j − P_0 and D = det(e_1, e_2, e_3) = 6|T| > 0,
//
//	∇λ_1 = (e_2 × e_3)/D,  ∇λ_2 = (e_3 × e_1)/D,  ∇λ_3 = (e_1 × e_2)/D,  ∇λ_0 = −(∇λ_1 + ∇λ_2 + ∇λ_3):
//
// the rows ∇λ_j of the inverse of the matrix with columns e_j satisfy
// ∇λ_i · e_j = δ_ij (e_i · (e_j × e_k) is D for (i, j, k) a cyclic
// permutation of (1, 2, 3) and 0 when two indices agree), so λ_j is the
// affine function that is 1 at P_j and 0 at the other vertices, and the
// four sum to 1. The edge lengths are the norms of e_1, e_2, e_3,
// e_2 − e_1, e_3 − e_1, e_3 − e_2 (LocalEdges), and the diameter of a
// tetrahedron is its longest edge (the distance is convex, so its maximum
// over T × T is attained at pairs of vertices).
func (m *Mesh) Geom(t int) Geom {
	m.mustBeBuilt()
	e := m.edge[t]
	g := Geom{Volume: m.vol[t], Edge: e}
	d := m.vol[t].MulF(6)
	for j := range 3 {
		c := cross(e[(j+1)%3], e[(j+2)%3])
		for k := range 3 {
			g.Grad[j+1][k] = c[k].Div(d)
		}
	}
	for k := range 3 {
		g.Grad[0][k] = g.Grad[1][k].Add(g.Grad[2][k]).Add(g.Grad[3][k]).Neg()
	}
	for j, le := range LocalEdges {
		g.EdgeLen[j] = length(edgeVector(e, le[0], le[1]))
		if j == 0 {
			g.Diam = g.EdgeLen[j]
		} else {
			g.Diam = g.Diam.Max(g.EdgeLen[j])
		}
	}
	g.H = g.Diam.Hi
	return g
}

// edgeVector encloses P_b − P_a from the edge vectors e_j = P_j − P_0.
func edgeVector(e [3][3]interval.I, a, b int) [3]interval.I {
	if a == 0 {
		return e[b-1]
	}
	var v [3]interval.I
	for c := range 3 {
		v[c] = e[b-1][c].Sub(e[a-1][c])
	}
	return v
}

// length encloses the Euclidean norm of v.
func length(v [3]interval.I) interval.I {
	l, ok := v[0].Sqr().Add(v[1].Sqr()).Add(v[2].Sqr()).Sqrt()
	if !ok {
		panic("mesh3: square root of a negative sum of squares")
	}
	return l
}

// HMax returns an upper bound of max_T diam(T).
func (m *Mesh) HMax() float64 {
	m.mustBeBuilt()
	h := 0.0
	for t := range m.Tets {
		for _, le := range LocalEdges {
			if l := length(edgeVector(m.edge[t], le[0], le[1])).Hi; l > h {
				h = l
			}
		}
	}
	return h
}

// mustBeBuilt panics unless m carries the geometry of its tetrahedra, as
// every mesh made by this package does.
func (m *Mesh) mustBeBuilt() {
	if len(m.edge) != len(m.Tets) || len(m.vol) != len(m.Tets) || len(m.swap) != len(m.Tets) ||
		len(m.parents) != len(m.Nodes)-m.given {
		panic("mesh3: Mesh not made by this package")
	}
}
