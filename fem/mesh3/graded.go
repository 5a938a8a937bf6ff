package mesh3

import (
	"fmt"
	"math"
	"slices"

	"gapcert/interval"
)

// Target is a closed segment between two given nodes (A ≠ B), or a given
// node (A == B), toward which RefineToward grades a mesh by Levels rounds.
// A and B index the nodes given to FromPolyhedron (0 ≤ A, B < NumGiven()).
type Target struct {
	A, B   int
	Levels int
}

// lengthBitsDropped is how many low bits of the 52 of the significand of
// an edge's squared length RefineToward's order rounds away (to nearest),
// far more than the rounding errors of a length from exact points (a few
// units in the last place) and far fewer than separate the lengths that
// matter for the shapes (relative 2^−28 ≈ 4e-9). Exact squared lengths
// with few bits, such as those of dyadic points, are unchanged.
const lengthBitsDropped = 24

// RefineToward returns m refined toward the targets: in round j = 1, 2, …
// up to the largest Levels, every tetrahedron with a node on a target of
// at least j levels has its six edges split (its diameter halves), and
// its neighbours are split as conformity requires. A mesh without targets
// or levels is returned as a copy.
//
// Which nodes lie on a target is decided exactly, without arithmetic, for
// targets that contain no given node but their ends (edges and vertices of
// the polyhedron; the caller guarantees it): a given node lies on target
// (A, B) when it is A or B, and a midpoint node
// lies on it when both nodes it is the midpoint of do (the midpoint of two
// points of a segment lies on it; conversely, if it lies on the segment's
// line while one of its parents does not, neither does the other, and a
// conforming mesh has no edge through a given node's position, so a mesh
// edge along the segment's line lies in the segment).
//
// A round is a bisection of the marked edges with conforming closure:
//
//  1. the six edges of every tetrahedron touching a target are marked;
//  2. closure (for shape, not for conformity): while a tetrahedron has a
//     marked edge and its longest edge is unmarked, its longest edge is
//     marked. Edges are ordered by their length (from the midpoints of the
//     node enclosures, a choice; the squared length rounded to 28
//     significant bits, lengthBitsDropped) and then by their nodes, a
//     strict order that depends only on the edge. The rounding makes
//     edges of equal exact length whose computed lengths differ by
//     rounding errors tie, so a polyhedron moved rigidly (an exact
//     rotation and translation, vertices in the same order) is graded
//     into the same tetrahedra. This ends since marks are only added
//     (Rivara's longest-edge propagation, M.-C. Rivara and C. Levin,
//     Commun. Appl. Numer. Methods 8 (1992) 281–290; the first
//     bisection of every refined tetrahedron is at its longest edge);
//  3. the exact midpoint of every marked edge becomes one new node, and
//     every tetrahedron is split by the face rule in three dimensions:
//     while a piece has a marked edge of the old mesh, it is bisected at
//     the greatest such edge (in the order of step 2) into the two pieces
//     in which one end of that edge is replaced by its midpoint. Boundary
//     triangles are split by the same rule.
//
// Conformity. The pieces of a face F of the old mesh that one tetrahedron
// holding F makes are those of the rule applied to F alone: when a piece
// of the tetrahedron is bisected at an edge f, a face piece F′ of it
// either contains f, and then f is also the greatest marked edge of F′,
// or misses one end of f and is a face of one child unchanged; a piece's
// marked edges are the old marked edges among its own edges, so F′ keeps
// its marks either way. Both tetrahedra on an interior face (or the
// tetrahedron and the boundary triangle on a boundary face) therefore
// split it into the same triangles, and the faces made inside one
// tetrahedron match in the same way. Each bisection of an exact
// tetrahedron at the exact midpoint of an edge tiles it exactly with two
// tetrahedra of half its volume, positively oriented in the same order (a
// vertex replaced by the midpoint of an edge through it halves the
// determinant); midpoints of boundary edges lie exactly in their face.
//
// Proof. The construction is not trusted: RefineToward checks the tiling
// of its result as FromPolyhedron does (every volume enclosure has a
// positive lower end; the oriented faces cancel in pairs except the
// boundary triangles, which refine the old ones at exact midpoints, so
// they still sum to the boundary of the polyhedron) and returns an error
// if the check fails. Shape regularity of longest-edge bisection in three
// dimensions is observed, not proven; it affects how narrow later bounds
// are, never whether they hold.
//
// Old nodes keep their numbers; new nodes and tetrahedra are numbered in
// the order of the rounds, of the edges and of the tetrahedra, which
// depends only on m and the targets. Each child's volume is exactly half
// its parent's, intersected with the enclosure from its nodes.
//
// It panics if a target's nodes are not given nodes or its levels are
// negative (misuse).
func (m *Mesh) RefineToward(targets []Target) (*Mesh, error) {
	m.mustBeBuilt()
	rounds := 0
	for _, tg := range targets {
		if tg.A < 0 || tg.A >= m.given || tg.B < 0 || tg.B >= m.given {
			panic(fmt.Sprintf("mesh3: target (%d, %d) outside the given nodes [0, %d)", tg.A, tg.B, m.given))
		}
		if tg.Levels < 0 {
			panic(fmt.Sprintf("mesh3: target (%d, %d) with %d levels", tg.A, tg.B, tg.Levels))
		}
		rounds = max(rounds, tg.Levels)
	}
	r := m.clone()
	for j := 1; j <= rounds; j++ {
		var segs [][2]int
		for _, tg := range targets {
			if tg.Levels >= j {
				segs = append(segs, [2]int{tg.A, tg.B})
			}
		}
		r = r.bisectRound(r.touching(segs))
	}
	if err := r.checkTiling(); err != nil {
		return nil, fmt.Errorf("mesh3: the graded mesh fails the tiling check: %v", err)
	}
	return r, nil
}

