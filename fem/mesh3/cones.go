package mesh3

import (
	"cmp"
	"fmt"
	"slices"

	"gapcert/interval"
)

// Cones returns the mesh of the cone tetrahedra over the outward boundary
// triangles of a polyhedron from an apex: nodes are enclosures of the
// polyhedron's exact points, apex the index in nodes of an exact point
// strictly on the inner side of every face's plane, triangles the outward
// triangles of the faces' triangulations (counterclockwise seen from
// outside) and faces[k] the polyhedron face that holds triangles[k] (as
// fem/problem's Polyhedron gives them: Nodes, the apex len(Vertices),
// Triangles, TriangleFaces). Cones does not modify its arguments.
//
// The cone (apex, a, b, c) over an outward triangle (a, b, c) with the
// apex on the inner side of its plane is positively oriented, and so is
// any cyclic rotation of (a, b, c); FromPolyhedron proves the orientation
// and the tiling again on the enclosures. Refine depends on the local
// vertex order of each tetrahedron, so the triangles are first put in a
// form that depends only on the set of oriented triangles: each rotated
// cyclically to start at its least vertex, and the list sorted by face,
// then by vertices. Every caller that meshes one polyhedron (the
// certifier, its re-check from the canonical problem, the pictures) thus
// gets the same mesh and the same refinements, whatever the order and the
// starting vertices of the triangles it was given.
//
// A tetrahedron (apex 4 over four triangles on the vertices 0–3) is
// returned as its own one-tetrahedron mesh instead of four cones.
//
// Cones panics if triangles and faces differ in length or an index is out
// of range (misuse); FromPolyhedron's errors are returned.
func Cones(nodes [][3]interval.I, apex int, triangles [][3]int, faces []int) (*Mesh, error) {
	if len(triangles) != len(faces) {
		panic(fmt.Sprintf("mesh3: %d triangles but %d face indices", len(triangles), len(faces)))
	}
	if apex < 0 || apex >= len(nodes) {
		panic(fmt.Sprintf("mesh3: apex %d out of range [0, %d)", apex, len(nodes)))
	}
	bnd := make([]BoundaryFace, len(triangles))
	for k, tr := range triangles {
		for _, v := range tr {
			if v < 0 || v >= len(nodes) || v == apex {
				panic(fmt.Sprintf("mesh3: triangle %d has vertex %d (nodes %d, apex %d)", k, v, len(nodes), apex))
			}
		}
		for tr[0] > tr[1] || tr[0] > tr[2] {
			tr = [3]int{tr[1], tr[2], tr[0]}
		}
		bnd[k] = BoundaryFace{A: tr[0], B: tr[1], C: tr[2], Face: faces[k]}
	}
	slices.SortFunc(bnd, func(x, y BoundaryFace) int {
		return cmp.Or(cmp.Compare(x.Face, y.Face), cmp.Compare(x.A, y.A), cmp.Compare(x.B, y.B), cmp.Compare(x.C, y.C))
	})
	if apex == 4 && len(bnd) == 4 {
		// A tetrahedron (vertices 0–3) is its own mesh: the vertex
		// opposite an outward face lies on its inner side, as the apex
		// does, so (d, a, b, c) is positively oriented; the four cones
		// would have its diameter (they share its edges) at four times
		// the tetrahedra.
		b := bnd[0]
		return FromPolyhedron(nodes[:apex], [][4]int{{6 - b.A - b.B - b.C, b.A, b.B, b.C}}, bnd)
	}
	tets := make([][4]int, len(bnd))
	for i, b := range bnd {
		tets[i] = [4]int{apex, b.A, b.B, b.C}
	}
	return FromPolyhedron(nodes, tets, bnd)
}
