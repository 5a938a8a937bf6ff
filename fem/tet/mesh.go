package tet

import (
	"fmt"
	"sort"

	"gapcert/fem/boundary"
	"gapcert/fem/mesh3"
	"gapcert/interval"
)

// Mesh is a conforming tetrahedral mesh of package fem/mesh3 (the proved
// tiling of the exact polyhedron, its node and geometry enclosures, its
// edge and face numbering) as the spaces of this package use it: a view
// that adds only the number of polyhedron faces (sides) that boundary
// conditions are given for. Nothing of the mesh is recomputed here.
//
// Local numbering (that of fem/mesh3). Local vertex i of a tetrahedron is
// its i-th node; local face i is the face opposite local vertex i; local
// edge k joins the local vertices mesh3.LocalEdges[k]. Global edges and
// faces are numbered by their sorted node numbers (mesh3.Mesh.Edges,
// Faces), so two tetrahedra sharing an edge or a face name it the same way
// whatever their local orders: this is the orientation the degrees of
// freedom on edges and faces use.
type Mesh struct {
	m3    *mesh3.Mesh
	sides int

	nodes    [][3]interval.I // m3.Nodes
	tets     [][4]int        // m3.Tets
	bnd      []BoundaryFace  // m3.Bnd
	edges    [][2]int        // sorted node pairs
	tetEdges [][6]int        // per tetrahedron, its local edges
	faces    [][3]int        // sorted node triples
	tetFaces [][4]int        // face opposite local vertex i
	bndOwner [][2]int        // per boundary face: tetrahedron and local face
}

// BoundaryFace is a boundary triangle of the mesh (outward oriented) with
// the polyhedron face it lies on (its side).
type BoundaryFace = mesh3.BoundaryFace

// Geom holds enclosures of the geometry of one exact tetrahedron
// (mesh3.Geom): volume, barycentric gradients ∇λ_i, edge lengths in the
// order of mesh3.LocalEdges, and the diameter (the longest edge).
type Geom = mesh3.Geom

// localEdges lists the local vertex pairs of the six edges.
var localEdges = mesh3.LocalEdges

// NewMesh returns the view of m with sides polyhedron faces. It returns an
// error unless every boundary face of m lies on a face in [0, sides).
// (That the tetrahedra tile the polyhedron conformingly, positively
// oriented, is proved by package fem/mesh3 when m is made.)
func NewMesh(m *mesh3.Mesh, sides int) (*Mesh, error) {
	for k, b := range m.Bnd {
		if b.Face < 0 || b.Face >= sides {
			return nil, fmt.Errorf("tet: boundary face %d (%d, %d, %d) lies on face %d, outside [0, %d)", k, b.A, b.B, b.C, b.Face, sides)
		}
	}
	v := &Mesh{m3: m, sides: sides, nodes: m.Nodes, tets: m.Tets, bnd: m.Bnd, bndOwner: m.BoundaryOwners()}
	v.edges, v.tetEdges = m.Edges()
	v.faces, v.tetFaces = m.Faces()
	return v, nil
}

// Mesh3 returns the mesh of package fem/mesh3 that m views.
func (m *Mesh) Mesh3() *mesh3.Mesh { return m.m3 }

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
func (m *Mesh) Geom(t int) Geom { return m.m3.Geom(t) }

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
	return m.m3.HMax()
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

// RTCells returns the tetrahedra of m as the flux space takes them
// (NewFlux): vertex enclosures and node numbers in local order, and the
// global number of the face opposite each local vertex.
func (m *Mesh) RTCells() []RTCell {
	cells := make([]RTCell, len(m.tets))
	for t, tt := range m.tets {
		cells[t] = RTCell{Vertices: m.Vertices(t), Nodes: tt, Faces: m.tetFaces[t]}
	}
	return cells
}

// faceConditions returns the condition of every boundary face keyed by
// its global face number (NewFlux), from the conditions bc of the
// polyhedron faces.
func (m *Mesh) faceConditions(bc []boundary.Condition) map[int]boundary.Condition {
	out := make(map[int]boundary.Condition, len(m.bnd))
	for k, b := range m.bnd {
		out[m.BoundaryFaceNumber(k)] = bc[b.Face]
	}
	return out
}
