package plot

import (
	"fmt"
	"math"

	"gapcert/fem/boundary"
	"gapcert/fem/mesh3"
	"gapcert/fem/problem"
	"gapcert/fem/tet"
	"gapcert/interval/decimalio"
)

// Size of the trial space of SolidModesOf (choices: enough for a
// picture, about a second): the mesh is refined while it keeps within
// solidModeTets tetrahedra, and the degree is 3 when P_3 keeps within
// about solidModeUnknowns unknowns (p³/6 per tetrahedron), else 2.
const (
	solidModeTets     = 2000
	solidModeUnknowns = 2000
)

// SolidModes are approximate eigenfunctions of a polyhedron problem for
// pictures, computed in floating point (choices, never part of a proof).
type SolidModes struct {
	Degree, Levels, Unknowns int
	Graded                   int // levels of grading toward singular edges (a certificate's mesh)
	// Triangles are the boundary triangles of the refined mesh, at the
	// midpoints of their node enclosures.
	Triangles []FaceTriangle

	space   *tet.Lagrange
	vecs    [][]float64
	locator *tetLocator
}

// SolidModesOf returns the lowest count approximate eigenfunctions of the
// polyhedron problem p on a trial space of its own size (see
// solidModeTets): the cone tetrahedra refined while they keep within
// solidModeTets, P_3 when it keeps within about solidModeUnknowns
// unknowns, else P_2 (SolidModesOn). It panics if p is not a polyhedron
// problem.
func SolidModesOf(p *problem.Problem, count int) (*SolidModes, error) {
	if p.Polyhedron == nil {
		panic("plot: SolidModesOf needs a polyhedron problem")
	}
	tets, levels := len(p.Polyhedron.Triangles()), 0
	for 8*tets <= solidModeTets {
		tets *= 8
		levels++
	}
	degree := 2
	if 27*tets <= 6*solidModeUnknowns {
		degree = 3
	}
	return SolidModesOn(p, degree, levels, count, 0)
}

// A TooLargeError reports a trial space with more unknowns than the limit
// given to SolidModesOn; nothing was solved.
type TooLargeError struct{ Unknowns, Limit int }

func (e *TooLargeError) Error() string {
	return fmt.Sprintf("the trial space has %d unknowns, more than the %d a picture may use", e.Unknowns, e.Limit)
}

// SolidModesOn returns the lowest count approximate eigenfunctions of the
// polyhedron problem p on Bernstein P_degree with the problem's face
// conditions (package fem/tet) on the cone tetrahedra of the polyhedron
// (fem/mesh3's Cones, as the certifier meshes it) refined uniformly levels
// times by Bey's red refinement: the lowest eigenvectors of the
// floating-point pencil a + σ·m, σ = 1 + max(0, −min V) so that the
// pencil is positive definite, by the sparse subspace iteration of the
// trial space. With these the certifier's recipe (its degree and
// refinements), the trial space is the certificate's. A positive limit
// bounds the unknowns: a larger space is a *TooLargeError, found before
// anything is solved. It panics if p is not a polyhedron problem, degree
// < 1 or levels < 0.
func SolidModesOn(p *problem.Problem, degree, levels, count, limit int) (*SolidModes, error) {
	ph := p.Polyhedron
	if ph == nil {
		panic("plot: SolidModesOn needs a polyhedron problem")
	}
	if degree < 1 || levels < 0 {
		panic(fmt.Sprintf("plot: SolidModesOn with degree %d and %d refinements", degree, levels))
	}
	m3, err := mesh3.Cones(ph.Nodes(), len(ph.Vertices), ph.Triangles(), ph.TriangleFaces())
	if err != nil {
		return nil, fmt.Errorf("the tetrahedra of the polyhedron: %v", err)
	}
	for range levels {
		m3 = m3.Refine()
	}
	mesh, err := tet.NewMesh(m3, len(ph.Faces))
	if err != nil {
		return nil, fmt.Errorf("the refined mesh: %v", err)
	}
	s, err := solidModesOnMesh(p, mesh, degree, count, limit)
	if err != nil {
		return nil, err
	}
	s.Levels = levels
	return s, nil
}

// solidModesOnMesh is SolidModesOn on a given tetrahedral mesh of p.
func solidModesOnMesh(p *problem.Problem, mesh *tet.Mesh, degree, count, limit int) (*SolidModes, error) {
	m3 := mesh.Mesh3()
	bc := make([]boundary.Condition, len(p.Boundary))
	for i, b := range p.Boundary {
		bc[i] = b.Condition()
	}
	space := tet.NewLagrange(mesh, degree, bc)
	if limit > 0 && space.N() > limit {
		return nil, &TooLargeError{Unknowns: space.N(), Limit: limit}
	}
	v, err := tet.NewPotential(mesh, p.Potential, 1)
	if err != nil {
		return nil, fmt.Errorf("the potential on the mesh: %v", err)
	}
	shift := 1 + math.Max(0, -p.PotentialRange().Lo)
	vecs, err := tet.NewTrial(space, v).ApproxEigenvectors(count, shift)
	if err != nil {
		return nil, fmt.Errorf("approximate eigenvectors: %v", err)
	}
	s := &SolidModes{Degree: degree, Unknowns: space.N(), space: space, vecs: vecs,
		locator: newTetLocator(mesh)}
	for _, f := range m3.Bnd {
		tr := FaceTriangle{Face: f.Face}
		for j, k := range [3]int{f.A, f.B, f.C} {
			for c := range 3 {
				tr.Corners[j][c] = m3.Nodes[k][c].Mid()
			}
		}
		s.Triangles = append(s.Triangles, tr)
	}
	return s, nil
}

