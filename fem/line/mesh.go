package line

import (
	"fmt"
	"math"
	"sort"

	"gapcert/interval"
)

// Mesh is a partition a = x_0 < x_1 < … < x_n = b of an interval. Nodes[k]
// encloses the exact node x_k. The end nodes are the caller's enclosures of
// the exact ends; the interior nodes made by this package are float64
// points (a choice of mesh: any interior points give a valid partition),
// so that the cell lengths are as tight as the ends allow. Consecutive
// enclosures are disjoint and increasing, so every cell has positive
// length: H(k).Lo > 0.
type Mesh struct {
	Nodes []interval.I
}

// Side names an end of the interval.
type Side int

const (
	Left Side = iota
	Right
)

// NewMesh returns the mesh with the given node enclosures. It returns an
// error unless there are at least two nodes, all bounded, with
// Nodes[k].Hi < Nodes[k+1].Lo.
func NewMesh(nodes []interval.I) (*Mesh, error) {
	if len(nodes) < 2 {
		return nil, fmt.Errorf("line: a mesh needs at least two nodes, got %d", len(nodes))
	}
	for k, x := range nodes {
		if !x.IsBounded() {
			return nil, fmt.Errorf("line: node %d is unbounded %v", k, x)
		}
		if k > 0 && !(nodes[k-1].Hi < x.Lo) {
			return nil, fmt.Errorf("line: nodes %d %v and %d %v are not strictly increasing", k-1, nodes[k-1], k, x)
		}
	}
	return &Mesh{Nodes: append([]interval.I(nil), nodes...)}, nil
}

// Uniform returns the mesh of n cells of (nearly) equal length on [a, b]:
// x_0 = a, x_n = b, and for 0 < k < n, x_k is a float64 within rounding of
// a + k(b − a)/n (the midpoint of its interval enclosure). It panics if
// n < 1 or the cells cannot be separated in float64.
func Uniform(a, b interval.I, n int) *Mesh {
	if n < 1 {
		panic("line: a mesh needs at least one cell")
	}
	nodes := make([]interval.I, n+1)
	nodes[0], nodes[n] = a, b
	fn := float64(n)
	for k := 1; k < n; k++ {
		x := a.MulF(float64(n - k)).Add(b.MulF(float64(k))).DivF(fn)
		nodes[k] = interval.Point(x.Mid())
	}
	m, err := NewMesh(nodes)
	if err != nil {
		panic(err.Error())
	}
	return m
}

// UniformWith returns Uniform(a, b, n) with a node at each of the points
// (exact float64s, for instance kinks of the potential) that lie strictly
// inside (a, b): a point within a quarter cell of an interior uniform node
// replaces that node (unless the node is itself one of the points), any
// other point is inserted. The cells keep lengths
// between about a quarter and the full uniform length. It panics as
// Uniform does.
func UniformWith(a, b interval.I, n int, points []float64) *Mesh {
	m := Uniform(a, b, n)
	if len(points) == 0 {
		return m
	}
	nodes := m.Nodes
	h := (b.Mid() - a.Mid()) / float64(n)
	placed := map[float64]bool{} // nodes that are points of the list: never moved
	for _, x := range points {
		if !(a.Hi < x && x < b.Lo) {
			continue
		}
		k := sort.Search(len(nodes), func(i int) bool { return nodes[i].Lo >= x })
		// nodes[k−1] < x ≤ nodes[k] (k ≥ 1 since x > a.Hi, k < len since x < b.Lo).
		placed[x] = true
		switch {
		case nodes[k].Lo == x && nodes[k].Hi == x:
			continue // already a node
		case k < len(nodes)-1 && nodes[k].IsPoint() && !placed[nodes[k].Lo] && nodes[k].Lo-x < h/4 && !(nodes[k-1].Hi >= x):
			nodes[k] = interval.Point(x)
		case k > 1 && nodes[k-1].IsPoint() && !placed[nodes[k-1].Lo] && x-nodes[k-1].Hi < h/4:
			nodes[k-1] = interval.Point(x)
		default:
			nodes = append(nodes[:k], append([]interval.I{interval.Point(x)}, nodes[k:]...)...)
		}
	}
	out, err := NewMesh(nodes)
	if err != nil {
		panic(err.Error())
	}
	return out
}

