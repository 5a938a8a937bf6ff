package mesh

import "sort"

// Edges returns the unique edges of m as node pairs (a, b) with a < b,
// sorted by a and then b, and for each triangle the indices of its local
// edges: triEdges[t][i] is the edge opposite local vertex i, joining local
// vertices i+1 and i+2 (mod 3). The numbering depends only on Tris.
func (m *Mesh) Edges() (edges [][2]int, triEdges [][3]int) {
	n := len(m.Nodes)
	// Bucket the 3·len(Tris) half-edges by their smaller node.
	start := make([]int, n+1)
	for _, tri := range m.Tris {
		for i := 0; i < 3; i++ {
			a, _ := edgeKey(tri, i)
			start[a+1]++
		}
	}
	for a := 0; a < n; a++ {
		start[a+1] += start[a]
	}
	type half struct{ b, slot int } // other node, 3t+i
	halves := make([]half, start[n])
	fill := append([]int(nil), start[:n]...)
	for t, tri := range m.Tris {
		for i := 0; i < 3; i++ {
			a, b := edgeKey(tri, i)
			halves[fill[a]] = half{b, 3*t + i}
			fill[a]++
		}
	}
	triEdges = make([][3]int, len(m.Tris))
	for a := 0; a < n; a++ {
		bucket := halves[start[a]:start[a+1]]
		// Insertion sort by (b, slot): buckets hold a node's few edges.
		for j := 1; j < len(bucket); j++ {
			h := bucket[j]
			k := j
			for ; k > 0 && (bucket[k-1].b > h.b || bucket[k-1].b == h.b && bucket[k-1].slot > h.slot); k-- {
				bucket[k] = bucket[k-1]
			}
			bucket[k] = h
		}
		for j, h := range bucket {
			if j == 0 || h.b != bucket[j-1].b {
				edges = append(edges, [2]int{a, h.b})
			}
			triEdges[h.slot/3][h.slot%3] = len(edges) - 1
		}
	}
	return edges, triEdges
}

// edgeKey returns the nodes (a < b) of local edge i of tri.
func edgeKey(tri [3]int, i int) (a, b int) {
	a, b = tri[(i+1)%3], tri[(i+2)%3]
	if a > b {
		a, b = b, a
	}
	return a, b
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

// BoundaryOwners returns, for each boundary edge Bnd[k], the triangle t
// and local edge i (opposite local vertex i) that contain it: the
// counterclockwise triangle traverses a boundary edge in the same direction
// A → B as ∂Ω. It panics if a boundary edge is in no triangle (impossible
// for meshes made by this package).
func (m *Mesh) BoundaryOwners() [][2]int {
	type dirEdge struct{ a, b int }
	owner := make(map[dirEdge][2]int, 3*len(m.Tris))
	for t, tri := range m.Tris {
		for i := 0; i < 3; i++ {
			owner[dirEdge{tri[(i+1)%3], tri[(i+2)%3]}] = [2]int{t, i}
		}
	}
	out := make([][2]int, len(m.Bnd))
	for k, be := range m.Bnd {
		ti, ok := owner[dirEdge{be.A, be.B}]
		if !ok {
			panic("mesh: boundary edge not found in the mesh triangles")
		}
		out[k] = ti
	}
	return out
}