// clone returns a copy of m that shares no slice with it.
func (m *Mesh) clone() *Mesh {
	return &Mesh{
		Nodes:   slices.Clone(m.Nodes),
		Tets:    slices.Clone(m.Tets),
		Bnd:     slices.Clone(m.Bnd),
		given:   m.given,
		parents: slices.Clone(m.parents),
		swap:    slices.Clone(m.swap),
		edge:    slices.Clone(m.edge),
		vol:     slices.Clone(m.vol),
	}
}

// checkTiling checks conditions 1 and 2 of FromPolyhedron on m.
func (m *Mesh) checkTiling() error {
	for t, v := range m.vol {
		if !(v.Lo > 0) {
			return fmt.Errorf("tetrahedron %d %v has the volume enclosure %v", t, m.Tets[t], v)
		}
	}
	return m.checkFaces()
}

// onSegments reports, for every node, whether it lies on one of the
// segments (pairs of given nodes; a pair (a, a) is the node a), decided
// exactly from the nodes' parents (RefineToward).
func (m *Mesh) onSegments(segs [][2]int) []bool {
	on := make([]bool, len(m.Nodes))
	if len(segs) == 0 {
		return on
	}
	// sets[k] lists the segments node k lies on.
	sets := make([][]int32, len(m.Nodes))
	for s, sg := range segs {
		sets[sg[0]] = append(sets[sg[0]], int32(s))
		if sg[1] != sg[0] {
			sets[sg[1]] = append(sets[sg[1]], int32(s))
		}
	}
	for k := m.given; k < len(m.Nodes); k++ {
		pa := m.parents[k-m.given]
		for _, s := range sets[pa[0]] {
			if slices.Contains(sets[pa[1]], s) {
				sets[k] = append(sets[k], s)
			}
		}
	}
	for k := range on {
		on[k] = len(sets[k]) > 0
	}
	return on
}

// touching returns, per tetrahedron, whether one of its nodes lies on one
// of the segments.
func (m *Mesh) touching(segs [][2]int) []bool {
	on := m.onSegments(segs)
	out := make([]bool, len(m.Tets))
	for t, tet := range m.Tets {
		out[t] = on[tet[0]] || on[tet[1]] || on[tet[2]] || on[tet[3]]
	}
	return out
}