// Graded returns an n-cell mesh on [a, b] refined toward the named ends
// (one or both): with t = k/n, x_k = a + (b − a)·t^grading toward Left,
// mirrored toward Right, and mirrored about the centre when both are named.
// grading ≥ 1 (1 gives Uniform spacing). Interior nodes are floats chosen
// at round-to-nearest (a choice); it returns an error if they collide.
func Graded(a, b interval.I, n int, grading float64, toward ...Side) (*Mesh, error) {
	if n < 1 || !(grading >= 1) || len(toward) == 0 {
		panic("line: Graded needs n ≥ 1, grading ≥ 1 and at least one end")
	}
	var left, right bool
	for _, s := range toward {
		switch s {
		case Left:
			left = true
		case Right:
			right = true
		default:
			panic("line: unknown side")
		}
	}
	g := func(t float64) float64 { return math.Pow(t, grading) }
	am, bm := a.Mid(), b.Mid()
	nodes := make([]interval.I, n+1)
	nodes[0], nodes[n] = a, b
	for k := 1; k < n; k++ {
		t := float64(k) / float64(n)
		var s float64
		switch {
		case left && right:
			if t <= 0.5 {
				s = 0.5 * g(2*t)
			} else {
				s = 1 - 0.5*g(2-2*t)
			}
		case left:
			s = g(t)
		default:
			s = 1 - g(1-t)
		}
		nodes[k] = interval.Point(am + (bm-am)*s)
	}
	return NewMesh(nodes)
}

// Cells returns the number of cells n.
func (m *Mesh) Cells() int { return len(m.Nodes) - 1 }

// H returns an enclosure of the exact length x_(k+1) − x_k of cell k.
func (m *Mesh) H(k int) interval.I { return m.Nodes[k+1].Sub(m.Nodes[k]) }

// HMax returns an upper bound of the largest exact cell length.
func (m *Mesh) HMax() float64 {
	h := 0.0
	for k := 0; k < m.Cells(); k++ {
		h = math.Max(h, m.H(k).Hi)
	}
	return h
}

// HMin returns a positive lower bound of the smallest exact cell length.
func (m *Mesh) HMin() float64 {
	h := math.Inf(1)
	for k := 0; k < m.Cells(); k++ {
		h = math.Min(h, m.H(k).Lo)
	}
	return h
}

// Refine returns the mesh with every cell bisected. The new node of cell k
// is the float64 nearest the midpoint of the enclosure of (x_k + x_(k+1))/2
// (a point, hence exact); it panics if a cell is too short to bisect.
func (m *Mesh) Refine() *Mesh {
	n := m.Cells()
	nodes := make([]interval.I, 0, 2*n+1)
	for k := 0; k < n; k++ {
		mid := m.Nodes[k].Add(m.Nodes[k+1]).MulF(0.5)
		nodes = append(nodes, m.Nodes[k], interval.Point(mid.Mid()))
	}
	nodes = append(nodes, m.Nodes[n])
	r, err := NewMesh(nodes)
	if err != nil {
		panic(err.Error())
	}
	return r
}

// locate returns the cell containing x (by node midpoints, clamped to the
// mesh) and the approximate reference coordinate ξ there (a choice, for
// evaluation only).
func (m *Mesh) locate(x float64) (int, float64) {
	n := m.Cells()
	k := sort.Search(n, func(k int) bool { return m.Nodes[k+1].Mid() >= x })
	if k >= n {
		k = n - 1
	}
	x0, x1 := m.Nodes[k].Mid(), m.Nodes[k+1].Mid()
	xi := (x - x0) / (x1 - x0)
	return k, math.Min(1, math.Max(0, xi))
}
