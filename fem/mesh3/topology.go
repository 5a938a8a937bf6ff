package mesh3

import "sort"

// Edges returns the unique edges of m as node pairs (a, b) with a < b,
// sorted by a and then b, and for each tetrahedron the indices of its
// local edges: tetEdges[t][j] is the edge joining the local vertices
// LocalEdges[j]. The numbering depends only on Tets.
func (m *Mesh) Edges() (edges [][2]int, tetEdges [][6]int) {
	type half struct{ a, b, slot int }
	halves := make([]half, 0, 6*len(m.Tets))
	for t, tet := range m.Tets {
		for j, le := range LocalEdges {
			a, b := tet[le[0]], tet[le[1]]
			if a > b {
				a, b = b, a
			}
			halves = append(halves, half{a, b, 6*t + j})
		}
	}
	sort.Slice(halves, func(i, j int) bool {
		x, y := halves[i], halves[j]
		if x.a != y.a {
			return x.a < y.a
		}
		if x.b != y.b {
			return x.b < y.b
		}
		return x.slot < y.slot
	})
	tetEdges = make([][6]int, len(m.Tets))
	for i, h := range halves {
		if i == 0 || h.a != halves[i-1].a || h.b != halves[i-1].b {
			edges = append(edges, [2]int{h.a, h.b})
		}
		tetEdges[h.slot/6][h.slot%6] = len(edges) - 1
	}
	return edges, tetEdges
}

// Faces returns the unique faces of m as sorted node triples (a < b < c),
// sorted lexicographically, and for each tetrahedron the indices of its
// local faces: tetFaces[t][i] is the face opposite local vertex i. The
// numbering depends only on Tets.
func (m *Mesh) Faces() (faces [][3]int, tetFaces [][4]int) {
	type half struct {
		k    [3]int
		slot int
	}
	halves := make([]half, 0, 4*len(m.Tets))
	for t, tet := range m.Tets {
		for i, f := range LocalFaces {
			k, _ := faceKey(tet[f[0]], tet[f[1]], tet[f[2]])
			halves = append(halves, half{k, 4*t + i})
		}
	}
	sort.Slice(halves, func(i, j int) bool {
		if halves[i].k != halves[j].k {
			return less3(halves[i].k, halves[j].k)
		}
		return halves[i].slot < halves[j].slot
	})
	tetFaces = make([][4]int, len(m.Tets))
	for i, h := range halves {
		if i == 0 || h.k != halves[i-1].k {
			faces = append(faces, h.k)
		}
		tetFaces[h.slot/4][h.slot%4] = len(faces) - 1
	}
	return faces, tetFaces
}

// BoundaryOwners returns, for each boundary face Bnd[k], the tetrahedron
// t and its local face i (opposite local vertex i) that contain it: the
// outward order LocalFaces[i] of the tetrahedron runs through the
// boundary triangle's nodes in the same cyclic order as Bnd[k]. It panics
// if a boundary face is in no tetrahedron (impossible for meshes made by
// this package).
func (m *Mesh) BoundaryOwners() [][2]int {
	owner := make(map[[3]int][2]int, len(m.Bnd))
	for _, b := range m.Bnd {
		k, _ := faceKey(b.A, b.B, b.C)
		owner[k] = [2]int{-1, -1}
	}
	for t, tet := range m.Tets {
		for i, f := range LocalFaces {
			k, _ := faceKey(tet[f[0]], tet[f[1]], tet[f[2]])
			if _, ok := owner[k]; ok {
				owner[k] = [2]int{t, i}
			}
		}
	}
	out := make([][2]int, len(m.Bnd))
	for j, b := range m.Bnd {
		k, _ := faceKey(b.A, b.B, b.C)
		o := owner[k]
		if o[0] < 0 {
			panic("mesh3: boundary face not found in the mesh tetrahedra")
		}
		out[j] = o
	}
	return out
}

// edgeIndex finds the number of an edge from its nodes.
type edgeIndex struct {
	start []int // edges with smaller node a are other[start[a]:start[a+1]]
	other []int // their larger nodes, increasing
}

// newEdgeIndex indexes edges as returned by Edges (sorted by (a, b)), so
// that edge k sits at position k.
func newEdgeIndex(n int, edges [][2]int) edgeIndex {
	x := edgeIndex{start: make([]int, n+1), other: make([]int, len(edges))}
	for k, e := range edges {
		x.start[e[0]+1]++
		x.other[k] = e[1]
	}
	for a := 0; a < n; a++ {
		x.start[a+1] += x.start[a]
	}
	return x
}

// find returns the number of the edge joining a and b, or −1.
func (x edgeIndex) find(a, b int) int {
	if a > b {
		a, b = b, a
	}
	lo, hi := x.start[a], x.start[a+1]
	k := lo + sort.SearchInts(x.other[lo:hi], b)
	if k < hi && x.other[k] == b {
		return k
	}
	return -1
}
