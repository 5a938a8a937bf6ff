package hypothesis

import (
	"math"

	"gapcert/fem/problem"
	"gapcert/interval"
)

// simplex is a triangle (two coordinates) or a tetrahedron (three), given
// by enclosures of its vertices, positively oriented: the exact simplex of
// every choice of vertices inside the enclosures is the one meant, and
// every statement below holds for each such choice.
type simplex [][]interval.I

// coordinateNames are the variables of the potential, in coordinate order.
var coordinateNames = [3]string{"x", "y", "z"}

// topSimplices returns the simplices that tile the closed domain of p, a
// polygon or a polyhedron: the counterclockwise triangles of p.Triangles,
// or the positively oriented cone tetrahedra of the polyhedron
// (problem.Polyhedron.Tetrahedra, over the enclosures of Nodes).
func topSimplices(p *problem.Problem) []simplex {
	var out []simplex
	if ph := p.Polyhedron; ph != nil {
		nodes := ph.Nodes()
		for _, t := range ph.Tetrahedra() {
			s := make(simplex, len(t))
			for j, k := range t {
				s[j] = nodes[k][:]
			}
			out = append(out, s)
		}
		return out
	}
	for _, t := range p.Triangles() {
		s := make(simplex, len(t))
		for j, k := range t {
			s[j] = []interval.I{p.Vertices[k][0].Val, p.Vertices[k][1].Val}
		}
		out = append(out, s)
	}
	return out
}

// dim returns the number of coordinates.
func (s simplex) dim() int { return len(s[0]) }

// box returns the coordinate box of s (variable name → hull of the
// vertices' coordinates), which contains the exact simplex.
func (s simplex) box() map[string]interval.I {
	env := map[string]interval.I{}
	for c := range s.dim() {
		h := s[0][c]
		for _, v := range s[1:] {
			h = h.Hull(v[c])
		}
		env[coordinateNames[c]] = h
	}
	return env
}

// split returns the sub-simplices of the midpoint subdivision of s, with
// enclosed midpoints m_ij = (v_i + v_j)/2: for every exact choice of
// vertices in s, the exact sub-simplices lie in the enclosures and cover
// the exact simplex. A triangle gives its four midpoint triangles; a
// tetrahedron the eight of Bey's red refinement (the four corner
// tetrahedra and the inner octahedron cut along the diagonal m_02 m_13:
// J. Bey, Tetrahedral grid refinement, Computing 55 (1995) 355–378),
// with the orientation left unspecified (only the cover is used).
func (s simplex) split() []simplex {
	mid := func(i, j int) []interval.I {
		m := make([]interval.I, s.dim())
		for c := range m {
			m[c] = s[i][c].Add(s[j][c]).MulF(0.5)
		}
		return m
	}
	if s.dim() == 2 {
		m01, m12, m20 := mid(0, 1), mid(1, 2), mid(2, 0)
		return []simplex{{s[0], m01, m20}, {m01, s[1], m12}, {m20, m12, s[2]}, {m12, m20, m01}}
	}
	x0, x1, x2, x3 := s[0], s[1], s[2], s[3]
	m01, m02, m03, m12, m13, m23 := mid(0, 1), mid(0, 2), mid(0, 3), mid(1, 2), mid(1, 3), mid(2, 3)
	return []simplex{
		{x0, m01, m02, m03}, {m01, x1, m12, m13}, {m02, m12, x2, m23}, {m03, m13, m23, x3},
		{m01, m02, m03, m13}, {m01, m02, m12, m13}, {m02, m03, m13, m23}, {m02, m12, m13, m23},
	}
}

// children is the number of simplices split returns in dimension d.
func children(d int) int { return 1 << d }

// centroidInside chooses a float point near the centroid of the
// sub-simplex t and returns it if it is verified to lie in the closed
// simplex top (a simplex of topSimplices, given by enclosures of its
// exact vertices; see insideSimplex).
func centroidInside(t, top simplex) ([]float64, bool) {
	q := make([]float64, t.dim())
	for i := range q {
		for _, v := range t {
			q[i] += v[i].Mid()
		}
		q[i] /= float64(len(t)) // a choice
		if math.IsNaN(q[i]) {
			return q, false
		}
	}
	return q, insideSimplex(top, q)
}

// insideSimplex reports whether the point q is verified to lie in the closed
// positively oriented simplex with vertex enclosures v: q lies there if
// and only if replacing any one vertex by q leaves the orientation ≥ 0
// (the barycentric coordinates of q are these orientations divided by
// the simplex's, common practice). In two dimensions the orientation with
// q in place of v_{j+2} is (v_{j+1} − v_j) × (q − v_j).
func insideSimplex(v simplex, q []float64) bool {
	pt := make([]interval.I, len(q))
	for i, x := range q {
		pt[i] = interval.Point(x)
	}
	if v.dim() == 2 {
		for j := range 3 {
			a, b := v[j], v[(j+1)%3]
			o := b[0].Sub(a[0]).Mul(pt[1].Sub(a[1])).Sub(b[1].Sub(a[1]).Mul(pt[0].Sub(a[0])))
			if o.Lo < 0 {
				return false
			}
		}
		return true
	}
	for i := range v {
		w := append(simplex(nil), v...)
		w[i] = pt
		var e [3][3]interval.I
		for r := range 3 {
			for c := range 3 {
				e[r][c] = w[r+1][c].Sub(w[0][c])
			}
		}
		if det3(e).Lo < 0 {
			return false
		}
	}
	return true
}

// samplePoints chooses float points verified inside the closed domain:
// on an interval its midpoint and quarter points, on a polygon or a
// polyhedron points near the centroids of the simplices that tile it.
func samplePoints(p *problem.Problem) [][]float64 {
	var out [][]float64
	if p.Dim == 1 {
		a, b := p.Interval[0].Val, p.Interval[1].Val
		for _, s := range []float64{0.5, 0.25, 0.75} {
			x := a.Mid() + s*(b.Mid()-a.Mid()) // a choice
			if a.Hi <= x && x <= b.Lo {
				out = append(out, []float64{x})
			}
		}
		return out
	}
	for _, t := range topSimplices(p) {
		if q, ok := centroidInside(t, t); ok {
			out = append(out, q)
		}
	}
	return out
}

// pointEnv returns the point enclosures of the coordinates of pt.
func pointEnv(pt []float64) map[string]interval.I {
	env := map[string]interval.I{}
	for i, x := range pt {
		env[coordinateNames[i]] = interval.Point(x)
	}
	return env
}