// bisectRound performs one round of RefineToward in which the edges of
// the tetrahedra with refine[t] are marked.
func (m *Mesh) bisectRound(refine []bool) *Mesh {
	edges, tetEdges := m.Edges()
	n0 := len(m.Nodes)
	// The order of step 2: squared length from the nodes' midpoints, then
	// the nodes (edges are sorted by their nodes, so by index).
	len2 := make([]float64, len(edges))
	for k, e := range edges {
		p, q := m.Nodes[e[0]], m.Nodes[e[1]]
		for c := range 3 {
			d := q[c].Mid() - p[c].Mid()
			len2[k] += float64(d * d)
		}
		len2[k] = math.Float64frombits((math.Float64bits(len2[k]) + 1<<(lengthBitsDropped-1)) &^ (1<<lengthBitsDropped - 1))
	}
	greater := func(a, b int) bool { return len2[a] > len2[b] || len2[a] == len2[b] && a > b }
	longest := make([]int, len(m.Tets))
	for t := range m.Tets {
		l := tetEdges[t][0]
		for _, k := range tetEdges[t][1:] {
			if greater(k, l) {
				l = k
			}
		}
		longest[t] = l
	}
	// Tetrahedra around each edge, for the closure's work list.
	start := make([]int, len(edges)+1)
	for _, te := range tetEdges {
		for _, k := range te {
			start[k+1]++
		}
	}
	for k := range edges {
		start[k+1] += start[k]
	}
	around := make([]int, start[len(edges)])
	fill := slices.Clone(start[:len(edges)])
	for t, te := range tetEdges {
		for _, k := range te {
			around[fill[k]] = t
			fill[k]++
		}
	}
	marked := make([]bool, len(edges))
	var queue []int
	mark := func(k int) {
		if !marked[k] {
			marked[k] = true
			queue = append(queue, around[start[k]:start[k+1]]...)
		}
	}
	for t, ref := range refine {
		if ref {
			for _, k := range tetEdges[t] {
				mark(k)
			}
		}
	}
	for len(queue) > 0 {
		t := queue[len(queue)-1]
		queue = queue[:len(queue)-1]
		mark(longest[t]) // t has a marked edge: it was queued when one was marked
	}

	r := &Mesh{
		Nodes:   slices.Clone(m.Nodes),
		Tets:    make([][4]int, 0, len(m.Tets)),
		Bnd:     make([]BoundaryFace, 0, len(m.Bnd)),
		given:   m.given,
		parents: slices.Clone(m.parents),
		swap:    make([]bool, 0, len(m.Tets)),
		edge:    make([][3][3]interval.I, 0, len(m.Tets)),
		vol:     make([]interval.I, 0, len(m.Tets)),
	}
	mid := make([]int, len(edges))
	for k, e := range edges {
		mid[k] = -1
		if marked[k] {
			mid[k] = len(r.Nodes)
			p, q := m.Nodes[e[0]], m.Nodes[e[1]]
			r.Nodes = append(r.Nodes, [3]interval.I{p[0].Add(q[0]).MulF(0.5), p[1].Add(q[1]).MulF(0.5), p[2].Add(q[2]).MulF(0.5)})
			r.parents = append(r.parents, e)
		}
	}
	idx := newEdgeIndex(n0, edges)
	// split returns the greatest marked old edge among the pairs of
	// nodes, as local positions (i, j) and its edge number, or ok false.
	split := func(nodes []int) (i, j, k int, ok bool) {
		k = -1
		for a := range nodes {
			for b := a + 1; b < len(nodes); b++ {
				if nodes[a] >= n0 || nodes[b] >= n0 {
					continue
				}
				if e := idx.find(nodes[a], nodes[b]); e >= 0 && marked[e] && (k < 0 || greater(e, k)) {
					i, j, k = a, b, e
				}
			}
		}
		return i, j, k, k >= 0
	}
	var bisectTet func(tet [4]int, vol interval.I, swap bool)
	bisectTet = func(tet [4]int, vol interval.I, swap bool) {
		i, j, k, ok := split(tet[:])
		if !ok {
			r.addTet(tet, swap, r.nodeEdges(tet), vol)
			return
		}
		half := vol.MulF(0.5)
		a, b := tet, tet
		a[j], b[i] = mid[k], mid[k]
		bisectTet(a, half, false)
		bisectTet(b, half, false)
	}
	for t, tet := range m.Tets {
		if _, _, _, ok := split(tet[:]); !ok {
			r.Tets = append(r.Tets, tet)
			r.swap = append(r.swap, m.swap[t])
			r.edge = append(r.edge, m.edge[t])
			r.vol = append(r.vol, m.vol[t])
			continue
		}
		bisectTet(tet, m.vol[t], false)
	}
	var bisectFace func(f BoundaryFace)
	bisectFace = func(f BoundaryFace) {
		nodes := []int{f.A, f.B, f.C}
		i, j, k, ok := split(nodes)
		if !ok {
			r.Bnd = append(r.Bnd, f)
			return
		}
		a, b := slices.Clone(nodes), slices.Clone(nodes)
		a[j], b[i] = mid[k], mid[k]
		bisectFace(BoundaryFace{a[0], a[1], a[2], f.Face})
		bisectFace(BoundaryFace{b[0], b[1], b[2], f.Face})
	}
	for _, f := range m.Bnd {
		bisectFace(f)
	}
	return r
}
