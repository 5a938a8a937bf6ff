package tet

import (
	"fmt"
	"sort"

	"gapcert/interval"
)

// Mesh is what the spaces of this package need of a conforming mesh of
// tetrahedra: the node enclosures (every exact node inside its box), the
// tetrahedra as node numbers, and the boundary faces with the polyhedron
// face (side) each lies on. A mesh package supplies these; NewMesh checks
// what the spaces rely on and derives the global edge and face numbering.
//
// Local numbering. Local vertex i of a tetrahedron is Tets[t][i]; local
// face i is the face opposite local vertex i; local edge k joins the
// local vertices localEdges[k]. Global edges and faces are numbered by
// their sorted node numbers, so two tetrahedra sharing an edge or a face
// name it the same way whatever their local orders: this is the
// orientation the degrees of freedom on edges and faces use.
type Mesh struct {
	nodes [][3]interval.I
	tets  [][4]int
	bnd   []BoundaryFace
	sides int

	geom     []Geom
	edges    [][2]int // sorted node pairs
	tetEdges [][6]int
	faces    [][3]int // sorted node triples
	tetFaces [][4]int // face opposite local vertex i
	bndOwner [][2]int // per boundary face: tetrahedron and local face
}

// BoundaryFace is a triangle of the boundary (three node numbers, any
// order) on polyhedron face Side.
type BoundaryFace struct {
	Nodes [3]int
	Side  int
}

// localEdges lists the local vertex pairs of the six edges.
var localEdges = [6][2]int{{0, 1}, {0, 2}, {0, 3}, {1, 2}, {1, 3}, {2, 3}}

// Geom holds enclosures of the geometry of one exact tetrahedron (for
// every exact choice of its nodes inside their enclosures).
//
// With d_k = v_k − v_0 (k = 1, 2, 3) and D = d_1·(d_2 × d_3) > 0 (positive
// orientation), the volume is D/6 and the barycentric gradients are
//
//	∇λ_1 = (d_2 × d_3)/D,  ∇λ_2 = (d_3 × d_1)/D,  ∇λ_3 = (d_1 × d_2)/D,  ∇λ_0 = −∇λ_1 − ∇λ_2 − ∇λ_3,
//
// since ∇λ_k·d_l = δ_kl (the rows of J⁻¹, J = [d_1 d_2 d_3], by the
// cofactor formula) and Σ λ_i = 1.
type Geom struct {
	Volume  interval.I
	Grad    [4][3]interval.I
	EdgeLen [6]interval.I // edge k joins the local vertices localEdges[k]
	Diam    interval.I    // the longest edge: the diameter of a tetrahedron (convex hull of its vertices)
}