// Eval returns approximate eigenfunction k (0-based) at (x, y, z), on
// the tetrahedron whose barycentric coordinates of the point have the
// largest minimum (the one holding the point, for a point of the solid).
func (s *SolidModes) Eval(k int, x, y, z float64) float64 {
	t, lam := s.locator.find([3]float64{x, y, z})
	if t < 0 {
		return s.space.Eval(s.vecs[k], x, y, z)
	}
	return s.space.EvalLocal(s.vecs[k], t, lam)
}

// tetLocator finds the tetrahedron of a point through a uniform grid of
// boxes, each listing the tetrahedra whose bounding boxes meet it.
type tetLocator struct {
	verts    [][4][3]float64 // node midpoints of each tetrahedron
	lo, size [3]float64      // the grid's corner and box size
	n        int             // boxes per axis
	boxes    [][]int
}

func newTetLocator(m *tet.Mesh) *tetLocator {
	l := &tetLocator{n: max(1, int(math.Cbrt(float64(m.NumTets())))), verts: make([][4][3]float64, m.NumTets())}
	hi := [3]float64{math.Inf(-1), math.Inf(-1), math.Inf(-1)}
	l.lo = [3]float64{math.Inf(1), math.Inf(1), math.Inf(1)}
	for t := range l.verts {
		for i, v := range m.Vertices(t) {
			for c := range 3 {
				l.verts[t][i][c] = v[c].Mid()
				l.lo[c], hi[c] = math.Min(l.lo[c], v[c].Mid()), math.Max(hi[c], v[c].Mid())
			}
		}
	}
	for c := range 3 {
		l.size[c] = (hi[c] - l.lo[c]) / float64(l.n)
	}
	l.boxes = make([][]int, l.n*l.n*l.n)
	for t, vs := range l.verts {
		var b0, b1 [3]int
		for c := range 3 {
			lo, hi := vs[0][c], vs[0][c]
			for _, v := range vs[1:] {
				lo, hi = math.Min(lo, v[c]), math.Max(hi, v[c])
			}
			b0[c], b1[c] = l.box(c, lo), l.box(c, hi)
		}
		for i := b0[0]; i <= b1[0]; i++ {
			for j := b0[1]; j <= b1[1]; j++ {
				for k := b0[2]; k <= b1[2]; k++ {
					idx := (i*l.n+j)*l.n + k
					l.boxes[idx] = append(l.boxes[idx], t)
				}
			}
		}
	}
	return l
}

// box returns the grid index along axis c of coordinate x, clamped.
func (l *tetLocator) box(c int, x float64) int {
	return min(l.n-1, max(0, int(math.Floor((x-l.lo[c])/l.size[c]))))
}

// find returns the tetrahedron of p's box with the largest least
// barycentric coordinate of p, and those coordinates; t = −1 when the box
// lists none.
func (l *tetLocator) find(p [3]float64) (t int, lam [4]float64) {
	b := l.boxes[(l.box(0, p[0])*l.n+l.box(1, p[1]))*l.n+l.box(2, p[2])]
	best, t := math.Inf(-1), -1
	for _, cand := range b {
		bl := barycentric(l.verts[cand], p)
		if m := min(bl[0], bl[1], bl[2], bl[3]); m > best {
			best, t, lam = m, cand, bl
		}
	}
	return t, lam
}

// barycentric returns the barycentric coordinates of p in the tetrahedron
// with vertices v (Cramer's rule on the edge vectors from v[0]).
func barycentric(v [4][3]float64, p [3]float64) [4]float64 {
	var d [3][3]float64
	var r [3]float64
	for c := range 3 {
		for k := range 3 {
			d[k][c] = v[k+1][c] - v[0][c]
		}
		r[c] = p[c] - v[0][c]
	}
	cross := func(a, b [3]float64) [3]float64 {
		return [3]float64{a[1]*b[2] - a[2]*b[1], a[2]*b[0] - a[0]*b[2], a[0]*b[1] - a[1]*b[0]}
	}
	dot := func(a, b [3]float64) float64 { return a[0]*b[0] + a[1]*b[1] + a[2]*b[2] }
	det := dot(d[0], cross(d[1], d[2]))
	l1 := dot(r, cross(d[1], d[2])) / det
	l2 := dot(d[0], cross(r, d[2])) / det
	l3 := dot(d[0], cross(d[1], r)) / det
	return [4]float64{1 - l1 - l2 - l3, l1, l2, l3}
}

// SolidOf returns the picture input of the polyhedron problem p: its
// vertices (enclosure midpoints), outward faces and face conditions, with
// no mesh, section or modes yet. It panics if p is not a polyhedron
// problem.
func SolidOf(p *problem.Problem) *Solid {
	ph := p.Polyhedron
	if ph == nil {
		panic("plot: SolidOf needs a polyhedron problem")
	}
	s := &Solid{Title: p.Name, Faces: ph.Faces}
	for _, v := range ph.Vertices {
		s.Vertices = append(s.Vertices, [3]float64{v[0].Val.Mid(), v[1].Val.Mid(), v[2].Val.Mid()})
	}
	for _, bc := range p.Boundary {
		side := Side{Kind: bc.Kind.String()}
		if bc.Kind == boundary.Robin {
			side.Alpha = bc.Alpha.Text
			if _, err := decimalio.ParseRat(side.Alpha); err != nil && bc.Alpha.Rat != nil {
				side.Alpha += " = " + ratText(bc.Alpha.Rat) // a parameter's value
			}
		}
		s.Boundary = append(s.Boundary, side)
	}
	return s
}