// NewMesh checks and indexes a tetrahedral mesh with sides polyhedron
// faces. It returns an error unless every tetrahedron has a volume
// verified > 0 with its nodes in the given order (positive orientation),
// every face of the mesh lies in one or two tetrahedra, every boundary
// face is a face of exactly one tetrahedron, every face of exactly one
// tetrahedron is a boundary face, and every side number is in [0, sides).
// (That the tetrahedra tile a given polyhedron is the mesh package's
// proof; the spaces need only this conformity.)
func NewMesh(nodes [][3]interval.I, tets [][4]int, bnd []BoundaryFace, sides int) (*Mesh, error) {
	m := &Mesh{nodes: nodes, tets: tets, bnd: bnd, sides: sides,
		geom: make([]Geom, len(tets)), tetEdges: make([][6]int, len(tets)), tetFaces: make([][4]int, len(tets))}
	edgeOf := map[[2]int]int{}
	faceOf := map[[3]int]int{}
	var faceCount []int
	var faceOwner [][2]int
	for t, tt := range tets {
		for _, n := range tt {
			if n < 0 || n >= len(nodes) {
				return nil, fmt.Errorf("tet: tetrahedron %d names node %d, outside [0, %d)", t, n, len(nodes))
			}
		}
		g, ok := geometry(m.Vertices(t))
		if !ok {
			return nil, fmt.Errorf("tet: tetrahedron %d %v has no volume verified > 0 (hint: list its nodes in positive orientation)", t, tt)
		}
		m.geom[t] = g
		for k, le := range localEdges {
			key := sort2(tt[le[0]], tt[le[1]])
			e, ok := edgeOf[key]
			if !ok {
				e = len(m.edges)
				edgeOf[key] = e
				m.edges = append(m.edges, key)
			}
			m.tetEdges[t][k] = e
		}
		for i := 0; i < 4; i++ {
			key := sort3(faceNodes(tt, i))
			f, ok := faceOf[key]
			if !ok {
				f = len(m.faces)
				faceOf[key] = f
				m.faces = append(m.faces, key)
				faceCount = append(faceCount, 0)
				faceOwner = append(faceOwner, [2]int{t, i})
			}
			faceCount[f]++
			m.tetFaces[t][i] = f
		}
	}
	isBnd := make([]bool, len(m.faces))
	for k, b := range bnd {
		if b.Side < 0 || b.Side >= sides {
			return nil, fmt.Errorf("tet: boundary face %d on side %d, outside [0, %d)", k, b.Side, sides)
		}
		f, ok := faceOf[sort3(b.Nodes)]
		if !ok || faceCount[f] != 1 || isBnd[f] {
			return nil, fmt.Errorf("tet: boundary face %d %v is not a face of exactly one tetrahedron (or is listed twice)", k, b.Nodes)
		}
		isBnd[f] = true
		m.bndOwner = append(m.bndOwner, faceOwner[f])
	}
	for f, c := range faceCount {
		if c > 2 {
			return nil, fmt.Errorf("tet: face %v lies in %d tetrahedra", m.faces[f], c)
		}
		if c == 1 && !isBnd[f] {
			return nil, fmt.Errorf("tet: face %v lies in one tetrahedron but is not a boundary face", m.faces[f])
		}
	}
	return m, nil
}

func sort2(a, b int) [2]int { return [2]int{min(a, b), max(a, b)} }

func sort3(a [3]int) [3]int {
	s := a[:]
	sort.Ints(s)
	return [3]int{s[0], s[1], s[2]}
}

// faceNodes returns the nodes of local face i (opposite local vertex i)
// in increasing local order.
func faceNodes(tt [4]int, i int) [3]int {
	var out [3]int
	k := 0
	for j := 0; j < 4; j++ {
		if j != i {
			out[k] = tt[j]
			k++
		}
	}
	return out
}

// geometry encloses Geom of the tetrahedron with vertex enclosures v; ok
// is false unless D > 0 is verified.
func geometry(v [4][3]interval.I) (Geom, bool) {
	var d [3][3]interval.I
	for k := 0; k < 3; k++ {
		for c := 0; c < 3; c++ {
			d[k][c] = v[k+1][c].Sub(v[0][c])
		}
	}
	cr := [3][3]interval.I{cross(d[1], d[2]), cross(d[2], d[0]), cross(d[0], d[1])}
	det := dot(d[0], cr[0])
	if !(det.Lo > 0) || !det.IsBounded() {
		return Geom{}, false
	}
	var g Geom
	g.Volume = det.DivF(6)
	for k := 0; k < 3; k++ {
		for c := 0; c < 3; c++ {
			g.Grad[k+1][c] = cr[k][c].Div(det)
		}
	}
	for c := 0; c < 3; c++ {
		g.Grad[0][c] = g.Grad[1][c].Add(g.Grad[2][c]).Add(g.Grad[3][c]).Neg()
	}
	for k, le := range localEdges {
		var s interval.I
		for c := 0; c < 3; c++ {
			s = s.Add(v[le[1]][c].Sub(v[le[0]][c]).Sqr())
		}
		g.EdgeLen[k], _ = s.Sqrt()
		if k == 0 {
			g.Diam = g.EdgeLen[k]
		} else {
			g.Diam = g.Diam.Max(g.EdgeLen[k])
		}
	}
	return g, true
}

func cross(a, b [3]interval.I) [3]interval.I {
	return [3]interval.I{
		a[1].Mul(b[2]).Sub(a[2].Mul(b[1])),
		a[2].Mul(b[0]).Sub(a[0].Mul(b[2])),
		a[0].Mul(b[1]).Sub(a[1].Mul(b[0])),
	}
}

func dot(a, b [3]interval.I) interval.I {
	return a[0].Mul(b[0]).Add(a[1].Mul(b[1])).Add(a[2].Mul(b[2]))
}

// faceArea encloses the area of local face i of tetrahedron t:
// |(b − a) × (c − a)|/2 for its vertices a, b, c.
func (m *Mesh) faceArea(t, i int) interval.I {
	v := m.Vertices(t)
	fn := faceNodes([4]int{0, 1, 2, 3}, i)
	var e1, e2 [3]interval.I
	for c := 0; c < 3; c++ {
		e1[c] = v[fn[1]][c].Sub(v[fn[0]][c])
		e2[c] = v[fn[2]][c].Sub(v[fn[0]][c])
	}
	n := cross(e1, e2)
	a, _ := dot(n, n).Sqrt()
	return a.MulF(0.5)
}

// Vertices returns the node enclosures of tetrahedron t in local order.
func (m *Mesh) Vertices(t int) [4][3]interval.I {
	var v [4][3]interval.I
	for i, n := range m.tets[t] {
		v[i] = m.nodes[n]
	}
	return v
}

// Geom returns the geometry enclosures of tetrahedron t.
func (m *Mesh) Geom(t int) Geom { return m.geom[t] }

// NumTets returns the number of tetrahedra.
func (m *Mesh) NumTets() int { return len(m.tets) }

// NumNodes returns the number of nodes.
func (m *Mesh) NumNodes() int { return len(m.nodes) }

// Tet returns the node numbers of tetrahedron t.
func (m *Mesh) Tet(t int) [4]int { return m.tets[t] }

// NumSides returns the number of polyhedron faces (boundary conditions).
func (m *Mesh) NumSides() int { return m.sides }

// Boundary returns the boundary faces (must not be modified).
func (m *Mesh) Boundary() []BoundaryFace { return m.bnd }

// HMax returns an upper bound of the largest tetrahedron diameter.
func (m *Mesh) HMax() float64 {
	h := 0.0
	for _, g := range m.geom {
		h = max(h, g.Diam.Hi)
	}
	return h
}

// Faces returns the global numbers of the faces of tetrahedron t, the
// face opposite local vertex i first (faces are numbered 0, 1, … without
// gaps, each by its sorted node numbers).
func (m *Mesh) Faces(t int) [4]int { return m.tetFaces[t] }

// NumFaces returns the number of faces of the mesh.
func (m *Mesh) NumFaces() int { return len(m.faces) }

// BoundaryFaceNumber returns the global face number of boundary face k
// (in the order of Boundary).
func (m *Mesh) BoundaryFaceNumber(k int) int {
	o := m.bndOwner[k]
	return m.tetFaces[o[0]][o[1]]
}

// baryApprox returns float barycentric coordinates of x in the
// tetrahedron with vertex enclosures v (midpoints; a choice).
func baryApprox(v [4][3]interval.I, x [3]float64) [4]float64 {
	var d [3][3]float64
	var r [3]float64
	for k := 0; k < 3; k++ {
		for c := 0; c < 3; c++ {
			d[k][c] = v[k+1][c].Mid() - v[0][c].Mid()
		}
	}
	for c := 0; c < 3; c++ {
		r[c] = x[c] - v[0][c].Mid()
	}
	crossF := func(a, b [3]float64) [3]float64 {
		return [3]float64{a[1]*b[2] - a[2]*b[1], a[2]*b[0] - a[0]*b[2], a[0]*b[1] - a[1]*b[0]}
	}
	dotF := func(a, b [3]float64) float64 { return a[0]*b[0] + a[1]*b[1] + a[2]*b[2] }
	det := dotF(d[0], crossF(d[1], d[2]))
	l1 := dotF(r, crossF(d[1], d[2])) / det
	l2 := dotF(r, crossF(d[2], d[0])) / det
	l3 := dotF(r, crossF(d[0], d[1])) / det
	return [4]float64{1 - l1 - l2 - l3, l1, l2, l3}
}
